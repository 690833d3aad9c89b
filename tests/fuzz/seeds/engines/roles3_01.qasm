OPENQASM 2.0;
gate g0 a { U(0,0,pi/4) a; }
gate g1 a, b { g0 a; CX a, b; g0 b; }
gate g2 a, b { g1 a, b; g1 b, a; }
//! ancilla q[1]
//! input q[0]
qreg q[3];
creg c[3];
g2 q[0], q[1];
g2 q[1], q[2];
measure q -> c;
reset q;
