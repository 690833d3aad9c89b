OPENQASM 2.0;
include "qelib1.inc";
//! input a, b
//! ancilla anc
//! garbage g
//! output s
qreg a[2];
qreg b[1];
qreg anc[1];
qreg g[1];
qreg s[1];
creg c[2];
ccx a[0], a[1], anc[0];
cx anc[0], s[0];
ccx a[0], a[1], anc[0];
cx a[0], g[0];
cswap b[0], a[0], a[1];
t a[0];
measure a[0] -> c[0];
measure a[0] -> c[0];
reset b[0];
if(c==1) x s[0];
