//===- HtmlWriter.h - The report as one self-contained HTML page ---------===//
//
// One page for one or several circuits: the summary table, an erasure
// timeline per wire, the energy-time frontier of both energy models, the
// critical path and the erasure hotspots (docs/html.md). The page needs
// nothing else: CSS and SVG are inline, there is no script and no link out.
// It is XHTML-compatible markup, so a strict XML parser reads it. Like every
// writer it only formats: each number it shows or plots is in the Report.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_REPORT_HTMLWRITER_H
#define REVBOUND_REPORT_HTMLWRITER_H

#include "revbound/report/Report.h"

#include <string>

namespace revbound::report {

/// The page, UTF-8, deterministic (same Report, same bytes). Text from files
/// (names, paths, messages) is escaped; bytes that are not UTF-8 and control
/// characters XML forbids become U+FFFD.
std::string writeHtml(const Report &R);

} // namespace revbound::report

#endif
