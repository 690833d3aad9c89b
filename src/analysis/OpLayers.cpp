//===- OpLayers.cpp - The layer in which a top-level operation starts ----===//
#include "revbound/analysis/OpLayers.h"
#include "revbound/support/Diagnostics.h"

#include "llvm/ADT/SmallVector.h"

#include <algorithm>

namespace revbound::analysis {

namespace {

// The rules are those of Schedule.cpp's All metric; OpLayersTest checks that
// both give the same depth.
class LayerWalk {
public:
  LayerWalk(const ir::Circuit &C, SummaryCache &Cache)
      : C(C), Cache(Cache), Ready(size_t(C.NumQubits) + C.NumClbits, 0),
        Free(Ready.size(), 0) {}

  /// Schedules op `Index`; its start layer goes to `Start`.
  llvm::Error step(uint32_t Index, uint64_t &Start);
  uint64_t depth() const {
    uint64_t D = 0;
    for (uint64_t R : Ready)
      D = std::max(D, R);
    return D;
  }

private:
  void collectWires(const ir::Op &O);
  llvm::Error leaf(const ir::Op &O, uint64_t &Start);
  llvm::Error call(const ir::Op &O, const GateSummary &S, uint64_t &Start);

  const ir::Circuit &C;
  SummaryCache &Cache;
  // Ready: when a qubit is next usable or a bit's value is known. Free: when
  // a bit may be written again (its readers are done).
  std::vector<uint64_t> Ready, Free;
  llvm::SmallVector<uint32_t, 8>
      Wires; // the op's wires, then its condition bits
};

llvm::Error overflow(const ir::Op &O) {
  return errorAt(O.Loc, "a depth passes 2^64-1 layers; revbound counts "
                        "exactly in 64 bits and will not wrap");
}

void LayerWalk::collectWires(const ir::Op &O) {
  Wires.clear();
  llvm::ArrayRef<uint32_t> W = C.wires(O);
  for (unsigned I = 0; I < W.size(); ++I)
    Wires.push_back(O.Kind == ir::OpKind::Measure && I == 1
                        ? uint32_t(C.NumQubits + W[I])
                        : W[I]);
  if (O.Cond != ir::NoCondition) {
    const ir::Register &R = C.CRegs[C.Conditions[O.Cond].CReg];
    for (uint32_t B = 0; B < R.Size; ++B)
      Wires.push_back(C.NumQubits + R.Offset + B);
  }
}

llvm::Error LayerWalk::leaf(const ir::Op &O, uint64_t &Start) {
  const unsigned N = O.NumWires;
  Start = 0;
  for (unsigned I = 0; I < Wires.size(); ++I) {
    uint32_t W = Wires[I];
    bool Written = I < N && W >= C.NumQubits;
    Start = std::max(Start, Written ? Free[W] : Ready[W]);
  }
  uint64_t End;
  if (__builtin_add_overflow(Start, O.Kind == ir::OpKind::Barrier ? 0 : 1,
                             &End))
    return overflow(O);
  for (unsigned I = 0; I < N; ++I)
    Ready[Wires[I]] = Free[Wires[I]] = End;
  for (unsigned I = N; I < Wires.size(); ++I)
    Free[Wires[I]] = std::max(Free[Wires[I]], End);
  return llvm::Error::success();
}

llvm::Error LayerWalk::call(const ir::Op &O, const GateSummary &S,
                            uint64_t &Start) {
  const unsigned K = O.NumWires;
  const DelayMatrix &D = S.Depth[unsigned(DepthMetric::All)];
  uint64_t CondReady = 0;
  for (unsigned I = K; I < Wires.size(); ++I)
    CondReady = std::max(CondReady, Ready[Wires[I]]);
  llvm::SmallVector<uint64_t, 8> In(K), Out(K);
  for (unsigned I = 0; I < K; ++I)
    In[I] = std::max(Ready[Wires[I]], CondReady);
  uint64_t FirstLeaf = NoPath, Latest = CondReady;
  for (unsigned J = 0; J < K; ++J) {
    uint64_t Best = 0, First = NoPath;
    for (unsigned I = 0; I < K; ++I) {
      uint64_t V;
      if (D.at(I, J) != NoPath) {
        if (__builtin_add_overflow(In[I], D.at(I, J), &V))
          return overflow(O);
        Best = std::max(Best, V);
      }
      if (S.FirstUse.at(I, J) != NoPath) {
        if (__builtin_add_overflow(In[I], S.FirstUse.at(I, J), &V))
          return overflow(O);
        First = First == NoPath ? V : std::max(First, V);
      }
    }
    Out[J] = Best;
    Latest = std::max(Latest, Best);
    FirstLeaf = std::min(FirstLeaf, First);
  }
  Start =
      FirstLeaf != NoPath ? FirstLeaf : *std::max_element(In.begin(), In.end());
  for (unsigned J = 0; J < K; ++J)
    Ready[Wires[J]] = Out[J];
  for (unsigned I = K; I < Wires.size(); ++I)
    Free[Wires[I]] = std::max(Free[Wires[I]], Latest);
  return llvm::Error::success();
}

llvm::Error LayerWalk::step(uint32_t Index, uint64_t &Start) {
  const ir::Op &O = C.Ops[Index];
  Start = 0;
  if (O.NumWires == 0)
    return llvm::Error::success();
  collectWires(O);
  if (O.Kind != ir::OpKind::Gate || Cache.isLeaf(O.Gate))
    return leaf(O, Start);
  llvm::Expected<const GateSummary *> S = Cache.get(O.Gate, C.params(O), O.Loc);
  if (!S)
    return S.takeError();
  return call(O, **S, Start);
}

} // namespace

llvm::Expected<OpLayers> startLayers(const ir::Circuit &C, SummaryCache &Cache,
                                     llvm::ArrayRef<uint32_t> Wanted) {
  OpLayers Out;
  Out.Start.reserve(Wanted.size());
  LayerWalk Walk(C, Cache);
  size_t Next = 0;
  for (uint32_t Index = 0; Index < C.Ops.size(); ++Index) {
    uint64_t Start;
    if (llvm::Error E = Walk.step(Index, Start))
      return std::move(E);
    while (Next < Wanted.size() && Wanted[Next] == Index) {
      Out.Start.push_back(Start);
      ++Next;
    }
  }
  Out.Depth = Walk.depth();
  return Out;
}

} // namespace revbound::analysis
