OPENQASM 2.0;
include "qelib1.inc";
//! input x
//! ancilla w
qreg x[2];
qreg w[1];
creg m[1];
h x[0];
cx x[0], w[0];
rz(pi/4) w[0];
measure w[0] -> m[0];
reset w[0];
h w[0];
