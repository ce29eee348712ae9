#!/usr/bin/env bash
# npm test: the same set-up as npm start against a fresh test database, then the type check,
# unit, API and browser tests, after the lint. `npm test -- unit api` runs only the kinds named;
# APISPEC=tests/api/x.test.ts or SPEC=tests/e2e/y.spec.ts narrows the API or browser tests to one file.
source "$(dirname "$0")/lib.sh"
trap 'cleanup_children' EXIT
trap 'exit 130' INT TERM

KINDS=("$@"); [ ${#KINDS[@]} -gt 0 ] || KINDS=(lint typecheck unit api e2e)
want() { local k; for k in "${KINDS[@]}"; do [ "$k" = "$1" ] && return 0; done; return 1; }

# A slot keeps parallel test runs on one machine apart (ports and database).
SLOT="${WAYSIDE_TEST_SLOT:-0}"
TEST_DB="wayside_test_$SLOT"
export WAYSIDE_TEST_PORT=$((3100 + SLOT * 10))
export NUXT_SMTP_PORT=$((2600 + SLOT * 10)) WAYSIDE_SMTP_PORT=$((2600 + SLOT * 10))
export WAYSIDE_MAIL_HTTP_PORT=$((2601 + SLOT * 10))
export NUXT_STRIPE_API_PORT=$((12200 + SLOT * 10)) WAYSIDE_PAY_PORT=$((12200 + SLOT * 10))
export WAYSIDE_TEST_URL="http://127.0.0.1:$WAYSIDE_TEST_PORT"
export WAYSIDE_MAIL_URL="http://127.0.0.1:$WAYSIDE_MAIL_HTTP_PORT"
export WAYSIDE_WEBHOOK_URL="$WAYSIDE_TEST_URL/api/payments/webhook" NUXT_SITE_URL="$WAYSIDE_TEST_URL"
export NUXT_SESSION_PASSWORD="${NUXT_SESSION_PASSWORD:-wayside-test-session-password-0123456789abcdef}"
export NUXT_LOGIN_MAX_FAILURES=5 NUXT_LOGIN_MAX_FAILURES_PER_ADDRESS=500
export NUXT_UPLOADS_DIR="$DATA/test-uploads-$SLOT"
# Short mail timeouts and retry waits, so the stalled-mail-server test runs in seconds.
export NUXT_SMTP_CONNECTION_TIMEOUT_MS=2000 NUXT_SMTP_GREETING_TIMEOUT_MS=2000 NUXT_SMTP_SOCKET_TIMEOUT_MS=5000 NUXT_MAIL_RETRY_DELAY_SECONDS=1

ensure_node_modules
want e2e && ensure_chromium
want e2e && ensure_poppler
ensure_cluster_running
export NUXT_DATABASE_URL="postgres://wayside@127.0.0.1:$PGPORT/$TEST_DB"
export WAYSIDE_PG_BIN="$PGBIN"

# Each kind of test starts from the same freshly seeded database, so one kind's writes (the API
# tests' conflicts, say) never change what another kind sees.
fresh_database() {
  say "fresh test database $TEST_DB"
  recreate_database "$TEST_DB"
  (cd "$ROOT" && npx tsx server/db/migrate.ts && npx tsx server/db/seed/index.ts)
}
SERVER_PID=""
start_server() {
  [ -n "$SERVER_PID" ] && { kill "$SERVER_PID" 2>/dev/null || true; wait "$SERVER_PID" 2>/dev/null || true; }
  fresh_database
  rm -rf "$NUXT_UPLOADS_DIR"
  NITRO_HOST=127.0.0.1 NITRO_PORT="$WAYSIDE_TEST_PORT" node .output/server/index.mjs >> "$DATA/test-server-$SLOT.log" 2>&1 9>&- & SERVER_PID=$!
  CHILD_PIDS+=("$SERVER_PID")
  wait_for_http "$WAYSIDE_TEST_URL/login" || { tail -n 30 "$DATA/test-server-$SLOT.log"; die "the test server did not start"; }
}

cd "$ROOT"
failed=()
if want lint; then
  say "lint"
  # The lint config extends the one Nuxt generates into .nuxt/.
  [ -f .nuxt/eslint.config.mjs ] || npx nuxt prepare >/dev/null
  npx eslint . || failed+=(lint)
fi
if want typecheck; then
  say "type check"
  npx nuxt typecheck || failed+=(typecheck)
fi
if want unit; then
  say "unit tests"
  npx vitest run --project unit || failed+=(unit)
fi
# Several checkouts testing on one small machine (WAYSIDE_TEST_LOCK set to a shared folder) take
# turns for the heavy part, at most WAYSIDE_TEST_LOCK_SLOTS at a time (2 by default), so no run's
# browser waits are stretched by the others'.
take_turn() {
  [ -n "${WAYSIDE_TEST_LOCK:-}" ] || return 0
  mkdir -p "$WAYSIDE_TEST_LOCK"
  local n
  say "waiting for a turn to build and run the server tests ($WAYSIDE_TEST_LOCK)"
  # Waiters queue on one blocking gate first, so a run is not starved by others that poll at luckier moments.
  exec 8>"$WAYSIDE_TEST_LOCK/gate"
  flock 8
  while :; do
    for n in $(seq 1 "${WAYSIDE_TEST_LOCK_SLOTS:-2}"); do
      exec 9>"$WAYSIDE_TEST_LOCK/turn-$n"
      if flock -n 9; then exec 8>&-; say "turn $n taken"; return 0; fi
      exec 9>&-
    done
    sleep 1
  done
}
if want api || want e2e; then
  take_turn
  build_if_needed
  : > "$DATA/test-server-$SLOT.log"
  node --import tsx scripts/fakes/run.ts 9>&- & CHILD_PIDS+=($!)
fi
if want api; then
  start_server
  say "API tests"
  npx vitest run --project api ${APISPEC:-} || failed+=(api)
fi
if want e2e; then
  start_server
  say "browser tests"
  npx playwright test ${SPEC:-} || failed+=(e2e)
fi

if [ ${#failed[@]} -gt 0 ]; then
  say "FAILED: ${failed[*]}"
  exit 1
fi
say "all tests passed (${KINDS[*]})"
