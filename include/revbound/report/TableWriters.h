//===- TableWriters.h - A report as a spreadsheet or a Markdown table -----===//
//
// `report --format csv|markdown`: the metrics of report/MetricTable.h, the
// same figures `compare` prints, for one or several circuits.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_REPORT_TABLEWRITERS_H
#define REVBOUND_REPORT_TABLEWRITERS_H

#include "revbound/report/Report.h"

#include <string>

namespace revbound::report {

/// A header line `file,<metric keys>`, then one line per circuit (RFC 4180;
/// absent figures are empty fields).
std::string writeCsv(const Report &R);

/// One row per metric, one column per circuit.
std::string writeMarkdown(const Report &R);

} // namespace revbound::report

#endif
