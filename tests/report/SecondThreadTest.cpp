//===- SecondThreadTest.cpp - The speed bounds' thread changes nothing ----===//
#include "TestSupport.h"

#include "revbound/report/Writers.h"

#include <gtest/gtest.h>

#include <fmt/format.h>

#include "llvm/Support/Error.h"

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

/// The message analyzeCircuit fails with, or "" when it does not.
static std::string failureOf(const std::string &Text,
                             const report::AnalysisOptions &Opts) {
  test::Elaborated E = test::elaborate(Text);
  if (!E.Circuit)
    return "elaboration failed: " + E.Error;
  llvm::Expected<report::CircuitReport> R =
      report::analyzeCircuit(*E.Circuit, *E.Files, "test.qasm", Opts);
  if (R)
    return "";
  return llvm::toString(R.takeError());
}

// The engine runs after the speed part on the second thread and reports
// its error only after the speed part's, as it does on one thread. A
// durations file without `h` fails the speed part (DeviceSchedule); the
// density engine refuses a circuit wider than its qubit limit.
TEST(SecondThread, SameFailureEitherWay) {
  std::string Text = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[3];\n"
                     "creg c[1];\nh q[0];\ncx q[0],q[1];\ncx q[1],q[2];\n"
                     "measure q[2] -> c[0];\nreset q[2];\n";
  for (bool SpeedFails : {false, true}) {
    SCOPED_TRACE(SpeedFails ? "speed and engine fail" : "engine fails");
    report::AnalysisOptions Alone, Beside;
    for (report::AnalysisOptions *O : {&Alone, &Beside}) {
      O->Engine.Choice = semantics::EngineChoice::Density;
      O->Engine.MaxDensityQubits = 1;
      if (SpeedFails)
        O->Durations = config::Durations{};
    }
    Alone.MinOpsForSecondThread = UINT64_MAX;
    Beside.MinOpsForSecondThread = 0;
    std::string A = failureOf(Text, Alone), B = failureOf(Text, Beside);
    EXPECT_NE(A, "");
    EXPECT_EQ(A, B);
    EXPECT_EQ(A.find("durations") != std::string::npos, SpeedFails) << A;
    EXPECT_EQ(A.find("density") != std::string::npos, !SpeedFails) << A;
  }
}
