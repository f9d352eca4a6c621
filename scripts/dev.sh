#!/usr/bin/env bash
# Day-to-day work: the private MariaDB, the API with reload (tsx watch) on $PORT and Vite's dev
# server with hot reload on $VITE_PORT, proxying /api to the API.
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT="$(pwd)"
if [ -f .env ]; then set -a; . ./.env; set +a; fi
. scripts/mariadb.sh
. scripts/common.sh
export PORT="${PORT:-8640}" HOST="${HOST:-127.0.0.1}"
DB_PORT="${DB_PORT:-33406}"; DATA_DIR="${DATA_DIR:-$ROOT/.data}"; mkdir -p "$DATA_DIR"
ensure_node_modules
STARTED_DB=0
API_PID=""; VITE_PID=""
cleanup() {
  trap - INT TERM EXIT
  for p in $API_PID $VITE_PID; do kill -TERM "$p" 2>/dev/null || true; done
  for p in $API_PID $VITE_PID; do wait "$p" 2>/dev/null || true; done
  if [ "$STARTED_DB" = 1 ]; then echo "[scrubwright] stopping MariaDB"; mariadb_stop "$DATA_DIR/mariadb"; fi
}
trap cleanup INT TERM EXIT
provision_local_database
npx tsx server/db/cli.ts migrate
npx tsx server/db/cli.ts seed
# Pages come from Vite's port in development: let its origin send cookie-authenticated writes.
export TRUSTED_ORIGINS="${TRUSTED_ORIGINS:-http://127.0.0.1:${VITE_PORT:-5173},http://localhost:${VITE_PORT:-5173}}"
node_modules/.bin/tsx watch server/index.ts &
API_PID=$!
node_modules/.bin/vite --host 127.0.0.1 --port "${VITE_PORT:-5173}" &
VITE_PID=$!
# Until either stops (or Ctrl-C); the trap then stops the other and the database.
wait -n "$API_PID" "$VITE_PID" || true
