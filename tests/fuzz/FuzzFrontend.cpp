//===- FuzzFrontend.cpp - libFuzzer entry over the whole pipeline ---------===//
//
// Lexer, parser, elaboration and report::analyzeCircuit (the structural
// analyses and the auto engine, with small limits) on arbitrary bytes. Any
// crash, sanitizer report or timeout is a finding; each one found becomes a
// file under tests/fuzz/regressions/frontend/ (README.md).
//
//===----------------------------------------------------------------------===//
#include "FuzzLimits.h"
#include "revbound/qasm/Frontend.h"
#include "revbound/report/Report.h"

#include <cstddef>
#include <cstdint>
#include <string>

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *Data, size_t Size) {
  using namespace revbound;
  SourceFiles Files;
  unsigned Id = Files.addBuffer(
      "fuzz.qasm", llvm::StringRef(reinterpret_cast<const char *>(Data), Size));
  qasm::FrontendOptions Front = fuzz::smallFrontendOptions(1024, 100'000);
  DiagnosticSink Warnings;
  llvm::Expected<ir::Circuit> C = qasm::buildCircuit(Files, Id, Front, Warnings);
  if (!C) {
    llvm::consumeError(C.takeError());
    return 0;
  }
  report::AnalysisOptions Opts;
  Opts.MaxDagNodes = 20000;
  // analyzeCircuit runs the auto engine too, under the small limits.
  Opts.Engine = fuzz::smallEngineOptions();
  llvm::Expected<report::CircuitReport> R =
      report::analyzeCircuit(*C, Files, "fuzz.qasm", Opts);
  if (!R)
    llvm::consumeError(R.takeError());
  return 0;
}
