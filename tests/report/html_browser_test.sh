#!/usr/bin/env bash
# Opens a sample HTML report in headless Chromium and checks that every embedded picture decoded
# (the page's script sets body data-images-loaded="true"), that the results table and the safety
# section are in the rendered DOM, and that a screenshot can be taken (non-empty PNG).
# Usage: html_browser_test.sh <path to cuspmap_tests>   (registered in tests/CMakeLists.txt)
# No chromium: installs it when running as root with CI=true, else prints "skipped" and exits 0.
# CUSPMAP_KEEP_DIR=<dir> keeps report.html, dom.html and screenshot.png there for a look.
set -euo pipefail
tests_bin=${1:?usage: html_browser_test.sh <cuspmap_tests binary>}

find_chromium() {
  local c
  for c in /usr/bin/chromium /usr/bin/chromium-browser; do
    if [ -x "$c" ]; then echo "$c"; return 0; fi
  done
  return 1
}

browser=$(find_chromium || true)
if [ -z "$browser" ] && [ "${CI:-}" = "true" ] && [ "$(id -u)" -eq 0 ]; then
  echo "html_browser_test: installing chromium (CI=true, running as root)"
  export DEBIAN_FRONTEND=noninteractive
  if ! { apt-get update -qq && apt-get install -y -qq chromium >/dev/null; }; then
    echo "html_browser_test: apt-get install chromium failed" >&2
  fi
  browser=$(find_chromium || true)
fi
if [ -z "$browser" ]; then
  echo "html_browser_test: skipped (no /usr/bin/chromium; 'apt-get install -y chromium' enables it)"
  exit 0
fi

tmp=$(mktemp -d "${TMPDIR:-/tmp}/cuspmap-browser-XXXXXX")
trap 'rm -rf "$tmp"' EXIT
if ! CUSPMAP_SAMPLE_REPORT="$tmp/report.html" "$tests_bin" "[io_sample]" >"$tmp/generate.log" 2>&1; then
  cat "$tmp/generate.log"
  echo "html_browser_test: FAILED to generate the sample report" >&2
  exit 1
fi

flags=(--headless --no-sandbox --disable-gpu --disable-quic --no-first-run
       --disable-background-networking --disable-component-update --disable-sync
       --disable-dev-shm-usage --user-data-dir="$tmp/profile")
url="file://$tmp/report.html"
fail() {
  echo "html_browser_test: FAILED: $1" >&2
  tail -n 20 "$tmp/chromium.log" >&2 || true
  exit 1
}

# --virtual-time-budget lets the load event and the page's script run before the DOM is dumped.
timeout 180 "$browser" "${flags[@]}" --virtual-time-budget=10000 --dump-dom "$url" \
  >"$tmp/dom.html" 2>"$tmp/chromium.log" || fail "chromium --dump-dom exited non-zero"
expected_images=$(grep -o '<img ' "$tmp/report.html" | wc -l)
grep -q 'data-images-loaded="true"' "$tmp/dom.html" || fail "not every picture decoded"
grep -q "data-image-count=\"$expected_images\"" "$tmp/dom.html" ||
  fail "picture count in the DOM differs from the $expected_images in the page"
grep -q '<section id="results">' "$tmp/dom.html" || fail "results section missing"
grep -q '<table' "$tmp/dom.html" || fail "no table in the rendered page"
grep -q '<section id="cautions">' "$tmp/dom.html" || fail "safety section missing"

timeout 180 "$browser" "${flags[@]}" --window-size=1200,1800 --screenshot="$tmp/screenshot.png" "$url" \
  >>"$tmp/chromium.log" 2>&1 || fail "chromium --screenshot exited non-zero"
[ -s "$tmp/screenshot.png" ] || fail "screenshot is empty"
[ "$(head -c 8 "$tmp/screenshot.png" | od -An -tx1 | tr -d ' \n')" = "89504e470d0a1a0a" ] ||
  fail "screenshot is not a PNG"

if [ -n "${CUSPMAP_KEEP_DIR:-}" ]; then
  cp "$tmp/report.html" "$tmp/dom.html" "$tmp/screenshot.png" "$CUSPMAP_KEEP_DIR"/
fi
echo "html_browser_test: ok ($expected_images pictures decoded, table present," \
     "screenshot $(stat -c %s "$tmp/screenshot.png") bytes)"
