#!/usr/bin/env bash
# npm run bench: the same set-up as npm test against a database of its own (wayside_bench), a
# build, the server on its own port, then every benchmark in scripts/bench/*.ts in turn (or only
# those named: `npm run bench -- sync-push`). Benchmarks print figures and assert nothing.
# A benchmark gets WAYSIDE_BENCH_URL (the server) and NUXT_DATABASE_URL (its database).
source "$(dirname "$0")/lib.sh"
trap 'cleanup_children' EXIT
trap 'exit 130' INT TERM

export WAYSIDE_BENCH_PORT="${WAYSIDE_BENCH_PORT:-3090}"
export WAYSIDE_BENCH_URL="http://127.0.0.1:$WAYSIDE_BENCH_PORT"
export NUXT_SESSION_PASSWORD="${NUXT_SESSION_PASSWORD:-wayside-bench-session-password-0123456789abcdef}"
export NUXT_UPLOADS_DIR="$DATA/bench-uploads"
BENCH_DB=wayside_bench

ensure_node_modules
ensure_cluster_running
say "fresh benchmark database $BENCH_DB"
recreate_database "$BENCH_DB"
export NUXT_DATABASE_URL="postgres://wayside@127.0.0.1:$PGPORT/$BENCH_DB"
cd "$ROOT"
npx tsx server/db/migrate.ts && npx tsx server/db/seed/index.ts
build_if_needed
rm -rf "$NUXT_UPLOADS_DIR"
NITRO_HOST=127.0.0.1 NITRO_PORT="$WAYSIDE_BENCH_PORT" node .output/server/index.mjs > "$DATA/bench-server.log" 2>&1 & CHILD_PIDS+=($!)
wait_for_http "$WAYSIDE_BENCH_URL/login" || { tail -n 30 "$DATA/bench-server.log"; die "the benchmark server did not start"; }

names=("$@")
if [ ${#names[@]} -eq 0 ]; then
  for f in scripts/bench/*.ts; do names+=("$(basename "$f" .ts)"); done
fi
for name in "${names[@]}"; do
  [ -f "scripts/bench/$name.ts" ] || die "no benchmark scripts/bench/$name.ts"
  say "benchmark: $name"
  npx tsx "scripts/bench/$name.ts"
done
