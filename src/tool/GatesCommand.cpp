//===- GatesCommand.cpp - `revbound gates [FILE]` -------------------------===//
#include "Commands.h"

#include "revbound/qasm/StandardLibrary.h"
#include "revbound/report/GateTable.h"
#include "revbound/support/Diagnostics.h"

#include <iostream>
#include <memory>

namespace revbound::tool {

namespace {

struct GatesOptions {
  InputOptions Input; // Files holds at most one file
  std::string Format = "text";
  std::string Output;
  std::vector<std::string> Params;
};

/// Prints `E` (DiagnosticErrors through `Files`) and returns ExitBadInput.
int printError(const SourceFiles &Files, llvm::Error E) {
  llvm::handleAllErrors(
      std::move(E),
      [&](const DiagnosticError &D) {
        std::cerr << formatDiagnostic(Files.mgr(), D.diagnostic());
      },
      [](const llvm::ErrorInfoBase &Other) {
        std::cerr << "error: " << Other.message() << "\n";
      });
  return ExitBadInput;
}

void printWarnings(const SourceFiles &Files, const DiagnosticSink &Sink) {
  for (const Diagnostic &W : Sink.warnings())
    std::cerr << formatDiagnostic(Files.mgr(), W);
}

int runGates(const GatesOptions &O) {
  // One SourceFiles for the library program, the file and the --params
  // buffers, so that every diagnostic resolves through it.
  SourceFiles Files(sourceOptions(O.Input));
  std::vector<report::ParamAssignment> Assignments;
  for (const std::string &P : O.Params) {
    llvm::Expected<report::ParamAssignment> A =
        report::parseParamAssignment(Files, P);
    if (!A)
      return printError(Files, A.takeError());
    Assignments.push_back(std::move(*A));
  }
  // The gates command takes no --role, so this cannot fail.
  qasm::FrontendOptions Front = llvm::cantFail(frontendOptions(O.Input));
  DiagnosticSink Warnings;
  unsigned LibId = Files.addBuffer("<revbound gates>",
                                   "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n");
  llvm::Expected<ir::Circuit> Library =
      qasm::buildCircuit(Files, LibId, Front, Warnings);
  if (!Library) {
    printWarnings(Files, Warnings);
    return printError(Files, Library.takeError());
  }
  std::optional<ir::Circuit> File;
  std::string FileName;
  if (!O.Input.Files.empty()) {
    FileName = O.Input.Files[0] == "-" ? "<stdin>" : O.Input.Files[0];
    llvm::Expected<unsigned> Id = Files.loadMain(O.Input.Files[0]);
    if (!Id)
      return printError(Files, Id.takeError());
    llvm::Expected<ir::Circuit> C =
        qasm::buildCircuit(Files, *Id, Front, Warnings);
    printWarnings(Files, Warnings);
    if (!C)
      return printError(Files, C.takeError());
    File = std::move(*C);
  } else {
    printWarnings(Files, Warnings);
  }
  std::string LibraryName = O.Input.StandardLibrary.empty()
                                ? std::string(qasm::BuiltinLibraryName)
                                : O.Input.StandardLibrary;
  llvm::Expected<report::GateTable> T =
      report::buildGateTable(*Library, File ? &*File : nullptr, Files, FileName,
                             LibraryName, Assignments);
  if (!T)
    return printError(Files, T.takeError());
  std::string Text = O.Format == "json" ? report::writeGateTableJson(*T)
                                        : report::writeGateTableText(*T);
  return writeOutput(O.Output, Text);
}

} // namespace

std::function<int()> setupGates(CLI::App &Cmd) {
  auto O = std::make_shared<GatesOptions>();
  InputOptions &In = O->Input;
  Cmd.add_option("file", In.Files,
                 "also list this file's own gates ('-' for standard input)")
      ->expected(0, 1);
  Cmd.add_option("--format", O->Format, "text or json")
      ->check(CLI::IsMember({"text", "json"}))
      ->capture_default_str();
  Cmd.add_option("-o,--output", O->Output,
                 "write the table here instead of stdout");
  // Not split on commas by CLI11: the values of one gate are comma-separated.
  Cmd.add_option("--params", O->Params,
                 "values for a parametrised gate, NAME=v1,v2,... (repeatable; "
                 "constant expressions such as pi/4)")
      ->allow_extra_args(false);
  Cmd.add_option("--stdlib", In.StandardLibrary,
                 "file that replaces the built-in qelib1.inc");
  Cmd.add_option("--include-path,-I", In.IncludePaths,
                 "folder searched for includes and allowed as an include root");
  Cmd.add_flag("--allow-include-escape", In.AllowIncludeEscape,
               "let includes leave the allowed roots");
  Cmd.add_option("--max-nesting", In.Limits.MaxNesting,
                 "levels of gate definitions calling gates")
      ->check(CLI::Range(1u, qasm::MaxNestingCap))
      ->capture_default_str();
  Cmd.add_option("--max-include-depth", In.MaxIncludeDepth,
                 "files open at once through nested includes")
      ->capture_default_str();
  Cmd.add_option("--max-file-bytes", In.MaxFileBytes,
                 "size limit of every file read")
      ->capture_default_str();
  return [O] { return runGates(*O); };
}

} // namespace revbound::tool
