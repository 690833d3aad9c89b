//===- DeviceScheduleTest.cpp - Durations files and device schedules ------===//
#include "TestSupport.h"
#include "revbound/config/Durations.h"
#include "revbound/support/Constants.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <unistd.h>

using namespace revbound;
namespace fs = std::filesystem;

namespace {

fs::path writeTemp(const std::string &Name, const std::string &Text) {
  fs::path P = fs::temp_directory_path() /
               ("revbound-dur-" + std::to_string(::getpid()) + "-" + Name);
  std::ofstream(P) << Text;
  return P;
}

std::string readError(const std::string &Text) {
  fs::path P = writeTemp("bad.toml", Text);
  config::ConfigError E;
  auto D = config::readDurations(P.string(), E);
  fs::remove(P);
  if (D)
    return "";
  std::string Out = E.format();
  return Out.substr(Out.find(".toml") + 5);
}

std::optional<report::CircuitReport> withDurations(const std::string &Body,
                                                   const std::string &Toml,
                                                   analysis::EnergyOptions E = {}) {
  fs::path P = writeTemp("d.toml", Toml);
  config::ConfigError Err;
  report::AnalysisOptions Opts;
  Opts.Durations = config::readDurations(P.string(), Err);
  fs::remove(P);
  EXPECT_TRUE(Opts.Durations) << Err.format();
  Opts.Energy = E;
  return test::analyzeText("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n" + Body, Opts);
}

} // namespace

TEST(Durations, FileErrorsNameTheLine) {
  EXPECT_EQ(readError("[durations]\ncx = \"3 kg\"\n"),
            ":2:6: error: 'kg' is not a unit of time; use s with an SI prefix "
            "(e.g. 1s, 20ns, 3 us)");
  EXPECT_EQ(readError("[limits]\ncx = 1\n"),
            ":1:1: error: unknown table 'limits'; a durations file holds only "
            "[durations]");
  EXPECT_EQ(readError("[durations]\ncx = true\n"),
            ":2:6: error: the duration of 'cx' must be a time such as \"20ns\" "
            "or a number of seconds");
  EXPECT_NE(readError("[durations\n"), "");
  EXPECT_EQ(readError("[durations]\ncx = \"20ns\"\ndefault = 1e-7\nrz = 0\n"), "");
}

// Hand-computed: x (50 ns) then cx (300 ns) on q[0], q[1], h (50 ns) on
// q[2] in parallel, then measure q[1] (1 us): 1.35 us.
TEST(DeviceSchedule, LongestPathWithDurations) {
  auto R = withDurations("qreg q[3];\ncreg c[1];\nx q[0];\ncx q[0], q[1];\nh q[2];\n"
                         "measure q[1] -> c[0];\n",
                         "[durations]\ndefault = \"50ns\"\ncx = \"300ns\"\n"
                         "measure = \"1us\"\n");
  ASSERT_TRUE(R && R->Speed.Device);
  EXPECT_NEAR(R->Speed.Device->ScheduleS, 1.35e-6, 1e-18);
}

TEST(DeviceSchedule, NestedDefinitionsAndKinds) {
  analysis::EnergyOptions E;
  E.EnergyPerQubitJ = 1e-24;
  auto R = withDurations("gate pair a, b { h a; cx a, b; }\nqreg q[2];\n"
                         "pair q[0], q[1];\npair q[1], q[0];\n",
                         "[durations]\nh = \"20ns\"\ncx = \"200ns\"\n", E);
  ASSERT_TRUE(R && R->Speed.Device);
  const analysis::DeviceComparison &D = *R->Speed.Device;
  EXPECT_NEAR(D.ScheduleS, 440e-9, 1e-18);
  ASSERT_EQ(D.Kinds.size(), 2u);
  // cx: action h/4 (orthogonal), step energy 2 x 1e-24 J: limit h/8e-24 s.
  const analysis::GateKindTiming &Cx = D.Kinds[0].Name == "cx" ? D.Kinds[0] : D.Kinds[1];
  EXPECT_EQ(Cx.Count, 2u);
  double Limit = si::PlanckJouleSeconds / 4 / 2e-24;
  EXPECT_NEAR(*Cx.LimitS, Limit, Limit * 1e-12);
  EXPECT_NEAR(*Cx.SlowerBy, 200e-9 / Limit, 200e-9 / Limit * 1e-12);
  ASSERT_TRUE(D.Ratio);
  EXPECT_NEAR(*D.Ratio, *R->Speed.Bounds.PerQubitTimeS / D.ScheduleS, 1e-12);
}

TEST(DeviceSchedule, MissingDurationIsAnError) {
  fs::path P = writeTemp("m.toml", "[durations]\nh = \"20ns\"\n");
  config::ConfigError Err;
  report::AnalysisOptions Opts;
  Opts.Durations = config::readDurations(P.string(), Err);
  fs::remove(P);
  test::Elaborated E = test::elaborate(
      "OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[2];\nh q[0];\ncx q[0], q[1];\n");
  ASSERT_TRUE(E.Circuit);
  llvm::Expected<report::CircuitReport> R =
      report::analyzeCircuit(*E.Circuit, *E.Files, "test.qasm", Opts);
  ASSERT_FALSE(bool(R));
  std::string Text;
  llvm::handleAllErrors(R.takeError(), [&](const DiagnosticError &D) {
    Text = formatDiagnostic(E.Files->mgr(), D.diagnostic());
  });
  EXPECT_EQ(Text, "test.qasm:5:1: error: the durations file gives no duration "
                  "for 'cx' and no default\n"
                  "cx q[0], q[1];\n"
                  "^\n");
}
