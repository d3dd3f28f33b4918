# Shared helpers for the service scripts: paths under .data/, pid-file checks, port waits.
# Sourced, not run. Every service writes its pid to .data/pids/<name>.pid; a pid only
# counts as "ours" when the process is alive and its command line names the service,
# so a stale file left after a reboot (pid reused by something else) is replaced.
# KERFCAST_DATA_DIR moves the whole state folder (pids, logs, lock, data) elsewhere and
# KERFCAST_SERVICES picks which services to start or stop, so a second, separate set
# can run beside the usual one (the script test does this in a scratch folder).

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
DATA="${KERFCAST_DATA_DIR:-$ROOT/.data}"
# Absolute, because the fakes are started from $ROOT and read it from the environment.
[[ "$DATA" == /* ]] || DATA="$PWD/$DATA"
export KERFCAST_DATA_DIR="$DATA"
PIDS="$DATA/pids"
LOGS="$DATA/logs"
RUN="$DATA/run"

KERFCAST_DB_PORT="${KERFCAST_DB_PORT:-3307}"
KERFCAST_S3_PORT="${KERFCAST_S3_PORT:-4569}"
KERFCAST_SMTP_PORT="${KERFCAST_SMTP_PORT:-2525}"
KERFCAST_MAIL_HTTP_PORT="${KERFCAST_MAIL_HTTP_PORT:-8025}"
export KERFCAST_DB_PORT KERFCAST_S3_PORT KERFCAST_SMTP_PORT KERFCAST_MAIL_HTTP_PORT

DB_SOCKET="$RUN/mariadb.sock"

KERFCAST_SERVICES="${KERFCAST_SERVICES:-mariadb s3-fake smtp-fake}"
for _service in $KERFCAST_SERVICES; do
  case "$_service" in
    mariadb | s3-fake | smtp-fake) ;;
    *) printf '[kerfcast] error: KERFCAST_SERVICES names "%s"; known: mariadb s3-fake smtp-fake\n' "$_service" >&2; exit 2 ;;
  esac
done
unset _service

# wanted NAME: true when NAME is one of the services this run should start or stop.
wanted() { [[ " $KERFCAST_SERVICES " == *" $1 "* ]]; }

log() { printf '[kerfcast] %s\n' "$*"; }
die() { printf '[kerfcast] error: %s\n' "$*" >&2; exit 1; }

# pid_alive NAME PATTERN: true when .data/pids/NAME.pid holds a live process whose
# command line contains PATTERN.
pid_alive() {
  local file="$PIDS/$1.pid" pid
  [[ -s "$file" ]] || return 1
  pid="$(tr -dc '0-9' <"$file")"
  [[ -n "$pid" ]] || return 1
  kill -0 "$pid" 2>/dev/null || return 1
  tr '\0' ' ' <"/proc/$pid/cmdline" 2>/dev/null | grep -q -- "$2"
}

pid_of() { tr -dc '0-9' <"$PIDS/$1.pid"; }

port_open() { (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }

# wait_port NAME PORT LOG [SECONDS]: wait until 127.0.0.1:PORT accepts connections.
wait_port() {
  local name="$1" port="$2" logfile="$3" limit="${4:-30}" i
  for ((i = 0; i < limit * 4; i++)); do
    port_open "$port" && return 0
    sleep 0.25
  done
  printf '[kerfcast] error: %s did not answer on 127.0.0.1:%s within %ss. Last log lines (%s):\n' \
    "$name" "$port" "$limit" "$logfile" >&2
  tail -n 25 "$logfile" >&2 2>/dev/null || true
  exit 1
}
