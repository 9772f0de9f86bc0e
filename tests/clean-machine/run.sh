#!/usr/bin/env bash
# Runs the README's quick start test commands (`npm install`, then `npm test`) the way a fresh
# machine would, as far as one machine with Chromium installed allows:
#   1. a fresh `git clone` of the committed tree (HEAD of this checkout) into a temporary folder:
#      nothing untracked, no node_modules, no build output, no test artifacts;
#   2. with chromium hidden from PATH (a temporary bin folder of links to every program on PATH
#      but chromium, chromium-browser and apt-get) `npm test` must stop before the first test,
#      saying what to do: the case of a machine with no browser and no way to install one;
#   3. with the ordinary PATH, `npm test` must pass from the fresh clone.
# Not covered here: the install branch of tests/e2e/ensure-chromium.sh (it needs a machine without
# Debian's chromium package; this one keeps it, and `apt-get install` could upgrade the browser
# under other runs). tests/test-command.test.ts checks that script's lookup on its own.
# Usage: tests/clean-machine/run.sh [--keep]   (--keep leaves the clone and logs in place)
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
repo="$(git -C "$here" rev-parse --show-toplevel)"
commit="$(git -C "$repo" rev-parse HEAD)"
work="$(mktemp -d "${TMPDIR:-/tmp}/rivalplate-clean.XXXXXX")"
[ "${1:-}" = --keep ] || trap 'rm -rf "$work"' EXIT
say() { printf '[clean-machine] %s\n' "$*"; }
fail() {
  say "FAILED: $*"
  exit 1
}

say "commit $commit, working in $work"
if [ -n "$(git -C "$repo" status --porcelain --untracked-files=no)" ]; then
  say "note: this checkout has uncommitted changes; the clone tests the commit only"
fi
git clone -q --no-hardlinks "$repo" "$work/rivalplate"
git -C "$work/rivalplate" checkout -q --detach "$commit"
cd "$work/rivalplate"

# A PATH that hides the browser (and the package manager that could install it).
hidden="$work/bin"
mkdir "$hidden"
IFS=: read -r -a dirs <<<"$PATH"
for dir in "${dirs[@]}"; do
  [ -d "$dir" ] || continue
  for program in "$dir"/*; do
    name="${program##*/}"
    case "$name" in chromium | chromium-browser | apt-get) continue ;; esac
    if [ -x "$program" ] && [ ! -e "$hidden/$name" ]; then ln -s "$program" "$hidden/$name"; fi
  done
done
if PATH="$hidden" bash -c 'command -v chromium || command -v chromium-browser'; then
  fail "chromium is still on the hidden PATH"
fi
say "PATH without chromium: $hidden ($(find "$hidden" -maxdepth 1 -type l | wc -l) programs)"

say "npm install (README quick start), chromium hidden"
start=$SECONDS
env -u RIVALPLATE_CHROMIUM PATH="$hidden" npm install --no-audit --no-fund >"$work/install.log" 2>&1 ||
  fail "npm install: see $work/install.log"
say "npm install done in $((SECONDS - start)) s"

say "npm test with no chromium on PATH: must stop before any test, saying what to do"
start=$SECONDS
if env -u RIVALPLATE_CHROMIUM PATH="$hidden" npm test >"$work/no-browser.log" 2>&1; then
  fail "npm test passed with no browser on PATH"
fi
grep -q "No chromium on PATH, and this shell cannot install it" "$work/no-browser.log" ||
  fail "no clear message about the missing browser: see $work/no-browser.log"
if grep -q "Test Files" "$work/no-browser.log"; then fail "vitest ran before the browser was found"; fi
if grep -q "Running [0-9]* test" "$work/no-browser.log"; then fail "playwright started without a browser"; fi
say "stopped after $((SECONDS - start)) s with: $(grep 'No chromium on PATH' "$work/no-browser.log")"

say "npm test with the ordinary PATH (chromium found): must pass from the fresh clone"
start=$SECONDS
env -u RIVALPLATE_CHROMIUM npm test >"$work/test.log" 2>&1 || {
  tail -40 "$work/test.log"
  fail "npm test failed: see $work/test.log"
}
grep -E "Test Files|Tests  | passed \(|[0-9]+ passed|[0-9]+ failed|[0-9]+ skipped" "$work/test.log" |
  sed 's/\x1b\[[0-9;]*m//g' | sed 's/^/[clean-machine]   /'
say "npm test passed in $((SECONDS - start)) s"
say "OK"
