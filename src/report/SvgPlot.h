//===- SvgPlot.h - Markup helpers and the two SVG plots of the HTML page --===//
//
// Internal to the HTML writer. The plots place report numbers on fixed
// frames; the frame and the axis range of each plot are written on its <svg>
// as data-* attributes and each mark carries the exact report value it
// stands for, so that a reader (or a test) can map any mark back.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_REPORT_SVGPLOT_H
#define REVBOUND_REPORT_SVGPLOT_H

#include "revbound/report/Report.h"

#include <string>
#include <string_view>

namespace revbound::report::markup {

/// A double for people: 4 significant digits ("3.425e-34", "0.5").
std::string figure(double V);
/// A double in the shortest form that reads back to the same double.
std::string exact(double V);

/// The erasure timeline: one row per wire that has events, a mark per
/// event at its layer, coloured by the bits it erases. Draws at most
/// `MaxWires` rows and `MaxMarks` marks (and says so). Empty string when
/// the circuit has no events.
std::string erasureTimeline(const CircuitReport &C, unsigned MaxWires,
                            unsigned MaxMarks);

/// The colour legend of the timeline, as HTML.
std::string timelineLegend();

/// Least time against energy on log-log axes: the frontier of both models,
/// the times at the given energies and target, and the device's schedule.
/// Empty string when no step takes time (the action is 0).
std::string energyFrontier(const CircuitReport &C);

/// The legend of the frontier plot, as HTML.
std::string frontierLegend(const CircuitReport &C);

} // namespace revbound::report::markup

#endif
