//===- CheckCommand.cpp - `revbound check FILE... --budget BUDGET.toml` ---===//
#include "Commands.h"
#include "InputFiles.h"

#include "revbound/policy/BaselineReader.h"
#include "revbound/policy/Budget.h"
#include "revbound/policy/CheckWriters.h"
#include "revbound/policy/Verdict.h"

#include <fmt/format.h>

#include <filesystem>
#include <iostream>
#include <memory>

namespace revbound::tool {

namespace {

struct CheckOptions {
  InputOptions Input;
  std::string BudgetFile, BaselineFile;
  std::string Sarif, Junit, Markdown;
};

int usageError(const std::string &Message) {
  // Messages about a file already say "file:line:col: error:".
  if (Message.find(": error: ") == std::string::npos)
    std::cerr << "revbound: error: " << Message << "\n";
  else
    std::cerr << Message << "\n";
  return ExitBadInput;
}

/// The baseline's figures: a circuit analysed with the checked files'
/// options, or the metrics of a saved JSON report.
int loadBaseline(const CheckOptions &O, const policy::Budget &B, bool IsCircuit,
                 policy::Baseline &Out) {
  Out.Source = O.BaselineFile;
  if (IsCircuit) {
    InputOptions Input = O.Input;
    Input.Files = {O.BaselineFile};
    report::Report R;
    if (int Status = analyzeAll(Input, R); Status != ExitOk)
      return Status;
    Out.SingleCircuit = true;
    Out.Circuits.emplace_back(R.Circuits.front().File,
                              policy::metricsOf(R.Circuits.front()));
    return ExitOk;
  }
  std::vector<policy::Metric> Wanted;
  for (const policy::GrowthRule &G : B.Growth)
    Wanted.push_back(G.M);
  config::ConfigError Error;
  std::optional<policy::Baseline> Read = policy::readBaselineReport(
      O.BaselineFile, Wanted, O.Input.MaxFileBytes, Error);
  if (!Read)
    return usageError(Error.format());
  Out = std::move(*Read);
  return ExitOk;
}

int runCheck(const CheckOptions &O) {
  config::ConfigError Error;
  std::optional<policy::Budget> B = policy::readBudget(O.BudgetFile, Error);
  if (!B)
    return usageError(Error.format());
  unsigned ToStdout = 0;
  for (const std::string *Path : {&O.Sarif, &O.Junit, &O.Markdown})
    ToStdout += *Path == "-";
  if (ToStdout > 1)
    return usageError("only one of --sarif, --junit and --markdown may write "
                      "to standard output ('-')");
  if (O.BaselineFile == "-")
    return usageError("--baseline must name a file, not standard input");
  if (!O.BaselineFile.empty() && std::filesystem::is_directory(O.BaselineFile))
    return usageError(fmt::format("--baseline {} is a folder; give one "
                                  "circuit or a saved JSON report",
                                  O.BaselineFile));
  bool BaselineIsCircuit =
      !O.BaselineFile.empty() && !policy::isJsonReport(O.BaselineFile);
  // Folders count as the circuits they hold.
  llvm::Expected<std::vector<std::string>> Checked = expandInputs(O.Input.Files);
  if (!Checked)
    return usageError(llvm::toString(Checked.takeError()));
  if (llvm::Error E = policy::checkBaselineUse(
          *B, O.BaselineFile, BaselineIsCircuit, Checked->size()))
    return usageError(llvm::toString(std::move(E)));
  std::optional<policy::Baseline> Base;
  if (!O.BaselineFile.empty() && B->Growth.empty()) {
    std::cerr << fmt::format("revbound: warning: --baseline {} is not used: "
                             "the budget {} has no [growth]\n",
                             O.BaselineFile, B->File);
  } else if (!O.BaselineFile.empty()) {
    Base.emplace();
    if (int Status = loadBaseline(O, *B, BaselineIsCircuit, *Base);
        Status != ExitOk)
      return Status;
  }
  report::Report R;
  if (int Status = analyzeAll(O.Input, R); Status != ExitOk)
    return Status;
  policy::CheckOptions Opts;
  Opts.ToolVersion = REVBOUND_VERSION; // from CMake's project()
  llvm::Expected<policy::CheckReport> Verdict =
      policy::evaluate(*B, R.Circuits, Base ? &*Base : nullptr, Opts);
  if (!Verdict)
    return usageError(llvm::toString(Verdict.takeError()));
  if (ToStdout == 0)
    std::cout << policy::writeCheckText(*Verdict) << std::flush;
  struct {
    const std::string &Path;
    std::string (*Write)(const policy::CheckReport &);
  } Outputs[] = {{O.Sarif, policy::writeCheckSarif},
                 {O.Junit, policy::writeCheckJunit},
                 {O.Markdown, policy::writeCheckMarkdown}};
  int WriteStatus = ExitOk;
  for (const auto &Output : Outputs)
    if (!Output.Path.empty())
      if (int Status = writeOutput(Output.Path, Output.Write(*Verdict));
          Status != ExitOk)
        WriteStatus = Status;
  if (WriteStatus != ExitOk)
    return WriteStatus;
  return Verdict->Failed ? ExitCheckFailed : ExitOk;
}

} // namespace

std::function<int()> setupCheck(CLI::App &Cmd) {
  auto O = std::make_shared<CheckOptions>();
  addInputOptions(Cmd, O->Input);
  Cmd.add_option("--budget", O->BudgetFile,
                 "TOML budget: [limits] by metric, [growth] over the baseline "
                 "(docs/check.md)")
      ->required();
  Cmd.add_option("--baseline", O->BaselineFile,
                 "what [growth] compares with: a circuit, or a JSON report "
                 "(revbound report --format json -o FILE)");
  Cmd.add_option("--sarif", O->Sarif, "write the failures as SARIF 2.1.0 here");
  Cmd.add_option("--junit", O->Junit, "write JUnit XML here");
  Cmd.add_option("--markdown", O->Markdown,
                 "write a Markdown table here (pull-request comment, job "
                 "summary)");
  return [O] { return runCheck(*O); };
}

} // namespace revbound::tool
