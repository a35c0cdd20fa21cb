#!/usr/bin/env bash
# Command 1: install what is missing, start the private services, migrate, load the demo, build,
# and serve the web app and the worker. Ctrl-C stops the app and worker; the services keep
# running (stop them with scripts/services.sh stop).
set -euo pipefail
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

export PORT="${PORT:-3000}"
export HOST="${HOST:-127.0.0.1}"
export ORIGIN="${ORIGIN:-http://$HOST:$PORT}"
export DATABASE_NAME="${DATABASE_NAME:-stillpoint}"
export NODE_ENV=production
# Uploads of originals up to UPLOAD_MAX_BYTES (200 MiB) must get past adapter-node's body limit.
export BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-210M}"
# The demo's mail goes to the local fake SMTP server; read it at /dev/mailbox.
export DEV_MAILBOX_DIR="${DEV_MAILBOX_DIR:-$DATA_DIR/mailbox}"

bash scripts/bootstrap.sh
bash scripts/services.sh start
bash scripts/services.sh database "$DATABASE_NAME"

# One random session secret per checkout, kept with the private data.
mkdir -p "$DATA_DIR"
[ -s "$DATA_DIR/auth-secret" ] || node -e "console.log(require('crypto').randomBytes(32).toString('base64url'))" >"$DATA_DIR/auth-secret"
export AUTH_SECRET="${AUTH_SECRET:-$(cat "$DATA_DIR/auth-secret")}"

npx tsx scripts/migrate.ts latest
seed_report="$(npx tsx scripts/seed.ts --with-photo)"
echo "$seed_report"
log "building the web app"
npx vite build --logLevel error

pids=()
cleanup() {
	trap - INT TERM EXIT
	for pid in "${pids[@]}"; do kill "$pid" 2>/dev/null || true; done
	wait 2>/dev/null || true
}
trap cleanup INT TERM EXIT

npx tsx scripts/fake-smtp.ts &
pids+=($!)
npx tsx workers/index.ts &
pids+=($!)
node build &
pids+=($!)
# Once the worker has restored the demo photo, review and release it for the demo client.
npx tsx scripts/demo-release.ts &

for _ in $(seq 1 100); do
	curl -fsS -o /dev/null "$ORIGIN/signin" 2>/dev/null && break
	sleep 0.1
done
echo "$seed_report" | tail -n +2
log "Stillpoint is running at $ORIGIN  (Ctrl-C to stop)"
wait -n "${pids[@]}"
