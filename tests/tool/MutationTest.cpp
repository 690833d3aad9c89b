//===- MutationTest.cpp - Mutated real circuits end cleanly ---------------===//
//
// A thousand randomly mutated circuits (bytes deleted, inserted and
// duplicated, huge numbers, NULs, deep nesting) go through the whole
// pipeline in-process. Each must end with a report or a diagnostic, within
// a few seconds, never a crash; under the sanitizer build (.ci/run) memory
// errors and undefined behaviour fail the test too.
//
//===----------------------------------------------------------------------===//
#include "TestSupport.h"

#include <gtest/gtest.h>

#include <chrono>
#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>

using namespace revbound;
namespace fs = std::filesystem;

namespace {

std::vector<std::string> seeds() {
  std::vector<std::string> Out = {
      "OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[3];\ncreg c[3];\n"
      "gate maj a,b,c { cx c,b; cx c,a; ccx a,b,c; }\nh q;\nmaj q[0],q[1],q[2];\n"
      "rz(pi/4) q[1];\nmeasure q -> c;\nif(c==5) x q[0];\nreset q[2];\n",
      "OPENQASM 2.0;\ngate g0 a { U(0,0,pi/4) a; }\ngate g1 a { g0 a; g0 a; }\n"
      "gate g2 a { g1 a; g1 a; }\nqreg q[2];\ng2 q[0];\nCX q[0],q[1];\n"
      "barrier q;\nopaque o(t) a, b;\no(1e-5) q[0], q[1];\n",
  };
  fs::path Examples = fs::path(test::sharedDir()) / "openqasm2" / "examples" / "generic";
  if (fs::is_directory(Examples))
    for (const auto &E : fs::directory_iterator(Examples))
      if (E.path().extension() == ".qasm") {
        std::ifstream In(E.path(), std::ios::binary);
        std::stringstream S;
        S << In.rdbuf();
        Out.push_back(S.str());
      }
  return Out;
}

std::string mutate(std::string Text, std::mt19937 &Rng) {
  static const char *Pieces[] = {"18446744073709551616", "99999999999999999999999",
                                 "1e999", "((((((((((", "----------", ";", "{", "}",
                                 "qreg q[4000000000];", "gate", "if(c==", "\"",
                                 "include \"qelib1.inc\";", "//", "\xff\xfe"};
  int Edits = 1 + int(Rng() % 2);
  for (int E = 0; E < Edits && !Text.empty(); ++E) {
    size_t At = Rng() % Text.size();
    switch (Rng() % 6) {
    case 0: // delete a run
      Text.erase(At, 1 + Rng() % 8);
      break;
    case 1: // insert a random byte
      Text.insert(Text.begin() + At, char(Rng() % 256));
      break;
    case 2: // duplicate a run
      Text.insert(At, Text.substr(At, 1 + Rng() % 40));
      break;
    case 3: // a NUL
      Text.insert(Text.begin() + At, '\0');
      break;
    default: // a hostile token
      Text.insert(At, Pieces[Rng() % (sizeof(Pieces) / sizeof(*Pieces))]);
      break;
    }
  }
  return Text;
}

} // namespace

TEST(Mutation, EveryMutantEndsWithAReportOrADiagnostic) {
  std::vector<std::string> Seeds = seeds();
  std::mt19937 Rng(7);
  qasm::FrontendOptions Front;
  Front.Limits.MaxQubits = 4096; // keep each mutant's memory small
  int Reports = 0, Diagnostics = 0;
  for (int I = 0; I < 1000; ++I) {
    std::string Text = mutate(Seeds[I % Seeds.size()], Rng);
    auto Start = std::chrono::steady_clock::now();
    test::Elaborated E = test::elaborate(Text, Front);
    if (E.Circuit) {
      report::AnalysisOptions Opts;
      llvm::Expected<report::CircuitReport> R =
          report::analyzeCircuit(*E.Circuit, *E.Files, "m.qasm", Opts);
      if (R) {
        ++Reports;
      } else {
        llvm::handleAllErrors(R.takeError(), [&](const DiagnosticError &D) {
          EXPECT_FALSE(formatDiagnostic(E.Files->mgr(), D.diagnostic()).empty());
        });
        ++Diagnostics;
      }
    } else {
      EXPECT_NE(E.Error.find("error: "), std::string::npos) << E.Error;
      ++Diagnostics;
    }
    double Seconds = std::chrono::duration<double>(
                         std::chrono::steady_clock::now() - Start)
                         .count();
    EXPECT_LT(Seconds, 5.0) << "mutant " << I << " took " << Seconds << " s";
  }
  // Both outcomes occur, so the mutations are neither all fatal nor idle.
  EXPECT_GT(Reports, 50);
  EXPECT_GT(Diagnostics, 50);
}
