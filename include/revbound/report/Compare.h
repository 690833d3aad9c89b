//===- Compare.h - Several circuits of one function side by side ----------===//
//
// `revbound compare`: the first file is the reference; every metric of
// every file in one table, with deltas from the reference and the best
// value marked, and, with --equivalence, the verdict on each candidate
// against the reference (docs/compare.md). Writers only format.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_REPORT_COMPARE_H
#define REVBOUND_REPORT_COMPARE_H

#include "revbound/report/MetricTable.h"
#include "revbound/report/Report.h"
#include "revbound/semantics/Equivalence.h"

#include <string>
#include <vector>

namespace revbound::report {

inline constexpr const char *CompareSchemaVersion = "revbound/compare-1";

/// The verdict on one candidate (a file after the first).
struct EquivalenceEntry {
  std::string Candidate;
  semantics::EquivalenceResult Result;
};

struct CompareReport {
  Report Circuits; // the reference first
  std::vector<MetricRow> Rows;
  bool EquivalenceChecked = false;
  std::vector<EquivalenceEntry> Equivalence;
};

/// A table for people: the verdicts, then one row per metric.
std::string writeCompareText(const CompareReport &R);
/// The same as a Markdown table (a pull-request comment).
std::string writeCompareMarkdown(const CompareReport &R);
/// One line per metric and file: metric,unit,file,value,delta,
/// delta_percent,best (RFC 4180).
std::string writeCompareCsv(const CompareReport &R);
/// `{"schema": "revbound/compare-1", ...}` as in docs/compare.md.
std::string writeCompareJson(const CompareReport &R);

} // namespace revbound::report

#endif
