#!/usr/bin/env bash
# npm run db:restore FILE [-- --clean]: a backup made by `npm run db:backup`, restored with Debian's
# pg_restore into NUXT_DATABASE_URL (or the local database). An empty database is filled; a
# database that already holds tables is refused unless --clean is given, which replaces the
# schemas the backup holds (public, the migrations' and the job queue's) with the backup's: rows
# written since the backup are lost. The restore runs in one transaction: it either
# completes or changes nothing.
set -euo pipefail
source "$(dirname "$0")/backup-lib.sh"

file="" clean=""
for arg in "$@"; do
  case "$arg" in
    --clean) clean=1 ;;
    -*) die "unknown option $arg (only --clean)" ;;
    *) [ -z "$file" ] || die "give one backup file"; file="$arg" ;;
  esac
done
[ -n "$file" ] || die "usage: npm run db:restore FILE [-- --clean]"
[ -f "$file" ] || die "no backup at $file"
"$PG_TOOLS/pg_restore" --list "$file" >/dev/null 2>&1 || die "$file is not a pg_dump custom-format backup"

tables="$("$PG_TOOLS/psql" -X -tAq -v ON_ERROR_STOP=1 -d "$DB_URL" \
  -c "SELECT count(*) FROM pg_tables WHERE schemaname NOT IN ('pg_catalog', 'information_schema')")" \
  || die "cannot reach $(redacted "$DB_URL")"
if [ "$tables" != 0 ] && [ -z "$clean" ]; then
  die "$(redacted "$DB_URL") already holds $tables tables; restore into an empty database, or add --clean to replace what the backup contains"
fi

if [ -z "$clean" ]; then
  "$PG_TOOLS/pg_restore" --no-owner --no-privileges --single-transaction --exit-on-error --dbname="$DB_URL" "$file" \
    || die "pg_restore failed; nothing was changed"
else
  # pg_restore --clean drops object by object and cannot drop the job queue's partitioned tables
  # that way; the schemas the backup holds (and public) are replaced whole instead, in the same
  # single transaction as the restore. The script is written out first, so a backup that cannot
  # be read never reaches the database half-read.
  sql="$(mktemp)"
  trap 'rm -f "$sql"' EXIT
  mapfile -t schemas < <("$PG_TOOLS/pg_restore" --list "$file" | awk '$4 == "SCHEMA" && $5 == "-" { print $6 }')
  {
    printf 'DROP SCHEMA IF EXISTS public CASCADE;\nCREATE SCHEMA public;\n'
    for s in "${schemas[@]}"; do printf 'DROP SCHEMA IF EXISTS "%s" CASCADE;\n' "$s"; done
    "$PG_TOOLS/pg_restore" --no-owner --no-privileges -f - "$file"
  } > "$sql" || die "cannot read $file; nothing was changed"
  "$PG_TOOLS/psql" -X -q -v ON_ERROR_STOP=1 --single-transaction -d "$DB_URL" -f "$sql" >/dev/null \
    || die "the restore failed; nothing was changed"
fi
say "restored $file into $(redacted "$DB_URL")" >&2
