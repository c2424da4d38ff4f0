#!/usr/bin/env bash
# First step of `npm start`, `npm run dev` and `npm test`. It is a shell script, not TypeScript, because it
# runs before node_modules (and so tsx) exists: it installs the Debian packages and npm packages that are
# missing, then hands over to the TypeScript launcher of the same name.
set -euo pipefail
cd "$(dirname "$0")/../.."
mode="${1:?usage: bootstrap.sh start|dev|test [args]}"
shift

apt_wanted=()
[ -x /usr/sbin/mariadbd ] || command -v mariadbd >/dev/null 2>&1 || apt_wanted+=(mariadb-server)
command -v mariadb-install-db >/dev/null 2>&1 || [ -x /usr/bin/mariadb-install-db ] || apt_wanted+=(mariadb-server)
# campaign queues (analyze campaign --queue, analyze-worker) run on a private Redis
[ -x /usr/bin/redis-server ] || apt_wanted+=(redis-server)
if [ "$mode" = test ]; then
  [ -x /usr/bin/chromium ] || apt_wanted+=(chromium)
  # the report test renders the PDF with pdftoppm and reads its text with pdftotext
  command -v pdftoppm >/dev/null 2>&1 || apt_wanted+=(poppler-utils)
fi
if [ ${#apt_wanted[@]} -gt 0 ]; then
  mapfile -t apt_wanted < <(printf '%s\n' "${apt_wanted[@]}" | sort -u)
  echo "fanlight: installing Debian packages: ${apt_wanted[*]}"
  sudo_cmd=()
  [ "$(id -u)" -eq 0 ] || sudo_cmd=(sudo)
  export DEBIAN_FRONTEND=noninteractive
  "${sudo_cmd[@]}" apt-get update -qq
  "${sudo_cmd[@]}" apt-get install -y -qq --no-install-recommends "${apt_wanted[@]}" >/dev/null
fi

# npm ci writes node_modules/.package-lock.json; a lock newer than that means the install is stale.
if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "fanlight: installing npm packages (npm ci)"
  npm ci --no-audit --no-fund
fi

exec node --import tsx "server/ops/$mode.ts" "$@"
