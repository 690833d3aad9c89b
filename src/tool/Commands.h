//===- Commands.h - The subcommands of the revbound driver ---------------===//
#ifndef REVBOUND_TOOL_COMMANDS_H
#define REVBOUND_TOOL_COMMANDS_H

#include "revbound/qasm/Frontend.h"
#include "revbound/report/Report.h"

#include "llvm/ADT/STLFunctionalExtras.h"
#include "llvm/Support/raw_ostream.h"

#include <CLI/CLI.hpp>

#include <algorithm>
#include <functional>
#include <memory>
#include <string>
#include <thread>
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
  // Files analysed at once (--jobs); outputs do not depend on it.
  unsigned Jobs = std::max(1u, std::thread::hardware_concurrency());
};

void addInputOptions(CLI::App &Cmd, InputOptions &O);
SourceOptions sourceOptions(const InputOptions &O);
/// The front-end options; fails with a message on a bad --role.
llvm::Expected<qasm::FrontendOptions> frontendOptions(const InputOptions &O);
/// The analysis options; fails with a message on a bad quantity or angle.
llvm::Expected<report::AnalysisOptions> analysisOptions(const InputOptions &O);

/// Analyses every input (folders expanded: expandInputs in InputFiles.h)
/// on O.Jobs threads. Each report goes to `Take`, and each file's
/// diagnostics and warnings to stderr, in input order whatever the number
/// of threads, as soon as the file and all before it are done; a progress
/// line shows when stderr is a terminal. `Take` returning false stops the
/// run. Returns ExitOk, or ExitBadInput on a bad option or input list, or
/// when any file failed (after trying them all). An internal error in one
/// file is rethrown, in input order, for main() to map to ExitInternal.
int analyzeEach(const InputOptions &O,
                llvm::function_ref<bool(report::CircuitReport &&)> Take);

/// analyzeEach, keeping every report in `Out`.
int analyzeAll(const InputOptions &O, report::Report &Out);

/// Output written piece by piece: to stdout ("-" or empty), flushed after
/// each piece, or to a temporary file beside `Path` that commit() renames
/// over it, so that readers never see half a report. A temporary that is
/// not committed is removed.
class OutputStream {
public:
  OutputStream() = default;
  OutputStream(const OutputStream &) = delete;
  OutputStream &operator=(const OutputStream &) = delete;
  ~OutputStream();
  /// Prints why and returns ExitBadInput when the file cannot be created.
  int open(const std::string &Path);
  /// Appends `Text`; false once a write has failed.
  bool write(llvm::StringRef Text);
  /// Finishes the output; prints why and returns ExitBadInput (ExitInternal
  /// for stdout) when a write, the close or the rename failed.
  int commit();

private:
  std::string Path;
  llvm::SmallString<256> Temp;
  std::unique_ptr<llvm::raw_fd_ostream> File;
};

/// Writes `Text` to `Path` ("-" or empty for stdout) through OutputStream.
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
