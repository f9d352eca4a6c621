#!/usr/bin/env bash
# Private MariaDB for Scrubwright: provisions Debian's server if missing, initialises a data
# directory and starts mariadbd on loopback. Sourced by start.sh and test.sh.
#   mariadb_ensure_installed
#   mariadb_start DATADIR PORT     (sets MARIADB_PID)
#   mariadb_stop DATADIR
set -euo pipefail

mariadb_bin() {
  for c in mariadbd /usr/sbin/mariadbd /usr/libexec/mariadbd mysqld /usr/sbin/mysqld; do
    if command -v "$c" >/dev/null 2>&1; then command -v "$c"; return 0; fi
  done
  return 1
}

mariadb_ensure_installed() {
  if mariadb_bin >/dev/null && command -v mariadb-install-db >/dev/null 2>&1; then return 0; fi
  if [ "$(id -u)" = "0" ] && command -v apt-get >/dev/null 2>&1; then
    echo "[scrubwright] MariaDB server not found: installing Debian's mariadb-server with apt-get" >&2
    apt-get update -qq >/dev/null
    DEBIAN_FRONTEND=noninteractive apt-get install -y -qq mariadb-server mariadb-client >/dev/null
    # Debian starts a system service on install; we use our own private instance instead.
    (service mariadb stop || service mysql stop || true) >/dev/null 2>&1
  else
    echo "[scrubwright] MariaDB server is not installed. Install it as root with:" >&2
    echo "    apt-get install mariadb-server" >&2
    echo "or point DATABASE_URL at an existing MariaDB (see .env.example)." >&2
    exit 1
  fi
}

mariadb_start() {
  local datadir="$1" port="$2"
  mkdir -p "$datadir"
  datadir="$(cd "$datadir" && pwd)"
  local bin; bin="$(mariadb_bin)"
  local user; user="$(id -un)"
  if [ ! -d "$datadir/mysql" ]; then
    mariadb-install-db --no-defaults --user="$user" --datadir="$datadir" \
      --auth-root-authentication-method=normal --skip-test-db >"$datadir/../mariadb-install.log" 2>&1 || {
        cat "$datadir/../mariadb-install.log" >&2; return 1; }
  fi
  if [ -f "$datadir/mariadbd.pid" ] && kill -0 "$(cat "$datadir/mariadbd.pid")" 2>/dev/null; then
    echo "[scrubwright] MariaDB already running on port $port (pid $(cat "$datadir/mariadbd.pid"))" >&2
    MARIADB_PID="$(cat "$datadir/mariadbd.pid")"; return 0
  fi
  "$bin" --no-defaults --user="$user" --datadir="$datadir" --port="$port" --bind-address=127.0.0.1 \
    --socket="$datadir/mariadbd.sock" --pid-file="$datadir/mariadbd.pid" --log-error="$datadir/error.log" \
    --innodb-buffer-pool-size=128M --skip-name-resolve --character-set-server=utf8mb4 \
    --collation-server=utf8mb4_unicode_ci >/dev/null 2>&1 &
  MARIADB_PID=$!
  for _ in $(seq 1 100); do
    if mariadb --no-defaults -uroot --socket="$datadir/mariadbd.sock" -e 'SELECT 1' >/dev/null 2>&1; then return 0; fi
    if ! kill -0 "$MARIADB_PID" 2>/dev/null; then echo "[scrubwright] MariaDB failed to start:" >&2; tail -20 "$datadir/error.log" >&2; return 1; fi
    sleep 0.2
  done
  echo "[scrubwright] MariaDB did not become ready in 20 s" >&2; tail -20 "$datadir/error.log" >&2; return 1
}

# mariadb_create_db DATADIR DBNAME USER PASSWORD
mariadb_create_db() {
  local datadir="$1" db="$2" user="$3" pass="$4"
  mariadb --no-defaults -uroot --socket="$datadir/mariadbd.sock" <<SQL
CREATE DATABASE IF NOT EXISTS \`$db\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$user'@'127.0.0.1' IDENTIFIED BY '$pass';
ALTER USER '$user'@'127.0.0.1' IDENTIFIED BY '$pass';
GRANT ALL PRIVILEGES ON \`$db\`.* TO '$user'@'127.0.0.1';
FLUSH PRIVILEGES;
SQL
}

mariadb_stop() {
  local datadir="$1"
  if [ -f "$datadir/mariadbd.pid" ]; then
    local pid; pid="$(cat "$datadir/mariadbd.pid")"
    if kill -0 "$pid" 2>/dev/null; then
      kill -TERM "$pid" 2>/dev/null || true
      for _ in $(seq 1 150); do kill -0 "$pid" 2>/dev/null || return 0; sleep 0.2; done
      kill -KILL "$pid" 2>/dev/null || true
    fi
  fi
}
