#!/usr/bin/env bash
# End-to-end figures of `revbound report --format json --engine structural` against issue 7's targets: time vs `wc -l`, peak memory per op, nested file time.
#
# usage: tests/perf/run_end_to_end.sh [--build DIR] [--ops N] [--levels K]
#                                     [--runs R] [--keep] [--strict]
#   --build DIR  build folder holding bin/revbound and bin/revbound_gen_circuits
#                (default: the build/ folder beside tests/)
#   --ops N      operations of the flat file (default 1000000)
#   --levels K   the nested file expands to 2^K leaves (default 61)
#   --runs R     hyperfine runs per command (default 10); medians are quoted
#                because the machine is shared and noisy
#   --idle S     seconds of idle before each run of the cold timing
#                (default 3; 0 skips it)
#   --keep       keep the generated files and the raw hyperfine exports
#   --strict     exit 1 when a target is missed (default: report only)
#
# Targets: flat report at most 6x the median time of `wc -l` on the same
# file (3x in the long run), judged on the cold runs (after an idle gap, as
# CI runs revbound: on VMs that hand free memory back to the host, fresh
# memory costs more then than back to back); peak RSS at most 100 bytes per op; the
# 2^61-op nested file's analysis under 1 ms, taken as its end-to-end time
# less that of a 100-op file (the process's fixed cost).
set -euo pipefail

Here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
Build="$Here/../../build"
Ops=1000000
Levels=61
Runs=10
Idle=3
Keep=0
Strict=0
while [[ $# -gt 0 ]]; do
  case "$1" in
    --build) Build="$2"; shift 2 ;;
    --ops) Ops="$2"; shift 2 ;;
    --levels) Levels="$2"; shift 2 ;;
    --runs) Runs="$2"; shift 2 ;;
    --idle) Idle="$2"; shift 2 ;;
    --keep) Keep=1; shift ;;
    --strict) Strict=1; shift ;;
    -h|--help) sed -n '2,21p' "$0"; exit 0 ;;
    *) echo "error: unknown argument '$1'" >&2; exit 2 ;;
  esac
done

Revbound="$Build/bin/revbound"
Gen="$Build/bin/revbound_gen_circuits"
for Tool in "$Revbound" "$Gen"; do
  [[ -x "$Tool" ]] || { echo "error: '$Tool' not built (ninja -C $Build)" >&2; exit 2; }
done
for Tool in hyperfine /usr/bin/time wc awk; do
  command -v "$Tool" >/dev/null || { echo "error: '$Tool' is not installed" >&2; exit 2; }
done

Work="$(mktemp -d "${TMPDIR:-/tmp}/revbound-perf.XXXXXX")"
if [[ $Keep -eq 0 ]]; then
  trap 'rm -rf "$Work"' EXIT
fi

echo "== generating into $Work"
"$Gen" --ops "$Ops" --levels "$Levels" "$Work"
mkdir "$Work/tiny"
"$Gen" --ops 100 --qubits 8 --levels 1 "$Work/tiny" >/dev/null
Flat="$Work/flat.qasm"
Nested="$Work/nested.qasm"
FlatBytes=$(wc -c <"$Flat")

# Every report must succeed before anything is timed.
for F in "$Flat" "$Nested"; do
  "$Revbound" report --format json --engine structural "$F" >"$Work/$(basename "$F" .qasm).json"
done

# median SECONDS of the command in row ROW (1-based) of a hyperfine CSV export
median() { awk -F, -v Row="$2" 'NR == Row + 1 { print $4 }' "$1"; }

echo "== timing the flat file ($Ops ops, $FlatBytes bytes), $Runs runs each"
hyperfine --shell=none --warmup 2 --runs "$Runs" --export-csv "$Work/flat.csv" \
  --command-name "revbound report" "$Revbound report --format json --engine structural $Flat" \
  --command-name "wc -l" "wc -l $Flat"
WarmSec=$(median "$Work/flat.csv" 1)
WarmWcSec=$(median "$Work/flat.csv" 2)
ReportSec=$WarmSec
WcSec=$WarmWcSec
if [[ $Idle != 0 ]]; then
  echo "== timing the flat file cold: $Idle s idle before each run"
  hyperfine --shell=none --runs "$Runs" --prepare "sleep $Idle" --export-csv "$Work/cold.csv" \
    --command-name "revbound report (cold)" "$Revbound report --format json --engine structural $Flat" \
    --command-name "wc -l (cold)" "wc -l $Flat"
  ReportSec=$(median "$Work/cold.csv" 1)
  WcSec=$(median "$Work/cold.csv" 2)
fi

echo "== timing the nested file (2^$Levels leaves)"
hyperfine --shell=none --warmup 2 --runs "$Runs" --export-csv "$Work/nested.csv" \
  --command-name "revbound report (nested)" "$Revbound report --format json --engine structural $Nested" \
  --command-name "revbound report (100 ops)" "$Revbound report --format json --engine structural $Work/tiny/flat.qasm"
NestedSec=$(median "$Work/nested.csv" 1)
TinySec=$(median "$Work/nested.csv" 2)

# peak RSS in KiB of `revbound report` on FILE; the largest of three runs
peakKib() {
  local Max=0 Kib
  for _ in 1 2 3; do
    Kib=$(/usr/bin/time -v "$Revbound" report --format json --engine structural "$1" 2>&1 >/dev/null |
          awk -F: '/Maximum resident set size/ { gsub(/ /, "", $2); print $2 }')
    if (( Kib > Max )); then Max=$Kib; fi
  done
  echo "$Max"
}
echo "== peak memory (/usr/bin/time -v)"
FlatKib=$(peakKib "$Flat")
NestedKib=$(peakKib "$Nested")
TinyKib=$(peakKib "$Work/tiny/flat.qasm") # the fixed cost of the process

Status=0
awk -v R="$ReportSec" -v W="$WcSec" -v RW="$WarmSec" -v WW="$WarmWcSec" -v N="$NestedSec" -v T="$TinySec" -v Ops="$Ops" \
    -v Bytes="$FlatBytes" -v FK="$FlatKib" -v BK="$TinyKib" -v NK="$NestedKib" -v Strict="$Strict" '
BEGIN {
  Ratio = R / W
  PerOp = FK * 1024 / Ops
  NetPerOp = (FK - BK) * 1024 / Ops
  printf "\n== results (medians of hyperfine runs)\n"
  printf "flat report      %9.1f ms   %7.1f MB/s   %6.2f M ops/s\n",
         R * 1e3, Bytes / R / 1e6, Ops / R / 1e6
  printf "wc -l            %9.1f ms\n", W * 1e3
  printf "back to back     %9.1f ms   wc -l %.1f ms (%.1fx)\n", RW * 1e3, WW * 1e3, RW / WW
  printf "ratio            %9.1f x     (target <= 6x)   %s\n", Ratio,
         Ratio <= 6 ? "PASS" : "FAIL"
  printf "peak RSS flat    %9.1f MiB  %7.1f bytes/op      (target <= 100)   %s\n",
         FK / 1024, PerOp, PerOp <= 100 ? "PASS" : "FAIL"
  printf "peak RSS tiny    %9.1f MiB  (100-op file: the process baseline; flat net of it %.1f bytes/op)\n",
         BK / 1024, NetPerOp
  Net = N - T
  printf "nested report    %9.1f ms   100-op file %.1f ms; analysis %.2f ms (target < 1 ms)   %s\n",
         N * 1e3, T * 1e3, Net * 1e3, Net < 0.001 ? "PASS" : "FAIL"
  printf "peak RSS nested  %9.1f MiB\n", NK / 1024
  Missed = (Ratio > 6) + (PerOp > 100) + (Net >= 0.001)
  exit (Strict && Missed) ? 1 : 0
}' || Status=$?
[[ $Keep -eq 1 ]] && echo "files kept in $Work"
exit $Status
