//===- CompareCommand.cpp - `revbound compare FILE...` ---------------------===//
#include "Commands.h"

#include "revbound/report/Compare.h"
#include "revbound/semantics/Equivalence.h"

#include <fmt/format.h>

#include <iostream>
#include <memory>

namespace revbound::tool {
namespace {

struct CompareOptions {
  InputOptions Input;
  std::string Format = "text";
  std::string Output;
  bool Equivalence = false;
  semantics::EquivalenceOptions Checker;
};

/// Elaborates `Path` again for the equivalence checker (its report already
/// passed, so errors here are unexpected but still reported).
std::optional<ir::Circuit> elaborate(const InputOptions &In,
                                     const qasm::FrontendOptions &Front,
                                     const std::string &Path) {
  SourceFiles Files(sourceOptions(In));
  DiagnosticSink Warnings;
  llvm::Expected<unsigned> Buffer = Files.loadMain(Path);
  if (!Buffer) {
    std::cerr << fmt::format("{}: error: {}\n", Path,
                             llvm::toString(Buffer.takeError()));
    return std::nullopt;
  }
  llvm::Expected<ir::Circuit> C =
      qasm::buildCircuit(Files, *Buffer, Front, Warnings);
  if (!C) {
    std::cerr << fmt::format("{}: error: {}\n", Path,
                             llvm::toString(C.takeError()));
    return std::nullopt;
  }
  return std::move(*C);
}

int runCompare(const CompareOptions &O) {
  report::CompareReport R;
  int Status = analyzeAll(O.Input, R.Circuits);
  if (Status != ExitOk)
    return Status;
  const std::vector<report::CircuitReport> &Circuits = R.Circuits.Circuits;
  if (Circuits.size() < 2) {
    std::cerr << "revbound: error: compare needs at least two circuits, the "
                 "reference first\n";
    return ExitBadInput;
  }
  R.Rows = report::metricTable(R.Circuits);
  semantics::EquivalenceOptions Checker = O.Checker;
  Checker.MaxBddNodes = O.Input.EngineLimits.MaxBddNodes;
  Checker.MaxExpandedOps = O.Input.EngineLimits.MaxExpandedOps;
  Checker.MaxMatrixQubits = O.Input.EngineLimits.MaxMatrixQubits;
  bool AnyDifferent = false;
  if (O.Equivalence) {
    R.EquivalenceChecked = true;
    for (const report::CircuitReport &C : Circuits)
      if (C.File == "<stdin>") {
        std::cerr << "revbound: error: compare --equivalence reads each file "
                     "twice and cannot take standard input\n";
        return ExitBadInput;
      }
    llvm::Expected<qasm::FrontendOptions> Front = frontendOptions(O.Input);
    if (!Front) {
      std::cerr << "revbound: error: " << llvm::toString(Front.takeError())
                << "\n";
      return ExitBadInput;
    }
    std::optional<ir::Circuit> Reference =
        elaborate(O.Input, *Front, Circuits[0].File);
    if (!Reference)
      return ExitBadInput;
    for (size_t I = 1; I < Circuits.size(); ++I) {
      std::optional<ir::Circuit> Candidate =
          elaborate(O.Input, *Front, Circuits[I].File);
      if (!Candidate)
        return ExitBadInput;
      llvm::Expected<semantics::EquivalenceResult> V =
          semantics::checkEquivalence(*Reference, *Candidate, Checker);
      if (!V) {
        std::cerr << fmt::format("{}: error: against the reference {}: {}\n",
                                 Circuits[I].File, Circuits[0].File,
                                 llvm::toString(V.takeError()));
        return ExitBadInput;
      }
      AnyDifferent |= V->Verdict == semantics::EquivalenceVerdict::NotEquivalent;
      R.Equivalence.push_back({Circuits[I].File, std::move(*V)});
    }
  }
  std::string Text;
  if (O.Format == "json")
    Text = report::writeCompareJson(R);
  else if (O.Format == "csv")
    Text = report::writeCompareCsv(R);
  else if (O.Format == "markdown")
    Text = report::writeCompareMarkdown(R);
  else
    Text = report::writeCompareText(R);
  int Written = writeOutput(O.Output, Text);
  if (Written != ExitOk)
    return Written;
  return AnyDifferent ? ExitCheckFailed : ExitOk;
}

} // namespace

std::function<int()> setupCompare(CLI::App &Cmd) {
  auto O = std::make_shared<CompareOptions>();
  addInputOptions(Cmd, O->Input);
  Cmd.add_option("--format", O->Format, "text, json, csv or markdown")
      ->check(CLI::IsMember({"text", "json", "csv", "markdown"}))
      ->capture_default_str();
  Cmd.add_option("-o,--output", O->Output,
                 "write the comparison here instead of stdout");
  Cmd.add_flag("--equivalence", O->Equivalence,
               "first check that every file computes what the first does; "
               "exit 1 when one does not");
  Cmd.add_option("--trials", O->Checker.Trials,
                 "random trials when no exact method fits")
      ->check(CLI::Range(1u, 1u << 20))
      ->capture_default_str();
  Cmd.add_option("--max-exact-inputs", O->Checker.MaxExactInputs,
                 "most input qubits for which every basis input is run")
      ->check(CLI::Range(0u, 30u))
      ->capture_default_str();
  return [O] { return runCompare(*O); };
}

} // namespace revbound::tool
