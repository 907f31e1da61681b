#!/usr/bin/env bash
# `npm start`: installs what is missing, builds, starts MariaDB, migrates, seeds the demo, starts the mail
# catcher and the built server on http://127.0.0.1:3000. Ctrl-C stops everything it started.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/setup.sh
source scripts/env.sh
export PATH="/usr/sbin:$PATH"
export HOST="${HOST:-127.0.0.1}" PORT="${PORT:-3000}"

bash scripts/db.sh start
npx tsx scripts/migrate.ts
npx tsx scripts/seed.ts
echo "Building the application (about 30 s)"
npx nuxt build > "$PERPEND_VAR/build.log" 2>&1 || { tail -40 "$PERPEND_VAR/build.log"; exit 1; }

pids=()
stop_all() {
  trap - INT TERM EXIT
  echo; echo "Stopping Perpend"
  for pid in "${pids[@]}"; do kill "$pid" 2>/dev/null || true; done
  wait 2>/dev/null || true
  bash scripts/db.sh stop
}
trap stop_all INT TERM EXIT

node_modules/.bin/tsx scripts/mail-catcher.ts & pids+=($!)
# The demo shows caught mail at /dev/mailbox and takes e-mailed answers on 127.0.0.1:2526.
PERPEND_DEV_MAILBOX=1 NUXT_INBOUND_SMTP_PORT="${NUXT_INBOUND_SMTP_PORT:-2526}" node .output/server/index.mjs & pids+=($!)

for _ in $(seq 1 60); do
  node -e "fetch(process.argv[1]).then(r => process.exit(r.ok ? 0 : 1), () => process.exit(1))" "http://$HOST:$PORT/api/health" && break
  sleep 0.5
done
cat <<MSG

  Perpend is running at http://$HOST:$PORT
  Demo sign-ins (password for all: $(npx tsx scripts/seed.ts --print-password)):
$(npx tsx scripts/seed.ts --print-accounts | sed 's/^/    /')
  Mail the product sends is caught locally: read it at http://$HOST:$PORT/dev/mailbox.
  E-mailed answers are taken on 127.0.0.1:${NUXT_INBOUND_SMTP_PORT:-2526}.
  Ctrl-C stops the server, the mail catcher and MariaDB.

MSG
wait -n "${pids[@]}" || true
