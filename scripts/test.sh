#!/usr/bin/env bash
# Command 2: the same set-up as the start command, then every test: type check, unit,
# integration (real MariaDB and Redis), end-to-end (Debian's Chromium through Playwright).
# Every stage runs even if an earlier one failed; the last line sums them up.
set -uo pipefail
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

bash scripts/bootstrap.sh || die "bootstrap failed"
bash scripts/services.sh start || die "services did not start"

ARTIFACTS="$ROOT/tests/artifacts"
rm -rf "$ARTIFACTS"
mkdir -p "$ARTIFACTS"
export AUTH_SECRET="${AUTH_SECRET:-test-only-secret-$(date +%s%N)}"
failed_stages=()

stage() { # name, command...
	local name="$1"
	shift
	log "── $name"
	if ! "$@"; then failed_stages+=("$name"); fi
}

type_check() {
	npx svelte-kit sync || return 1
	npx svelte-check --tsconfig ./tsconfig.json --fail-on-warnings --output machine >"$ARTIFACTS/svelte-check.txt" 2>&1
	local status=$?
	grep -E ' (ERROR|WARNING) ' "$ARTIFACTS/svelte-check.txt" | head -40
	tail -1 "$ARTIFACTS/svelte-check.txt"
	return $status
}
stage "type check" type_check

stage "unit" npx vitest run --project unit --reporter=default --reporter=json --outputFile.json="$ARTIFACTS/unit.json"

stage "build" npx vite build --logLevel error

stage "integration" npx vitest run --project integration --reporter=default --reporter=json --outputFile.json="$ARTIFACTS/integration.json"

export E2E_DATABASE_NAME=stillpoint_e2e
# The e2e app's own database, queue keys, storage and mailbox (as in playwright.config.ts), emptied,
# then the demo with its photo, so the workbench tests open the same item a demo user would.
prepare_e2e() {
	bash scripts/services.sh database "$E2E_DATABASE_NAME" --fresh &&
		{ redis-cli -p "$REDIS_PORT" --scan --pattern 'stillpoint_e2e:*' | xargs -r redis-cli -p "$REDIS_PORT" del >/dev/null; } &&
		rm -rf .data/e2e-storage .data/e2e-mailbox &&
		DATABASE_NAME="$E2E_DATABASE_NAME" npx tsx scripts/migrate.ts latest &&
		DATABASE_NAME="$E2E_DATABASE_NAME" STORAGE_DIR=.data/e2e-storage QUEUE_PREFIX=stillpoint_e2e \
			npx tsx scripts/seed.ts --with-photo >/dev/null
}
stage "end-to-end setup" prepare_e2e
stage "end-to-end" npx playwright test

node scripts/test-summary.mjs "$ARTIFACTS" "${failed_stages[@]}"
