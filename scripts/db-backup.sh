#!/usr/bin/env bash
# npm run db:backup [-- FILE]: a consistent snapshot of the database (mariadb-dump with
# --single-transaction: one InnoDB snapshot, no table locks, the app keeps running) into FILE,
# by default backups/scrubwright-YYYYmmdd-HHMMSS.sql. The database is DATABASE_URL, else the
# private MariaDB that `npm start` runs (DB_PORT, DATA_DIR), which must be running.
set -euo pipefail
cd "$(dirname "$0")/.."
if [ -f .env ]; then set -a; . ./.env; set +a; fi
. scripts/db-url.sh
FILE="${1:-backups/scrubwright-$(date -u +%Y%m%d-%H%M%S).sql}"
mkdir -p "$(dirname "$FILE")"
MYSQL_PWD="$DB_PASS" mariadb-dump --no-defaults --single-transaction --quick --routines --triggers --no-tablespaces \
  --default-character-set=utf8mb4 -h "$DB_HOST" -P "$DB_PORT_" -u "$DB_USER" "$DB_NAME" > "$FILE.partial"
mv "$FILE.partial" "$FILE"
echo "[scrubwright] backup written to $FILE ($(wc -c < "$FILE") bytes)"
