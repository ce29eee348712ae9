#!/usr/bin/env bash
# npm run db:restore FILE [-- --clean]: a backup made by `npm run db:backup`, restored with Debian's
# pg_restore into NUXT_DATABASE_URL (or the local database). An empty database is filled; a
# database that already holds tables is refused unless --clean is given, which drops every object
# the backup contains before recreating it from the backup (rows written since the backup are
# lost; tables the backup does not know stay). The restore runs in one transaction: it either
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

opts=(--no-owner --no-privileges --single-transaction --exit-on-error)
[ -n "$clean" ] && opts+=(--clean --if-exists)
"$PG_TOOLS/pg_restore" "${opts[@]}" --dbname="$DB_URL" "$file" || die "pg_restore failed; nothing was changed"
say "restored $file into $(redacted "$DB_URL")" >&2
