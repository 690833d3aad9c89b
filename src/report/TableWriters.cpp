//===- TableWriters.cpp - A report as a spreadsheet or a Markdown table ---===//
#include "revbound/report/TableWriters.h"

#include "TableFormat.h"

#include "revbound/report/MetricTable.h"

namespace revbound::report {

std::string writeCsv(const Report &R) {
  std::vector<MetricRow> Rows = metricTable(R);
  std::vector<std::string> Header = {"file"};
  for (const MetricRow &Row : Rows)
    Header.push_back(Row.Key);
  std::string Out = table::csvLine(Header);
  for (size_t C = 0; C < R.Circuits.size(); ++C) {
    std::vector<std::string> Fields = {R.Circuits[C].File};
    for (const MetricRow &Row : Rows)
      Fields.push_back(showMetric(Row.Values[C]));
    Out += table::csvLine(Fields);
  }
  return Out;
}

std::string writeMarkdown(const Report &R) {
  std::vector<MetricRow> Rows = metricTable(R);
  std::vector<std::string> Header = {"metric", "unit"};
  for (const CircuitReport &C : R.Circuits)
    Header.push_back(C.File);
  std::string Out = table::markdownRow(Header);
  Out += table::markdownRule(Header.size(), 2);
  for (const MetricRow &Row : Rows) {
    std::vector<std::string> Cells = {Row.Label, Row.Unit};
    for (const std::optional<MetricValue> &V : Row.Values)
      Cells.push_back(V ? showMetric(V) : "n/a");
    Out += table::markdownRow(Cells);
  }
  return Out;
}

} // namespace revbound::report
