//===- CommonOptions.cpp - Options shared by the commands that read files -===//
#include "Commands.h"

#include "Batch.h"
#include "InputFiles.h"

#include "revbound/support/Diagnostics.h"
#include "revbound/support/Units.h"

#include "llvm/Support/FileSystem.h"
#include "llvm/Support/Path.h"
#include "llvm/Support/raw_ostream.h"

#include <fmt/format.h>

#include <exception>
#include <iostream>
#include <numbers>
#include <optional>
#include <unistd.h>
#include <utility>

namespace revbound::tool {

void addInputOptions(CLI::App &Cmd, InputOptions &O) {
  Cmd.add_option("files", O.Files,
                 "OpenQASM 2.0 files ('-' for standard input); a folder stands "
                 "for the .qasm files under it, in sorted order")
      ->required();
  Cmd.add_option("--jobs,-j", O.Jobs,
                 "files analysed at once (default: the number of cores); "
                 "the output is the same for every value")
      ->check(CLI::Range(1u, 1024u))
      ->capture_default_str();
  Cmd.add_option("--include-path,-I", O.IncludePaths,
                 "folder searched for includes and allowed as an include root");
  Cmd.add_flag("--allow-include-escape", O.AllowIncludeEscape,
               "let includes leave the allowed roots");
  Cmd.add_option("--stdlib", O.StandardLibrary,
                 "file that replaces the built-in qelib1.inc");
  Cmd.add_option("--granularity", O.Granularity,
                 "leaves for counts and depth: native or primitive (U and CX)")
      ->check(CLI::IsMember({"native", "primitive"}));
  Cmd.add_option("--native", O.Native, "user gates to keep whole as leaves")
      ->delimiter(',');
  Cmd.add_option("--max-qubits", O.Limits.MaxQubits, "qubit limit")
      ->capture_default_str();
  Cmd.add_option("--max-clbits", O.Limits.MaxClbits, "classical bit limit")
      ->capture_default_str();
  Cmd.add_option("--max-nesting", O.Limits.MaxNesting,
                 "levels of gate definitions calling gates")
      ->check(CLI::Range(1u, qasm::MaxNestingCap))
      ->capture_default_str();
  Cmd.add_option("--max-ops", O.Limits.MaxOps,
                 "top-level operations after broadcasting")
      ->check(CLI::Range(uint64_t(0), ir::MaxPoolEntries))
      ->capture_default_str();
  Cmd.add_option("--max-include-depth", O.MaxIncludeDepth,
                 "files open at once through nested includes")
      ->capture_default_str();
  Cmd.add_option("--max-file-bytes", O.MaxFileBytes, "size limit of every file read")
      ->capture_default_str();
  Cmd.add_option("--energy", O.Energy,
                 "energy above the ground state shared by the machine (J, eV, "
                 "meV, ...): the pooled model");
  Cmd.add_option("--energy-per-qubit", O.EnergyPerQubit,
                 "energy each qubit holds: the per-qubit (longest path) model");
  Cmd.add_option("--energy-spread", O.EnergySpread,
                 "energy spread, for the Mandelstam-Tamm bound (per qubit "
                 "with --energy-per-qubit)");
  Cmd.add_option("--target-time", O.TargetTime,
                 "a run time (s, ms, us, ns, ...): report the least energy for it");
  Cmd.add_option("--gate-angle", O.GateAngles,
                 "NAME=RADIANS: the gate angle of a leaf revbound cannot compute "
                 "(opaque, or over 10 qubits); RADIANS may use pi, e.g. pi/2");
  Cmd.add_option("--durations", O.DurationsFile,
                 "TOML file of gate durations: compare the device's schedule "
                 "with the bounds");
  Cmd.add_option("--max-dag-nodes", O.MaxDagNodes,
                 "largest leaf graph built for the critical path")
      ->capture_default_str();
  Cmd.add_option("--role", O.Roles,
                 "NAME=ROLE: the role of a register or qubit (input, ancilla, "
                 "output, garbage); wins over the file's '//!' comments");
  Cmd.add_option("--engine", O.Engine,
                 "semantic engine for erasures and ancillas: auto, structural, "
                 "classical or density")
      ->check(CLI::IsMember({"auto", "structural", "classical", "density"}))
      ->capture_default_str();
  Cmd.add_option("--temperature", O.Temperature,
                 "bath temperature for the Landauer heat (K, mK, uK)")
      ->capture_default_str();
  Cmd.add_option("--max-density-qubits", O.EngineLimits.MaxDensityQubits,
                 "widest circuit the density engine simulates")
      ->check(CLI::Range(1u, 14u))
      ->capture_default_str();
  Cmd.add_option("--max-bdd-nodes", O.EngineLimits.MaxBddNodes,
                 "BDD nodes the classical engine may hold before it samples")
      ->check(CLI::Range(uint64_t(1) << 10, uint64_t(1) << 26))
      ->capture_default_str();
  Cmd.add_option("--samples", O.EngineLimits.Samples,
                 "random inputs when the classical engine falls back to "
                 "sampling")
      ->check(CLI::Range(uint64_t(64), uint64_t(1) << 24))
      ->capture_default_str();
  Cmd.add_option("--max-engine-ops", O.EngineLimits.MaxExpandedOps,
                 "gate applications a semantic engine expands to; larger "
                 "calls are over-approximated whole")
      ->capture_default_str();
}

SourceOptions sourceOptions(const InputOptions &O) {
  SourceOptions S;
  S.IncludePaths = O.IncludePaths;
  S.AllowIncludeEscape = O.AllowIncludeEscape;
  S.MaxFileBytes = O.MaxFileBytes;
  return S;
}

llvm::Expected<qasm::FrontendOptions> frontendOptions(const InputOptions &O) {
  qasm::FrontendOptions F;
  for (const std::string &Spec : O.Roles) {
    llvm::Expected<qasm::RoleOption> R = qasm::parseRoleOption(Spec);
    if (!R)
      return R.takeError();
    F.Roles.push_back(std::move(*R));
  }
  F.Limits = O.Limits;
  F.Parser.MaxIncludeDepth = O.MaxIncludeDepth;
  // Named on the command line, so it is read wherever it is.
  F.Parser.StandardLibraryPath = O.StandardLibrary;
  return F;
}

static llvm::Expected<std::optional<double>>
optionalQuantity(const std::string &Text, Dimension D, const char *Option) {
  if (Text.empty())
    return std::optional<double>();
  llvm::Expected<double> V = parseQuantity(Text, D);
  if (!V)
    return llvm::createStringError(llvm::inconvertibleErrorCode(), "%s: %s",
                                   Option, llvm::toString(V.takeError()).c_str());
  return std::optional<double>(*V);
}

/// NAME=EXPR with EXPR a constant OpenQASM expression, read by our parser.
static llvm::Error addGateAngle(const std::string &Spec,
                                llvm::StringMap<double> &Out) {
  size_t Eq = Spec.find('=');
  auto fail = [&](const std::string &Why) {
    return llvm::createStringError(llvm::inconvertibleErrorCode(),
                                   "--gate-angle '%s': %s", Spec.c_str(),
                                   Why.c_str());
  };
  if (Eq == std::string::npos || Eq == 0)
    return fail("expected NAME=RADIANS");
  SourceFiles Files;
  unsigned Id = Files.addBuffer("<--gate-angle>",
                                "OPENQASM 2.0; qreg q[1]; U(" + Spec.substr(Eq + 1) +
                                    ",0,0) q[0];");
  DiagnosticSink Ignored;
  llvm::Expected<ir::Circuit> C = qasm::buildCircuit(Files, Id, {}, Ignored);
  if (!C) {
    llvm::consumeError(C.takeError());
    return fail("the angle is not a constant expression");
  }
  if (C->Params.size() != 3)
    return fail("the angle is not a single expression");
  if (C->Params[0] < 0 || C->Params[0] > std::numbers::pi / 2 + 1e-12)
    return fail("a gate angle lies in [0, pi/2]");
  Out[Spec.substr(0, Eq)] = C->Params[0];
  return llvm::Error::success();
}

llvm::Expected<report::AnalysisOptions> analysisOptions(const InputOptions &O) {
  report::AnalysisOptions A;
  struct {
    const std::string &Text;
    Dimension D;
    const char *Option;
    std::optional<double> &Into;
  } Quantities[] = {
      {O.Energy, Dimension::Energy, "--energy", A.Energy.EnergyJ},
      {O.EnergyPerQubit, Dimension::Energy, "--energy-per-qubit",
       A.Energy.EnergyPerQubitJ},
      {O.EnergySpread, Dimension::Energy, "--energy-spread", A.Energy.SpreadJ},
      {O.TargetTime, Dimension::Time, "--target-time", A.Energy.TargetTimeS},
  };
  for (auto &Q : Quantities) {
    llvm::Expected<std::optional<double>> V =
        optionalQuantity(Q.Text, Q.D, Q.Option);
    if (!V)
      return V.takeError();
    Q.Into = *V;
  }
  for (const std::string &Spec : O.GateAngles)
    if (llvm::Error E = addGateAngle(Spec, A.GivenAngles))
      return E;
  if (!O.DurationsFile.empty()) {
    config::ConfigError Error;
    A.Durations = config::readDurations(O.DurationsFile, Error);
    if (!A.Durations)
      return llvm::createStringError(llvm::inconvertibleErrorCode(), "%s",
                                     Error.format().c_str());
  }
  A.Policy.Level = O.Granularity == "primitive" ? analysis::Granularity::Primitive
                                                : analysis::Granularity::Native;
  for (const std::string &N : O.Native)
    A.Policy.NativeNames.insert(N);
  A.MaxDagNodes = O.MaxDagNodes;
  A.Engine = O.EngineLimits;
  A.Engine.Choice = *semantics::parseEngineChoice(O.Engine);
  llvm::Expected<double> T = parseQuantity(O.Temperature, Dimension::Temperature);
  if (!T)
    return llvm::createStringError(llvm::inconvertibleErrorCode(),
                                   "--temperature: %s",
                                   llvm::toString(T.takeError()).c_str());
  if (!(*T > 0))
    return llvm::createStringError(llvm::inconvertibleErrorCode(),
                                   "--temperature: must be above 0 K");
  A.TemperatureK = *T;
  return A;
}

/// A usage error about the options as a whole: one line on stderr.
static int optionsError(llvm::Error E) {
  // Messages from files already say "file:line:col: error:".
  std::string Message = llvm::toString(std::move(E));
  if (Message.find(": error: ") == std::string::npos)
    Message = "revbound: error: " + Message;
  std::cerr << Message << "\n";
  return ExitBadInput;
}

namespace {

/// What one file leaves: its report (none when it failed), and its
/// diagnostics and warnings as they will be printed.
struct FileOutcome {
  std::optional<report::CircuitReport> Report;
  std::string Messages;
  std::exception_ptr Crash; // rethrown on the calling thread, in order
};

} // namespace

static FileOutcome analyzeOne(const std::string &File, const InputOptions &O,
                              const qasm::FrontendOptions &Front,
                              const report::AnalysisOptions &Analysis) {
  FileOutcome Out;
  try {
    SourceFiles Files(sourceOptions(O));
    DiagnosticSink Warnings;
    llvm::Expected<report::CircuitReport> R =
        report::analyzeFile(Files, File, Front, Analysis, Warnings);
    for (const Diagnostic &W : Warnings.warnings())
      Out.Messages += formatDiagnostic(Files.mgr(), W);
    if (!R) {
      llvm::handleAllErrors(
          R.takeError(),
          [&](const DiagnosticError &E) {
            Out.Messages += formatDiagnostic(Files.mgr(), E.diagnostic());
          },
          [&](const llvm::ErrorInfoBase &E) {
            // Errors without a place in a file: a --role naming no register,
            // an engine that cannot run.
            Out.Messages += fmt::format(
                "{}: error: {}\n", File == "-" ? "<stdin>" : File, E.message());
          });
      return Out;
    }
    for (const report::Finding &F : R->Warnings)
      if (F.At.Line == 0)
        Out.Messages += fmt::format("{}: warning: {}\n", F.At.File, F.Message);
    Out.Report = std::move(*R);
  } catch (...) {
    Out.Crash = std::current_exception();
  }
  return Out;
}

int analyzeEach(const InputOptions &O,
                llvm::function_ref<bool(report::CircuitReport &&)> Take) {
  llvm::Expected<qasm::FrontendOptions> FrontOrErr = frontendOptions(O);
  llvm::Expected<report::AnalysisOptions> AnalysisOrErr = analysisOptions(O);
  if (!FrontOrErr || !AnalysisOrErr) {
    llvm::Error E =
        FrontOrErr ? AnalysisOrErr.takeError() : FrontOrErr.takeError();
    if (!FrontOrErr && !AnalysisOrErr)
      llvm::consumeError(AnalysisOrErr.takeError()); // one message is enough
    return optionsError(std::move(E));
  }
  llvm::Expected<std::vector<std::string>> Paths = expandInputs(O.Files);
  if (!Paths)
    return optionsError(Paths.takeError());
  const qasm::FrontendOptions &Front = *FrontOrErr;
  const report::AnalysisOptions &Analysis = *AnalysisOrErr;
  // A few results per thread may wait for a slow earlier file; slot I of
  // the ring holds file I until it is taken.
  std::vector<FileOutcome> Ring(
      std::min<size_t>(Paths->size(), size_t(4) * std::max(1u, O.Jobs)));
  ProgressLine Progress(Paths->size(), ::isatty(STDERR_FILENO) == 1, std::cerr);
  size_t Done = 0;
  int Status = ExitOk;
  runOrdered(
      Paths->size(), O.Jobs, Ring.size(),
      [&](size_t I) {
        Ring[I % Ring.size()] = analyzeOne((*Paths)[I], O, Front, Analysis);
      },
      [&](size_t I) {
        FileOutcome Out = std::exchange(Ring[I % Ring.size()], FileOutcome());
        ++Done;
        if (Out.Crash) {
          Progress.clear();
          std::rethrow_exception(Out.Crash);
        }
        if (!Out.Messages.empty()) {
          Progress.clear();
          std::cerr << Out.Messages << std::flush;
        }
        Progress.show(Done);
        if (!Out.Report) {
          Status = ExitBadInput;
          return true;
        }
        return Take(std::move(*Out.Report));
      },
      [&] { Progress.show(Done); });
  Progress.clear();
  return Status;
}

int analyzeAll(const InputOptions &O, report::Report &Out) {
  return analyzeEach(O, [&](report::CircuitReport &&C) {
    Out.Circuits.push_back(std::move(C));
    return true;
  });
}

OutputStream::~OutputStream() {
  if (!File)
    return;
  File->clear_error(); // raw_fd_ostream aborts on an unchecked error
  File.reset();
  llvm::sys::fs::remove(Temp);
}

int OutputStream::open(const std::string &P) {
  Path = P;
  if (Path.empty() || Path == "-")
    return ExitOk;
  llvm::SmallString<256> Model(Path);
  Model += ".tmp-%%%%%%";
  int FD;
  if (std::error_code EC = llvm::sys::fs::createUniqueFile(Model, FD, Temp)) {
    std::cerr << fmt::format("error: cannot write '{}': {}\n", Path,
                             EC.message());
    return ExitBadInput;
  }
  File = std::make_unique<llvm::raw_fd_ostream>(FD, /*shouldClose=*/true);
  return ExitOk;
}

bool OutputStream::write(llvm::StringRef Text) {
  if (!File) {
    std::cout.write(Text.data(), std::streamsize(Text.size()));
    std::cout.flush();
    return bool(std::cout);
  }
  *File << Text;
  return !File->has_error();
}

int OutputStream::commit() {
  if (!File) {
    std::cout.flush();
    return std::cout ? ExitOk : ExitInternal;
  }
  File->close();
  bool Failed = File->has_error();
  File->clear_error();
  File.reset();
  if (Failed) {
    llvm::sys::fs::remove(Temp);
    std::cerr << fmt::format("error: cannot write '{}'\n", Path);
    return ExitBadInput;
  }
  if (std::error_code EC = llvm::sys::fs::rename(Temp, Path)) {
    llvm::sys::fs::remove(Temp);
    std::cerr << fmt::format("error: cannot write '{}': {}\n", Path,
                             EC.message());
    return ExitBadInput;
  }
  return ExitOk;
}

int writeOutput(const std::string &Path, const std::string &Text) {
  OutputStream Out;
  if (int Status = Out.open(Path); Status != ExitOk)
    return Status;
  Out.write(Text); // a failure shows in commit()
  return Out.commit();
}

} // namespace revbound::tool
