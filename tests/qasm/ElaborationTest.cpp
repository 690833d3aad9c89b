//===- ElaborationTest.cpp - Broadcasting, conditions, weak definitions ---===//
//
// Semantics from the OpenQASM 2.0 specification (Cross et al.,
// arXiv:1707.03429, section 3): a statement over registers of size n means n
// applications, single qubits being repeated; measure and reset broadcast the
// same way; `if(c==n)` compares the whole register, its first bit the least
// significant.
//
//===----------------------------------------------------------------------===//
#include "TestSupport.h"

#include <gtest/gtest.h>

using revbound::test::elaborate;
using namespace revbound;

static std::vector<std::vector<uint32_t>> wiresOf(const ir::Circuit &C) {
  std::vector<std::vector<uint32_t>> Out;
  for (const ir::Op &O : C.Ops) {
    auto W = C.wires(O);
    Out.emplace_back(W.begin(), W.end());
  }
  return Out;
}

TEST(Elaboration, BroadcastRegistersAndSingles) {
  test::Elaborated E = elaborate("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                                 "qreg a[3];\nqreg b[3];\n"
                                 "cx a, b;\ncx a[0], b;\nh a;\n");
  ASSERT_TRUE(E.Circuit) << E.Error;
  // a = qubits 0..2, b = 3..5.
  EXPECT_EQ(wiresOf(*E.Circuit),
            (std::vector<std::vector<uint32_t>>{
                {0, 3}, {1, 4}, {2, 5}, {0, 3}, {0, 4}, {0, 5}, {0}, {1}, {2}}));
}

TEST(Elaboration, MeasureResetAndBarrierBroadcast) {
  test::Elaborated E = elaborate("OPENQASM 2.0;\nqreg q[2];\nqreg r[1];\n"
                                 "creg c[2];\nmeasure q->c;\nreset q;\n"
                                 "barrier q, r[0], q[1];\n");
  ASSERT_TRUE(E.Circuit) << E.Error;
  const ir::Circuit &C = *E.Circuit;
  ASSERT_EQ(C.Ops.size(), 5u);
  EXPECT_EQ(C.Ops[0].Kind, ir::OpKind::Measure);
  EXPECT_EQ(wiresOf(C),
            (std::vector<std::vector<uint32_t>>{{0, 0}, {1, 1}, {0}, {1}, {0, 1, 2}}));
  EXPECT_EQ(C.Ops[4].Kind, ir::OpKind::Barrier);
}

TEST(Elaboration, PublishedFileQuirks) {
  // Gate argument names equal to register names, a gate named id, a
  // parameter named lambda, CRLF, tabs, a space before '(', no final newline
  // (all seen in the standard's examples and QASMBench; SOURCES.md).
  test::Elaborated E = elaborate(
      "OPENQASM 2.0;\r\ninclude \"qelib1.inc\";\r\n"
      "qreg q[2];\tqreg a[1];\r\n"
      "gate mine(lambda) q, a { u1 (lambda) q; cx q,a; id a; }\r\n"
      "mine (pi/4) q[0], a[0]; id q[1];\r\nmeasure q[0]->q[0];");
  EXPECT_NE(E.Error, "");
  E = elaborate("OPENQASM 2.0;\r\ninclude \"qelib1.inc\";\r\n"
                "qreg q[2];\tqreg a[1];\tcreg c[1];\r\n"
                "gate mine(lambda) q, a { u1 (lambda) q; cx q,a; id a; }\r\n"
                "mine (pi/4) q[0], a[0]; id q[1];\r\nmeasure q[0]->c[0];");
  ASSERT_TRUE(E.Circuit) << E.Error;
  EXPECT_EQ(E.Circuit->Ops.size(), 3u);
}

TEST(Elaboration, ConditionsWiderThan64Bits) {
  // 2^70 - 1 = 1180591620717411303423 fits a 70-bit register exactly.
  test::Elaborated E = elaborate("OPENQASM 2.0;\nqreg q[1];\ncreg c[70];\n"
                                 "if(c==1180591620717411303423) U(0,0,0) q[0];\n");
  ASSERT_TRUE(E.Circuit) << E.Error;
  ASSERT_EQ(E.Circuit->Conditions.size(), 1u);
  const ir::Condition &Cd = E.Circuit->Conditions[0];
  EXPECT_FALSE(Cd.Unsatisfiable);
  EXPECT_EQ(Cd.Value.getBitWidth(), 70u);
  EXPECT_TRUE(Cd.Value.isAllOnes());
  // 2^70 needs 71 bits: it can never hold, and we say so.
  E = elaborate("OPENQASM 2.0;\nqreg q[1];\ncreg c[70];\n"
                "if(c==1180591620717411303424) U(0,0,0) q[0];\n");
  ASSERT_TRUE(E.Circuit) << E.Error;
  EXPECT_TRUE(E.Circuit->Conditions[0].Unsatisfiable);
  EXPECT_EQ(E.Warnings.size(), 1u);
}

TEST(Elaboration, LibraryGatesAreWeak) {
  test::Elaborated E = elaborate(
      "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
      "gate h a { U(pi/2,0,pi) a; }\ngate cx a, b { CX a, b; }\n"
      "qreg q[2];\nh q[0];\ncx q[0], q[1];\n");
  ASSERT_TRUE(E.Circuit) << E.Error;
  const ir::Circuit &C = *E.Circuit;
  EXPECT_EQ(C.gate(C.GateByName.lookup("h")).Origin, ir::GateOrigin::User);
  EXPECT_EQ(C.gate(C.GateByName.lookup("cx")).Origin, ir::GateOrigin::User);
  EXPECT_EQ(C.gate(C.GateByName.lookup("ccx")).Origin,
            ir::GateOrigin::StandardLibrary);
}

TEST(Elaboration, OpaqueGates) {
  test::Elaborated E = elaborate("OPENQASM 2.0;\nopaque magic(a, b) x, y;\n"
                                 "qreg q[2];\nmagic(1, 2) q[0], q[1];\n");
  ASSERT_TRUE(E.Circuit) << E.Error;
  EXPECT_EQ(E.Circuit->gate(E.Circuit->Ops[0].Gate).Origin, ir::GateOrigin::Opaque);
  EXPECT_EQ(E.Circuit->params(E.Circuit->Ops[0]), (llvm::ArrayRef<double>{1, 2}));
}

TEST(Elaboration, OpLimit) {
  qasm::FrontendOptions Opts;
  Opts.Limits.MaxOps = 4;
  EXPECT_EQ(elaborate("OPENQASM 2.0;\nqreg q[5];\nU(0,0,0) q;\n", Opts).Error,
            "test.qasm:3:1: error: more than 4 top-level operations after "
            "broadcasting (--max-ops)\n"
            "U(0,0,0) q;\n"
            "^\n");
}

// The IR indexes wires and parameter values in 32 bits; FrontendLimits
// lowers the bound so that a test reaches it.
TEST(Elaboration, PoolEntryLimit) {
  qasm::FrontendOptions Opts;
  Opts.Limits.MaxPoolEntries = 5;
  // The diagnostic at `Line`, whose statement is `Statement`.
  auto PoolsFull = [](unsigned Line, const std::string &Statement) {
    return "test.qasm:" + std::to_string(Line) +
           ":1: error: the top-level operations pass 5 wires or parameter "
           "values in all; revbound indexes them in 32 bits\n" +
           Statement + "\n^\n";
  };
  // Wires: the third cx brings them to six.
  EXPECT_EQ(elaborate("OPENQASM 2.0;\nqreg q[3];\nCX q[0],q[1];\n"
                      "CX q[1],q[2];\nCX q[0],q[2];\n",
                      Opts)
                .Error,
            PoolsFull(5, "CX q[0],q[2];"));
  // A barrier's wires, and a broadcast's.
  EXPECT_EQ(elaborate("OPENQASM 2.0;\nqreg q[6];\nbarrier q;\n", Opts).Error,
            PoolsFull(3, "barrier q;"));
  EXPECT_EQ(elaborate("OPENQASM 2.0;\nqreg q[6];\nU(0,0,0) q;\n", Opts).Error,
            PoolsFull(3, "U(0,0,0) q;"));
  // Parameter values: U takes three, so the second U passes five.
  EXPECT_EQ(elaborate("OPENQASM 2.0;\nqreg q[1];\nU(0,0,0) q[0];\n"
                      "U(0,0,0) q[0];\n",
                      Opts)
                .Error,
            PoolsFull(4, "U(0,0,0) q[0];"));
  // At the bound exactly, nothing is wrong.
  EXPECT_EQ(elaborate("OPENQASM 2.0;\nqreg q[5];\nbarrier q;\n", Opts).Error,
            "");
}

// Checks that a library gate replaced after use takes effect from the
// replacement on (the name caches must not keep the old definition).
TEST(Elaboration, LibraryGateReplacedAfterUse) {
  test::Elaborated E = elaborate("OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[1];\n"
                                 "h q[0];\ngate h a { U(0,0,0) a; }\nh q[0];\n");
  ASSERT_TRUE(E.Circuit) << E.Error;
  EXPECT_EQ(E.Circuit->gate(E.Circuit->Ops[0].Gate).Origin,
            ir::GateOrigin::StandardLibrary);
  EXPECT_EQ(E.Circuit->gate(E.Circuit->Ops[1].Gate).Origin, ir::GateOrigin::User);
}
