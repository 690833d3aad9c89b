//===- Schedule.h - Depths, spacetime volume and the critical path -------===//
//
// An as-soon-as-possible schedule of the top level in one streaming pass:
// leaves take one layer (measure and reset too), barriers align the wires
// they name without adding a layer, an `if` makes its op wait for the bits
// of its register, and calls of non-leaf gates go through their summaries.
// Wires are the qubits, then the classical bits.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_ANALYSIS_SCHEDULE_H
#define REVBOUND_ANALYSIS_SCHEDULE_H

#include "revbound/analysis/Census.h"
#include "revbound/analysis/Summary.h"

#include <cstdint>
#include <vector>

namespace revbound::analysis {

struct Schedule {
  uint64_t Depth[NumDepthMetrics] = {0, 0, 0};
  /// Sum over qubits of the layers from the start of their first use to the
  /// end of their last use (docs/metrics.md); unused qubits add nothing.
  uint64_t Volume = 0;
  /// Top-level ops on one longest path (All metric), first to last; ties go
  /// to the lowest wire, then the earliest op.
  std::vector<uint32_t> CriticalOps;

  bool operator==(const Schedule &) const = default;
};

/// Schedules `C`. Fails only when a depth passes 2^64 - 1, or, with
/// `Tally`, where the census fails first.
///
/// With `Tally`, every top-level op also goes to it as the walk reads it:
/// a report needs both, and on a large file reading the ops once instead
/// of twice saves a sixth of the analysis (about 6 ms per million ops).
/// After a depth error the tally is incomplete.
llvm::Expected<Schedule> scheduleCircuit(const ir::Circuit &C,
                                         SummaryCache &Cache,
                                         CensusTally *Tally = nullptr);

} // namespace revbound::analysis

#endif
