#!/usr/bin/env bash
# Renders a revbound HTML page in headless Chromium and fails when the
# browser logs a console error or the page comes out blank.
#
#   render_check.sh PAGE.html
#   render_check.sh --sample SAMPLE_BINARY FILE.qasm...   (revbound_html_sample)
#   render_check.sh --revbound REVBOUND_BINARY FILE.qasm... (report --format html)
#
# Skips (exit 0, prints SKIPPED) when no Chromium is installed. CHROMIUM may
# name the browser; otherwise chromium or chromium-browser is looked up.
set -euo pipefail

CHROMIUM="${CHROMIUM:-$(command -v chromium || command -v chromium-browser || true)}"
if [ -z "$CHROMIUM" ] || [ ! -x "$CHROMIUM" ]; then
  echo "render_check: SKIPPED: no chromium found (Debian package chromium)"
  exit 0
fi

WORK="$(mktemp -d)"
trap 'rm -rf "$WORK"' EXIT
PAGE="$WORK/page.html"

case "${1:-}" in
  --sample)
    [ $# -ge 3 ] || { echo "usage: $0 --sample BINARY FILE.qasm..." >&2; exit 2; }
    BIN="$2"; shift 2
    "$BIN" "$PAGE" "$@"
    ;;
  --revbound)
    [ $# -ge 3 ] || { echo "usage: $0 --revbound BINARY FILE.qasm..." >&2; exit 2; }
    BIN="$2"; shift 2
    "$BIN" report --format html -o "$PAGE" --energy 1eV "$@"
    ;;
  ""|-*)
    echo "usage: $0 PAGE.html | --sample BINARY FILE.qasm... | --revbound BINARY FILE.qasm..." >&2
    exit 2
    ;;
  *)
    cp "$1" "$PAGE"
    ;;
esac

# The page must need nothing from outside: no source, stylesheet, import or
# link other than to its own anchors. Browsers do not log a failed image load
# as a console error, so this is checked in the markup; every host is also
# blocked below, so the render itself never reaches the network.
status=0
if grep -oE '(src|href|xlink:href)="[^"]*"' "$PAGE" | grep -vE '^(href|xlink:href)="#' \
     >"$WORK/outside.txt" ||
   grep -oE '<link|url\(|@import' "$PAGE" >>"$WORK/outside.txt"; then
  echo "render_check: FAILED: the page refers outside itself:"
  sort -u "$WORK/outside.txt"
  status=1
fi

FLAGS=(--headless --no-sandbox --disable-gpu --no-first-run
       --disable-extensions --disable-background-networking
       --host-resolver-rules="MAP * ~NOTFOUND"
       --user-data-dir="$WORK/profile" --enable-logging=stderr --v=0
       --window-size=1000,1400)

"$CHROMIUM" "${FLAGS[@]}" --dump-dom "file://$PAGE" >"$WORK/dom.html" 2>"$WORK/dom.log" || {
  echo "render_check: FAILED: chromium exited with $? while loading the page"
  cat "$WORK/dom.log"
  exit 1
}
"$CHROMIUM" "${FLAGS[@]}" --screenshot="$WORK/shot.png" "file://$PAGE" \
  >/dev/null 2>"$WORK/shot.log" || true

# Console messages are logged as "CONSOLE(line)" (or "CONSOLE:" in newer
# versions); any of them, and any failed load, is an error for a page
# without scripts.
if grep -E 'CONSOLE|Uncaught|ERR_NAME_NOT_RESOLVED|Failed to load' \
     "$WORK/dom.log" "$WORK/shot.log" >"$WORK/errors.txt"; then
  echo "render_check: FAILED: console or load errors:"
  cat "$WORK/errors.txt"
  status=1
fi

# Not blank: the rendered DOM holds the summary table and at least one plot.
for needle in 'id="summary"' '<svg' '<table'; do
  if ! grep -q "$needle" "$WORK/dom.html"; then
    echo "render_check: FAILED: the rendered page has no $needle"
    status=1
  fi
done

# Not blank as pixels either: the screenshot has more than a handful of
# colours (a blank page has one).
if [ ! -s "$WORK/shot.png" ]; then
  echo "render_check: FAILED: no screenshot was written"
  cat "$WORK/shot.log"
  status=1
else
  colours="$(python3 "$(dirname "$0")/png_colours.py" "$WORK/shot.png")" || {
    echo "render_check: FAILED: cannot read the screenshot"
    status=1
    colours=0
  }
  if [ "$colours" -lt 16 ]; then
    echo "render_check: FAILED: the screenshot has only $colours colours (blank page?)"
    status=1
  fi
fi

if [ "$status" -eq 0 ]; then
  echo "render_check: OK: rendered without console errors ($colours colours)"
fi
exit "$status"
