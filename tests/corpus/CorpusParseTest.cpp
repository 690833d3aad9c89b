//===- CorpusParseTest.cpp - The shared corpus read as the standard says -===//
//
// The standard's examples and benchmarks (shared/openqasm2, from
// openqasm/openqasm) and the QASMBench suite (shared/benchmarks, from
// pnnl/QASMBench @357b942): the valid files elaborate and analyse without
// error, the invalid ones are rejected at the right line, files without the
// version header are read with a warning. Which files are which is stated by
// the two SOURCES.md files next to them.
//
//===----------------------------------------------------------------------===//
#include "CorpusSupport.h"

#include "revbound/report/Report.h"

#include <gtest/gtest.h>

#include <cctype>
#include <set>

using namespace revbound;
using namespace revbound::test;

namespace {

// Files meant to be rejected. shared/openqasm2/SOURCES.md: the standard's two
// invalid examples; shared/benchmarks/SOURCES.md: two QASMBench files that
// measure into registers they never declare.
const std::set<std::string> ExpectedInvalid = {
    "openqasm2/examples/invalid/missing_semicolon.qasm",
    "openqasm2/examples/invalid/gate_no_found.qasm",
    "benchmarks/qasmbench/small/hhl_n10/hhl_n10.qasm",
    "benchmarks/qasmbench/small/vqe_uccsd_n8/vqe_uccsd_n8.qasm",
};

/// True when the first thing in the file, after comments and blanks, is the
/// OPENQASM keyword.
bool startsWithHeader(const std::string &Text) {
  size_t I = 0;
  while (I < Text.size()) {
    if (std::isspace(static_cast<unsigned char>(Text[I]))) {
      ++I;
      continue;
    }
    if (Text.compare(I, 2, "//") == 0) {
      I = Text.find('\n', I);
      if (I == std::string::npos)
        return false;
      continue;
    }
    return Text.compare(I, 8, "OPENQASM") == 0;
  }
  return false;
}

std::vector<fs::path> corpusFiles() {
  std::vector<fs::path> All = filesUnder(sharedPath("openqasm2"), ".qasm");
  std::vector<fs::path> Bench = filesUnder(sharedPath("benchmarks"), ".qasm");
  All.insert(All.end(), Bench.begin(), Bench.end());
  return All;
}

bool isHeaderWarning(const Diagnostic &D) {
  return D.Sev == Severity::Warning &&
         D.Message.find("'OPENQASM 2.0;' header") != std::string::npos;
}

} // namespace

// Checks that the walk finds the whole corpus: shared/openqasm2/SOURCES.md
// lists 74 .qasm files, shared/benchmarks/SOURCES.md 37 .qasm + 1 .qasm3.
TEST(CorpusParse, FindsEveryFileTheManifestsList) {
  REVBOUND_REQUIRE_SHARED("openqasm2");
  REVBOUND_REQUIRE_SHARED("benchmarks");
  EXPECT_EQ(filesUnder(sharedPath("openqasm2"), ".qasm").size(), 74u);
  EXPECT_EQ(filesUnder(sharedPath("benchmarks"), ".qasm").size(), 37u);
  EXPECT_EQ(filesUnder(sharedPath("benchmarks"), ".qasm3").size(), 1u);
}

// Checks that every valid file of the corpus elaborates and analyses
// (default options: built-in qelib1.inc, native granularity) without error.
TEST(CorpusParse, ValidFilesElaborateAndAnalyse) {
  REVBOUND_REQUIRE_SHARED("openqasm2");
  REVBOUND_REQUIRE_SHARED("benchmarks");
  unsigned Valid = 0, Invalid = 0;
  for (const fs::path &P : corpusFiles()) {
    std::string Rel = relToShared(P);
    if (ExpectedInvalid.count(Rel)) {
      ++Invalid;
      continue;
    }
    ++Valid;
    SourceFiles Files;
    DiagnosticSink Warnings;
    llvm::Expected<report::CircuitReport> R =
        report::analyzeFile(Files, P.string(), qasm::FrontendOptions(),
                            report::AnalysisOptions(), Warnings);
    if (!R) {
      std::string Text;
      llvm::handleAllErrors(R.takeError(), [&](const DiagnosticError &D) {
        Text = formatDiagnostic(Files.mgr(), D.diagnostic());
      });
      ADD_FAILURE() << Rel << " was rejected:\n" << Text;
      continue;
    }
    EXPECT_GT(R->Qubits, 0u) << Rel;
  }
  EXPECT_EQ(Invalid, ExpectedInvalid.size());
  EXPECT_EQ(Valid, 74u + 37u - 4u);
}

// Checks the standard's example of a missing semicolon: `OPENQASM 2.0` on
// line 3 lacks its ';' (shared/openqasm2/SOURCES.md), so the error belongs
// to line 3, right after the version, not to the `qreg` on line 4.
TEST(CorpusParse, MissingSemicolonRejectedAfterHeader) {
  REVBOUND_REQUIRE_SHARED("openqasm2/examples/invalid/missing_semicolon.qasm");
  fs::path P = sharedPath("openqasm2/examples/invalid/missing_semicolon.qasm");
  std::string Text = readText(P);
  unsigned HeaderLine = firstLineStartingWith(Text, "OPENQASM 2.0");
  ASSERT_EQ(HeaderLine, 3u); // openqasm/openqasm @0af8b84, this file
  Loaded L = loadFile(P, qasm::FrontendOptions());
  ASSERT_FALSE(L.Circuit);
  ASSERT_TRUE(L.Error);
  EXPECT_EQ(L.ErrorAt.Line, HeaderLine) << L.ErrorText;
  // The column just after "OPENQASM 2.0".
  EXPECT_EQ(L.ErrorAt.Column, std::string("OPENQASM 2.0").size() + 1)
      << L.ErrorText;
  EXPECT_NE(L.Error->Message.find("expected ';'"), std::string::npos)
      << L.ErrorText;
}

// Checks the standard's example of an undeclared gate: `w q;` on line 5.
TEST(CorpusParse, UnknownGateRejectedAtItsLine) {
  REVBOUND_REQUIRE_SHARED("openqasm2/examples/invalid/gate_no_found.qasm");
  fs::path P = sharedPath("openqasm2/examples/invalid/gate_no_found.qasm");
  std::string Text = readText(P);
  unsigned CallLine = firstLineStartingWith(Text, "w q;");
  ASSERT_EQ(CallLine, 5u); // openqasm/openqasm @0af8b84, this file
  Loaded L = loadFile(P, qasm::FrontendOptions());
  ASSERT_FALSE(L.Circuit);
  ASSERT_TRUE(L.Error);
  EXPECT_EQ(L.ErrorAt.Line, CallLine) << L.ErrorText;
  EXPECT_EQ(L.ErrorAt.Column, 1u) << L.ErrorText;
  EXPECT_NE(L.Error->Message.find("unknown gate 'w'"), std::string::npos)
      << L.ErrorText;
}

// Checks the two QASMBench files that end with `measure q[i] -> c[i];` on
// registers q and c they never declare (shared/benchmarks/SOURCES.md): the
// error points at the `q` of the first such measurement.
TEST(CorpusParse, MeasureIntoUndeclaredRegisterRejected) {
  REVBOUND_REQUIRE_SHARED("benchmarks/qasmbench");
  for (const char *Rel :
       {"benchmarks/qasmbench/small/hhl_n10/hhl_n10.qasm",
        "benchmarks/qasmbench/small/vqe_uccsd_n8/vqe_uccsd_n8.qasm"}) {
    fs::path P = sharedPath(Rel);
    std::string Text = readText(P);
    unsigned MeasureLine = firstLineStartingWith(Text, "measure q[");
    ASSERT_GT(MeasureLine, 0u) << Rel;
    Loaded L = loadFile(P, qasm::FrontendOptions());
    ASSERT_FALSE(L.Circuit) << Rel;
    ASSERT_TRUE(L.Error) << Rel;
    EXPECT_EQ(L.ErrorAt.Line, MeasureLine) << Rel << "\n" << L.ErrorText;
    EXPECT_EQ(L.ErrorAt.LineText.find("q["), L.ErrorAt.Column - 1)
        << Rel << "\n"
        << L.ErrorText;
    EXPECT_NE(L.Error->Message.find("undeclared quantum register 'q'"),
              std::string::npos)
        << L.ErrorText;
  }
}

// Checks that the OpenQASM 3 telecloning circuit (`OPENQASM 3;`,
// shared/benchmarks/SOURCES.md) is refused for its version, at the version.
TEST(CorpusParse, OpenQasm3Rejected) {
  REVBOUND_REQUIRE_SHARED("benchmarks");
  std::vector<fs::path> Qasm3 = filesUnder(sharedPath("benchmarks"), ".qasm3");
  ASSERT_EQ(Qasm3.size(), 1u);
  std::string Text = readText(Qasm3[0]);
  unsigned HeaderLine = firstLineStartingWith(Text, "OPENQASM 3");
  ASSERT_GT(HeaderLine, 0u);
  Loaded L = loadFile(Qasm3[0], qasm::FrontendOptions());
  ASSERT_FALSE(L.Circuit);
  ASSERT_TRUE(L.Error);
  EXPECT_NE(L.Error->Message.find("unsupported OpenQASM version"),
            std::string::npos)
      << L.ErrorText;
  EXPECT_EQ(L.ErrorAt.Line, HeaderLine) << L.ErrorText;
}

// Checks that files without the `OPENQASM 2.0;` line are read with a
// warning, and that files with it get none. The spec's grammar requires the
// header; shared/openqasm2/SOURCES.md names the five benchmarks/sat files
// and unmerged-prs/pr47/simple.qasm, shared/benchmarks/SOURCES.md
// medium/sat_n11.
TEST(CorpusParse, MissingHeaderWarns) {
  REVBOUND_REQUIRE_SHARED("openqasm2");
  REVBOUND_REQUIRE_SHARED("benchmarks");
  std::vector<std::string> Headerless;
  for (const fs::path &P : corpusFiles()) {
    std::string Rel = relToShared(P);
    if (ExpectedInvalid.count(Rel))
      continue;
    bool HasHeader = startsWithHeader(readText(P));
    if (!HasHeader)
      Headerless.push_back(Rel);
    Loaded L = loadFile(P, qasm::FrontendOptions());
    ASSERT_TRUE(L.Circuit) << L.ErrorText;
    unsigned HeaderWarnings = 0;
    for (const Diagnostic &W : L.Warnings)
      HeaderWarnings += isHeaderWarning(W);
    EXPECT_EQ(HeaderWarnings, HasHeader ? 0u : 1u) << Rel;
  }
  unsigned Sat = 0;
  for (const std::string &Rel : Headerless)
    Sat += Rel.rfind("openqasm2/benchmarks/sat/", 0) == 0;
  EXPECT_EQ(Sat, 5u);
  EXPECT_EQ(Headerless.size(), 7u);
  auto Has = [&](const char *Rel) {
    return std::find(Headerless.begin(), Headerless.end(), Rel) !=
           Headerless.end();
  };
  EXPECT_TRUE(Has("openqasm2/unmerged-prs/pr47/simple.qasm"));
  EXPECT_TRUE(Has("benchmarks/qasmbench/medium/sat_n11/sat_n11.qasm"));
}

// Checks the line a header warning points at: the first token of the file,
// after its leading comments (medium/sat_n11 opens with a comment).
TEST(CorpusParse, MissingHeaderWarningLocation) {
  REVBOUND_REQUIRE_SHARED("benchmarks/qasmbench/medium/sat_n11/sat_n11.qasm");
  fs::path P = sharedPath("benchmarks/qasmbench/medium/sat_n11/sat_n11.qasm");
  std::string Text = readText(P);
  unsigned IncludeLine = firstLineStartingWith(Text, "include");
  ASSERT_GT(IncludeLine, 1u);
  Loaded L = loadFile(P, qasm::FrontendOptions());
  ASSERT_TRUE(L.Circuit) << L.ErrorText;
  ASSERT_EQ(L.Warnings.size(), 1u);
  EXPECT_TRUE(isHeaderWarning(L.Warnings[0]));
  EXPECT_EQ(resolve(L.Files->mgr(), L.Warnings[0].Loc).Line, IncludeLine);
}
