// Demo scenario (invented for revbound): the step stage of a 4-bit program
// counter in a cryogenic pulse sequencer, written as a reversible
// ripple-carry adder b <- a + b with a carry-out, so that the stage can run
// without erasing bits. The adder is the MAJ/UMA construction of Cuccaro,
// Draper, Kutin and Moulton (quant-ph/0410184). After the read-out the
// sequencer clears the step register for the next cycle with resets: those
// are the stage's only erasures, and the carry-in ancilla must come back
// clean.
OPENQASM 2.0;
include "qelib1.inc";

// MAJ: carry into c, a and b turned into their XORs with the carry.
gate maj c, b, a { cx a, b; cx a, c; ccx c, b, a; }
// UMA: undo MAJ and leave the sum bit in b.
gate uma c, b, a { ccx c, b, a; cx a, c; cx c, b; }

//! input a, b
//! ancilla carry
qreg carry[1];   // carry-in, starts and must end at |0>
qreg a[4];       // the step size, any value
qreg b[4];       // the counter, any value, replaced by counter + step
qreg cout[1];    // carry-out
creg readout[5];

maj carry[0], b[0], a[0];
maj a[0], b[1], a[1];
maj a[1], b[2], a[2];
maj a[2], b[3], a[3];
cx a[3], cout[0];
uma a[2], b[3], a[3];
uma a[1], b[2], a[2];
uma a[0], b[1], a[1];
uma carry[0], b[0], a[0];

measure b[0] -> readout[0];
measure b[1] -> readout[1];
measure b[2] -> readout[2];
measure b[3] -> readout[3];
measure cout[0] -> readout[4];

// Clear the step register for the next cycle.
reset a;
