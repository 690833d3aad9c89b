//===- SpeedBounds.cpp - The least time a circuit needs for an energy -----===//
#include "revbound/analysis/SpeedBounds.h"
#include "revbound/support/Checked.h"
#include "revbound/support/Constants.h"
#include "revbound/support/Diagnostics.h"

#include "llvm/ADT/StringSet.h"

#include <algorithm>
#include <cmath>
#include <cstring>
#include <unordered_map>

namespace revbound::analysis {

namespace {

/// Per gate and parameter values: the sums over its expansion and the
/// longest weighted path through it, for one weight rule.
struct TimeSummary {
  double ActionJs = 0, AngleSumRad = 0;
  uint64_t Steps = 0, Orthogonal = 0, Unknown = 0;
  MaxPlusMatrix<double> Path;
};

class SpeedAnalysis {
public:
  SpeedAnalysis(const ir::Circuit &C, SummaryCache &Cache,
                physics::GateCostModel &Costs, double StepEnergyJ,
                std::optional<double> StepSpreadJ)
      : C(C), Cache(Cache), Costs(Costs), StepEnergyJ(StepEnergyJ),
        StepSpreadJ(StepSpreadJ) {}

  /// The weight of one step on `K` qubits: its time when each qubit holds
  /// StepEnergyJ (and StepSpreadJ).
  double weight(const physics::LeafCost &Cost, unsigned K) const {
    double T = Cost.ActionJs / (K * StepEnergyJ);
    if (StepSpreadJ)
      T = std::max(T, si::ReducedPlanckJouleSeconds * Cost.AngleRad /
                          (K * *StepSpreadJ));
    return T;
  }

  const TimeSummary &summary(ir::GateId G, llvm::ArrayRef<double> Params);
  llvm::StringSet<> Unknown;

private:
  const ir::Circuit &C;
  SummaryCache &Cache;
  physics::GateCostModel &Costs;
  double StepEnergyJ;
  std::optional<double> StepSpreadJ;
  std::unordered_map<std::string, std::unique_ptr<TimeSummary>> Memo;
  unsigned Depth = 0;
};

const TimeSummary &SpeedAnalysis::summary(ir::GateId G,
                                          llvm::ArrayRef<double> Params) {
  std::string Key = ir::callKey(G, Params);
  auto It = Memo.find(Key);
  if (It != Memo.end())
    return *It->second;
  // A cache: bound it, but only where no summary is in use by a caller.
  if (Depth == 0 && Memo.size() > 65536)
    Memo.clear();
  ++Depth;
  struct Leave {
    unsigned &D;
    ~Leave() { --D; }
  } L{Depth};
  const ir::GateDef &D = C.gate(G);
  unsigned K = D.numQubits();
  auto S = std::make_unique<TimeSummary>();
  BodyState<double> State(K, /*TrackUses=*/false);
  llvm::SmallVector<double, 4> Sub;
  for (const ir::BodyOp &B : D.Body) {
    if (B.IsBarrier)
      continue;
    Sub.clear();
    for (const ir::ParamExpr &E : B.Params)
      Sub.push_back(E.evaluate(Params));
    if (Cache.isLeaf(B.Callee)) {
      const physics::LeafCost &Cost = Costs.cost(B.Callee, Sub);
      ++S->Steps;
      S->Orthogonal += Cost.Orthogonal;
      if (!Cost.Known) {
        ++S->Unknown;
        Unknown.insert(C.gate(B.Callee).Name);
      }
      S->ActionJs += Cost.ActionJs;
      S->AngleSumRad += Cost.AngleRad;
      State.leaf(B.Qubits, weight(Cost, unsigned(B.Qubits.size())));
      continue;
    }
    const TimeSummary &Inner = summary(B.Callee, Sub);
    S->ActionJs += Inner.ActionJs;
    S->AngleSumRad += Inner.AngleSumRad;
    S->Steps += Inner.Steps;
    S->Orthogonal += Inner.Orthogonal;
    S->Unknown += Inner.Unknown;
    State.call(B.Qubits, Inner.Path);
  }
  S->Path = State.delays();
  return *Memo.emplace(std::move(Key), std::move(S)).first->second;
}

/// Walks the top level once with one weight rule; returns the longest path
/// (in the rule's unit) and fills the sums into `Out` when asked.
double walk(const ir::Circuit &C, SummaryCache &Cache,
            physics::GateCostModel &Costs, SpeedAnalysis &A,
            SpeedBounds *Out) {
  std::vector<double> Ready(C.NumQubits, 0.0);
  llvm::SmallVector<double, 8> In;
  // The walk runs beside the schedule on large files: a copy of the leaf
  // flags of its own keeps its per-op reads off the other thread's cache
  // lines (the cache sits in that thread's frame, beside what it writes on
  // every op; sharing those lines made both walks half again as slow).
  std::vector<uint8_t> IsLeaf(C.Gates.size());
  for (ir::GateId G = 0; G < IsLeaf.size(); ++G)
    IsLeaf[G] = Cache.isLeaf(G);
  for (const ir::Op &O : C.Ops) {
    if (O.Kind != ir::OpKind::Gate)
      continue;
    if (O.Cond != ir::NoCondition) {
      if (Out)
        ++Out->ConditionalSkipped;
      continue;
    }
    llvm::ArrayRef<uint32_t> W = C.wires(O);
    if (IsLeaf[O.Gate]) {
      const physics::LeafCost &Cost = Costs.cost(O.Gate, C.params(O));
      double Start = 0;
      for (uint32_t Q : W)
        Start = std::max(Start, Ready[Q]);
      double End = Start + A.weight(Cost, unsigned(W.size()));
      for (uint32_t Q : W)
        Ready[Q] = End;
      if (Out) {
        ++Out->Steps;
        Out->OrthogonalSteps += Cost.Orthogonal;
        Out->ActionJs += Cost.ActionJs;
        Out->AngleSumRad += Cost.AngleRad;
        if (!Cost.Known) {
          ++Out->UnknownSteps;
          A.Unknown.insert(C.gate(O.Gate).Name);
        }
      }
      continue;
    }
    const TimeSummary &S = A.summary(O.Gate, C.params(O));
    applyCall(Ready, W, S.Path, In);
    if (Out) {
      Out->Steps += S.Steps;
      Out->OrthogonalSteps += S.Orthogonal;
      Out->UnknownSteps += S.Unknown;
      Out->ActionJs += S.ActionJs;
      Out->AngleSumRad += S.AngleSumRad;
    }
  }
  double Longest = 0;
  for (double R : Ready)
    Longest = std::max(Longest, R);
  return Longest;
}

} // namespace

llvm::Expected<SpeedBounds> boundSpeed(const ir::Circuit &C, SummaryCache &Cache,
                                       physics::GateCostModel &Costs,
                                       const EnergyOptions &Energy) {
  SpeedBounds Out;
  // Energy-free pass: weights action / k at one joule per qubit, so the
  // path is in J s and T = PathActionJs / E_q.
  SpeedAnalysis Free(C, Cache, Costs, 1.0, std::nullopt);
  Out.PathActionJs = walk(C, Cache, Costs, Free, &Out);
  for (const auto &Name : Free.Unknown)
    Out.UnknownGates.push_back(Name.getKey().str());
  std::sort(Out.UnknownGates.begin(), Out.UnknownGates.end());

  if (Energy.EnergyJ) {
    double T = Out.ActionJs / *Energy.EnergyJ;
    if (Energy.SpreadJ)
      T = std::max(T, si::ReducedPlanckJouleSeconds * Out.AngleSumRad / *Energy.SpreadJ);
    Out.PooledTimeS = T;
  }
  if (Energy.EnergyPerQubitJ) {
    if (Energy.SpreadJ) {
      // With a spread the weights depend on both energies: one more pass.
      SpeedAnalysis Timed(C, Cache, Costs, *Energy.EnergyPerQubitJ, Energy.SpreadJ);
      Out.PerQubitTimeS = walk(C, Cache, Costs, Timed, nullptr);
    } else {
      Out.PerQubitTimeS = Out.PathActionJs / *Energy.EnergyPerQubitJ;
    }
  }
  // The inverse by the Margolus-Levitin term alone: the least energy with
  // which the steps' action fits the target time.
  if (Energy.TargetTimeS) {
    Out.PooledEnergyForTargetJ = Out.ActionJs / *Energy.TargetTimeS;
    Out.PerQubitEnergyForTargetJ = Out.PathActionJs / *Energy.TargetTimeS;
  }
  return Out;
}

} // namespace revbound::analysis
