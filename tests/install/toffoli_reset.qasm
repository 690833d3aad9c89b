// The Toffoli gate as the 7-T Clifford+T circuit of the ccx body in the
// OpenQASM 2.0 specification's qelib1.inc (Cross, Bishop, Smolin & Gambetta,
// arXiv:1707.03429), written out as a user gate so that it expands to its
// leaves, then a reset of the target: the AND of two random input bits is
// erased.
OPENQASM 2.0;
include "qelib1.inc";
//! input a, b
qreg a[1];
qreg b[1];
qreg c[1];
gate toffoli7 x, y, z
{
  h z;
  cx y, z; tdg z;
  cx x, z; t z;
  cx y, z; tdg z;
  cx x, z; t y; t z; h z;
  cx x, y; t x; tdg y;
  cx x, y;
}
toffoli7 a[0], b[0], c[0];
reset c[0];
