//===- Budget.h - The budget file of `revbound check`, read from TOML -----===//
//
//   [limits]               # docs/check.md
//   erasure_events = 0     # absolute ceilings, by metric name
//   depth = 120
//   heat_J = 3e-21
//   [growth]               # allowed growth over --baseline
//   depth = "5%"
//   gates = "0%"
//
// Counts are compared exactly as integers; entropy_bits, action_Js and
// heat_J are doubles. Unknown tables and keys, wrong types and malformed
// percentages are errors with the budget file's line and column.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_POLICY_BUDGET_H
#define REVBOUND_POLICY_BUDGET_H

#include "revbound/config/Durations.h"
#include "revbound/report/Report.h"

#include "llvm/ADT/ArrayRef.h"
#include "llvm/ADT/StringRef.h"

#include <cstdint>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace revbound::policy {

/// The metrics a budget may hold, in the order every output lists them.
enum class Metric {
  ErasureEvents,
  EntropyBits,
  DirtyAncillas,
  Depth,
  TwoQubitDepth,
  TCount,
  Gates,
  Qubits,
  ActionJs,
  HeatJ,
};
inline constexpr unsigned NumMetrics = 10;

/// Every metric, in enum order.
llvm::ArrayRef<Metric> allMetrics();
/// The name budgets use ("erasure_events", "action_Js", ...).
llvm::StringRef metricName(Metric M);
/// The metric of a budget key; std::nullopt for an unknown name.
std::optional<Metric> parseMetric(llvm::StringRef Name);
/// True for metrics that are exact integer counts; false for the three
/// real-valued ones (entropy_bits, action_Js, heat_J).
bool isCountMetric(Metric M);
/// The unit a value of `M` is written with in messages ("layers", "J s").
llvm::StringRef metricUnit(Metric M);

/// A metric's figure: an exact count or a double, as isCountMetric says.
struct Amount {
  bool IsCount = true;
  uint64_t Count = 0;
  double Real = 0;

  static Amount count(uint64_t N) { return {true, N, 0}; }
  static Amount real(double X) { return {false, 0, X}; }
};

/// `A` and `B` as text: counts as integers, doubles to six significant
/// digits, or in full when six digits would print two different values
/// alike.
std::pair<std::string, std::string> showAmounts(const Amount &A,
                                                const Amount &B);

/// `[limits]`: the metric may not exceed Ceiling.
struct LimitRule {
  Metric M = Metric::Depth;
  Amount Ceiling;
  report::SourcePoint At; // the key in the budget file
};

/// `[growth]`: the metric may exceed its baseline value by at most this
/// percentage.
struct GrowthRule {
  Metric M = Metric::Depth;
  /// The percentage times 10^6, so that "2.5%" is exact: 2'500'000.
  uint64_t PercentMicros = 0;
  std::string Written; // as in the file: "2.5%"
  report::SourcePoint At;
};

/// The largest growth a budget may allow, and the most decimals it may
/// give (so that PercentMicros holds it exactly).
inline constexpr uint64_t MaxGrowthPercent = 1'000'000;
inline constexpr unsigned MaxGrowthDecimals = 6;

struct Budget {
  std::string File;
  std::vector<LimitRule> Limits;   // in metric order
  std::vector<GrowthRule> Growth;  // in metric order
  report::SourcePoint GrowthTable; // `[growth]`, when present
  bool HasGrowthTable = false;
};

/// Parses budget text read from `Name`; on failure returns std::nullopt and
/// the first error, located in the text.
std::optional<Budget> parseBudget(llvm::StringRef Text, const std::string &Name,
                                  config::ConfigError &Error);

/// Reads a budget file (a regular file of at most 16 MiB); on failure
/// returns std::nullopt and the error.
std::optional<Budget> readBudget(const std::string &Path,
                                 config::ConfigError &Error);

/// Parses a growth percentage such as "5%" or "2.5%" into millionths of a
/// percent; on failure returns a message for people.
llvm::Expected<uint64_t> parseGrowthPercent(llvm::StringRef Text);

} // namespace revbound::policy

#endif
