#!/usr/bin/env bash
# Shared set-up for `npm start`, `npm test` and `npm run dev`: PostgreSQL from Debian, npm
# packages, the cluster on loopback, the session password. Sourced, never run on its own.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
# These scripts run Wayside on this machine over plain http: say so, so the production checks
# (server/plugins/production.ts) stand aside and the session cookie works without HTTPS.
export WAYSIDE_LOCAL=1
export NUXT_SESSION_COOKIE_SECURE="${NUXT_SESSION_COOKIE_SECURE:-false}"
DATA="$ROOT/.data"
PGPORT="${WAYSIDE_PG_PORT:-54329}"
PGUSER_DB=wayside
mkdir -p "$DATA"

say() { printf '\033[1m[wayside]\033[0m %s\n' "$*"; }
die() { printf '\033[1;31m[wayside]\033[0m %s\n' "$*" >&2; exit 1; }

is_root() { [ "$(id -u)" = 0 ]; }

apt_install() {
  is_root || die "Missing Debian packages ($*). Install them with: sudo apt-get install -y $*"
  if [ -z "${WAYSIDE_APT_UPDATED:-}" ]; then
    say "apt-get update"
    DEBIAN_FRONTEND=noninteractive apt-get update -qq >/dev/null
    export WAYSIDE_APT_UPDATED=1
  fi
  say "installing $* from Debian's packages"
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "$@" >/dev/null
}

pg_bindir() {
  local d
  d="$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)"
  [ -n "$d" ] && [ -x "$d/initdb" ] && echo "$d"
}

ensure_postgres_installed() {
  if [ -z "$(pg_bindir)" ]; then
    apt_install postgresql
    # Debian's package starts its own cluster on 5432; Wayside uses its own, so stop that one.
    (command -v pg_ctlcluster >/dev/null && for c in $(ls /etc/postgresql 2>/dev/null); do pg_ctlcluster "$c" main stop 2>/dev/null || true; done) || true
  fi
  PGBIN="$(pg_bindir)"
  [ -n "$PGBIN" ] || die "PostgreSQL server binaries not found under /usr/lib/postgresql"
}

ensure_chromium() {
  command -v chromium >/dev/null || apt_install chromium
}

# pdftoppm renders invoice PDFs to PNG for the browser tests' screenshots.
ensure_poppler() {
  command -v pdftoppm >/dev/null || apt_install poppler-utils
}

ensure_node_modules() {
  local want have=""
  want="$(sha256sum "$ROOT/package-lock.json" | cut -d' ' -f1)"
  [ -f "$ROOT/node_modules/.wayside-lock" ] && have="$(cat "$ROOT/node_modules/.wayside-lock")"
  if [ "$want" != "$have" ]; then
    say "installing npm packages (package-lock.json changed)"
    (cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error)
    echo "$want" > "$ROOT/node_modules/.wayside-lock"
  fi
}

# The cluster's owner: initdb and postgres refuse root, so as root they run as `postgres`.
pg_run() {
  if is_root; then runuser -u "$PG_OWNER" -- "$@"; else "$@"; fi
}

choose_cluster_dir() {
  PG_OWNER="$(id -un)"
  PGDIR="$DATA/pg"
  if is_root; then
    id postgres >/dev/null 2>&1 || useradd --system --home-dir /var/lib/postgresql --shell /bin/bash postgres
    PG_OWNER=postgres
    mkdir -p "$PGDIR"
    chown "$PG_OWNER" "$PGDIR"
    if ! runuser -u "$PG_OWNER" -- test -w "$PGDIR"; then
      # Some parent folder of the checkout is closed to the postgres user (a mode-700 home).
      local alt="/var/tmp/wayside-pg-$(printf '%s' "$ROOT" | sha256sum | cut -c1-12)"
      mkdir -p "$alt"; chown "$PG_OWNER" "$alt"; chmod 700 "$alt"
      say "the checkout is not reachable by the postgres user; the cluster lives in $alt"
      PGDIR="$alt"
    fi
  fi
  mkdir -p "$PGDIR"
  PGDATA_DIR="$PGDIR/data"
  PGSOCK="$PGDIR"
  PGLOG="$PGDIR/postgres.log"
}

# A postmaster.pid may outlive its server (a crash, a killed sandbox): keep it only if it names
# a live, non-zombie postgres process.
clear_stale_pid() {
  local pidfile="$PGDATA_DIR/postmaster.pid" pid state cmd
  [ -f "$pidfile" ] || return 0
  pid="$(head -n 1 "$pidfile" | tr -dc 0-9)"
  if [ -n "$pid" ] && [ -r "/proc/$pid/stat" ]; then
    state="$(awk '{print $3}' "/proc/$pid/stat" 2>/dev/null || true)"
    cmd="$(tr '\0' ' ' < "/proc/$pid/cmdline" 2>/dev/null || true)"
    if [ "$state" != Z ] && [[ "$cmd" == *postgres* ]]; then return 0; fi
  fi
  say "removing a stale postmaster.pid (pid $pid is not a running server)"
  rm -f "$pidfile"
}

pg_ready() { "$PGBIN/pg_isready" -q -h 127.0.0.1 -p "$PGPORT" >/dev/null 2>&1; }

ensure_cluster_running() {
  ensure_postgres_installed
  choose_cluster_dir
  if [ ! -f "$PGDATA_DIR/PG_VERSION" ]; then
    say "creating the PostgreSQL cluster in $PGDATA_DIR"
    pg_run "$PGBIN/initdb" -D "$PGDATA_DIR" -U "$PGUSER_DB" --auth=trust --encoding=UTF8 --no-locale >/dev/null
    cat >> "$PGDATA_DIR/postgresql.conf" <<CONF
# Wayside: loopback only, its own port and socket folder.
listen_addresses = '127.0.0.1'
port = $PGPORT
unix_socket_directories = '$PGSOCK'
max_connections = 100
CONF
  fi
  if pg_ready; then return 0; fi
  clear_stale_pid
  say "starting PostgreSQL on 127.0.0.1:$PGPORT"
  pg_run "$PGBIN/pg_ctl" -D "$PGDATA_DIR" -l "$PGLOG" -w -t 60 start >/dev/null \
    || { tail -n 20 "$PGLOG" >&2 || true; die "PostgreSQL did not start (log: $PGLOG)"; }
}

psql_admin() { "$PGBIN/psql" -q -v ON_ERROR_STOP=1 -h 127.0.0.1 -p "$PGPORT" -U "$PGUSER_DB" -d postgres "$@"; }

ensure_database() {
  local name="$1"
  if [ "$(psql_admin -tAc "SELECT 1 FROM pg_database WHERE datname = '$name'")" != 1 ]; then
    say "creating database $name"
    psql_admin -c "CREATE DATABASE \"$name\""
  fi
}

recreate_database() {
  local name="$1"
  psql_admin -c "DROP DATABASE IF EXISTS \"$name\" WITH (FORCE)"
  psql_admin -c "CREATE DATABASE \"$name\""
}

ensure_session_password() {
  if [ -z "${NUXT_SESSION_PASSWORD:-}" ]; then
    local f="$DATA/session-password"
    [ -s "$f" ] || { (umask 077; openssl rand -hex 32 > "$f" 2>/dev/null || node -e "console.log(require('crypto').randomBytes(32).toString('hex'))" > "$f"); }
    NUXT_SESSION_PASSWORD="$(cat "$f")"
    export NUXT_SESSION_PASSWORD
  fi
}

# Rebuild only when a source file is newer than the last build.
build_if_needed() {
  local stamp="$ROOT/.output/.wayside-built"
  if [ -f "$stamp" ] && [ -z "$(cd "$ROOT" && find app server shared public nuxt.config.ts tailwind.config.ts package-lock.json -newer "$stamp" -print -quit 2>/dev/null)" ]; then
    say "build is up to date"
    return 0
  fi
  say "building the app"
  (cd "$ROOT" && NODE_OPTIONS="--max-old-space-size=3072" npx nuxt build >"$DATA/build.log" 2>&1) \
    || { tail -n 40 "$DATA/build.log" >&2; die "build failed (log: $DATA/build.log)"; }
  touch "$stamp"
}

# Children started here stop with us on Ctrl-C or exit.
CHILD_PIDS=()
cleanup_children() {
  local p
  for p in "${CHILD_PIDS[@]:-}"; do [ -n "$p" ] && kill "$p" 2>/dev/null || true; done
  wait 2>/dev/null || true
}

wait_for_http() {
  local url="$1" tries="${2:-120}"
  for _ in $(seq "$tries"); do
    curl -fsS -o /dev/null "$url" 2>/dev/null && return 0
    sleep 0.5
  done
  return 1
}
