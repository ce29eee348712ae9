#!/usr/bin/env bash
# npm run bench: the speed figures. Sets up like npm test (its own database and ports, the built
# app), starts the server, then runs every scripts/bench/*.ts and prints what each measured.
# Benchmarks print; they assert nothing.
source "$(dirname "$0")/lib.sh"
trap 'cleanup_children' EXIT
trap 'exit 130' INT TERM

SLOT="${WAYSIDE_BENCH_SLOT:-9}"
BENCH_DB="wayside_bench_$SLOT"
export WAYSIDE_TEST_PORT=$((3100 + SLOT * 10))
export NUXT_SMTP_PORT=$((2600 + SLOT * 10)) WAYSIDE_SMTP_PORT=$((2600 + SLOT * 10))
export WAYSIDE_MAIL_HTTP_PORT=$((2601 + SLOT * 10))
export NUXT_STRIPE_API_PORT=$((12200 + SLOT * 10)) WAYSIDE_PAY_PORT=$((12200 + SLOT * 10))
export WAYSIDE_TEST_URL="http://127.0.0.1:$WAYSIDE_TEST_PORT"
export NUXT_SESSION_PASSWORD="${NUXT_SESSION_PASSWORD:-wayside-bench-session-password-0123456789abcdef}"
export NUXT_LOGIN_MAX_FAILURES=50 NUXT_LOGIN_MAX_FAILURES_PER_ADDRESS=5000
export NUXT_UPLOADS_DIR="$DATA/bench-uploads-$SLOT"

ensure_node_modules
ensure_chromium
ensure_cluster_running
recreate_database "$BENCH_DB"
export NUXT_DATABASE_URL="postgres://wayside@127.0.0.1:$PGPORT/$BENCH_DB"
(cd "$ROOT" && npx tsx server/db/migrate.ts && npx tsx server/db/seed/index.ts)
cd "$ROOT"
build_if_needed
rm -rf "$NUXT_UPLOADS_DIR"
node --import tsx scripts/fakes/run.ts & CHILD_PIDS+=($!)
NITRO_HOST=127.0.0.1 NITRO_PORT="$WAYSIDE_TEST_PORT" node .output/server/index.mjs > "$DATA/bench-server-$SLOT.log" 2>&1 & CHILD_PIDS+=($!)
wait_for_http "$WAYSIDE_TEST_URL/login" || die "the bench server did not start"

for b in scripts/bench/*.ts; do
  say "bench: $(basename "$b" .ts)"
  npx tsx "$b" || say "bench $(basename "$b" .ts) failed"
done
