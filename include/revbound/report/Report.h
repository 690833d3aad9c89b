//===- Report.h - What revbound found, as plain data ---------------------===//
//
// Analyses fill a Report; writers only format it. Locations are already
// resolved to file, line and column so that a Report outlives the sources.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_REPORT_REPORT_H
#define REVBOUND_REPORT_REPORT_H

#include "revbound/analysis/Census.h"
#include "revbound/analysis/LeafPolicy.h"
#include "revbound/analysis/DeviceSchedule.h"
#include "revbound/analysis/EnergyFrontier.h"
#include "revbound/analysis/SpeedBounds.h"
#include "revbound/qasm/Frontend.h"
#include "revbound/semantics/Engines.h"
#include "revbound/support/SourceFiles.h"

#include <cstdint>
#include <string>
#include <vector>

namespace revbound::report {

inline constexpr const char *SchemaVersion = "revbound/report-1";

struct SourcePoint {
  std::string File;
  unsigned Line = 0;
  unsigned Column = 0;
};

/// One operation on the critical path.
struct PathStep {
  std::string Gate;               // gate name, or measure / reset
  std::vector<std::string> Wires; // "q[0]", "c[1]"
  SourcePoint At;                 // the top-level statement
  SourcePoint Inside;             // the gate-body statement (Line 0 if none)
};

struct CriticalPath {
  std::string Method;  // "dag" (leaf graph) or "summary" (top-level ops)
  uint64_t Length = 0; // layers, equal to depth.all
  uint64_t Steps = 0;  // operations on the path
  std::vector<PathStep> Listed; // the first MaxPathSteps of them
};

struct Finding {
  std::string Severity; // "warning"
  SourcePoint At;
  std::string Message;
};

/// DESIGN.md's `speed`: the energy-free action and, with energies, times.
struct SpeedReport {
  analysis::EnergyOptions Energy; // as given
  analysis::SpeedBounds Bounds;
  std::optional<analysis::DeviceComparison> Device; // with --durations
  analysis::EnergyFrontier Frontier; // least time against energy, sampled
};

/// One erasure of DESIGN.md's ledger, located.
struct ErasureEntry {
  std::string Kind;   // reset | overwrite | discard
  std::string Wire;   // "anc[0]", or the bit "c[1]" of an overwrite
  SourcePoint At;
  std::string Status; // constant | exact | unknown
  double BitsLow = 0, BitsHigh = 0;
  uint64_t Samples = 0;   // nonzero: BitsEstimate is sampled, not a bound
  double BitsEstimate = 0;
  /// The depth.all layer the operation starts in (0-based); a discard
  /// happens after the last layer, at layer depth.all.
  uint64_t Layer = 0;
};

/// The erasures of one source line (file:line of the events' At): where a
/// circuit erases most. Sums of the events' own intervals (for discards,
/// their marginals, so BitsHigh stays an upper bound on what they remove).
struct ErasureHotspot {
  std::string File;
  unsigned Line = 0;
  uint64_t Events = 0;
  double BitsLow = 0, BitsHigh = 0;
};

struct AncillaEntry {
  std::string Wire;
  std::optional<bool> Clean;
  /// Input register -> bit string, highest index first (as a binary
  /// numeral); qubits of the register that are not inputs read 0.
  std::vector<std::pair<std::string, std::string>> Counterexample;
  bool HasCounterexample = false;
  std::optional<double> DirtyProbability;
  uint64_t Samples = 0, DirtySamples = 0;
};

/// DESIGN.md's `erasures`, `ancillas` and `landauer`.
struct ErasureReport {
  std::string Engine, Reason;
  uint64_t Events = 0;
  semantics::BitInterval Entropy;      // every event, discards jointly
  semantics::BitInterval DiscardJoint; // the discard at the end alone
  std::vector<ErasureEntry> List;
  /// By BitsHigh, then BitsLow, then Events (largest first), then file, line.
  std::vector<ErasureHotspot> Hotspots;
  std::vector<AncillaEntry> Ancillas;
  std::vector<std::string> Notes;
  double TemperatureK = 300;
  double HeatLowJ = 0, HeatHighJ = 0;
};

struct CircuitReport {
  std::string File;
  uint32_t Qubits = 0;
  uint32_t Clbits = 0;
  std::string Granularity;
  analysis::Census Ops;
  uint64_t DepthAll = 0, DepthTwoQubit = 0, DepthT = 0;
  uint64_t Volume = 0;
  CriticalPath Path;
  SpeedReport Speed;
  ErasureReport Erasures;
  std::vector<Finding> Warnings;
};

struct Report {
  std::vector<CircuitReport> Circuits;
};

struct AnalysisOptions {
  analysis::LeafPolicy Policy;
  uint64_t MaxDagNodes = 200'000; // leaf graph size for the exact path listing
  unsigned MaxPathSteps = 100;    // critical-path steps listed
  /// From this many top-level ops on, the speed bounds and then the
  /// erasure engine run on a thread of their own beside the census and the
  /// schedule (same results; a thread costs more than it saves on small
  /// circuits).
  uint64_t MinOpsForSecondThread = 100'000;
  analysis::EnergyOptions Energy;
  llvm::StringMap<double> GivenAngles; // --gate-angle NAME=RADIANS
  unsigned MaxMatrixQubits = 10;       // widest leaf given a unitary
  std::optional<config::Durations> Durations; // --durations FILE.toml
  semantics::EngineOptions Engine;
  double TemperatureK = 300; // --temperature
};

/// Reads, elaborates and analyses one file ("-" for standard input) whose
/// sources stay in `Files`. Errors are DiagnosticErrors located in `Files`;
/// warnings go to `Warnings` and into the report.
llvm::Expected<CircuitReport> analyzeFile(SourceFiles &Files,
                                          llvm::StringRef Path,
                                          const qasm::FrontendOptions &Front,
                                          const AnalysisOptions &Opts,
                                          DiagnosticSink &Warnings);

/// Analyses an elaborated circuit (the library entry point for embedders).
llvm::Expected<CircuitReport> analyzeCircuit(const ir::Circuit &C,
                                             const SourceFiles &Files,
                                             llvm::StringRef DisplayName,
                                             const AnalysisOptions &Opts);

} // namespace revbound::report

#endif
