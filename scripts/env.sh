# Shared settings for the project's scripts: sourced, never run.
# Every value can be overridden from the environment; the NUXT_* names are the ones the built server reads.
PERPEND_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
export PERPEND_ROOT
export PERPEND_VAR="${PERPEND_VAR:-$PERPEND_ROOT/var}"
export NUXT_DB_HOST="${NUXT_DB_HOST:-127.0.0.1}"
export NUXT_DB_PORT="${NUXT_DB_PORT:-3307}"
export NUXT_DB_NAME="${NUXT_DB_NAME:-perpend}"
export NUXT_DB_USER="${NUXT_DB_USER:-perpend}"
export NUXT_DB_PASSWORD="${NUXT_DB_PASSWORD:-perpend-local}"
export NUXT_MAIL_URL="${NUXT_MAIL_URL:-smtp://127.0.0.1:2525}"
export NUXT_UPLOAD_DIR="${NUXT_UPLOAD_DIR:-$PERPEND_VAR/uploads}"
export PERPEND_MAILBOX_DIR="${PERPEND_MAILBOX_DIR:-$PERPEND_VAR/mailbox}"

# nuxt-auth-utils refuses to seal sessions without a 32+ character password in production.
# Generate one per checkout, keep it out of git, reuse it so sessions survive a restart.
if [ -z "${NUXT_SESSION_PASSWORD:-}" ]; then
  mkdir -p "$PERPEND_VAR"
  if [ ! -s "$PERPEND_VAR/session-password" ]; then
    node -e "process.stdout.write(require('crypto').randomBytes(32).toString('hex'))" > "$PERPEND_VAR/session-password"
    chmod 600 "$PERPEND_VAR/session-password"
  fi
  NUXT_SESSION_PASSWORD="$(cat "$PERPEND_VAR/session-password")"
  export NUXT_SESSION_PASSWORD
fi
