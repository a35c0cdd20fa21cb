# Shared settings for the project's scripts: sourced, not run.
# Everything lives under the checkout's .data/ and listens on loopback only.
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
DATA_DIR="${STILLPOINT_DATA_DIR:-$ROOT/.data}"
RUN_DIR="$DATA_DIR/run"
export DATABASE_HOST="${DATABASE_HOST:-127.0.0.1}"
export DATABASE_PORT="${DATABASE_PORT:-3407}"
export DATABASE_USER="${DATABASE_USER:-stillpoint}"
export DATABASE_PASSWORD="${DATABASE_PASSWORD:-stillpoint}"
REDIS_PORT="${REDIS_PORT:-6391}"
export REDIS_URL="${REDIS_URL:-redis://127.0.0.1:$REDIS_PORT/0}"

log() { printf '\033[1;34m[stillpoint]\033[0m %s\n' "$*"; }
die() { printf '\033[1;31m[stillpoint] %s\033[0m\n' "$*" >&2; exit 1; }
