#!/usr/bin/env bash
# npm run dev: the same database and fakes as npm start, with Nuxt's hot-reloading dev server.
source "$(dirname "$0")/lib.sh"
trap 'cleanup_children' EXIT
trap 'exit 130' INT TERM
ensure_node_modules
ensure_cluster_running
ensure_database wayside
export NUXT_DATABASE_URL="postgres://wayside@127.0.0.1:$PGPORT/wayside"
(cd "$ROOT" && npx tsx server/db/migrate.ts && npx tsx server/db/seed/index.ts)
ensure_session_password
export WAYSIDE_WEBHOOK_URL="http://127.0.0.1:3000/api/payments/webhook" WAYSIDE_MAIL_DIR="$DATA/mail"
(cd "$ROOT" && exec node --import tsx scripts/fakes/run.ts) & CHILD_PIDS+=($!)
cd "$ROOT" && npx nuxt dev --host 127.0.0.1 --port 3000
