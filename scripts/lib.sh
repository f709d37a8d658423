# Shared shell helpers for Kitwright's scripts: install what is missing, start and stop the private
# MariaDB, Redis and SMTP fake. Sourced by demo.sh, test.sh and stop.sh; not run on its own.
# Every service binds to 127.0.0.1 and keeps its files under $KW_STATE (data) and $KW_RUN (sockets, pids, logs).

set -euo pipefail
KW_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"

log() { printf '\033[1m[kitwright]\033[0m %s\n' "$*" >&2; }

ensure_apt_packages() {
  local missing=()
  command -v mariadbd >/dev/null 2>&1 || [ -x /usr/sbin/mariadbd ] || missing+=(mariadb-server)
  command -v redis-server >/dev/null 2>&1 || missing+=(redis-server)
  command -v curl >/dev/null 2>&1 || missing+=(curl)
  if [ "${KW_NEED_BROWSER:-0}" = 1 ]; then command -v chromium >/dev/null 2>&1 || missing+=(chromium); fi
  if [ "${KW_NEED_SOX:-0}" = 1 ]; then command -v sox >/dev/null 2>&1 || missing+=(sox); fi
  if [ ${#missing[@]} -gt 0 ]; then
    log "installing Debian packages: ${missing[*]}"
    local SUDO=""; [ "$(id -u)" = 0 ] || SUDO="sudo"
    $SUDO apt-get update -qq
    DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
  fi
}

ensure_node_modules() {
  cd "$KW_ROOT"
  if [ ! -d node_modules ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    log "installing npm packages (npm ci)"
    npm ci --no-audit --no-fund >/dev/null
  fi
}

# start_mariadb STATE_DIR RUN_DIR PORT
# (InnoDB's buffer pool: KW_DB_BUFFER_POOL, 1G by default. A library of 100,000 samples is about 600 MB of rows and
# indexes; with the server's 128 MB default every search and deep page read from disk. Pages are taken as used.)
start_mariadb() {
  local data="$1/mariadb" run="$2" port="$3"
  mkdir -p "$run"
  if [ ! -d "$data/mysql" ]; then
    mkdir -p "$data"
    log "creating MariaDB data folder $data"
    mariadb-install-db --no-defaults --datadir="$data" --user=root --auth-root-authentication-method=normal \
      --skip-test-db >"$run/mariadb-install.log" 2>&1
  fi
  if mariadb-admin --no-defaults --socket="$run/mariadb.sock" ping >/dev/null 2>&1; then return 0; fi
  /usr/sbin/mariadbd --no-defaults --datadir="$data" --user=root --socket="$run/mariadb.sock" \
    --pid-file="$run/mariadb.pid" --port="$port" --bind-address=127.0.0.1 --skip-name-resolve \
    --log-error="$run/mariadb.log" --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
    --innodb-buffer-pool-size="${KW_DB_BUFFER_POOL:-1G}" --max-connections=300 >/dev/null 2>&1 &
  for _ in $(seq 1 200); do
    mariadb-admin --no-defaults --socket="$run/mariadb.sock" ping >/dev/null 2>&1 && break
    sleep 0.1
  done
  mariadb-admin --no-defaults --socket="$run/mariadb.sock" ping >/dev/null 2>&1 || { log "MariaDB did not start; see $run/mariadb.log"; tail -20 "$run/mariadb.log" >&2; return 1; }
  # root over TCP from loopback with the password from the environment
  mariadb --no-defaults --socket="$run/mariadb.sock" -uroot -e \
    "CREATE USER IF NOT EXISTS 'kitwright'@'127.0.0.1' IDENTIFIED BY '${KW_DB_PASSWORD}'; GRANT ALL ON *.* TO 'kitwright'@'127.0.0.1'; FLUSH PRIVILEGES;"
}

# create_database RUN_DIR NAME [fresh]
create_database() {
  local run="$1" name="$2" fresh="${3:-}"
  if [ "$fresh" = fresh ]; then
    mariadb --no-defaults --socket="$run/mariadb.sock" -uroot -e "DROP DATABASE IF EXISTS \`$name\`"
  fi
  mariadb --no-defaults --socket="$run/mariadb.sock" -uroot -e \
    "CREATE DATABASE IF NOT EXISTS \`$name\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci"
}

stop_mariadb() {
  local run="$1"
  if [ -S "$run/mariadb.sock" ]; then
    mariadb-admin --no-defaults --socket="$run/mariadb.sock" -uroot shutdown >/dev/null 2>&1 || true
  fi
}

# start_redis STATE_DIR RUN_DIR PORT
start_redis() {
  local data="$1/redis" run="$2" port="$3"
  mkdir -p "$data" "$run"
  if redis-cli -h 127.0.0.1 -p "$port" ping >/dev/null 2>&1; then return 0; fi
  redis-server --bind 127.0.0.1 --port "$port" --dir "$data" --pidfile "$run/redis.pid" \
    --logfile "$run/redis.log" --daemonize yes --appendonly yes --save "" >/dev/null
  for _ in $(seq 1 100); do redis-cli -h 127.0.0.1 -p "$port" ping >/dev/null 2>&1 && return 0; sleep 0.05; done
  log "Redis did not start; see $run/redis.log"; return 1
}

stop_redis() {
  local run="$1" port="$2"
  redis-cli -h 127.0.0.1 -p "$port" shutdown nosave >/dev/null 2>&1 || true
}

# start_smtp_fake STATE_DIR RUN_DIR PORT
start_smtp_fake() {
  local dir="$1/mail" run="$2" port="$3"
  mkdir -p "$dir" "$run"
  if [ -f "$run/smtp.pid" ] && kill -0 "$(cat "$run/smtp.pid")" 2>/dev/null; then return 0; fi
  cd "$KW_ROOT"
  nohup node --import tsx scripts/smtp-fake.ts --port "$port" --dir "$dir" \
    >"$run/smtp.log" 2>&1 </dev/null &
  echo $! >"$run/smtp.pid"
  for _ in $(seq 1 100); do (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null && return 0; sleep 0.1; done
  log "SMTP fake did not start; see $run/smtp.log"; return 1
}

stop_pidfile() {
  local f="$1"
  if [ -f "$f" ]; then
    local pid; pid="$(cat "$f")"
    if kill -0 "$pid" 2>/dev/null; then
      kill "$pid" 2>/dev/null || true
      for _ in $(seq 1 50); do kill -0 "$pid" 2>/dev/null || break; sleep 0.1; done
      kill -9 "$pid" 2>/dev/null || true
    fi
    rm -f "$f"
  fi
}
