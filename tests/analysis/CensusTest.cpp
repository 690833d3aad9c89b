//===- CensusTest.cpp - Counts through definitions and granularities ------===//
#include "TestSupport.h"

#include <gtest/gtest.h>

#include <cstdlib>
#include <unistd.h>

using namespace revbound;
using test::analyzeText;
using test::countOf;

static const char *Header = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n";

// The expansion counts of qelib1.inc gates follow from the standard's own
// definitions (Cross et al., arXiv:1707.03429, figure of qelib1.inc): ccx is
// 6 cx + 9 one-qubit gates (h, t, tdg), each one-qubit gate one U.
TEST(Census, NativeAndPrimitiveCountsOfToffoli) {
  auto R = analyzeText(std::string(Header) + "qreg q[3];\nccx q[0], q[1], q[2];\n");
  ASSERT_TRUE(R);
  EXPECT_EQ(countOf(R->Ops.ByName, "ccx"), 1u);
  EXPECT_EQ(R->Ops.Gates, 1u);
  EXPECT_EQ(R->Ops.TwoQubit, 1u);
  EXPECT_EQ(R->Ops.PrimitiveCX, 6u);
  EXPECT_EQ(R->Ops.PrimitiveU, 9u);
  EXPECT_EQ(R->Ops.TCount, 0u); // a native ccx is one leaf, not seven T gates

  report::AnalysisOptions Prim;
  Prim.Policy.Level = analysis::Granularity::Primitive;
  R = analyzeText(std::string(Header) + "qreg q[3];\nccx q[0], q[1], q[2];\n", Prim);
  ASSERT_TRUE(R);
  EXPECT_EQ(countOf(R->Ops.ByName, "U"), 9u);
  EXPECT_EQ(countOf(R->Ops.ByName, "CX"), 6u);
  EXPECT_EQ(R->Ops.Gates, 15u);
  // 7 of the 9 one-qubit gates are t or tdg: U(0,0,+-pi/4) at primitive level.
  EXPECT_EQ(R->Ops.TCount, 7u);
}

TEST(Census, UserGatesExpandAndNativeKeepsThemWhole) {
  std::string Text = std::string(Header) +
                     "gate pair a, b { h a; cx a, b; }\n"
                     "qreg q[4];\npair q[0], q[1];\npair q[2], q[3];\nx q;\n";
  auto R = analyzeText(Text);
  ASSERT_TRUE(R);
  EXPECT_EQ(countOf(R->Ops.AsWritten, "pair"), 2u);
  EXPECT_EQ(countOf(R->Ops.AsWritten, "x"), 4u);
  EXPECT_EQ(countOf(R->Ops.ByName, "h"), 2u);
  EXPECT_EQ(countOf(R->Ops.ByName, "cx"), 2u);
  EXPECT_EQ(countOf(R->Ops.ByName, "pair"), 0u);
  report::AnalysisOptions Native;
  Native.Policy.NativeNames.insert("pair");
  R = analyzeText(Text, Native);
  ASSERT_TRUE(R);
  EXPECT_EQ(countOf(R->Ops.ByName, "pair"), 2u);
  EXPECT_EQ(R->Ops.Gates, 6u);
}

// T-count counts leaves equal to T or T-dagger up to global phase
// (DESIGN.md): rz(pi/4), u1(-pi/4), p(pi/4) and U(0, a, b) with a + b = pi/4.
TEST(Census, TCountByAngle) {
  auto R = analyzeText(std::string(Header) +
                       "qreg q[1];\nt q[0];\ntdg q[0];\nrz(pi/4) q[0];\n"
                       "u1(-pi/4) q[0];\np(pi/4) q[0];\nU(0,pi/8,pi/8) q[0];\n"
                       "rz(9*pi/4) q[0];\nrz(pi/2) q[0];\nrz(0.7854) q[0];\n"
                       "u3(0.1,0,pi/4) q[0];\n");
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Ops.TCount, 7u);
  EXPECT_EQ(R->DepthT, 7u);
}

TEST(Census, ParameterisedDefinitionsAreSummarisedPerAngle) {
  auto R = analyzeText(std::string(Header) +
                       "gate phase(a) q { rz(a) q; rz(a) q; }\n"
                       "qreg q[1];\nphase(pi/4) q[0];\nphase(pi/2) q[0];\n"
                       "phase(-pi/4) q[0];\n");
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Ops.TCount, 4u);
  EXPECT_EQ(R->Ops.Gates, 6u);
}

TEST(Census, NonUnitaryAndConditional) {
  auto R = analyzeText(std::string(Header) +
                       "qreg q[2];\ncreg c[2];\nh q;\nbarrier q;\nmeasure q -> c;\n"
                       "if(c==1) x q[0];\nreset q[1];\n");
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Ops.Measure, 2u);
  EXPECT_EQ(R->Ops.Reset, 1u);
  EXPECT_EQ(R->Ops.Barrier, 1u);
  EXPECT_EQ(R->Ops.Conditional, 1u);
  EXPECT_EQ(R->Ops.Gates, 3u);
}

TEST(Census, OpaqueGatesAreLeaves) {
  auto R = analyzeText("OPENQASM 2.0;\nopaque magic a, b;\nqreg q[2];\n"
                       "magic q[0], q[1];\n");
  ASSERT_TRUE(R);
  EXPECT_EQ(countOf(R->Ops.ByName, "magic"), 1u);
  EXPECT_EQ(R->Ops.PrimitiveU + R->Ops.PrimitiveCX, 0u);
  EXPECT_EQ(R->DepthAll, 1u);
}

// A native one-qubit leaf is T by its unitary; a gate calling it with its
// own parameter is summarised per angle (found in review: the first call's
// angle was reused).
TEST(Census, UnitaryTestedLeavesAreSummarisedPerAngle) {
  report::AnalysisOptions Opts;
  Opts.Policy.NativeNames.insert("myp");
  auto R = analyzeText("OPENQASM 2.0;\ngate myp(a) q { U(0,0,a) q; }\n"
                       "gate g(a) q { myp(a) q; }\nqreg q[1];\n"
                       "g(pi/2) q[0];\ng(pi/4) q[0];\ng(pi/4) q[0];\n",
                       Opts);
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Ops.TCount, 2u);
}

// The angle rule goes by name only where the name means the library's gate:
// a library that defines rz(phi) as u1(2 phi) gets the unitary test.
TEST(Census, AngleRuleCheckedAgainstTheDefinition) {
  std::string Lib = "gate u1(lambda) q { U(0,0,lambda) q; }\n"
                    "gate rz(phi) a { u1(2*phi) a; }\n";
  char Path[] = "/tmp/revbound-lib-XXXXXX";
  int Fd = mkstemp(Path);
  ASSERT_GE(Fd, 0);
  ASSERT_EQ(write(Fd, Lib.data(), Lib.size()), ssize_t(Lib.size()));
  close(Fd);
  qasm::FrontendOptions Front;
  Front.Parser.StandardLibraryPath = Path;
  auto R = analyzeText("OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[1];\n"
                       "rz(pi/4) q[0];\nrz(pi/8) q[0];\n",
                       {}, Front);
  unlink(Path);
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Ops.TCount, 1u); // rz(pi/8) is u1(pi/4) = T here
}
