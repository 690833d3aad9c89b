//===- SecondThreadTest.cpp - The speed bounds' thread changes nothing ----===//
#include "TestSupport.h"

#include "revbound/report/Writers.h"

#include <gtest/gtest.h>

#include <fmt/format.h>

using namespace revbound;

// A circuit of our own (a mix of rotations, Cliffords and Toffolis with
// measurements and a reset, so that every part of the report is filled),
// reported with the speed bounds on the calling thread and on a second one:
// the JSON must be the same byte for byte (docs/json.md, determinism).
TEST(SecondThread, SameReportEitherWay) {
  std::string Text = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[6];\n"
                     "creg c[6];\n";
  for (int I = 0; I < 400; ++I)
    Text += fmt::format("rz({}) q[{}];\ncx q[{}],q[{}];\nh q[{}];\n"
                        "ccx q[{}],q[{}],q[{}];\nt q[{}];\n",
                        0.001 * I - 0.2, I % 6, I % 6, (I + 1) % 6, (I + 2) % 6,
                        I % 6, (I + 3) % 6, (I + 4) % 6, (I + 5) % 6);
  Text += "measure q -> c;\nreset q[0];\nmeasure q[0] -> c[0];\n";
  report::AnalysisOptions Alone, Beside;
  Alone.MinOpsForSecondThread = UINT64_MAX;
  Beside.MinOpsForSecondThread = 0;
  std::optional<report::CircuitReport> A = test::analyzeText(Text, Alone);
  std::optional<report::CircuitReport> B = test::analyzeText(Text, Beside);
  ASSERT_TRUE(A && B);
  EXPECT_GT(A->Speed.Bounds.Steps, 0u);
  EXPECT_EQ(report::writeJsonLine(*A), report::writeJsonLine(*B));
}
