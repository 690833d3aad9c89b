//===- main.cpp - Embedding revbound: the figures of one circuit file -----===//
//
// Reads an OpenQASM 2.0 file with the qasm front end, analyses the circuit
// with report::analyzeCircuit and prints its T-count, depths and erasures.
// tests/install builds it against an installed revbound; docs/guide.md
// quotes it.
//
//===----------------------------------------------------------------------===//
#include "revbound/qasm/Frontend.h"
#include "revbound/report/Report.h"
#include "revbound/support/Diagnostics.h"
#include "revbound/support/SourceFiles.h"

#include "llvm/Support/Path.h"

#include <cstdio>
#include <iostream>

namespace rb = revbound;

int main(int Argc, char **Argv) {
  if (Argc != 2) {
    std::cerr << "usage: revbound_embed FILE.qasm\n";
    return 2;
  }
  rb::SourceFiles Files; // owns the text every location points into
  // Errors about the input carry a location in Files; print them there.
  auto Fail = [&](llvm::Error E) {
    llvm::handleAllErrors(
        std::move(E),
        [&](const rb::DiagnosticError &D) {
          std::cerr << rb::formatDiagnostic(Files.mgr(), D.diagnostic());
        },
        [&](const llvm::ErrorInfoBase &B) {
          std::cerr << Argv[1] << ": error: " << B.message() << "\n";
        });
    return 2;
  };

  llvm::Expected<unsigned> Buffer = Files.loadMain(Argv[1]);
  if (!Buffer)
    return Fail(Buffer.takeError());
  rb::DiagnosticSink Warnings;
  llvm::Expected<rb::ir::Circuit> Circuit = rb::qasm::buildCircuit(
      Files, *Buffer, rb::qasm::FrontendOptions{}, Warnings);
  if (!Circuit)
    return Fail(Circuit.takeError());
  for (const rb::Diagnostic &W : Warnings.warnings())
    std::cerr << rb::formatDiagnostic(Files.mgr(), W);

  rb::report::AnalysisOptions Opts; // 300 K, native leaves, engine "auto"
  llvm::Expected<rb::report::CircuitReport> R = rb::report::analyzeCircuit(
      *Circuit, Files, llvm::sys::path::filename(Argv[1]), Opts);
  if (!R)
    return Fail(R.takeError());

  const rb::report::ErasureReport &E = R->Erasures;
  std::printf("%s: %u qubits\n", R->File.c_str(), unsigned(R->Qubits));
  std::printf("T-count %llu\n", (unsigned long long)R->Ops.TCount);
  std::printf("two-qubit gates %llu\n", (unsigned long long)R->Ops.TwoQubit);
  std::printf("depth %llu\n", (unsigned long long)R->DepthAll);
  std::printf("T-depth %llu\n", (unsigned long long)R->DepthT);
  std::printf("erasure events %llu\n", (unsigned long long)E.Events);
  std::printf("erased entropy %.6f to %.6f bits\n", E.Entropy.Low,
              E.Entropy.High);
  std::printf("least heat at %g K %.4g J\n", E.TemperatureK, E.HeatLowJ);
  return 0;
}
