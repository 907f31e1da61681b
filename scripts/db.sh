#!/usr/bin/env bash
# The project's private MariaDB: its own datadir, socket and port on 127.0.0.1, the system's config ignored.
#   scripts/db.sh start | stop | status | recreate <database>
set -euo pipefail
source "$(dirname "$0")/env.sh"

DATADIR="$PERPEND_VAR/mariadb/data"
RUNDIR="$PERPEND_VAR/mariadb/run"
SOCKET="$RUNDIR/mariadb.sock"
PIDFILE="$RUNDIR/mariadb.pid"
LOG="$PERPEND_VAR/mariadb/mariadb.log"
USER_OPT=()
[ "$(id -u)" = "0" ] && USER_OPT=(--user=root)

# --no-defaults must come first for every MariaDB program, or /etc/mysql is read.
client() { mariadb --no-defaults --socket="$SOCKET" -uroot "$@"; }

is_up() { mariadb-admin --no-defaults --socket="$SOCKET" -uroot --connect-timeout=1 ping >/dev/null 2>&1; }

start() {
  if is_up; then echo "MariaDB already running on 127.0.0.1:$NUXT_DB_PORT"; return 0; fi
  mkdir -p "$DATADIR" "$RUNDIR"
  if [ ! -d "$DATADIR/mysql" ]; then
    echo "Initialising the MariaDB datadir in $DATADIR"
    mariadb-install-db --no-defaults "${USER_OPT[@]}" --datadir="$DATADIR" --auth-root-authentication-method=socket \
      --skip-test-db >"$PERPEND_VAR/mariadb/install.log" 2>&1
  fi
  mariadbd --no-defaults "${USER_OPT[@]}" --datadir="$DATADIR" --socket="$SOCKET" --pid-file="$PIDFILE" \
    --port="$NUXT_DB_PORT" --bind-address=127.0.0.1 --skip-name-resolve \
    --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
    --innodb-buffer-pool-size=256M --max-connections=300 --log-error="$LOG" >/dev/null 2>&1 &
  for _ in $(seq 1 120); do
    is_up && break
    sleep 0.25
  done
  if ! is_up; then echo "MariaDB did not start; see $LOG" >&2; tail -20 "$LOG" >&2 || true; exit 1; fi
  ensure_database "$NUXT_DB_NAME"
  echo "MariaDB running on 127.0.0.1:$NUXT_DB_PORT (datadir $DATADIR)"
}

ensure_database() {
  local db="$1"
  client <<SQL
CREATE DATABASE IF NOT EXISTS \`$db\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$NUXT_DB_USER'@'127.0.0.1' IDENTIFIED BY '$NUXT_DB_PASSWORD';
ALTER USER '$NUXT_DB_USER'@'127.0.0.1' IDENTIFIED BY '$NUXT_DB_PASSWORD';
GRANT ALL PRIVILEGES ON \`$db\`.* TO '$NUXT_DB_USER'@'127.0.0.1';
FLUSH PRIVILEGES;
SQL
}

recreate() {
  local db="$1"
  client -e "DROP DATABASE IF EXISTS \`$db\`"
  ensure_database "$db"
}

stop() {
  if ! is_up; then echo "MariaDB is not running"; return 0; fi
  mariadb-admin --no-defaults --socket="$SOCKET" -uroot shutdown
  echo "MariaDB stopped"
}

case "${1:-status}" in
  start) start ;;
  stop) stop ;;
  status) if is_up; then echo "up"; else echo "down"; exit 3; fi ;;
  recreate) recreate "${2:?database name}" ;;
  *) echo "usage: scripts/db.sh start|stop|status|recreate <db>" >&2; exit 2 ;;
esac
