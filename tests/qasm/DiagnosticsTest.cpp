//===- DiagnosticsTest.cpp - Every front-end error, by its printed text ---===//
//
// Each test checks the whole printed diagnostic: file:line:col, the message,
// the source line and the caret line, as STYLE.md asks. The rules come from
// the OpenQASM 2.0 specification (Cross et al., arXiv:1707.03429).
//
//===----------------------------------------------------------------------===//
#include "TestSupport.h"
#include "revbound/analysis/Summary.h"

#include <gtest/gtest.h>

using revbound::test::elaborate;

static const char *Header = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n";

static std::string errorOf(const std::string &Body) {
  return elaborate(std::string(Header) + Body).Error;
}

TEST(Diagnostics, MissingSemicolonPointsAfterTheStatement) {
  EXPECT_EQ(errorOf("qreg q[2]\nh q;\n"),
            "test.qasm:3:10: error: expected ';' after the register declaration\n"
            "qreg q[2]\n"
            "         ^\n");
}

TEST(Diagnostics, UnexpectedToken) {
  EXPECT_EQ(errorOf("qreg q[2];\ncx q[0] q[1];\n"),
            "test.qasm:4:8: error: expected ';' after the gate call\n"
            "cx q[0] q[1];\n"
            "       ^\n");
  EXPECT_EQ(errorOf("qreg q[2];\n) q;\n"),
            "test.qasm:4:1: error: expected a statement, got ')'\n"
            ") q;\n"
            "^\n");
}

TEST(Diagnostics, BadBytesKeepTheLexerMessage) {
  EXPECT_EQ(errorOf("qreg q[2];\nh q[0]; $\n"),
            "test.qasm:4:9: error: unexpected character '$'\n"
            "h q[0]; $\n"
            "        ^\n");
  // Non-ASCII on the line: no caret, since it could not be aligned.
  EXPECT_EQ(errorOf("qreg q\xC3\xA9[2];\n"),
            "test.qasm:3:7: error: unexpected non-ASCII byte 0xC3 outside a comment\n"
            "qreg q\xC3\xA9[2];\n");
  std::string Nul = std::string(Header) + "qreg q[2];\nh q";
  Nul.push_back('\0');
  Nul += "[0];\n";
  EXPECT_EQ(elaborate(Nul).Error.substr(0, 42),
            "test.qasm:4:4: error: unexpected NUL byte\n");
}

TEST(Diagnostics, UnterminatedGateBody) {
  EXPECT_EQ(errorOf("gate g a {\n  h a;\n"),
            "test.qasm:5:1: error: unterminated gate body; expected '}'\n"
            "\n"
            "^\n"
            "test.qasm:3:10: note: the gate body opened here\n"
            "gate g a {\n"
            "         ^\n");
}

TEST(Diagnostics, UndeclaredAndRedeclaredNames) {
  EXPECT_EQ(errorOf("qreg q[2];\nh r[0];\n"),
            "test.qasm:4:3: error: use of undeclared quantum register 'r'\n"
            "h r[0];\n"
            "  ^\n");
  EXPECT_EQ(errorOf("qreg q[2];\ncreg q[2];\n"),
            "test.qasm:4:6: error: redeclaration of register 'q'\n"
            "creg q[2];\n"
            "     ^\n"
            "test.qasm:3:6: note: previous declaration is here\n"
            "qreg q[2];\n"
            "     ^\n");
  EXPECT_EQ(errorOf("qreg q[1];\nfoo q[0];\n"),
            "test.qasm:4:1: error: unknown gate 'foo'\n"
            "foo q[0];\n"
            "^~~\n");
  EXPECT_EQ(errorOf("gate g a { h a; }\ngate g b { x b; }\n"),
            "test.qasm:4:6: error: redefinition of gate 'g'\n"
            "gate g b { x b; }\n"
            "     ^\n"
            "test.qasm:3:6: note: previous definition is here\n"
            "gate g a { h a; }\n"
            "     ^\n");
}

TEST(Diagnostics, UseBeforeDeclaration) {
  EXPECT_EQ(errorOf("h q[0];\nqreg q[1];\n"),
            "test.qasm:3:3: error: use of undeclared quantum register 'q'\n"
            "h q[0];\n"
            "  ^\n");
  EXPECT_EQ(errorOf("qreg q[1];\nfoo q[0];\ngate foo a { x a; }\n"),
            "test.qasm:4:1: error: unknown gate 'foo'\n"
            "foo q[0];\n"
            "^~~\n");
}

TEST(Diagnostics, IndexOutOfRange) {
  EXPECT_EQ(errorOf("qreg q[2];\nh q[2];\n"),
            "test.qasm:4:5: error: index 2 is out of range for register 'q' of size 2\n"
            "h q[2];\n"
            "    ^\n"
            "test.qasm:3:6: note: register declared here\n"
            "qreg q[2];\n"
            "     ^\n");
}

TEST(Diagnostics, BroadcastSizeMismatch) {
  EXPECT_EQ(errorOf("qreg a[2];\nqreg b[3];\ncx a, b;\n"),
            "test.qasm:5:7: error: register 'b' has 3 wires but 'a' has 2; "
            "registers in one statement must have equal sizes\n"
            "cx a, b;\n"
            "      ^\n"
            "test.qasm:5:4: note: the first register operand is here\n"
            "cx a, b;\n"
            "   ^\n");
}

// "It is an error if the same qubit is used twice in a gate" applies to
// every gate, not only CX (specification, section 3).
TEST(Diagnostics, RepeatedQubitInEveryGate) {
  EXPECT_EQ(errorOf("qreg q[3];\nccx q[0], q[1], q[0];\n"),
            "test.qasm:4:17: error: qubit q[0] is used twice in one application of 'ccx'\n"
            "ccx q[0], q[1], q[0];\n"
            "                ^~~~\n");
  EXPECT_NE(errorOf("qreg q[2];\nCX q[1], q[1];\n"), "");
  EXPECT_NE(errorOf("qreg q[2];\nswap q, q[0];\n"), "");
  EXPECT_EQ(errorOf("gate g a, b { cx a, a; }\n"),
            "test.qasm:3:21: error: qubit 'a' is used twice in one gate application\n"
            "gate g a, b { cx a, a; }\n"
            "                    ^\n");
}

TEST(Diagnostics, WrongParameterAndQubitCounts) {
  EXPECT_EQ(errorOf("qreg q[2];\nrz q[0];\n"),
            "test.qasm:4:1: error: gate 'rz' takes 1 parameter, got 0\n"
            "rz q[0];\n"
            "^~\n");
  EXPECT_EQ(errorOf("qreg q[2];\nU(0,0) q[0];\n"),
            "test.qasm:4:1: error: gate 'U' takes 3 parameters, got 2\n"
            "U(0,0) q[0];\n"
            "^\n");
  EXPECT_EQ(errorOf("qreg q[2];\nh q[0], q[1];\n"),
            "test.qasm:4:1: error: gate 'h' acts on 1 qubit, got 2\n"
            "h q[0], q[1];\n"
            "^\n");
}

TEST(Diagnostics, IfNeedsAClassicalRegister) {
  EXPECT_EQ(errorOf("qreg q[1];\nif(q==1) x q[0];\n"),
            "test.qasm:4:4: error: 'q' is a quantum register; 'if' compares a classical register\n"
            "if(q==1) x q[0];\n"
            "   ^\n");
  EXPECT_EQ(errorOf("qreg q[1];\ncreg c[1];\nif(c[0]==1) x q[0];\n"),
            "test.qasm:5:5: error: 'if' compares a whole classical register; "
            "single bits cannot be tested in OpenQASM 2.0\n"
            "if(c[0]==1) x q[0];\n"
            "    ^\n");
  EXPECT_EQ(errorOf("qreg q[1];\nif(d==1) x q[0];\n"),
            "test.qasm:4:4: error: use of undeclared classical register 'd' in 'if'\n"
            "if(d==1) x q[0];\n"
            "   ^\n");
}

TEST(Diagnostics, MeasureSizeMismatch) {
  EXPECT_EQ(errorOf("qreg q[2];\ncreg c[3];\nmeasure q -> c;\n"),
            "test.qasm:5:14: error: measure maps 2 qubits onto 3 bits; a "
            "measurement needs a qubit and a bit, or two registers of equal size\n"
            "measure q -> c;\n"
            "             ^\n");
  EXPECT_EQ(errorOf("qreg q[2];\ncreg c[2];\nmeasure q -> c[0];\n"),
            "test.qasm:5:14: error: measure maps 2 qubits onto 1 bit; a "
            "measurement needs a qubit and a bit, or two registers of equal size\n"
            "measure q -> c[0];\n"
            "             ^~~~\n");
  EXPECT_EQ(errorOf("qreg q[2];\ncreg c[2];\nmeasure c -> q;\n"),
            "test.qasm:5:9: error: 'c' is a classical register; expected a quantum register\n"
            "measure c -> q;\n"
            "        ^\n");
}

TEST(Diagnostics, NumbersOutOfRange) {
  EXPECT_EQ(errorOf("qreg q[18446744073709551616];\n"),
            "test.qasm:3:8: error: integer '18446744073709551616' is out of "
            "range (at most 18446744073709551615)\n"
            "qreg q[18446744073709551616];\n"
            "       ^~~~~~~~~~~~~~~~~~~~\n");
  EXPECT_EQ(errorOf("qreg q[1];\nrz(1e400) q[0];\n"),
            "test.qasm:4:4: error: number '1e400' is out of the range of a double\n"
            "rz(1e400) q[0];\n"
            "   ^~~~~\n");
  EXPECT_EQ(errorOf("qreg q[1];\nrz(1/0) q[0];\n"),
            "test.qasm:4:5: error: parameter evaluates to a non-finite value\n"
            "rz(1/0) q[0];\n"
            "    ^\n");
  EXPECT_EQ(errorOf("qreg q[0];\n"),
            "test.qasm:3:8: error: a register needs at least one wire\n"
            "qreg q[0];\n"
            "       ^\n");
}

TEST(Diagnostics, QubitLimit) {
  revbound::qasm::FrontendOptions Opts;
  Opts.Limits.MaxQubits = 8;
  EXPECT_EQ(elaborate("qreg a[5];\nqreg b[4];\n", Opts).Error,
            "test.qasm:2:8: error: 9 qubits in all would exceed the limit of 8 "
            "(--max-qubits)\n"
            "qreg b[4];\n"
            "       ^\n");
}

TEST(Diagnostics, NestingLimit) {
  revbound::qasm::FrontendOptions Opts;
  Opts.Limits.MaxNesting = 2;
  EXPECT_EQ(elaborate("gate a q { U(0,0,0) q; }\ngate b q { a q; }\n"
                      "gate c q { b q; }\n",
                      Opts)
                .Error,
            "test.qasm:3:6: error: gate 'c' nests 3 levels of definitions, over "
            "the limit of 2 (--max-nesting)\n"
            "gate c q { b q; }\n"
            "     ^\n");
}

TEST(Diagnostics, GateBodyRules) {
  EXPECT_EQ(errorOf("gate g a { h b; }\n"),
            "test.qasm:3:14: error: 'b' is not a qubit argument of gate 'g'\n"
            "gate g a { h b; }\n"
            "             ^\n");
  EXPECT_EQ(errorOf("gate g a { g a; }\n"),
            "test.qasm:3:12: error: gate 'g' calls itself; a gate body may only "
            "call gates defined before it\n"
            "gate g a { g a; }\n"
            "           ^\n");
  EXPECT_EQ(errorOf("gate g(t) a { rz(s) a; }\n"),
            "test.qasm:3:18: error: 's' is not a parameter of this gate\n"
            "gate g(t) a { rz(s) a; }\n"
            "                 ^\n");
  EXPECT_EQ(errorOf("gate g a { measure a -> c; }\n"),
            "test.qasm:3:12: error: 'measure' is not allowed inside a gate body; "
            "a gate body holds only gate calls and barriers\n"
            "gate g a { measure a -> c; }\n"
            "           ^~~~~~~\n");
  EXPECT_EQ(errorOf("gate g a, a { h a; }\n"),
            "test.qasm:3:11: error: duplicate gate qubit argument 'a'\n"
            "gate g a, a { h a; }\n"
            "          ^\n"
            "test.qasm:3:8: note: first declared here\n"
            "gate g a, a { h a; }\n"
            "       ^\n");
  EXPECT_EQ(errorOf("gate CX a, b { }\n"),
            "test.qasm:3:6: error: cannot redefine the built-in gate 'CX'\n"
            "gate CX a, b { }\n"
            "     ^~\n");
}

TEST(Diagnostics, VersionAndHeader) {
  EXPECT_EQ(elaborate("OPENQASM 3;\nqubit[2] q;\n").Error,
            "test.qasm:1:10: error: unsupported OpenQASM version '3'; revbound "
            "reads OpenQASM 2.0\n"
            "OPENQASM 3;\n"
            "         ^\n");
  revbound::test::Elaborated E = elaborate("include \"qelib1.inc\";\nqreg q[1];\nh q;\n");
  ASSERT_TRUE(E.Circuit);
  ASSERT_EQ(E.Warnings.size(), 1u);
  EXPECT_EQ(E.Warnings[0],
            "test.qasm:1:1: warning: missing 'OPENQASM 2.0;' header; reading the "
            "file as OpenQASM 2.0\n"
            "include \"qelib1.inc\";\n"
            "^~~~~~~\n");
}

TEST(Diagnostics, UnsatisfiableConditionIsAWarning) {
  revbound::test::Elaborated E =
      elaborate(std::string(Header) + "qreg q[1];\ncreg c[2];\nif(c==4) x q[0];\n");
  ASSERT_TRUE(E.Circuit);
  ASSERT_EQ(E.Warnings.size(), 1u);
  EXPECT_EQ(E.Warnings[0],
            "test.qasm:5:7: warning: condition can never hold: register 'c' has "
            "2 bits and cannot equal 4\n"
            "if(c==4) x q[0];\n"
            "      ^\n");
}

// A non-finite angle inside a body is caught when the call is analysed, at
// the call site (an elaborated circuit is only checked for constants).
TEST(Diagnostics, NonFiniteParameterInsideABody) {
  auto E = elaborate(std::string(Header) + "gate g(x) a { U(1/x,0,0) a; }\n"
                                           "qreg q[1];\ng(0) q[0];\n");
  ASSERT_TRUE(E.Circuit) << E.Error;
  revbound::analysis::LeafPolicy Policy;
  revbound::analysis::SummaryCache Cache(*E.Circuit, Policy);
  const revbound::ir::Op &O = E.Circuit->Ops[0];
  llvm::Expected<const revbound::analysis::GateSummary *> S =
      Cache.get(O.Gate, E.Circuit->params(O), O.Loc);
  ASSERT_FALSE(bool(S));
  std::string Text;
  llvm::handleAllErrors(S.takeError(), [&](const revbound::DiagnosticError &D) {
    Text = revbound::formatDiagnostic(E.Files->mgr(), D.diagnostic());
  });
  EXPECT_EQ(Text, "test.qasm:5:1: error: a parameter of 'U' inside gate 'g' "
                  "evaluates to a non-finite value\n"
                  "g(0) q[0];\n"
                  "^\n");
}
