//===- Census.cpp - Operation counts of a circuit -------------------------===//
#include "revbound/analysis/Census.h"
#include "revbound/support/Checked.h"
#include "revbound/support/Diagnostics.h"

#include <algorithm>

namespace revbound::analysis {

static llvm::Error tooMany(llvm::SMLoc Loc) {
  return errorAt(Loc, "a count passes 2^64-1; revbound counts exactly in 64 "
                      "bits and will not wrap");
}

/// Folds counts by gate id into counts by name; two definitions can share a
/// name when a file replaces a library gate that other library gates call.
static llvm::Expected<NamedCounts> byName(const ir::Circuit &C,
                                          const std::vector<uint64_t> &ById) {
  NamedCounts Out;
  for (size_t G = 0; G < ById.size(); ++G)
    if (ById[G])
      Out.push_back({C.Gates[G].Name, ById[G]});
  std::sort(Out.begin(), Out.end());
  NamedCounts Merged;
  for (auto &Entry : Out) {
    if (!Merged.empty() && Merged.back().first == Entry.first) {
      if (!addChecked(Merged.back().second, Entry.second))
        return tooMany(llvm::SMLoc());
      continue;
    }
    Merged.push_back(std::move(Entry));
  }
  return Merged;
}

llvm::Expected<Census> takeCensus(const ir::Circuit &C, SummaryCache &Cache) {
  Census Out;
  std::vector<uint64_t> Written(C.Gates.size(), 0), Leaves(C.Gates.size(), 0);
  // Primitive counts per gate are memoised; summing them per op is one add.
  for (const ir::Op &O : C.Ops) {
    if (O.Cond != ir::NoCondition)
      ++Out.Conditional;
    switch (O.Kind) {
    case ir::OpKind::Measure:
      ++Out.Measure;
      continue;
    case ir::OpKind::Reset:
      ++Out.Reset;
      continue;
    case ir::OpKind::Barrier:
      ++Out.Barrier;
      continue;
    case ir::OpKind::Gate:
      break;
    }
    ++Written[O.Gate];
    llvm::Expected<PrimitiveCounts> P = Cache.primitive(O.Gate, O.Loc);
    if (!P)
      return P.takeError();
    if (!addChecked(Out.PrimitiveU, P->U) || !addChecked(Out.PrimitiveCX, P->CX) ||
        !addChecked(Out.PrimitiveOpaque, P->Opaque))
      return tooMany(O.Loc);
    if (Cache.isLeaf(O.Gate)) {
      // Checked too: expanded calls before this op may have filled a count.
      bool IsT = Cache.isT(O.Gate, C.params(O));
      if (!addChecked(Leaves[O.Gate], 1) || !addChecked(Out.Gates, 1) ||
          !addChecked(Out.TwoQubit, O.NumWires >= 2) ||
          !addChecked(Out.TCount, IsT))
        return tooMany(O.Loc);
      continue;
    }
    llvm::Expected<const GateSummary *> S =
        Cache.get(O.Gate, C.params(O), O.Loc);
    if (!S)
      return S.takeError();
    bool Ok = addChecked(Out.Gates, (*S)->Gates) &&
              addChecked(Out.TwoQubit, (*S)->MultiQubit) &&
              addChecked(Out.TCount, (*S)->TCount);
    for (const auto &[Leaf, N] : (*S)->LeafCounts)
      Ok = Ok && addChecked(Leaves[Leaf], N);
    if (!Ok)
      return tooMany(O.Loc);
  }
  llvm::Expected<NamedCounts> AsWritten = byName(C, Written);
  if (!AsWritten)
    return AsWritten.takeError();
  llvm::Expected<NamedCounts> ByName = byName(C, Leaves);
  if (!ByName)
    return ByName.takeError();
  Out.AsWritten = std::move(*AsWritten);
  Out.ByName = std::move(*ByName);
  return Out;
}

} // namespace revbound::analysis
