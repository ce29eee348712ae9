#!/usr/bin/env bash
# npm run db:backup: the database, dumped with Debian's pg_dump in its custom format (compressed,
# restorable table by table) into .data/backups/wayside-<UTC time>.dump; prints the file's path.
# The database is NUXT_DATABASE_URL, or the local one `npm start` uses; WAYSIDE_BACKUP_DIR moves
# the folder.
set -euo pipefail
source "$(dirname "$0")/backup-lib.sh"

mkdir -p "$BACKUP_DIR"
file="$BACKUP_DIR/wayside-$(date -u +%Y%m%dT%H%M%SZ).dump"
[ -e "$file" ] && file="${file%.dump}-$$.dump"
"$PG_TOOLS/pg_dump" --format=custom --no-owner --no-privileges --file="$file.partial" "$DB_URL" \
  || { rm -f "$file.partial"; die "pg_dump failed for $(redacted "$DB_URL")"; }
# Renamed only once complete, so a cut-off dump never looks like a backup.
mv "$file.partial" "$file"
say "backup of $(redacted "$DB_URL") written ($(du -h "$file" | cut -f1))" >&2
echo "$file"
