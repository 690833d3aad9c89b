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

llvm::Error CensusTally::addCall(const ir::Op &O, const GateSummary &S) {
  Conditional += O.Cond != ir::NoCondition;
  ++Written[O.Gate];
  bool Ok = addChecked(Out.Gates, S.Gates) &&
            addChecked(Out.TwoQubit, S.MultiQubit) &&
            addChecked(Out.TCount, S.TCount);
  for (const auto &[Leaf, N] : S.LeafCounts)
    Ok = Ok && addChecked(Leaves[Leaf], N);
  return Ok ? llvm::Error::success() : tooMany(O.Loc);
}

void CensusTally::addOther(const ir::Op &O) {
  Conditional += O.Cond != ir::NoCondition;
  switch (O.Kind) {
  case ir::OpKind::Measure:
    ++Out.Measure;
    break;
  case ir::OpKind::Reset:
    ++Out.Reset;
    break;
  case ir::OpKind::Barrier:
    ++Out.Barrier;
    break;
  case ir::OpKind::Gate:
    break; // addLeaf's or addCall's
  }
}

llvm::Expected<Census> CensusTally::finish(SummaryCache &Cache) {
  Out.Conditional = Conditional;
  // Per gate: its applications times its expansion. The location of an
  // overflow is the gate's.
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
  return std::move(Out);
}

llvm::Expected<Census> takeCensus(const ir::Circuit &C, SummaryCache &Cache) {
  CensusTally Tally(C);
  for (const ir::Op &O : C.Ops) {
    if (O.Kind != ir::OpKind::Gate) {
      Tally.addOther(O);
      continue;
    }
    if (Cache.isLeaf(O.Gate)) {
      Tally.addLeaf(O, Cache.isT(O.Gate, C.params(O)));
      continue;
    }
    llvm::Expected<const GateSummary *> S =
        Cache.get(O.Gate, C.params(O), O.Loc);
    if (!S)
      return S.takeError();
    if (llvm::Error E = Tally.addCall(O, **S))
      return E;
  }
  return Tally.finish(Cache);
}

} // namespace revbound::analysis
