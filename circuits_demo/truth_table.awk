# truth_table.awk - an independent check of the demo circuits, outside revbound.
#
#   awk -f truth_table.awk eager.qasm lazy.qasm measure_reset.qasm buggy.qasm
#
# For each file it runs all 64 basis inputs of the 3-bit reading r and the
# 3-bit setpoint s through a small state-vector simulator of its own (real
# amplitudes, kept sparse), and checks that the flag `over` ends as r > s
# (unsigned), with r and s unchanged. Measurements and resets branch on their
# outcomes; a branch must have the same probability and the same sign for
# every input, so that the outcomes carry nothing about the input and no
# relative phase is left. It also reports, per ancilla, the inputs on which
# it does not end in |0>. A file that passes and whose ancillas all end in
# |0> is the same channel as the clean reversible map |r,s,0> -> |r,s,r>s>.
#
# It understands only what the demo files use: qreg, creg, x, h, cx, cz,
# ccx and ccx_ct (taken as the Toffoli gate: its body is the textbook
# Clifford+T Toffoli), measure, reset and if (creg==value). Gate definitions
# are skipped. Exit status: 0 when every file computes r > s, 1 otherwise,
# 2 on a statement it does not understand.

function fail(msg) { printf "%s: %s\n", Cur, msg > "/dev/stderr"; Bad = 2; exit 2 }

# Global qubit index of an operand NAME[i]; a bare register name only where
# the caller broadcasts it.
function qubit(op,    name, idx) {
  gsub(/ /, "", op)
  if (op !~ /^[A-Za-z_][A-Za-z0-9_]*\[[0-9]+\]$/) fail("expected NAME[i], got '" op "'")
  name = op; sub(/\[.*/, "", name)
  idx = op; sub(/.*\[/, "", idx); sub(/\]/, "", idx)
  if (!(name in QBase) || idx + 0 >= QSize[name]) fail("unknown qubit " op)
  return QBase[name] + idx
}

function bit(key, q) { return int(key / Pow[q]) % 2 }

# Permutations and signs on the sparse state Amp.
function applyX(q,    k) {
  for (k in Amp) T[bit(k, q) ? k - Pow[q] : k + Pow[q]] = Amp[k]
  moveBack()
}
function applyCX(c, q,    k) {
  for (k in Amp) T[(bit(k, c) ? (bit(k, q) ? k - Pow[q] : k + Pow[q]) : k)] = Amp[k]
  moveBack()
}
function applyCCX(a, b, q,    k) {
  for (k in Amp) T[(bit(k, a) && bit(k, b) ? (bit(k, q) ? k - Pow[q] : k + Pow[q]) : k)] = Amp[k]
  moveBack()
}
function applyCZ(a, b,    k) { for (k in Amp) if (bit(k, a) && bit(k, b)) Amp[k] = -Amp[k] }
function applyH(q,    k, lo, s) {
  s = sqrt(0.5)
  for (k in Amp) {
    lo = bit(k, q) ? k - Pow[q] : k + 0
    T[lo] += s * Amp[k]
    T[lo + Pow[q]] += (bit(k, q) ? -s : s) * Amp[k]
  }
  moveBack()
}
# Keep the part of the state where qubit q reads v.
function project(q, v,    k) { for (k in Amp) if (bit(k, q) != v) delete Amp[k] }
function moveBack(    k) {
  for (k in Amp) delete Amp[k]
  for (k in T) { if (T[k] * T[k] > 1e-24) Amp[k] = T[k]; delete T[k] }
}

# Splits "a, b, c" into Args[1..n]; returns n.
function operands(s) { return split(s, Args, /,/) }

function regValue(name,    i, v) {
  v = 0
  for (i = 0; i < CSize[name]; i++) v += Clbit[name, i] * 2 ^ i
  return v
}

function binary(v, n,    s, i) { s = ""; for (i = n - 1; i >= 0; i--) s = s (int(v / 2 ^ i) % 2); return s }

# Runs statement s on the current state; Outcome[] gives the branch taken
# by the j-th measurement or reset.
function run(s,    op, rest, cond, name, val, n, q, c, j) {
  if (s ~ /^if *\(/) {
    cond = s; sub(/^if *\( */, "", cond); sub(/ *\).*/, "", cond)
    split(cond, P, / *== */); name = P[1]; val = P[2] + 0
    rest = s; sub(/^if *\([^)]*\) */, "", rest)
    if (!(name in CSize)) fail("unknown classical register " name)
    if (regValue(name) == val) run(rest)
    return
  }
  op = s; sub(/ .*/, "", op)
  rest = s; sub(/^[^ ]+ */, "", rest)
  if (op == "measure") {
    split(rest, P, / *-> */)
    q = qubit(P[1]); c = P[2]; gsub(/ /, "", c)
    name = c; sub(/\[.*/, "", name); j = c; sub(/.*\[/, "", j); sub(/\]/, "", j)
    project(q, Outcome[++Taken]); Clbit[name, j + 0] = Outcome[Taken]
    return
  }
  if (op == "reset") { q = qubit(rest); project(q, Outcome[++Taken]); if (Outcome[Taken]) applyX(q); return }
  if ((op == "x" || op == "h") && rest ~ /^[A-Za-z_][A-Za-z0-9_]* *$/) {
    gsub(/ /, "", rest)
    if (!(rest in QBase)) fail("unknown register " rest)
    for (j = 0; j < QSize[rest]; j++) run(op " " rest "[" j "]")
    return
  }
  n = operands(rest)
  if (op == "x" && n == 1) applyX(qubit(Args[1]))
  else if (op == "h" && n == 1) applyH(qubit(Args[1]))
  else if (op == "cx" && n == 2) applyCX(qubit(Args[1]), qubit(Args[2]))
  else if (op == "cz" && n == 2) applyCZ(qubit(Args[1]), qubit(Args[2]))
  else if ((op == "ccx" || op == "ccx_ct") && n == 3) applyCCX(qubit(Args[1]), qubit(Args[2]), qubit(Args[3]))
  else fail("statement not understood: '" s "'")
}

function regOf(key, name,    v, i) {
  v = 0
  for (i = 0; i < QSize[name]; i++) v += bit(key, QBase[name] + i) * 2 ^ i
  return v
}

function checkFile(    r, s, b, key, k, nz, p, amp, sign, wrong, i, dirty, firstDirty, branches, a, branchSeen, line, name) {
  for (name in QBase) if (name != "r" && name != "s" && name != "over" && !(name in Anc)) fail("unexpected register " name)
  if (!("r" in QBase) || !("s" in QBase) || !("over" in QBase)) fail("expected registers r, s and over")
  wrong = 0; branches = 0
  for (r = 0; r < 8; r++) for (s = 0; s < 8; s++) {
    for (b = 0; b < 2 ^ Branchings; b++) {
      for (i = 1; i <= Branchings; i++) Outcome[i] = int(b / 2 ^ (i - 1)) % 2
      for (k in Amp) delete Amp[k]
      for (k in Clbit) delete Clbit[k]
      Amp[r * Pow[QBase["r"]] + s * Pow[QBase["s"]]] = 1
      Taken = 0
      for (i = 1; i <= NStmt; i++) run(Stmt[i])
      nz = 0; p = 0
      for (k in Amp) { nz++; key = k + 0; amp = Amp[k]; p += amp * amp }
      if (nz == 0) continue
      if (!(b in branchSeen)) { branchSeen[b] = 1; branches++ }
      sign = amp > 0 ? 1 : -1
      if (nz != 1 || regOf(key, "r") != r || regOf(key, "s") != s || bit(key, QBase["over"]) != (r > s)) {
        if (!wrong) printf "%s: WRONG for r=%s s=%s\n", Cur, binary(r, 3), binary(s, 3)
        wrong++
      }
      # One probability and one sign per branch, for every input.
      BranchInputs[b]++
      if (!(b in BranchP)) { BranchP[b] = p; BranchSign[b] = sign }
      else if ((p - BranchP[b]) ^ 2 > 1e-18 || sign != BranchSign[b]) {
        if (!wrong) printf "%s: branch %d differs between inputs (r=%s s=%s)\n", Cur, b, binary(r, 3), binary(s, 3)
        wrong++
      }
      for (a = 0; a < NAnc; a++) if (bit(key, AncQ[a])) {
        if (!(a in dirty)) firstDirty[a] = "r=" binary(r, 3) " s=" binary(s, 3)
        dirty[a]++
      }
    }
  }
  # A branch that some inputs never take tells those inputs apart.
  for (k in BranchP) {
    if (BranchInputs[k] != 64 && !wrong) { printf "%s: outcome branch %d is taken by %d of 64 inputs only\n", Cur, k, BranchInputs[k]; wrong++ }
    delete BranchP[k]; delete BranchInputs[k]
  }
  if (wrong) { Bad = 1; return }
  line = Cur ": over = (r > s) on all 64 inputs"
  if (Branchings) line = line ", in each of " branches " outcome branches (same probability and sign for every input)"
  print line
  for (a = 0; a < NAnc; a++)
    if (a in dirty) printf "  %s ends |1> on %d of 64 inputs, first for %s\n", AncName[a], dirty[a], firstDirty[a]
    else printf "  %s ends |0> on every input\n", AncName[a]
}

function resetFile(    k) {
  for (k in QBase) delete QBase[k]
  for (k in QSize) delete QSize[k]
  for (k in CSize) delete CSize[k]
  for (k in Anc) delete Anc[k]
  for (k in Stmt) delete Stmt[k]
  NQ = 0; NStmt = 0; NAnc = 0; Branchings = 0; Text = ""
}

function finishFile(    parts, n, i, s, name, size, reg, a, j) {
  gsub(/gate[^{]*\{[^}]*\}/, "", Text)
  n = split(Text, parts, /;/)
  for (i = 1; i <= n; i++) {
    s = parts[i]; gsub(/[\t\n]+/, " ", s); gsub(/^ +| +$/, "", s); gsub(/  +/, " ", s)
    if (s == "" || s ~ /^OPENQASM / || s ~ /^include /) continue
    if (s ~ /^[qc]reg /) {
      name = s; sub(/^[qc]reg +/, "", name); size = name; sub(/ *\[.*/, "", name)
      sub(/.*\[/, "", size); sub(/\].*/, "", size)
      if (s ~ /^qreg/) { QBase[name] = NQ; QSize[name] = size + 0; NQ += size }
      else CSize[name] = size + 0
      continue
    }
    Stmt[++NStmt] = s
    if (s ~ /(^|\) *)(measure|reset) /) Branchings++
  }
  for (j = 0; j <= NQ; j++) Pow[j] = 2 ^ j
  for (reg in Anc) if (reg in QBase) for (j = 0; j < QSize[reg]; j++) { AncName[NAnc] = reg "[" j "]"; AncQ[NAnc++] = QBase[reg] + j }
  # List ancillas by qubit index so that the output does not depend on
  # the order of awk's arrays.
  for (i = 0; i < NAnc; i++) for (j = i + 1; j < NAnc; j++) if (AncQ[j] < AncQ[i]) {
    a = AncQ[i]; AncQ[i] = AncQ[j]; AncQ[j] = a; a = AncName[i]; AncName[i] = AncName[j]; AncName[j] = a
  }
  checkFile()
}

FNR == 1 { if (NR > 1) finishFile(); resetFile(); Cur = FILENAME }
/^\/\/! *ancilla / { l = $0; sub(/^\/\/! *ancilla */, "", l); n = split(l, P, / *, */); for (i = 1; i <= n; i++) Anc[P[i]] = 1 }
{ l = $0; sub(/\/\/.*/, "", l); Text = Text l "\n" }
END { if (Bad == 2) exit 2; if (NR > 0) finishFile(); exit Bad }
