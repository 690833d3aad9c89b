//===- EquivalenceBdd.cpp - Classical circuits compared as functions ------===//
//
// For circuits whose every step is monomial (a permutation of basis states
// up to phases), each kept wire at the end is a Boolean function of the
// inputs, and two such circuits agree on every basis input iff their kept
// wires' BDDs are equal (BDDs are canonical for a fixed variable order:
// Bryant, IEEE Trans. Computers C-35(8), 677 (1986)). Both circuits share
// one BDD package and one variable per input, so equality is a node
// comparison and a difference yields a witness from any satisfying
// assignment of the XOR. Phases are invisible here, as the result says.
//
//===----------------------------------------------------------------------===//
#include "BddSteps.h"
#include "BuddySession.h"
#include "ClassicalSteps.h"
#include "EngineSupport.h"
#include "EquivalenceSupport.h"

#include "revbound/semantics/Engines.h"

#include <bdd.h>
#include <fmt/format.h>

namespace revbound::semantics::equivalence {
namespace {

using namespace classical;

/// Work per allowed node before the walk gives up (as in the classical
/// engine: a step is charged the sizes of the functions it wrote).
constexpr uint64_t WorkPerNode = 8;

/// One circuit's wires as BDDs; the walk interface of walkCircuit.
class FunctionSimulation {
public:
  FunctionSimulation(const ir::Circuit &C, const std::vector<int> &VarOfQubit,
                     uint64_t WorkBudget)
      : C(C), WorkBudget(WorkBudget), Qubits(C.NumQubits, bddfalse),
        Bits(C.NumClbits, bddfalse) {
    for (uint32_t Q = 0; Q < C.NumQubits; ++Q)
      if (VarOfQubit[Q] >= 0)
        Qubits[Q] = bdd_ithvar(VarOfQubit[Q]);
  }

  bool stopped() const {
    return !NotClassical.empty() || BuddySession::failed() || Work > WorkBudget;
  }

  void setCondition(const ir::Condition *Cond) {
    Guarded = Cond != nullptr;
    if (!Guarded)
      return;
    Guard = Cond->Unsatisfiable ? bddfalse : bddtrue;
    std::vector<uint32_t> GuardBits = conditionBits(C, *Cond);
    for (size_t I = 0; I < GuardBits.size(); ++I) {
      bool Want = I < Cond->Value.getBitWidth() && Cond->Value[unsigned(I)];
      const bdd &B = Bits[GuardBits[I]];
      Guard &= Want ? B : !B;
    }
  }

  void step(const GateStep &S, const BasisAction &A) {
    const bdd *G = guard();
    switch (A.K) {
    case BasisAction::Kind::Identity:
      return;
    case BasisAction::Kind::Flip:
      applyFlip(Qubits, S, A, G);
      break;
    case BasisAction::Kind::Relabel:
      applyRelabel(Qubits, S, A, G);
      break;
    case BasisAction::Kind::Table:
      applyTable(Qubits, S, A, G);
      break;
    case BasisAction::Kind::Fresh:
      if (A.Changed.empty())
        return;
      NotClassical = fmt::format("gate {} {}", C.gate(S.Gate).Name,
                                 S.U ? "maps basis states to superpositions"
                                     : "has no known unitary");
      return;
    }
    for (uint32_t Qb : S.Qubits)
      Work += uint64_t(std::max(0, bdd_nodecount(Qubits[Qb])));
  }

  void reset(uint32_t Qb, const ir::Op &) {
    assignGuarded(Qubits[Qb], bddfalse, guard());
  }

  void measure(uint32_t Qb, uint32_t Cb, const ir::Op &) {
    // A basis state is unchanged by measurement; the bit gets its value.
    assignGuarded(Bits[Cb], Qubits[Qb], guard());
  }

  const ir::Circuit &C;
  uint64_t WorkBudget, Work = 0;
  std::string NotClassical;
  std::vector<bdd> Qubits, Bits;

private:
  const bdd *guard() const { return Guarded ? &Guard : nullptr; }

  bool Guarded = false;
  bdd Guard;
};

/// Input index -> value of a satisfying assignment of F (0 where free).
std::vector<bool> witnessOf(const bdd &F, const std::vector<uint32_t> &Order,
                            size_t Inputs) {
  std::vector<bool> X(Inputs, false);
  bdd Cube = bdd_satone(F);
  int N = Cube.id();
  while (N > 1) {
    int Lo = bdd_low(N), Hi = bdd_high(N);
    bool One = Lo == 0; // the cube's other branch is false
    X[Order[size_t(bdd_var(N))]] = One;
    N = One ? Hi : Lo;
  }
  return X;
}

bool evaluate(const bdd &F, const std::vector<bool> &X,
              const std::vector<uint32_t> &Order) {
  int N = F.id();
  while (N > 1)
    N = X[Order[size_t(bdd_var(N))]] ? bdd_high(N) : bdd_low(N);
  return N == 1;
}

std::string stopReason(const FunctionSimulation &Sim, uint64_t MaxNodes) {
  if (!Sim.NotClassical.empty())
    return Sim.NotClassical;
  if (Sim.Work > Sim.WorkBudget)
    return fmt::format("BDD work limit of {} node visits reached",
                       Sim.WorkBudget);
  if (BuddySession::nearLimit() ||
      BuddySession::errorCode() == BDD_NODENUM)
    return fmt::format("BDD node limit of {} reached", MaxNodes);
  const char *What = bdd_errstring(BuddySession::errorCode());
  return fmt::format("the BDD library failed ({})",
                     What ? What : "unknown error");
}

std::optional<bool> ancillasClean(const FunctionSimulation &Sim) {
  bool Any = false;
  for (uint32_t Q = 0; Q < Sim.C.NumQubits; ++Q) {
    if (Sim.C.role(Q) != ir::WireRole::Ancilla)
      continue;
    Any = true;
    if (Sim.Qubits[Q] != bddfalse)
      return false;
  }
  return Any ? std::optional<bool>(true) : std::nullopt;
}

} // namespace

Attempt compareFunctions(const ir::Circuit &A, const ir::Circuit &B,
                         const Interface &I, const EquivalenceOptions &Opts) {
  Attempt Out;
  size_t Inputs = I.Inputs.size();
  BuddySession Session(Opts.MaxBddNodes, Inputs);
  if (!Session.ok()) {
    Out.WhyNot = Session.failure();
    return Out;
  }
  // At least one variable: BuDDy 2.4's bdd_done frees the level tables of
  // the last bdd_setvarnum twice without one (see ClassicalEngine.cpp).
  Session.setVariableCount(int(std::max<size_t>(Inputs, 1)));
  std::vector<uint32_t> InputsOfA;
  for (const auto &P : I.Inputs)
    InputsOfA.push_back(P.first);
  // Order[v] = the interface input of variable v: first-touch order in A.
  std::vector<uint32_t> Order = inputOrder(A, InputsOfA);
  std::vector<int> VarA(A.NumQubits, -1), VarB(B.NumQubits, -1);
  for (size_t V = 0; V < Order.size(); ++V) {
    VarA[I.Inputs[Order[V]].first] = int(V);
    VarB[I.Inputs[Order[V]].second] = int(V);
  }
  EngineOptions Walk;
  Walk.MaxMatrixQubits = Opts.MaxMatrixQubits;
  Walk.MaxExpandedOps = Opts.MaxExpandedOps;
  uint64_t Budget = WorkPerNode * std::min(Opts.MaxBddNodes, MaxBuddyNodeCap);
  FunctionSimulation SimA(A, VarA, Budget), SimB(B, VarB, Budget);
  for (auto [Sim, Side] : {std::pair{&SimA, "reference"},
                           std::pair{&SimB, "candidate"}}) {
    WalkOutcome W = walkCircuit(Sim->C, Walk, *Sim);
    if (!W.Finished) {
      const ir::Op &At = Sim->C.Ops[W.StoppedAt];
      std::string Where =
          At.Kind == ir::OpKind::Gate
              ? fmt::format(" (in operation {} of {}, a call of {})",
                            W.StoppedAt + 1, Sim->C.Ops.size(),
                            Sim->C.gate(At.Gate).Name)
              : fmt::format(" (at operation {} of {})", W.StoppedAt + 1,
                            Sim->C.Ops.size());
      Out.WhyNot = fmt::format("{}: {}{}", Side,
                               stopReason(*Sim, Opts.MaxBddNodes), Where);
      return Out;
    }
    if (W.BudgetRanOut) {
      Out.WhyNot = fmt::format("{}: the gate expansion budget ran out", Side);
      return Out;
    }
  }

  EquivalenceResult R;
  R.Method = EquivalenceMethod::Bdd;
  R.Reason = "both circuits are classical (monomial gates only): kept wires "
             "compared as Boolean functions of the inputs";
  R.Verdict = EquivalenceVerdict::Equivalent;
  R.Notes.push_back("relative phases are not compared: the circuits agree "
                    "on basis inputs, which is what a classical circuit "
                    "computes");
  R.AncillasCleanA = ancillasClean(SimA);
  R.AncillasCleanB = ancillasClean(SimB);
  auto Differs = [&](const bdd &FA, const bdd &FB) {
    if (FA == FB)
      return false;
    std::vector<bool> X = witnessOf(FA ^ FB, Order, Inputs);
    EquivalenceWitness W;
    W.First = inputBits(A, I, X);
    for (const auto &[QA, QB] : I.KeptQubits)
      if (evaluate(SimA.Qubits[QA], X, Order) !=
          evaluate(SimB.Qubits[QB], X, Order))
        W.DifferingWires.push_back(A.qubitName(QA));
    for (const auto &[CA, CB] : I.KeptBits)
      if (evaluate(SimA.Bits[CA], X, Order) != evaluate(SimB.Bits[CB], X, Order))
        W.DifferingWires.push_back(A.clbitName(CA));
    R.Witness = std::move(W);
    return true;
  };
  bool Different = false;
  for (const auto &[QA, QB] : I.KeptQubits)
    if (!Different)
      Different = Differs(SimA.Qubits[QA], SimB.Qubits[QB]);
  for (const auto &[CA, CB] : I.KeptBits)
    if (!Different)
      Different = Differs(SimA.Bits[CA], SimB.Bits[CB]);
  if (Different) {
    R.Verdict = EquivalenceVerdict::NotEquivalent;
    R.Notes.clear();
  }
  Out.Result = std::move(R);
  return Out;
}

} // namespace revbound::semantics::equivalence
