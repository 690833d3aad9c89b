//===- Commands.h - The subcommands of the revbound driver ---------------===//
#ifndef REVBOUND_TOOL_COMMANDS_H
#define REVBOUND_TOOL_COMMANDS_H

#include "revbound/qasm/Frontend.h"
#include "revbound/report/Report.h"

#include <CLI/CLI.hpp>

#include <functional>
#include <string>
#include <vector>

namespace revbound::tool {

/// Exit codes (DESIGN.md): 0 ok, 1 a check failed, 2 bad input or usage,
/// 3 internal error.
enum ExitCode : int { ExitOk = 0, ExitCheckFailed = 1, ExitBadInput = 2, ExitInternal = 3 };

/// Options every command that reads circuits shares.
struct InputOptions {
  std::vector<std::string> Files;
  std::vector<std::string> IncludePaths;
  bool AllowIncludeEscape = false;
  uint64_t MaxFileBytes = uint64_t(1) << 30;
  std::string StandardLibrary;
  std::string Granularity = "native";
  std::vector<std::string> Native;
  qasm::FrontendLimits Limits;
  unsigned MaxIncludeDepth = 16;
  uint64_t MaxDagNodes = 200'000;
  // Physical quantities as written ("1eV", "20 mK"); parsed in
  // analysisOptions so that a bad unit is a usage error.
  std::string Energy, EnergyPerQubit, EnergySpread, TargetTime;
  std::vector<std::string> GateAngles; // NAME=EXPR
  std::string DurationsFile;
  // Erasures and ancillas.
  std::vector<std::string> Roles; // NAME=ROLE
  std::string Engine = "auto";
  std::string Temperature = "300K";
  semantics::EngineOptions EngineLimits;
};

void addInputOptions(CLI::App &Cmd, InputOptions &O);
SourceOptions sourceOptions(const InputOptions &O);
/// The front-end options; fails with a message on a bad --role.
llvm::Expected<qasm::FrontendOptions> frontendOptions(const InputOptions &O);
/// The analysis options; fails with a message on a bad quantity or angle.
llvm::Expected<report::AnalysisOptions> analysisOptions(const InputOptions &O);

/// Analyses every file; prints diagnostics to stderr. Returns ExitOk, or
/// ExitBadInput when any file failed (after trying them all).
int analyzeAll(const InputOptions &O, report::Report &Out);

/// Writes `Text` to `Path` ("-" or empty for stdout) through a temporary
/// file and a rename, so that readers never see half a report.
int writeOutput(const std::string &Path, const std::string &Text);

/// A subcommand: its name, one line of help, and how to set it up; `Setup`
/// registers the options and returns the function that runs it.
struct Command {
  const char *Name;
  const char *Help;
  std::function<std::function<int()>(CLI::App &)> Setup;
};

std::function<int()> setupReport(CLI::App &Cmd);
std::function<int()> setupGates(CLI::App &Cmd);
std::function<int()> setupCheck(CLI::App &Cmd);
std::function<int()> setupCompare(CLI::App &Cmd);

} // namespace revbound::tool

#endif
