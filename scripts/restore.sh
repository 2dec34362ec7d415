#!/usr/bin/env bash
# npm run restore FILE: restores an archive written by npm run backup into an EMPTY database and an
# empty uploads folder; refuses to write over data that is there.
#   DB_NAME (default stripwright) the database to restore into (created when missing);
#   UPLOADS_DIR (default ./.data/uploads) the uploads folder to fill.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"

archive="${1:-}"
[ -n "$archive" ] && [ -f "$archive" ] || die "usage: npm run restore FILE   (FILE: an archive from npm run backup)"
archive="$(cd "$(dirname "$archive")" && pwd)/$(basename "$archive")"

ensure_postgres_installed
start_cluster
trap '[ "${PG_STARTED_HERE:-0}" = 1 ] && stop_cluster; rm -rf "${work:-}"' EXIT

db="${DB_NAME:-stripwright}"
uploads="${UPLOADS_DIR:-$ROOT/.data/uploads}"
work="$(mktemp -d)"
tar -C "$work" -xzf "$archive" || die "$archive is not a backup archive (tar could not read it)"
[ -f "$work/database.dump" ] || die "$archive holds no database.dump: not an archive from npm run backup"

ensure_database "$db"
psql=("$PG_BIN/psql" -h 127.0.0.1 -p "$PG_PORT" -U stripwright -d "$db" -v ON_ERROR_STOP=1 -qtA)
tables="$(PGPASSWORD="$PG_PASSWORD" "${psql[@]}" -c "SELECT count(*) FROM pg_tables WHERE schemaname = 'public'")"
[ "$tables" = 0 ] || die "database $db is not empty ($tables tables): restore into an empty database, e.g. DB_NAME=stripwright_restored npm run restore FILE"
if [ -d "$uploads" ] && [ -n "$(ls -A "$uploads" 2>/dev/null)" ]; then
	die "uploads folder $uploads is not empty: choose an empty one with UPLOADS_DIR"
fi

PGPASSWORD="$PG_PASSWORD" "$PG_BIN/pg_restore" -h 127.0.0.1 -p "$PG_PORT" -U stripwright -d "$db" --no-owner --exit-on-error --single-transaction "$work/database.dump" \
	|| die "pg_restore into $db failed; the database was left as it was"
mkdir -p "$uploads"
cp -a "$work/uploads/." "$uploads/"
say "Restored $archive into database $db and uploads folder $uploads"
