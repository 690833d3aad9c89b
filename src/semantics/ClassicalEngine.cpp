//===- ClassicalEngine.cpp - Wires as Boolean functions of the inputs -----===//
//
// DESIGN.md, "Semantics tiers" (classical). Every wire is a BDD over one
// variable per input qubit; monomial steps permute basis values, other steps
// give the qubits they can change fresh variables (a sound over-approximation
// of the support). Entropies of erased wires are model counts under
// uniformly random inputs. A bit-parallel simulation looks for dirty
// ancillas first, and stands in, as sampling, when the BDDs outgrow their
// limits (ClassicalSampler.h).
//
// BuDDy is one global package, so runs hold a BuddySession's lock.
//
//===----------------------------------------------------------------------===//
#include "BddSteps.h"
#include "BuddySession.h"
#include "ClassicalSampler.h"
#include "ClassicalSteps.h"
#include "EngineSupport.h"

#include "revbound/semantics/Engines.h"

#include "llvm/ADT/DenseMap.h"
#include "llvm/ADT/DenseSet.h"

#include <bdd.h>
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <map>

namespace revbound::semantics {
namespace {

using namespace classical;
using Assignment = std::vector<std::pair<uint32_t, bool>>;

/// Fresh variables past this many fall back to sampling: BuDDy keeps two
/// nodes and per-operator tables for every variable.
constexpr uint32_t MaxVariables = uint32_t(1) << 16;
/// The BDD pass's work budget, per allowed node: after each gate step the
/// functions of its qubits are charged their size past the first
/// SmallFunction nodes. BuDDy's operations cost about the size of what
/// they read and build, so this bounds the time of circuits whose functions
/// grow large long before they fill the node table; small functions, which
/// stay in cache, are free.
constexpr uint64_t WorkPerNode = 8;
constexpr uint64_t SmallFunction = 1024;
/// One wire's function may hold this share of the node limit: operations on
/// two functions cost up to the product of their sizes, which the node limit
/// alone does not bound.
constexpr uint64_t FunctionShare = 64;
/// Memory the sampling fallback may spend on words (wires x words x 8).
constexpr uint64_t SamplingMemoryWords = (uint64_t(256) << 20) / 8;
/// Inputs tried by the counterexample search before the BDD pass.
constexpr uint64_t SearchLanes = 256;

bool isConstant(const bdd &F) { return F == bddfalse || F == bddtrue; }

/// The probability that F is 1 with every variable uniformly random: a
/// node's is the mean of its children's, whatever levels they skip.
double probabilityOfOne(const bdd &F) {
  int Root = F.id();
  if (Root < 2)
    return Root;
  llvm::DenseMap<int, double> P;
  P[0] = 0;
  P[1] = 1;
  std::vector<int> Stack{Root};
  while (!Stack.empty()) {
    int N = Stack.back();
    if (P.count(N)) {
      Stack.pop_back();
      continue;
    }
    int Lo = bdd_low(N), Hi = bdd_high(N);
    auto LoIt = P.find(Lo), HiIt = P.find(Hi);
    if (LoIt != P.end() && HiIt != P.end()) {
      double V = 0.5 * (LoIt->second + HiIt->second);
      P[N] = V;
      Stack.pop_back();
      continue;
    }
    if (LoIt == P.end())
      Stack.push_back(Lo);
    if (HiIt == P.end())
      Stack.push_back(Hi);
  }
  return P[Root];
}

/// The distinct non-constant functions among Fs (constants and repeats add
/// nothing to a joint entropy).
std::vector<bdd> distinctVariables(llvm::ArrayRef<bdd> Fs) {
  std::vector<bdd> Out;
  for (const bdd &F : Fs)
    if (!isConstant(F) &&
        std::none_of(Out.begin(), Out.end(),
                     [&](const bdd &G) { return G == F; }))
      Out.push_back(F);
  return Out;
}

std::string freshNote(uint64_t Gates) {
  return fmt::format("{} {} that make{} superpositions {} over-approximated; "
                     "figures depending on them are intervals",
                     Gates, Gates == 1 ? "gate" : "gates",
                     Gates == 1 ? "s" : "", Gates == 1 ? "was" : "were");
}

std::string budgetNote(const EngineOptions &Opts, const WalkOutcome &W,
                       const ir::Circuit &C) {
  return fmt::format("the expansion budget of {} gate applications ran out "
                     "at operation {} of {}; later calls were simulated "
                     "whole, and over-approximated where no unitary was "
                     "known",
                     Opts.MaxExpandedOps, W.BudgetRanOutAt + 1, C.Ops.size());
}

Assignment allInputsZero(const std::vector<uint32_t> &Inputs) {
  Assignment Out;
  for (uint32_t In : Inputs)
    Out.push_back({In, false});
  return Out;
}

//===----------------------------------------------------------------------===//
// The BDD simulation
//===----------------------------------------------------------------------===//

/// Wires as BDDs; the walk interface of walkCircuit, then finish().
class BddSimulation {
public:
  BddSimulation(BuddySession &Session, const ir::Circuit &C,
                const EngineOptions &Opts, const std::vector<uint32_t> &Inputs,
                const std::vector<uint32_t> &Order)
      : Session(Session), C(C), Opts(Opts), Inputs(Inputs), InputOfVar(Order),
        NumInputVars(uint32_t(Inputs.size())),
        WorkBudget(WorkPerNode * std::min(Opts.MaxBddNodes, MaxBuddyNodeCap)),
        FunctionCap(std::max(SmallFunction,
                             std::min(Opts.MaxBddNodes, MaxBuddyNodeCap) /
                                 FunctionShare)),
        Qubits(C.NumQubits), Bits(C.NumClbits), FunctionSize(C.NumQubits, 1) {
    // Every session declares at least one variable: BuDDy 2.4's bdd_done
    // frees the level tables of the last bdd_setvarnum without clearing
    // them, so a session without one would free them twice. A spare one
    // waits for the first fresh variable.
    Session.setVariableCount(int(std::max<uint32_t>(NumInputVars, 1)));
    if (stopped())
      return;
    VarsAllocated = std::max<uint32_t>(NumInputVars, 1);
    NextVar = NumInputVars;
    for (uint32_t V = 0; V < NumInputVars; ++V)
      Qubits[Inputs[Order[V]]] = bdd_ithvar(int(V));
  }

  bool stopped() const {
    return BuddySession::failed() || VariableLimit ||
           WorkLimit || FunctionLimit;
  }
  bool functionLimit() const { return FunctionLimit; }
  uint64_t functionCap() const { return FunctionCap; }
  bool variableLimit() const { return VariableLimit; }
  bool workLimit() const { return WorkLimit; }
  uint64_t workBudget() const { return WorkBudget; }
  uint64_t freshGates() const { return FreshGates; }

  void setCondition(const ir::Condition *Cond) {
    Guarded = Cond != nullptr;
    GuardBits.clear();
    if (!Guarded)
      return;
    GuardBits = conditionBits(C, *Cond);
    Guard = Cond->Unsatisfiable ? bddfalse : bddtrue;
    for (size_t I = 0; I < GuardBits.size(); ++I) {
      bool Want = I < Cond->Value.getBitWidth() && Cond->Value[unsigned(I)];
      const bdd &B = Bits[GuardBits[I]];
      Guard &= Want ? B : !B;
    }
  }

  void step(const GateStep &S, const BasisAction &A) {
    if (neverRuns() || A.K == BasisAction::Kind::Identity)
      return;
    llvm::SmallVector<int, 4> Before;
    for (uint32_t Qb : S.Qubits)
      Before.push_back(Qubits[Qb].id());
    switch (A.K) {
    case BasisAction::Kind::Identity:
      break;
    case BasisAction::Kind::Flip:
      applyFlip(Qubits, S, A, guard());
      break;
    case BasisAction::Kind::Relabel:
      applyRelabel(Qubits, S, A, guard());
      break;
    case BasisAction::Kind::Table:
      applyTable(Qubits, S, A, guard());
      break;
    case BasisAction::Kind::Fresh:
      fresh(S, A);
      break;
    }
    charge(S, Before);
  }

  /// True when the current condition provably never holds: then the
  /// operation is no operation, and no event (docs/erasures.md).
  bool neverRuns() const { return Guarded && Guard == bddfalse; }

  void reset(uint32_t Qb, const ir::Op &O) {
    if (neverRuns())
      return;
    bdd &Wire = Qubits[Qb];
    ErasureEvent E = event(ErasureKind::Reset, Qb, O);
    if (isConstant(Wire)) {
      constant(E);
    } else if (!Guarded) {
      if (inputOnly(Wire))
        exact(E, clampBits(binaryEntropy(probabilityOfOne(Wire)), 1));
    } else if (std::optional<double> Removed =
                   guardedChange(Wire, Wire & !Guard, nullptr, -1)) {
      exact(E, *Removed);
    }
    Events.push_back(E);
    assign(Wire, bddfalse);
  }

  void measure(uint32_t Qb, uint32_t Cb, const ir::Op &O) {
    if (neverRuns())
      return;
    bdd &Dst = Bits[Cb];
    const bdd &Src = Qubits[Qb];
    // Overwriting a known constant erases nothing.
    if (!isConstant(Dst)) {
      ErasureEvent E = event(ErasureKind::Overwrite, Cb, O);
      if (Dst == Src) {
        // c is a function of q in every branch: H(c | q) = 0.
        exact(E, 0);
      } else if (!Guarded) {
        if (inputOnly(Src) && inputOnly(Dst))
          exact(E, clampBits(jointEntropy({Src, Dst}) - jointEntropy({Src}),
                             1));
      } else if (std::optional<double> Removed = guardedChange(
                     Dst, bdd_ite(Guard, Src, Dst), &Src, int64_t(Cb))) {
        exact(E, *Removed);
      }
      Events.push_back(E);
    }
    assign(Dst, Src);
  }

  /// The discards, the ancilla verdicts and the joint discard entropy;
  /// false when BuDDy hit a limit on the way.
  bool finish(Ledger &L);

  std::vector<ErasureEvent> Events;

private:
  /// Charges a step the sizes of its qubits' functions (see WorkPerNode);
  /// sizes are remembered per qubit and counted again only when written.
  void charge(const GateStep &S, llvm::ArrayRef<int> Before) {
    if (stopped())
      return;
    for (size_t I = 0; I < S.Qubits.size(); ++I) {
      uint32_t Qb = S.Qubits[I];
      uint64_t &Nodes = FunctionSize[Qb];
      if (Qubits[Qb].id() != Before[I])
        Nodes = uint64_t(std::max(0, bdd_nodecount(Qubits[Qb])));
      if (Nodes > SmallFunction)
        Work += Nodes - SmallFunction;
      FunctionLimit |= Nodes > FunctionCap;
    }
    WorkLimit = Work > WorkBudget;
    if (bdd_getallocnum() != TableSeen) {
      TableSeen = bdd_getallocnum();
      Session.fitCaches();
    }
  }

  const bdd *guard() const { return Guarded ? &Guard : nullptr; }

  void assign(bdd &Wire, const bdd &New) { assignGuarded(Wire, New, guard()); }

  void fresh(const GateStep &S, const BasisAction &A) {
    if (A.Changed.empty())
      return;
    ++FreshGates;
    for (uint32_t I : A.Changed) {
      bdd F;
      if (!freshVariable(F))
        return;
      assign(Qubits[S.Qubits[I]], F);
    }
  }

  bool freshVariable(bdd &Out) {
    if (NextVar >= MaxVariables) {
      VariableLimit = true;
      return false;
    }
    if (NextVar >= VarsAllocated) {
      // Grow geometrically: each extension resizes BuDDy's tables.
      uint32_t Grow = std::min(std::max(VarsAllocated, uint32_t(256)),
                               MaxVariables - VarsAllocated);
      Session.setVariableCount(int(VarsAllocated + Grow));
      if (stopped() || bdd_varnum() != int(VarsAllocated + Grow))
        return false;
      VarsAllocated += Grow;
    }
    Out = bdd_ithvar(int(NextVar++));
    return true;
  }

  /// True when F depends on input variables only.
  bool inputOnly(const bdd &F) const {
    if (NextVar == NumInputVars || F.id() < 2)
      return true;
    llvm::DenseSet<int> Seen;
    std::vector<int> Stack{F.id()};
    while (!Stack.empty()) {
      int N = Stack.back();
      Stack.pop_back();
      if (N < 2 || !Seen.insert(N).second)
        continue;
      if (uint32_t(bdd_var(N)) >= NumInputVars)
        return false;
      Stack.push_back(bdd_low(N));
      Stack.push_back(bdd_high(N));
    }
    return true;
  }

  /// The joint Shannon entropy of Fs under uniform variables: every value
  /// pattern by depth-first search, empty conjunctions pruned.
  double jointEntropy(llvm::ArrayRef<bdd> Fs) {
    std::vector<bdd> Vars = distinctVariables(Fs);
    double H = 0;
    patterns(Vars, 0, bddtrue, H);
    return H;
  }
  void patterns(const std::vector<bdd> &Fs, size_t I, const bdd &G,
                double &H) {
    if (G == bddfalse || stopped())
      return;
    if (I == Fs.size()) {
      double P = probabilityOfOne(G);
      if (P > 0)
        H -= P * std::log2(P);
      return;
    }
    patterns(Fs, I + 1, G & Fs[I], H);
    patterns(Fs, I + 1, bdd_apply(G, Fs[I], bddop_diff), H);
  }

  /// max(0, H(A before) - H(A after)) for a conditioned operation that
  /// changes one wire from `Before` to `After`: A is that wire, `Extra`
  /// (the measured qubit) when given, and the condition's bits other than
  /// `SkipBit`. Nothing when A is not input-only or is too wide.
  std::optional<double> guardedChange(const bdd &Before, const bdd &After,
                                      const bdd *Extra, int64_t SkipBit) {
    std::vector<bdd> A{Before}, Z{After};
    if (Extra) {
      A.push_back(*Extra);
      Z.push_back(*Extra);
    }
    for (uint32_t Cb : GuardBits)
      if (int64_t(Cb) != SkipBit) {
        A.push_back(Bits[Cb]);
        Z.push_back(Bits[Cb]);
      }
    if (distinctVariables(A).size() > Opts.MaxJointWires ||
        !std::all_of(A.begin(), A.end(),
                     [&](const bdd &F) { return inputOnly(F); }))
      return std::nullopt;
    return clampBits(jointEntropy(A) - jointEntropy(Z), 1);
  }

  /// F quantified universally over its fresh variables: the inputs under
  /// which F is 1 whatever the superpositions did.
  bdd forallFresh(const bdd &F) {
    // Not bdd_support: BuDDy 2.4 keeps its support buffer's size in a
    // static that outlives bdd_done, so a later session writes through a
    // null buffer.
    llvm::DenseSet<int> Seen, FreshSeen;
    std::vector<int> Stack{F.id()}, Fresh;
    while (!Stack.empty()) {
      int N = Stack.back();
      Stack.pop_back();
      if (N < 2 || !Seen.insert(N).second)
        continue;
      int V = bdd_var(N);
      if (uint32_t(V) >= NumInputVars && FreshSeen.insert(V).second)
        Fresh.push_back(V);
      Stack.push_back(bdd_low(N));
      Stack.push_back(bdd_high(N));
    }
    std::sort(Fresh.begin(), Fresh.end());
    if (Fresh.empty())
      return F;
    bdd Set = bdd_makeset(Fresh.data(), int(Fresh.size()));
    return bdd_forall(F, Set);
  }

  /// Every input qubit with its value on the path of a satisfying cube
  /// (variables off the path are 0).
  Assignment assignmentOf(const bdd &Cube) const {
    std::vector<bool> Value(Inputs.size(), false);
    for (int N = Cube.id(); N > 1;) {
      int V = bdd_var(N), Lo = bdd_low(N);
      bool One = Lo == 0;
      if (uint32_t(V) < NumInputVars)
        Value[InputOfVar[size_t(V)]] = One;
      N = One ? bdd_high(N) : Lo;
    }
    Assignment Out;
    for (size_t I = 0; I < Inputs.size(); ++I)
      Out.push_back({Inputs[I], bool(Value[I])});
    return Out;
  }

  ErasureEvent event(ErasureKind Kind, uint32_t Wire, const ir::Op &O) const {
    ErasureEvent E;
    E.Kind = Kind;
    E.Wire = Wire;
    E.Loc = O.Loc;
    E.Status = ErasureStatus::Unknown;
    E.BitsLow = 0;
    E.BitsHigh = 1;
    return E;
  }
  static void constant(ErasureEvent &E) {
    E.Status = ErasureStatus::Constant;
    E.BitsLow = E.BitsHigh = 0;
  }
  static void exact(ErasureEvent &E, double Bits) {
    E.Status = ErasureStatus::Exact;
    E.BitsLow = E.BitsHigh = Bits;
  }

  void discard(uint32_t Qb, llvm::SMLoc Loc, Ledger &L, AncillaVerdict &V,
               std::vector<bdd> &Joint, bool &JointExact, double &MaxMarginal,
               double &HighSum);

  BuddySession &Session;
  int TableSeen = 0;
  const ir::Circuit &C;
  const EngineOptions &Opts;
  const std::vector<uint32_t> &Inputs;
  std::vector<uint32_t> InputOfVar; // variable -> index into Inputs
  uint32_t NumInputVars;
  uint32_t VarsAllocated = 0, NextVar = 0;
  bool VariableLimit = false, WorkLimit = false, FunctionLimit = false;
  uint64_t Work = 0, WorkBudget, FunctionCap;
  uint64_t FreshGates = 0;
  std::vector<bdd> Qubits, Bits;
  std::vector<uint64_t> FunctionSize; // nodes per qubit, as last written
  bool Guarded = false;
  bdd Guard;
  std::vector<uint32_t> GuardBits;
};

void BddSimulation::discard(uint32_t Qb, llvm::SMLoc Loc, Ledger &L,
                            AncillaVerdict &V, std::vector<bdd> &Joint,
                            bool &JointExact, double &MaxMarginal,
                            double &HighSum) {
  const bdd &F = Qubits[Qb];
  if (F == bddfalse) {
    // Sound with fresh variables too: no branch leaves the qubit at 1.
    V.Clean = true;
    return;
  }
  V.Clean = false;
  if (F == bddtrue) {
    L.Events.push_back(discardEvent(Qb, Loc, ErasureStatus::Constant, 0, 0));
    V.Counterexample = allInputsZero(Inputs);
    V.HasCounterexample = true;
    return;
  }
  if (inputOnly(F)) {
    double H = clampBits(binaryEntropy(probabilityOfOne(F)), 1);
    L.Events.push_back(discardEvent(Qb, Loc, ErasureStatus::Exact, H, H));
    MaxMarginal = std::max(MaxMarginal, H);
    HighSum += H;
    Joint.push_back(F);
    V.Counterexample = assignmentOf(bdd_satone(F));
    V.HasCounterexample = true;
    return;
  }
  L.Events.push_back(discardEvent(Qb, Loc, ErasureStatus::Unknown, 0, 1));
  HighSum += 1;
  JointExact = false;
  bdd Always = forallFresh(F);
  if (Always == bddfalse) {
    V.Clean.reset();
    return;
  }
  V.Counterexample = assignmentOf(bdd_satone(Always));
  V.HasCounterexample = true;
}

bool BddSimulation::finish(Ledger &L) {
  std::vector<llvm::SMLoc> Last = lastUses(C);
  std::vector<uint32_t> Discarded = discardedQubits(C);
  std::vector<bdd> Joint;
  bool JointExact = true;
  double MaxMarginal = 0, HighSum = 0;
  for (uint32_t Qb : Discarded) {
    AncillaVerdict V;
    V.Qubit = Qb;
    discard(Qb, Last[Qb], L, V, Joint, JointExact, MaxMarginal, HighSum);
    if (C.role(Qb) == ir::WireRole::Ancilla)
      L.Ancillas.push_back(std::move(V));
    if (stopped())
      return false;
  }
  if (Discarded.empty()) {
    L.DiscardJoint = {0, 0, true};
    return true;
  }
  std::vector<bdd> Vars = distinctVariables(Joint);
  if (JointExact && Vars.size() <= Opts.MaxJointWires) {
    double H = clampBits(jointEntropy(Vars), double(Vars.size()));
    L.DiscardJoint = {H, H, true};
  } else {
    // Classical states: H(joint) >= the largest marginal.
    L.DiscardJoint = {MaxMarginal, std::min(HighSum, double(Discarded.size())),
                      false};
  }
  return !stopped();
}

/// Why the BDD pass stopped, for Ledger.Notes; `Where` says where.
std::string stopReason(const BddSimulation &Sim, const EngineOptions &Opts,
                       const std::string &Where) {
  if (Sim.variableLimit())
    return fmt::format("more than {} BDD variables were needed {}",
                       MaxVariables, Where);
  if (Sim.functionLimit())
    return fmt::format("BDD node limit of {} reached: a wire's function "
                       "passed {} nodes (1/{} of the limit) {}",
                       Opts.MaxBddNodes, Sim.functionCap(), FunctionShare,
                       Where);
  if (Sim.workLimit())
    return fmt::format("BDD work limit of {} node visits ({} per allowed "
                       "node) reached {}",
                       Sim.workBudget(), WorkPerNode, Where);
  if (BuddySession::nearLimit() ||
      BuddySession::errorCode() == BDD_NODENUM)
    return fmt::format("BDD node limit of {} reached {}", Opts.MaxBddNodes,
                       Where);
  if (BuddySession::errorCode() == BDD_MEMORY)
    return fmt::format("the BDD library ran out of memory {}", Where);
  const char *What = bdd_errstring(BuddySession::errorCode());
  return fmt::format("the BDD library failed ({}) {}",
                     What ? What : "unknown error", Where);
}

/// The BDD pass; nothing, and `Why` set, when it had to stop.
std::optional<Ledger> runBdd(const ir::Circuit &C, const EngineOptions &Opts,
                             const std::vector<uint32_t> &Inputs,
                             std::string &Why) {
  BuddySession Session(Opts.MaxBddNodes, Inputs.size());
  if (!Session.ok()) {
    Why = Session.failure();
    return std::nullopt;
  }
  BddSimulation Sim(Session, C, Opts, Inputs, inputOrder(C, Inputs));
  if (Sim.stopped()) {
    Why = stopReason(Sim, Opts, "while creating the input variables");
    return std::nullopt;
  }
  WalkOutcome W = walkCircuit(C, Opts, Sim);
  if (!W.Finished) {
    Why = stopReason(Sim, Opts,
                     fmt::format("at operation {} of {}", W.StoppedAt + 1,
                                 C.Ops.size()));
    return std::nullopt;
  }
  Ledger L;
  L.Engine = EngineKind::Classical;
  L.Events = std::move(Sim.Events);
  if (!Sim.finish(L)) {
    Why = stopReason(Sim, Opts, "while computing the end-of-circuit figures");
    return std::nullopt;
  }
  if (Sim.freshGates())
    L.Notes.push_back(freshNote(Sim.freshGates()));
  if (W.BudgetRanOut)
    L.Notes.push_back(budgetNote(Opts, W, C));
  return L;
}

//===----------------------------------------------------------------------===//
// Bit-parallel counterexamples and the sampling fallback
//===----------------------------------------------------------------------===//

bool hasAncilla(const ir::Circuit &C) {
  for (uint32_t Qb = 0; Qb < C.NumQubits; ++Qb)
    if (C.role(Qb) == ir::WireRole::Ancilla)
      return true;
  return false;
}

/// Lanes that fit the sampling memory (at least one word per wire).
uint64_t affordableLanes(const ir::Circuit &C, uint64_t Wanted) {
  uint64_t Wires = uint64_t(C.NumQubits) + C.NumClbits +
                   inputQubits(C).size() + 1;
  uint64_t Words = std::max<uint64_t>(1, SamplingMemoryWords / Wires);
  return std::min(Wanted, Words * 64);
}

/// Dirty ancillas found on a few random inputs, valid only when no step
/// made a superposition (then each lane is a real run).
std::map<uint32_t, Assignment> searchCounterexamples(const ir::Circuit &C,
                                                     const EngineOptions &O) {
  std::map<uint32_t, Assignment> Found;
  if (!hasAncilla(C))
    return Found;
  WordSimulation Sim(C, affordableLanes(C, SearchLanes), O.Seed,
                     /*Record=*/false);
  walkCircuit(C, O, Sim);
  if (Sim.freshGates())
    return Found;
  for (uint32_t Qb = 0; Qb < C.NumQubits; ++Qb)
    if (C.role(Qb) == ir::WireRole::Ancilla)
      if (std::optional<uint64_t> Lane = Sim.firstOne(Qb))
        Found[Qb] = Sim.inputsOfLane(*Lane);
  return Found;
}

AncillaVerdict sampledVerdict(const WordSimulation &Sim, uint32_t Qb,
                              const std::vector<uint32_t> &Inputs,
                              const std::map<uint32_t, Assignment> &Found) {
  AncillaVerdict V;
  V.Qubit = Qb;
  if (Sim.known(Qb) == 0) {
    V.Clean = true;
    return V;
  }
  if (Sim.known(Qb) == 1) {
    V.Clean = false;
    V.Counterexample = allInputsZero(Inputs);
    V.HasCounterexample = true;
    return V;
  }
  V.Samples = Sim.lanes();
  V.DirtySamples = Sim.ones(Qb);
  std::optional<uint64_t> Lane = Sim.firstOne(Qb);
  auto It = Found.find(Qb);
  if (Lane && Sim.freshGates() == 0) {
    V.Clean = false;
    V.Counterexample = Sim.inputsOfLane(*Lane);
    V.HasCounterexample = true;
  } else if (It != Found.end()) {
    V.Clean = false;
    V.Counterexample = It->second;
    V.HasCounterexample = true;
  }
  return V;
}

/// Every figure from `Opts.Samples` random inputs (fewer when memory is
/// short), with `Why` the first note.
Ledger sampledLedger(const ir::Circuit &C, const EngineOptions &Opts,
                     const std::string &Why,
                     const std::map<uint32_t, Assignment> &Found) {
  uint64_t Lanes = affordableLanes(C, Opts.Samples);
  WordSimulation Sim(C, Lanes, Opts.Seed, /*Record=*/true);
  WalkOutcome W = walkCircuit(C, Opts, Sim);
  Ledger L;
  L.Engine = EngineKind::Classical;
  L.Events = std::move(Sim.Events);
  L.Notes.push_back(fmt::format("{}; figures from {} random inputs", Why,
                                Lanes));
  std::vector<uint32_t> Inputs = inputQubits(C);
  std::vector<llvm::SMLoc> Last = lastUses(C);
  std::vector<uint32_t> Discarded = discardedQubits(C);
  double Open = 0;
  for (uint32_t Qb : Discarded) {
    int8_t K = Sim.known(Qb);
    if (K == 1)
      L.Events.push_back(
          discardEvent(Qb, Last[Qb], ErasureStatus::Constant, 0, 0));
    if (K < 0) {
      ErasureEvent E =
          discardEvent(Qb, Last[Qb], ErasureStatus::Unknown, 0, 1);
      E.Samples = Lanes;
      if (Lanes)
        E.BitsEstimate = binaryEntropy(double(Sim.ones(Qb)) / double(Lanes));
      L.Events.push_back(E);
      Open += 1;
    }
    if (C.role(Qb) == ir::WireRole::Ancilla)
      L.Ancillas.push_back(sampledVerdict(Sim, Qb, Inputs, Found));
  }
  // Known values carry no entropy; each open qubit up to one bit.
  L.DiscardJoint = {0, Open, Open == 0};
  if (Sim.freshGates())
    L.Notes.push_back(freshNote(Sim.freshGates()));
  if (W.BudgetRanOut)
    L.Notes.push_back(budgetNote(Opts, W, C));
  return L;
}

} // namespace

Ledger runClassical(const ir::Circuit &C, const EngineOptions &Opts) {
  std::map<uint32_t, Assignment> Found = searchCounterexamples(C, Opts);
  std::vector<uint32_t> Inputs = inputQubits(C);
  std::string Why;
  if (Inputs.size() > MaxVariables) {
    Why = fmt::format("{} input qubits need more than {} BDD variables",
                      Inputs.size(), MaxVariables);
  } else if (std::optional<Ledger> L = runBdd(C, Opts, Inputs, Why)) {
    return std::move(*L);
  }
  return sampledLedger(C, Opts, Why, Found);
}

} // namespace revbound::semantics
