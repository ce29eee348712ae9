#!/usr/bin/env bash
# npm run bench: the speed figures. Sets up like npm test (a database of its own, wayside_bench,
# its own ports, the built app), starts the fakes and the server, then runs every
# scripts/bench/*.ts, or only those named (`npm run bench -- sync-push`), and prints what each
# measured, then one table (scripts/bench/support/table.ts) and bench/results.json. Each benchmark records
# its figures with recordRow (scripts/bench/support/rows.ts). Benchmarks print; they assert nothing. A benchmark finds the server at
# WAYSIDE_BENCH_URL (also WAYSIDE_TEST_URL) and its database at NUXT_DATABASE_URL.
source "$(dirname "$0")/lib.sh"
trap 'cleanup_children' EXIT
trap 'exit 130' INT TERM

SLOT="${WAYSIDE_BENCH_SLOT:-9}"
BENCH_DB=wayside_bench
export WAYSIDE_TEST_PORT=$((3100 + SLOT * 10))
export NUXT_SMTP_PORT=$((2600 + SLOT * 10)) WAYSIDE_SMTP_PORT=$((2600 + SLOT * 10))
export WAYSIDE_MAIL_HTTP_PORT=$((2601 + SLOT * 10))
export NUXT_STRIPE_API_PORT=$((12200 + SLOT * 10)) WAYSIDE_PAY_PORT=$((12200 + SLOT * 10))
export WAYSIDE_TEST_URL="http://127.0.0.1:$WAYSIDE_TEST_PORT"
export WAYSIDE_BENCH_URL="$WAYSIDE_TEST_URL"
export NUXT_SESSION_PASSWORD="${NUXT_SESSION_PASSWORD:-wayside-bench-session-password-0123456789abcdef}"
export NUXT_LOGIN_MAX_FAILURES=50 NUXT_LOGIN_MAX_FAILURES_PER_ADDRESS=5000
export NUXT_UPLOADS_DIR="$DATA/bench-uploads-$SLOT"

ensure_node_modules
# The browser benchmarks (the phone's cold start) need Chromium.
ensure_chromium
ensure_cluster_running
say "fresh benchmark database $BENCH_DB"
recreate_database "$BENCH_DB"
export NUXT_DATABASE_URL="postgres://wayside@127.0.0.1:$PGPORT/$BENCH_DB"
cd "$ROOT"
npx tsx server/db/migrate.ts && npx tsx server/db/seed/index.ts
build_if_needed
rm -rf "$NUXT_UPLOADS_DIR"
node --import tsx scripts/fakes/run.ts & CHILD_PIDS+=($!)
NITRO_HOST=127.0.0.1 NITRO_PORT="$WAYSIDE_TEST_PORT" node .output/server/index.mjs > "$DATA/bench-server-$SLOT.log" 2>&1 & CHILD_PIDS+=($!)
wait_for_http "$WAYSIDE_TEST_URL/login" || { tail -n 30 "$DATA/bench-server-$SLOT.log"; die "the bench server did not start"; }

rm -f bench/rows.jsonl
names=("$@")
if [ ${#names[@]} -eq 0 ]; then
  for f in scripts/bench/*.ts; do names+=("$(basename "$f" .ts)"); done
fi
for name in "${names[@]}"; do
  [ -f "scripts/bench/$name.ts" ] || die "no benchmark scripts/bench/$name.ts"
  say "bench: $name"
  npx tsx "scripts/bench/$name.ts" || say "bench $name failed"
done
npx tsx scripts/bench/support/table.ts
