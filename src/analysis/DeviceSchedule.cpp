//===- DeviceSchedule.cpp - A device's real schedule against the bounds ---===//
#include "revbound/analysis/DeviceSchedule.h"
#include "revbound/support/Diagnostics.h"

#include "llvm/ADT/DenseMap.h"

#include <algorithm>
#include <cmath>
#include <fmt/format.h>
#include <limits>
#include <map>

namespace revbound::analysis {

namespace {

struct KindStats {
  uint64_t Count = 0;
  double MaxActionJs = 0;
  unsigned Qubits = 1;
};

class Walker {
public:
  Walker(const ir::Circuit &C, SummaryCache &Cache,
         physics::GateCostModel &Costs, const config::Durations &D)
      : C(C), Cache(Cache), Costs(Costs), D(D) {}

  llvm::Error run(double &Length);
  llvm::DenseMap<ir::GateId, KindStats> Kinds;

private:
  llvm::Expected<double> durationOf(ir::GateId G, llvm::SMLoc Loc);
  llvm::Expected<const MaxPlusMatrix<double> *> path(ir::GateId G, llvm::SMLoc Loc);
  /// Adds the leaf applications of a call to Kinds (costs need the values).
  void countKinds(ir::GateId G, llvm::ArrayRef<double> Params);
  using KindList = std::vector<std::pair<ir::GateId, KindStats>>;
  /// The kinds a call expands to, memoised per gate and parameter values;
  /// the census has already checked that every count fits 64 bits.
  const KindList &kindsOf(ir::GateId G, llvm::ArrayRef<double> Params);
  std::map<std::pair<ir::GateId, std::vector<double>>, KindList> KindMemo;

  const ir::Circuit &C;
  SummaryCache &Cache;
  physics::GateCostModel &Costs;
  const config::Durations &D;
  llvm::DenseMap<ir::GateId, std::unique_ptr<MaxPlusMatrix<double>>> Paths;
};

llvm::Expected<double> Walker::durationOf(ir::GateId G, llvm::SMLoc Loc) {
  const std::string &Name = C.gate(G).Name;
  if (std::optional<double> S = D.of(Name))
    return *S;
  return errorAt(Loc, fmt::format("the durations file gives no duration for "
                                  "'{}' and no default",
                                  Name));
}

// Durations do not depend on angles, so one matrix per gate serves all calls.
llvm::Expected<const MaxPlusMatrix<double> *> Walker::path(ir::GateId G,
                                                           llvm::SMLoc Loc) {
  auto It = Paths.find(G);
  if (It != Paths.end())
    return It->second.get();
  const ir::GateDef &Def = C.gate(G);
  BodyState<double> State(Def.numQubits(), /*TrackUses=*/false);
  for (const ir::BodyOp &B : Def.Body) {
    if (B.IsBarrier)
      continue;
    if (Cache.isLeaf(B.Callee)) {
      llvm::Expected<double> T = durationOf(B.Callee, Loc);
      if (!T)
        return T.takeError();
      State.leaf(B.Qubits, *T);
      continue;
    }
    llvm::Expected<const MaxPlusMatrix<double> *> Sub = path(B.Callee, Loc);
    if (!Sub)
      return Sub.takeError();
    State.call(B.Qubits, **Sub);
  }
  auto M = std::make_unique<MaxPlusMatrix<double>>(State.delays());
  const MaxPlusMatrix<double> *Raw = M.get();
  Paths[G] = std::move(M);
  return Raw;
}

static void merge(llvm::DenseMap<ir::GateId, KindStats> &Into, ir::GateId G,
                  const KindStats &K, uint64_t Times = 1) {
  KindStats &T = Into[G];
  T.Count += K.Count * Times;
  T.Qubits = K.Qubits;
  T.MaxActionJs = std::max(T.MaxActionJs, K.MaxActionJs);
}

const Walker::KindList &Walker::kindsOf(ir::GateId G,
                                        llvm::ArrayRef<double> Params) {
  auto Key = std::make_pair(G, std::vector<double>(Params.begin(), Params.end()));
  auto It = KindMemo.find(Key);
  if (It != KindMemo.end())
    return It->second;
  llvm::DenseMap<ir::GateId, KindStats> Acc;
  llvm::SmallVector<double, 4> Sub;
  for (const ir::BodyOp &B : C.gate(G).Body) {
    if (B.IsBarrier)
      continue;
    Sub.clear();
    for (const ir::ParamExpr &E : B.Params)
      Sub.push_back(E.evaluate(Params));
    if (Cache.isLeaf(B.Callee)) {
      KindStats K;
      K.Count = 1;
      K.Qubits = C.gate(B.Callee).numQubits();
      K.MaxActionJs = Costs.cost(B.Callee, Sub).ActionJs;
      merge(Acc, B.Callee, K);
      continue;
    }
    for (const auto &[Leaf, K] : kindsOf(B.Callee, Sub))
      merge(Acc, Leaf, K);
  }
  KindList List(Acc.begin(), Acc.end());
  std::sort(List.begin(), List.end(),
            [](const auto &A, const auto &B) { return A.first < B.first; });
  return KindMemo.emplace(std::move(Key), std::move(List)).first->second;
}

void Walker::countKinds(ir::GateId G, llvm::ArrayRef<double> Params) {
  if (Cache.isLeaf(G)) {
    KindStats K;
    K.Count = 1;
    K.Qubits = C.gate(G).numQubits();
    K.MaxActionJs = Costs.cost(G, Params).ActionJs;
    merge(Kinds, G, K);
    return;
  }
  for (const auto &[Leaf, K] : kindsOf(G, Params))
    merge(Kinds, Leaf, K);
}

llvm::Error Walker::run(double &Length) {
  std::vector<double> Ready(C.NumQubits, 0.0);
  llvm::SmallVector<double, 8> In;
  for (const ir::Op &O : C.Ops) {
    if (O.Kind == ir::OpKind::Barrier)
      continue;
    llvm::ArrayRef<uint32_t> W = C.wires(O);
    if (O.Kind != ir::OpKind::Gate || Cache.isLeaf(O.Gate)) {
      std::optional<double> T;
      if (O.Kind == ir::OpKind::Gate) {
        llvm::Expected<double> Dur = durationOf(O.Gate, O.Loc);
        if (!Dur)
          return Dur.takeError();
        T = *Dur;
        countKinds(O.Gate, C.params(O));
      } else {
        const char *Name = O.Kind == ir::OpKind::Measure ? "measure" : "reset";
        T = D.of(Name);
        if (!T)
          return errorAt(O.Loc, fmt::format("the durations file gives no "
                                            "duration for '{}' and no default",
                                            Name));
      }
      unsigned NumQ = O.Kind == ir::OpKind::Measure ? 1 : unsigned(W.size());
      double Start = 0;
      for (unsigned I = 0; I < NumQ; ++I)
        Start = std::max(Start, Ready[W[I]]);
      for (unsigned I = 0; I < NumQ; ++I)
        Ready[W[I]] = Start + *T;
      continue;
    }
    llvm::Expected<const MaxPlusMatrix<double> *> P = path(O.Gate, O.Loc);
    if (!P)
      return P.takeError();
    countKinds(O.Gate, C.params(O));
    applyCall(Ready, W, **P, In);
  }
  Length = 0;
  for (double R : Ready)
    Length = std::max(Length, R);
  return llvm::Error::success();
}

} // namespace

llvm::Expected<DeviceComparison>
compareWithDevice(const ir::Circuit &C, SummaryCache &Cache,
                  physics::GateCostModel &Costs, const config::Durations &D,
                  const EnergyOptions &Energy, const SpeedBounds &Bounds) {
  DeviceComparison Out;
  Walker W(C, Cache, Costs, D);
  if (llvm::Error E = W.run(Out.ScheduleS))
    return std::move(E);
  Out.BoundS = Bounds.PerQubitTimeS ? Bounds.PerQubitTimeS : Bounds.PooledTimeS;
  if (Out.BoundS && Out.ScheduleS > 0)
    Out.Ratio = *Out.BoundS / Out.ScheduleS;
  for (const auto &[G, K] : W.Kinds) {
    GateKindTiming T;
    T.Name = C.gate(G).Name;
    T.Count = K.Count;
    T.DurationS = *D.of(T.Name);
    T.MaxActionJs = K.MaxActionJs;
    T.LeastEnergyJ = T.DurationS > 0 ? K.MaxActionJs / T.DurationS
                                     : std::numeric_limits<double>::infinity();
    std::optional<double> StepEnergy;
    if (Energy.EnergyPerQubitJ)
      StepEnergy = K.Qubits * *Energy.EnergyPerQubitJ;
    else if (Energy.EnergyJ)
      StepEnergy = *Energy.EnergyJ;
    // A zero duration is a frame change, not an evolution: no ratio.
    if (StepEnergy && K.MaxActionJs > 0 && T.DurationS > 0) {
      T.LimitS = K.MaxActionJs / *StepEnergy;
      T.SlowerBy = T.DurationS / *T.LimitS;
    }
    Out.Kinds.push_back(std::move(T));
  }
  // Furthest from the limit first: the least energy a step needs to keep its
  // duration is smallest where the device is slowest relative to physics.
  std::sort(Out.Kinds.begin(), Out.Kinds.end(),
            [](const GateKindTiming &A, const GateKindTiming &B) {
              if (A.LeastEnergyJ != B.LeastEnergyJ)
                return A.LeastEnergyJ < B.LeastEnergyJ;
              return A.Name < B.Name;
            });
  return Out;
}

} // namespace revbound::analysis
