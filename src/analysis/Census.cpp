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
  uint64_t LeafT = 0; // T applications among top-level leaves
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
    if (Cache.isLeaf(O.Gate)) {
      // Leaf applications are added per gate after the loop; only the
      // T test depends on the op's own angles.
      if (Cache.isT(O.Gate, C.params(O)))
        ++LeafT;
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
  // Per gate: its applications times its expansion (one multiply per gate,
  // not one lookup per op). The location of an overflow is the gate's.
  bool Ok = addChecked(Out.TCount, LeafT);
  for (ir::GateId G = 0; G < Written.size() && Ok; ++G) {
    uint64_t N = Written[G];
    if (N == 0)
      continue;
    llvm::Expected<PrimitiveCounts> P = Cache.primitive(G, C.gate(G).Loc);
    if (!P)
      return P.takeError();
    uint64_t U, CX, Opaque;
    Ok = !__builtin_mul_overflow(N, P->U, &U) &&
         !__builtin_mul_overflow(N, P->CX, &CX) &&
         !__builtin_mul_overflow(N, P->Opaque, &Opaque) &&
         addChecked(Out.PrimitiveU, U) && addChecked(Out.PrimitiveCX, CX) &&
         addChecked(Out.PrimitiveOpaque, Opaque);
    if (Ok && Cache.isLeaf(G))
      Ok = addChecked(Leaves[G], N) && addChecked(Out.Gates, N) &&
           (C.gate(G).numQubits() < 2 || addChecked(Out.TwoQubit, N));
  }
  if (!Ok)
    return tooMany(C.Ops.empty() ? llvm::SMLoc() : C.Ops.back().Loc);
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
