#!/usr/bin/env bash
# Starts Kerfcast's local services, each detached with a pid file in .data/pids/ and a
# log in .data/logs/: a private MariaDB (127.0.0.1:$KERFCAST_DB_PORT, default 3307), the
# S3 fake (4569) and the SMTP capture (2525, captured mail as JSON on 8025). Running it
# again leaves live services alone. KERFCAST_DATA_DIR and KERFCAST_SERVICES: see
# lib/common.sh. Databases `kerfcast` and `kerfcast_test` and the
# user kerfcast are created here; that user may create and drop any database whose name
# starts with "kerfcast" (the migration test uses scratch databases). Its password is
# random per install, made on the first start into .data/db-password (mode 0600), where
# lib/env.ts, scripts/test.sh and the tests read it. An install made before that keeps
# its old password until KERFCAST_DB_PASSWORD_ROTATE=1 asks for a random one.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib/common.sh"
mkdir -p "$PIDS" "$LOGS" "$RUN" "$DATA/s3" "$DATA/mail" "$DATA/tmp"

# One start at a time: two terminals (or a test run beside `npm start`) must not both
# decide a service is down and start it twice. Every daemon is launched from a subshell
# that first closes fd 9 and every other inherited descriptor, then becomes the daemon: a service, or a shell
# waiting on it, that kept fd 9 would hold the lock for its whole life, and the next run
# would wait for it in vain.
# The same goes for any descriptor the caller left open (a CI runner's or a test wrapper's
# own `flock` lock): close_inherited_fds drops everything above stderr before the exec.
close_inherited_fds() {
  local fd
  for fd in /proc/$BASHPID/fd/*; do
    fd=${fd##*/}
    [[ $fd =~ ^[0-9]+$ ]] && ((fd > 2)) && eval "exec $fd>&-" 2>/dev/null
  done
  return 0
}
if command -v flock >/dev/null 2>&1; then
  exec 9>"$DATA/services.lock"
  flock -w 120 9 || die "another services-start.sh has held $DATA/services.lock for 120 s"
fi

MARIADB_LOG="$LOGS/mariadb.log"

# mariadb-install-db gives socket-authenticated admin rights to root and to the OS user
# that ran it, so whoever runs these scripts reaches the server through the socket.
DB_ADMIN_USER="$( [[ "$(id -u)" -eq 0 ]] && echo root || id -un)"
mariadb_root() { mariadb --no-defaults --protocol=socket --socket="$DB_SOCKET" -u"$DB_ADMIN_USER" "$@"; }

start_mariadb() {
  if pid_alive mariadb mariadbd; then
    return 0
  fi
  rm -f "$PIDS/mariadb.pid"
  # Debian puts mariadbd in /usr/sbin, which is not on every user's PATH.
  local mariadbd
  mariadbd="$(command -v mariadbd || true)"
  [[ -n "$mariadbd" ]] || [[ ! -x /usr/sbin/mariadbd ]] || mariadbd=/usr/sbin/mariadbd
  [[ -n "$mariadbd" ]] || die "mariadbd not found: run scripts/setup.sh (installs mariadb-server)"
  if port_open "$KERFCAST_DB_PORT"; then
    die "port $KERFCAST_DB_PORT is taken by another process; set KERFCAST_DB_PORT to a free port"
  fi
  if [[ ! -d "$DATA/mariadb/mysql" ]]; then
    log "initialising MariaDB data folder .data/mariadb"
    # Built in a side folder and moved into place only on success, so an interrupted
    # first run never leaves a half-made data folder that later runs would trust.
    rm -rf "$DATA/mariadb.init"
    # Root gets unix_socket auth only: nothing but the socket under .data/run reaches it.
    mariadb-install-db --no-defaults --datadir="$DATA/mariadb.init" --user="$(id -un)" \
      --auth-root-authentication-method=socket --skip-test-db \
      >>"$MARIADB_LOG" 2>&1 || { tail -n 25 "$MARIADB_LOG" >&2; die "mariadb-install-db failed"; }
    rm -rf "$DATA/mariadb"
    mv "$DATA/mariadb.init" "$DATA/mariadb"
  fi
  log "starting MariaDB on 127.0.0.1:$KERFCAST_DB_PORT"
  # --no-defaults keeps the system's /etc/mysql settings (datadir, socket) out of it;
  # --user is required by mariadbd when it runs as root and harmless otherwise.
  # A subshell that drops the lock and then becomes mariadbd, so $! is the server's pid.
  (
    close_inherited_fds
    exec setsid "$mariadbd" --no-defaults \
      --datadir="$DATA/mariadb" --socket="$DB_SOCKET" --pid-file="$PIDS/mariadb.pid" \
      --bind-address=127.0.0.1 --port="$KERFCAST_DB_PORT" --user="$(id -un)" \
      --log-error="$MARIADB_LOG" --tmpdir="$DATA/tmp" --skip-name-resolve \
      --default-time-zone=+00:00 --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
      --innodb-buffer-pool-size=128M --max-connections=200 \
      </dev/null >>"$MARIADB_LOG" 2>&1
  ) &
  local server=$! i
  for ((i = 0; i < 120; i++)); do
    if mariadb-admin --no-defaults --socket="$DB_SOCKET" -u"$DB_ADMIN_USER" ping >/dev/null 2>&1; then
      break
    fi
    kill -0 "$server" 2>/dev/null || break # exited early: bad option, locked data folder…
    sleep 0.5
  done
  if ! mariadb-admin --no-defaults --socket="$DB_SOCKET" -u"$DB_ADMIN_USER" ping >/dev/null 2>&1; then
    printf '[kerfcast] error: MariaDB did not start (no answer within 60 s, or it exited). Last log lines (%s):\n' "$MARIADB_LOG" >&2
    tail -n 25 "$MARIADB_LOG" >&2 || true
    exit 1
  fi
}

DB_PASSWORD_FILE="$DATA/db-password"
# Decided before MariaDB starts, which makes the data folder of a fresh install.
DB_FOLDER_EXISTED=0
[[ -d "$DATA/mariadb/mysql" ]] && DB_FOLDER_EXISTED=1

# db_password: prints the install's database password, making it on first use. Letters
# and digits only, so it needs no quoting in SQL or in a URL.
db_password() {
  if [[ ! -s "$DB_PASSWORD_FILE" || "${KERFCAST_DB_PASSWORD_ROTATE:-}" == 1 ]]; then
    local password
    if [[ ! -s "$DB_PASSWORD_FILE" && "$DB_FOLDER_EXISTED" == 1 && "${KERFCAST_DB_PASSWORD_ROTATE:-}" != 1 ]]; then
      # An install from before per-install passwords: other shells may still use the old one.
      password=kerfcast
      log "this install keeps its old database password; KERFCAST_DB_PASSWORD_ROTATE=1 gives it a random one" >&2
    else
      password="$(head -c 48 /dev/urandom | base64 | tr -dc 'A-Za-z0-9' | head -c 32)"
    fi
    (umask 077 && printf '%s\n' "$password" >"$DB_PASSWORD_FILE.tmp") && mv "$DB_PASSWORD_FILE.tmp" "$DB_PASSWORD_FILE"
  fi
  tr -dc 'A-Za-z0-9' <"$DB_PASSWORD_FILE"
}

prepare_databases() {
  local password
  password="$(db_password)"
  [[ -n "$password" ]] || die "$DB_PASSWORD_FILE holds no usable password (letters and digits); delete it to make a new one"
  # Idempotent: IF NOT EXISTS everywhere; the password is re-set so a changed one heals.
  mariadb_root <<SQL
CREATE DATABASE IF NOT EXISTS \`kerfcast\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE DATABASE IF NOT EXISTS \`kerfcast_test\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS 'kerfcast'@'127.0.0.1' IDENTIFIED BY '$password';
CREATE USER IF NOT EXISTS 'kerfcast'@'localhost' IDENTIFIED BY '$password';
ALTER USER 'kerfcast'@'127.0.0.1' IDENTIFIED BY '$password';
ALTER USER 'kerfcast'@'localhost' IDENTIFIED BY '$password';
GRANT ALL PRIVILEGES ON \`kerfcast%\`.* TO 'kerfcast'@'127.0.0.1';
GRANT ALL PRIVILEGES ON \`kerfcast%\`.* TO 'kerfcast'@'localhost';
FLUSH PRIVILEGES;
SQL
}

# start_node NAME SCRIPT PORT...: run scripts/SCRIPT under tsx, detached; the script
# writes its own pid file once listening, so the pid is the node process itself.
start_node() {
  local name="$1" script="$2"; shift 2
  local logfile="$LOGS/$name.log" port
  if pid_alive "$name" "$script"; then
    return 0
  fi
  rm -f "$PIDS/$name.pid"
  for port in "$@"; do
    if port_open "$port"; then
      die "port $port (for $name) is taken by another process; free it or change KERFCAST_*_PORT"
    fi
  done
  log "starting $name on 127.0.0.1:$*"
  (
    close_inherited_fds
    cd "$ROOT" || exit 1
    exec setsid node --import tsx "scripts/$script" </dev/null >>"$logfile" 2>&1
  ) &
  for port in "$@"; do
    wait_port "$name" "$port" "$logfile" 30
  done
  local i
  for ((i = 0; i < 40; i++)); do
    pid_alive "$name" "$script" && return 0
    sleep 0.25
  done
  die "$name answers but wrote no pid file ($PIDS/$name.pid); see $logfile"
}

up=()
if wanted mariadb; then
  start_mariadb
  prepare_databases
  up+=("MariaDB 127.0.0.1:$KERFCAST_DB_PORT")
fi
if wanted s3-fake; then
  start_node s3-fake s3-fake.ts "$KERFCAST_S3_PORT"
  up+=("S3 http://127.0.0.1:$KERFCAST_S3_PORT")
fi
if wanted smtp-fake; then
  start_node smtp-fake smtp-fake.ts "$KERFCAST_SMTP_PORT" "$KERFCAST_MAIL_HTTP_PORT"
  up+=("SMTP 127.0.0.1:$KERFCAST_SMTP_PORT" "mail http://127.0.0.1:$KERFCAST_MAIL_HTTP_PORT/messages")
fi
printf -v summary '%s, ' "${up[@]}"
log "services up: ${summary%, }"
