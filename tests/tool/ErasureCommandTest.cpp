//===- ErasureCommandTest.cpp - Roles, engines and heat from the CLI ------===//
//
// The erasure ledger as a user sees it: `//!` roles and --role, --engine,
// --temperature, the JSON fields of docs/json.md and the exit codes of
// DESIGN.md (2 for bad input or usage).
//
//===----------------------------------------------------------------------===//
#include "ToolRunner.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>

namespace {

using revbound::test::Outcome;

class ErasureCommand : public revbound::test::ToolTest {
protected:
  nlohmann::json circuit(const std::string &Args) {
    Outcome R = invoke("report --format json " + Args);
    EXPECT_EQ(R.Exit, 0) << R.Err;
    if (R.Exit != 0)
      return nlohmann::json::object();
    return nlohmann::json::parse(R.Out)["circuits"][0];
  }
};

// ccx computes a AND b into the ancilla, which a reset then erases.
const char *AndThenReset = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                           "//! input a, b\n"
                           "qreg a[1];\nqreg b[1];\nqreg anc[1];\n"
                           "ccx a[0], b[0], anc[0];\n"
                           "reset anc[0];\n";

// Binary entropy H2(1/4) = 2 - (3/4) log2 3 (Shannon, Bell Syst. Tech. J.
// 27, 379 (1948)); the AND of two uniform bits is 1 with probability 1/4.
const double H2Quarter = 2 - 0.75 * std::log2(3.0);
// k_B T ln 2 at 300 K with the SI 2019 k_B = 1.380649e-23 J/K (Landauer,
// IBM J. Res. Dev. 5, 183 (1961); BIPM SI Brochure, 9th ed., 2019).
const double LandauerAt300K = 2.870979e-21;

TEST_F(ErasureCommand, ResetOfAnAndIsChargedItsEntropy) {
  write("and.qasm", AndThenReset);
  nlohmann::json C = circuit("and.qasm");
  ASSERT_TRUE(C.contains("erasures"));
  const nlohmann::json &E = C["erasures"];
  EXPECT_EQ(E["engine"], "classical");
  EXPECT_EQ(E["events"], 1);
  ASSERT_EQ(E["list"].size(), 1u);
  const nlohmann::json &Ev = E["list"][0];
  EXPECT_EQ(Ev["kind"], "reset");
  EXPECT_EQ(Ev["wire"], "anc[0]");
  EXPECT_EQ(Ev["file"], "and.qasm");
  EXPECT_EQ(Ev["line"], 8);
  EXPECT_EQ(Ev["column"], 1);
  EXPECT_EQ(Ev["status"], "exact");
  EXPECT_NEAR(Ev["bits_low"].get<double>(), 0.811278, 1e-6);
  EXPECT_NEAR(Ev["bits_high"].get<double>(), H2Quarter, 1e-12);
  EXPECT_TRUE(E["entropy_bits"]["exact"].get<bool>());
  EXPECT_NEAR(C["landauer"]["heat_J"]["low"].get<double>(),
              H2Quarter * LandauerAt300K, 1e-26);
}

TEST_F(ErasureCommand, TemperatureScalesTheHeat) {
  write("and.qasm", AndThenReset);
  nlohmann::json Warm = circuit("and.qasm");
  nlohmann::json Cold = circuit("and.qasm --temperature 20mK");
  EXPECT_EQ(Cold["landauer"]["temperature_K"], 0.02);
  EXPECT_NEAR(Cold["landauer"]["heat_J"]["low"].get<double>() /
                  Warm["landauer"]["heat_J"]["low"].get<double>(),
              0.02 / 300, 1e-12);
  Outcome Bad = invoke("report and.qasm --temperature 1eV");
  EXPECT_EQ(Bad.Exit, 2);
  EXPECT_NE(Bad.Err.find("--temperature"), std::string::npos) << Bad.Err;
  Outcome Zero = invoke("report and.qasm --temperature 0K");
  EXPECT_EQ(Zero.Exit, 2);
}

TEST_F(ErasureCommand, RoleOptionWinsOverTheFile) {
  // Without inputs the AND is constant 0: its reset erases nothing.
  write("and.qasm", AndThenReset);
  nlohmann::json C = circuit("and.qasm --role a=output --role b=output");
  ASSERT_EQ(C["erasures"]["list"].size(), 1u);
  EXPECT_EQ(C["erasures"]["list"][0]["status"], "constant");
  EXPECT_EQ(C["erasures"]["entropy_bits"]["high"], 0.0);
}

TEST_F(ErasureCommand, DirtyAncillaHasACounterexample) {
  // The carry of a AND b is left in the ancilla: dirty exactly when both
  // inputs are 1.
  write("dirty.qasm", "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                      "//! input a\n//! ancilla anc\n"
                      "qreg a[2];\nqreg anc[1];\n"
                      "ccx a[0], a[1], anc[0];\n");
  nlohmann::json C = circuit("dirty.qasm");
  ASSERT_EQ(C["ancillas"].size(), 1u);
  EXPECT_EQ(C["ancillas"][0]["wire"], "anc[0]");
  EXPECT_EQ(C["ancillas"][0]["clean"], false);
  EXPECT_EQ(C["ancillas"][0]["counterexample"]["a"], "11");
  ASSERT_EQ(C["erasures"]["list"].size(), 1u);
  EXPECT_EQ(C["erasures"]["list"][0]["kind"], "discard");
  EXPECT_EQ(C["erasures"]["list"][0]["line"], 7);
  EXPECT_NEAR(C["erasures"]["list"][0]["bits_low"].get<double>(), H2Quarter,
              1e-12);
  // A dirty ancilla is not a failed check for `report`: exit 0 (the exit
  // code 1 belongs to `check`).
}

TEST_F(ErasureCommand, EngineChoiceIsReported) {
  write("and.qasm", AndThenReset);
  nlohmann::json S = circuit("and.qasm --engine structural");
  EXPECT_EQ(S["erasures"]["engine"], "structural");
  EXPECT_EQ(S["erasures"]["list"][0]["status"], "unknown");
  EXPECT_EQ(S["erasures"]["list"][0]["bits_high"], 1.0);
  nlohmann::json D = circuit("and.qasm --engine density");
  EXPECT_EQ(D["erasures"]["engine"], "density");
  EXPECT_NEAR(D["erasures"]["list"][0]["bits_low"].get<double>(), H2Quarter,
              1e-9);
  Outcome Bad = invoke("report and.qasm --engine quantum");
  EXPECT_EQ(Bad.Exit, 2);
}

TEST_F(ErasureCommand, DensityEngineTooWideIsAnError) {
  write("wide.qasm", "OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[3];\n"
                     "h q[0];\ncx q[0], q[1];\ncx q[1], q[2];\nreset q[0];\n");
  Outcome R = invoke("report wide.qasm --engine density --max-density-qubits 2");
  EXPECT_EQ(R.Exit, 2);
  EXPECT_NE(R.Err.find("wide.qasm"), std::string::npos) << R.Err;
}

TEST_F(ErasureCommand, RoleErrorsExitTwo) {
  write("and.qasm", AndThenReset);
  Outcome Undeclared = invoke("report and.qasm --role zz=input");
  EXPECT_EQ(Undeclared.Exit, 2);
  EXPECT_EQ(Undeclared.Err,
            "and.qasm: error: --role zz: 'zz' is not a declared quantum "
            "register\n");
  Outcome BadRole = invoke("report and.qasm --role a=helper");
  EXPECT_EQ(BadRole.Exit, 2);
  EXPECT_EQ(BadRole.Err, "revbound: error: --role a=helper: expected "
                         "NAME=ROLE with ROLE one of input, ancilla, output "
                         "or garbage\n");
  write("typo.qasm", "OPENQASM 2.0;\nqreg q[1];\n//! ancila q\n");
  Outcome Typo = invoke("report typo.qasm");
  EXPECT_EQ(Typo.Exit, 2);
  EXPECT_EQ(Typo.Err.substr(0, 70),
            "typo.qasm:3:5: error: unknown role 'ancila'; expected input, "
            "ancilla, ");
}

TEST_F(ErasureCommand, TextReportShowsTheLedger) {
  write("and.qasm", AndThenReset);
  Outcome R = invoke("report and.qasm");
  ASSERT_EQ(R.Exit, 0) << R.Err;
  EXPECT_NE(R.Out.find("and.qasm:8:1 reset anc[0]: 0.811278 bits"),
            std::string::npos)
      << R.Out;
  EXPECT_NE(R.Out.find("landauer"), std::string::npos);
}

} // namespace
