#!/usr/bin/env bash
# Installs what a fresh machine lacks, and stays quiet when nothing is missing:
# Debian's mariadb-server (the private database) and chromium (browser tests), then the
# npm packages when node_modules is absent or older than package-lock.json.
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"

missing=()
command -v mariadbd >/dev/null 2>&1 || [[ -x /usr/sbin/mariadbd ]] || missing+=(mariadb-server)
# mariadb-server pulls in the client, but a half-installed machine may have only one.
command -v mariadb >/dev/null 2>&1 || missing+=(mariadb-client)
command -v chromium >/dev/null 2>&1 || [[ -x /usr/bin/chromium ]] || missing+=(chromium)

if ((${#missing[@]} > 0)); then
  sudo=()
  if [[ "$(id -u)" -ne 0 ]]; then
    command -v sudo >/dev/null 2>&1 || { echo "[kerfcast] error: need root or sudo to install: ${missing[*]}" >&2; exit 1; }
    sudo=(sudo)
  fi
  echo "[kerfcast] installing Debian packages: ${missing[*]}"
  "${sudo[@]}" env DEBIAN_FRONTEND=noninteractive apt-get update -qq
  "${sudo[@]}" env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "${missing[@]}"
  # The Debian package starts a system-wide server on 3306; Kerfcast runs its own on
  # 127.0.0.1:${KERFCAST_DB_PORT:-3307}, so the system one is not needed by us.
fi

cd "$ROOT"
# npm writes node_modules/.package-lock.json after package-lock.json on every install,
# so a lock newer than it means the installed tree is out of date.
if [[ ! -e node_modules/.package-lock.json ]] || [[ package-lock.json -nt node_modules/.package-lock.json ]]; then
  echo "[kerfcast] installing npm packages (npm ci)"
  npm ci --no-audit --no-fund
fi
