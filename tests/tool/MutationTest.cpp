//===- MutationTest.cpp - Mutated real circuits end cleanly ---------------===//
//
// A thousand randomly mutated circuits (bytes deleted, inserted and
// duplicated, huge numbers, NULs, deep nesting) go through the whole
// pipeline in-process. Each must end with a report or a diagnostic, within
// a few seconds, never a crash; under the sanitizer build (.ci/run) memory
// errors and undefined behaviour fail the test too. A second test runs the
// revbound executable with `--engine classical` and `--engine density` on
// mutants of circuits with role annotations: exit 0 or 2, within seconds.
//
//===----------------------------------------------------------------------===//
#include "TestSupport.h"
#include "ToolRunner.h"

#include <gtest/gtest.h>

#include <chrono>
#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>
#include <sys/wait.h>

using namespace revbound;
namespace fs = std::filesystem;

namespace {

fs::path sharedExamples() {
  return fs::path(test::sharedDir()) / "openqasm2" / "examples" / "generic";
}

std::vector<std::string> seeds() {
  std::vector<std::string> Out = {
      "OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[3];\ncreg c[3];\n"
      "gate maj a,b,c { cx c,b; cx c,a; ccx a,b,c; }\nh q;\nmaj q[0],q[1],q[2];\n"
      "rz(pi/4) q[1];\nmeasure q -> c;\nif(c==5) x q[0];\nreset q[2];\n",
      "OPENQASM 2.0;\ngate g0 a { U(0,0,pi/4) a; }\ngate g1 a { g0 a; g0 a; }\n"
      "gate g2 a { g1 a; g1 a; }\nqreg q[2];\ng2 q[0];\nCX q[0],q[1];\n"
      "barrier q;\nopaque o(t) a, b;\no(1e-5) q[0], q[1];\n",
  };
  fs::path Examples = sharedExamples();
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

/// Circuits whose `//!` roles (docs/formats.md) give the engines inputs,
/// ancillas and garbage to decide, with resets, measurements and an `if`.
std::vector<std::string> roleSeeds() {
  return {
      "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
      "//! input a, b\n//! ancilla anc\n//! garbage g\n"
      "qreg a[2];\nqreg b[1];\nqreg anc[1];\nqreg g[1];\n"
      "creg c[2];\nccx a[0],a[1],anc[0];\ncx anc[0],b[0];\n"
      "ccx a[0],a[1],anc[0];\ncx a[0],g[0];\ncswap b[0],a[0],a[1];\n"
      "measure a[0] -> c[0];\nmeasure a[0] -> c[0];\nreset b[0];\n"
      "if(c==1) x b[0];\n",
      "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n//! input x\n//! ancilla w\n"
      "qreg x[2];\nqreg w[1];\ncreg m[1];\nh x[0];\ncx x[0],w[0];\n"
      "rz(pi/4) w[0];\nmeasure w[0] -> m[0];\nreset w[0];\nh w[0];\n",
      "OPENQASM 2.0;\ngate g0 a { U(0,0,pi/4) a; }\n"
      "gate g1 a, b { g0 a; CX a, b; g0 b; }\n"
      "gate g2 a, b { g1 a, b; g1 b, a; }\n"
      "//! ancilla q[1]\n//! input q[0]\nqreg q[3];\ncreg c[3];\n"
      "g2 q[0], q[1];\ng2 q[1], q[2];\nmeasure q -> c;\nreset q;\n",
  };
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
  // The counts below are of mutants of the shared examples as well.
  if (!fs::is_directory(sharedExamples()))
    GTEST_SKIP() << "needs the shared examples in " << sharedExamples()
                 << " (CMake option REVBOUND_SHARED_DIR)";
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

// The driver, as users run it, with each explicit engine on mutants of
// circuits with roles (and of the shared examples): every run ends with a
// report (exit 0) or a diagnostic (exit 2, DESIGN.md "Exit codes"), never
// a crash (a signal), an internal error (3) or a hang. `timeout` (GNU
// coreutils) stops a hung run after 60 s, which fails the exit-code check.
class MutationTool : public test::ToolTest {};

TEST_F(MutationTool, ExplicitEnginesExitZeroOrTwo) {
  // The counts below are of mutants of the shared examples as well.
  if (!fs::is_directory(sharedExamples()))
    GTEST_SKIP() << "needs the shared examples in " << sharedExamples()
                 << " (CMake option REVBOUND_SHARED_DIR)";
  std::vector<std::string> Seeds = roleSeeds();
  for (std::string &S : seeds())
    Seeds.push_back(std::move(S));
  std::mt19937 Rng(11);
  int Exit0 = 0, Exit2 = 0;
  for (int I = 0; I < 100; ++I) {
    std::string Text = mutate(Seeds[I % Seeds.size()], Rng);
    fs::path File = write("m.qasm", Text);
    for (const char *Engine : {"classical", "density"}) {
      std::string Cmd = "timeout -k 5 60 '" REVBOUND_BINARY
                        "' report --format json --max-qubits 4096 --engine " +
                        std::string(Engine) + " '" + File.string() + "' >'" +
                        (Dir / "out.txt").string() + "' 2>'" +
                        (Dir / "err.txt").string() + "'";
      auto Start = std::chrono::steady_clock::now();
      int Status = std::system(Cmd.c_str());
      double Seconds = std::chrono::duration<double>(
                           std::chrono::steady_clock::now() - Start)
                           .count();
      int Exit = WIFEXITED(Status) ? WEXITSTATUS(Status) : -1;
      std::string Err = test::slurp(Dir / "err.txt");
      EXPECT_TRUE(Exit == 0 || Exit == 2)
          << "mutant " << I << " with --engine " << Engine << ": exit "
          << Exit << "\n"
          << Err << "\n--- input ---\n"
          << Text;
      if (Exit == 2)
        EXPECT_NE(Err.find("error: "), std::string::npos) << Err;
      Exit0 += Exit == 0;
      Exit2 += Exit == 2;
      EXPECT_LT(Seconds, 10.0) << "mutant " << I << " with --engine "
                               << Engine << " took " << Seconds << " s";
    }
  }
  // Both outcomes occur, so the mutations are neither all fatal nor idle
  // (about one mutant in twelve still reads).
  EXPECT_GT(Exit0, 5);
  EXPECT_GT(Exit2, 5);
}
