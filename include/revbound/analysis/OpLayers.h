//===- OpLayers.h - The layer in which a top-level operation starts ------===//
//
// The erasure timeline needs to know where in depth each reset and
// measurement happens. This is the `depth.all` schedule of Schedule.h
// (leaves, measures and resets one layer, barriers align without a layer, an
// `if` waits for its bits, a measurement into a bit waits for the bit's
// earlier readers, calls through their summaries' delay matrices), walked
// once for the All metric only and keeping the start layer of the operations
// asked for. Layers are exact 64-bit integers, counted from 0.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_ANALYSIS_OPLAYERS_H
#define REVBOUND_ANALYSIS_OPLAYERS_H

#include "revbound/analysis/Summary.h"

#include <cstdint>
#include <vector>

namespace revbound::analysis {

struct OpLayers {
  /// Start[i]: the ASAP layer in which op Wanted[i] starts: for a leaf,
  /// measure or reset its one layer; for a barrier the layer its wires are
  /// aligned to; for a call of a non-leaf gate the first layer in which one
  /// of its leaves runs (the latest ready wire for a call with no leaves).
  std::vector<uint64_t> Start;
  /// Layers of the whole schedule, equal to Schedule::Depth[All].
  uint64_t Depth = 0;
};

/// Start layers of the top-level ops `Wanted` (indices into C.Ops, in
/// ascending order). Fails, at the op, only when a layer passes 2^64 - 1,
/// or when a summary cannot be computed (as scheduleCircuit does).
llvm::Expected<OpLayers> startLayers(const ir::Circuit &C, SummaryCache &Cache,
                                     llvm::ArrayRef<uint32_t> Wanted);

} // namespace revbound::analysis

#endif
