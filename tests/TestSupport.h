//===- TestSupport.h - Helpers shared by the revbound tests --------------===//
#ifndef REVBOUND_TESTS_TESTSUPPORT_H
#define REVBOUND_TESTS_TESTSUPPORT_H

#include "revbound/qasm/Frontend.h"
#include "revbound/report/Report.h"
#include "revbound/support/Diagnostics.h"
#include "revbound/support/SourceFiles.h"

#include <memory>
#include <optional>
#include <string>
#include <vector>

namespace revbound::test {

/// A program elaborated from memory: the circuit, or the printed error.
struct Elaborated {
  std::unique_ptr<SourceFiles> Files;
  std::optional<ir::Circuit> Circuit;
  std::string Error;                 // formatDiagnostic text, notes included
  std::vector<std::string> Warnings; // formatDiagnostic text of each warning
};

/// Elaborates `Text` as a buffer named `Name`.
inline Elaborated elaborate(const std::string &Text,
                            const qasm::FrontendOptions &Opts = {},
                            const std::string &Name = "test.qasm") {
  Elaborated E;
  E.Files = std::make_unique<SourceFiles>();
  unsigned Id = E.Files->addBuffer(Name, Text);
  DiagnosticSink Warnings;
  llvm::Expected<ir::Circuit> C =
      qasm::buildCircuit(*E.Files, Id, Opts, Warnings);
  for (const Diagnostic &W : Warnings.warnings())
    E.Warnings.push_back(formatDiagnostic(E.Files->mgr(), W));
  if (!C) {
    llvm::handleAllErrors(
        C.takeError(),
        [&](const DiagnosticError &D) {
          E.Error = formatDiagnostic(E.Files->mgr(), D.diagnostic());
        },
        [&](const llvm::ErrorInfoBase &Other) { E.Error = Other.message(); });
    return E;
  }
  E.Circuit = std::move(*C);
  return E;
}

/// Elaborates and analyses `Text`; fails the test on any error.
inline std::optional<report::CircuitReport>
analyzeText(const std::string &Text, const report::AnalysisOptions &Opts = {},
            const qasm::FrontendOptions &Front = {}) {
  Elaborated E = elaborate(Text, Front);
  if (!E.Circuit)
    return std::nullopt;
  llvm::Expected<report::CircuitReport> R =
      report::analyzeCircuit(*E.Circuit, *E.Files, "test.qasm", Opts);
  if (!R) {
    llvm::consumeError(R.takeError());
    return std::nullopt;
  }
  return std::move(*R);
}

/// Count of `Name` in a NamedCounts list (0 when absent).
inline uint64_t countOf(const analysis::NamedCounts &C, const std::string &Name) {
  for (const auto &[N, V] : C)
    if (N == Name)
      return V;
  return 0;
}

/// The folder shared by the team (benchmarks, the standard's examples).
inline std::string sharedDir() { return REVBOUND_SHARED_DIR; }

} // namespace revbound::test

#endif
