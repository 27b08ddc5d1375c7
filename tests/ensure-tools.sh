#!/usr/bin/env bash
# Makes sure the browser, PDF and database tools the tests drive are on this machine: Debian's chromium
# (never a browser download), poppler-utils and postgresql (the tests start a throwaway server of their own). Installs them through apt when missing and
# possible; otherwise stops with what to install.
set -euo pipefail
missing=()
command -v chromium >/dev/null 2>&1 || [ -x /usr/bin/chromium ] || missing+=(chromium)
command -v pdftotext >/dev/null 2>&1 || missing+=(poppler-utils)
compgen -G "/usr/lib/postgresql/*/bin/initdb" >/dev/null || missing+=(postgresql)
[ ${#missing[@]} -eq 0 ] && exit 0
echo "Installing ${missing[*]} for the browser and PDF tests..."
if [ "$(id -u)" -eq 0 ] && command -v apt-get >/dev/null 2>&1; then
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq >/dev/null
  apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
elif command -v sudo >/dev/null 2>&1 && sudo -n true 2>/dev/null; then
  sudo apt-get update -qq >/dev/null
  sudo DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
else
  echo "The tests need: ${missing[*]}. Install them (Debian: apt-get install ${missing[*]}) and run again." >&2
  exit 1
fi
