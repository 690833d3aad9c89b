//===- Writers.h - Turning a Report into text for people or programs -----===//
//
// Writers only format: every number they print is in the Report. Output is
// deterministic (same Report, same bytes).
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_REPORT_WRITERS_H
#define REVBOUND_REPORT_WRITERS_H

#include "revbound/report/Report.h"

#include <string>

namespace revbound::report {

/// A human summary, one block per circuit.
std::string writeText(const Report &R);

/// One JSON object `{"schema": "revbound/report-1", "circuits": [...]}` as
/// documented in docs/json.md; counts are JSON integers, exact past 2^53.
std::string writeJson(const Report &R);

/// One circuit as one line of JSON Lines (`--format jsonl`): the object
/// writeJson puts in "circuits", with the "schema" member first, compact,
/// ending in '\n'. A batch is written line by line as results come.
std::string writeJsonLine(const CircuitReport &C);

} // namespace revbound::report

#endif
