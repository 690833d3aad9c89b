//===- Verdict.h - Holding circuit reports to a budget (`revbound check`) -===//
//
// A budget's metrics are read off each CircuitReport (docs/check.md,
// "Metrics"), compared with the budget's ceilings and, for `[growth]`, with
// the same metrics of a baseline. The result is a CheckReport: plain data
// that the writers of CheckWriters.h only format.
//
// Counts compare exactly (value == limit passes). The real-valued metrics
// are sums of doubles whose last bits depend on the order of the terms, so
// they pass up to RealTolerance above their ceiling.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_POLICY_VERDICT_H
#define REVBOUND_POLICY_VERDICT_H

#include "revbound/policy/Budget.h"
#include "revbound/report/Report.h"

#include "llvm/ADT/ArrayRef.h"
#include "llvm/Support/Error.h"

#include <array>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace revbound::policy {

/// Relative slack of a real-valued metric over its ceiling.
inline constexpr double RealTolerance = 1e-9;

/// One circuit's figures, by metric; a metric may be absent (a baseline
/// read from JSON holds only the metrics the budget's growth needs).
struct MetricSet {
  std::array<std::optional<Amount>, NumMetrics> Values;
  std::optional<Amount> &operator[](Metric M) { return Values[unsigned(M)]; }
  const std::optional<Amount> &operator[](Metric M) const {
    return Values[unsigned(M)];
  }
};

/// Every metric of a report. entropy_bits and heat_J are the high ends of
/// their intervals: a budget holds for what the circuit may erase.
MetricSet metricsOf(const report::CircuitReport &C);

/// The figures a change is compared with.
struct Baseline {
  std::string Source; // the file given as --baseline
  /// A circuit file: it stands for the single checked file, whatever its
  /// name. Otherwise circuits are matched by path.
  bool SingleCircuit = false;
  std::vector<std::pair<std::string, MetricSet>> Circuits; // by "file"
};

/// A place a finding points to; Line 0 means the whole file.
struct Place {
  report::SourcePoint At;
  std::string What; // "reset anc[0]", "ancilla anc[0] (dirty)", "cx q[0], q[1]"
};

enum class CheckKind { Limit, Growth };
enum class CheckStatus { Passed, Failed, Skipped };

/// "budget/depth" for a limit, "growth/depth" for a growth check.
std::string ruleId(Metric M, CheckKind K);
/// What the rule holds, in a sentence (SARIF's rule help).
std::string ruleHelp(Metric M, CheckKind K);
/// The rule in a few words ("depth within the budget's limit").
std::string ruleSummary(Metric M, CheckKind K);

/// One metric of one file against one rule of the budget.
struct CheckResult {
  Metric M = Metric::Depth;
  CheckKind Kind = CheckKind::Limit;
  CheckStatus Status = CheckStatus::Passed;
  Amount Value;                        // the circuit's figure
  Amount Allowed;                      // the limit, or the baseline grown
  std::optional<Amount> BaselineValue; // growth only
  std::string Growth;                  // growth only, as written: "5%"
  report::SourcePoint Rule;            // the key in the budget file
  std::string Message;                 // for people (and SARIF, JUnit)
  std::vector<Place> Places;           // of a failure: where it comes from
  uint64_t PlacesTotal = 0;            // Places before the cap
};

struct FileVerdict {
  std::string File;
  std::vector<CheckResult> Checks; // by metric, each limit before growth
  std::vector<std::string> Notes;  // "not in the baseline ..."
};

struct CheckReport {
  std::string BudgetFile, BaselineFile; // BaselineFile empty without one
  std::string ToolVersion;
  std::vector<FileVerdict> Files; // in command-line order
  uint64_t Passed = 0, Failed = 0, Skipped = 0;
};

struct CheckOptions {
  unsigned MaxPlaces = 20; // places listed per failed check
  std::string ToolVersion;
};

/// Fails when the budget has growth rules and `BaselinePath` is empty (the
/// message points at `[growth]`), or when a circuit-file baseline would
/// stand for several checked files.
llvm::Error checkBaselineUse(const Budget &B, const std::string &BaselinePath,
                             bool BaselineIsCircuit, size_t CheckedFiles);

/// Holds every circuit to the budget, growth against `Base` (may be null
/// when the budget has no [growth]). Fails as checkBaselineUse does.
llvm::Expected<CheckReport>
evaluate(const Budget &B, llvm::ArrayRef<report::CircuitReport> Circuits,
         const Baseline *Base, const CheckOptions &Opts = {});

} // namespace revbound::policy

#endif
