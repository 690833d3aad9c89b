// Demo scenario (invented for revbound): the over-threshold flag of the
// arithmetic block of a cryogenic qubit controller, over = (r > s) for a
// 3-bit reading r and a 3-bit setpoint s; see eager.qasm for the formula.
//
// Strategy 4, a bug: eager.qasm with the last uncomputing Toffoli left out.
// The flag is still right, but anc[0] keeps e2 & e1, that is, whether the
// two high bits of r and s agree, and is left dirty.
OPENQASM 2.0;
include "qelib1.inc";

// The Toffoli gate in Clifford+T, written out so that its 7 T gates are
// counted: the body of ccx in the OpenQASM 2.0 qelib1.inc (Cross, Bishop,
// Smolin and Gambetta, arXiv:1707.03429), the circuit of Nielsen and Chuang,
// "Quantum Computation and Quantum Information", figure 4.9.
gate ccx_ct a, b, c {
  h c; cx b, c; tdg c; cx a, c; t c; cx b, c; tdg c; cx a, c;
  t b; t c; h c; cx a, b; t a; tdg b; cx a, b;
}

//! input r, s
//! output over
//! ancilla anc
qreg r[3];       // the reading, any value, kept
qreg s[3];       // the setpoint, any value, kept
qreg over[1];    // the flag, starts at |0>
qreg anc[2];     // scratch ANDs, start and must end at |0>

x s;                            // s := ~s, so s_i now holds ~s_i
ccx_ct r[2], s[2], over[0];     // over ^= g2
ccx_ct r[1], s[1], anc[0];      // anc0 = g1
cx r[2], s[2];                  // s2 := e2
ccx_ct s[2], anc[0], over[0];   // over ^= e2 & g1
ccx_ct r[1], s[1], anc[0];      // anc0 back to |0>
cx r[1], s[1];                  // s1 := e1
ccx_ct s[2], s[1], anc[0];      // anc0 = e2 & e1 (reused)
ccx_ct anc[0], r[0], anc[1];    // anc1 = e2 & e1 & r0
ccx_ct anc[1], s[0], over[0];   // over ^= e2 & e1 & g0
ccx_ct anc[0], r[0], anc[1];    // anc1 back to |0>
                                // (forgotten: ccx_ct s[2], s[1], anc[0];)
cx r[1], s[1];                  // restore the setpoint
cx r[2], s[2];
x s;
