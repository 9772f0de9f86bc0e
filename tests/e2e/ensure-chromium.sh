#!/usr/bin/env bash
# Finds the Chromium the browser tests drive, before any of them runs, installing Debian's package
# when it is missing and this shell may (root with apt-get). The lookup is the one
# tests/support/chromium.ts makes for the tests themselves: RIVALPLATE_CHROMIUM if set, else
# `chromium` or `chromium-browser` on PATH. Playwright downloads no browser.
set -euo pipefail
if [ -n "${RIVALPLATE_CHROMIUM:-}" ]; then
  [ -x "$RIVALPLATE_CHROMIUM" ] && exit 0
  echo "RIVALPLATE_CHROMIUM=$RIVALPLATE_CHROMIUM is not an executable file" >&2
  exit 1
fi
on_path() { command -v chromium >/dev/null || command -v chromium-browser >/dev/null; }
on_path && exit 0
if [ "$(id -u)" = 0 ] && command -v apt-get >/dev/null; then
  echo "No chromium on PATH: installing Debian's chromium package" >&2
  apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
  hash -r
  on_path && exit 0
  echo "Debian's chromium package is installed, but no chromium is on PATH ($PATH): add its folder (usually /usr/bin) or set RIVALPLATE_CHROMIUM to the browser's path." >&2
  exit 1
fi
echo "No chromium on PATH, and this shell cannot install it. Install it (Debian: apt-get install -y chromium) or set RIVALPLATE_CHROMIUM to the browser's path." >&2
exit 1
