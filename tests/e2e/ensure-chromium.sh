#!/usr/bin/env bash
# Finds the Chromium the end-to-end tests drive, installing Debian's package when it is missing
# and this shell may (root with apt-get). RIVALPLATE_CHROMIUM overrides the path.
set -euo pipefail
browser="${RIVALPLATE_CHROMIUM:-/usr/bin/chromium}"
if [ -x "$browser" ]; then exit 0; fi
if [ -n "${RIVALPLATE_CHROMIUM:-}" ]; then
  echo "RIVALPLATE_CHROMIUM=$browser is not an executable file" >&2
  exit 1
fi
if [ "$(id -u)" = 0 ] && command -v apt-get >/dev/null; then
  echo "Chromium not found at $browser: installing Debian's chromium package" >&2
  apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
  [ -x "$browser" ] && exit 0
fi
echo "No Chromium at $browser. Install it (Debian: apt-get install -y chromium) or set RIVALPLATE_CHROMIUM to its path." >&2
exit 1
