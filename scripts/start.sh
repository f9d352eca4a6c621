#!/usr/bin/env bash
# One command from a fresh clone to a running Scrubwright with demo data:
# installs npm packages, provisions a private MariaDB on 127.0.0.1 (unless DATABASE_URL is set),
# migrates, seeds the demo scenario once, builds the client and serves API + client.
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

SERVER_PID=""; STARTED_DB=0
cleanup() {
  trap - INT TERM EXIT
  if [ -n "$SERVER_PID" ] && kill -0 "$SERVER_PID" 2>/dev/null; then
    kill -TERM "$SERVER_PID" 2>/dev/null || true; wait "$SERVER_PID" 2>/dev/null || true
  fi
  if [ "$STARTED_DB" = 1 ]; then echo "[scrubwright] stopping MariaDB"; mariadb_stop "$DATA_DIR/mariadb"; fi
}
trap cleanup INT TERM EXIT

provision_local_database
export MAIL_MODE="${MAIL_MODE:-fake}"

npx tsx server/db/cli.ts migrate
npx tsx server/db/cli.ts seed
echo "[scrubwright] building the client"
npx vite build --logLevel warn

require_free_port "$PORT" PORT
node_modules/.bin/tsx server/index.ts &
SERVER_PID=$!
wait_for_http "http://$HOST:$PORT/api/v1/health" 60 || { echo "[scrubwright] server did not start" >&2; exit 1; }
cat <<TXT

  Scrubwright is running at http://$HOST:$PORT

  Demo sign-ins (password for all: $(npx tsx server/db/cli.ts demo-password)):
$(npx tsx server/db/cli.ts demo-users)

  Press Ctrl-C to stop the server and the database.
TXT
wait "$SERVER_PID"
