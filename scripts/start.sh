#!/usr/bin/env bash
# One command from a fresh clone to a running Scrubwright with demo data:
# installs npm packages, provisions a private MariaDB on 127.0.0.1 (unless DATABASE_URL is set),
# migrates, seeds the demo scenario once, builds the client and serves API + client. The server
# runs as compiled JavaScript (dist-server/, rebuilt when a source is newer than the build).
# Ctrl-C stops the server and the database cleanly.
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT="$(pwd)"
if [ -f .env ]; then set -a; . ./.env; set +a; fi
. scripts/mariadb.sh
. scripts/common.sh

export PORT="${PORT:-8640}"
export HOST="${HOST:-127.0.0.1}"
DB_PORT="${DB_PORT:-33406}"
DATA_DIR="${DATA_DIR:-$ROOT/.data}"
mkdir -p "$DATA_DIR"

ensure_node_modules

SERVER_PID=""; STEP_PID=""; STARTED_DB=0
# Stops whatever runs (a start-up step or the server) and the database, then exits: on Ctrl-C or
# TERM at any moment, start-up included, nothing carries on afterwards.
cleanup() {
  local rc=$?
  trap - INT TERM EXIT
  for pid in $STEP_PID $SERVER_PID; do
    if kill -0 "$pid" 2>/dev/null; then kill -TERM "$pid" 2>/dev/null || true; wait "$pid" 2>/dev/null || true; fi
  done
  if [ "$STARTED_DB" = 1 ]; then echo "[scrubwright] stopping MariaDB"; mariadb_stop "$DATA_DIR/mariadb"; fi
  exit "$rc"
}
trap 'cleanup' EXIT
trap 'exit 130' INT
trap 'exit 143' TERM
# Each start-up step runs in the background and is waited for, so a signal is handled at once.
step() { "$@" & STEP_PID=$!; wait "$STEP_PID"; STEP_PID=""; }

provision_local_database
export MAIL_MODE="${MAIL_MODE:-fake}"

echo "[scrubwright] compiling the server (when its sources changed)"
step node scripts/run-built.mjs db-cli migrate
step node scripts/run-built.mjs db-cli seed
echo "[scrubwright] building the client"
step npx vite build --logLevel warn

require_free_port "$PORT" PORT
node scripts/run-built.mjs index &
SERVER_PID=$!
wait_for_http "http://$HOST:$PORT/api/v1/health" 60 || { echo "[scrubwright] server did not start" >&2; exit 1; }
cat <<TXT

  Scrubwright is running at http://$HOST:$PORT

  Demo sign-ins (password for all: $(node dist-server/db-cli.mjs demo-password)):
$(node dist-server/db-cli.mjs demo-users)

  Press Ctrl-C to stop the server and the database.
TXT
wait "$SERVER_PID"
