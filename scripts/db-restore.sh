#!/usr/bin/env bash
# npm run db:restore -- FILE: load a backup made by db:backup into the database (DATABASE_URL, else
# the private MariaDB of `npm start`). The dump drops and recreates each table: stop the app first.
set -euo pipefail
cd "$(dirname "$0")/.."
if [ -f .env ]; then set -a; . ./.env; set +a; fi
FILE="${1:-}"
if [ -z "$FILE" ] || [ ! -f "$FILE" ]; then echo "usage: npm run db:restore -- FILE.sql" >&2; exit 2; fi
. scripts/db-url.sh
MYSQL_PWD="$DB_PASS" mariadb --no-defaults --default-character-set=utf8mb4 -h "$DB_HOST" -P "$DB_PORT_" -u "$DB_USER" "$DB_NAME" < "$FILE"
echo "[scrubwright] restored $FILE into $DB_NAME on $DB_HOST:$DB_PORT_"
