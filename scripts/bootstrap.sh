#!/usr/bin/env bash
# Install what a fresh Debian 12 machine lacks: the Debian packages the services and browser tests
# need, then the npm dependencies from the lock file. Safe to run any number of times.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

# command → Debian package that provides it
declare -A NEEDED=(
	[mariadbd]=mariadb-server
	[mariadb]=mariadb-client
	[redis-server]=redis-server
	[chromium]=chromium
	[pdftotext]=poppler-utils
)
missing=()
for cmd in "${!NEEDED[@]}"; do
	if ! command -v "$cmd" >/dev/null 2>&1 && [ ! -x "/usr/sbin/$cmd" ]; then
		missing+=("${NEEDED[$cmd]}")
	fi
done
# The demo photo and the benchmark scenes are SVG drawn with the DejaVu faces.
[ -f /usr/share/fonts/truetype/dejavu/DejaVuSans.ttf ] || missing+=(fonts-dejavu-core)
if [ ${#missing[@]} -gt 0 ]; then
	[ "$(id -u)" -eq 0 ] || die "missing Debian packages (${missing[*]}); run as root or install them"
	log "installing Debian packages: ${missing[*]}"
	export DEBIAN_FRONTEND=noninteractive
	apt-get update -qq
	apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
	# The packaged services start system-wide instances; Stillpoint runs its own private ones.
	for svc in mariadb redis-server; do
		service "$svc" stop >/dev/null 2>&1 || true
	done
fi

# npm ci only when the lock file changed since the last install.
stamp="node_modules/.stillpoint-lock.sha256"
want="$(sha256sum package-lock.json | cut -d' ' -f1)"
if [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$want" ]; then
	log "installing npm dependencies (npm ci)"
	# The font packages' install hook would start a usage-reporting process in CI; a lab's build
	# phones nobody (the switch is the reporter's own documented opt-out).
	export IBM_TELEMETRY_DISABLED=true
	npm ci --no-audit --no-fund --loglevel=error
	echo "$want" >"$stamp"
fi
