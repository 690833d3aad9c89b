//===- ReportCommandTest.cpp - `revbound report` as a user runs it --------===//
//
// Runs the real executable: exit codes (DESIGN.md: 0 ok, 2 bad input or
// usage), JSON contract fields, determinism, standard input, -o.
//
//===----------------------------------------------------------------------===//
#include "ToolRunner.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <sys/wait.h>
#include <unistd.h>

namespace fs = std::filesystem;

namespace {

using revbound::test::Outcome;
using revbound::test::slurp;

class ReportCommand : public revbound::test::ToolTest {
protected:

};

const char *Bell = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                   "qreg q[2];\ncreg c[2];\nh q[0];\ncx q[0], q[1];\n"
                   "measure q -> c;\n";

} // namespace

TEST_F(ReportCommand, JsonContract) {
  write("bell.qasm", Bell);
  Outcome R = invoke("report --format json bell.qasm");
  ASSERT_EQ(R.Exit, 0) << R.Err;
  nlohmann::json J = nlohmann::json::parse(R.Out);
  EXPECT_EQ(J["schema"], "revbound/report-1");
  ASSERT_EQ(J["circuits"].size(), 1u);
  const nlohmann::json &C = J["circuits"][0];
  EXPECT_EQ(C["file"], "bell.qasm");
  EXPECT_EQ(C["qubits"], 2);
  EXPECT_EQ(C["clbits"], 2);
  EXPECT_EQ(C["ops"]["by_name"]["h"], 1);
  EXPECT_EQ(C["ops"]["by_name"]["cx"], 1);
  EXPECT_EQ(C["ops"]["primitive"]["U"], 1);
  EXPECT_EQ(C["ops"]["primitive"]["CX"], 1);
  EXPECT_EQ(C["ops"]["gates"], 2);
  EXPECT_EQ(C["ops"]["measure"], 2);
  EXPECT_EQ(C["depth"]["all"], 3);
  EXPECT_EQ(C["depth"]["two_qubit"], 1);
  EXPECT_EQ(C["critical_path"]["length"], 3);
  // Two orthogonal steps (h, cx: L = pi/2) of action pi hbar / 2 = h / 4
  // each (Margolus & Levitin, Physica D 120, 188 (1998)).
  EXPECT_NEAR(C["speed"]["action_Js"].get<double>(), 2 * 6.62607015e-34 / 4, 1e-46);
  EXPECT_EQ(C["speed"]["orthogonal_ops"], 2);
  EXPECT_TRUE(C["speed"]["energy_J"].is_null());
  EXPECT_TRUE(C["speed"]["time_s"]["pooled"].is_null());
  // Two measures into bits known to be 0 overwrite nothing (DESIGN.md,
  // "Erasure ledger"), and nothing is discarded.
  EXPECT_EQ(C["erasures"]["events"], 0);
  EXPECT_EQ(C["erasures"]["entropy_bits"]["high"], 0.0);
  EXPECT_TRUE(C["ancillas"].empty());
  EXPECT_EQ(C["landauer"]["temperature_K"], 300.0);
  EXPECT_EQ(C["landauer"]["heat_J"]["low"], 0.0);
}

TEST_F(ReportCommand, DeterministicAndStdin) {
  write("bell.qasm", Bell);
  Outcome A = invoke("report --format json bell.qasm");
  Outcome B = invoke("report --format json bell.qasm");
  EXPECT_EQ(A.Out, B.Out);
  Outcome S = invoke("report --format json -", Bell);
  ASSERT_EQ(S.Exit, 0) << S.Err;
  EXPECT_EQ(nlohmann::json::parse(S.Out)["circuits"][0]["file"], "<stdin>");
}

TEST_F(ReportCommand, SeveralFilesAndOutputFile) {
  write("a.qasm", Bell);
  write("b.qasm", "OPENQASM 2.0;\nqreg q[1];\nU(0,0,0) q[0];\n");
  Outcome R = invoke("report --format json -o out.json a.qasm b.qasm");
  ASSERT_EQ(R.Exit, 0) << R.Err;
  EXPECT_EQ(R.Out, "");
  nlohmann::json J = nlohmann::json::parse(slurp(Dir / "out.json"));
  ASSERT_EQ(J["circuits"].size(), 2u);
  EXPECT_EQ(J["circuits"][1]["file"], "b.qasm");
  // No temporary file is left beside the output.
  int Files = 0;
  for (const auto &E : fs::directory_iterator(Dir))
    Files += E.path().filename().string().find(".tmp-") != std::string::npos;
  EXPECT_EQ(Files, 0);
}

TEST_F(ReportCommand, BadInputExitsTwoWithDiagnostic) {
  write("bad.qasm", "OPENQASM 2.0;\nqreg q[2];\nCX q[0], q[0];\n");
  write("good.qasm", Bell);
  Outcome R = invoke("report good.qasm bad.qasm");
  EXPECT_EQ(R.Exit, 2);
  EXPECT_EQ(R.Out, "");
  EXPECT_EQ(R.Err,
            "bad.qasm:3:10: error: qubit q[0] is used twice in one application of 'CX'\n"
            "CX q[0], q[0];\n"
            "         ^~~~\n");
  Outcome Missing = invoke("report nope.qasm");
  EXPECT_EQ(Missing.Exit, 2);
  EXPECT_NE(Missing.Err.find("cannot open 'nope.qasm'"), std::string::npos);
}

TEST_F(ReportCommand, UsageErrorsExitTwo) {
  EXPECT_EQ(invoke("").Exit, 2);
  EXPECT_EQ(invoke("report").Exit, 2);
  write("bell.qasm", Bell);
  EXPECT_EQ(invoke("report --format yaml bell.qasm").Exit, 2);
  EXPECT_EQ(invoke("report --bogus bell.qasm").Exit, 2);
  // Ops are indexed in 32 bits (docs/limits.md); a larger limit would let
  // the indices wrap.
  Outcome Big = invoke("report --max-ops 4294967295 bell.qasm");
  EXPECT_EQ(Big.Exit, 2);
  EXPECT_NE(Big.Err.find("--max-ops"), std::string::npos) << Big.Err;
  EXPECT_EQ(invoke("report --help").Exit, 0);
}

TEST_F(ReportCommand, WarningsDoNotChangeTheExitCode) {
  write("nohead.qasm", "include \"qelib1.inc\";\nqreg q[1];\nx q[0];\n");
  Outcome R = invoke("report --format json nohead.qasm");
  EXPECT_EQ(R.Exit, 0);
  EXPECT_NE(R.Err.find("warning: missing 'OPENQASM 2.0;' header"), std::string::npos);
  nlohmann::json J = nlohmann::json::parse(R.Out);
  EXPECT_EQ(J["circuits"][0]["warnings"].size(), 1u);
}

// Counts past 2^53 must be exact JSON integers: 2^60 x gates through 60
// levels of doubling definitions (2^60 = 1152921504606846976, exact).
TEST_F(ReportCommand, HugeCountsAreExactIntegers) {
  std::string Text = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\ngate g0 a { x a; }\n";
  for (int K = 1; K <= 60; ++K)
    Text += "gate g" + std::to_string(K) + " a { g" + std::to_string(K - 1) +
            " a; g" + std::to_string(K - 1) + " a; }\n";
  Text += "qreg q[1];\ng60 q[0];\n";
  write("huge.qasm", Text);
  Outcome R = invoke("report --format json huge.qasm");
  ASSERT_EQ(R.Exit, 0) << R.Err;
  EXPECT_NE(R.Out.find("\"gates\": 1152921504606846976"), std::string::npos);
  EXPECT_NE(R.Out.find("\"all\": 1152921504606846976"), std::string::npos);
  // Four more doublings pass 2^64 - 1: an error, not a wrapped count.
  for (int K = 61; K <= 64; ++K)
    Text.insert(Text.find("qreg"), "gate g" + std::to_string(K) + " a { g" +
                                       std::to_string(K - 1) + " a; g" +
                                       std::to_string(K - 1) + " a; }\n");
  Text.replace(Text.find("g60 q[0]"), 3, "g64");
  write("huger.qasm", Text);
  R = invoke("report huger.qasm");
  EXPECT_EQ(R.Exit, 2);
  EXPECT_NE(R.Err.find("passes 2^64-1"), std::string::npos);
}

TEST_F(ReportCommand, UnknownNativeNameAndCommand) {
  write("bell.qasm", Bell);
  Outcome R = invoke("report --native nosuch bell.qasm");
  EXPECT_EQ(R.Exit, 0);
  EXPECT_EQ(R.Err, "bell.qasm: warning: --native names 'nosuch', which is not "
                   "a gate the file defines\n");
  R = invoke("frob bell.qasm");
  EXPECT_EQ(R.Exit, 2);
  EXPECT_EQ(R.Err, "revbound: unknown command 'frob'; expected one of: report gates check compare\n");
}

TEST_F(ReportCommand, OpaqueGatesInThePrimitiveCounts) {
  write("op.qasm", "OPENQASM 2.0;\nopaque magic a;\nqreg q[1];\nmagic q[0];\n"
                   "U(0,0,0) q[0];\n");
  Outcome R = invoke("report --format json op.qasm");
  ASSERT_EQ(R.Exit, 0) << R.Err;
  nlohmann::json P = nlohmann::json::parse(R.Out)["circuits"][0]["ops"]["primitive"];
  EXPECT_EQ(P["U"], 1);
  EXPECT_EQ(P["opaque"], 1);
}

// File names need not be UTF-8; the JSON stays valid.
TEST_F(ReportCommand, NonUtf8FileName) {
  write("bad\xff.qasm", Bell);
  Outcome R = invoke("report --format json 'bad\xff.qasm'");
  ASSERT_EQ(R.Exit, 0) << R.Err;
  EXPECT_EQ(nlohmann::json::parse(R.Out)["circuits"][0]["file"], "bad\xEF\xBF\xBD.qasm");
}

TEST_F(ReportCommand, EnergiesAndBadUnits) {
  write("bell.qasm", Bell);
  Outcome R = invoke("report --format json --energy 1J --energy-per-qubit 1J bell.qasm");
  ASSERT_EQ(R.Exit, 0) << R.Err;
  nlohmann::json S = nlohmann::json::parse(R.Out)["circuits"][0]["speed"];
  // Pooled: 2 x h/4 at 1 J; per qubit: h (1 qubit) then cx (2 qubits).
  EXPECT_NEAR(S["time_s"]["pooled"].get<double>(), 2 * 6.62607015e-34 / 4, 1e-46);
  EXPECT_NEAR(S["time_s"]["per_qubit"].get<double>(),
              6.62607015e-34 / 4 + 6.62607015e-34 / 8, 1e-46);
  R = invoke("report --energy 3K bell.qasm");
  EXPECT_EQ(R.Exit, 2);
  EXPECT_EQ(R.Err, "revbound: error: --energy: 'K' is not a unit of energy; use "
                   "J or eV with an SI prefix (e.g. 1eV, 3 meV, 2e-20 J)\n");
  R = invoke("report --gate-angle magic bell.qasm");
  EXPECT_EQ(R.Exit, 2);
  EXPECT_EQ(R.Err, "revbound: error: --gate-angle 'magic': expected NAME=RADIANS\n");
}
