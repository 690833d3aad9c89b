// Demo circuit for the HTML render check (invented for the demo): an
// adder-like block whose ancilla is reset, a measured bit that is reused,
// and an ancilla left dirty so that a discard shows at the end.
OPENQASM 2.0;
include "qelib1.inc";
//! input a, b
//! ancilla anc
//! output s
qreg a[2];
qreg b[2];
qreg anc[2];
qreg s[1];
creg c[1];
gate maj x, y, z { cx z, y; cx z, x; ccx x, y, z; }
h a[0];
t a[1];
maj a[0], b[0], anc[0];
maj a[1], b[1], anc[1];
cx anc[1], s[0];
reset anc[0];
measure a[0] -> c[0];
if (c == 1) x s[0];
measure b[0] -> c[0];
tdg s[0];
