#!/usr/bin/env bash
# npm run backup: one dated archive holding a pg_dump of the app database and the uploads folder.
#   BACKUP_DIR (default ./backups) where the archive goes; DB_NAME (default stripwright) which database;
#   UPLOADS_DIR (default ./.data/uploads) the folder of stored photos and files.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"

ensure_postgres_installed
start_cluster
trap '[ "${PG_STARTED_HERE:-0}" = 1 ] && stop_cluster; rm -rf "${work:-}"' EXIT

db="${DB_NAME:-stripwright}"
uploads="${UPLOADS_DIR:-$ROOT/.data/uploads}"
out_dir="${BACKUP_DIR:-$ROOT/backups}"
mkdir -p "$out_dir"
stamp="$(date -u +%Y%m%dT%H%M%SZ)"
archive="$out_dir/stripwright-$db-$stamp.tar.gz"

work="$(mktemp -d)"
mkdir -p "$work/uploads"
# Custom format: compressed, and pg_restore can restore it into an empty database.
PGPASSWORD="$PG_PASSWORD" "$PG_BIN/pg_dump" -h 127.0.0.1 -p "$PG_PORT" -U stripwright -d "$db" -Fc --no-owner -f "$work/database.dump" \
	|| die "pg_dump of $db failed"
[ -d "$uploads" ] && cp -a "$uploads/." "$work/uploads/"
printf 'database=%s\ncreated=%s\n' "$db" "$stamp" >"$work/BACKUP-INFO"
tar -C "$work" -czf "$archive" BACKUP-INFO database.dump uploads
say "Backup written: $archive"
echo "$archive"
