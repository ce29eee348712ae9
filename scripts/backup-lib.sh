#!/usr/bin/env bash
# Shared by backup.sh and restore.sh: where the PostgreSQL tools, the database and the backups are.
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
say() { printf '[wayside] %s\n' "$*"; }
die() { printf '[wayside] %s\n' "$*" >&2; exit 1; }

# Debian's client tools, the newest installed version (they must not be older than the server).
PG_TOOLS="${WAYSIDE_PG_BIN:-$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)}"
[ -x "$PG_TOOLS/pg_dump" ] || die "pg_dump not found; install Debian's postgresql-client (apt-get install -y postgresql-client)"
DB_URL="${NUXT_DATABASE_URL:-postgres://wayside@127.0.0.1:${WAYSIDE_PG_PORT:-54329}/wayside}"
BACKUP_DIR="${WAYSIDE_BACKUP_DIR:-$ROOT/.data/backups}"

# The URL without its password, for messages.
redacted() { printf '%s' "$1" | sed -E 's#(://[^:/@]+):[^@]*@#\1:***@#'; }
