#!/bin/sh
# docker/services.sh start|stop|status|restart [mariadb|redis]
#
# Project-local MariaDB and Redis on 127.0.0.1 for machines without a container
# engine (development, tests, CI). Installs Debian's packages when missing,
# keeps all data under the git-ignored .data/ at the repository root, and is
# idempotent: start on a running service is a no-op, a stale pid file (after a
# kill -9) is cleared, and a port held by some other program is named.
#
# Environment (defaults match src/lib/server/config.ts):
#   DB_PORT=3307 DB_USER=loftwise DB_PASS=loftwise_pw
#   DB_NAMES="loftwise loftwise_test loftwise_e2e loftwise_scratch"
#            (development; integration tests; browser tests; migration tests)
#   REDIS_PORT=6380 DATA_DIR=<repo>/.data WAIT_S=60
set -eu
HERE=$(cd "$(dirname "$0")" && pwd)
ROOT=$(cd "$HERE/.." && pwd)
DATA_DIR=${DATA_DIR:-$ROOT/.data}
DB_PORT=${DB_PORT:-3307} DB_USER=${DB_USER:-loftwise} DB_PASS=${DB_PASS:-loftwise_pw}
DB_NAMES=${DB_NAMES:-loftwise loftwise_test loftwise_e2e loftwise_scratch}
DB_BUFFER_POOL=${DB_BUFFER_POOL:-1G}
DB_FLUSH_AT_COMMIT=${DB_FLUSH_AT_COMMIT:-2}   # 1 = fsync per commit; 2 = once a second
REDIS_PORT=${REDIS_PORT:-6380} WAIT_S=${WAIT_S:-60}
MY_DIR=$DATA_DIR/mariadb RD_DIR=$DATA_DIR/redis RUN=$DATA_DIR/run LOG=$DATA_DIR/log
MY_SOCK=$RUN/mariadb.sock       # whole path must stay < 108 bytes (AF_UNIX)
MY_PID=$RUN/mariadb.pid MY_LOG=$LOG/mariadb.err RD_PID=$RUN/redis.pid RD_LOG=$LOG/redis.log
PATH=$PATH:/usr/sbin:/sbin
MY_USER=; [ "$(id -u)" = 0 ] && MY_USER=--user=root   # mariadbd refuses bare root
DETACH=; command -v setsid >/dev/null && DETACH=setsid  # own session: no ^C/SIGHUP from the caller

say() { echo "services: $*"; }
die() { echo "services: $*" >&2; exit 1; }
now() { date +%s; }

if [ ${#MY_SOCK} -ge 100 ]; then
  MY_SOCK=/tmp/loftwise-$(id -u)-$(printf '%s' "$DATA_DIR" | cksum | cut -d' ' -f1).sock
fi

# Install Debian's packages when a binary is missing (as root), or say what to install.
ensure_packages() {
  need= b=
  # Every program this script runs; a half-removed install (server without client) counts as missing.
  for b in mariadbd mariadb-install-db mariadb mariadb-admin; do
    command -v "$b" >/dev/null 2>&1 || { need="$need mariadb-server mariadb-client"; break; }
  done
  for b in redis-server redis-cli; do
    command -v "$b" >/dev/null 2>&1 || { need="$need redis-server redis-tools"; break; }
  done
  [ -z "$need" ] && return 0
  if [ "$(id -u)" != 0 ]; then
    die "missing Debian packages:$need — install them with: sudo apt-get install -y$need"
  fi
  say "installing Debian packages:$need"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -q >"$LOG/apt.log" 2>&1 || { tail -n 20 "$LOG/apt.log" >&2; die "apt-get update failed"; }
  # shellcheck disable=SC2086
  apt-get install -y -q $need >>"$LOG/apt.log" 2>&1 || { tail -n 20 "$LOG/apt.log" >&2; die "apt-get install$need failed"; }
}

live_pid() { # $1=pidfile $2=comm -> pid if alive and really that program
  [ -s "$1" ] || return 1
  p=$(tr -cd 0-9 <"$1")
  [ -n "$p" ] && kill -0 "$p" 2>/dev/null || return 1
  [ "$(ps -p "$p" -o comm= 2>/dev/null)" = "$2" ] && echo "$p"
}
# 0 when something accepts TCP connections on 127.0.0.1:$1
port_busy_sh() { bash -c "exec 3<>/dev/tcp/127.0.0.1/$1" 2>/dev/null; }
my_ping() { mariadb-admin --no-defaults --socket="$MY_SOCK" -uroot --connect-timeout=2 ping >/dev/null 2>&1; }
# redis-cli has no read timeout; a foreign listener on the port would hang it
rd_ping() { [ "$(timeout 3 redis-cli -h 127.0.0.1 -p "$REDIS_PORT" ping 2>/dev/null)" = PONG ]; }
# wait_pid PID CHECK: 0 when CHECK passes, 1 when PID is gone, 2 after WAIT_S
wait_pid() {
  t0=$(now)
  while kill -0 "$1" 2>/dev/null; do
    "$2" && return 0
    [ $(($(now) - t0)) -lt "$WAIT_S" ] || return 2
    sleep 0.1
  done
  return 1
}
ready() { # PID CHECK LOGFILE (PID = the server just launched)
  wait_pid "$1" "$2" && return 0
  tail -n 15 "$3" >&2 || true; return 1
}
already() { # PIDFILE COMM CHECK NAME: 0 if up; waits out one still starting
  p=$(live_pid "$1" "$2") || return 1
  wait_pid "$p" "$3" && { say "$4 already running (pid $p)"; return 0; }
  ! kill -0 "$p" 2>/dev/null || die "$4 pid $p is alive but not answering; run: $0 stop $4"
  return 1
}

start_mariadb() {
  already "$MY_PID" mariadbd my_ping mariadb || {
  port_busy_sh "$DB_PORT" && die "port $DB_PORT (DB_PORT) is taken by another program; free it or set DB_PORT"
  mkdir -p "$RUN" "$LOG"; rm -f "$MY_PID" "$MY_SOCK"   # stale after kill -9
  if [ ! -d "$MY_DIR/mysql" ]; then   # first run; temp dir + rename = no half-initialised datadir
    rm -rf "$MY_DIR.init"
    mariadb-install-db --no-defaults $MY_USER --datadir="$MY_DIR.init" \
      --auth-root-authentication-method=normal --skip-test-db >"$LOG/mariadb-install.log" 2>&1 \
      || { cat "$LOG/mariadb-install.log" >&2; die "mariadb-install-db failed"; }
    mv "$MY_DIR.init" "$MY_DIR"
  fi
  # --no-defaults (must be first): ignore /etc/mysql; that also drops utf8mb4, so set it here
  $DETACH mariadbd --no-defaults $MY_USER --datadir="$MY_DIR" --bind-address=127.0.0.1 \
    --port="$DB_PORT" --socket="$MY_SOCK" --pid-file="$MY_PID" --log-error="$MY_LOG" \
    --skip-name-resolve --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
    --innodb-buffer-pool-size="$DB_BUFFER_POOL" --innodb-flush-log-at-trx-commit="$DB_FLUSH_AT_COMMIT" \
    --max-allowed-packet=64M --max-connections=300 </dev/null >>"$MY_LOG" 2>&1 &
  ready $! my_ping "$MY_LOG" || die "mariadb not ready on port $DB_PORT (see $MY_LOG)"
  }
  U="'$DB_USER'@'localhost' IDENTIFIED BY '$DB_PASS', '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASS'"
  sql="CREATE USER IF NOT EXISTS $U; ALTER USER $U;"
  for db in $DB_NAMES; do
    sql="$sql CREATE DATABASE IF NOT EXISTS \`$db\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;"
    sql="$sql GRANT ALL ON \`$db\`.* TO '$DB_USER'@'localhost', '$DB_USER'@'127.0.0.1';"
  done
  echo "$sql" | mariadb --no-defaults --socket="$MY_SOCK" -uroot
  say "mariadb ready on 127.0.0.1:$DB_PORT (pid $(live_pid "$MY_PID" mariadbd); databases: $DB_NAMES)"
}

start_redis() {
  already "$RD_PID" redis-server rd_ping redis && return 0
  port_busy_sh "$REDIS_PORT" && die "port $REDIS_PORT (REDIS_PORT) is taken by another program; free it or set REDIS_PORT"
  mkdir -p "$RD_DIR" "$RUN" "$LOG"; rm -f "$RD_PID"
  # no config file; AOF only (save "" = no RDB fork); foreground so $! is the server
  $DETACH redis-server --bind 127.0.0.1 --port "$REDIS_PORT" --dir "$RD_DIR" \
    --appendonly yes --appendfsync everysec --save "" --maxmemory-policy noeviction \
    --daemonize no --pidfile "$RD_PID" --logfile "$RD_LOG" </dev/null >>"$LOG/redis.out" 2>&1 &
  ready $! rd_ping "$RD_LOG" || die "redis not ready on port $REDIS_PORT (see $RD_LOG)"
  say "redis ready on 127.0.0.1:$REDIS_PORT (pid $(live_pid "$RD_PID" redis-server))"
}

stop_one() { # NAME PIDFILE COMM SHUTDOWN-CMD...
  n=$1 f=$2 c=$3; shift 3
  if p=$(live_pid "$f" "$c"); then
    "$@" >/dev/null 2>&1 || kill -TERM "$p"
    r=0; wait_pid "$p" false || r=$?; [ $r -eq 1 ] || die "$n pid $p did not stop"
    say "$n stopped (was pid $p)"
  else say "$n not running"; fi
}
stop_mariadb() {
  stop_one mariadb "$MY_PID" mariadbd mariadb-admin --no-defaults --socket="$MY_SOCK" -uroot shutdown
  rm -f "$MY_PID" "$MY_SOCK"
}
stop_redis() { # SIGTERM = a clean SHUTDOWN (AOF fsynced); aimed by pid, so a wrong REDIS_PORT can't stop another server
  p=$(live_pid "$RD_PID" redis-server) || true
  stop_one redis "$RD_PID" redis-server kill -TERM "${p:-0}"
  rm -f "$RD_PID"
}

status() {
  rc=0
  if p=$(live_pid "$MY_PID" mariadbd) && my_ping; then say "mariadb up pid $p 127.0.0.1:$DB_PORT"; else say "mariadb down"; rc=1; fi
  if p=$(live_pid "$RD_PID" redis-server) && rd_ping; then say "redis up pid $p 127.0.0.1:$REDIS_PORT"; else say "redis down"; rc=1; fi
  return $rc
}

what=${2:-all}
case $what in all|mariadb|redis) ;; *) die "unknown service: $what (mariadb or redis)" ;; esac
want() { [ "$what" = all ] || [ "$what" = "$1" ]; }
mkdir -p "$LOG"
case ${1:-} in
  start)   ensure_packages; want mariadb && start_mariadb; want redis && start_redis; : ;;
  stop)    want redis && stop_redis; want mariadb && stop_mariadb; : ;;
  restart) ensure_packages; want redis && stop_redis; want mariadb && stop_mariadb
           want mariadb && start_mariadb; want redis && start_redis; : ;;
  status)  status ;;
  *) echo "usage: $0 start|stop|status|restart [mariadb|redis]" >&2; exit 2 ;;
esac
