#!/usr/bin/env bash
# The speed-up of `revbound report --jobs 2` over `--jobs 1` on a batch of files.
#
# usage: tests/perf/batch_speedup.sh [--build DIR] [--files N] [--ops N]
#                                    [--qubits N] [--from DIR] [--runs R]
#                                    [--jobs J] [--format F] [--keep]
#   --build DIR   build folder holding bin/revbound (default: build/ beside
#                 tests/); bin/revbound_gen_circuits is used when built there
#                 (REVBOUND_BUILD_BENCHMARKS=ON), otherwise it is compiled from
#                 tests/perf/GenerateCircuits.cpp into the scratch folder
#   --files N     files in the batch (default 200)
#   --ops N       operations per generated file (default 20000)
#   --qubits N    qubits per generated file (default 16)
#   --from DIR    instead of generating, copy the .qasm files under DIR (for
#                 instance the shared benchmarks), cycling until N files
#   --runs R      timed runs per job count (default 5); medians are quoted
#                 because the machine is shared and noisy
#   --jobs J      the parallel job count compared with 1 (default 2)
#   --format F    report format (default jsonl)
#   --keep        keep the scratch folder
#
# Times with hyperfine when it is installed, otherwise with /usr/bin/time
# (which also gives the CPU seconds, so the cores a run got). A control run
# measures the parallel capacity the shared machine offers at the time. Before timing, checks that --jobs 1 and
# --jobs J print the same bytes. Prints the load average before and after,
# since other processes share the cores.
set -euo pipefail

Here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
Build="$Here/../../build"
Files=200
Ops=20000
Qubits=16
From=""
Runs=5
Jobs=2
Format=jsonl
Keep=0
while [[ $# -gt 0 ]]; do
  case "$1" in
    --build) Build="$2"; shift 2 ;;
    --files) Files="$2"; shift 2 ;;
    --ops) Ops="$2"; shift 2 ;;
    --qubits) Qubits="$2"; shift 2 ;;
    --from) From="$2"; shift 2 ;;
    --runs) Runs="$2"; shift 2 ;;
    --jobs) Jobs="$2"; shift 2 ;;
    --format) Format="$2"; shift 2 ;;
    --keep) Keep=1; shift ;;
    -h|--help) sed -n '2,24p' "$0"; exit 0 ;;
    *) echo "error: unknown argument '$1'" >&2; exit 2 ;;
  esac
done

Revbound="$Build/bin/revbound"
[[ -x "$Revbound" ]] || { echo "error: '$Revbound' not built" >&2; exit 2; }

Work="$(mktemp -d "${TMPDIR:-/tmp}/revbound-batch.XXXXXX")"
if [[ $Keep -eq 0 ]]; then
  trap 'rm -rf "$Work"' EXIT
fi
mkdir "$Work/batch"

if [[ -n "$From" ]]; then
  mapfile -t Sources < <(find "$From" -type f -name '*.qasm' | LC_ALL=C sort)
  [[ ${#Sources[@]} -gt 0 ]] || { echo "error: no .qasm files under '$From'" >&2; exit 2; }
  for ((I = 0; I < Files; ++I)); do
    cp "${Sources[I % ${#Sources[@]}]}" "$(printf '%s/batch/%04d.qasm' "$Work" "$I")"
  done
  What="$Files files copied from $From (${#Sources[@]} distinct)"
else
  Gen="$Build/bin/revbound_gen_circuits"
  if [[ ! -x "$Gen" ]]; then
    Gen="$Work/revbound_gen_circuits"
    "${CXX:-c++}" -std=c++20 -O2 -o "$Gen" "$Here/GenerateCircuits.cpp" \
      "$Here/CircuitGenerator.cpp"
  fi
  for ((I = 0; I < Files; ++I)); do
    "$Gen" --ops "$Ops" --qubits "$Qubits" --levels 1 --seed $((I + 1)) \
      "$Work" >/dev/null
    mv "$Work/flat.qasm" "$(printf '%s/batch/%04d.qasm' "$Work" "$I")"
  done
  rm -f "$Work/nested.qasm"
  What="$Files generated files ($Ops ops, $Qubits qubits, seeds 1..$Files)"
fi

One=("$Revbound" report --format "$Format" --jobs 1 "$Work/batch")
Many=("$Revbound" report --format "$Format" --jobs "$Jobs" "$Work/batch")
"${One[@]}" >"$Work/one.out" 2>"$Work/one.err" || true
"${Many[@]}" >"$Work/many.out" 2>"$Work/many.err" || true
cmp -s "$Work/one.out" "$Work/many.out" && cmp -s "$Work/one.err" "$Work/many.err" ||
  { echo "error: --jobs 1 and --jobs $Jobs differ" >&2; exit 1; }

echo "== $What; $(nproc) cores; $(wc -c <"$Work/one.out") bytes of $Format"
echo "== load before: $(uptime)"

# median of the numbers on standard input
median() { sort -g | awk '{ V[NR] = $1 } END { print (NR % 2) ? V[(NR + 1) / 2] : (V[NR / 2] + V[NR / 2 + 1]) / 2 }'; }

if command -v hyperfine >/dev/null; then
  hyperfine --shell=none --warmup 1 --runs "$Runs" --export-json "$Work/times.json" \
    --command-name "jobs 1" "${One[*]}" --command-name "jobs $Jobs" "${Many[*]}"
  OneSec=$(python3 -c 'import json,sys; print(json.load(open(sys.argv[1]))["results"][0]["median"])' "$Work/times.json")
  ManySec=$(python3 -c 'import json,sys; print(json.load(open(sys.argv[1]))["results"][1]["median"])' "$Work/times.json")
  Timer=hyperfine
else
  command -v /usr/bin/time >/dev/null || { echo "error: neither hyperfine nor /usr/bin/time" >&2; exit 2; }
  # Alternate the two commands so that a change in load hits both. Also
  # record CPU seconds: CPU / elapsed is the cores a run really got.
  : >"$Work/one.times"
  : >"$Work/many.times"
  for ((R = 0; R < Runs; ++R)); do
    for Which in one many; do
      if [[ $Which == one ]]; then Cmd=("${One[@]}"); else Cmd=("${Many[@]}"); fi
      /usr/bin/time -f '%e %U %S' -o "$Work/run.time" "${Cmd[@]}" >/dev/null 2>&1 || true
      awk '{ printf "%s %.2f\n", $1, $2 + $3 }' "$Work/run.time" >>"$Work/$Which.times"
    done
  done
  OneSec=$(cut -d' ' -f1 "$Work/one.times" | median)
  ManySec=$(cut -d' ' -f1 "$Work/many.times" | median)
  OneCpu=$(cut -d' ' -f2 "$Work/one.times" | median)
  ManyCpu=$(cut -d' ' -f2 "$Work/many.times" | median)
  Timer="/usr/bin/time; elapsed s and CPU s per run: jobs 1: $(tr '\n' ',' <"$Work/one.times") jobs $Jobs: $(tr '\n' ',' <"$Work/many.times")"
fi

# Control: how many cores a second process really gets now. Two copies of
# the --jobs 1 run at once against one alone; 2 x alone / pair is the
# parallel capacity the machine offers (2.0 on an idle 2-core machine), the
# ceiling of any speed-up measured above.
T0=$EPOCHREALTIME
"${One[@]}" >/dev/null 2>&1 || true
T1=$EPOCHREALTIME
{ "${One[@]}" >/dev/null 2>&1 & "${One[@]}" >/dev/null 2>&1; wait; } || true
T2=$EPOCHREALTIME
Capacity=$(awk -v A="$T0" -v B="$T1" -v C="$T2" 'BEGIN { printf "%.2f (alone %.2f s, two at once %.2f s)", 2 * (B - A) / (C - B), B - A, C - B }')

echo "== load after:  $(uptime)"
awk -v A="$OneSec" -v B="$ManySec" -v C1="${OneCpu:-}" -v C2="${ManyCpu:-}" -v J="$Jobs" -v Cap="$Capacity" -v R="$Runs" -v T="$Timer" 'BEGIN {
  printf "\n== medians of %d runs (%s)\n", R, T
  printf "jobs 1   %9.1f ms\n", A * 1e3
  printf "jobs %-3d %9.1f ms\n", J, B * 1e3
  printf "speed-up %9.2f x\n", A / B
  if (C1 != "")
    printf "CPU      %9.2f s (jobs 1), %.2f s (jobs %d); cores used %.2f and %.2f\n",
           C1, C2, J, C1 / A, C2 / B
  printf "control  parallel capacity of the machine now: %s\n", Cap
}'
[[ $Keep -eq 1 ]] && echo "files kept in $Work"
exit 0
