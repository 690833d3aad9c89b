//===- Census.h - Operation counts of a circuit ---------------------------===//
#ifndef REVBOUND_ANALYSIS_CENSUS_H
#define REVBOUND_ANALYSIS_CENSUS_H

#include "revbound/analysis/Summary.h"

#include <string>
#include <utility>
#include <vector>

namespace revbound::analysis {

using NamedCounts = std::vector<std::pair<std::string, uint64_t>>; // by name

/// Counts as DESIGN.md's JSON contract names them. Every count is exact; a
/// count past 2^64 - 1 is an error, never a wrapped number.
struct Census {
  NamedCounts AsWritten;   // top-level gate applications after broadcasting
  NamedCounts ByName;      // leaf applications, expanded through definitions
  uint64_t PrimitiveU = 0; // full expansion to the built-ins
  uint64_t PrimitiveCX = 0;
  uint64_t PrimitiveOpaque = 0; // opaque applications, which cannot expand
  uint64_t Gates = 0;      // unitary leaf applications (opaque ones included)
  uint64_t Measure = 0;
  uint64_t Reset = 0;
  uint64_t Barrier = 0;    // top-level barrier statements
  uint64_t TCount = 0;
  uint64_t TwoQubit = 0;   // leaf applications on two or more qubits
  uint64_t Conditional = 0; // top-level operations under `if`

  bool operator==(const Census &) const = default;
};

/// A census built one top-level op at a time, so that a walk that reads
/// every op anyway (scheduleCircuit's) can take it on the way instead of a
/// pass of its own over the ops. Each op goes to exactly one add function.
class CensusTally {
public:
  explicit CensusTally(const ir::Circuit &C)
      : C(C), Written(C.Gates.size()), Leaves(C.Gates.size()) {}

  /// A call of a leaf gate; `IsT` as SummaryCache::isT says.
  void addLeaf(const ir::Op &O, bool IsT) {
    Conditional += O.Cond != ir::NoCondition;
    ++Written[O.Gate];
    LeafT += IsT;
  }
  /// A call of a non-leaf gate, with its summary.
  llvm::Error addCall(const ir::Op &O, const GateSummary &S);
  /// A measure, reset or barrier.
  void addOther(const ir::Op &O);

  /// The census of the ops added, leaves as `Cache`'s policy says.
  llvm::Expected<Census> finish(SummaryCache &Cache);

private:
  const ir::Circuit &C;
  Census Out;
  // Leaf applications are added per gate at the end (one multiply per
  // gate, not one lookup per op); only the T test needs the op itself.
  std::vector<uint64_t> Written; // top-level calls per gate
  std::vector<uint64_t> Leaves;  // leaf applications inside calls, per gate
  uint64_t Conditional = 0;
  uint64_t LeafT = 0; // T applications among top-level leaves
};

/// Counts the operations of `C`, leaves as `Cache`'s policy says.
llvm::Expected<Census> takeCensus(const ir::Circuit &C, SummaryCache &Cache);

} // namespace revbound::analysis

#endif
