//===- StandardLibrary.cpp - The built-in qelib1.inc ---------------------===//
#include "revbound/qasm/StandardLibrary.h"

namespace revbound::qasm {

// The first part is the standard's qelib1.inc (OpenQASM 2.0, Cross et al.,
// arXiv:1707.03429), gate for gate with the same bodies. The second part adds
// gates that published circuits call without defining them. Each is written
// from its textbook circuit identity (Nielsen & Chuang, "Quantum Computation
// and Quantum Information", 2000, sections 4.2-4.3, for the controlled
// rotations and Fredkin; the others as noted); the unitaries are checked in
// tests/ir/UnitaryTest.cpp and tests/corpus/StandardLibraryTest.cpp.
static const char LibraryText[] = R"QASM(// revbound built-in standard library
gate u3(theta,phi,lambda) q { U(theta,phi,lambda) q; }
gate u2(phi,lambda) q { U(pi/2,phi,lambda) q; }
gate u1(lambda) q { U(0,0,lambda) q; }
gate cx c,t { CX c,t; }
gate id a { U(0,0,0) a; }
gate x a { u3(pi,0,pi) a; }
gate y a { u3(pi,pi/2,pi/2) a; }
gate z a { u1(pi) a; }
gate h a { u2(0,pi) a; }
gate s a { u1(pi/2) a; }
gate sdg a { u1(-pi/2) a; }
gate t a { u1(pi/4) a; }
gate tdg a { u1(-pi/4) a; }
gate rx(theta) a { u3(theta,-pi/2,pi/2) a; }
gate ry(theta) a { u3(theta,0,0) a; }
gate rz(phi) a { u1(phi) a; }
gate cz a,b { h b; cx a,b; h b; }
gate cy a,b { sdg b; cx a,b; s b; }
gate ch a,b {
h b; sdg b;
cx a,b;
h b; t b;
cx a,b;
t b; h b; s b; x b; s a;
}
gate ccx a,b,c
{
  h c;
  cx b,c; tdg c;
  cx a,c; t c;
  cx b,c; tdg c;
  cx a,c; t b; t c; h c;
  cx a,b; t a; tdg b;
  cx a,b;
}
gate crz(lambda) a,b
{
  u1(lambda/2) b;
  cx a,b;
  u1(-lambda/2) b;
  cx a,b;
}
gate cu1(lambda) a,b
{
  u1(lambda/2) a;
  cx a,b;
  u1(-lambda/2) b;
  cx a,b;
  u1(lambda/2) b;
}
gate cu3(theta,phi,lambda) c, t
{
  u1((lambda-phi)/2) t;
  cx c,t;
  u3(-theta/2,0,-(phi+lambda)/2) t;
  cx c,t;
  u3(theta/2,phi,0) t;
}
// --- beyond the standard's qelib1.inc ---
// U(theta,phi,lambda) under the names later libraries use.
gate u(theta,phi,lambda) q { U(theta,phi,lambda) q; }
// Phase gate diag(1, e^{i lambda}), the same operator as u1.
gate p(lambda) q { U(0,0,lambda) q; }
// Idle gate with a duration parameter; the identity.
gate u0(gamma) q { U(0,0,0) q; }
// Square root of X: H S H = (1/2)[[1+i,1-i],[1-i,1+i]] exactly.
gate sx a { h a; s a; h a; }
gate sxdg a { h a; sdg a; h a; }
// Swap as three CNOTs (Nielsen & Chuang, figure 1.7).
gate swap a,b { cx a,b; cx b,a; cx a,b; }
// Fredkin: CNOT(c->b), Toffoli(a,b->c), CNOT(c->b).
gate cswap a,b,c { cx c,b; ccx a,b,c; cx c,b; }
// Controlled phase, the same circuit as cu1.
gate cp(lambda) a,b
{
  p(lambda/2) a;
  cx a,b;
  p(-lambda/2) b;
  cx a,b;
  p(lambda/2) b;
}
// Controlled rotations by the A X B X C construction (Nielsen & Chuang,
// corollary 4.2 and figure 4.6).
gate cry(theta) a,b { ry(theta/2) b; cx a,b; ry(-theta/2) b; cx a,b; }
gate crx(theta) a,b
{
  s b;
  cx a,b;
  ry(-theta/2) b;
  cx a,b;
  ry(theta/2) b;
  sdg b;
}
// Two-qubit rotations exp(-i theta/2 P(x)P) by basis change around
// CNOT-RZ-CNOT.
gate rzz(theta) a,b { cx a,b; rz(theta) b; cx a,b; }
gate rxx(theta) a,b { h a; h b; cx a,b; rz(theta) b; cx a,b; h a; h b; }
gate ryy(theta) a,b
{
  rx(pi/2) a; rx(pi/2) b;
  cx a,b; rz(theta) b; cx a,b;
  rx(-pi/2) a; rx(-pi/2) b;
}
// Controlled sqrt(X) = controlled-(H S H).
gate csx a,b { h b; cu1(pi/2) a,b; h b; }
// Controlled-(e^{i gamma} u3(theta,phi,lambda)) where u3 carries the phase
// e^{i(phi+lambda)/2} relative to OpenQASM's U, as later libraries define
// cu; cu3 here is controlled-U, so the control takes both phases.
gate cu(theta,phi,lambda,gamma) c,t
{
  p(gamma+(phi+lambda)/2) c;
  cu3(theta,phi,lambda) c,t;
}
)QASM";

llvm::StringRef builtinLibraryText() {
  return llvm::StringRef(LibraryText, sizeof(LibraryText) - 1);
}

} // namespace revbound::qasm
