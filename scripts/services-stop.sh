#!/usr/bin/env bash
# Stops the local services started by scripts/services-start.sh: exactly the processes
# named in .data/pids/*.pid (and only if the pid still belongs to that service).
# KERFCAST_DATA_DIR and KERFCAST_SERVICES: see lib/common.sh.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib/common.sh"

stop_one() {
  local name="$1" pattern="$2" pid i
  if ! pid_alive "$name" "$pattern"; then
    [[ -e "$PIDS/$name.pid" ]] && { log "$name: stale pid file removed"; rm -f "$PIDS/$name.pid"; }
    return 0
  fi
  pid="$(pid_of "$name")"
  log "stopping $name (pid $pid)"
  kill -TERM "$pid"
  # MariaDB flushes InnoDB on TERM; give it time before reporting.
  for ((i = 0; i < 120; i++)); do
    kill -0 "$pid" 2>/dev/null || { rm -f "$PIDS/$name.pid"; return 0; }
    sleep 0.5
  done
  die "$name (pid $pid) did not exit within 60 s; it is still running"
}

! wanted smtp-fake || stop_one smtp-fake smtp-fake.ts
! wanted s3-fake || stop_one s3-fake s3-fake.ts
! wanted mariadb || stop_one mariadb mariadbd
