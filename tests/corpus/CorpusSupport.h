//===- CorpusSupport.h - Helpers for the tests over the shared corpus ----===//
//
// The corpus (the standard's examples and the benchmark suites) lives in the
// team's shared folder, REVBOUND_SHARED_DIR; nothing of it is copied into
// the project. Tests that need it skip with a clear message when it is absent.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_TESTS_CORPUS_CORPUSSUPPORT_H
#define REVBOUND_TESTS_CORPUS_CORPUSSUPPORT_H

#include "TestSupport.h"

#include "revbound/qasm/Frontend.h"
#include "revbound/support/Diagnostics.h"
#include "revbound/support/SourceFiles.h"

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <memory>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

namespace revbound::test {

namespace fs = std::filesystem;

/// `Sub` inside the shared folder.
inline fs::path sharedPath(const std::string &Sub) {
  return fs::path(sharedDir()) / Sub;
}

/// Skips the current test when `Sub` is missing from the shared folder.
#define REVBOUND_REQUIRE_SHARED(Sub)                                           \
  do {                                                                         \
    if (!std::filesystem::exists(::revbound::test::sharedPath(Sub)))           \
      GTEST_SKIP() << "shared folder not found at "                            \
                   << ::revbound::test::sharedPath(Sub).string();              \
  } while (0)

/// The whole file as bytes ("" if it cannot be read).
inline std::string readText(const fs::path &P) {
  std::ifstream In(P, std::ios::binary);
  std::ostringstream S;
  S << In.rdbuf();
  return S.str();
}

/// Every file under `Root` (recursively) whose name ends with `Ext`, sorted.
inline std::vector<fs::path> filesUnder(const fs::path &Root,
                                        const std::string &Ext) {
  std::vector<fs::path> Out;
  if (!fs::exists(Root))
    return Out;
  for (const auto &E : fs::recursive_directory_iterator(Root))
    if (E.is_regular_file() && E.path().extension() == Ext)
      Out.push_back(E.path());
  std::sort(Out.begin(), Out.end());
  return Out;
}

/// `P` relative to the shared folder, for messages and look-ups.
inline std::string relToShared(const fs::path &P) {
  return fs::relative(P, sharedDir()).generic_string();
}

/// 1-based number of the first line that starts (after blanks) with
/// `Prefix`; 0 if none does.
inline unsigned firstLineStartingWith(const std::string &Text,
                                      const std::string &Prefix) {
  std::istringstream In(Text);
  std::string Line;
  for (unsigned N = 1; std::getline(In, Line); ++N) {
    size_t B = Line.find_first_not_of(" \t");
    if (B != std::string::npos && Line.compare(B, Prefix.size(), Prefix) == 0)
      return N;
  }
  return 0;
}

/// A file or buffer run through the front end, the error kept structured.
struct Loaded {
  std::unique_ptr<SourceFiles> Files = std::make_unique<SourceFiles>();
  std::optional<ir::Circuit> Circuit;
  std::optional<Diagnostic> Error;
  ResolvedLocation ErrorAt; // the error's location, resolved
  std::string ErrorText;    // formatDiagnostic of the error
  std::vector<Diagnostic> Warnings;
};

inline void finishLoad(Loaded &L, llvm::Expected<ir::Circuit> C) {
  if (C) {
    L.Circuit = std::move(*C);
    return;
  }
  llvm::handleAllErrors(C.takeError(), [&](const DiagnosticError &D) {
    L.Error = D.diagnostic();
    L.ErrorAt = resolve(L.Files->mgr(), D.diagnostic().Loc);
    L.ErrorText = formatDiagnostic(L.Files->mgr(), D.diagnostic());
  });
}

/// Reads and elaborates the file at `P`.
inline Loaded loadFile(const fs::path &P, const qasm::FrontendOptions &Opts) {
  Loaded L;
  llvm::Expected<unsigned> Id = L.Files->loadMain(P.string());
  if (!Id) {
    finishLoad(L, Id.takeError());
    return L;
  }
  DiagnosticSink Sink;
  finishLoad(L, qasm::buildCircuit(*L.Files, *Id, Opts, Sink));
  L.Warnings = Sink.warnings();
  return L;
}

/// Elaborates `Text` as a buffer named `Name`.
inline Loaded loadText(const std::string &Name, const std::string &Text,
                       const qasm::FrontendOptions &Opts) {
  Loaded L;
  unsigned Id = L.Files->addBuffer(Name, Text);
  DiagnosticSink Sink;
  finishLoad(L, qasm::buildCircuit(*L.Files, Id, Opts, Sink));
  L.Warnings = Sink.warnings();
  return L;
}

/// Options that read `Library` in place of the built-in qelib1.inc.
inline qasm::FrontendOptions withStandardLibrary(const fs::path &Library) {
  qasm::FrontendOptions O;
  O.Parser.StandardLibraryPath = Library.string();
  return O;
}

} // namespace revbound::test

#endif
