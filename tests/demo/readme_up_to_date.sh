#!/usr/bin/env bash
# readme_up_to_date.sh BIN DEMO_DIR: regenerates the demo folder's README.md
# and baseline.json in a scratch copy with revbound BIN and fails, with the
# difference, when they are not the checked-in files.
set -euo pipefail
bin=$1
demo=$2
scratch=$(mktemp -d)
trap 'rm -rf "$scratch"' EXIT
cp -R "$demo"/. "$scratch"/
if ! bash "$scratch/regenerate.sh" "$bin" >"$scratch/regenerate.log" 2>&1; then
  echo "circuits_demo/regenerate.sh failed:" >&2
  cat "$scratch/regenerate.log" >&2
  exit 1
fi
stale=0
for f in README.md baseline.json; do
  if ! diff -u "$demo/$f" "$scratch/$f" >"$scratch/$f.diff"; then
    echo "circuits_demo/$f is stale: run circuits_demo/regenerate.sh build/bin/revbound" >&2
    head -n 80 "$scratch/$f.diff" >&2
    stale=1
  fi
done
exit "$stale"
