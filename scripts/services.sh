#!/usr/bin/env bash
# Start, stop or report Stillpoint's private MariaDB and Redis (loopback, own ports, data under
# .data/). `start` is idempotent: services that already answer are left alone.
#   scripts/services.sh start|stop|status
set -euo pipefail
source "$(dirname "$0")/lib.sh"

MARIADB_DIR="$DATA_DIR/mariadb"
REDIS_DIR="$DATA_DIR/redis"
SOCK="$RUN_DIR/mariadb.sock"
mariadbd_bin="$(command -v mariadbd || echo /usr/sbin/mariadbd)"

mariadb_up() { mariadb --no-defaults -S "$SOCK" -uroot -e 'select 1' >/dev/null 2>&1; }
redis_up() { redis-cli -h 127.0.0.1 -p "$REDIS_PORT" ping 2>/dev/null | grep -q PONG; }

wait_for() { # name, check function, seconds
	local i
	for ((i = 0; i < $3 * 10; i++)); do
		"$2" && return 0
		sleep 0.1
	done
	die "$1 did not answer within $3 s (see $RUN_DIR)"
}

start_mariadb() {
	if mariadb_up; then log "MariaDB already running on 127.0.0.1:$DATABASE_PORT"; return; fi
	mkdir -p "$MARIADB_DIR" "$RUN_DIR"
	if [ ! -d "$MARIADB_DIR/mysql" ]; then
		log "initialising MariaDB data directory"
		mariadb-install-db --no-defaults --user="$(id -un)" --datadir="$MARIADB_DIR" \
			--auth-root-authentication-method=normal --skip-test-db --skip-name-resolve \
			>"$RUN_DIR/mariadb-install.log" 2>&1 || die "mariadb-install-db failed: see $RUN_DIR/mariadb-install.log"
	fi
	"$mariadbd_bin" --no-defaults --user="$(id -un)" --datadir="$MARIADB_DIR" --socket="$SOCK" \
		--pid-file="$RUN_DIR/mariadb.pid" --log-error="$RUN_DIR/mariadb.err" \
		--port="$DATABASE_PORT" --bind-address=127.0.0.1 --skip-networking=0 --skip-name-resolve \
		--character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
		--default-time-zone=+00:00 --innodb-flush-log-at-trx-commit=2 \
		>/dev/null 2>&1 &
	wait_for MariaDB mariadb_up 30
	mariadb --no-defaults -S "$SOCK" -uroot <<SQL
CREATE USER IF NOT EXISTS '$DATABASE_USER'@'127.0.0.1' IDENTIFIED BY '$DATABASE_PASSWORD';
GRANT ALL PRIVILEGES ON *.* TO '$DATABASE_USER'@'127.0.0.1';
SQL
	log "MariaDB running on 127.0.0.1:$DATABASE_PORT (data in $MARIADB_DIR)"
}

start_redis() {
	if redis_up; then log "Redis already running on 127.0.0.1:$REDIS_PORT"; return; fi
	mkdir -p "$REDIS_DIR" "$RUN_DIR"
	redis-server --port "$REDIS_PORT" --bind 127.0.0.1 --save '' --appendonly no --dir "$REDIS_DIR" \
		--pidfile "$RUN_DIR/redis.pid" --logfile "$RUN_DIR/redis.log" --daemonize yes >/dev/null
	wait_for Redis redis_up 10
	log "Redis running on 127.0.0.1:$REDIS_PORT (no persistence)"
}

stop_all() {
	if redis_up; then redis-cli -h 127.0.0.1 -p "$REDIS_PORT" shutdown nosave >/dev/null 2>&1 || true; log "Redis stopped"; fi
	if mariadb_up; then
		mariadb-admin --no-defaults -S "$SOCK" -uroot shutdown >/dev/null 2>&1 || true
		log "MariaDB stopped"
	fi
}

# Create (or recreate with --fresh) a database for the app or a test suite.
ensure_database() { # name [--fresh]
	[[ "$1" =~ ^[a-z0-9_]+$ ]] || die "bad database name: $1"
	if [ "${2:-}" = "--fresh" ]; then
		mariadb --no-defaults -S "$SOCK" -uroot -e "DROP DATABASE IF EXISTS \`$1\`"
	fi
	mariadb --no-defaults -S "$SOCK" -uroot -e \
		"CREATE DATABASE IF NOT EXISTS \`$1\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci"
}

case "${1:-}" in
	start) start_mariadb; start_redis ;;
	stop) stop_all ;;
	status)
		mariadb_up && echo "mariadb: up (127.0.0.1:$DATABASE_PORT)" || echo "mariadb: down"
		redis_up && echo "redis: up (127.0.0.1:$REDIS_PORT)" || echo "redis: down"
		;;
	database) ensure_database "${2:?database name}" "${3:-}" ;;
	*) die "usage: scripts/services.sh start|stop|status|database NAME [--fresh]" ;;
esac
