//===- GateTableTest.cpp - The gate table against textbook values ---------===//
//
// Sources of the expected values:
//  - gate angles from the definition L(U) = max over psi of
//    arccos |<psi|U|psi>|: for eigenvalues e^{ia}, e^{ib} of a two-level
//    unitary, psi = (|a> + |b>)/sqrt 2 gives |<psi|U|psi>| = |cos((a-b)/2)|,
//    the least modulus of any convex combination, so L = |a - b|/2 with
//    a - b reduced to [-pi, pi]; with eigenvalues +1 and -1, L = pi/2.
//  - matrices and hence classes and eigenvalues: Nielsen & Chuang, "Quantum
//    Computation and Quantum Information" (2000), sections 4.2 and 4.3
//    (X = [[0,1],[1,0]], Y = [[0,-i],[i,0]], Z = diag(1,-1), S = diag(1,i),
//    T = diag(1,e^{i pi/4}), H, CNOT, CZ, Toffoli, swap).
//  - U/CX counts: the standard's qelib1.inc (OpenQASM 2.0, Cross et al.,
//    arXiv:1707.03429, appendix): ccx is 6 cx and 9 single-qubit gates
//    (h, t, tdg, each one u1 or u2, each one U); h = u2(0,pi) = one U.
//  - the Margolus-Levitin action: reaching an orthogonal state takes
//    t >= pi hbar / (2E) (Margolus & Levitin, Physica D 120, 188 (1998)), so
//    the action is pi hbar / 2 = h / 4 with h = 6.62607015e-34 J s exact
//    (SI Brochure, 9th edition, 2019); below pi/2 the factor alpha(eps)
//    satisfies (2/pi arccos sqrt eps)^2 <= alpha(eps) <= 1 (Giovannetti,
//    Lloyd & Maccone, PRA 67, 052109 (2003)).
//
//===----------------------------------------------------------------------===//
#include "revbound/report/GateTable.h"
#include "TestSupport.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <numbers>

using namespace revbound;
using report::Evaluation;
using report::GateRow;
using std::numbers::pi;

namespace {

const double PlanckJs = 6.62607015e-34; // SI Brochure 2019, exact

const char *WithLibrary = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n";

/// Elaborates `Text` and tabulates it with the given `--params` texts;
/// fails the test on any error.
struct Tabulated {
  test::Elaborated E;
  std::vector<GateRow> Rows;
  std::string Error; // formatDiagnostic text of a failure
};

Tabulated tabulate(const std::string &Text,
                   std::vector<std::string> Params = {}) {
  Tabulated T;
  T.E = test::elaborate(Text);
  EXPECT_TRUE(T.E.Circuit) << T.E.Error;
  if (!T.E.Circuit)
    return T;
  std::vector<report::ParamAssignment> Assignments;
  auto Keep = [&](llvm::Error Err) {
    llvm::handleAllErrors(std::move(Err), [&](const DiagnosticError &D) {
      T.Error = formatDiagnostic(T.E.Files->mgr(), D.diagnostic());
    });
  };
  for (const std::string &P : Params) {
    llvm::Expected<report::ParamAssignment> A =
        report::parseParamAssignment(*T.E.Files, P);
    if (!A) {
      Keep(A.takeError());
      return T;
    }
    Assignments.push_back(std::move(*A));
  }
  llvm::Expected<std::vector<GateRow>> Rows =
      report::tabulateGates(*T.E.Circuit, *T.E.Files, Assignments);
  if (!Rows) {
    Keep(Rows.takeError());
    return T;
  }
  T.Rows = std::move(*Rows);
  return T;
}

/// The row named `Name` with origin `O` (the first, if several).
const GateRow *find(const std::vector<GateRow> &Rows, const std::string &Name,
                    ir::GateOrigin O = ir::GateOrigin::StandardLibrary) {
  for (const GateRow &R : Rows)
    if (R.Name == Name && R.Origin == O)
      return &R;
  return nullptr;
}

double angleOf(const std::vector<GateRow> &Rows, const std::string &Name) {
  const GateRow *R = find(Rows, Name);
  if (!R || !R->AngleRad) {
    ADD_FAILURE() << "no angle for " << Name;
    return -1;
  }
  return *R->AngleRad;
}

std::string classOf(const std::vector<GateRow> &Rows, const std::string &Name) {
  const GateRow *R = find(Rows, Name);
  if (!R || !R->Class)
    return "(none)";
  return ir::unitaryClassName(*R->Class);
}

} // namespace

TEST(GateTable, TextbookAngles) {
  // Checks L(U) of the fixed library gates against the two-level formula in
  // the header comment, eigenvalues from Nielsen & Chuang's matrices.
  Tabulated T = tabulate(WithLibrary);
  // X, Z, H: eigenvalues +1, -1. CX, CZ, CCX: +1 (many times) and -1.
  for (const char *G : {"x", "y", "z", "h", "cx", "cz", "ccx", "swap"})
    EXPECT_NEAR(angleOf(T.Rows, G), pi / 2, 1e-9) << G;
  // S = diag(1, i): |0 - pi/2| / 2. T = diag(1, e^{i pi/4}): pi/8.
  EXPECT_NEAR(angleOf(T.Rows, "s"), pi / 4, 1e-9);
  EXPECT_NEAR(angleOf(T.Rows, "sdg"), pi / 4, 1e-9);
  EXPECT_NEAR(angleOf(T.Rows, "t"), pi / 8, 1e-9);
  EXPECT_NEAR(angleOf(T.Rows, "tdg"), pi / 8, 1e-9);
  // The identity moves nothing.
  EXPECT_NEAR(angleOf(T.Rows, "id"), 0, 1e-9);
  const GateRow *X = find(T.Rows, "x");
  ASSERT_TRUE(X && X->Orthogonal);
  EXPECT_TRUE(*X->Orthogonal);
  const GateRow *TG = find(T.Rows, "t");
  ASSERT_TRUE(TG && TG->Orthogonal);
  EXPECT_FALSE(*TG->Orthogonal);
  EXPECT_EQ(TG->Eval, Evaluation::Fixed);
}

TEST(GateTable, TextbookClasses) {
  // Checks the class on basis states against Nielsen & Chuang's matrices:
  // X, CNOT, Toffoli and swap permute basis states; Z, S, T, CZ only add
  // phases; Y = [[0,-i],[i,0]] permutes with unequal phases; H = [[1,1],
  // [1,-1]]/sqrt 2 makes superpositions.
  Tabulated T = tabulate(WithLibrary);
  for (const char *G : {"x", "cx", "ccx", "swap", "cswap"})
    EXPECT_EQ(classOf(T.Rows, G), "permutation") << G;
  for (const char *G : {"z", "s", "t", "cz"})
    EXPECT_EQ(classOf(T.Rows, G), "diagonal") << G;
  EXPECT_EQ(classOf(T.Rows, "y"), "monomial");
  EXPECT_EQ(classOf(T.Rows, "h"), "general");
  // rz(theta) = diag(e^{-i theta/2}, e^{i theta/2}) for every theta.
  EXPECT_EQ(classOf(T.Rows, "rz"), "diagonal");
  // rx(theta) = cos(theta/2) I - i sin(theta/2) X mixes basis states.
  EXPECT_EQ(classOf(T.Rows, "rx"), "general");
}

TEST(GateTable, GenericParametersGiveClassButNoAngle) {
  // Checks that a parametrised gate without values is classified at generic
  // values, with its angle left to depend on them.
  Tabulated T = tabulate(WithLibrary);
  for (const char *G : {"rz", "u1", "crz", "rx", "u3"}) {
    const GateRow *R = find(T.Rows, G);
    ASSERT_TRUE(R) << G;
    EXPECT_EQ(R->Eval, Evaluation::Generic) << G;
    EXPECT_TRUE(R->Class.has_value()) << G;
    EXPECT_FALSE(R->AngleRad.has_value()) << G;
    EXPECT_FALSE(R->Orthogonal.has_value()) << G;
    EXPECT_FALSE(R->ActionJs.has_value()) << G;
  }
  // crz(lambda) = diag(1, 1, e^{-i lambda/2}, e^{i lambda/2}) up to the
  // qubit order (Nielsen & Chuang, section 4.3): diagonal.
  EXPECT_EQ(classOf(T.Rows, "crz"), "diagonal");
}

TEST(GateTable, RzAngleIsHalfTheRotation) {
  // Checks L(rz(theta)) = |theta|/2: rz(theta) has eigenvalues
  // e^{-i theta/2} and e^{i theta/2}, which differ by theta (reduced mod
  // 2 pi into [-pi, pi]).
  struct Case {
    const char *Text;
    double Expected;
  } Cases[] = {
      {"rz=pi/4", pi / 8},                         // the T gate's angle
      {"rz=-pi/3", pi / 6},                        // sign does not matter
      {"rz=1", 0.5},        {"rz=3*pi/2", pi / 4}, // 3pi/2 is -pi/2 mod 2 pi
      {"rz=pi", pi / 2},                           // Z up to phase
  };
  for (const Case &C : Cases) {
    Tabulated T = tabulate(WithLibrary, {C.Text});
    ASSERT_EQ(T.Error, "") << C.Text;
    const GateRow *R = find(T.Rows, "rz");
    ASSERT_TRUE(R && R->AngleRad) << C.Text;
    EXPECT_EQ(R->Eval, Evaluation::Values);
    EXPECT_NEAR(*R->AngleRad, C.Expected, 1e-9) << C.Text;
    EXPECT_EQ(classOf(T.Rows, "rz"), "diagonal") << C.Text;
  }
}

TEST(GateTable, SeveralValuesInOrder) {
  // Checks that several values are read in order: u3(pi, 0, pi) is X up to
  // phase (OpenQASM 2.0 specification: x = u3(pi,0,pi)), so a permutation
  // with angle pi/2.
  Tabulated T = tabulate(WithLibrary, {"u3=pi, 0 ,pi"});
  ASSERT_EQ(T.Error, "");
  const GateRow *R = find(T.Rows, "u3");
  ASSERT_TRUE(R);
  ASSERT_EQ(R->Values.size(), 3u);
  EXPECT_DOUBLE_EQ(R->Values[0], pi);
  EXPECT_DOUBLE_EQ(R->Values[1], 0);
  EXPECT_EQ(classOf(T.Rows, "u3"), "permutation");
  EXPECT_NEAR(angleOf(T.Rows, "u3"), pi / 2, 1e-9);
}

TEST(GateTable, PrimitiveCounts) {
  // Checks the expansion to U and CX against the standard's qelib1.inc
  // (arXiv:1707.03429): ccx = 6 cx + 9 one-qubit gates; h and t one U each;
  // swap as three CNOTs (Nielsen & Chuang, figure 1.7); cz = h cx h.
  Tabulated T = tabulate(WithLibrary);
  const GateRow *Ccx = find(T.Rows, "ccx");
  ASSERT_TRUE(Ccx);
  EXPECT_EQ(Ccx->PrimitiveCX, 6u);
  EXPECT_EQ(Ccx->PrimitiveU, 9u);
  const GateRow *H = find(T.Rows, "h");
  ASSERT_TRUE(H);
  EXPECT_EQ(H->PrimitiveU, 1u);
  EXPECT_EQ(H->PrimitiveCX, 0u);
  const GateRow *Swap = find(T.Rows, "swap");
  ASSERT_TRUE(Swap);
  EXPECT_EQ(Swap->PrimitiveCX, 3u);
  EXPECT_EQ(Swap->PrimitiveU, 0u);
  const GateRow *Cz = find(T.Rows, "cz");
  ASSERT_TRUE(Cz);
  EXPECT_EQ(Cz->PrimitiveCX, 1u);
  EXPECT_EQ(Cz->PrimitiveU, 2u);
}

TEST(GateTable, ActionOfOneApplication) {
  // Checks the energy-free Margolus-Levitin action against pi hbar / 2 =
  // h / 4 for gates that reach an orthogonal state, and against the bounds
  // (2/pi L)^2 h/4 <= action <= h/4 (alpha's bounds, with eps = cos^2 L).
  Tabulated T = tabulate(WithLibrary);
  for (const char *G : {"x", "h", "cx", "ccx"}) {
    const GateRow *R = find(T.Rows, G);
    ASSERT_TRUE(R && R->ActionJs) << G;
    EXPECT_NEAR(*R->ActionJs / (PlanckJs / 4), 1, 1e-12) << G;
  }
  for (const char *G : {"s", "t"}) {
    const GateRow *R = find(T.Rows, G);
    ASSERT_TRUE(R && R->ActionJs && R->AngleRad) << G;
    double Low = std::pow(2 / pi * *R->AngleRad, 2) * PlanckJs / 4;
    EXPECT_GE(*R->ActionJs, Low * (1 - 1e-9)) << G;
    EXPECT_LT(*R->ActionJs, PlanckJs / 4) << G;
  }
  const GateRow *Id = find(T.Rows, "id");
  ASSERT_TRUE(Id && Id->ActionJs);
  EXPECT_EQ(*Id->ActionJs, 0);
}

TEST(GateTable, UserGatesOpaqueAndWide) {
  // Checks the file's own gates: a CZ written as H CX H (H X H = Z, Nielsen
  // & Chuang section 4.2, so H around the target turns CNOT into CZ) is
  // diagonal with angle pi/2; opaque and 11-qubit gates and gates calling
  // an opaque gate have no unitary and say why.
  std::string Text = std::string(WithLibrary) +
                     "gate mycz a,b { h b; cx a,b; h b; }\n"
                     "opaque magic(w) q;\n"
                     "gate wrap a { magic(0.5) a; }\n"
                     "gate wide a,b,c,d,e,f,g,h1,i,j,k { cx a,k; }\n";
  Tabulated T = tabulate(Text);
  const GateRow *Cz = find(T.Rows, "mycz", ir::GateOrigin::User);
  ASSERT_TRUE(Cz && Cz->Class && Cz->AngleRad);
  EXPECT_EQ(ir::unitaryClassName(*Cz->Class), std::string("diagonal"));
  EXPECT_NEAR(*Cz->AngleRad, pi / 2, 1e-9);
  EXPECT_EQ(Cz->File, "test.qasm");
  EXPECT_EQ(Cz->Line, 3u);
  EXPECT_EQ(Cz->Column, 6u);

  const GateRow *Magic = find(T.Rows, "magic", ir::GateOrigin::Opaque);
  ASSERT_TRUE(Magic);
  EXPECT_EQ(Magic->Eval, Evaluation::None);
  EXPECT_FALSE(Magic->Class.has_value());
  EXPECT_FALSE(Magic->AngleRad.has_value());
  EXPECT_NE(Magic->Note.find("opaque"), std::string::npos);
  EXPECT_EQ(Magic->PrimitiveOpaque, 1u);

  const GateRow *Wrap = find(T.Rows, "wrap", ir::GateOrigin::User);
  ASSERT_TRUE(Wrap);
  EXPECT_FALSE(Wrap->Class.has_value());
  EXPECT_NE(Wrap->Note.find("'magic'"), std::string::npos);

  const GateRow *Wide = find(T.Rows, "wide", ir::GateOrigin::User);
  ASSERT_TRUE(Wide);
  EXPECT_EQ(Wide->Qubits, 11u);
  EXPECT_FALSE(Wide->Class.has_value());
  EXPECT_NE(Wide->Note.find("11 qubits"), std::string::npos);
  EXPECT_EQ(Wide->PrimitiveCX, 1u); // counts need no unitary
}

TEST(GateTable, ReplacedLibraryGate) {
  // Checks that a file's own h (library gates are weak, docs/language.md)
  // is listed after the library, and the library's h is marked replaced.
  std::string Text = std::string(WithLibrary) + "gate h a { x a; }\n";
  Tabulated T = tabulate(Text);
  const GateRow *Lib = find(T.Rows, "h");
  const GateRow *Own = find(T.Rows, "h", ir::GateOrigin::User);
  ASSERT_TRUE(Lib && Own);
  EXPECT_TRUE(Lib->Replaced);
  EXPECT_FALSE(Own->Replaced);
  EXPECT_LT(Lib, Own);
  EXPECT_EQ(classOf(T.Rows, "h"), "general");
  ASSERT_TRUE(Own->Class);
  EXPECT_EQ(*Own->Class, ir::UnitaryClass::Permutation); // it is X
  EXPECT_EQ(T.Rows[0].Name, "U");
  EXPECT_EQ(T.Rows[1].Name, "CX");
}

TEST(GateTable, ParamsDiagnostics) {
  // Checks the printed diagnostics for malformed --params values, caret
  // line included; the buffer is the option's text itself.
  struct Case {
    const char *Text;
    const char *Expected;
  } Cases[] = {
      {"rz=pi/x",
       "--params:1:7: error: 'x' is not defined; outside gate bodies "
       "parameters must be constant expressions\nrz=pi/x\n      ^\n"},
      {"rz=1,,2", "--params:1:6: error: expected a value\nrz=1,,2\n     ^\n"},
      {"rz", "--params:1:1: error: expected NAME=VALUE,... (for example "
             "rz=pi/4)\nrz\n^~\n"},
      {"rz=1;h", "--params:1:5: error: unexpected character in a parameter "
                 "value\nrz=1;h\n    ^\n"},
      {"nosuch=1", "--params:1:1: error: no gate named 'nosuch'\nnosuch=1\n"
                   "^~~~~~\n"},
      {"rz=1,2", "--params:1:1: error: gate 'rz' takes 1 parameter, got 2\n"
                 "rz=1,2\n^~\n"},
      {"h=1", "--params:1:1: error: gate 'h' takes no parameters\nh=1\n^\n"},
  };
  for (const Case &C : Cases) {
    Tabulated T = tabulate(WithLibrary, {C.Text});
    EXPECT_EQ(T.Error, C.Expected) << C.Text;
  }
}

TEST(GateTable, LibraryRowsForFileWithoutInclude) {
  // Checks that a file that does not include qelib1.inc is listed with the
  // library rows taken from the library program, its own gates after them.
  // One SourceFiles for both programs, as the driver uses.
  SourceFiles Files;
  DiagnosticSink Warnings;
  llvm::Expected<ir::Circuit> Lib = qasm::buildCircuit(
      Files, Files.addBuffer("lib.qasm", WithLibrary), {}, Warnings);
  llvm::Expected<ir::Circuit> Own = qasm::buildCircuit(
      Files,
      Files.addBuffer("own.qasm",
                      "OPENQASM 2.0;\ngate g a { U(pi,0,pi) a; }\n"),
      {}, Warnings);
  ASSERT_TRUE(Lib && Own);
  llvm::Expected<report::GateTable> T =
      report::buildGateTable(*Lib, &*Own, Files, "own.qasm", "lib", {});
  ASSERT_TRUE(bool(T));
  EXPECT_FALSE(T->LibraryIncluded);
  ASSERT_TRUE(find(T->Rows, "ccx"));
  const GateRow *G = find(T->Rows, "g", ir::GateOrigin::User);
  ASSERT_TRUE(G);
  EXPECT_EQ(G, &T->Rows.back());
  EXPECT_EQ(G->File, "own.qasm");
  EXPECT_EQ(G->Line, 2u);
  // U(pi, 0, pi) = X up to phase (specification, section 3).
  ASSERT_TRUE(G->Class);
  EXPECT_EQ(*G->Class, ir::UnitaryClass::Permutation);
}

TEST(GateTable, JsonShape) {
  // Checks the JSON form (docs/json.md, "revbound gates"): the schema field,
  // nulls for unknown entries, the counts as integers.
  Tabulated T = tabulate(std::string(WithLibrary) + "opaque o a;\n");
  report::GateTable Table;
  Table.Library = "<built-in qelib1.inc>";
  Table.Rows = T.Rows;
  nlohmann::json J = nlohmann::json::parse(report::writeGateTableJson(Table));
  EXPECT_EQ(J["schema"], "revbound/gates-1");
  EXPECT_TRUE(J["file"].is_null());
  bool SawCcx = false, SawOpaque = false, SawRz = false;
  for (const nlohmann::json &G : J["gates"]) {
    if (G["name"] == "ccx") {
      SawCcx = true;
      EXPECT_EQ(G["origin"], "library");
      EXPECT_EQ(G["class"], "permutation");
      EXPECT_EQ(G["primitive"]["U"], 9);
      EXPECT_EQ(G["primitive"]["CX"], 6);
      EXPECT_NEAR(G["angle_rad"].get<double>(), pi / 2, 1e-12);
      EXPECT_EQ(G["orthogonal"], true);
      EXPECT_EQ(G["evaluation"], "fixed");
      EXPECT_TRUE(G["note"].is_null());
    }
    if (G["name"] == "o") {
      SawOpaque = true;
      EXPECT_EQ(G["origin"], "opaque");
      EXPECT_TRUE(G["class"].is_null());
      EXPECT_TRUE(G["angle_rad"].is_null());
      EXPECT_TRUE(G["orthogonal"].is_null());
      EXPECT_TRUE(G["action_Js"].is_null());
      EXPECT_TRUE(G["note"].is_string());
      EXPECT_EQ(G["evaluation"], "none");
    }
    if (G["name"] == "rz") {
      SawRz = true;
      EXPECT_EQ(G["evaluation"], "generic");
      EXPECT_EQ(G["class"], "diagonal");
      EXPECT_TRUE(G["angle_rad"].is_null());
      EXPECT_EQ(G["params"], nlohmann::json::array({"phi"}));
      EXPECT_TRUE(G["values"].is_null());
    }
  }
  EXPECT_TRUE(SawCcx && SawOpaque && SawRz);
}
