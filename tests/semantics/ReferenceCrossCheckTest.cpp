//===- ReferenceCrossCheckTest.cpp - Engines against the reference ------===//
//
// Checks the semantic engines against ReferenceSimulator.h, a reference
// written apart from them: every expected value below is computed here by
// brute force (ReferenceSimulator.h) unless a comment gives a closed form
// and its source.
//
// Which operations are events (DESIGN.md, "Erasure ledger"; Ledger.h):
//  - a reset always is, unless it provably never runs (an `if` on bits
//    known never to hold its value; docs/erasures.md): that is no operation
//    (ResetThatNeverRunsIsNoEvent pins it down for every engine; the
//    random cross-checks accept it listed or not, so that they keep
//    checking values);
//  - a measure is not when the bit it writes holds a constant just before:
//    then S(q, c) before is S(q) and after it is the Shannon entropy of the
//    outcome, which is never smaller (von Neumann entropy is at most the
//    Shannon entropy of the diagonal), so nothing is removed;
//  - a discard (ancilla, garbage) is, unless the qubit is proved |0>.
// An exact engine (density; classical on reversible circuits) lists exactly
// the events these rules give. A sound engine may fail to prove a bit
// constant or a qubit |0> and list more; every interval it gives must hold
// the reference value, and every figure it calls exact must equal it.
// Probabilities up to ZeroProb count as rounding noise of a zero, where an
// event may or may not be listed (its bits are then 0 either way).
//
// Measures are never conditioned here: the rule for A of a conditioned
// measure is not pinned down by the design.
//
//===----------------------------------------------------------------------===//
#include "ReferenceSimulator.h"
#include "TestSupport.h"

#include "revbound/semantics/Engines.h"

#include <fmt/format.h>
#include <gtest/gtest-spi.h>
#include <gtest/gtest.h>

#include <algorithm>
#include <functional>
#include <map>
#include <memory>
#include <numbers>
#include <set>

namespace revbound {
namespace {

namespace sem = semantics;
using namespace test::reference;

constexpr double Tol = 1e-9;
constexpr double ZeroProb = 1e-10;

ir::WireRole toWireRole(RefRole R) {
  switch (R) {
  case RefRole::Output:
    return ir::WireRole::Output;
  case RefRole::Input:
    return ir::WireRole::Input;
  case RefRole::Ancilla:
    return ir::WireRole::Ancilla;
  case RefRole::Garbage:
    return ir::WireRole::Garbage;
  }
  return ir::WireRole::Output;
}

/// A RefCircuit as the project's front end elaborates it, roles set
/// directly on the IR.
struct Prepared {
  RefCircuit Ref;
  std::string Text;
  test::Elaborated E;
  /// Reference op index by location; filled when the text has one
  /// statement per reference op (RefCircuit::toQasm).
  std::map<const char *, size_t> OpByLoc;
  /// Per qubit, the location a discard must carry: the last top-level
  /// operation on it (a measure's bit aside), or null for none.
  std::vector<const char *> LastUse;

  const ir::Circuit &circuit() const { return *E.Circuit; }
};

/// Elaborates `Text` (by default the reference's own printout); null, with
/// a test failure, when it does not elaborate.
std::unique_ptr<Prepared> prepare(const RefCircuit &Ref,
                                  std::string Text = "") {
  auto P = std::make_unique<Prepared>();
  P->Ref = Ref;
  bool Flat = Text.empty();
  P->Text = Flat ? Ref.toQasm() : std::move(Text);
  P->E = test::elaborate(P->Text);
  if (!P->E.Circuit) {
    ADD_FAILURE() << "does not elaborate:\n" << P->Text << "\n" << P->E.Error;
    return nullptr;
  }
  ir::Circuit &C = *P->E.Circuit;
  if (C.NumQubits != Ref.numQubits() || C.NumClbits != Ref.numBits()) {
    ADD_FAILURE() << "register sizes differ from the reference";
    return nullptr;
  }
  C.QubitRoles.assign(C.NumQubits, ir::WireRole::Output);
  for (unsigned Q = 0; Q < C.NumQubits; ++Q)
    C.QubitRoles[Q] = toWireRole(Ref.role(Q));
  C.QubitRoleLocs.assign(C.NumQubits, {});

  if (Flat) {
    if (C.Ops.size() != Ref.Ops.size()) {
      ADD_FAILURE() << "op counts differ from the reference";
      return nullptr;
    }
    for (size_t I = 0; I < C.Ops.size(); ++I) {
      ir::OpKind Want = Ref.Ops[I].Kind == RefOpKind::Reset ? ir::OpKind::Reset
                        : Ref.Ops[I].Kind == RefOpKind::Measure
                            ? ir::OpKind::Measure
                            : ir::OpKind::Gate;
      if (C.Ops[I].Kind != Want) {
        ADD_FAILURE() << "op " << I << " differs from the reference";
        return nullptr;
      }
      P->OpByLoc[C.Ops[I].Loc.getPointer()] = I;
    }
  }
  P->LastUse.assign(C.NumQubits, nullptr);
  for (const ir::Op &O : C.Ops) {
    if (O.Kind == ir::OpKind::Barrier)
      continue;
    llvm::ArrayRef<uint32_t> W = C.wires(O);
    if (O.Kind == ir::OpKind::Measure)
      W = W.take_front(1);
    for (uint32_t Q : W)
      P->LastUse[Q] = O.Loc.getPointer();
  }
  return P;
}

std::optional<sem::Ledger> runChoice(const ir::Circuit &C,
                                     sem::EngineChoice Choice,
                                     sem::EngineOptions Opts = {}) {
  Opts.Choice = Choice;
  llvm::Expected<sem::Ledger> L = sem::runEngine(C, Opts);
  if (!L) {
    ADD_FAILURE() << "engine failed: " << llvm::toString(L.takeError());
    return std::nullopt;
  }
  return std::move(*L);
}

enum class Strictness { Exact, Sound };

/// The interval rules every engine obeys, and for an exact engine a point.
void checkBits(const sem::ErasureEvent &E, double RefBits, Strictness S) {
  SCOPED_TRACE(fmt::format("{} event on wire {}: [{}, {}] ({}), reference {}",
                           sem::erasureKindName(E.Kind), E.Wire, E.BitsLow,
                           E.BitsHigh, sem::erasureStatusName(E.Status),
                           RefBits));
  EXPECT_LE(E.BitsLow, RefBits + Tol);
  EXPECT_GE(E.BitsHigh, RefBits - Tol);
  if (E.Status != sem::ErasureStatus::Unknown) {
    EXPECT_NEAR(E.BitsLow, RefBits, Tol);
    EXPECT_NEAR(E.BitsHigh, RefBits, Tol);
  }
  if (E.Status == sem::ErasureStatus::Constant) {
    EXPECT_NEAR(RefBits, 0, Tol);
  }
  if (S == Strictness::Exact) {
    EXPECT_NE(E.Status, sem::ErasureStatus::Unknown);
  }
}

/// Runs the reference on a counterexample input and checks that the
/// ancilla really ends at 1 (with certainty for a reversible circuit).
void checkCounterexample(const RefCircuit &R, const sem::AncillaVerdict &V) {
  BasisInput Basis;
  for (const auto &[Q, Value] : V.Counterexample) {
    EXPECT_EQ(R.role(Q), RefRole::Input)
        << "counterexample names qubit " << Q << ", not an input";
    Basis[Q] = Value;
  }
  std::string Shown;
  for (const auto &[Q, Value] : V.Counterexample)
    Shown += fmt::format(" q{}={}", Q, int(Value));
  SCOPED_TRACE("counterexample:" + Shown);
  if (R.isReversible()) {
    EXPECT_EQ(simulateClassical(R, Basis).ProbOne[V.Qubit], 1.0);
    if (R.numQubits() <= MaxDensityQubits) {
      EXPECT_NEAR(simulateDensity(R, Basis).ProbOne[V.Qubit], 1.0, Tol);
    }
  } else if (R.numQubits() <= MaxDensityQubits) {
    EXPECT_GT(simulateDensity(R, Basis).ProbOne[V.Qubit], ZeroProb);
  }
}

/// Compares a whole ledger with the reference outcome `Ref` of `P`.
void checkLedger(const sem::Ledger &L, const Prepared &P, const RefOutcome &Ref,
                 Strictness S) {
  const RefCircuit &R = P.Ref;
  const bool Reversible = R.isReversible();
  SCOPED_TRACE(fmt::format("{} engine ({})", sem::engineName(L.Engine),
                           S == Strictness::Exact ? "exact" : "sound"));

  std::map<size_t, const RefEvent *> RefByOp;
  for (const RefEvent &E : Ref.Events)
    RefByOp[E.OpIndex] = &E;

  // Resets and overwrites in program order, then discards by qubit.
  std::map<size_t, unsigned> ListedOps;
  std::map<unsigned, const sem::ErasureEvent *> DiscardOf;
  bool SeenDiscard = false;
  std::optional<size_t> PrevOp;
  std::optional<unsigned> PrevDiscard;
  for (const sem::ErasureEvent &E : L.Events) {
    if (E.Kind == sem::ErasureKind::Discard) {
      SeenDiscard = true;
      EXPECT_TRUE(!PrevDiscard || E.Wire > *PrevDiscard)
          << "discards out of qubit order";
      PrevDiscard = E.Wire;
      ASSERT_LT(E.Wire, R.numQubits());
      EXPECT_TRUE(isDiscardedRole(R.role(E.Wire)))
          << "discard of qubit " << E.Wire << ", which is kept";
      EXPECT_EQ(E.Loc.getPointer(), P.LastUse[E.Wire])
          << "discard of qubit " << E.Wire << " not at its last use";
      DiscardOf[E.Wire] = &E;
      continue;
    }
    EXPECT_FALSE(SeenDiscard) << "a reset or overwrite after the discards";
    auto It = P.OpByLoc.find(E.Loc.getPointer());
    if (It == P.OpByLoc.end()) {
      ADD_FAILURE() << sem::erasureKindName(E.Kind)
                    << " event at no reset or measure of the circuit";
      continue;
    }
    size_t Op = It->second;
    EXPECT_TRUE(!PrevOp || Op > *PrevOp) << "events out of program order";
    PrevOp = Op;
    ++ListedOps[Op];
    const RefOp &O = R.Ops[Op];
    if (E.Kind == sem::ErasureKind::Reset) {
      EXPECT_EQ(O.Kind, RefOpKind::Reset) << "op " << Op;
      EXPECT_EQ(E.Wire, O.Qubits[0]) << "op " << Op;
    } else {
      EXPECT_EQ(O.Kind, RefOpKind::Measure) << "op " << Op;
      EXPECT_EQ(E.Wire, O.Bit) << "op " << Op;
    }
    if (RefByOp.count(Op)) {
      SCOPED_TRACE(fmt::format("op {}", Op));
      checkBits(E, RefByOp[Op]->Bits, S);
    }
  }

  // Every reset, and every measure into a bit that is not constant, is an
  // event; for an exact engine on a reversible circuit (no rounding) the
  // measures into constant bits are not.
  for (const RefEvent &E : Ref.Events) {
    unsigned Listed = ListedOps.count(E.OpIndex) ? ListedOps[E.OpIndex] : 0;
    EXPECT_LE(Listed, 1u) << "op " << E.OpIndex << " listed twice";
    if (E.Kind == RefOpKind::Reset) {
      if (E.RunProbability > ZeroProb) {
        EXPECT_EQ(Listed, 1u) << "reset at op " << E.OpIndex << " missing";
      }
      continue;
    }
    if (E.BitMinorityBefore > ZeroProb) {
      EXPECT_EQ(Listed, 1u) << "measure at op " << E.OpIndex
                            << " into a non-constant bit is missing";
    } else if (S == Strictness::Exact && Reversible) {
      EXPECT_EQ(Listed, 0u)
          << "measure at op " << E.OpIndex << " into a constant bit is listed";
    }
  }

  // A discard is an event unless the qubit ends |0>.
  for (size_t K = 0; K < Ref.Discarded.size(); ++K) {
    unsigned Q = Ref.Discarded[K];
    double P1 = Ref.ProbOne[Q];
    auto It = DiscardOf.find(Q);
    SCOPED_TRACE(fmt::format("discarded qubit {}, P(not |0>) = {}", Q, P1));
    if (P1 > ZeroProb) {
      EXPECT_TRUE(It != DiscardOf.end()) << "discard missing";
    } else if (S == Strictness::Exact && Reversible) {
      EXPECT_TRUE(It == DiscardOf.end()) << "discard of a |0> qubit listed";
    }
    if (It != DiscardOf.end())
      checkBits(*It->second, Ref.DiscardMarginal[K], S);
  }

  const sem::BitInterval &J = L.DiscardJoint;
  EXPECT_LE(J.Low, Ref.DiscardJoint + Tol) << "discard joint";
  EXPECT_GE(J.High, Ref.DiscardJoint - Tol) << "discard joint";
  if (J.Exact) {
    EXPECT_NEAR(J.Low, Ref.DiscardJoint, Tol) << "discard joint";
    EXPECT_NEAR(J.High, Ref.DiscardJoint, Tol) << "discard joint";
  }
  if (S == Strictness::Exact && !DiscardOf.empty()) {
    EXPECT_TRUE(J.Exact) << "discard joint not exact";
  }

  std::vector<unsigned> Ancillas = R.qubitsWithRole(RefRole::Ancilla);
  ASSERT_EQ(L.Ancillas.size(), Ancillas.size()) << "one verdict per ancilla";
  for (size_t K = 0; K < Ancillas.size(); ++K) {
    const sem::AncillaVerdict &V = L.Ancillas[K];
    double P1 = Ref.ProbOne[Ancillas[K]];
    SCOPED_TRACE(fmt::format("ancilla {}, P(not |0>) = {}", Ancillas[K], P1));
    EXPECT_EQ(V.Qubit, Ancillas[K]);
    if (V.Clean) {
      EXPECT_EQ(*V.Clean, P1 <= ZeroProb) << "wrong verdict";
    } else {
      EXPECT_NE(S, Strictness::Exact) << "an exact engine left it open";
    }
    if (V.DirtyProbability) {
      EXPECT_NEAR(*V.DirtyProbability, P1, Tol);
    }
    if (S == Strictness::Exact && L.Engine == sem::EngineKind::Density) {
      EXPECT_TRUE(V.DirtyProbability.has_value());
    }
    if (S == Strictness::Exact && L.Engine == sem::EngineKind::Classical &&
        V.Clean == false) {
      EXPECT_TRUE(V.HasCounterexample) << "dirty without a counterexample";
    }
    if (V.HasCounterexample)
      checkCounterexample(R, V);
  }
}

//===----------------------------------------------------------------------===//
// Random circuits from a fixed seed.
//===----------------------------------------------------------------------===//

/// SplitMix64 (Steele, Lea & Flood, OOPSLA 2014): the same sequence on
/// every platform, unlike the std distributions.
class SplitMix {
public:
  explicit SplitMix(uint64_t Seed) : State(Seed) {}
  uint64_t next() {
    uint64_t Z = (State += 0x9e3779b97f4a7c15ULL);
    Z = (Z ^ (Z >> 30)) * 0xbf58476d1ce4e5b9ULL;
    Z = (Z ^ (Z >> 27)) * 0x94d049bb133111ebULL;
    return Z ^ (Z >> 31);
  }
  unsigned below(unsigned N) { return unsigned(next() % N); }
  double unit() { return double(next() >> 11) * 0x1.0p-53; }
  bool chance(double P) { return unit() < P; }

private:
  uint64_t State;
};

/// The positions of a gate's arguments that it changes; the others are
/// controls.
std::vector<unsigned> targetPositions(RefGate G) {
  switch (G) {
  case RefGate::CX:
    return {1};
  case RefGate::CCX:
    return {2};
  case RefGate::Swap:
    return {0, 1};
  case RefGate::CSwap:
    return {1, 2};
  default:
    return {0};
  }
}

class CircuitGenerator {
public:
  CircuitGenerator(SplitMix &Rng, bool General) : Rng(Rng), General(General) {}

  /// A circuit on 2..MaxQubits qubits, registers c[2] and d[1]. Half are
  /// shaped compute / copy / uncompute (with now and then one uncompute
  /// gate missing), so that clean and dirty ancillas both occur.
  RefCircuit circuit(unsigned MaxQubits) {
    RefCircuit C;
    unsigned N = 2 + Rng.below(MaxQubits - 1);
    C.QRegs = {{"q", N}};
    C.CRegs = {{"c", 2}, {"d", 1}};
    static const RefRole Roles[] = {RefRole::Input,   RefRole::Input,
                                    RefRole::Output,  RefRole::Ancilla,
                                    RefRole::Ancilla, RefRole::Garbage};
    for (unsigned Q = 0; Q < N; ++Q)
      C.Roles.push_back(Roles[Rng.below(6)]);
    if (!std::count(C.Roles.begin(), C.Roles.end(), RefRole::Input) &&
        Rng.chance(0.8))
      C.Roles[Rng.below(N)] = RefRole::Input;

    std::vector<unsigned> All, NonAncilla;
    for (unsigned Q = 0; Q < N; ++Q) {
      All.push_back(Q);
      if (C.Roles[Q] != RefRole::Ancilla)
        NonAncilla.push_back(Q);
    }
    if (Rng.chance(0.5)) {
      for (unsigned I = 0, E = 4 + Rng.below(16); I < E; ++I)
        addRandomOp(C, All, /*Events=*/true);
      return C;
    }
    // Ancillas are only read before the compute block and after the
    // uncompute block.
    for (unsigned I = 0, E = Rng.below(6); I < E && !NonAncilla.empty(); ++I)
      addRandomOp(C, NonAncilla, true);
    size_t ComputeBegin = C.Ops.size();
    for (unsigned I = 0, E = 1 + Rng.below(6); I < E; ++I)
      addRandomOp(C, All, false);
    std::vector<RefOp> Compute(C.Ops.begin() + ComputeBegin, C.Ops.end());
    std::set<unsigned> Touched;
    for (const RefOp &O : Compute)
      Touched.insert(O.Qubits.begin(), O.Qubits.end());
    std::vector<unsigned> CopyTargets;
    for (unsigned Q : NonAncilla)
      if (!Touched.count(Q))
        CopyTargets.push_back(Q);
    for (unsigned I = 0, E = Rng.below(3); I < E && !CopyTargets.empty(); ++I) {
      unsigned T = CopyTargets[Rng.below(unsigned(CopyTargets.size()))];
      unsigned Ctl = All[Rng.below(N)];
      if (Ctl != T)
        C.gate(RefGate::CX, {Ctl, T});
    }
    std::optional<size_t> Skip;
    if (Rng.chance(0.3))
      Skip = Rng.below(unsigned(Compute.size()));
    for (size_t I = Compute.size(); I-- > 0;)
      if (I != Skip)
        C.Ops.push_back(inverse(Compute[I]));
    for (unsigned I = 0, E = Rng.below(4); I < E && !NonAncilla.empty(); ++I)
      addRandomOp(C, NonAncilla, true);
    return C;
  }

private:
  RefGate randomGate() {
    static const RefGate Reversible[] = {
        RefGate::X,   RefGate::CX,   RefGate::CX,   RefGate::CCX,
        RefGate::CCX, RefGate::Swap, RefGate::CSwap};
    static const RefGate Quantum[] = {RefGate::H, RefGate::H,  RefGate::T,
                                      RefGate::S, RefGate::RY, RefGate::RY,
                                      RefGate::RZ};
    if (General && Rng.chance(0.4))
      return Quantum[Rng.below(7)];
    return Reversible[Rng.below(7)];
  }

  std::optional<RefCondition> randomCondition() {
    if (!Rng.chance(0.35))
      return std::nullopt;
    if (Rng.chance(0.6))
      return RefCondition{0, Rng.below(4)};
    return RefCondition{1, Rng.below(2)};
  }

  /// A gate, reset or measure whose changed qubits come from `Targets`.
  void addRandomOp(RefCircuit &C, const std::vector<unsigned> &Targets,
                   bool Events) {
    unsigned N = C.numQubits();
    if (Events && Rng.chance(0.35)) {
      unsigned Q = Targets[Rng.below(unsigned(Targets.size()))];
      if (Rng.chance(0.5))
        C.reset(Q, randomCondition());
      else
        C.measure(Q, Rng.below(3));
      return;
    }
    for (;;) {
      RefGate G = randomGate();
      unsigned K = refGateArity(G);
      std::vector<unsigned> TargetPos = targetPositions(G);
      if (K > N || TargetPos.size() > Targets.size())
        continue;
      std::vector<unsigned> Qs(K, ~0u);
      std::set<unsigned> Used;
      for (unsigned Pos : TargetPos) {
        unsigned Q;
        do
          Q = Targets[Rng.below(unsigned(Targets.size()))];
        while (Used.count(Q));
        Qs[Pos] = Q;
        Used.insert(Q);
      }
      for (unsigned &Q : Qs) {
        if (Q != ~0u)
          continue;
        do
          Q = Rng.below(N);
        while (Used.count(Q));
        Used.insert(Q);
      }
      double Theta = 0;
      if (hasAngle(G))
        Theta = (Rng.chance(0.5) ? 1 : -1) * (0.2 + 2.7 * Rng.unit());
      C.gate(G, Qs, Theta, randomCondition());
      return;
    }
  }

  /// The inverse gate (up to a global phase), with the same condition.
  static RefOp inverse(RefOp O) {
    switch (O.Gate) {
    case RefGate::T:
      O.Gate = RefGate::RZ;
      O.Theta = -std::numbers::pi / 4;
      break;
    case RefGate::S:
      O.Gate = RefGate::RZ;
      O.Theta = -std::numbers::pi / 2;
      break;
    case RefGate::RY:
    case RefGate::RZ:
      O.Theta = -O.Theta;
      break;
    default:
      break; // self-inverse
    }
    return O;
  }

  SplitMix &Rng;
  bool General;
};

/// "q[0] input, q[1] ancilla, ..." for failure messages.
std::string rolesOf(const RefCircuit &R) {
  static const char *Names[] = {"output", "input", "ancilla", "garbage"};
  std::string Out;
  for (unsigned Q = 0; Q < R.numQubits(); ++Q)
    Out +=
        fmt::format("{}{} {}", Q ? ", " : "", RefCircuit::wireName(R.QRegs, Q),
                    Names[unsigned(R.role(Q))]);
  return Out;
}

struct RandomCase {
  std::unique_ptr<Prepared> P;
  RefOutcome Ref;
  std::string trace(size_t I) const {
    return fmt::format("random circuit #{} (roles: {}):\n{}", I,
                       P ? rolesOf(P->Ref) : "", P ? P->Text : "");
  }
};

/// Reversible circuits with resets, measures and conditions on up to 6
/// qubits; the reference outcome is the density one (the two references
/// are compared in ReferenceSelfCheck).
const std::vector<RandomCase> &reversibleCases() {
  static const std::vector<RandomCase> Cases = [] {
    std::vector<RandomCase> Out;
    SplitMix Rng(0x7265766272ULL);
    CircuitGenerator Gen(Rng, /*General=*/false);
    for (int I = 0; I < 200; ++I) {
      RandomCase Case;
      RefCircuit R = Gen.circuit(6);
      Case.P = prepare(R);
      Case.Ref = simulateDensity(R);
      Out.push_back(std::move(Case));
    }
    return Out;
  }();
  return Cases;
}

/// Circuits that add h, t, s, ry and rz, on up to 5 qubits.
const std::vector<RandomCase> &generalCases() {
  static const std::vector<RandomCase> Cases = [] {
    std::vector<RandomCase> Out;
    SplitMix Rng(0x67656e6572ULL);
    CircuitGenerator Gen(Rng, /*General=*/true);
    for (int I = 0; I < 120; ++I) {
      RandomCase Case;
      RefCircuit R = Gen.circuit(5);
      Case.P = prepare(R);
      Case.Ref = simulateDensity(R);
      Out.push_back(std::move(Case));
    }
    return Out;
  }();
  return Cases;
}

void expectSameOutcome(const RefOutcome &A, const RefOutcome &B) {
  ASSERT_EQ(A.Events.size(), B.Events.size());
  for (size_t I = 0; I < A.Events.size(); ++I) {
    EXPECT_EQ(A.Events[I].OpIndex, B.Events[I].OpIndex);
    EXPECT_NEAR(A.Events[I].Bits, B.Events[I].Bits, 1e-12) << "event " << I;
    EXPECT_NEAR(A.Events[I].BitMinorityBefore, B.Events[I].BitMinorityBefore,
                1e-12)
        << "event " << I;
    EXPECT_NEAR(A.Events[I].RunProbability, B.Events[I].RunProbability, 1e-12)
        << "event " << I;
  }
  ASSERT_EQ(A.ProbOne.size(), B.ProbOne.size());
  for (size_t Q = 0; Q < A.ProbOne.size(); ++Q)
    EXPECT_NEAR(A.ProbOne[Q], B.ProbOne[Q], 1e-12) << "qubit " << Q;
  ASSERT_EQ(A.Discarded, B.Discarded);
  for (size_t K = 0; K < A.DiscardMarginal.size(); ++K)
    EXPECT_NEAR(A.DiscardMarginal[K], B.DiscardMarginal[K], 1e-12);
  EXPECT_NEAR(A.DiscardJoint, B.DiscardJoint, 1e-12);
}

//===----------------------------------------------------------------------===//
// The reference against itself.
//===----------------------------------------------------------------------===//

// Checks that the density reference and the classical brute force agree on
// every figure of the random reversible circuits, and that the generator
// reaches the cases the cross-checks are about.
TEST(ReferenceSelfCheck, TwoReferencesAgreeOnReversibleCircuits) {
  const auto &Cases = reversibleCases();
  unsigned ErasingResets = 0, ConditionedResets = 0, ConstantMeasures = 0,
           ErasingMeasures = 0, CleanAncillas = 0, DirtyAncillas = 0,
           DirtyDiscards = 0;
  for (size_t I = 0; I < Cases.size(); ++I) {
    ASSERT_TRUE(Cases[I].P);
    SCOPED_TRACE(Cases[I].trace(I));
    const RefCircuit &R = Cases[I].P->Ref;
    expectSameOutcome(Cases[I].Ref, simulateClassical(R));
    for (const RefEvent &E : Cases[I].Ref.Events) {
      const RefOp &O = R.Ops[E.OpIndex];
      if (E.Kind == RefOpKind::Reset) {
        ErasingResets += E.Bits > 0.01;
        ConditionedResets += O.Cond && E.Bits > 0.01;
      } else {
        ConstantMeasures += E.BitMinorityBefore == 0;
        ErasingMeasures += E.Bits > 0.01;
      }
    }
    for (unsigned Q : R.qubitsWithRole(RefRole::Ancilla))
      ++(Cases[I].Ref.ProbOne[Q] == 0 ? CleanAncillas : DirtyAncillas);
    for (unsigned Q : R.discardedQubits())
      DirtyDiscards += Cases[I].Ref.ProbOne[Q] > 0;
  }
  EXPECT_GE(ErasingResets, 50u);
  EXPECT_GE(ConditionedResets, 10u);
  EXPECT_GE(ConstantMeasures, 20u);
  EXPECT_GE(ErasingMeasures, 10u);
  EXPECT_GE(CleanAncillas, 50u);
  EXPECT_GE(DirtyAncillas, 30u);
  EXPECT_GE(DirtyDiscards, 50u);
}

// Checks the density reference on the random general circuits: every
// figure is an entropy or probability in range, and the classical brute
// force agrees on those that happen to be reversible.
TEST(ReferenceSelfCheck, GeneralCircuitFiguresAreInRange) {
  const auto &Cases = generalCases();
  unsigned Superposed = 0;
  for (size_t I = 0; I < Cases.size(); ++I) {
    ASSERT_TRUE(Cases[I].P);
    SCOPED_TRACE(Cases[I].trace(I));
    const RefOutcome &Ref = Cases[I].Ref;
    for (const RefEvent &E : Ref.Events) {
      EXPECT_GE(E.Bits, 0);
      // A reset's A holds one qubit and the condition's register, whose
      // entropy no reset lowers; a measure's A is a qubit and a bit.
      EXPECT_LE(E.Bits, (E.Kind == RefOpKind::Reset ? 1 : 2) + 1e-12);
    }
    for (double P : Ref.ProbOne) {
      EXPECT_GE(P, -1e-12);
      EXPECT_LE(P, 1 + 1e-12);
      Superposed += P > 1e-6 && P < 1 - 1e-6 && std::abs(P - 0.5) > 1e-6;
    }
    // Subadditivity, S(AB) <= S(A) + S(B) (Araki & Lieb, Commun. Math.
    // Phys. 18, 160 (1970)); a marginal may exceed the joint (a Bell pair).
    double SumOfMarginals = 0;
    for (double M : Ref.DiscardMarginal) {
      EXPECT_LE(M, 1 + 1e-12);
      SumOfMarginals += M;
    }
    EXPECT_LE(Ref.DiscardJoint, SumOfMarginals + 1e-9);
    if (Cases[I].P->Ref.isReversible())
      expectSameOutcome(Ref, simulateClassical(Cases[I].P->Ref));
  }
  EXPECT_GE(Superposed, 30u); // probabilities other than 0, 1/2, 1 occur
}

/// Registers q (one qubit per role) and c[Bits].
RefCircuit qubitsAndBits(std::vector<RefRole> Roles, unsigned Bits) {
  RefCircuit C;
  C.QRegs = {{"q", unsigned(Roles.size())}};
  C.CRegs = {{"c", Bits}};
  C.Roles = std::move(Roles);
  return C;
}

/// The ledger an exact engine should give, built from the reference
/// outcome alone, with a counterexample for each dirty ancilla found by
/// trying every basis input.
sem::Ledger oracleLedger(const Prepared &P, const RefOutcome &Ref) {
  const RefCircuit &R = P.Ref;
  const ir::Circuit &C = P.circuit();
  sem::Ledger L;
  L.Engine = sem::EngineKind::Classical;
  for (const RefEvent &E : Ref.Events) {
    if (E.Kind == RefOpKind::Measure && E.BitMinorityBefore == 0)
      continue;
    sem::ErasureEvent Ev;
    Ev.Kind = E.Kind == RefOpKind::Reset ? sem::ErasureKind::Reset
                                         : sem::ErasureKind::Overwrite;
    Ev.Wire = E.Wire;
    Ev.Loc = C.Ops[E.OpIndex].Loc;
    Ev.Status = sem::ErasureStatus::Exact;
    Ev.BitsLow = Ev.BitsHigh = E.Bits;
    L.Events.push_back(Ev);
  }
  for (size_t K = 0; K < Ref.Discarded.size(); ++K) {
    unsigned Q = Ref.Discarded[K];
    if (Ref.ProbOne[Q] == 0)
      continue;
    sem::ErasureEvent Ev;
    Ev.Kind = sem::ErasureKind::Discard;
    Ev.Wire = Q;
    Ev.Loc = llvm::SMLoc::getFromPointer(P.LastUse[Q]);
    Ev.Status = sem::ErasureStatus::Exact;
    Ev.BitsLow = Ev.BitsHigh = Ref.DiscardMarginal[K];
    L.Events.push_back(Ev);
  }
  L.DiscardJoint = {Ref.DiscardJoint, Ref.DiscardJoint, true};
  std::vector<unsigned> Inputs = R.qubitsWithRole(RefRole::Input);
  for (unsigned Q : R.qubitsWithRole(RefRole::Ancilla)) {
    sem::AncillaVerdict V;
    V.Qubit = Q;
    V.Clean = Ref.ProbOne[Q] == 0;
    for (uint64_t X = 0; !*V.Clean && X < (uint64_t(1) << Inputs.size()); ++X) {
      BasisInput In;
      for (size_t I = 0; I < Inputs.size(); ++I)
        In[Inputs[I]] = (X >> I) & 1;
      if (simulateClassical(R, In).ProbOne[Q] != 1)
        continue;
      V.HasCounterexample = true;
      for (const auto &[Input, Value] : In)
        V.Counterexample.push_back({Input, Value});
      break;
    }
    L.Ancillas.push_back(V);
  }
  return L;
}

/// How many test failures `F` reports, intercepted so that they do not
/// fail the calling test.
size_t failuresOf(const std::function<void()> &F) {
  ::testing::TestPartResultArray Results;
  {
    ::testing::ScopedFakeTestPartResultReporter Reporter(
        ::testing::ScopedFakeTestPartResultReporter::
            INTERCEPT_ONLY_CURRENT_THREAD,
        &Results);
    F();
  }
  return size_t(Results.size());
}

// Checks the checker: the ledger built from the reference passes, and each
// kind of wrong ledger fails. The fixture's values are Shannon entropies of
// fair bits worked by hand (Shannon 1948): the overwrite of c = x0 by
// q1 = x1 removes H(x1, x0) - H(x1, x1) = 1 bit, the reset of q0 = x0
// 1 bit; the ancilla ends x0 x1 (H2(1/4), dirty), the garbage x1 (1 bit),
// jointly 1.5 bits.
TEST(ReferenceSelfCheck, CheckerRejectsWrongLedgers) {
  using R = RefRole;
  RefCircuit C = qubitsAndBits({R::Input, R::Input, R::Ancilla, R::Garbage}, 1);
  C.gate(RefGate::CCX, {0, 1, 2})
      .measure(0, 0)
      .gate(RefGate::CX, {1, 3})
      .measure(1, 0)
      .reset(0);
  auto P = prepare(C);
  ASSERT_TRUE(P);
  RefOutcome Ref = simulateClassical(C);
  expectSameOutcome(Ref, simulateDensity(C));
  const sem::Ledger Good = oracleLedger(*P, Ref);
  ASSERT_EQ(Good.Events.size(), 4u);
  EXPECT_NEAR(Good.Events[0].BitsLow, 1.0, 1e-12);
  EXPECT_NEAR(Good.Events[1].BitsLow, 1.0, 1e-12);
  EXPECT_NEAR(Good.Events[2].BitsLow, binaryEntropyBits(0.25), 1e-12);
  EXPECT_NEAR(Good.Events[3].BitsLow, 1.0, 1e-12);
  EXPECT_NEAR(Good.DiscardJoint.Low, 1.5, 1e-12);
  ASSERT_EQ(Good.Ancillas.size(), 1u);
  ASSERT_TRUE(Good.Ancillas[0].HasCounterexample);

  auto Check = [&](const sem::Ledger &L, Strictness S) {
    return failuresOf([&] { checkLedger(L, *P, Ref, S); });
  };
  EXPECT_EQ(Check(Good, Strictness::Exact), 0u);
  sem::Ledger Wide = Good;
  for (sem::ErasureEvent &E : Wide.Events) {
    E.Status = sem::ErasureStatus::Unknown;
    E.BitsLow = 0;
    E.BitsHigh = 2;
  }
  Wide.DiscardJoint = {0, 4, false};
  Wide.Ancillas[0] = sem::AncillaVerdict{};
  Wide.Ancillas[0].Qubit = 2;
  EXPECT_EQ(Check(Wide, Strictness::Sound), 0u);
  EXPECT_GT(Check(Wide, Strictness::Exact), 0u);

  const ir::Circuit &IR = P->circuit();
  std::vector<std::pair<const char *, std::function<void(sem::Ledger &)>>>
      Mutations = {
          {"bits off",
           [](sem::Ledger &L) {
             L.Events[0].BitsLow = L.Events[0].BitsHigh = 0.99;
           }},
          {"reset missing",
           [](sem::Ledger &L) { L.Events.erase(L.Events.begin() + 1); }},
          {"constant measure listed",
           [&](sem::Ledger &L) {
             sem::ErasureEvent E = L.Events[0];
             E.Loc = IR.Ops[1].Loc;
             E.BitsLow = E.BitsHigh = 0;
             L.Events.insert(L.Events.begin(), E);
           }},
          {"out of order",
           [](sem::Ledger &L) { std::swap(L.Events[0], L.Events[1]); }},
          {"discard missing", [](sem::Ledger &L) { L.Events.pop_back(); }},
          {"discard of a kept qubit",
           [](sem::Ledger &L) { L.Events[3].Wire = 1; }},
          {"discard elsewhere",
           [&](sem::Ledger &L) { L.Events[3].Loc = IR.Ops[0].Loc; }},
          {"joint off",
           [](sem::Ledger &L) {
             L.DiscardJoint.Low = L.DiscardJoint.High = 1.4;
           }},
          {"verdict flipped",
           [](sem::Ledger &L) { L.Ancillas[0].Clean = true; }},
          {"verdict missing", [](sem::Ledger &L) { L.Ancillas.clear(); }},
          {"bogus counterexample",
           [](sem::Ledger &L) {
             L.Ancillas[0].Counterexample = {{0, false}, {1, true}};
           }},
          {"dirty probability off",
           [](sem::Ledger &L) { L.Ancillas[0].DirtyProbability = 0.5; }},
          {"constant but not zero",
           [](sem::Ledger &L) {
             L.Events[1].Status = sem::ErasureStatus::Constant;
           }},
      };
  for (const auto &[Name, Mutate] : Mutations) {
    sem::Ledger Bad = Good;
    Mutate(Bad);
    EXPECT_GT(Check(Bad, Strictness::Exact), 0u) << Name;
    // A sound engine may list a measure it cannot prove constant.
    if (std::string(Name) != "constant measure listed") {
      EXPECT_GT(Check(Bad, Strictness::Sound), 0u) << Name;
    }
  }
  sem::Ledger Narrow = Wide;
  Narrow.Events[1].BitsHigh = 0.5; // the reset removes 1 bit
  EXPECT_GT(Check(Narrow, Strictness::Sound), 0u);
}

//===----------------------------------------------------------------------===//
// Closed forms.
//===----------------------------------------------------------------------===//

struct ClosedForm {
  std::string Name;
  RefCircuit Circuit;
  /// Expected bits of the reference event of each reset / measure, in
  /// program order, each with its source.
  std::vector<std::pair<double, std::string>> Bits;
  /// Expected measure events that are not events (bit constant before).
  std::vector<size_t> NotEvents; // indices into Bits
};

std::vector<ClosedForm> closedForms() {
  using R = RefRole;
  std::vector<ClosedForm> Out;
  {
    ClosedForm F{"bell pair, reset one half",
                 qubitsAndBits({R::Output, R::Output}, 1),
                 {},
                 {}};
    F.Circuit.gate(RefGate::H, {0}).gate(RefGate::CX, {0, 1}).reset(0);
    // The reduced state of a Bell pair is I/2: 1 bit (common practice).
    F.Bits = {{1.0, "Bell pair half: S(I/2) = 1 bit"}};
    Out.push_back(F);
  }
  {
    ClosedForm F{"pure state reset", qubitsAndBits({R::Output}, 1), {}, {}};
    F.Circuit.gate(RefGate::H, {0})
        .gate(RefGate::T, {0})
        .gate(RefGate::RY, {0}, 0.3)
        .reset(0);
    // A pure state has zero von Neumann entropy (common practice).
    F.Bits = {{0.0, "pure state: S = 0"}};
    Out.push_back(F);
  }
  {
    ClosedForm F{"basis state reset", qubitsAndBits({R::Output}, 1), {}, {}};
    F.Circuit.gate(RefGate::X, {0}).reset(0);
    F.Bits = {{0.0, "known basis state: S = 0 (common practice)"}};
    Out.push_back(F);
  }
  for (double Theta : {0.3, 1.0, std::numbers::pi / 2, 2.2, 3.0}) {
    ClosedForm F{fmt::format("ry({}); cx; reset", Theta),
                 qubitsAndBits({R::Output, R::Output}, 1),
                 {},
                 {}};
    F.Circuit.gate(RefGate::RY, {0}, Theta).gate(RefGate::CX, {0, 1}).reset(1);
    // cos(t/2)|00> + sin(t/2)|11> has reduced state
    // diag(cos^2(t/2), sin^2(t/2)): S = H2(sin^2(t/2)) (Schmidt
    // decomposition; H2 from Shannon, Bell Syst. Tech. J. 27, 379 (1948)).
    double S = std::sin(Theta / 2);
    F.Bits = {{binaryEntropyBits(S * S), "H2(sin^2(theta/2))"}};
    Out.push_back(F);
  }
  {
    ClosedForm F{"ccx of two uniform inputs into an ancilla, reset",
                 qubitsAndBits({R::Input, R::Input, R::Ancilla}, 1),
                 {},
                 {}};
    F.Circuit.gate(RefGate::CCX, {0, 1, 2}).reset(2);
    // AND of two fair bits is 1 with probability 1/4: H2(1/4) = 0.811278
    // bits (Shannon 1948; value computed from the formula).
    F.Bits = {{0.811278, "H2(1/4)"}};
    Out.push_back(F);
  }
  {
    ClosedForm F{"measures of one input into one bit, then of another",
                 qubitsAndBits({R::Input, R::Input}, 1),
                 {},
                 {}};
    F.Circuit.measure(0, 0).measure(0, 0).measure(1, 0);
    // First: the bit is constant before, so no event and 0 bits. Second:
    // q and c hold the same fair bit before and after, H = 1 both times.
    // Third: two independent fair bits (H = 2) become one copied bit
    // (H = 1). Shannon 1948.
    F.Bits = {{0.0, "measure into a constant bit"},
              {0.0, "H(X, X) - H(X, X) = 0"},
              {1.0, "H(X, Y) - H(Y, Y) = 2 - 1"}};
    F.NotEvents = {0};
    Out.push_back(F);
  }
  {
    ClosedForm F{"reset conditioned on a measured copy",
                 qubitsAndBits({R::Input, R::Input}, 1),
                 {},
                 {}};
    F.Circuit.measure(0, 0).reset(0, RefCondition{0, 1}).measure(1, 0).reset(1);
    // A = {q0, c}: H(X, X) = 1 before and H(0, X) = 1 after, so the
    // conditioned reset removes nothing; the record in c keeps the bit.
    // Then c is overwritten with q1 (1 bit, as above) and q1 reset
    // unconditionally (1 bit). Shannon 1948.
    F.Bits = {{0.0, "measure into a constant bit"},
              {0.0, "H(X, X) - H(0, X) = 0"},
              {1.0, "H(Y, X) - H(Y, Y) = 2 - 1"},
              {1.0, "fair bit reset"}};
    F.NotEvents = {0};
    Out.push_back(F);
  }
  return Out;
}

// Checks that the reference reproduces the closed forms (sources beside
// each value in closedForms()).
TEST(ReferenceSelfCheck, ClosedForms) {
  for (const ClosedForm &F : closedForms()) {
    SCOPED_TRACE(F.Name);
    RefOutcome Ref = simulateDensity(F.Circuit);
    ASSERT_EQ(Ref.Events.size(), F.Bits.size());
    for (size_t I = 0; I < F.Bits.size(); ++I)
      EXPECT_NEAR(Ref.Events[I].Bits, F.Bits[I].first, 1e-6)
          << F.Bits[I].second;
    for (size_t I : F.NotEvents)
      EXPECT_EQ(Ref.Events[I].BitMinorityBefore, 0);
    if (F.Circuit.isReversible())
      expectSameOutcome(Ref, simulateClassical(F.Circuit));
  }
}

// Checks every engine on the closed forms: density exactly, classical
// exactly on the reversible ones, every engine soundly.
TEST(ReferenceClosedForm, EnginesReproduceThem) {
  for (const ClosedForm &F : closedForms()) {
    SCOPED_TRACE(F.Name);
    auto P = prepare(F.Circuit);
    ASSERT_TRUE(P);
    RefOutcome Ref = simulateDensity(F.Circuit);
    bool Reversible = F.Circuit.isReversible();
    for (auto [Choice, S] :
         {std::pair{sem::EngineChoice::Density, Strictness::Exact},
          std::pair{sem::EngineChoice::Classical,
                    Reversible ? Strictness::Exact : Strictness::Sound},
          std::pair{sem::EngineChoice::Structural, Strictness::Sound}}) {
      std::optional<sem::Ledger> L = runChoice(P->circuit(), Choice);
      ASSERT_TRUE(L);
      checkLedger(*L, *P, Ref, S);
      if (S != Strictness::Exact)
        continue;
      // The closed-form values themselves, event by event.
      size_t Next = 0;
      for (size_t I = 0; I < F.Bits.size(); ++I) {
        if (std::count(F.NotEvents.begin(), F.NotEvents.end(), I))
          continue;
        ASSERT_LT(Next, L->Events.size());
        EXPECT_NEAR(L->Events[Next].BitsLow, F.Bits[I].first, 1e-6)
            << F.Bits[I].second;
        EXPECT_NEAR(L->Events[Next].BitsHigh, F.Bits[I].first, 1e-6)
            << F.Bits[I].second;
        ++Next;
      }
    }
  }
}

// Checks that the structural engine proves a reset basis state constant
// by constant propagation (DESIGN.md, "Semantics tiers": x|0> = |1>).
TEST(ReferenceClosedForm, StructuralProvesBasisResetConstant) {
  RefCircuit C = qubitsAndBits({RefRole::Output}, 1);
  C.gate(RefGate::X, {0}).reset(0);
  auto P = prepare(C);
  ASSERT_TRUE(P);
  std::optional<sem::Ledger> L =
      runChoice(P->circuit(), sem::EngineChoice::Structural);
  ASSERT_TRUE(L);
  ASSERT_EQ(L->Events.size(), 1u);
  EXPECT_EQ(L->Events[0].Status, sem::ErasureStatus::Constant);
  EXPECT_EQ(L->Events[0].BitsHigh, 0.0);
}

// Checks that a reset whose condition never holds is no event for any
// engine: the operation never runs, so it is no operation and erases
// nothing (docs/erasures.md). The reference lists it with run probability 0
// and 0 bits; the reset after it erases a fair input bit.
TEST(ReferenceClosedForm, ResetThatNeverRunsIsNoEvent) {
  RefCircuit C = qubitsAndBits({RefRole::Input, RefRole::Input}, 1);
  C.reset(0, RefCondition{0, 1}).reset(1);
  RefOutcome Ref = simulateDensity(C);
  ASSERT_EQ(Ref.Events.size(), 2u);
  EXPECT_EQ(Ref.Events[0].RunProbability, 0.0);
  EXPECT_EQ(Ref.Events[0].Bits, 0.0);
  EXPECT_NEAR(Ref.Events[1].Bits, 1.0, 1e-12); // a fair bit
  auto P = prepare(C);
  ASSERT_TRUE(P);
  for (auto Choice :
       {sem::EngineChoice::Structural, sem::EngineChoice::Classical,
        sem::EngineChoice::Density}) {
    std::optional<sem::Ledger> L = runChoice(P->circuit(), Choice);
    ASSERT_TRUE(L);
    SCOPED_TRACE(sem::engineName(L->Engine));
    checkLedger(*L, *P, Ref, Strictness::Sound);
    // Every engine leaves the never-run reset out (docs/erasures.md: "An
    // operation that provably never runs ... is no event"), not even as a
    // 0-bit listing: only the reset of wire 1 remains.
    ASSERT_EQ(L->Events.size(), 1u);
    EXPECT_EQ(L->Events[0].Kind, sem::ErasureKind::Reset);
    EXPECT_EQ(L->Events[0].Wire, 1u);
  }
}

//===----------------------------------------------------------------------===//
// Random circuits against the engines.
//===----------------------------------------------------------------------===//

// Checks that the classical engine is exact on reversible circuits: every
// event's bits, the discard joint, every ancilla verdict, and every
// counterexample confirmed by the reference run on that basis input.
TEST(ReferenceCrossCheck, ClassicalIsExactOnReversibleCircuits) {
  const auto &Cases = reversibleCases();
  for (size_t I = 0; I < Cases.size(); ++I) {
    ASSERT_TRUE(Cases[I].P);
    SCOPED_TRACE(Cases[I].trace(I));
    std::optional<sem::Ledger> L =
        runChoice(Cases[I].P->circuit(), sem::EngineChoice::Classical);
    ASSERT_TRUE(L);
    EXPECT_EQ(L->Engine, sem::EngineKind::Classical);
    checkLedger(*L, *Cases[I].P, Cases[I].Ref, Strictness::Exact);
    if (::testing::Test::HasFailure())
      return; // one circuit's report is enough to read
  }
}

// Checks that the density engine is exact on the reversible circuits too.
TEST(ReferenceCrossCheck, DensityIsExactOnReversibleCircuits) {
  const auto &Cases = reversibleCases();
  for (size_t I = 0; I < Cases.size(); ++I) {
    ASSERT_TRUE(Cases[I].P);
    SCOPED_TRACE(Cases[I].trace(I));
    std::optional<sem::Ledger> L =
        runChoice(Cases[I].P->circuit(), sem::EngineChoice::Density);
    ASSERT_TRUE(L);
    EXPECT_EQ(L->Engine, sem::EngineKind::Density);
    checkLedger(*L, *Cases[I].P, Cases[I].Ref, Strictness::Exact);
    if (::testing::Test::HasFailure())
      return;
  }
}

// Checks that the structural engine's intervals hold the reference values.
TEST(ReferenceCrossCheck, StructuralIsSoundOnReversibleCircuits) {
  const auto &Cases = reversibleCases();
  for (size_t I = 0; I < Cases.size(); ++I) {
    ASSERT_TRUE(Cases[I].P);
    SCOPED_TRACE(Cases[I].trace(I));
    std::optional<sem::Ledger> L =
        runChoice(Cases[I].P->circuit(), sem::EngineChoice::Structural);
    ASSERT_TRUE(L);
    EXPECT_EQ(L->Engine, sem::EngineKind::Structural);
    checkLedger(*L, *Cases[I].P, Cases[I].Ref, Strictness::Sound);
    if (::testing::Test::HasFailure())
      return;
  }
}

// Checks that the density engine equals the reference on general circuits.
TEST(ReferenceCrossCheck, DensityIsExactOnGeneralCircuits) {
  const auto &Cases = generalCases();
  for (size_t I = 0; I < Cases.size(); ++I) {
    ASSERT_TRUE(Cases[I].P);
    SCOPED_TRACE(Cases[I].trace(I));
    std::optional<sem::Ledger> L =
        runChoice(Cases[I].P->circuit(), sem::EngineChoice::Density);
    ASSERT_TRUE(L);
    EXPECT_EQ(L->Engine, sem::EngineKind::Density);
    checkLedger(*L, *Cases[I].P, Cases[I].Ref, Strictness::Exact);
    if (::testing::Test::HasFailure())
      return;
  }
}

// Checks that the classical and structural engines stay sound on general
// circuits, where the classical engine over-approximates non-monomial
// gates.
TEST(ReferenceCrossCheck, ClassicalAndStructuralAreSoundOnGeneralCircuits) {
  const auto &Cases = generalCases();
  for (size_t I = 0; I < Cases.size(); ++I) {
    ASSERT_TRUE(Cases[I].P);
    SCOPED_TRACE(Cases[I].trace(I));
    for (auto Choice :
         {sem::EngineChoice::Classical, sem::EngineChoice::Structural}) {
      std::optional<sem::Ledger> L = runChoice(Cases[I].P->circuit(), Choice);
      ASSERT_TRUE(L);
      checkLedger(*L, *Cases[I].P, Cases[I].Ref, Strictness::Sound);
    }
    if (::testing::Test::HasFailure())
      return;
  }
}

/// Reversible circuits on 7 to 10 qubits, past the density reference:
/// the classical brute force is the reference.
const std::vector<RandomCase> &wideReversibleCases() {
  static const std::vector<RandomCase> Cases = [] {
    std::vector<RandomCase> Out;
    SplitMix Rng(0x77696465ULL);
    CircuitGenerator Gen(Rng, /*General=*/false);
    while (Out.size() < 40) {
      RefCircuit R = Gen.circuit(10);
      if (R.numQubits() < 7)
        continue;
      RandomCase Case;
      Case.P = prepare(R);
      Case.Ref = simulateClassical(R);
      Out.push_back(std::move(Case));
    }
    return Out;
  }();
  return Cases;
}

// Checks the classical engine against the classical brute force on wider
// reversible circuits (more BDD variables than the density reference can
// follow).
TEST(ReferenceCrossCheck, ClassicalIsExactOnWiderReversibleCircuits) {
  const auto &Cases = wideReversibleCases();
  for (size_t I = 0; I < Cases.size(); ++I) {
    ASSERT_TRUE(Cases[I].P);
    SCOPED_TRACE(Cases[I].trace(I));
    std::optional<sem::Ledger> L =
        runChoice(Cases[I].P->circuit(), sem::EngineChoice::Classical);
    ASSERT_TRUE(L);
    checkLedger(*L, *Cases[I].P, Cases[I].Ref, Strictness::Exact);
    std::optional<sem::Ledger> S =
        runChoice(Cases[I].P->circuit(), sem::EngineChoice::Structural);
    ASSERT_TRUE(S);
    checkLedger(*S, *Cases[I].P, Cases[I].Ref, Strictness::Sound);
    if (::testing::Test::HasFailure())
      return;
  }
}

// Checks that the engines stay sound where their limits make them give up
// exactness: a tiny BDD budget (sampling fallback), a joint entropy over
// at most one wire, calls over-approximated whole, few samples. Every
// fourth random circuit, every engine and Auto.
TEST(ReferenceCrossCheck, EnginesStaySoundUnderTightLimits) {
  struct Variant {
    const char *Name;
    sem::EngineOptions Opts;
  };
  std::vector<Variant> Variants(4);
  Variants[0].Name = "MaxBddNodes = 64";
  Variants[0].Opts.MaxBddNodes = 64;
  Variants[1].Name = "MaxJointWires = 1";
  Variants[1].Opts.MaxJointWires = 1;
  Variants[2].Name = "MaxExpandedOps = 3";
  Variants[2].Opts.MaxExpandedOps = 3;
  Variants[3].Name = "Samples = 16";
  Variants[3].Opts.Samples = 16;
  for (const Variant &V : Variants) {
    SCOPED_TRACE(V.Name);
    for (const auto *Cases : {&reversibleCases(), &generalCases()}) {
      for (size_t I = 0; I < Cases->size(); I += 4) {
        const RandomCase &Case = (*Cases)[I];
        ASSERT_TRUE(Case.P);
        SCOPED_TRACE(Case.trace(I));
        for (auto Choice :
             {sem::EngineChoice::Structural, sem::EngineChoice::Classical,
              sem::EngineChoice::Density, sem::EngineChoice::Auto}) {
          std::optional<sem::Ledger> L =
              runChoice(Case.P->circuit(), Choice, V.Opts);
          ASSERT_TRUE(L);
          checkLedger(*L, *Case.P, Case.Ref, Strictness::Sound);
        }
        if (::testing::Test::HasFailure())
          return;
      }
    }
  }
}

// Checks the discard joint of an entangled pair when the engines may not
// compute it exactly: the two halves of a Bell pair have 1 bit each, but
// the pair is pure, so the joint entropy is 0 (common practice; Araki &
// Lieb, Commun. Math. Phys. 18, 160 (1970): S(AB) >= |S(A) - S(B)| is the
// only lower bound from the marginals). So the largest marginal is no
// lower bound on a quantum joint entropy.
TEST(ReferenceCrossCheck, JointFallbackIsSoundForEntangledDiscards) {
  RefCircuit C = qubitsAndBits({RefRole::Garbage, RefRole::Garbage}, 1);
  C.gate(RefGate::H, {0}).gate(RefGate::CX, {0, 1});
  RefOutcome Ref = simulateDensity(C);
  EXPECT_NEAR(Ref.DiscardMarginal[0], 1.0, 1e-12);
  EXPECT_NEAR(Ref.DiscardMarginal[1], 1.0, 1e-12);
  EXPECT_NEAR(Ref.DiscardJoint, 0.0, 1e-12);
  auto P = prepare(C);
  ASSERT_TRUE(P);
  sem::EngineOptions Opts;
  Opts.MaxJointWires = 1;
  for (auto Choice :
       {sem::EngineChoice::Structural, sem::EngineChoice::Classical,
        sem::EngineChoice::Density, sem::EngineChoice::Auto}) {
    std::optional<sem::Ledger> L = runChoice(P->circuit(), Choice, Opts);
    ASSERT_TRUE(L);
    checkLedger(*L, *P, Ref, Strictness::Sound);
  }
}

//===----------------------------------------------------------------------===//
// Auto.
//===----------------------------------------------------------------------===//

/// Whether anything in the circuit can erase: a reset, a measure, a
/// discarded qubit.
/// Whether any event is possible: a reset, a discarded qubit, or a bit
/// measured into a second time (the first measure into a bit overwrites a
/// known 0, which removes nothing).
bool canErase(const RefCircuit &R) {
  if (!R.discardedQubits().empty())
    return true;
  std::set<unsigned> Written;
  for (const RefOp &O : R.Ops) {
    if (O.Kind == RefOpKind::Reset)
      return true;
    if (O.Kind == RefOpKind::Measure && !Written.insert(O.Bit).second)
      return true;
  }
  return false;
}

// Checks that Auto runs the classical engine on reversible circuits (it
// decides everything there) and that its ledger is the exact one.
TEST(ReferenceAuto, PicksClassicalForReversibleCircuits) {
  const auto &Cases = reversibleCases();
  for (size_t I = 0; I < Cases.size(); I += 5) {
    ASSERT_TRUE(Cases[I].P);
    SCOPED_TRACE(Cases[I].trace(I));
    std::optional<sem::Ledger> L =
        runChoice(Cases[I].P->circuit(), sem::EngineChoice::Auto);
    ASSERT_TRUE(L);
    EXPECT_FALSE(L->Reason.empty());
    // With no reset, measure or discard there is nothing to decide, and
    // any engine's (empty) ledger will do.
    if (canErase(Cases[I].P->Ref)) {
      EXPECT_EQ(L->Engine, sem::EngineKind::Classical) << L->Reason;
    }
    checkLedger(*L, *Cases[I].P, Cases[I].Ref, Strictness::Exact);
    if (::testing::Test::HasFailure())
      return;
  }
}

// Checks that Auto runs the density engine on small general circuits whose
// erasures the classical engine cannot decide, and that a general circuit
// it answers classically is one the classical engine decided exactly.
TEST(ReferenceAuto, PicksDensityForSmallGeneralCircuits) {
  RefCircuit C = qubitsAndBits({RefRole::Output, RefRole::Output}, 1);
  C.gate(RefGate::RY, {0}, 0.7).gate(RefGate::CX, {0, 1}).reset(1);
  auto P = prepare(C);
  ASSERT_TRUE(P);
  std::optional<sem::Ledger> L =
      runChoice(P->circuit(), sem::EngineChoice::Auto);
  ASSERT_TRUE(L);
  EXPECT_EQ(L->Engine, sem::EngineKind::Density) << L->Reason;
  checkLedger(*L, *P, simulateDensity(C), Strictness::Exact);

  const auto &Cases = generalCases();
  unsigned Density = 0;
  for (size_t I = 0; I < Cases.size(); ++I) {
    ASSERT_TRUE(Cases[I].P);
    SCOPED_TRACE(Cases[I].trace(I));
    L = runChoice(Cases[I].P->circuit(), sem::EngineChoice::Auto);
    ASSERT_TRUE(L);
    if (L->Engine == sem::EngineKind::Density) {
      ++Density;
      checkLedger(*L, *Cases[I].P, Cases[I].Ref, Strictness::Exact);
    } else if (!canErase(Cases[I].P->Ref)) {
      EXPECT_TRUE(L->Events.empty());
    } else {
      // Auto keeps a classical ledger only when it decided everything
      // (Engines.h): then each decided figure must be the reference's.
      EXPECT_EQ(L->Engine, sem::EngineKind::Classical) << L->Reason;
      checkLedger(*L, *Cases[I].P, Cases[I].Ref, Strictness::Sound);
      for (const sem::ErasureEvent &E : L->Events) {
        if (E.Kind != sem::ErasureKind::Discard) {
          EXPECT_NE(E.Status, sem::ErasureStatus::Unknown);
        }
      }
      for (const sem::AncillaVerdict &V : L->Ancillas)
        EXPECT_TRUE(V.Clean.has_value());
    }
    if (::testing::Test::HasFailure())
      return;
  }
  EXPECT_GE(Density, 30u);
}

// Checks that Auto falls back to the classical engine when a general
// circuit is wider than the density engine may go, and that asking for
// the density engine then is an error that names the limit.
TEST(ReferenceAuto, FallsBackWhenTooWideForDensity) {
  RefCircuit C = qubitsAndBits(
      {RefRole::Output, RefRole::Output, RefRole::Output, RefRole::Output}, 1);
  C.gate(RefGate::RY, {0}, 0.7)
      .gate(RefGate::CX, {0, 1})
      .gate(RefGate::CX, {1, 2})
      .gate(RefGate::CX, {2, 3})
      .reset(3);
  auto P = prepare(C);
  ASSERT_TRUE(P);
  sem::EngineOptions Opts;
  Opts.MaxDensityQubits = 3;
  std::optional<sem::Ledger> L =
      runChoice(P->circuit(), sem::EngineChoice::Auto, Opts);
  ASSERT_TRUE(L);
  EXPECT_EQ(L->Engine, sem::EngineKind::Classical) << L->Reason;
  checkLedger(*L, *P, simulateDensity(C), Strictness::Sound);

  Opts.Choice = sem::EngineChoice::Density;
  llvm::Expected<sem::Ledger> D = sem::runEngine(P->circuit(), Opts);
  ASSERT_FALSE(bool(D));
  EXPECT_NE(llvm::toString(D.takeError()).find('3'), std::string::npos);
}

//===----------------------------------------------------------------------===//
// Published constructions.
//===----------------------------------------------------------------------===//

/// Bennett's compute-copy-uncompute (Bennett, IBM J. Res. Dev. 17, 525
/// (1973)) for the AND of K inputs x, computed by a Toffoli ladder into
/// the K - 1 ancillas a (a_0 = x_0 x_1, a_j = a_{j-1} x_{j+1}), copied into
/// out with a CNOT; then either uncomputed (the ladder in reverse) or, the
/// variant, reset.
RefCircuit bennettAnd(unsigned K, bool ResetInstead) {
  RefCircuit C;
  C.QRegs = {{"x", K}, {"a", K - 1}, {"out", 1}};
  for (unsigned I = 0; I < K; ++I)
    C.Roles.push_back(RefRole::Input);
  for (unsigned I = 0; I + 1 < K; ++I)
    C.Roles.push_back(RefRole::Ancilla);
  C.Roles.push_back(RefRole::Output);
  auto X = [](unsigned I) { return I; };
  auto A = [K](unsigned J) { return K + J; };
  const unsigned Out = 2 * K - 1;
  RefCircuit Tmp;
  Tmp.gate(RefGate::CCX, {X(0), X(1), A(0)});
  for (unsigned J = 1; J + 1 < K; ++J)
    Tmp.gate(RefGate::CCX, {A(J - 1), X(J + 1), A(J)});
  C.Ops = Tmp.Ops;
  C.gate(RefGate::CX, {A(K - 2), Out});
  if (ResetInstead) {
    for (unsigned J = K - 1; J-- > 0;)
      C.reset(A(J));
  } else {
    for (size_t I = Tmp.Ops.size(); I-- > 0;)
      C.Ops.push_back(Tmp.Ops[I]);
  }
  return C;
}

// Checks, computed here by brute force, that the construction computes the
// AND into out and leaves x unchanged, then that the engines find it
// leaves every ancilla clean and erases nothing (Bennett 1973).
TEST(PublishedBennett, ComputeCopyUncomputeErasesNothing) {
  for (unsigned K = 2; K <= 5; ++K) {
    SCOPED_TRACE(fmt::format("AND of {} inputs", K));
    RefCircuit R = bennettAnd(K, false);
    for (uint64_t V = 0; V < (uint64_t(1) << K); ++V) {
      BasisInput In;
      for (unsigned I = 0; I < K; ++I)
        In[I] = (V >> I) & 1;
      RefOutcome O = simulateClassical(R, In);
      EXPECT_EQ(O.ProbOne[2 * K - 1], V == (uint64_t(1) << K) - 1 ? 1.0 : 0.0);
      for (unsigned I = 0; I < K; ++I)
        EXPECT_EQ(O.ProbOne[I], double((V >> I) & 1));
    }
    RefOutcome Ref = simulateClassical(R);
    if (R.numQubits() <= 6)
      expectSameOutcome(Ref, simulateDensity(R));
    for (unsigned Q : R.qubitsWithRole(RefRole::Ancilla))
      EXPECT_EQ(Ref.ProbOne[Q], 0.0);

    auto P = prepare(R);
    ASSERT_TRUE(P);
    for (auto Choice : {sem::EngineChoice::Auto, sem::EngineChoice::Classical,
                        sem::EngineChoice::Density}) {
      std::optional<sem::Ledger> L = runChoice(P->circuit(), Choice);
      ASSERT_TRUE(L);
      if (Choice == sem::EngineChoice::Auto) {
        EXPECT_EQ(L->Engine, sem::EngineKind::Classical) << L->Reason;
      }
      checkLedger(*L, *P, Ref, Strictness::Exact);
      // Bennett 1973: nothing erased, every ancilla restored.
      EXPECT_TRUE(L->Events.empty());
      EXPECT_EQ(L->Ancillas.size(), K - 1);
      for (const sem::AncillaVerdict &V : L->Ancillas)
        EXPECT_EQ(V.Clean, std::optional<bool>(true));
      EXPECT_EQ(sem::totals(*L).Entropy.High, 0.0);
    }
  }
}

// Checks the variant that resets the ancillas instead of uncomputing: one
// reset per ancilla, each removing the marginal entropy of an AND of j + 2
// fair bits, H2(2^-(j+2)) (Shannon 1948), which the brute force reproduces;
// the ancillas then end clean.
TEST(PublishedBennett, ResetInsteadChargesEachAncilla) {
  for (unsigned K = 2; K <= 5; ++K) {
    SCOPED_TRACE(fmt::format("AND of {} inputs", K));
    RefCircuit R = bennettAnd(K, true);
    RefOutcome Ref = simulateClassical(R);
    if (R.numQubits() <= 6)
      expectSameOutcome(Ref, simulateDensity(R));
    ASSERT_EQ(Ref.Events.size(), K - 1);
    for (const RefEvent &E : Ref.Events) {
      unsigned J = E.Wire - K;
      EXPECT_NEAR(E.Bits, binaryEntropyBits(std::ldexp(1.0, -int(J + 2))),
                  1e-12);
    }
    auto P = prepare(R);
    ASSERT_TRUE(P);
    std::vector<sem::EngineChoice> Choices = {sem::EngineChoice::Auto,
                                              sem::EngineChoice::Classical};
    if (R.numQubits() <= 6)
      Choices.push_back(sem::EngineChoice::Density);
    for (auto Choice : Choices) {
      std::optional<sem::Ledger> L = runChoice(P->circuit(), Choice);
      ASSERT_TRUE(L);
      checkLedger(*L, *P, Ref, Strictness::Exact);
      EXPECT_EQ(L->Events.size(), K - 1);
      for (const sem::AncillaVerdict &V : L->Ancillas)
        EXPECT_EQ(V.Clean, std::optional<bool>(true));
    }
    std::optional<sem::Ledger> S =
        runChoice(P->circuit(), sem::EngineChoice::Structural);
    ASSERT_TRUE(S);
    checkLedger(*S, *P, Ref, Strictness::Sound);
  }
}

/// The Cuccaro et al. ripple-carry adder (arXiv:quant-ph/0410184), written
/// as tests/corpus/PublishedConstructionsTest.cpp writes it: MAJ and UMA as
/// gates `majority` and `unmaj`. Qubits cin[1], a[n], b[n], cout[1]; cin
/// is the carry-in ancilla, a and b the inputs. With `Drop`, the
/// uncompute half is written gate by gate with its gate number Drop left
/// out.
struct Adder {
  RefCircuit Ref;
  std::string Text;
};

Adder cuccaroAdder(unsigned N, std::optional<unsigned> Drop = std::nullopt) {
  Adder A;
  RefCircuit &R = A.Ref;
  R.QRegs = {{"cin", 1}, {"a", N}, {"b", N}, {"cout", 1}};
  R.Roles.push_back(RefRole::Ancilla);
  for (unsigned I = 0; I < 2 * N; ++I)
    R.Roles.push_back(RefRole::Input);
  R.Roles.push_back(RefRole::Output);
  auto Ai = [](unsigned I) { return 1 + I; };
  auto Bi = [N](unsigned I) { return 1 + N + I; };
  const unsigned Cin = 0, Cout = 2 * N + 1;
  auto Name = [&](unsigned Q) { return RefCircuit::wireName(R.QRegs, Q); };

  std::string &S = A.Text;
  S = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
      "gate majority a,b,c { cx c,b; cx c,a; ccx a,b,c; }\n"
      "gate unmaj a,b,c { ccx a,b,c; cx c,a; cx a,b; }\n";
  S += fmt::format("qreg cin[1];\nqreg a[{0}];\nqreg b[{0}];\nqreg cout[1];\n",
                   N);
  auto Majority = [&](unsigned X, unsigned Y, unsigned Z) {
    S += fmt::format("majority {},{},{};\n", Name(X), Name(Y), Name(Z));
    R.gate(RefGate::CX, {Z, Y})
        .gate(RefGate::CX, {Z, X})
        .gate(RefGate::CCX, {X, Y, Z});
  };
  unsigned UncomputeGate = 0;
  auto Flat = [&](RefGate G, std::vector<unsigned> Qs) {
    if (UncomputeGate++ == Drop)
      return;
    S += refGateName(G);
    for (size_t I = 0; I < Qs.size(); ++I)
      S += (I ? "," : " ") + Name(Qs[I]);
    S += ";\n";
    R.gate(G, Qs);
  };
  auto Unmaj = [&](unsigned X, unsigned Y, unsigned Z) {
    if (Drop) {
      Flat(RefGate::CCX, {X, Y, Z});
      Flat(RefGate::CX, {Z, X});
      Flat(RefGate::CX, {X, Y});
      return;
    }
    S += fmt::format("unmaj {},{},{};\n", Name(X), Name(Y), Name(Z));
    R.gate(RefGate::CCX, {X, Y, Z})
        .gate(RefGate::CX, {Z, X})
        .gate(RefGate::CX, {X, Y});
  };

  Majority(Cin, Bi(0), Ai(0));
  for (unsigned I = 1; I < N; ++I)
    Majority(Ai(I - 1), Bi(I), Ai(I));
  S += fmt::format("cx {},{};\n", Name(Ai(N - 1)), Name(Cout));
  R.gate(RefGate::CX, {Ai(N - 1), Cout});
  for (unsigned I = N - 1; I >= 1; --I)
    Unmaj(Ai(I - 1), Bi(I), Ai(I));
  Unmaj(Cin, Bi(0), Ai(0));
  return A;
}

// Checks, computed here by brute force, that the construction adds (a + b
// into b, the carry into cout, a and cin restored: Cuccaro et al.), and
// that the engines prove the carry-in ancilla clean with nothing erased.
TEST(PublishedCuccaro, AdderReturnsCarryInClean) {
  for (unsigned N = 1; N <= 6; ++N) {
    SCOPED_TRACE(fmt::format("n = {}", N));
    Adder A = cuccaroAdder(N);
    const RefCircuit &R = A.Ref;
    for (uint64_t X = 0; X < (uint64_t(1) << N); ++X)
      for (uint64_t Y = 0; Y < (uint64_t(1) << N); ++Y) {
        BasisInput In;
        for (unsigned I = 0; I < N; ++I) {
          In[1 + I] = (X >> I) & 1;
          In[1 + N + I] = (Y >> I) & 1;
        }
        RefOutcome O = simulateClassical(R, In);
        uint64_t AOut = 0, BOut = 0;
        for (unsigned I = 0; I < N; ++I) {
          AOut |= uint64_t(O.ProbOne[1 + I]) << I;
          BOut |= uint64_t(O.ProbOne[1 + N + I]) << I;
        }
        uint64_t Sum = X + Y;
        ASSERT_EQ(AOut, X);
        ASSERT_EQ(BOut, Sum & ((uint64_t(1) << N) - 1));
        ASSERT_EQ(O.ProbOne[2 * N + 1], double(Sum >> N));
        ASSERT_EQ(O.ProbOne[0], 0.0);
      }
    RefOutcome Ref = simulateClassical(R);
    if (R.numQubits() <= 6)
      expectSameOutcome(Ref, simulateDensity(R));

    auto P = prepare(R, A.Text);
    ASSERT_TRUE(P);
    for (auto Choice :
         {sem::EngineChoice::Auto, sem::EngineChoice::Classical}) {
      std::optional<sem::Ledger> L = runChoice(P->circuit(), Choice);
      ASSERT_TRUE(L);
      EXPECT_EQ(L->Engine, sem::EngineKind::Classical) << L->Reason;
      checkLedger(*L, *P, Ref, Strictness::Exact);
      EXPECT_TRUE(L->Events.empty());
      ASSERT_EQ(L->Ancillas.size(), 1u);
      EXPECT_EQ(L->Ancillas[0].Qubit, 0u);
      EXPECT_EQ(L->Ancillas[0].Clean, std::optional<bool>(true));
    }
  }
}

// Checks the adder with each single gate of its uncompute half removed:
// the engines' verdict on cin matches the brute force, each counterexample
// really leaves cin at 1; and removing UMA_0's CNOT back into cin (the
// `cx c,a` of unmaj) leaves cin dirty.
TEST(PublishedCuccaro, MissingUncomputeGateLeavesCarryInDirty) {
  for (unsigned N = 1; N <= 6; ++N) {
    SCOPED_TRACE(fmt::format("n = {}", N));
    for (unsigned Drop = 0; Drop < 3 * N; ++Drop) {
      SCOPED_TRACE(fmt::format("uncompute gate {} removed", Drop));
      Adder A = cuccaroAdder(N, Drop);
      RefOutcome Ref = simulateClassical(A.Ref);
      if (A.Ref.numQubits() <= 6)
        expectSameOutcome(Ref, simulateDensity(A.Ref));
      const unsigned CinBack = 3 * N - 2; // UMA_0 is the last three gates
      if (Drop == CinBack) {
        EXPECT_GT(Ref.ProbOne[0], 0.0);
      }
      auto P = prepare(A.Ref, A.Text);
      ASSERT_TRUE(P);
      std::optional<sem::Ledger> L =
          runChoice(P->circuit(), sem::EngineChoice::Classical);
      ASSERT_TRUE(L);
      checkLedger(*L, *P, Ref, Strictness::Exact);
      if (Drop == CinBack) {
        ASSERT_EQ(L->Ancillas.size(), 1u);
        EXPECT_EQ(L->Ancillas[0].Clean, std::optional<bool>(false));
        EXPECT_TRUE(L->Ancillas[0].HasCounterexample);
      }
      if (::testing::Test::HasFailure())
        return;
    }
  }
}

} // namespace
} // namespace revbound
