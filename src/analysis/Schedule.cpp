//===- Schedule.cpp - Depths, spacetime volume and the critical path -----===//
#include "revbound/analysis/Schedule.h"
#include "revbound/support/Checked.h"
#include "revbound/support/Diagnostics.h"

#include "llvm/ADT/SmallVector.h"

#include <algorithm>
#include <memory>

namespace revbound::analysis {

namespace {

constexpr uint32_t NoOp = UINT32_MAX;
// Ops are numbered below ir::MaxPoolEntries, so this is no op's number.
constexpr uint32_t CallSteps = UINT32_MAX - 1;
// How far below the current op finish() prefetches: 64 path steps, eight
// 64-byte lines.
constexpr uint32_t PrefetchAhead = 64;
static_assert(ir::MaxPoolEntries <= CallSteps);

class Scheduler {
public:
  Scheduler(const ir::Circuit &C, SummaryCache &Cache, CensusTally *Tally)
      : C(C), Cache(Cache), Tally(Tally),
        NumWires(size_t(C.NumQubits) + C.NumClbits),
        FirstUse(C.NumQubits, NoPath), LastUse(C.NumQubits, 0),
        LastOp(NumWires, NoOp), LastFree(NumWires, NoOp), LastSlot(NumWires, 0),
        LastFreeSlot(NumWires, 0),
        StepInto(std::make_unique_for_overwrite<PathStep[]>(C.Ops.size())) {
    for (auto &R : Ready)
      R.assign(NumWires, 0);
    for (auto &F : Free)
      F.assign(NumWires, 0);
  }

  llvm::Error run();
  llvm::Expected<Schedule> finish();

private:
  void collectWires(const ir::Op &O);
  llvm::Error applyCall(uint32_t Index, const ir::Op &O,
                        const GateSummary &S);
  llvm::Error applyLeaf(uint32_t Index, const ir::Op &O, bool IsT,
                        bool UsesQubits);
  llvm::Error applyPlainGate(uint32_t Index, const ir::Op &O, bool IsT);
  void markUse(uint32_t Wire, uint64_t Start, uint64_t End) {
    if (Wire >= C.NumQubits)
      return;
    if (FirstUse[Wire] == NoPath)
      FirstUse[Wire] = Start;
    LastUse[Wire] = End;
  }

  bool isBit(uint32_t Wire) const { return Wire >= C.NumQubits; }

  const ir::Circuit &C;
  SummaryCache &Cache;
  CensusTally *Tally;
  size_t NumWires;
  // Per wire and metric: when a qubit is next usable, when a bit's value is
  // available (its last measurement's end). Reading bits (conditions) does
  // not order readers among themselves; a measurement into a bit waits until
  // every earlier reader is done: Free is that time.
  std::vector<uint64_t> Ready[NumDepthMetrics];
  std::vector<uint64_t> Free[NumDepthMetrics];
  std::vector<uint64_t> FirstUse, LastUse; // per qubit, for the volume
  std::vector<uint32_t> LastOp;    // op that last advanced each wire (writer)
  std::vector<uint32_t> LastFree;  // op that last pushed a bit's Free time
  // The wire slots (indices into C.Wires) through which a path continues
  // into LastOp and LastFree: the op's own slot for the wire, or its first
  // slot where the wire is only a condition it read.
  std::vector<uint32_t> LastSlot, LastFreeSlot;
  // A step of a longest path, back from an op: the op before it and that
  // op's wire slot (index into C.Wires) the path came in through.
  struct PathStep {
    uint32_t Op;   // or NoOp
    uint32_t Slot;
  };
  // Per op, where a longest path into it comes from. A leaf, measure,
  // reset or barrier ends all its wires at once, so one step serves every
  // slot; a call's slots each have their own, kept in SlotSteps, and its
  // entry here is {CallSteps, index of its first slot's step there}. Every
  // op with wires writes its entry before finish() reads any, so the array
  // starts unfilled: for a flat file it is the largest one here (one entry
  // per op, not per slot, halves the pages it takes).
  std::unique_ptr<PathStep[]> StepInto;
  std::vector<PathStep> SlotSteps;
  bool SawBarrier = false; // else finish() need not read the ops' kinds
  llvm::SmallVector<uint32_t, 8> Wires; // the op's wires, then its condition bits
};

void Scheduler::collectWires(const ir::Op &O) {
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

static llvm::Error depthOverflow(const ir::Op &O) {
  return errorAt(O.Loc, "a depth passes 2^64-1 layers; revbound counts "
                        "exactly in 64 bits and will not wrap");
}

// A leaf, measure, reset or barrier: it starts when its wires are ready, a
// written bit is free and its condition bits hold their value, and all its
// own wires end `weight` layers later.
llvm::Error Scheduler::applyLeaf(uint32_t Index, const ir::Op &O, bool IsT,
                                 bool UsesQubits) {
  bool IsGate = O.Kind == ir::OpKind::Gate;
  bool IsBarrier = O.Kind == ir::OpKind::Barrier;
  uint64_t Weight[NumDepthMetrics] = {
      IsBarrier ? 0u : 1u, IsGate && O.NumWires >= 2 ? 1u : 0u, IsT ? 1u : 0u};
  const unsigned N = O.NumWires;
  for (unsigned M = 0; M < NumDepthMetrics; ++M) {
    std::vector<uint64_t> &R = Ready[M], &F = Free[M];
    bool All = M == unsigned(DepthMetric::All);
    uint64_t Start = 0, End;
    uint32_t CritSlot = LastSlot[Wires[0]], CritOp = NoOp;
    for (unsigned I = 0; I < Wires.size(); ++I) {
      uint32_t W = Wires[I];
      bool Written = I < N && isBit(W);
      uint64_t T = Written ? F[W] : R[W];
      if (T > Start) {
        Start = T;
        CritSlot = Written ? LastFreeSlot[W] : LastSlot[W];
        CritOp = Written ? LastFree[W] : LastOp[W];
      }
    }
    if (__builtin_add_overflow(Start, Weight[M], &End))
      return depthOverflow(O);
    if (All) {
      StepInto[Index] = {CritOp, CritSlot};
      if (UsesQubits)
        for (unsigned I = 0; I < N; ++I)
          markUse(Wires[I], Start, End);
    }
    for (unsigned I = 0; I < N; ++I) {
      R[Wires[I]] = End;
      F[Wires[I]] = End;
    }
    for (unsigned I = N; I < Wires.size(); ++I)
      if (End >= F[Wires[I]]) {
        F[Wires[I]] = End;
        if (All) {
          LastFree[Wires[I]] = Index;
          LastFreeSlot[Wires[I]] = O.FirstWire;
        }
      }
  }
  for (unsigned I = 0; I < N; ++I) {
    LastOp[Wires[I]] = LastFree[Wires[I]] = Index;
    LastSlot[Wires[I]] = LastFreeSlot[Wires[I]] = O.FirstWire + I;
  }
  return llvm::Error::success();
}

// The common case, an unconditional leaf gate on qubits only: applyLeaf's
// rule in one pass over the wires for all three metrics. It runs once per
// op of a flat file, so it works on raw pointers: stores through the
// vectors would make the compiler reload every vector's data pointer (and
// C.NumQubits) after each one.
llvm::Error Scheduler::applyPlainGate(uint32_t Index, const ir::Op &O,
                                      bool IsT) {
  const uint32_t *W = C.Wires.data() + O.FirstWire;
  const unsigned N = O.NumWires;
  uint64_t *All = Ready[unsigned(DepthMetric::All)].data();
  uint64_t *Two = Ready[unsigned(DepthMetric::TwoQubit)].data();
  uint64_t *T = Ready[unsigned(DepthMetric::T)].data();
  uint32_t *Last = LastOp.data(), *Slot = LastSlot.data();
  uint64_t *First = FirstUse.data(), *LastEnd = LastUse.data();
  uint64_t StartAll = 0, StartTwo = 0, StartT = 0;
  uint32_t Critical = W[0];
  for (unsigned I = 0; I < N; ++I) {
    uint32_t X = W[I];
    if (All[X] > StartAll) {
      StartAll = All[X];
      Critical = X;
    }
    StartTwo = std::max(StartTwo, Two[X]);
    StartT = std::max(StartT, T[X]);
  }
  uint64_t EndAll, EndTwo, EndT;
  if (__builtin_add_overflow(StartAll, 1, &EndAll) ||
      __builtin_add_overflow(StartTwo, uint64_t(N >= 2), &EndTwo) ||
      __builtin_add_overflow(StartT, uint64_t(IsT), &EndT))
    return depthOverflow(O);
  StepInto[Index] = {StartAll > 0 ? Last[Critical] : NoOp, Slot[Critical]};
  for (unsigned I = 0; I < N; ++I) {
    uint32_t X = W[I]; // a qubit: markUse's test is not needed
    Slot[X] = O.FirstWire + I;
    if (First[X] == NoPath)
      First[X] = StartAll;
    LastEnd[X] = EndAll;
    All[X] = EndAll;
    Two[X] = EndTwo;
    T[X] = EndT;
    Last[X] = Index;
  }
  return llvm::Error::success();
}

llvm::Error Scheduler::applyCall(uint32_t Index, const ir::Op &O,
                                 const GateSummary &S) {
  unsigned K = O.NumWires;
  llvm::SmallVector<uint64_t, 8> In(K), Out(K);
  llvm::SmallVector<uint32_t, 8> InSlot(K), InOp(K);
  StepInto[Index] = {CallSteps, uint32_t(SlotSteps.size())};
  PathStep *Steps = &*SlotSteps.insert(SlotSteps.end(), K, PathStep{NoOp, 0});
  for (unsigned M = 0; M < NumDepthMetrics; ++M) {
    std::vector<uint64_t> &R = Ready[M];
    bool All = M == unsigned(DepthMetric::All);
    // The condition bits hold every input back until they are ready.
    uint64_t CondReady = 0;
    uint32_t CondWire = 0; // read only where CondReady > 0
    for (unsigned I = K; I < Wires.size(); ++I)
      if (R[Wires[I]] > CondReady) {
        CondReady = R[Wires[I]];
        CondWire = Wires[I];
      }
    for (unsigned I = 0; I < K; ++I) {
      In[I] = R[Wires[I]];
      InSlot[I] = LastSlot[Wires[I]];
      InOp[I] = LastOp[Wires[I]];
      if (CondReady > In[I]) {
        In[I] = CondReady;
        InSlot[I] = LastSlot[CondWire];
        InOp[I] = LastOp[CondWire];
      }
    }
    if (All)
      for (unsigned J = 0; J < K; ++J) {
        uint64_t First = NoPath, Last = NoPath;
        for (unsigned I = 0; I < K; ++I) {
          uint64_t F = S.FirstUse.at(I, J), L = S.LastUse.at(I, J);
          if (F != NoPath)
            First = First == NoPath ? In[I] + F : std::max(First, In[I] + F);
          if (L != NoPath)
            Last = Last == NoPath ? In[I] + L : std::max(Last, In[I] + L);
        }
        if (First != NoPath)
          markUse(Wires[J], First, Last);
      }
    uint64_t Latest = CondReady;
    for (unsigned J = 0; J < K; ++J) {
      uint64_t Best = 0;
      unsigned From = J;
      bool Found = false;
      for (unsigned I = 0; I < K; ++I) {
        uint64_t D = S.Depth[M].at(I, J);
        if (D == NoPath)
          continue;
        uint64_t V;
        if (__builtin_add_overflow(In[I], D, &V))
          return depthOverflow(O);
        if (!Found || V > Best) {
          Best = V;
          From = I;
          Found = true;
        }
      }
      Out[J] = Best;
      Latest = std::max(Latest, Best);
      if (All)
        Steps[J] = {In[From] > 0 ? InOp[From] : NoOp, InSlot[From]};
    }
    for (unsigned J = 0; J < K; ++J)
      R[Wires[J]] = Out[J];
    // The condition bits may be measured again once the whole call is done.
    for (unsigned I = K; I < Wires.size(); ++I)
      if (Latest >= Free[M][Wires[I]]) {
        Free[M][Wires[I]] = Latest;
        if (All) {
          LastFree[Wires[I]] = Index;
          LastFreeSlot[Wires[I]] = O.FirstWire;
        }
      }
  }
  for (unsigned J = 0; J < K; ++J) {
    LastOp[Wires[J]] = Index;
    LastSlot[Wires[J]] = O.FirstWire + J;
  }
  return llvm::Error::success();
}

llvm::Error Scheduler::run() {
  const ir::Op *Ops = C.Ops.data();
  const uint32_t NumOps = uint32_t(C.Ops.size());
  for (uint32_t Index = 0; Index < NumOps; ++Index) {
    const ir::Op &O = Ops[Index];
    bool IsGate = O.Kind == ir::OpKind::Gate;
    if (IsGate && Cache.isLeaf(O.Gate)) {
      bool IsT = Cache.isT(O.Gate, C.params(O));
      if (Tally)
        Tally->addLeaf(O, IsT);
      if (O.NumWires == 0)
        continue;
      if (O.Cond == ir::NoCondition) {
        if (llvm::Error E = applyPlainGate(Index, O, IsT))
          return E;
        continue;
      }
      collectWires(O);
      if (llvm::Error E = applyLeaf(Index, O, IsT, /*UsesQubits=*/true))
        return E;
      continue;
    }
    if (!IsGate) {
      SawBarrier |= O.Kind == ir::OpKind::Barrier;
      if (Tally)
        Tally->addOther(O);
      if (O.NumWires == 0)
        continue;
      collectWires(O);
      if (llvm::Error E =
              applyLeaf(Index, O, /*IsT=*/false, O.Kind != ir::OpKind::Barrier))
        return E;
      continue;
    }
    if (O.NumWires == 0 && !Tally)
      continue;
    llvm::Expected<const GateSummary *> S =
        Cache.get(O.Gate, C.params(O), O.Loc);
    if (!S)
      return S.takeError();
    if (Tally)
      if (llvm::Error E = Tally->addCall(O, **S))
        return E;
    if (O.NumWires == 0)
      continue;
    collectWires(O);
    if (llvm::Error E = applyCall(Index, O, **S))
      return E;
  }
  return llvm::Error::success();
}

llvm::Expected<Schedule> Scheduler::finish() {
  Schedule Out;
  for (unsigned M = 0; M < NumDepthMetrics; ++M)
    for (uint64_t V : Ready[M])
      Out.Depth[M] = std::max(Out.Depth[M], V);
  const std::vector<uint64_t> &All = Ready[unsigned(DepthMetric::All)];
  for (uint32_t Q = 0; Q < C.NumQubits; ++Q)
    if (FirstUse[Q] != NoPath &&
        !addChecked(Out.Volume, LastUse[Q] - FirstUse[Q]))
      return errorAt(C.Ops[LastOp[Q]].Loc,
                     "the spacetime volume passes 2^64-1 qubit-layers here; "
                     "revbound counts exactly in 64 bits and will not wrap");
  // Walk back from the wire that finishes last.
  uint32_t Wire = 0;
  for (uint32_t W = 1; W < All.size(); ++W)
    if (All[W] > All[Wire])
      Wire = W;
  if (All.empty() || All[Wire] == 0)
    return Out;
  PathStep Step = {LastOp[Wire], LastSlot[Wire]};
  while (Step.Op != NoOp) {
    // The walk goes down through the ops a few entries at a time, each
    // step's address known only from the step before: fetching the lines
    // below ahead of it saves a cache miss per step on a large file.
    if (Step.Op >= PrefetchAhead + 8) {
      __builtin_prefetch(StepInto.get() + Step.Op - PrefetchAhead);
      __builtin_prefetch(StepInto.get() + Step.Op - PrefetchAhead - 8);
    }
    // A barrier aligns and takes no layer. Reading the op's kind is a cache
    // miss per step on a large file, so only where there are barriers.
    if (!SawBarrier || C.Ops[Step.Op].Kind != ir::OpKind::Barrier)
      Out.CriticalOps.push_back(Step.Op);
    PathStep Into = StepInto[Step.Op];
    if (Into.Op == CallSteps)
      Into = SlotSteps[Into.Slot + (Step.Slot - C.Ops[Step.Op].FirstWire)];
    Step = Into;
  }
  std::reverse(Out.CriticalOps.begin(), Out.CriticalOps.end());
  return Out;
}

} // namespace

llvm::Expected<Schedule>
scheduleCircuit(const ir::Circuit &C, SummaryCache &Cache, CensusTally *Tally) {
  Scheduler S(C, Cache, Tally);
  if (llvm::Error E = S.run())
    return E;
  return S.finish();
}

} // namespace revbound::analysis
