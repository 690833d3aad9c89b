#!/usr/bin/env bash
# truth_table_test.sh DEMO_DIR: runs the demo's own simulator (not revbound)
# over the four strategies and compares with the expected verdicts, derived
# by hand from the circuits:
# - every file computes over = (r > s) (the simulator checks all 64 inputs
#   against the definition of unsigned "greater than");
# - measure_reset.qasm makes 3 X-basis measurements with uniform outcomes,
#   so 2^3 = 8 branches;
# - buggy.qasm leaves anc[0] = e2 & e1 = (r2 == s2) & (r1 == s1), which is 1
#   for 2 * 2 * 4 = 16 of the 64 inputs (r0 and s0 free), the first in
#   counting order being r = s = 000.
set -euo pipefail
cd "$1"
expected='eager.qasm: over = (r > s) on all 64 inputs
  anc[0] ends |0> on every input
  anc[1] ends |0> on every input
lazy.qasm: over = (r > s) on all 64 inputs
  anc[0] ends |0> on every input
  anc[1] ends |0> on every input
  anc[2] ends |0> on every input
measure_reset.qasm: over = (r > s) on all 64 inputs, in each of 8 outcome branches (same probability and sign for every input)
  anc[0] ends |0> on every input
  anc[1] ends |0> on every input
buggy.qasm: over = (r > s) on all 64 inputs
  anc[0] ends |1> on 16 of 64 inputs, first for r=000 s=000
  anc[1] ends |0> on every input'
actual=$(LC_ALL=C awk -f truth_table.awk eager.qasm lazy.qasm measure_reset.qasm buggy.qasm)
if [ "$actual" != "$expected" ]; then
  echo "truth_table.awk disagrees with the expected verdicts" >&2
  diff <(printf '%s\n' "$expected") <(printf '%s\n' "$actual") >&2 || true
  exit 1
fi
# The simulator must also be able to fail: a flag with the g0 term wired to
# r0 instead of s0 is wrong for r = s = 001 (e2 = e1 = 1, r0 = 1: the term
# fires although r = s).
scratch=$(mktemp -d)
trap 'rm -rf "$scratch"' EXIT
sed 's/ccx_ct anc\[1\], s\[0\], over\[0\];/ccx_ct anc[1], r[0], over[0];/' eager.qasm >"$scratch/wrong.qasm"
if out=$(LC_ALL=C awk -f truth_table.awk "$scratch/wrong.qasm" 2>&1); then
  echo "truth_table.awk accepted a wrong flag: $out" >&2
  exit 1
fi
case "$out" in
  *"WRONG for r=001 s=001"*) ;;
  *) echo "truth_table.awk gave an unexpected verdict on a wrong flag: $out" >&2; exit 1 ;;
esac
