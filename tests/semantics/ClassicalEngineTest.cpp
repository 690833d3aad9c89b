//===- ClassicalEngineTest.cpp - Wires as Boolean functions of the inputs -===//
//
// The classical engine against closed forms of information theory, against
// published constructions, and against a brute-force reference written here
// (a basis-value simulator over every input assignment), which shares no
// code with the engine.
//
//===----------------------------------------------------------------------===//
#include "TestSupport.h"

#include "revbound/semantics/Engines.h"

#include <gtest/gtest.h>

#include <fmt/format.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <map>
#include <random>
#include <sstream>

#if defined(__GLIBC__)
#include <malloc.h>
#endif

using namespace revbound;
using namespace revbound::semantics;

namespace {

/// A program with roles set by register name (the rest are outputs).
test::Elaborated withRoles(const std::string &Text,
                           const std::map<std::string, ir::WireRole> &Roles) {
  test::Elaborated E = test::elaborate(Text);
  if (!E.Circuit) {
    ADD_FAILURE() << E.Error;
    return E;
  }
  ir::Circuit &C = *E.Circuit;
  C.QubitRoles.assign(C.NumQubits, ir::WireRole::Output);
  C.QubitRoleLocs.assign(C.NumQubits, llvm::SMLoc());
  for (const ir::Register &R : C.QRegs)
    if (auto It = Roles.find(R.Name); It != Roles.end())
      for (uint32_t I = 0; I < R.Size; ++I)
        C.QubitRoles[R.Offset + I] = It->second;
  return E;
}

const std::string Header = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n";
constexpr ir::WireRole Input = ir::WireRole::Input;
constexpr ir::WireRole Ancilla = ir::WireRole::Ancilla;
constexpr ir::WireRole Garbage = ir::WireRole::Garbage;

// Binary entropy H2(1/4) = 2 - (3/4) log2 3 (Shannon, Bell Syst. Tech. J.
// 27, 379 (1948)).
const double H2Quarter = 2 - 0.75 * std::log2(3.0);

//===----------------------------------------------------------------------===//
// The brute-force reference: basis values, every input assignment
//===----------------------------------------------------------------------===//

/// One run of the circuit on basis values. Gates are x, cx, ccx, swap and
/// cswap, or user gates built from them (expanded here by their bodies).
struct ReferenceRun {
  const ir::Circuit &C;
  std::vector<bool> Q, B;
  /// A reset or measure: the wire that loses its value (the qubit, or the
  /// bit), its value before, and the values of the erased set A before and
  /// after, A = that wire (and the measured qubit), then the condition's
  /// bits.
  struct Erasure {
    ErasureKind Kind;
    uint32_t Wire;
    bool WireBefore;
    bool Ran;
    std::vector<bool> Before, After;
  };
  std::vector<Erasure> Erasures; // program order

  ReferenceRun(const ir::Circuit &C, const std::vector<bool> &Inputs)
      : C(C), Q(C.NumQubits, false), B(C.NumClbits, false) {
    size_t Next = 0;
    for (uint32_t I = 0; I < C.NumQubits; ++I)
      if (C.role(I) == Input)
        Q[I] = Inputs[Next++];
    for (const ir::Op &O : C.Ops)
      run(O);
  }

  void gate(ir::GateId G, const std::vector<uint32_t> &W) {
    const ir::GateDef &D = C.gate(G);
    if (D.Name == "x") {
      Q[W[0]] = !Q[W[0]];
    } else if (D.Name == "cx" || D.Name == "CX") {
      Q[W[1]] = Q[W[1]] != Q[W[0]];
    } else if (D.Name == "ccx") {
      Q[W[2]] = Q[W[2]] != (Q[W[0]] && Q[W[1]]);
    } else if (D.Name == "swap" || (D.Name == "cswap" && Q[W[0]])) {
      size_t A = D.Name == "swap" ? 0 : 1;
      bool T = Q[W[A]];
      Q[W[A]] = Q[W[A + 1]];
      Q[W[A + 1]] = T;
    } else if (D.Name != "cswap") {
      ASSERT_TRUE(D.hasBody()) << "the reference has no rule for " << D.Name;
      for (const ir::BodyOp &Op : D.Body) {
        if (Op.IsBarrier)
          continue;
        std::vector<uint32_t> Sub;
        for (uint32_t L : Op.Qubits)
          Sub.push_back(W[L]);
        gate(Op.Callee, Sub);
      }
    }
  }

  std::vector<uint32_t> conditionBits(const ir::Op &O) const {
    std::vector<uint32_t> Out;
    if (O.Cond == ir::NoCondition)
      return Out;
    const ir::Register &R = C.CRegs[C.Conditions[O.Cond].CReg];
    for (uint32_t I = 0; I < R.Size; ++I)
      Out.push_back(R.Offset + I);
    return Out;
  }

  bool conditionHolds(const ir::Op &O) const {
    if (O.Cond == ir::NoCondition)
      return true;
    const ir::Condition &Cd = C.Conditions[O.Cond];
    if (Cd.Unsatisfiable)
      return false;
    std::vector<uint32_t> Bits = conditionBits(O);
    for (size_t I = 0; I < Bits.size(); ++I)
      if (B[Bits[I]] != Cd.Value[unsigned(I)])
        return false;
    return true;
  }

  std::vector<bool> erasedSet(const ir::Op &O) const {
    llvm::ArrayRef<uint32_t> W = C.wires(O);
    std::vector<bool> A{Q[W[0]]};
    if (O.Kind == ir::OpKind::Measure)
      A.push_back(B[W[1]]);
    for (uint32_t Bit : conditionBits(O))
      if (O.Kind != ir::OpKind::Measure || Bit != W[1])
        A.push_back(B[Bit]);
    return A;
  }

  void run(const ir::Op &O) {
    if (O.Kind == ir::OpKind::Barrier)
      return;
    bool Runs = conditionHolds(O);
    bool Erases = O.Kind != ir::OpKind::Gate;
    llvm::ArrayRef<uint32_t> W = C.wires(O);
    Erasure Er;
    if (Erases) {
      bool IsReset = O.Kind == ir::OpKind::Reset;
      Er.Kind = IsReset ? ErasureKind::Reset : ErasureKind::Overwrite;
      Er.Wire = IsReset ? W[0] : W[1];
      Er.WireBefore = IsReset ? Q[W[0]] : B[W[1]];
      Er.Ran = Runs;
      Er.Before = erasedSet(O);
    }
    if (Runs && O.Kind == ir::OpKind::Gate)
      gate(O.Gate, W.vec());
    if (Runs && O.Kind == ir::OpKind::Reset)
      Q[W[0]] = false;
    if (Runs && O.Kind == ir::OpKind::Measure)
      B[W[1]] = Q[W[0]];
    if (Erases) {
      Er.After = erasedSet(O);
      Erasures.push_back(Er);
    }
  }
};

uint32_t countInputs(const ir::Circuit &C) {
  uint32_t N = 0;
  for (uint32_t I = 0; I < C.NumQubits; ++I)
    N += C.role(I) == Input;
  return N;
}

/// Every input assignment, the I-th input qubit (in index order) from bit I.
std::vector<ReferenceRun> allRuns(const ir::Circuit &C) {
  uint32_t K = countInputs(C);
  std::vector<ReferenceRun> Runs;
  for (uint64_t X = 0; X < (uint64_t(1) << K); ++X) {
    std::vector<bool> In;
    for (uint32_t I = 0; I < K; ++I)
      In.push_back(X >> I & 1);
    Runs.emplace_back(C, In);
  }
  return Runs;
}

/// Shannon entropy of the patterns, each run equally likely.
double entropyOf(const std::vector<std::vector<bool>> &Patterns) {
  std::map<std::vector<bool>, double> Counts;
  for (const std::vector<bool> &P : Patterns)
    Counts[P] += 1;
  double H = 0;
  for (const auto &[P, N] : Counts) {
    double Pr = N / double(Patterns.size());
    H -= Pr * std::log2(Pr);
  }
  return H;
}

/// The events the engine must find, from every run: resets and overwrites
/// with max(0, H(A before) - H(A after)), constant when the erased wire
/// holds one value in every run (an overwrite of such a bit is no event,
/// nor is an operation that runs in no run), then the discards with their
/// marginals.
std::vector<ErasureEvent> referenceEvents(const ir::Circuit &C,
                                          const std::vector<ReferenceRun> &Runs) {
  std::vector<ErasureEvent> Out;
  for (size_t I = 0; I < Runs[0].Erasures.size(); ++I) {
    std::vector<std::vector<bool>> Before, After, Wire;
    bool EverRuns = false;
    for (const ReferenceRun &R : Runs) {
      EverRuns |= R.Erasures[I].Ran;
      Before.push_back(R.Erasures[I].Before);
      After.push_back(R.Erasures[I].After);
      Wire.push_back({R.Erasures[I].WireBefore});
    }
    ErasureEvent E;
    E.Kind = Runs[0].Erasures[I].Kind;
    E.Wire = Runs[0].Erasures[I].Wire;
    bool Constant = entropyOf(Wire) == 0;
    if (!EverRuns || (Constant && E.Kind == ErasureKind::Overwrite))
      continue;
    E.Status = Constant ? ErasureStatus::Constant : ErasureStatus::Exact;
    E.BitsLow = E.BitsHigh =
        Constant ? 0 : std::max(0.0, entropyOf(Before) - entropyOf(After));
    Out.push_back(E);
  }
  for (uint32_t Q = 0; Q < C.NumQubits; ++Q) {
    if (!ir::isDiscarded(C.role(Q)))
      continue;
    std::vector<std::vector<bool>> End;
    bool AnyOne = false, AnyZero = false;
    for (const ReferenceRun &R : Runs) {
      End.push_back({R.Q[Q]});
      (R.Q[Q] ? AnyOne : AnyZero) = true;
    }
    if (!AnyOne)
      continue;
    ErasureEvent E;
    E.Kind = ErasureKind::Discard;
    E.Wire = Q;
    E.Status = AnyZero ? ErasureStatus::Exact : ErasureStatus::Constant;
    E.BitsLow = E.BitsHigh = entropyOf(End);
    Out.push_back(E);
  }
  return Out;
}

/// The final value of qubit Q under the counterexample's inputs.
bool endsAtOne(const ir::Circuit &C, const AncillaVerdict &V) {
  std::vector<bool> In;
  uint32_t Next = 0;
  for (uint32_t I = 0; I < C.NumQubits; ++I) {
    if (C.role(I) != Input)
      continue;
    EXPECT_LT(Next, V.Counterexample.size());
    if (Next >= V.Counterexample.size())
      return false;
    EXPECT_EQ(V.Counterexample[Next].first, I); // every input, index order
    In.push_back(V.Counterexample[Next++].second);
  }
  EXPECT_EQ(Next, V.Counterexample.size());
  return ReferenceRun(C, In).Q[V.Qubit];
}

const ErasureEvent *onlyEvent(const Ledger &L) {
  EXPECT_EQ(L.Events.size(), 1u);
  return L.Events.empty() ? nullptr : &L.Events[0];
}

/// The status of the ledger's only event (Unknown, after a failure, when
/// there is none).
ErasureStatus onlyStatus(const Ledger &L) {
  const ErasureEvent *E = onlyEvent(L);
  return E ? E->Status : ErasureStatus::Unknown;
}

//===----------------------------------------------------------------------===//
// Closed forms
//===----------------------------------------------------------------------===//

// Checks that resetting the AND of two uniform bits removes H2(1/4) bits:
// the ancilla is 1 with probability 1/4 (Shannon 1948).
TEST(ClassicalEngine, ResetOfToffoliOfTwoInputsRemovesH2OfAQuarter) {
  test::Elaborated E = withRoles(Header + "qreg a[2];\nqreg anc[1];\n"
                                          "ccx a[0],a[1],anc[0];\n"
                                          "reset anc[0];\n",
                                 {{"a", Input}, {"anc", Ancilla}});
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  EXPECT_EQ(L.Engine, EngineKind::Classical);
  const ErasureEvent *R = onlyEvent(L);
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Kind, ErasureKind::Reset);
  EXPECT_EQ(R->Wire, 2u);
  EXPECT_EQ(R->Status, ErasureStatus::Exact);
  EXPECT_NEAR(R->BitsLow, 0.811278, 1e-6);
  EXPECT_NEAR(R->BitsLow, H2Quarter, 1e-12);
  EXPECT_EQ(R->BitsHigh, R->BitsLow);
  ASSERT_EQ(L.Ancillas.size(), 1u);
  EXPECT_EQ(L.Ancillas[0].Clean, std::optional<bool>(true)); // reset to |0>
  EXPECT_TRUE(L.DiscardJoint.Exact);
  EXPECT_EQ(L.DiscardJoint.High, 0);
  EXPECT_TRUE(L.Notes.empty());
}

// Checks that resetting a copy of a uniform input removes one bit
// (H2(1/2) = 1, Shannon 1948; Landauer's one bit per erased random bit).
TEST(ClassicalEngine, ResetOfACopiedInputRemovesOneBit) {
  test::Elaborated E = withRoles(Header + "qreg in[1];\nqreg anc[1];\n"
                                          "cx in[0],anc[0];\nreset anc[0];\n",
                                 {{"in", Input}, {"anc", Ancilla}});
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  const ErasureEvent *R = onlyEvent(L);
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Status, ErasureStatus::Exact);
  EXPECT_DOUBLE_EQ(R->BitsLow, 1.0);
  EXPECT_DOUBLE_EQ(R->BitsHigh, 1.0);
}

// Checks that resetting a qubit that holds a known basis value erases
// nothing: |0> as declared, and |1> after an x (a pure state has zero
// entropy, common practice).
TEST(ClassicalEngine, ResetOfAKnownValueIsConstant) {
  test::Elaborated E = withRoles(Header + "qreg q[2];\nreset q[0];\n"
                                          "x q[1];\nreset q[1];\n",
                                 {});
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  ASSERT_EQ(L.Events.size(), 2u);
  for (const ErasureEvent &R : L.Events) {
    EXPECT_EQ(R.Status, ErasureStatus::Constant);
    EXPECT_EQ(R.BitsLow, 0);
    EXPECT_EQ(R.BitsHigh, 0);
  }
}

// Checks the overwrite rule H(q, c) - H(q) = H(c | q) (Shannon's chain
// rule): writing a fresh bit into a known 0 erases nothing (no event),
// overwriting an independent uniform bit erases 1 bit, and measuring the
// same qubit again erases 0 bits.
TEST(ClassicalEngine, MeasuringTheSameQubitTwiceOverwritesNothing) {
  test::Elaborated E = withRoles(Header + "qreg q[2];\ncreg c[1];\n"
                                          "measure q[1] -> c[0];\n"
                                          "measure q[0] -> c[0];\n"
                                          "measure q[0] -> c[0];\n",
                                 {{"q", Input}});
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  ASSERT_EQ(L.Events.size(), 2u);
  EXPECT_EQ(L.Events[0].Kind, ErasureKind::Overwrite);
  EXPECT_EQ(L.Events[0].Wire, 0u);
  EXPECT_EQ(L.Events[0].Status, ErasureStatus::Exact);
  EXPECT_DOUBLE_EQ(L.Events[0].BitsLow, 1.0);
  EXPECT_EQ(L.Events[1].Status, ErasureStatus::Exact);
  EXPECT_EQ(L.Events[1].BitsLow, 0);
  EXPECT_EQ(L.Events[1].BitsHigh, 0);
}

// Checks that a second measurement of a qubit in superposition is still
// free: the bit already equals the qubit in every branch, so H(c | q) = 0
// whatever the superposition was.
TEST(ClassicalEngine, RemeasuringASuperposedQubitIsFree) {
  test::Elaborated E = withRoles(Header + "qreg q[1];\ncreg c[1];\nh q[0];\n"
                                          "measure q[0] -> c[0];\n"
                                          "measure q[0] -> c[0];\n",
                                 {});
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  const ErasureEvent *M = onlyEvent(L);
  ASSERT_TRUE(M);
  EXPECT_EQ(M->Status, ErasureStatus::Exact);
  EXPECT_EQ(M->BitsHigh, 0);
}

//===----------------------------------------------------------------------===//
// Ancillas
//===----------------------------------------------------------------------===//

const std::string BennettAnd3 = "qreg x[3];\nqreg anc[2];\nqreg out[1];\n"
                                "ccx x[0],x[1],anc[0];\n"
                                "ccx anc[0],x[2],anc[1];\n"
                                "cx anc[1],out[0];\n";
const std::string BennettUncompute = "ccx anc[0],x[2],anc[1];\n"
                                     "ccx x[0],x[1],anc[0];\n";

// Checks that compute, copy, uncompute (Bennett, IBM J. Res. Dev. 17, 525
// (1973)) of x0 x1 x2 brings both ancillas back to |0>: no erasure at all.
TEST(ClassicalEngine, ComputeCopyUncomputeLeavesAncillasClean) {
  test::Elaborated E = withRoles(Header + BennettAnd3 + BennettUncompute,
                                 {{"x", Input}, {"anc", Ancilla}});
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  EXPECT_TRUE(L.Events.empty());
  ASSERT_EQ(L.Ancillas.size(), 2u);
  for (const AncillaVerdict &V : L.Ancillas) {
    EXPECT_EQ(V.Clean, std::optional<bool>(true));
    EXPECT_FALSE(V.HasCounterexample);
  }
  EXPECT_TRUE(L.DiscardJoint.Exact);
  EXPECT_EQ(L.DiscardJoint.High, 0);
}

// Checks that without the uncompute both ancillas are dirty, that each
// counterexample really leaves its ancilla at 1 (substituted into the
// reference), and the discard entropies: anc0 = x0 x1 (H2(1/4)), anc1 =
// x0 x1 x2 (H2(1/8)), jointly the distribution {6/8, 1/8, 1/8}, computed
// here by brute force.
TEST(ClassicalEngine, SkippedUncomputeLeavesDirtyAncillasWithCounterexamples) {
  test::Elaborated E =
      withRoles(Header + BennettAnd3, {{"x", Input}, {"anc", Ancilla}});
  ASSERT_TRUE(E.Circuit);
  const ir::Circuit &C = *E.Circuit;
  Ledger L = runClassical(C, {});
  ASSERT_EQ(L.Ancillas.size(), 2u);
  for (const AncillaVerdict &V : L.Ancillas) {
    EXPECT_EQ(V.Clean, std::optional<bool>(false));
    ASSERT_TRUE(V.HasCounterexample);
    EXPECT_TRUE(endsAtOne(C, V)) << "ancilla " << V.Qubit;
  }
  ASSERT_EQ(L.Events.size(), 2u);
  EXPECT_EQ(L.Events[0].Kind, ErasureKind::Discard);
  EXPECT_EQ(L.Events[0].Wire, 3u);
  EXPECT_NEAR(L.Events[0].BitsLow, H2Quarter, 1e-12);
  EXPECT_NEAR(L.Events[1].BitsLow,
              -(1.0 / 8) * std::log2(1.0 / 8) - (7.0 / 8) * std::log2(7.0 / 8),
              1e-12);
  std::vector<std::vector<bool>> Ends;
  for (const ReferenceRun &R : allRuns(C))
    Ends.push_back({R.Q[3], R.Q[4]});
  EXPECT_TRUE(L.DiscardJoint.Exact);
  EXPECT_NEAR(L.DiscardJoint.Low, entropyOf(Ends), 1e-12);
  EXPECT_NEAR(L.DiscardJoint.Low, 1.0612781244591327, 1e-12);
}

// Checks the joint discard entropy of two garbage copies of one input:
// H(X, X) = H(X) = 1 bit, not the 2 bits of the marginals (Shannon); with
// the joint limit below two wires, the largest marginal bounds it below.
TEST(ClassicalEngine, DiscardJointCountsCopiesOnce) {
  test::Elaborated E = withRoles(Header + "qreg x[2];\nqreg g[3];\n"
                                          "cx x[0],g[0];\ncx x[0],g[1];\n"
                                          "cx x[1],g[2];\n",
                                 {{"x", Input}, {"g", Garbage}});
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  ASSERT_EQ(L.Events.size(), 3u);
  EXPECT_TRUE(L.Ancillas.empty()); // garbage has no verdict
  EXPECT_TRUE(L.DiscardJoint.Exact);
  EXPECT_DOUBLE_EQ(L.DiscardJoint.Low, 2.0); // x0 and x1, once each
  EngineOptions Narrow;
  Narrow.MaxJointWires = 1;
  Ledger N = runClassical(*E.Circuit, Narrow);
  EXPECT_FALSE(N.DiscardJoint.Exact);
  EXPECT_DOUBLE_EQ(N.DiscardJoint.Low, 1.0);
  EXPECT_DOUBLE_EQ(N.DiscardJoint.High, 3.0);
}

// Checks that a Hadamard on an ancilla is over-approximated: the ancilla is
// not claimed clean, its discard is the interval [0, 1], and a note says
// why. (Two Hadamards would restore |0>, which the classical engine does
// not see; it must not claim either way.)
TEST(ClassicalEngine, HadamardOnAnAncillaIsNotClaimedClean) {
  for (const char *Body : {"h anc[0];\n", "h anc[0];\nh anc[0];\n"}) {
    SCOPED_TRACE(Body);
    test::Elaborated E =
        withRoles(Header + "qreg anc[1];\n" + Body, {{"anc", Ancilla}});
    ASSERT_TRUE(E.Circuit);
    Ledger L = runClassical(*E.Circuit, {});
    ASSERT_EQ(L.Ancillas.size(), 1u);
    EXPECT_FALSE(L.Ancillas[0].Clean.has_value());
    const ErasureEvent *D = onlyEvent(L);
    ASSERT_TRUE(D);
    EXPECT_EQ(D->Status, ErasureStatus::Unknown);
    EXPECT_EQ(D->BitsLow, 0);
    EXPECT_EQ(D->BitsHigh, 1);
    EXPECT_FALSE(L.DiscardJoint.Exact);
    ASSERT_FALSE(L.Notes.empty());
    EXPECT_NE(L.Notes[0].find("over-approximated"), std::string::npos);
  }
}

// Checks a reset after a Hadamard: the erased entropy is unknown ([0, 1]),
// and the ancilla is clean afterwards (a reset leaves |0>).
TEST(ClassicalEngine, ResetOfASuperposedQubitIsUnknown) {
  test::Elaborated E = withRoles(Header + "qreg anc[1];\nh anc[0];\n"
                                          "reset anc[0];\n",
                                 {{"anc", Ancilla}});
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  const ErasureEvent *R = onlyEvent(L);
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Status, ErasureStatus::Unknown);
  EXPECT_EQ(L.Ancillas[0].Clean, std::optional<bool>(true));
}

// Checks that a superposition elsewhere does not hide a dirty ancilla: anc =
// a OR f, with f from a Hadamard, is 1 for a = 1 whatever f is, so the
// ancilla is refuted with a = 1 as the counterexample.
TEST(ClassicalEngine, AncillaSetWhateverTheSuperpositionIsDirty) {
  test::Elaborated E = withRoles(Header + "qreg a[1];\nqreg q[1];\n"
                                          "qreg anc[1];\nh q[0];\n"
                                          "cx a[0],anc[0];\ncx q[0],anc[0];\n"
                                          "ccx a[0],q[0],anc[0];\n",
                                 {{"a", Input}, {"anc", Ancilla}});
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  ASSERT_EQ(L.Ancillas.size(), 1u);
  const AncillaVerdict &V = L.Ancillas[0];
  EXPECT_EQ(V.Clean, std::optional<bool>(false));
  ASSERT_TRUE(V.HasCounterexample);
  ASSERT_EQ(V.Counterexample.size(), 1u);
  EXPECT_EQ(V.Counterexample[0], std::make_pair(uint32_t(0), true));
  EXPECT_EQ(onlyStatus(L), ErasureStatus::Unknown);
}

// Checks that a controlled Hadamard leaves its control a basis value (a
// controlled-U never mixes basis states that differ in the control, common
// practice): a copy of the control is still an exact 1-bit discard.
TEST(ClassicalEngine, ControlledHadamardKeepsItsControl) {
  test::Elaborated E = withRoles(Header + "qreg a[1];\nqreg t[1];\n"
                                          "qreg anc[1];\nch a[0],t[0];\n"
                                          "cx a[0],anc[0];\n",
                                 {{"a", Input}, {"anc", Ancilla}});
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  const ErasureEvent *D = onlyEvent(L);
  ASSERT_TRUE(D);
  EXPECT_EQ(D->Status, ErasureStatus::Exact);
  EXPECT_DOUBLE_EQ(D->BitsLow, 1.0);
  EXPECT_EQ(L.Ancillas[0].Clean, std::optional<bool>(false));
  EXPECT_TRUE(L.Ancillas[0].HasCounterexample);
  EXPECT_TRUE(L.DiscardJoint.Exact);
}

// Checks that a gate without a unitary (opaque) is over-approximated on all
// its qubits: the ancilla it touches is left open, never claimed clean.
TEST(ClassicalEngine, OpaqueGateLeavesItsQubitsOpen) {
  test::Elaborated E = withRoles(Header + "opaque mystery a,b;\n"
                                          "qreg a[1];\nqreg anc[1];\n"
                                          "mystery a[0],anc[0];\n",
                                 {{"a", Input}, {"anc", Ancilla}});
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  ASSERT_EQ(L.Ancillas.size(), 1u);
  EXPECT_FALSE(L.Ancillas[0].Clean.has_value());
  EXPECT_EQ(onlyStatus(L), ErasureStatus::Unknown);
}

// Checks that a spent expansion budget is reported and stays sound: calls
// past it are simulated whole, which for cx (a known permutation) is still
// exact, so the copy-and-uncopy ancilla is still proved clean.
TEST(ClassicalEngine, SpentExpansionBudgetIsNoted) {
  test::Elaborated E = withRoles(Header + "qreg a[1];\nqreg anc[1];\n"
                                          "cx a[0],anc[0];\ncx a[0],anc[0];\n",
                                 {{"a", Input}, {"anc", Ancilla}});
  ASSERT_TRUE(E.Circuit);
  EngineOptions Small;
  Small.MaxExpandedOps = 1;
  Ledger L = runClassical(*E.Circuit, Small);
  EXPECT_EQ(L.Ancillas[0].Clean, std::optional<bool>(true));
  ASSERT_EQ(L.Notes.size(), 1u);
  EXPECT_EQ(L.Notes[0].rfind("the expansion budget of 1 gate applications "
                             "ran out at operation 2 of 2",
                             0),
            0u)
      << L.Notes[0];
}

//===----------------------------------------------------------------------===//
// Conditions
//===----------------------------------------------------------------------===//

// Checks a reset conditioned on an independent uniform bit c: A = {q, c}
// goes from 2 bits to the distribution {1/4, 1/4, 1/2} of 1.5 bits, so
// 0.5 bits are erased (Reeb & Wolf's rule with Shannon entropies).
TEST(ClassicalEngine, ConditionalResetErasesHalfABit) {
  test::Elaborated E = withRoles(Header + "qreg q[2];\ncreg c[1];\n"
                                          "measure q[1] -> c[0];\n"
                                          "if (c==1) reset q[0];\n",
                                 {{"q", Input}});
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  const ErasureEvent *R = onlyEvent(L); // the measure wrote into a known 0
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Kind, ErasureKind::Reset);
  EXPECT_EQ(R->Status, ErasureStatus::Exact);
  EXPECT_NEAR(R->BitsLow, 0.5, 1e-12);
}

// Checks reset by feedback (measure, then x when the bit is 1; common
// practice): the qubit is then a known 0, so a later reset is constant,
// and a conditioned reset on the measured bit erases nothing (the bit
// keeps the information).
TEST(ClassicalEngine, ResetByFeedbackErasesNothingFromTheQubit) {
  test::Elaborated E = withRoles(Header + "qreg q[2];\ncreg c[2];\n"
                                          "measure q[0] -> c[0];\n"
                                          "if (c==1) x q[0];\n"
                                          "reset q[0];\n"
                                          "measure q[1] -> c[1];\n"
                                          "if (c==2) reset q[1];\n"
                                          "if (c==3) reset q[1];\n",
                                 {{"q", Input}});
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  ASSERT_EQ(L.Events.size(), 3u);
  EXPECT_EQ(L.Events[0].Status, ErasureStatus::Constant);
  EXPECT_EQ(L.Events[1].Status, ErasureStatus::Exact);
  EXPECT_NEAR(L.Events[1].BitsLow, 0, 1e-12);
  EXPECT_EQ(L.Events[2].Status, ErasureStatus::Exact);
  EXPECT_NEAR(L.Events[2].BitsLow, 0, 1e-12);
}

// Checks that an operation whose condition can never hold (a 1-bit register
// compared with 2, or a bit known to be 0 compared with 1) never runs: it
// is no operation, so no event (docs/erasures.md), and the qubit keeps its
// value (the later reset removes the fair bit it holds).
TEST(ClassicalEngine, ResetThatNeverRunsIsNoEvent) {
  for (const char *Cond : {"c==2", "c==1"}) {
    SCOPED_TRACE(Cond);
    test::Elaborated E = withRoles(Header + "qreg q[1];\ncreg c[1];\n" +
                                       fmt::format("if ({}) reset q[0];\n",
                                                   Cond) +
                                       "reset q[0];\n",
                                   {{"q", Input}});
    ASSERT_TRUE(E.Circuit);
    Ledger L = runClassical(*E.Circuit, {});
    const ErasureEvent *R = onlyEvent(L);
    ASSERT_TRUE(R);
    EXPECT_EQ(R->Status, ErasureStatus::Exact);
    EXPECT_DOUBLE_EQ(R->BitsLow, 1.0);
  }
}

//===----------------------------------------------------------------------===//
// The brute-force cross-check
//===----------------------------------------------------------------------===//

/// A random circuit of x, cx, ccx, swap, cswap, a 3-qubit permutation gate,
/// measures, resets and conditions on 4 inputs, 2 ancillas, 1 garbage and 1
/// output qubit.
std::string randomClassicalCircuit(unsigned Seed) {
  std::mt19937 Rng(Seed);
  std::string S = Header + "gate maj a,b,c { cx c,b; cx c,a; ccx a,b,c; }\n"
                           "qreg x[4];\nqreg anc[2];\nqreg g[1];\nqreg o[1];\n"
                           "creg c[2];\n";
  const char *Names[8] = {"x[0]",   "x[1]",   "x[2]", "x[3]",
                          "anc[0]", "anc[1]", "g[0]", "o[0]"};
  auto Pick = [&](unsigned K) {
    std::vector<unsigned> All{0, 1, 2, 3, 4, 5, 6, 7};
    std::shuffle(All.begin(), All.end(), Rng);
    std::string Out;
    for (unsigned I = 0; I < K; ++I)
      Out += std::string(I ? "," : "") + Names[All[I]];
    return Out;
  };
  for (unsigned I = 0; I < 30; ++I) {
    unsigned Kind = Rng() % 9;
    if (Rng() % 5 == 0)
      S += fmt::format("if (c=={}) ", Rng() % 4);
    switch (Kind) {
    case 0: S += "x " + Pick(1); break;
    case 1: case 2: S += "cx " + Pick(2); break;
    case 3: S += "ccx " + Pick(3); break;
    case 4: S += "swap " + Pick(2); break;
    case 5: S += "cswap " + Pick(3); break;
    case 6: S += "maj " + Pick(3); break;
    case 7: S += fmt::format("measure {} -> c[{}]", Pick(1), Rng() % 2); break;
    default: S += "reset " + Pick(1); break;
    }
    S += ";\n";
  }
  return S;
}

// Checks every figure of the engine on random classical circuits against
// the brute-force reference over all 16 inputs: each reset's and
// overwrite's max(0, H(A before) - H(A after)), each discard's marginal,
// the joint discard entropy, and the ancilla verdicts with their
// counterexamples (all computed here by brute force).
TEST(ClassicalEngine, AgreesWithBruteForceOnRandomCircuits) {
  for (unsigned Seed = 1; Seed <= 40; ++Seed) {
    std::string Text = randomClassicalCircuit(Seed);
    SCOPED_TRACE(Text);
    test::Elaborated E = withRoles(
        Text, {{"x", Input}, {"anc", Ancilla}, {"g", Garbage}});
    ASSERT_TRUE(E.Circuit);
    const ir::Circuit &C = *E.Circuit;
    std::vector<ReferenceRun> Runs = allRuns(C);
    Ledger L = runClassical(C, {});
    EXPECT_TRUE(L.Notes.empty());
    std::vector<ErasureEvent> Want = referenceEvents(C, Runs);
    ASSERT_EQ(L.Events.size(), Want.size());
    for (size_t I = 0; I < Want.size(); ++I) {
      SCOPED_TRACE(fmt::format("event {}", I));
      EXPECT_EQ(L.Events[I].Kind, Want[I].Kind);
      EXPECT_EQ(L.Events[I].Wire, Want[I].Wire);
      EXPECT_EQ(L.Events[I].Status, Want[I].Status);
      EXPECT_NEAR(L.Events[I].BitsLow, Want[I].BitsLow, 1e-9);
      EXPECT_NEAR(L.Events[I].BitsHigh, Want[I].BitsHigh, 1e-9);
    }
    std::vector<std::vector<bool>> Ends(Runs.size());
    for (size_t R = 0; R < Runs.size(); ++R)
      for (uint32_t Q = 0; Q < C.NumQubits; ++Q)
        if (ir::isDiscarded(C.role(Q)))
          Ends[R].push_back(Runs[R].Q[Q]);
    EXPECT_TRUE(L.DiscardJoint.Exact);
    EXPECT_NEAR(L.DiscardJoint.Low, entropyOf(Ends), 1e-9);
    EXPECT_NEAR(L.DiscardJoint.High, entropyOf(Ends), 1e-9);
    ASSERT_EQ(L.Ancillas.size(), 2u);
    for (const AncillaVerdict &V : L.Ancillas) {
      bool EverOne = false;
      for (const ReferenceRun &R : Runs)
        EverOne |= R.Q[V.Qubit];
      EXPECT_EQ(V.Clean, std::optional<bool>(!EverOne));
      EXPECT_EQ(V.HasCounterexample, EverOne);
      if (V.HasCounterexample)
        EXPECT_TRUE(endsAtOne(C, V)) << "ancilla " << V.Qubit;
      else
        EXPECT_TRUE(V.Counterexample.empty());
    }
  }
}

//===----------------------------------------------------------------------===//
// Limits
//===----------------------------------------------------------------------===//

// The parity of twelve inputs is reset (one bit exactly); then an input is
// copied into an ancilla. The first reset never runs (c is a known 0), so
// it is no event.
const std::string ParityThenCopy = [] {
  std::string S = Header + "qreg x[12];\nqreg p[1];\nqreg anc[1];\n"
                           "creg c[1];\nif (c==1) reset x[0];\n";
  for (unsigned I = 0; I < 12; ++I)
    S += fmt::format("cx x[{}],p[0];\n", I);
  return S + "reset p[0];\ncx x[5],anc[0];\n";
}();

// Checks the fallback when the BDDs may not hold the parity: every figure
// comes from 4096 random inputs, none is claimed exact, the note says which
// limit was hit, and the estimates are close to the exact values (1 bit for
// the parity, Shannon; 1 bit for the copied input). The reset that never
// runs is still no event. Without superpositions
// a dirty sample is a real run, so the ancilla is refuted with a
// counterexample that the reference confirms.
TEST(ClassicalEngine, TinyNodeLimitFallsBackToSampling) {
  test::Elaborated E = withRoles(ParityThenCopy,
                                 {{"x", Input}, {"anc", Ancilla}});
  ASSERT_TRUE(E.Circuit);
  EngineOptions Tiny;
  Tiny.MaxBddNodes = 40;
  Ledger L = runClassical(*E.Circuit, Tiny);
  ASSERT_FALSE(L.Notes.empty());
  EXPECT_EQ(L.Notes[0].rfind("BDD node limit of 40 reached", 0), 0u)
      << L.Notes[0];
  EXPECT_NE(L.Notes[0].find("figures from 4096 random inputs"),
            std::string::npos)
      << L.Notes[0];
  ASSERT_EQ(L.Events.size(), 2u);
  for (const ErasureEvent &Ev : L.Events) {
    EXPECT_EQ(Ev.Status, ErasureStatus::Unknown);
    EXPECT_EQ(Ev.BitsLow, 0);
    EXPECT_EQ(Ev.BitsHigh, 1);
    EXPECT_EQ(Ev.Samples, 4096u);
    EXPECT_GT(Ev.BitsEstimate, 0.99);
    EXPECT_LE(Ev.BitsEstimate, 1.0);
  }
  EXPECT_FALSE(L.DiscardJoint.Exact);
  ASSERT_EQ(L.Ancillas.size(), 1u);
  const AncillaVerdict &V = L.Ancillas[0];
  EXPECT_EQ(V.Samples, 4096u);
  EXPECT_GT(V.DirtySamples, 1800u); // about half of 4096
  EXPECT_LT(V.DirtySamples, 2300u);
  EXPECT_EQ(V.Clean, std::optional<bool>(false));
  ASSERT_TRUE(V.HasCounterexample);
  EXPECT_TRUE(endsAtOne(*E.Circuit, V));

  // The default limit holds these BDDs: the same figures, exact.
  Ledger Exact = runClassical(*E.Circuit, {});
  EXPECT_TRUE(Exact.Notes.empty());
  EXPECT_EQ(Exact.Events[0].Status, ErasureStatus::Exact);
  EXPECT_DOUBLE_EQ(Exact.Events[0].BitsLow, 1.0);
}

// Checks the fallback with a superposition: dirty samples are then not
// counterexamples, so the ancilla is left open with its sample counts.
TEST(ClassicalEngine, SampledSuperpositionLeavesTheAncillaOpen) {
  test::Elaborated E = withRoles(ParityThenCopy + "h anc[0];\n",
                                 {{"x", Input}, {"anc", Ancilla}});
  ASSERT_TRUE(E.Circuit);
  EngineOptions Tiny;
  Tiny.MaxBddNodes = 40;
  Tiny.Samples = 1000; // not a multiple of 64
  Ledger L = runClassical(*E.Circuit, Tiny);
  ASSERT_EQ(L.Ancillas.size(), 1u);
  const AncillaVerdict &V = L.Ancillas[0];
  EXPECT_FALSE(V.Clean.has_value());
  EXPECT_EQ(V.Samples, 1000u);
  EXPECT_GT(V.DirtySamples, 0u);
  EXPECT_LT(V.DirtySamples, 1000u);
  for (const ErasureEvent &Ev : L.Events)
    EXPECT_NE(Ev.Status, ErasureStatus::Exact);
  ASSERT_EQ(L.Notes.size(), 2u);
  EXPECT_NE(L.Notes[0].find("figures from 1000 random inputs"),
            std::string::npos);
  EXPECT_NE(L.Notes[1].find("over-approximated"), std::string::npos);
}

// Checks that the sampling fallback never calls a value constant from its
// samples: the AND of 20 uniform inputs is 1 with probability 2^-20, so
// all 4096 sampled lanes very likely hold 0, yet the reset of it erases
// H2(2^-20) > 0 bits (Shannon) and must stay an interval. Resets that
// constant propagation proves (a fresh qubit, a qubit just reset) stay
// constant.
TEST(ClassicalEngine, SampledZerosAreNotAProof) {
  std::string S = Header + "qreg x[20];\nqreg a[19];\nqreg z[1];\n"
                           "ccx x[0],x[1],a[0];\n";
  for (unsigned I = 1; I < 19; ++I)
    S += fmt::format("ccx a[{}],x[{}],a[{}];\n", I - 1, I + 1, I);
  S += "reset a[18];\nreset a[18];\nreset z[0];\n";
  test::Elaborated E = withRoles(S, {{"x", Input}});
  ASSERT_TRUE(E.Circuit);
  EngineOptions Tiny;
  Tiny.MaxBddNodes = 40;
  Ledger L = runClassical(*E.Circuit, Tiny);
  ASSERT_FALSE(L.Notes.empty());
  EXPECT_NE(L.Notes[0].find("figures from 4096 random inputs"),
            std::string::npos)
      << L.Notes[0];
  ASSERT_EQ(L.Events.size(), 3u);
  EXPECT_EQ(L.Events[0].Status, ErasureStatus::Unknown);
  EXPECT_EQ(L.Events[0].BitsLow, 0);
  EXPECT_EQ(L.Events[0].BitsHigh, 1);
  EXPECT_EQ(L.Events[0].Samples, 4096u);
  EXPECT_EQ(L.Events[1].Status, ErasureStatus::Constant);
  EXPECT_EQ(L.Events[2].Status, ErasureStatus::Constant);
}

/// The inner product of a and b (N pairs) into t, with every a touched
/// before every b, which puts the a variables first in the BDD order: then
/// the function has 5 2^(N-1) - 3 nodes (a BDD must remember which a_i are
/// 1), not 3N.
std::string innerProduct(unsigned N, unsigned Toggles) {
  std::string S = Header + fmt::format("qreg a[{0}];\nqreg b[{0}];\n"
                                       "qreg t[1];\nqreg u[1];\n",
                                       N);
  for (unsigned I = 0; I < N; ++I)
    S += fmt::format("id a[{}];\n", I);
  for (unsigned I = 0; I < N; ++I)
    S += fmt::format("ccx a[{0}],b[{0}],t[0];\n", I);
  for (unsigned I = 0; I < Toggles; ++I)
    S += "cx t[0],u[0];\n";
  return S;
}

// Checks the per-function share of the node limit: at a limit of 20000
// nodes a function may hold 1024 (the floor), and the inner product of 10
// pairs in the bad order has 2557. Under the default limit the same garbage
// bit is exact: the inner product of n uniform pairs is 1 with probability
// 1/2 - 2^-(n+1) (its bias is 2^-n, a fact of the trade).
TEST(ClassicalEngine, LargeFunctionFallsBackToSampling) {
  test::Elaborated E = withRoles(innerProduct(10, 0),
                                 {{"a", Input}, {"b", Input}, {"t", Garbage}});
  ASSERT_TRUE(E.Circuit);
  EngineOptions Small;
  Small.MaxBddNodes = 20000;
  Ledger L = runClassical(*E.Circuit, Small);
  ASSERT_FALSE(L.Notes.empty());
  EXPECT_EQ(L.Notes[0].rfind("BDD node limit of 20000 reached: a wire's "
                             "function passed 1024 nodes",
                             0),
            0u)
      << L.Notes[0];
  EXPECT_EQ(onlyStatus(L), ErasureStatus::Unknown);

  Ledger Exact = runClassical(*E.Circuit, {});
  EXPECT_TRUE(Exact.Notes.empty());
  const ErasureEvent *D = onlyEvent(Exact);
  ASSERT_TRUE(D);
  EXPECT_EQ(D->Status, ErasureStatus::Exact);
  double P = 0.5 - std::ldexp(1.0, -11);
  EXPECT_NEAR(D->BitsLow, -P * std::log2(P) - (1 - P) * std::log2(1 - P),
              1e-12);
}

// Checks the work limit: at a node limit of 2^17 the budget is 8 x 2^17
// node visits, charged per step for functions past 1024 nodes; copying
// the 1277-node inner product of 9 pairs back and forth 3000 times spends
// it, while the default limit's budget is 32 times larger.
TEST(ClassicalEngine, LongWorkOnLargeFunctionsFallsBackToSampling) {
  test::Elaborated E = withRoles(innerProduct(9, 3000),
                                 {{"a", Input}, {"b", Input}, {"t", Garbage}});
  ASSERT_TRUE(E.Circuit);
  EngineOptions Small;
  Small.MaxBddNodes = 1 << 17;
  Ledger L = runClassical(*E.Circuit, Small);
  ASSERT_FALSE(L.Notes.empty());
  EXPECT_EQ(L.Notes[0].rfind("BDD work limit of 1048576 node visits", 0), 0u)
      << L.Notes[0];
  Ledger Exact = runClassical(*E.Circuit, {});
  EXPECT_TRUE(Exact.Notes.empty());
  EXPECT_EQ(onlyStatus(Exact), ErasureStatus::Exact);
}

// Checks that fresh variables are bounded: 70000 Hadamards would need more
// than 65536 BDD variables, so the engine samples instead and says so.
TEST(ClassicalEngine, TooManyFreshVariablesFallBackToSampling) {
  std::string S = Header + "qreg q[1];\n";
  for (unsigned I = 0; I < 70000; ++I)
    S += "h q[0];\n";
  test::Elaborated E = withRoles(S, {{"q", Garbage}});
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  ASSERT_FALSE(L.Notes.empty());
  EXPECT_EQ(L.Notes[0].rfind("more than 65536 BDD variables", 0), 0u)
      << L.Notes[0];
  const ErasureEvent *D = onlyEvent(L);
  ASSERT_TRUE(D);
  EXPECT_EQ(D->Status, ErasureStatus::Unknown);
  EXPECT_GT(D->Samples, 0u);
}

//===----------------------------------------------------------------------===//
// BuDDy's collections after the variable set grows
//===----------------------------------------------------------------------===//

/// While alive, glibc fills every block malloc hands out with 0x5a bytes
/// (mallopt(3), M_PERTURB; the byte given is inverted on allocation), so
/// that memory read before anyone wrote it holds 0x5a5a5a5a instead of
/// whatever the heap held before. Elsewhere it does nothing.
class PerturbedHeap {
public:
  PerturbedHeap() {
#if defined(__GLIBC__) && defined(M_PERTURB)
    mallopt(M_PERTURB, 0xa5);
#endif
  }
  ~PerturbedHeap() {
#if defined(__GLIBC__) && defined(M_PERTURB)
    mallopt(M_PERTURB, 0);
#endif
  }
  PerturbedHeap(const PerturbedHeap &) = delete;
  PerturbedHeap &operator=(const PerturbedHeap &) = delete;
};

/// `Inputs` input qubits nothing touches, then `Fresh` Hadamards each
/// xor-ed into t (a parity chain of fresh variables, one level deeper per
/// step), then a copy of x[0] into g.
std::string freshParityChain(unsigned Inputs, unsigned Fresh) {
  std::string S = Header + fmt::format("qreg x[{}];\nqreg f[1];\nqreg t[1];\n"
                                       "qreg g[1];\n",
                                       Inputs);
  for (unsigned I = 0; I < Fresh; ++I)
    S += "h f[0];\ncx f[0],t[0];\n";
  return S + "cx x[0],g[0];\n";
}

// Checks the engine across BuDDy collections that follow a growth of the
// variable set. BuDDy 2.4's bdd_extvarnum mallocs a new node reference
// stack, and its operations reserve a slot on it before computing what goes
// there, so a collection inside an operation read uninitialised memory and
// crashed in bdd_mark in some runs (BuddySession.cpp, clearUnwrittenRefs).
// With the heap perturbed the unwritten slots hold 0x5a5a5a5a, and without
// the workaround both circuits crash every time (each grows the variables
// from N to 2N at the first Hadamard and to 4N after N more, and collects
// inside the next xor). The figures are common practice: g holds a copy of
// a uniform input, 1 bit (Shannon); t depends on fresh variables only, so
// it is an interval [0, 1] and the note counts the Hadamards.
TEST(ClassicalEngine, CollectionsAfterVariableGrowthSurviveAPerturbedHeap) {
  for (unsigned N : {2500u, 3000u}) {
    SCOPED_TRACE(N);
    test::Elaborated E = withRoles(freshParityChain(N, N + 10),
                                   {{"x", Input}, {"t", Garbage},
                                    {"g", Garbage}});
    ASSERT_TRUE(E.Circuit);
    Ledger L;
    {
      PerturbedHeap Perturbed;
      L = runClassical(*E.Circuit, {});
    }
    ASSERT_EQ(L.Notes.size(), 1u);
    EXPECT_EQ(L.Notes[0].rfind(fmt::format("{} gates that make superpositions",
                                           N + 10),
                               0),
              0u)
        << L.Notes[0];
    ASSERT_EQ(L.Events.size(), 2u);
    const ErasureEvent &T = L.Events[0], &G = L.Events[1];
    EXPECT_EQ(T.Kind, ErasureKind::Discard);
    EXPECT_EQ(T.Status, ErasureStatus::Unknown);
    EXPECT_EQ(T.BitsLow, 0);
    EXPECT_EQ(T.BitsHigh, 1);
    EXPECT_EQ(G.Kind, ErasureKind::Discard);
    EXPECT_EQ(G.Status, ErasureStatus::Exact);
    EXPECT_DOUBLE_EQ(G.BitsLow, 1.0);
  }
}

// Checks the circuit that showed the crash: bwt_n21 of the QASMBench suite
// in the shared folder, 9207 resets, no roles and no `if`, with 4800
// Hadamards and so as many fresh variables. With the heap perturbed every
// run crashed before the workaround; now the BDD pass runs until its work
// limit and the sampling fallback lists every reset, each of which runs.
TEST(ClassicalEngine, BwtN21SurvivesAPerturbedHeap) {
  namespace fs = std::filesystem;
  fs::path File = fs::path(test::sharedDir()) /
                  "benchmarks/qasmbench/medium/bwt_n21/bwt_n21.qasm";
  if (!fs::exists(File))
    GTEST_SKIP() << "the shared benchmarks are not at " << File
                 << " (set REVBOUND_SHARED_DIR)";
  std::ifstream In(File);
  std::stringstream Text;
  Text << In.rdbuf();
  test::Elaborated E = test::elaborate(Text.str());
  ASSERT_TRUE(E.Circuit) << E.Error;
  Ledger L;
  {
    PerturbedHeap Perturbed;
    L = runClassical(*E.Circuit, {});
  }
  EXPECT_EQ(L.Engine, EngineKind::Classical);
  EXPECT_EQ(L.Events.size(), 9207u); // `grep -c '^reset'` on the file
  for (const ErasureEvent &Ev : L.Events)
    EXPECT_EQ(Ev.Kind, ErasureKind::Reset);
}

//===----------------------------------------------------------------------===//
// The ripple-carry adder of Cuccaro, Draper, Kutin and Moulton
// (arXiv:quant-ph/0410184): MAJ(c, b, a) is CNOT a->b, CNOT a->c,
// Toffoli(c, b -> a); UMA(c, b, a) is Toffoli(c, b -> a), CNOT a->c,
// CNOT c->b. The carry-in c0 starts at 0 and comes back to 0.
//===----------------------------------------------------------------------===//

/// The adder with MAJ and UMA as gates (as in PublishedConstructionsTest).
std::string cuccaroWithGates(unsigned N) {
  std::string S = Header +
                  "gate majority a,b,c { cx c,b; cx c,a; ccx a,b,c; }\n"
                  "gate unmaj a,b,c { ccx a,b,c; cx c,a; cx a,b; }\n";
  S += fmt::format("qreg cin[1];\nqreg a[{0}];\nqreg b[{0}];\nqreg cout[1];\n",
                   N);
  S += "majority cin[0],b[0],a[0];\n";
  for (unsigned I = 1; I < N; ++I)
    S += fmt::format("majority a[{}],b[{}],a[{}];\n", I - 1, I, I);
  S += fmt::format("cx a[{}],cout[0];\n", N - 1);
  for (unsigned I = N - 1; I >= 1; --I)
    S += fmt::format("unmaj a[{}],b[{}],a[{}];\n", I - 1, I, I);
  return S + "unmaj cin[0],b[0],a[0];\n";
}

/// The same adder written with cx and ccx; `SkipRestore` leaves out the
/// last UMA's CNOT a0 -> c0, the gate that uncomputes the carry-in.
std::string cuccaroFlat(unsigned N, bool SkipRestore) {
  auto Maj = [](std::string C, std::string B, std::string A) {
    return fmt::format("cx {2},{1};\ncx {2},{0};\nccx {0},{1},{2};\n", C, B,
                       A);
  };
  auto Uma = [](std::string C, std::string B, std::string A, bool Skip) {
    return fmt::format("ccx {0},{1},{2};\n{3}cx {0},{1};\n", C, B, A,
                       Skip ? "" : fmt::format("cx {},{};\n", A, C));
  };
  auto Q = [](const char *R, unsigned I) { return fmt::format("{}[{}]", R, I); };
  std::string S = Header;
  S += fmt::format("qreg cin[1];\nqreg a[{0}];\nqreg b[{0}];\nqreg cout[1];\n",
                   N);
  S += Maj("cin[0]", "b[0]", "a[0]");
  for (unsigned I = 1; I < N; ++I)
    S += Maj(Q("a", I - 1), Q("b", I), Q("a", I));
  S += fmt::format("cx a[{}],cout[0];\n", N - 1);
  for (unsigned I = N - 1; I >= 1; --I)
    S += Uma(Q("a", I - 1), Q("b", I), Q("a", I), false);
  return S + Uma("cin[0]", "b[0]", "a[0]", SkipRestore);
}

const std::map<std::string, ir::WireRole> AdderRoles{
    {"a", Input}, {"b", Input}, {"cin", Ancilla}};

// Checks that the carry-in ancilla of the 64-bit adder is proved clean,
// with the MAJ and UMA gates taken whole and written out as cx and ccx.
TEST(ClassicalEngine, CuccaroAdderCarryInIsClean) {
  for (bool Flat : {false, true}) {
    SCOPED_TRACE(Flat ? "flat" : "with gates");
    test::Elaborated E = withRoles(
        Flat ? cuccaroFlat(64, false) : cuccaroWithGates(64), AdderRoles);
    ASSERT_TRUE(E.Circuit);
    Ledger L = runClassical(*E.Circuit, {});
    ASSERT_EQ(L.Ancillas.size(), 1u);
    EXPECT_EQ(L.Ancillas[0].Qubit, 0u);
    EXPECT_EQ(L.Ancillas[0].Clean, std::optional<bool>(true));
    EXPECT_TRUE(L.Events.empty());
    EXPECT_TRUE(L.DiscardJoint.Exact);
    EXPECT_TRUE(L.Notes.empty());
  }
}

// Checks the adder with the carry-in's restoring CNOT removed: the ancilla
// is proved dirty (it ends holding a0, 1 bit), and the counterexample,
// substituted into the reference, really ends with the carry-in at 1.
TEST(ClassicalEngine, CuccaroAdderWithoutRestoreIsDirty) {
  test::Elaborated E = withRoles(cuccaroFlat(64, true), AdderRoles);
  ASSERT_TRUE(E.Circuit);
  Ledger L = runClassical(*E.Circuit, {});
  ASSERT_EQ(L.Ancillas.size(), 1u);
  const AncillaVerdict &V = L.Ancillas[0];
  EXPECT_EQ(V.Clean, std::optional<bool>(false));
  ASSERT_TRUE(V.HasCounterexample);
  EXPECT_EQ(V.Counterexample.size(), 128u);
  EXPECT_TRUE(endsAtOne(*E.Circuit, V));
  const ErasureEvent *D = onlyEvent(L);
  ASSERT_TRUE(D);
  EXPECT_EQ(D->Status, ErasureStatus::Exact);
  EXPECT_DOUBLE_EQ(D->BitsLow, 1.0);
}

// Checks the adder itself on a few inputs through the reference (a + b in
// b, the carry in cout, a restored), so that the circuits above are the
// construction they claim to be.
TEST(ClassicalEngine, CuccaroAdderReferenceAdds) {
  for (bool Flat : {false, true}) {
    test::Elaborated E = withRoles(
        Flat ? cuccaroFlat(8, false) : cuccaroWithGates(8), AdderRoles);
    ASSERT_TRUE(E.Circuit);
    for (unsigned X : {0u, 1u, 77u, 200u, 255u})
      for (unsigned Y : {0u, 3u, 128u, 255u}) {
        std::vector<bool> In;
        for (unsigned I = 0; I < 8; ++I)
          In.push_back(X >> I & 1);
        for (unsigned I = 0; I < 8; ++I)
          In.push_back(Y >> I & 1);
        ReferenceRun R(*E.Circuit, In);
        unsigned Sum = 0, A = 0;
        for (unsigned I = 0; I < 8; ++I) {
          A |= unsigned(R.Q[1 + I]) << I;
          Sum |= unsigned(R.Q[9 + I]) << I;
        }
        Sum |= unsigned(R.Q[17]) << 8;
        EXPECT_EQ(Sum, X + Y);
        EXPECT_EQ(A, X);
        EXPECT_FALSE(R.Q[0]);
      }
  }
}

} // namespace
