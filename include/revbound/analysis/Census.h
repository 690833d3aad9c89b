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
};

/// Counts the operations of `C`, leaves as `Cache`'s policy says.
llvm::Expected<Census> takeCensus(const ir::Circuit &C, SummaryCache &Cache);

} // namespace revbound::analysis

#endif
