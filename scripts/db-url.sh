#!/usr/bin/env bash
# Sourced by db-backup.sh and db-restore.sh: DB_HOST, DB_PORT_, DB_USER, DB_PASS, DB_NAME from
# DATABASE_URL, or from the private MariaDB of `npm start` when DATABASE_URL is unset.
if [ -z "${DATABASE_URL:-}" ]; then
  DATA_DIR="${DATA_DIR:-.data}"
  if [ ! -f "$DATA_DIR/db-password" ]; then echo "[scrubwright] set DATABASE_URL, or run npm start once to create the private database" >&2; exit 1; fi
  DATABASE_URL="mariadb://scrubwright:$(cat "$DATA_DIR/db-password")@127.0.0.1:${DB_PORT:-33406}/scrubwright"
fi
eval "$(node -e '
  const u = new URL(process.argv[1]); const q = (s) => "\x27" + s.replace(/\x27/g, "\x27\\\x27\x27") + "\x27"
  console.log(`DB_HOST=${q(u.hostname)} DB_PORT_=${q(u.port || "3306")} DB_USER=${q(decodeURIComponent(u.username))} DB_PASS=${q(decodeURIComponent(u.password))} DB_NAME=${q(u.pathname.slice(1))}`)
' "$DATABASE_URL")"
