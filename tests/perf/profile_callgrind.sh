#!/usr/bin/env bash
# Profiles `revbound report --format json` on a generated flat file with callgrind and prints the top functions.
#
# usage: tests/perf/profile_callgrind.sh [--build DIR] [--ops N] [--top N] [--out DIR]
#   --build DIR  build folder with bin/revbound and bin/revbound_gen_circuits
#                (default: build/ beside tests/). A build with
#                -DCMAKE_CXX_FLAGS="-g -fno-omit-frame-pointer" gives source lines.
#   --ops N      operations of the flat file (default 100000)
#   --top N      functions listed (default 25)
#   --out DIR    keep callgrind.out and the circuit here (default: a temp dir)
#
# Instruction counts are deterministic, so unlike timings they can be
# compared across runs on a noisy machine; kernel time (page faults) is not
# in them.
set -euo pipefail

Here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
Build="$Here/../../build"
Ops=100000
Top=25
Out=""
while [[ $# -gt 0 ]]; do
  case "$1" in
    --build) Build="$2"; shift 2 ;;
    --ops) Ops="$2"; shift 2 ;;
    --top) Top="$2"; shift 2 ;;
    --out) Out="$2"; shift 2 ;;
    -h|--help) sed -n '2,14p' "$0"; exit 0 ;;
    *) echo "error: unknown argument '$1'" >&2; exit 2 ;;
  esac
done
command -v valgrind >/dev/null || { echo "error: valgrind is not installed" >&2; exit 2; }

if [[ -z "$Out" ]]; then
  Out="$(mktemp -d "${TMPDIR:-/tmp}/revbound-prof.XXXXXX")"
  trap 'rm -rf "$Out"' EXIT
fi
mkdir -p "$Out"
"$Build/bin/revbound_gen_circuits" --ops "$Ops" --levels 20 "$Out" >/dev/null
valgrind --tool=callgrind --callgrind-out-file="$Out/callgrind.out" \
  "$Build/bin/revbound" report --format json "$Out/flat.qasm" >/dev/null 2>"$Out/valgrind.log"
grep -E "I +refs" "$Out/valgrind.log" | sed 's/^==[0-9]*== *//'

# Rows of callgrind_annotate's function table only (they carry a percentage).
table() { callgrind_annotate "$@" "$Out/callgrind.out" 2>/dev/null |
          grep -E '^ *[0-9,]+ +\( *[0-9.]+%\) ' | grep -v 'PROGRAM TOTALS' |
          head -n "$Top" | cut -c1-160; }
echo "== exclusive (self) cost"
table --inclusive=no
echo "== inclusive cost"
table --inclusive=yes
