//===- LeafPolicy.h - Which gates an analysis treats as leaves ------------===//
//
// DESIGN.md, "Levels of a circuit": at native granularity the leaves are the
// standard library's gates, opaque gates, U, CX and any user gate named with
// --native; at primitive granularity everything expands to U and CX (opaque
// gates cannot expand and stay leaves). Library users may pass their own
// predicate instead, e.g. to reproduce a published counting convention.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_ANALYSIS_LEAFPOLICY_H
#define REVBOUND_ANALYSIS_LEAFPOLICY_H

#include "revbound/ir/Circuit.h"

#include "llvm/ADT/StringSet.h"

#include <functional>

namespace revbound::analysis {

enum class Granularity { Native, Primitive };

/// "native" or "primitive".
const char *granularityName(Granularity G);

struct LeafPolicy {
  Granularity Level = Granularity::Native;
  llvm::StringSet<> NativeNames; // user gates kept whole at native level
  /// When set, decides alone for gates with a body (U, CX and opaque gates
  /// are always leaves).
  std::function<bool(const ir::GateDef &)> Custom;

  bool isLeaf(const ir::GateDef &G) const;
};

} // namespace revbound::analysis

#endif
