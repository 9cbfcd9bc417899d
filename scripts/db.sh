#!/usr/bin/env bash
# Project-local MariaDB on loopback: `bash scripts/db.sh start|stop|status`.
# Data lives under .data/mariadb (git-ignored). Never touches a system MariaDB on 3306:
# every client call uses --no-defaults and our own socket.
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT=$(pwd)
DATA="$ROOT/.data/mariadb"
RUN="$DATA/run"
SOCK="$RUN/mysqld.sock"
PIDFILE="$RUN/mysqld.pid"
LOG="$DATA/mariadbd.err"
# Read only the DB_* keys of .env.local (other values may hold characters a shell would parse).
if [ -f .env.local ]; then
  while IFS='=' read -r key value; do
    case "$key" in DB_PORT|DB_NAME|DB_USER|DB_PASSWORD) [ -z "${!key:-}" ] && export "$key=$value" ;; esac
  done < <(grep -E '^DB_[A-Z_]+=' .env.local)
fi
PORT="${DB_PORT:-3307}"

die() { echo "db: $*" >&2; exit 1; }

ensure_server_installed() {
  if command -v mariadbd >/dev/null 2>&1 || [ -x /usr/sbin/mariadbd ]; then return; fi
  if [ "$(id -u)" != "0" ]; then
    die "MariaDB server is not installed. Run as root: apt-get update && apt-get install -y mariadb-server"
  fi
  echo "db: installing Debian's mariadb-server (one time)…"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  # The package's own service start is not wanted (and is refused in containers).
  apt-get install -y -qq mariadb-server >/dev/null
}

mariadbd_bin() { command -v mariadbd 2>/dev/null || echo /usr/sbin/mariadbd; }

client() { mariadb --no-defaults --socket="$SOCK" -uroot "$@"; }

running() { [ -S "$SOCK" ] && mariadb-admin --no-defaults --socket="$SOCK" -uroot ping >/dev/null 2>&1; }

start() {
  if [ "$PORT" = "3306" ]; then die "DB_PORT=3306 is the system MariaDB's port; choose another (default 3307)"; fi
  ensure_server_installed
  mkdir -p "$RUN"
  if running; then echo "db: MariaDB already running on 127.0.0.1:$PORT (socket $SOCK)"; provision; return; fi
  if [ ! -d "$DATA/data/mysql" ]; then
    echo "db: initialising data directory $DATA/data"
    mariadb-install-db --no-defaults --datadir="$DATA/data" --user=root --auth-root-authentication-method=socket \
      --skip-test-db --innodb-log-file-size=8M >"$DATA/install.log" 2>&1 || { tail -20 "$DATA/install.log"; die "mariadb-install-db failed"; }
  fi
  rm -f "$SOCK" "$PIDFILE"
  nohup "$(mariadbd_bin)" --no-defaults --datadir="$DATA/data" --user=root --bind-address=127.0.0.1 --port="$PORT" \
    --socket="$SOCK" --pid-file="$PIDFILE" --log-error="$LOG" --skip-name-resolve --default-time-zone=+00:00 \
    --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci --innodb-log-file-size=256M --innodb-buffer-pool-size=256M \
    --max-connections=300 --max-allowed-packet=256M >"$DATA/mariadbd.out" 2>&1 &
  local waited=0
  until running; do
    sleep 0.2; waited=$((waited + 1))
    if [ $waited -ge 150 ]; then
      echo "db: MariaDB did not accept connections within 30 s. End of $LOG:" >&2
      tail -25 "$LOG" >&2 || true
      exit 1
    fi
  done
  echo "db: MariaDB up on 127.0.0.1:$PORT (pid $(cat "$PIDFILE" 2>/dev/null || echo '?'))"
  provision
}

# Creates the application and test databases and the application user (idempotent).
provision() {
  : "${DB_NAME:?DB_NAME missing from .env.local — run: node scripts/ensure-env.mjs}"
  : "${DB_USER:?DB_USER missing}"; : "${DB_PASSWORD:?DB_PASSWORD missing}"
  local test_db="${DB_NAME}_test"
  client <<SQL
CREATE DATABASE IF NOT EXISTS \`$DB_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE DATABASE IF NOT EXISTS \`$test_db\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
ALTER USER '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
GRANT ALL ON \`$DB_NAME\`.* TO '$DB_USER'@'127.0.0.1';
GRANT ALL ON \`$test_db\`.* TO '$DB_USER'@'127.0.0.1';
SQL
}

stop() {
  if running; then
    mariadb-admin --no-defaults --socket="$SOCK" -uroot shutdown
    echo "db: MariaDB stopped"
  else
    echo "db: MariaDB is not running"
  fi
}

status() {
  if running; then echo "db: running on 127.0.0.1:$PORT"; else echo "db: not running"; exit 1; fi
}

case "${1:-start}" in
  start) start ;;
  stop) stop ;;
  status) status ;;
  *) die "usage: scripts/db.sh start|stop|status" ;;
esac
