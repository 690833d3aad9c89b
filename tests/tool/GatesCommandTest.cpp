//===- GatesCommandTest.cpp - `revbound gates` as a user runs it ----------===//
//
// Runs the real executable: exit codes (DESIGN.md: 0 ok, 2 bad input or
// usage), the JSON form's schema and fields, --params, files, determinism.
// Expected values: gate angles from L(U) = max arccos |<psi|U|psi>| with the
// eigenvalues of Nielsen & Chuang's matrices (2000, sections 4.2-4.3): X, H,
// CX, CCX have eigenvalues +1 and -1, so pi/2; T = diag(1, e^{i pi/4}) gives
// pi/8; rz(theta) has eigenvalues e^{-+i theta/2}, so |theta|/2. ccx expands
// to 6 CX and 9 U in the standard's qelib1.inc (arXiv:1707.03429).
//
//===----------------------------------------------------------------------===//
#include "ToolRunner.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <numbers>
#include <sstream>
#include <sys/wait.h>
#include <unistd.h>

namespace fs = std::filesystem;
using std::numbers::pi;

namespace {

using revbound::test::Outcome;
using revbound::test::slurp;

class GatesCommand : public revbound::test::ToolTest {
protected:
  /// Runs with `Args` and parses standard output as JSON; fails on exit != 0.
  nlohmann::json json(const std::string &Args, const std::string &Stdin = "") {
    Outcome R = invoke(Args, Stdin);
    EXPECT_EQ(R.Exit, 0) << R.Err;
    if (R.Exit != 0)
      return nullptr;
    return nlohmann::json::parse(R.Out);
  }
};

/// The row of `J` named `Name` with origin `Origin` (null if none).
nlohmann::json row(const nlohmann::json &J, const std::string &Name,
                   const std::string &Origin = "library") {
  if (!J.is_object())
    return nullptr;
  for (const nlohmann::json &G : J["gates"])
    if (G["name"] == Name && G["origin"] == Origin)
      return G;
  return nullptr;
}

double angle(const nlohmann::json &Row) {
  if (!Row.is_object() || !Row["angle_rad"].is_number()) {
    ADD_FAILURE() << "no angle in " << Row.dump();
    return -1;
  }
  return Row["angle_rad"].get<double>();
}

const char *Own = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                  "gate flip a { x a; }\n"
                  "gate phase(th) a { rz(th) a; }\n"
                  "opaque magic b;\n";

} // namespace

TEST_F(GatesCommand, BuiltinLibraryJson) {
  nlohmann::json J = json("gates --format json");
  ASSERT_TRUE(J.is_object());
  EXPECT_EQ(J["schema"], "revbound/gates-1");
  EXPECT_TRUE(J["file"].is_null());
  EXPECT_EQ(J["library_included"], true);
  // The built-ins come first (OpenQASM 2.0 specification, section 3).
  EXPECT_EQ(J["gates"][0]["name"], "U");
  EXPECT_EQ(J["gates"][0]["origin"], "builtin");
  EXPECT_EQ(J["gates"][1]["name"], "CX");
  for (const char *G : {"x", "h", "cx", "ccx"})
    EXPECT_NEAR(angle(row(J, G)), pi / 2, 1e-9) << G;
  EXPECT_NEAR(angle(row(J, "t")), pi / 8, 1e-9);
  EXPECT_NEAR(angle(row(J, "s")), pi / 4, 1e-9);
  nlohmann::json Ccx = row(J, "ccx");
  EXPECT_EQ(Ccx["qubits"], 3);
  EXPECT_EQ(Ccx["class"], "permutation");
  EXPECT_EQ(Ccx["orthogonal"], true);
  EXPECT_EQ(Ccx["primitive"]["CX"], 6);
  EXPECT_EQ(Ccx["primitive"]["U"], 9);
  EXPECT_EQ(row(J, "h")["class"], "general");
  EXPECT_EQ(row(J, "y")["class"], "monomial");
  EXPECT_EQ(row(J, "cz")["class"], "diagonal");
  // Without values, rz's angle depends on theta: null, class for generic
  // values (rz is diagonal for every theta).
  nlohmann::json Rz = row(J, "rz");
  EXPECT_TRUE(Rz["angle_rad"].is_null());
  EXPECT_EQ(Rz["evaluation"], "generic");
  EXPECT_EQ(Rz["class"], "diagonal");
}

TEST_F(GatesCommand, ParamsGiveAngles) {
  nlohmann::json J =
      json("gates --format json --params rz=pi/4 --params 'u3=pi/2, 0, pi'");
  nlohmann::json Rz = row(J, "rz");
  EXPECT_EQ(Rz["evaluation"], "values");
  ASSERT_EQ(Rz["values"].size(), 1u);
  EXPECT_NEAR(Rz["values"][0].get<double>(), pi / 4, 1e-15);
  EXPECT_NEAR(angle(Rz), pi / 8, 1e-9); // |theta| / 2
  EXPECT_EQ(Rz["orthogonal"], false);
  // u3(pi/2, 0, pi) = h (qelib1.inc: h = u2(0,pi) = U(pi/2,0,pi)).
  nlohmann::json U3 = row(J, "u3");
  EXPECT_EQ(U3["class"], "general");
  EXPECT_NEAR(angle(U3), pi / 2, 1e-9);
}

TEST_F(GatesCommand, FileGatesAreMarked) {
  write("own.qasm", Own);
  nlohmann::json J = json("gates --format json --params phase=-pi/2 own.qasm");
  ASSERT_TRUE(J.is_object());
  EXPECT_EQ(J["file"], "own.qasm");
  EXPECT_EQ(J["library_included"], true);
  nlohmann::json Flip = row(J, "flip", "user");
  ASSERT_TRUE(Flip.is_object());
  EXPECT_EQ(Flip["defined_at"]["file"], "own.qasm");
  EXPECT_EQ(Flip["defined_at"]["line"], 3);
  EXPECT_EQ(Flip["class"], "permutation"); // it is X
  EXPECT_NEAR(angle(Flip), pi / 2, 1e-9);
  nlohmann::json Phase = row(J, "phase", "user");
  EXPECT_NEAR(angle(Phase), pi / 4, 1e-9); // |-pi/2| / 2
  nlohmann::json Magic = row(J, "magic", "opaque");
  ASSERT_TRUE(Magic.is_object());
  EXPECT_TRUE(Magic["class"].is_null());
  EXPECT_TRUE(Magic["angle_rad"].is_null());
  EXPECT_TRUE(Magic["note"].is_string());
  // The library is still listed, before the file's own gates.
  EXPECT_TRUE(row(J, "ccx").is_object());
  EXPECT_EQ(J["gates"].back()["name"], "magic");
}

TEST_F(GatesCommand, FileWithoutIncludeStillListsLibrary) {
  nlohmann::json J = json("gates --format json -",
                          "OPENQASM 2.0;\ngate g a { U(pi,0,pi) a; }\n");
  ASSERT_TRUE(J.is_object());
  EXPECT_EQ(J["file"], "<stdin>");
  EXPECT_EQ(J["library_included"], false);
  EXPECT_TRUE(row(J, "ccx").is_object());
  EXPECT_EQ(row(J, "g", "user")["class"], "permutation"); // U(pi,0,pi) ~ X
}

TEST_F(GatesCommand, TextTable) {
  Outcome R = invoke("gates --params rz=pi/4");
  ASSERT_EQ(R.Exit, 0) << R.Err;
  EXPECT_EQ(R.Err, "");
  std::istringstream Lines(R.Out);
  std::string Line;
  bool SawCcx = false, SawRz = false;
  while (std::getline(Lines, Line)) {
    std::istringstream Words(Line);
    std::string Name, From, Qubits;
    Words >> Name >> From >> Qubits;
    if (Name == "ccx") {
      SawCcx = true;
      EXPECT_EQ(From, "library");
      EXPECT_EQ(Qubits, "3");
      EXPECT_NE(Line.find("permutation"), std::string::npos);
      EXPECT_NE(Line.find("pi/2"), std::string::npos);
    }
    if (Name == "rz") {
      SawRz = true;
      EXPECT_NE(Line.find("pi/8"), std::string::npos) << Line;
    }
  }
  EXPECT_TRUE(SawCcx && SawRz) << R.Out;
}

TEST_F(GatesCommand, DeterministicAndOutputFile) {
  write("own.qasm", Own);
  Outcome A = invoke("gates --format json own.qasm");
  Outcome B = invoke("gates --format json own.qasm");
  ASSERT_EQ(A.Exit, 0) << A.Err;
  EXPECT_EQ(A.Out, B.Out);
  Outcome C = invoke("gates --format json -o table.json own.qasm");
  ASSERT_EQ(C.Exit, 0) << C.Err;
  EXPECT_EQ(C.Out, "");
  EXPECT_EQ(slurp(Dir / "table.json"), A.Out);
}

TEST_F(GatesCommand, BadInputExitsTwoWithDiagnostic) {
  write("bad.qasm", "OPENQASM 2.0;\ngate g a { foo a; }\n");
  Outcome R = invoke("gates bad.qasm");
  EXPECT_EQ(R.Exit, 2);
  EXPECT_EQ(R.Out, "");
  EXPECT_EQ(R.Err, "bad.qasm:2:12: error: unknown gate 'foo'\n"
                   "gate g a { foo a; }\n"
                   "           ^~~\n"
                   "note: the standard gates (h, cx, ccx, ...) come from "
                   "'include \"qelib1.inc\";'\n");
  Outcome Missing = invoke("gates nope.qasm");
  EXPECT_EQ(Missing.Exit, 2);
  EXPECT_NE(Missing.Err.find("cannot open 'nope.qasm'"), std::string::npos);
  Outcome Stdlib = invoke("gates --stdlib nope.inc");
  EXPECT_EQ(Stdlib.Exit, 2);
  EXPECT_NE(Stdlib.Err.find("cannot open 'nope.inc'"), std::string::npos);
}

TEST_F(GatesCommand, BadParamsExitTwo) {
  Outcome R = invoke("gates --params rz=pi/x");
  EXPECT_EQ(R.Exit, 2);
  EXPECT_EQ(R.Out, "");
  EXPECT_EQ(R.Err, "--params:1:7: error: 'x' is not defined; outside gate "
                   "bodies parameters must be constant expressions\n"
                   "rz=pi/x\n"
                   "      ^\n");
  Outcome Count = invoke("gates --params cx=1");
  EXPECT_EQ(Count.Exit, 2);
  EXPECT_EQ(Count.Err, "--params:1:1: error: gate 'cx' takes no parameters\n"
                       "cx=1\n"
                       "^~\n");
  EXPECT_EQ(invoke("gates --params nosuch=1").Exit, 2);
  EXPECT_EQ(invoke("gates --params 'rz=1/0'").Exit, 2);
}

TEST_F(GatesCommand, UsageErrorsExitTwo) {
  EXPECT_EQ(invoke("gates --format yaml").Exit, 2);
  EXPECT_EQ(invoke("gates --bogus").Exit, 2);
  write("a.qasm", Own);
  EXPECT_EQ(invoke("gates a.qasm a.qasm").Exit, 2);
  EXPECT_EQ(invoke("gates --help").Exit, 0);
}
