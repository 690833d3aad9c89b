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
};

/// Schedules `C`. Fails only when a depth passes 2^64 - 1.
llvm::Expected<Schedule> scheduleCircuit(const ir::Circuit &C,
                                         SummaryCache &Cache);

} // namespace revbound::analysis

#endif
