//===- Summary.h - Memoised per-definition summaries ---------------------===//
//
// A gate definition is analysed once (once per set of parameter values when
// its T gates depend on them) into counts and max-plus delay matrices. A call
// then costs one max-plus product: ready'[j] = max_i(ready[i] + D[i][j]).
// That is how a file whose nested definitions expand to 2^60 operations is
// counted and scheduled exactly in microseconds.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_ANALYSIS_SUMMARY_H
#define REVBOUND_ANALYSIS_SUMMARY_H

#include "revbound/analysis/LeafPolicy.h"
#include "revbound/analysis/MaxPlus.h"
#include "revbound/ir/Circuit.h"
#include "revbound/ir/Unitary.h"

#include "llvm/ADT/ArrayRef.h"
#include "llvm/ADT/SmallVector.h"
#include "llvm/Support/Error.h"

#include <cstdint>
#include <memory>
#include <string>
#include <unordered_map>
#include <utility>
#include <vector>

namespace revbound::analysis {

/// The three depths DESIGN.md asks for: every leaf one layer; only leaves on
/// two or more qubits; only T and T-dagger leaves. Ops of weight 0 still
/// order the wires they touch.
enum class DepthMetric : unsigned { All = 0, TwoQubit = 1, T = 2 };
inline constexpr unsigned NumDepthMetrics = 3;

/// Longest path in layers through a gate, input wire i to output wire j.
using DelayMatrix = MaxPlusMatrix<uint64_t>;
inline constexpr uint64_t NoPath = MaxPlusTraits<uint64_t>::none();

/// What one call of a gate contributes, expanded down to leaves.
struct GateSummary {
  /// Leaf applications by gate, sorted by id.
  llvm::SmallVector<std::pair<ir::GateId, uint64_t>, 4> LeafCounts;
  uint64_t Gates = 0;      // unitary leaf applications
  uint64_t MultiQubit = 0; // leaf applications on two or more qubits
  uint64_t TCount = 0;
  DelayMatrix Depth[NumDepthMetrics];
  /// For the All metric: the longest path from input i to the start of the
  /// first leaf on wire j (NoPath if no leaf touches j). Gives the layer in
  /// which a call first uses each wire, for the spacetime volume.
  DelayMatrix FirstUse;
  /// Likewise to the end of the last leaf on wire j: a barrier after the last
  /// use moves a wire's ready time but not its last use.
  DelayMatrix LastUse;
};

/// Full expansion of a gate to the built-ins (opaque gates cannot expand).
struct PrimitiveCounts {
  uint64_t U = 0;
  uint64_t CX = 0;
  uint64_t Opaque = 0;
};

/// True for a one-qubit leaf whose unitary is T or T-dagger up to global
/// phase: t and tdg of the library, and angle gates (rz, u1, p, U, u3, u with
/// theta = 0) at +-pi/4 modulo 2 pi, within 1e-9.
bool isTLeaf(const ir::GateDef &G, llvm::ArrayRef<double> Params);
/// isTLeaf's angle rule without the name checks: for rz, u1 and p
/// (`ThreeAngles` false) or for U, u3 and u.
bool isTByAngle(bool ThreeAngles, llvm::ArrayRef<double> Params);

/// Computes and memoises the summaries of one circuit under one policy.
class SummaryCache {
public:
  SummaryCache(const ir::Circuit &C, const LeafPolicy &Policy);
  ~SummaryCache();

  bool isLeaf(ir::GateId G) const { return LeafFlags[G]; }

  /// True when leaf `G` with `Params` is T or T-dagger up to global phase:
  /// by the angle rule for the library's angle gates (exact for them, and
  /// fast), by comparing unitaries for every other one-qubit leaf.
  bool isT(ir::GateId G, llvm::ArrayRef<double> Params) {
    switch (TKinds[G]) {
    case TKind::Never:
      return false;
    case TKind::Always:
      return true;
    case TKind::ByAngle:
      return isTByAngle(false, Params);
    case TKind::ByThreeAngles:
      return isTByAngle(true, Params);
    case TKind::ByUnitary:
      return unitaryIsT(G, Params);
    }
    return false;
  }

  /// The summary of non-leaf gate `G` called with `Params`. The pointer stays
  /// valid until the next call. A count past 2^64 - 1 is an error at `Loc`.
  llvm::Expected<const GateSummary *> get(ir::GateId G,
                                          llvm::ArrayRef<double> Params,
                                          llvm::SMLoc Loc);

  /// U/CX counts of the full expansion of `G` (a leaf counts as itself).
  llvm::Expected<PrimitiveCounts> primitive(ir::GateId G, llvm::SMLoc Loc);

private:
  llvm::Expected<std::unique_ptr<GateSummary>> compute(ir::GateId G,
                                                       llvm::ArrayRef<double> Params,
                                                       llvm::SMLoc Loc);
  bool dependsOnParams(ir::GateId G);

  const ir::Circuit &C;
  const LeafPolicy &Policy;
  std::vector<uint8_t> LeafFlags; // a byte each: read once per op
  enum class TKind : uint8_t { Never, Always, ByAngle, ByThreeAngles, ByUnitary };
  std::vector<TKind> TKinds;
  bool unitaryIsT(ir::GateId G, llvm::ArrayRef<double> Params);
  bool angleRuleHolds(ir::GateId G);
  std::unique_ptr<ir::UnitaryCache> Unitaries;
  std::vector<int8_t> ParamSensitive; // -1 unknown, 0 no, 1 yes
  std::vector<std::unique_ptr<GateSummary>> ById;
  std::unordered_map<std::string, std::unique_ptr<GateSummary>> ByParams;
  std::vector<std::unique_ptr<PrimitiveCounts>> Primitive;
  unsigned Depth = 0;
  uint64_t MatrixEntries = 0; // summaries' memory, bounded by MaxMatrixEntries

public:
  /// Bound on the delay-matrix entries all summaries may hold (8 bytes each);
  /// past it, summarising is an error rather than an allocation failure.
  static constexpr uint64_t MaxMatrixEntries = uint64_t(1) << 27;
};

} // namespace revbound::analysis

#endif
