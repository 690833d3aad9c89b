//===- LeafDag.h - The dependency graph of a circuit's leaves -------------===//
//
// The circuit expanded to leaves (as the summary cache's policy says) as a
// Boost.Graph DAG: a vertex per leaf, measure, reset and barrier, an edge
// from the previous vertex on each wire. Built only up to a size limit;
// larger circuits use the streaming schedule, which gives the same length.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_ANALYSIS_LEAFDAG_H
#define REVBOUND_ANALYSIS_LEAFDAG_H

#include "revbound/analysis/Summary.h"

#include "llvm/ADT/SmallVector.h"

#include <cstdint>
#include <memory>
#include <optional>
#include <vector>

namespace revbound::analysis {

/// One vertex: a leaf (or measure, reset, barrier) and where it came from.
struct LeafNode {
  uint32_t TopOp = 0;        // the top-level op it expands from
  ir::OpKind Kind = ir::OpKind::Gate;
  ir::GateId Gate = 0;       // for Kind::Gate
  llvm::SmallVector<uint32_t, 3> Wires; // qubits, then NumQubits + bit
  llvm::SMLoc BodyLoc;       // innermost gate-body statement, if expanded
};

class LeafDag {
public:
  /// Expands `C`; returns std::nullopt when it has more than `MaxNodes`
  /// vertices.
  static llvm::Expected<std::optional<LeafDag>>
  build(const ir::Circuit &C, SummaryCache &Cache, uint64_t MaxNodes);

  LeafDag(LeafDag &&);
  LeafDag &operator=(LeafDag &&);
  ~LeafDag();

  size_t size() const { return Nodes.size(); }
  const LeafNode &node(size_t I) const { return Nodes[I]; }
  /// Length in layers of the longest path (barriers weigh 0), and its
  /// vertices in order.
  uint64_t longestPath(std::vector<uint32_t> &Path) const;

private:
  struct Graph;
  LeafDag();
  std::vector<LeafNode> Nodes;
  std::unique_ptr<Graph> G;
};

} // namespace revbound::analysis

#endif
