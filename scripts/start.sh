#!/usr/bin/env bash
# npm start: set up everything on this machine, then serve Wayside on 127.0.0.1:3000.
source "$(dirname "$0")/lib.sh"
trap 'cleanup_children; stop_cluster_if_ours' EXIT
trap 'exit 130' INT TERM

STARTED_PG=""
stop_cluster_if_ours() { [ -n "$STARTED_PG" ] && pg_run "$PGBIN/pg_ctl" -D "$PGDATA_DIR" -m fast stop >/dev/null 2>&1 || true; }

ensure_node_modules
ensure_postgres_installed
choose_cluster_dir
pg_ready || STARTED_PG=1
ensure_cluster_running
ensure_database wayside
export NUXT_DATABASE_URL="postgres://wayside@127.0.0.1:$PGPORT/wayside"
(cd "$ROOT" && npx tsx server/db/migrate.ts && npx tsx server/db/seed/index.ts)
build_if_needed
ensure_session_password

APP_PORT="${PORT:-3000}"
export NUXT_SMTP_PORT="${NUXT_SMTP_PORT:-2525}" WAYSIDE_SMTP_PORT="${NUXT_SMTP_PORT:-2525}" WAYSIDE_MAIL_HTTP_PORT="${WAYSIDE_MAIL_HTTP_PORT:-2580}"
export NUXT_STRIPE_API_PORT="${NUXT_STRIPE_API_PORT:-12111}" WAYSIDE_PAY_PORT="${NUXT_STRIPE_API_PORT:-12111}"
export WAYSIDE_WEBHOOK_URL="http://127.0.0.1:$APP_PORT/api/payments/webhook" WAYSIDE_MAIL_DIR="$DATA/mail"
export NUXT_SITE_URL="${NUXT_SITE_URL:-http://127.0.0.1:$APP_PORT}"
# WAYSIDE_S3=1 keeps photos in a local S3-compatible fake (the path several servers take) instead of .data/uploads.
if [ "${WAYSIDE_S3:-}" = 1 ]; then
  export WAYSIDE_S3_PORT="${WAYSIDE_S3_PORT:-4568}" WAYSIDE_S3_DIR="$DATA/s3"
  export NUXT_UPLOADS_S3_ENDPOINT="http://127.0.0.1:$WAYSIDE_S3_PORT" NUXT_UPLOADS_S3_BUCKET="${NUXT_UPLOADS_S3_BUCKET:-wayside-photos}"
  export NUXT_UPLOADS_S3_ACCESS_KEY_ID=S3RVER NUXT_UPLOADS_S3_SECRET_ACCESS_KEY=S3RVER
fi

(cd "$ROOT" && exec node --import tsx scripts/fakes/run.ts) & CHILD_PIDS+=($!)
(cd "$ROOT" && HOST=127.0.0.1 PORT="$APP_PORT" NITRO_HOST=127.0.0.1 NITRO_PORT="$APP_PORT" exec node .output/server/index.mjs) & CHILD_PIDS+=($!)
wait_for_http "http://127.0.0.1:$APP_PORT/login" || die "the app did not answer on port $APP_PORT"

cat <<MSG

  Wayside is running at http://127.0.0.1:$APP_PORT

  Demo sign-ins (password: wayside-demo)
    admin@wayside.test      admin: people, rates, test cards
    dispatch@wayside.test   dispatcher: take calls, assign mechanics
    office@wayside.test     office: billing
    mech1@wayside.test      mechanic (phone screens)
    mech2@wayside.test      mechanic (phone screens)

  Mail sent by the app is caught locally: http://127.0.0.1:$WAYSIDE_MAIL_HTTP_PORT/messages
  Photos are kept in: ${NUXT_UPLOADS_S3_ENDPOINT:+the local object store $NUXT_UPLOADS_S3_ENDPOINT, bucket }${NUXT_UPLOADS_S3_BUCKET:-.data/uploads}
  Press Ctrl-C to stop.

MSG
wait -n "${CHILD_PIDS[@]}" || true
