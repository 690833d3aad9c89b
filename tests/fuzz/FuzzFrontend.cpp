//===- FuzzFrontend.cpp - libFuzzer entry over the whole pipeline ---------===//
//
// Lexer, parser, elaboration and report::analyzeCircuit (the structural
// analyses and the auto engine, with small limits) on arbitrary bytes. Any
// crash, sanitizer report or timeout is a finding; each one found becomes a
// file under tests/fuzz/regressions/frontend/ (README.md).
//
//===----------------------------------------------------------------------===//
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
  qasm::FrontendOptions Front;
  // Small limits keep each input's memory and time bounded, as a CI job's
  // budget would.
  Front.Limits.MaxQubits = 1024;
  Front.Limits.MaxClbits = 1024;
  Front.Limits.MaxOps = 100000;
  Front.Limits.MaxNesting = 64;
  DiagnosticSink Warnings;
  llvm::Expected<ir::Circuit> C = qasm::buildCircuit(Files, Id, Front, Warnings);
  if (!C) {
    llvm::consumeError(C.takeError());
    return 0;
  }
  report::AnalysisOptions Opts;
  Opts.MaxDagNodes = 20000;
  // analyzeCircuit runs the auto engine too. Its default bounds allow
  // seconds of density simulation in a release build, which is tens of
  // seconds under the sanitizers (regressions/frontend/density_branches.qasm);
  // FuzzEngines.cpp fuzzes the engines with limits like these.
  Opts.Engine.MaxDensityQubits = 8;
  Opts.Engine.MaxAutoDensityWork = uint64_t(1) << 24;
  Opts.Engine.MaxAutoClassicalOps = 20'000;
  Opts.Engine.MaxBddNodes = uint64_t(1) << 16;
  Opts.Engine.MaxExpandedOps = 100'000;
  Opts.Engine.Samples = 64;
  llvm::Expected<report::CircuitReport> R =
      report::analyzeCircuit(*C, Files, "fuzz.qasm", Opts);
  if (!R)
    llvm::consumeError(R.takeError());
  return 0;
}
