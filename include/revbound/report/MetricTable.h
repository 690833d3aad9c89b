//===- MetricTable.h - A report's figures as rows of one table ------------===//
//
// The figures `report --format csv|markdown` and `compare` print, one row
// per metric and one column per circuit. Keys match the budget metrics of
// `revbound check` where both have one (docs/check.md); every metric is
// better when lower. Deltas and the best column are computed here so that
// the writers only format.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_REPORT_METRICTABLE_H
#define REVBOUND_REPORT_METRICTABLE_H

#include "revbound/report/Report.h"

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace revbound::report {

/// A figure: an exact count, or a real.
struct MetricValue {
  bool IsCount = true;
  uint64_t Count = 0;
  double Real = 0;
};

/// A column's difference from the first column.
struct MetricDelta {
  bool IsCount = true;
  bool Negative = false;
  uint64_t CountMagnitude = 0; // |delta| of counts, exact
  double Real = 0;             // delta of reals
  std::optional<double> Percent; // none when the reference is zero
};

struct MetricRow {
  std::string Key;   // "depth", "t_count", "heat_J", ...
  std::string Label; // for people
  std::string Unit;  // "" for plain counts
  std::vector<std::optional<MetricValue>> Values; // per circuit
  std::vector<std::optional<MetricDelta>> Deltas; // per circuit; [0] none
  /// Per circuit: holds the least value of the row (none marked when every
  /// present value is equal).
  std::vector<bool> Best;
};

/// Every metric of every circuit of `R`, in a fixed order.
std::vector<MetricRow> metricTable(const Report &R);

/// A value as printed everywhere: counts in full, reals to six significant
/// digits; "" when absent.
std::string showMetric(const std::optional<MetricValue> &V);
/// "+3", "-1.5e-21", with the percentage when there is one: "+3 (+12.5%)".
std::string showDelta(const std::optional<MetricDelta> &D, bool WithPercent);

} // namespace revbound::report

#endif
