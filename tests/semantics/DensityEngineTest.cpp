//===- DensityEngineTest.cpp - The density engine against closed forms ----===//
//
// Each expected value is a closed form of quantum information theory, with
// its source beside it, or comes from the brute-force simulator at the end
// of this file, written apart from the engine: qubits and classical bits
// are all wires of one dense density matrix, every operation is a Kraus sum
// of full-size matrices built entry by entry, and partial traces are
// explicit sums.
//
//===----------------------------------------------------------------------===//
#include "TestSupport.h"

#include "revbound/semantics/Engines.h"

// The engine's internal kernels, checked one by one against full matrices.
#include "../../src/semantics/DensityKernels.h"

#include <Eigen/Dense>
#include <Eigen/Eigenvalues>
#include <fmt/format.h>
#include <gtest/gtest.h>

#include <algorithm>
#include <bit>
#include <cmath>
#include <complex>
#include <iterator>
#include <numbers>
#include <numeric>
#include <random>
#include <string>
#include <utility>
#include <vector>

namespace revbound::semantics {
namespace {

// The engine's numerical tolerance (DensityEngine.cpp): probabilities and
// entropies within 1e-9 are equal.
constexpr double Tol = 1e-9;

/// Elaborates `Body` after the OpenQASM header and gives the listed qubits
/// their roles; every other qubit is an output.
test::Elaborated
program(const std::string &Body,
        const std::vector<std::pair<uint32_t, ir::WireRole>> &Roles = {}) {
  test::Elaborated E =
      test::elaborate("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n" + Body);
  if (E.Circuit) {
    ir::Circuit &C = *E.Circuit;
    C.QubitRoles.assign(C.NumQubits, ir::WireRole::Output);
    C.QubitRoleLocs.assign(C.NumQubits, llvm::SMLoc());
    for (auto [Q, R] : Roles)
      C.QubitRoles[Q] = R;
  }
  return E;
}

/// The ledger of a density run that must succeed.
std::optional<Ledger> density(const test::Elaborated &E,
                              const EngineOptions &Opts = {}) {
  if (!E.Circuit) {
    ADD_FAILURE() << E.Error;
    return std::nullopt;
  }
  llvm::Expected<Ledger> L = runDensity(*E.Circuit, Opts);
  if (!L) {
    ADD_FAILURE() << llvm::toString(L.takeError());
    return std::nullopt;
  }
  EXPECT_EQ(L->Engine, EngineKind::Density);
  return std::move(*L);
}

/// The printed error of a density run that must fail.
std::string densityError(const test::Elaborated &E,
                         const EngineOptions &Opts = {}) {
  if (!E.Circuit)
    return "elaboration failed: " + E.Error;
  llvm::Expected<Ledger> L = runDensity(*E.Circuit, Opts);
  if (L)
    return "no error";
  std::string Out;
  llvm::handleAllErrors(
      L.takeError(),
      [&](const DiagnosticError &D) {
        Out = formatDiagnostic(E.Files->mgr(), D.diagnostic());
      },
      [&](const llvm::ErrorInfoBase &B) { Out = B.message(); });
  return Out;
}

/// H2(p) in bits (Shannon, Bell Syst. Tech. J. 27, 379 (1948)).
double binaryEntropy(double P) {
  if (P <= 0 || P >= 1)
    return 0;
  return -P * std::log2(P) - (1 - P) * std::log2(1 - P);
}

void expectEvent(const ErasureEvent &E, ErasureKind Kind, uint32_t Wire,
                 ErasureStatus Status, double Bits) {
  EXPECT_EQ(E.Kind, Kind);
  EXPECT_EQ(E.Wire, Wire);
  EXPECT_EQ(E.Status, Status);
  EXPECT_NEAR(E.BitsLow, Bits, Tol);
  EXPECT_NEAR(E.BitsHigh, Bits, Tol);
  EXPECT_TRUE(E.Loc.isValid());
}

// Checks that resetting one half of a Bell pair removes exactly one bit: the
// reduced state of a maximally entangled qubit is I/2, entropy 1 (Nielsen &
// Chuang, Quantum Computation and Quantum Information, 2000, section 11.3).
TEST(DensityEngine, ResetOfBellHalfRemovesOneBit) {
  auto E = program("qreg q[2];\nh q[0];\ncx q[0],q[1];\nreset q[1];\n");
  auto L = density(E);
  ASSERT_TRUE(L);
  ASSERT_EQ(L->Events.size(), 1u);
  expectEvent(L->Events[0], ErasureKind::Reset, 1, ErasureStatus::Exact, 1);
}

// Checks that a whole bit prints as one, not 0.9999999999999996. After the
// first reset q[0] is I/2; cx from it onto q[2] = HTH|0>, whose Bloch
// vector (0, -1/sqrt2, 1/sqrt2) X turns into (0, 1/sqrt2, -1/sqrt2), leaves
// q[2] the average of the two, I/2: one bit exactly (Bloch-sphere form of a
// qubit's state, Nielsen & Chuang, 2000, section 4.2). The engine's sums
// land within round-off of it.
TEST(DensityEngine, WholeBitIsExactlyOne) {
  auto E = program("qreg q[3];\nh q[0];\ncx q[0],q[1];\nreset q[1];\n"
                   "h q[2];\nt q[2];\nh q[2];\nu3(pi/2,pi/3,pi/5) q[0];\n"
                   "cx q[0],q[2];\nreset q[2];\n");
  auto L = density(E);
  ASSERT_TRUE(L);
  ASSERT_EQ(L->Events.size(), 2u);
  EXPECT_EQ(L->Events[0].BitsLow, 1.0);
  EXPECT_EQ(L->Events[1].BitsLow, 1.0);
  EXPECT_EQ(L->Events[1].BitsHigh, 1.0);
}

// Checks that resetting a qubit in a known pure state removes nothing: a
// pure state has zero von Neumann entropy (Nielsen & Chuang, 2000, section
// 11.3). A basis state is also proved constant.
TEST(DensityEngine, ResetOfKnownStatesRemovesNothing) {
  auto E = program("qreg q[3];\nh q[0];\nreset q[0];\nx q[1];\nreset q[1];\n"
                   "reset q[2];\n");
  auto L = density(E);
  ASSERT_TRUE(L);
  ASSERT_EQ(L->Events.size(), 3u);
  expectEvent(L->Events[0], ErasureKind::Reset, 0, ErasureStatus::Exact, 0);
  expectEvent(L->Events[1], ErasureKind::Reset, 1, ErasureStatus::Constant, 0);
  expectEvent(L->Events[2], ErasureKind::Reset, 2, ErasureStatus::Constant, 0);
}

// Checks partial entanglement: ry(theta)|0> then cx gives the Schmidt form
// cos(theta/2)|00> + sin(theta/2)|11>, so the target's reduced state has
// eigenvalues cos^2(theta/2), sin^2(theta/2) and entropy H2(sin^2(theta/2))
// (Schmidt decomposition, Nielsen & Chuang, 2000, theorem 2.7).
TEST(DensityEngine, ResetOfPartlyEntangledQubitRemovesBinaryEntropy) {
  for (double Theta : {0.3, 1.0, std::numbers::pi / 2, 2.5, 3.0}) {
    auto E = program(fmt::format(
        "qreg q[2];\nry({:.17g}) q[0];\ncx q[0],q[1];\nreset q[1];\n", Theta));
    auto L = density(E);
    ASSERT_TRUE(L);
    ASSERT_EQ(L->Events.size(), 1u);
    double S = std::sin(Theta / 2);
    expectEvent(L->Events[0], ErasureKind::Reset, 1, ErasureStatus::Exact,
                binaryEntropy(S * S));
  }
}

// Checks that resetting an input, and a classical copy of one, each remove
// one bit: the input is uniformly random (DESIGN.md, "Roles of wires") and
// erasing a uniform bit costs one bit (Landauer, IBM J. Res. Dev. 5, 183
// (1961)). The second reset erases the copy q[1] after q[0] was reset: the
// data of q[0] survives only in q[1].
TEST(DensityEngine, ResetOfInputRemovesOneBit) {
  auto E = program("qreg q[2];\ncx q[0],q[1];\nreset q[0];\nreset q[1];\n",
                   {{0, ir::WireRole::Input}});
  auto L = density(E);
  ASSERT_TRUE(L);
  ASSERT_EQ(L->Events.size(), 2u);
  expectEvent(L->Events[0], ErasureKind::Reset, 0, ErasureStatus::Exact, 1);
  expectEvent(L->Events[1], ErasureKind::Reset, 1, ErasureStatus::Exact, 1);
}

// Checks measuring |+> into a bit that already held an independent uniform
// bit. With A = {q, c}: before, q is pure and independent of c, so
// S(qc) = S(q) + S(c) = 0 + 1; after, q is dephased and c holds its value,
// S(qc) = H(1/2) = 1. The net removed is (0 + 1) - 1 = 0 bits, although the
// old content of c is gone (DESIGN.md, "Erasure ledger").
TEST(DensityEngine, MeasureOfPlusOverIndependentBitRemovesNothing) {
  auto E = program("qreg q[2];\ncreg c[1];\nh q[0];\nmeasure q[0] -> c[0];\n"
                   "h q[1];\nmeasure q[1] -> c[0];\n");
  auto L = density(E);
  ASSERT_TRUE(L);
  // The first measurement writes a bit that held the constant 0.
  ASSERT_EQ(L->Events.size(), 1u);
  expectEvent(L->Events[0], ErasureKind::Overwrite, 0, ErasureStatus::Exact, 0);
}

// Checks measuring |0> over an independent uniform bit: before
// S(qc) = 0 + 1, after c = 0 and q = |0>, S = 0, so one bit is removed (the
// "up to 1 bit when c held independent data" case of DESIGN.md).
TEST(DensityEngine, MeasureOfBasisStateOverIndependentBitRemovesOneBit) {
  auto E = program("qreg q[2];\ncreg c[1];\nh q[0];\nmeasure q[0] -> c[0];\n"
                   "measure q[1] -> c[0];\n");
  auto L = density(E);
  ASSERT_TRUE(L);
  ASSERT_EQ(L->Events.size(), 1u);
  expectEvent(L->Events[0], ErasureKind::Overwrite, 0, ErasureStatus::Exact, 1);
}

// Checks the same qubit measured twice: c already holds q's value, the
// state of qc is (|00><00| + |11><11|)/2 before and after, S = 1 both
// times, so 0 bits (DESIGN.md, "Erasure ledger").
TEST(DensityEngine, RepeatedMeasurementRemovesNothing) {
  auto E = program("qreg q[1];\ncreg c[1];\nh q[0];\nmeasure q[0] -> c[0];\n"
                   "measure q[0] -> c[0];\n");
  auto L = density(E);
  ASSERT_TRUE(L);
  ASSERT_EQ(L->Events.size(), 1u);
  expectEvent(L->Events[0], ErasureKind::Overwrite, 0, ErasureStatus::Exact, 0);
}

// Checks that a measurement into a bit known to be 0 records no event:
// S(qc) before is S(q), and dephasing q and copying it into c cannot lower
// it (von Neumann entropy never decreases under dephasing, Nielsen &
// Chuang, 2000, theorem 11.9).
TEST(DensityEngine, MeasureIntoFreshBitHasNoEvent) {
  auto E = program("qreg q[2];\ncreg c[2];\nh q[0];\ncx q[0],q[1];\n"
                   "measure q[0] -> c[0];\nmeasure q[1] -> c[1];\n");
  auto L = density(E);
  ASSERT_TRUE(L);
  EXPECT_TRUE(L->Events.empty());
}

// Checks measure-and-correct: after measuring q and flipping it where the
// outcome was 1, q is |0> in every branch (common practice), so the reset
// that follows is proved constant and the ancilla comes back clean.
TEST(DensityEngine, ConditionalFlipRestoresZero) {
  auto E = program("qreg q[1];\ncreg c[1];\nh q[0];\nmeasure q[0] -> c[0];\n"
                   "if(c==1) x q[0];\nreset q[0];\n",
                   {{0, ir::WireRole::Ancilla}});
  auto L = density(E);
  ASSERT_TRUE(L);
  ASSERT_EQ(L->Events.size(), 1u);
  expectEvent(L->Events[0], ErasureKind::Reset, 0, ErasureStatus::Constant, 0);
  ASSERT_EQ(L->Ancillas.size(), 1u);
  EXPECT_EQ(L->Ancillas[0].Clean, std::optional<bool>(true));
}

// Checks a conditioned reset of a Bell half, conditioned on an independent
// uniform bit c. A = {q1, c}; S(A) = H(c) + sum_v p(v) S(q1 | c = v).
// Before: 1 + 1/2 * 1 + 1/2 * 1 = 2. After (q1 reset where c = 1):
// 1 + 1/2 * 1 + 1/2 * 0 = 1.5. Removed: 0.5 bits.
TEST(DensityEngine, ConditionalResetChargesOnlyItsBranch) {
  auto E = program("qreg q[3];\ncreg c[1];\nh q[0];\ncx q[0],q[1];\nh q[2];\n"
                   "measure q[2] -> c[0];\nif(c==1) reset q[1];\n");
  auto L = density(E);
  ASSERT_TRUE(L);
  ASSERT_EQ(L->Events.size(), 1u);
  expectEvent(L->Events[0], ErasureKind::Reset, 1, ErasureStatus::Exact, 0.5);
}

// Checks a conditioned reset where the condition fixes the qubit: where
// c = 1 the measured qubit is |1>, a basis state, so nothing is erased; the
// qubit ends |0> in both branches.
TEST(DensityEngine, ConditionalResetOfKnownValueIsConstant) {
  auto E = program("qreg q[1];\ncreg c[1];\nh q[0];\nmeasure q[0] -> c[0];\n"
                   "if(c==1) reset q[0];\n",
                   {{0, ir::WireRole::Ancilla}});
  auto L = density(E);
  ASSERT_TRUE(L);
  ASSERT_EQ(L->Events.size(), 1u);
  expectEvent(L->Events[0], ErasureKind::Reset, 0, ErasureStatus::Constant, 0);
  ASSERT_EQ(L->Ancillas.size(), 1u);
  EXPECT_EQ(L->Ancillas[0].Clean, std::optional<bool>(true));
}

// Checks that operations under a condition that never holds do nothing:
// c is never written, so it reads 0 (bits start 0, DESIGN.md), and 3 needs
// two bits of a one-bit register (OpenQASM 2.0, "if" compares the register
// as an integer).
TEST(DensityEngine, ConditionThatNeverHoldsDoesNothing) {
  auto E = program("qreg q[2];\ncreg c[1];\nif(c==1) x q[0];\nh q[1];\n"
                   "if(c==3) reset q[1];\n",
                   {{0, ir::WireRole::Ancilla}});
  auto L = density(E);
  ASSERT_TRUE(L);
  EXPECT_TRUE(L->Events.empty());
  ASSERT_EQ(L->Ancillas.size(), 1u);
  EXPECT_EQ(L->Ancillas[0].Clean, std::optional<bool>(true));
}

// Checks a measurement under a condition on the very bit it writes: where
// c = 0, q (|1> there) is measured into c, which then reads 1 like the
// branch where c already held 1, so c's old value is lost: one bit (the
// map (c, q): (0, 1) -> (1, 1), (1, 1) -> (1, 1) is not injective; its
// entropy drops from 1 to 0). A rule that saw c known where the
// measurement runs and skipped it would miss this.
TEST(DensityEngine, ConditionedMeasurementOntoItsConditionBit) {
  auto E = program("qreg q[2];\ncreg c[1];\nh q[0];\nmeasure q[0] -> c[0];\n"
                   "x q[1];\nif(c==0) measure q[1] -> c[0];\n");
  auto L = density(E);
  ASSERT_TRUE(L);
  ASSERT_EQ(L->Events.size(), 1u);
  // With A = {q1, c}: before, c is uniform and q1 = |1>: S = 1; after c = 1
  // and q1 = |1> everywhere: S = 0.
  expectEvent(L->Events[0], ErasureKind::Overwrite, 0, ErasureStatus::Exact, 1);
}

// Checks discarding garbage: one half of a Bell pair alone carries one bit
// (its reduced state is I/2), but both halves together are a pure state
// with zero entropy (Nielsen & Chuang, 2000, section 11.3), which is what
// the joint discard charges.
TEST(DensityEngine, DiscardedBellHalvesMarginalAndJoint) {
  const char *Text = "qreg q[2];\nh q[0];\ncx q[0],q[1];\n";
  {
    auto L = density(program(Text, {{1, ir::WireRole::Garbage}}));
    ASSERT_TRUE(L);
    ASSERT_EQ(L->Events.size(), 1u);
    expectEvent(L->Events[0], ErasureKind::Discard, 1, ErasureStatus::Exact, 1);
    EXPECT_TRUE(L->DiscardJoint.Exact);
    EXPECT_NEAR(L->DiscardJoint.Low, 1, Tol);
    EXPECT_NEAR(L->DiscardJoint.High, 1, Tol);
  }
  {
    auto L = density(program(
        Text, {{0, ir::WireRole::Garbage}, {1, ir::WireRole::Garbage}}));
    ASSERT_TRUE(L);
    ASSERT_EQ(L->Events.size(), 2u);
    expectEvent(L->Events[0], ErasureKind::Discard, 0, ErasureStatus::Exact, 1);
    expectEvent(L->Events[1], ErasureKind::Discard, 1, ErasureStatus::Exact, 1);
    EXPECT_TRUE(L->DiscardJoint.Exact);
    EXPECT_NEAR(L->DiscardJoint.Low, 0, Tol);
    EXPECT_NEAR(L->DiscardJoint.High, 0, Tol);
  }
}

// Checks ancilla verdicts: H H = I (common practice) returns |0>; H alone
// leaves |+>, which reads 1 with probability 1/2 (Born rule) and, being
// pure and unentangled, carries 0 bits when discarded, dirty all the same;
// X leaves |1>, dirty with probability 1 and proved constant.
TEST(DensityEngine, AncillaVerdicts) {
  auto E = program("qreg q[3];\nh q[0];\nh q[0];\nh q[1];\nx q[2];\n",
                   {{0, ir::WireRole::Ancilla},
                    {1, ir::WireRole::Ancilla},
                    {2, ir::WireRole::Ancilla}});
  auto L = density(E);
  ASSERT_TRUE(L);
  ASSERT_EQ(L->Ancillas.size(), 3u);
  EXPECT_EQ(L->Ancillas[0].Qubit, 0u);
  EXPECT_EQ(L->Ancillas[0].Clean, std::optional<bool>(true));
  ASSERT_TRUE(L->Ancillas[0].DirtyProbability);
  EXPECT_NEAR(*L->Ancillas[0].DirtyProbability, 0, Tol);
  EXPECT_EQ(L->Ancillas[1].Clean, std::optional<bool>(false));
  ASSERT_TRUE(L->Ancillas[1].DirtyProbability);
  EXPECT_NEAR(*L->Ancillas[1].DirtyProbability, 0.5, Tol);
  EXPECT_EQ(L->Ancillas[2].Clean, std::optional<bool>(false));
  EXPECT_NEAR(*L->Ancillas[2].DirtyProbability, 1, Tol);
  // q[0] ends |0>: no event. q[1] is pure |+>: 0 bits, exact. q[2] is |1>.
  ASSERT_EQ(L->Events.size(), 2u);
  expectEvent(L->Events[0], ErasureKind::Discard, 1, ErasureStatus::Exact, 0);
  expectEvent(L->Events[1], ErasureKind::Discard, 2, ErasureStatus::Constant,
              0);
  EXPECT_NEAR(L->DiscardJoint.Low, 0, Tol);
}

// Checks Bennett's uncomputation (Bennett, IBM J. Res. Dev. 17, 525
// (1973)): copying an input into an ancilla and copying again restores the
// ancilla; a single copy leaves it holding a uniform bit, dirty with
// probability 1/2 and one bit when discarded.
TEST(DensityEngine, CopyOfInputCleanOnlyWhenUncomputed) {
  {
    auto L = density(
        program("qreg q[2];\ncx q[0],q[1];\ncx q[0],q[1];\n",
                {{0, ir::WireRole::Input}, {1, ir::WireRole::Ancilla}}));
    ASSERT_TRUE(L);
    ASSERT_EQ(L->Ancillas.size(), 1u);
    EXPECT_EQ(L->Ancillas[0].Clean, std::optional<bool>(true));
    EXPECT_TRUE(L->Events.empty());
  }
  {
    auto L = density(
        program("qreg q[2];\ncx q[0],q[1];\n",
                {{0, ir::WireRole::Input}, {1, ir::WireRole::Ancilla}}));
    ASSERT_TRUE(L);
    ASSERT_EQ(L->Ancillas.size(), 1u);
    EXPECT_EQ(L->Ancillas[0].Clean, std::optional<bool>(false));
    EXPECT_NEAR(*L->Ancillas[0].DirtyProbability, 0.5, Tol);
    ASSERT_EQ(L->Events.size(), 1u);
    expectEvent(L->Events[0], ErasureKind::Discard, 1, ErasureStatus::Exact, 1);
    EXPECT_NEAR(L->DiscardJoint.Low, 1, Tol);
  }
}

// Checks the joint discard of wide sets. Five copies of one uniformly
// random input bit carry one bit together: H(X, X, ..., X) = H(X) = 1
// (Shannon, Bell Syst. Tech. J. 27, 379 (1948)). Four measured |+> qubits
// and one copy of an input are five independent uniform bits: 5 bits.
TEST(DensityEngine, JointDiscardOfWideSets) {
  std::vector<std::pair<uint32_t, ir::WireRole>> Roles = {
      {0, ir::WireRole::Input}};
  for (uint32_t Q = 1; Q < 6; ++Q)
    Roles.push_back({Q, ir::WireRole::Garbage});
  {
    auto L = density(program("qreg q[6];\ncx q[0],q[1];\ncx q[0],q[2];\n"
                             "cx q[0],q[3];\ncx q[0],q[4];\ncx q[0],q[5];\n",
                             Roles));
    ASSERT_TRUE(L);
    EXPECT_EQ(L->Events.size(), 5u);
    EXPECT_TRUE(L->DiscardJoint.Exact);
    EXPECT_NEAR(L->DiscardJoint.Low, 1, Tol);
  }
  {
    std::string Text = "qreg q[6];\ncreg c[4];\ncx q[0],q[5];\n";
    for (unsigned Q = 1; Q < 5; ++Q)
      Text += fmt::format("h q[{0}];\nmeasure q[{0}] -> c[{1}];\n", Q, Q - 1);
    auto L = density(program(Text, Roles));
    ASSERT_TRUE(L);
    EXPECT_TRUE(L->DiscardJoint.Exact);
    EXPECT_NEAR(L->DiscardJoint.Low, 5, Tol);
  }
}

// Checks that an opaque gate, which has no unitary, stops the engine with a
// diagnostic at the call.
TEST(DensityEngine, OpaqueGateIsAnError) {
  auto E = program("opaque magic a;\nqreg q[1];\nh q[0];\nmagic q[0];\n");
  EXPECT_EQ(densityError(E),
            "test.qasm:6:1: error: gate 'magic' is opaque; the density engine "
            "needs the unitary of every gate\n"
            "magic q[0];\n"
            "^\n");
}

// Checks that the work limit counts classical branches: 4 qubits (4^4 = 256
// entries), 1000 gates. On one branch that is 256,000 updates; after three
// measurements of superposed qubits it is 8 branches and about 2 million,
// past a limit of 2^20, which the estimate made beforehand (ops x 4^n)
// cannot see. Under auto the run stops and the classical engine reports;
// its reason says why. (The limit is the engine's own: no outside source.)
TEST(DensityEngine, WorkLimitCountsBranches) {
  std::string Gates;
  for (int I = 0; I < 250; ++I)
    Gates += "h q[0];\ncx q[0],q[1];\nh q[2];\ncx q[2],q[3];\n";
  std::string Branching = "h q[1];\nh q[2];\nh q[3];\nmeasure q[1] -> c[1];\n"
                          "measure q[2] -> c[2];\nmeasure q[3] -> c[3];\n";
  std::string Head = "qreg q[4];\ncreg c[4];\n";
  EngineOptions Opts;
  Opts.MaxAutoDensityWork = uint64_t(1) << 20;
  // A reset makes the auto engine look past the structural shortcut.
  auto OneBranch = program(Head + Gates + "reset q[0];\n");
  auto Branched = program(Head + Branching + Gates + "reset q[0];\n");
  ASSERT_TRUE(OneBranch.Circuit && Branched.Circuit);
  llvm::Expected<Ledger> A = runEngine(*OneBranch.Circuit, Opts);
  ASSERT_TRUE(bool(A)) << llvm::toString(A.takeError());
  EXPECT_EQ(A->Engine, EngineKind::Density) << A->Reason;
  llvm::Expected<Ledger> B = runEngine(*Branched.Circuit, Opts);
  ASSERT_TRUE(bool(B)) << llvm::toString(B.takeError());
  EXPECT_NE(B->Engine, EngineKind::Density);
  EXPECT_NE(B->Reason.find("matrix-entry updates"), std::string::npos)
      << B->Reason;
  // An explicit density run stops at its own limit, with the location.
  Opts.Choice = EngineChoice::Density;
  Opts.MaxDensityWork = uint64_t(1) << 20;
  EXPECT_NE(densityError(Branched, Opts).find("test.qasm:"), std::string::npos);
}

// Checks the qubit limit: the message names the count and the limit.
TEST(DensityEngine, TooManyQubitsIsAnError) {
  auto E = program("qreg q[4];\nh q[0];\nh q[1];\nh q[2];\nh q[3];\n");
  EngineOptions Opts;
  Opts.MaxDensityQubits = 3;
  EXPECT_EQ(densityError(E, Opts),
            "the circuit acts on 4 qubits, more than the density engine's "
            "limit of 3 (--max-density-qubits)");
}

// Checks that declared but untouched qubits are not simulated: 30 declared,
// two used, with a limit of 2. An untouched ancilla stays |0> (clean), an
// untouched garbage qubit carries nothing.
TEST(DensityEngine, UntouchedQubitsDoNotCount) {
  auto E = program("qreg q[30];\nh q[0];\ncx q[0],q[29];\nbarrier q;\n"
                   "reset q[29];\n",
                   {{5, ir::WireRole::Ancilla},
                    {7, ir::WireRole::Garbage},
                    {9, ir::WireRole::Input}});
  EngineOptions Opts;
  Opts.MaxDensityQubits = 2;
  auto L = density(E, Opts);
  ASSERT_TRUE(L);
  ASSERT_EQ(L->Events.size(), 1u);
  expectEvent(L->Events[0], ErasureKind::Reset, 29, ErasureStatus::Exact, 1);
  ASSERT_EQ(L->Ancillas.size(), 1u);
  EXPECT_EQ(L->Ancillas[0].Qubit, 5u);
  EXPECT_EQ(L->Ancillas[0].Clean, std::optional<bool>(true));
  EXPECT_TRUE(L->DiscardJoint.Exact);
  EXPECT_NEAR(L->DiscardJoint.High, 0, Tol);
}

//===----------------------------------------------------------------------===//
// Brute force: qubits and bits as the wires of one dense density matrix.
//===----------------------------------------------------------------------===//

using Complex = std::complex<double>;
using Mat = Eigen::MatrixXcd;

class BruteForce {
public:
  /// `Wires` wires, bit w of the basis index being wire w; the wires in
  /// `Mixed` start maximally mixed, the others |0>.
  BruteForce(unsigned Wires, uint64_t Mixed)
      : Wires(Wires), Dim(uint64_t(1) << Wires),
        Rho(Mat::Zero(Eigen::Index(Dim), Eigen::Index(Dim))) {
    double P = std::ldexp(1.0, -__builtin_popcountll(Mixed));
    for (uint64_t R = 0; R < Dim; ++R)
      if ((R & ~Mixed) == 0)
        Rho(Eigen::Index(R), Eigen::Index(R)) = P;
  }

  /// The full operator that acts as `Local` on `On` (bit i of Local's index
  /// is wire On[i]) and as the identity elsewhere.
  Mat lift(const Mat &Local, const std::vector<unsigned> &On) const {
    Mat Full = Mat::Zero(Eigen::Index(Dim), Eigen::Index(Dim));
    uint64_t Mask = 0;
    for (unsigned W : On)
      Mask |= uint64_t(1) << W;
    for (uint64_t R = 0; R < Dim; ++R)
      for (uint64_t C = 0; C < Dim; ++C)
        if ((R & ~Mask) == (C & ~Mask))
          Full(Eigen::Index(R), Eigen::Index(C)) =
              Local(Eigen::Index(local(R, On)), Eigen::Index(local(C, On)));
    return Full;
  }

  /// The projector onto the basis states whose `Bits` read `Value` (bit i
  /// of Value is Bits[i]), or onto the others.
  Mat conditionProjector(const std::vector<unsigned> &Bits, uint64_t Value,
                         bool Holds) const {
    Mat P = Mat::Zero(Eigen::Index(Dim), Eigen::Index(Dim));
    for (uint64_t R = 0; R < Dim; ++R)
      if ((local(R, Bits) == Value) == Holds)
        P(Eigen::Index(R), Eigen::Index(R)) = 1;
    return P;
  }

  void applyKraus(const std::vector<Mat> &Kraus) {
    Mat Out = Mat::Zero(Rho.rows(), Rho.cols());
    for (const Mat &K : Kraus)
      Out += K * Rho * K.adjoint();
    Rho = Out;
  }

  Mat reduced(const std::vector<unsigned> &Keep) const {
    uint64_t Size = uint64_t(1) << Keep.size();
    Mat Out = Mat::Zero(Eigen::Index(Size), Eigen::Index(Size));
    for (uint64_t R = 0; R < Dim; ++R)
      for (uint64_t C = 0; C < Dim; ++C) {
        bool SameRest = true;
        for (unsigned W = 0; W < Wires; ++W)
          if (std::find(Keep.begin(), Keep.end(), W) == Keep.end() &&
              (R >> W & 1) != (C >> W & 1))
            SameRest = false;
        if (SameRest)
          Out(Eigen::Index(local(R, Keep)), Eigen::Index(local(C, Keep))) +=
              Rho(Eigen::Index(R), Eigen::Index(C));
      }
    return Out;
  }

  double entropy(const std::vector<unsigned> &Keep) const {
    if (Keep.empty())
      return 0;
    Eigen::SelfAdjointEigenSolver<Mat> S(reduced(Keep), Eigen::EigenvaluesOnly);
    double H = 0;
    for (Eigen::Index I = 0; I < S.eigenvalues().size(); ++I) {
      double L = S.eigenvalues()(I);
      if (L > 1e-14)
        H -= L * std::log2(L);
    }
    return H;
  }

private:
  static uint64_t local(uint64_t Index, const std::vector<unsigned> &On) {
    uint64_t L = 0;
    for (unsigned I = 0; I < On.size(); ++I)
      L |= (Index >> On[I] & 1) << I;
    return L;
  }

  unsigned Wires;
  uint64_t Dim;
  Mat Rho;
};

/// One gate of the reference's gate set, as its standard matrix (common
/// practice; OpenQASM 2.0's qelib1.inc defines the same gates up to a
/// global phase), and the part of a user gate's body it stands for.
struct Piece {
  Mat U;
  std::vector<unsigned> Args; // indices into the call's qubits
};

Mat permutationMatrix(unsigned Qubits, uint64_t (*Map)(uint64_t)) {
  uint64_t Size = uint64_t(1) << Qubits;
  Mat U = Mat::Zero(Eigen::Index(Size), Eigen::Index(Size));
  for (uint64_t I = 0; I < Size; ++I)
    U(Eigen::Index(Map(I)), Eigen::Index(I)) = 1;
  return U;
}

Mat oneQubit(Complex A, Complex B, Complex C, Complex D) {
  Mat U(2, 2);
  U << A, B, C, D;
  return U;
}

/// The pieces of a call of `Name`: one for a library gate, the body for the
/// test's own gates (which the engine takes whole or expands).
std::vector<Piece> pieces(const std::string &Name, double Theta) {
  const Complex I(0, 1);
  double C = std::cos(Theta / 2), S = std::sin(Theta / 2);
  auto Phase = [&](double Phi) { return oneQubit(1, 0, 0, std::exp(I * Phi)); };
  auto Ry = [](double T) {
    return oneQubit(std::cos(T / 2), -std::sin(T / 2), std::sin(T / 2),
                    std::cos(T / 2));
  };
  if (Name == "h")
    return {{oneQubit(1, 1, 1, -1) / std::sqrt(2.0), {0}}};
  if (Name == "x")
    return {{oneQubit(0, 1, 1, 0), {0}}};
  if (Name == "y")
    return {{oneQubit(0, -I, I, 0), {0}}};
  if (Name == "z")
    return {{Phase(std::numbers::pi), {0}}};
  if (Name == "s")
    return {{Phase(std::numbers::pi / 2), {0}}};
  if (Name == "sdg")
    return {{Phase(-std::numbers::pi / 2), {0}}};
  if (Name == "t")
    return {{Phase(std::numbers::pi / 4), {0}}};
  if (Name == "tdg")
    return {{Phase(-std::numbers::pi / 4), {0}}};
  if (Name == "ry")
    return {{Ry(Theta), {0}}};
  if (Name == "rz")
    return {
        {oneQubit(std::exp(-I * Theta / 2.0), 0, 0, std::exp(I * Theta / 2.0)),
         {0}}};
  if (Name == "rx")
    return {{oneQubit(C, -I * S, -I * S, C), {0}}};
  if (Name == "cx")
    return {
        {permutationMatrix(2, [](uint64_t L) { return L ^ ((L & 1) << 1); }),
         {0, 1}}};
  if (Name == "swap")
    return {
        {permutationMatrix(2, [](uint64_t L) { return (L & 1) << 1 | L >> 1; }),
         {0, 1}}};
  if (Name == "cz") {
    Mat U = Mat::Identity(4, 4);
    U(3, 3) = -1;
    return {{U, {0, 1}}};
  }
  if (Name == "crz") {
    // Control = argument 0 (bit 0); target gets Rz(theta) where it is 1.
    Mat U = Mat::Identity(4, 4);
    U(1, 1) = std::exp(-I * Theta / 2.0);
    U(3, 3) = std::exp(I * Theta / 2.0);
    return {{U, {0, 1}}};
  }
  if (Name == "ccx")
    return {
        {permutationMatrix(
             3, [](uint64_t L) { return L ^ ((L & 1) & (L >> 1 & 1)) << 2; }),
         {0, 1, 2}}};
  if (Name == "cswap")
    return {{permutationMatrix(3,
                               [](uint64_t L) {
                                 if (!(L & 1))
                                   return L;
                                 return 1 | (L >> 1 & 1) << 2 |
                                        (L >> 2 & 1) << 1;
                               }),
             {0, 1, 2}}};
  // The test's own gates; their bodies are in `Definitions` below.
  auto Cx = pieces("cx", 0)[0].U;
  if (Name == "cry2")
    return {{Ry(Theta / 2), {1}},
            {Cx, {0, 1}},
            {Ry(-Theta / 2), {1}},
            {Cx, {0, 1}}};
  if (Name == "g3")
    return {{pieces("h", 0)[0].U, {0}},
            {pieces("ccx", 0)[0].U, {0, 1, 2}},
            {Ry(0.7), {2}},
            {Cx, {2, 0}},
            {pieces("t", 0)[0].U, {1}}};
  if (Name == "g4") {
    std::vector<Piece> P = pieces("g3", 0);
    P.push_back({Cx, {2, 3}});
    P.push_back({pieces("h", 0)[0].U, {3}});
    P.push_back({pieces("cz", 0)[0].U, {0, 3}});
    return P;
  }
  ADD_FAILURE() << "no reference matrix for " << Name;
  return {};
}

const char *Definitions =
    "gate cry2(th) a,b { ry(th/2) b; cx a,b; ry(-th/2) b; cx a,b; }\n"
    "gate g3 a,b,c { h a; ccx a,b,c; ry(0.7) c; cx c,a; t b; }\n"
    "gate g4 a,b,c,d { g3 a,b,c; cx c,d; h d; cz a,d; }\n";

struct GateKind {
  const char *Name;
  unsigned Arity;
  bool HasAngle;
};
const GateKind GateKinds[] = {
    {"h", 1, false},   {"x", 1, false},     {"y", 1, false},  {"z", 1, false},
    {"s", 1, false},   {"sdg", 1, false},   {"t", 1, false},  {"tdg", 1, false},
    {"ry", 1, true},   {"rz", 1, true},     {"rx", 1, true},  {"cx", 2, false},
    {"cz", 2, false},  {"swap", 2, false},  {"crz", 2, true}, {"cry2", 2, true},
    {"ccx", 3, false}, {"cswap", 3, false}, {"g3", 3, false}, {"g4", 4, false},
};

/// A random circuit on 4 qubits and a 2-bit register, as text and as the
/// reference's operations; checks every event of the engine against the
/// reference's S(A before) - S(A after), and the discards and ancillas.
void checkAgainstBruteForce(unsigned Seed) {
  constexpr unsigned Qubits = 4, Bits = 2;
  std::mt19937 Rng(Seed);
  auto Pick = [&](unsigned N) { return unsigned(Rng() % N); };
  std::vector<std::pair<uint32_t, ir::WireRole>> Roles;
  uint64_t Mixed = 0;
  for (uint32_t Q = 0; Q < Qubits; ++Q) {
    ir::WireRole R = ir::WireRole(Pick(4));
    Roles.push_back({Q, R});
    if (R == ir::WireRole::Input)
      Mixed |= uint64_t(1) << Q;
  }
  // Reference wires: qubits 0..3, then bits as wires 4, 5.
  BruteForce Ref(Qubits + Bits, Mixed);
  std::vector<unsigned> CondWires = {Qubits, Qubits + 1};
  std::string Text = std::string(Definitions) +
                     fmt::format("qreg q[{}];\ncreg c[{}];\n", Qubits, Bits);
  std::vector<double> Removed; // per op, the reference's bits (-1: none)
  for (unsigned Step = 0; Step < 40; ++Step) {
    std::string Cond;
    std::optional<uint64_t> CondValue;
    if (Pick(5) == 0) {
      CondValue = Pick(4);
      Cond = fmt::format("if(c=={}) ", *CondValue);
    }
    auto Conditioned = [&](std::vector<Mat> Kraus) {
      if (!CondValue)
        return Kraus;
      Mat Holds = Ref.conditionProjector(CondWires, *CondValue, true);
      for (Mat &K : Kraus)
        K = K * Holds;
      Kraus.push_back(Ref.conditionProjector(CondWires, *CondValue, false));
      return Kraus;
    };
    unsigned What = Pick(20);
    if (What == 0) {
      Text += "barrier q;\n";
      Removed.push_back(-1);
      continue;
    }
    if (What <= 2) {
      unsigned Q = Pick(Qubits);
      std::vector<unsigned> A = {Q};
      if (CondValue)
        A.insert(A.end(), CondWires.begin(), CondWires.end());
      double Before = Ref.entropy(A);
      Ref.applyKraus(Conditioned({Ref.lift(oneQubit(1, 0, 0, 0), {Q}),
                                  Ref.lift(oneQubit(0, 1, 0, 0), {Q})}));
      Removed.push_back(std::max(0.0, Before - Ref.entropy(A)));
      Text += Cond + fmt::format("reset q[{}];\n", Q);
      continue;
    }
    if (What <= 4) {
      unsigned Q = Pick(Qubits), B = Pick(Bits);
      std::vector<unsigned> A = {Q, Qubits + B};
      if (CondValue)
        A = {Q, Qubits, Qubits + 1};
      double Before = Ref.entropy(A);
      // Kraus |o><o|_q (x) |o><v|_c: q read in the basis, c's old value v
      // dropped.
      std::vector<Mat> Kraus;
      for (unsigned Out = 0; Out < 2; ++Out)
        for (unsigned Old = 0; Old < 2; ++Old) {
          Mat K = Mat::Zero(4, 4);
          K(Out + 2 * Out, Out + 2 * Old) = 1;
          Kraus.push_back(Ref.lift(K, {Q, Qubits + B}));
        }
      Ref.applyKraus(Conditioned(Kraus));
      Removed.push_back(std::max(0.0, Before - Ref.entropy(A)));
      Text += Cond + fmt::format("measure q[{}] -> c[{}];\n", Q, B);
      continue;
    }
    const GateKind &G = GateKinds[Pick(std::size(GateKinds))];
    std::vector<unsigned> On;
    while (On.size() < G.Arity) {
      unsigned Q = Pick(Qubits);
      if (std::find(On.begin(), On.end(), Q) == On.end())
        On.push_back(Q);
    }
    double Theta = (Pick(1000) / 1000.0 - 0.5) * 4 * std::numbers::pi;
    for (const Piece &P : pieces(G.Name, Theta)) {
      std::vector<unsigned> Wires;
      for (unsigned A : P.Args)
        Wires.push_back(On[A]);
      Ref.applyKraus(Conditioned({Ref.lift(P.U, Wires)}));
    }
    Text += Cond + G.Name;
    if (G.HasAngle)
      Text += fmt::format("({:.17g})", Theta);
    for (unsigned I = 0; I < On.size(); ++I)
      Text += fmt::format("{}q[{}]", I ? "," : " ", On[I]);
    Text += ";\n";
    Removed.push_back(-1);
  }
  SCOPED_TRACE(Text);
  test::Elaborated E = program(Text, Roles);
  std::optional<Ledger> L = density(E);
  ASSERT_TRUE(L);
  const ir::Circuit &C = *E.Circuit;
  ASSERT_EQ(C.Ops.size(), Removed.size());

  size_t Next = 0;
  for (size_t I = 0; I < C.Ops.size(); ++I) {
    if (Removed[I] < 0)
      continue;
    if (Next < L->Events.size() &&
        L->Events[Next].Kind != ErasureKind::Discard &&
        L->Events[Next].Loc == C.Ops[I].Loc) {
      EXPECT_NEAR(L->Events[Next].BitsLow, Removed[I], Tol) << "op " << I;
      EXPECT_NEAR(L->Events[Next].BitsHigh, Removed[I], Tol) << "op " << I;
      ++Next;
    } else {
      // No event: the operation provably erased nothing.
      EXPECT_NEAR(Removed[I], 0, Tol) << "op " << I;
    }
  }
  std::vector<unsigned> Discarded;
  for (uint32_t Q = 0; Q < Qubits; ++Q) {
    if (!ir::isDiscarded(C.role(Q)))
      continue;
    Discarded.push_back(Q);
    double S = Ref.entropy({Q});
    double P1 = Ref.reduced({Q})(1, 1).real();
    bool Expected = S > Tol || P1 > Tol;
    bool Found = Next < L->Events.size() && L->Events[Next].Wire == Q &&
                 L->Events[Next].Kind == ErasureKind::Discard;
    EXPECT_EQ(Found, Expected) << "discard of q[" << Q << "]";
    if (Found) {
      EXPECT_NEAR(L->Events[Next].BitsLow, S, Tol)
          << "discard of q[" << Q << "]";
      ++Next;
    }
    if (C.role(Q) == ir::WireRole::Ancilla) {
      auto It =
          std::find_if(L->Ancillas.begin(), L->Ancillas.end(),
                       [&](const AncillaVerdict &V) { return V.Qubit == Q; });
      ASSERT_NE(It, L->Ancillas.end());
      ASSERT_TRUE(It->DirtyProbability);
      EXPECT_NEAR(*It->DirtyProbability, P1, Tol);
      EXPECT_EQ(It->Clean, std::optional<bool>(P1 <= Tol));
    }
  }
  EXPECT_EQ(Next, L->Events.size());
  EXPECT_TRUE(L->DiscardJoint.Exact);
  EXPECT_NEAR(L->DiscardJoint.Low, Ref.entropy(Discarded), Tol);
}

// Checks random circuits of every gate class (diagonal, permutation,
// monomial, general; one to four qubits; taken whole or expanded), resets,
// measurements and conditions against the brute-force simulator (computed
// here by brute force).
TEST(DensityEngine, MatchesBruteForceOnRandomCircuits) {
  for (unsigned Seed = 1; Seed <= 12; ++Seed) {
    SCOPED_TRACE(Seed);
    checkAgainstBruteForce(Seed);
  }
}

/// A Haar-like random unitary: the Q of a random complex matrix (common
/// practice; any unitary will do here).
Mat randomUnitary(unsigned Size, std::mt19937 &Rng) {
  std::normal_distribution<double> Normal;
  Mat A(Size, Size);
  for (unsigned R = 0; R < Size; ++R)
    for (unsigned C = 0; C < Size; ++C)
      A(R, C) = Complex(Normal(Rng), Normal(Rng));
  return Eigen::HouseholderQR<Mat>(A).householderQ();
}

/// A random density matrix: A A^+ / Tr(A A^+).
Mat randomState(unsigned N, std::mt19937 &Rng) {
  Mat A = randomUnitary(1u << N, Rng) * Mat::Random(1 << N, 1 << N);
  Mat Rho = A * A.adjoint();
  return Rho / Rho.trace();
}

// Checks each kernel of the engine (diagonal, one-qubit phase, permutation,
// monomial, fused one-qubit, general two and three qubits) on every
// placement of its qubits, in and out of order, against U rho U^+ with U
// lifted to the full space (computed here by brute force).
TEST(DensityKernels, MatchFullMatrixProducts) {
  std::mt19937 Rng(7);
  std::vector<Mat> Gates;
  for (const char *Name :
       {"h", "y", "t", "rx", "cx", "cz", "crz", "swap", "ccx", "cswap"})
    Gates.push_back(pieces(Name, 0.9)[0].U);
  Gates.push_back(randomUnitary(2, Rng));
  Gates.push_back(randomUnitary(4, Rng));
  Gates.push_back(randomUnitary(8, Rng));
  // A three-qubit diagonal and a monomial with phases.
  Mat Diagonal = Mat::Zero(8, 8), Monomial = Mat::Zero(8, 8);
  for (unsigned I = 0; I < 8; ++I) {
    Diagonal(I, I) = std::polar(1.0, 0.37 * I * I);
    Monomial((I * 3 + 1) % 8, I) = std::polar(1.0, 1.1 * I);
  }
  Gates.push_back(Diagonal);
  Gates.push_back(Monomial);
  constexpr unsigned N = 4;
  for (const Mat &U : Gates) {
    unsigned Arity = unsigned(std::countr_zero(uint64_t(U.rows())));
    std::vector<unsigned> Qs(N);
    std::iota(Qs.begin(), Qs.end(), 0u);
    do {
      std::vector<unsigned> On(Qs.begin(), Qs.begin() + Arity);
      Mat Rho = randomState(N, Rng);
      BruteForce Lift(N, 0);
      Mat Full = Lift.lift(U, On);
      Mat Want = Full * Rho * Full.adjoint();
      for (ir::UnitaryClass Class :
           {ir::classify(U), ir::UnitaryClass::General}) {
        Mat Got = Rho;
        density::GateKernel(U, Class, On, N).apply(Got.data());
        EXPECT_LT((Got - Want).cwiseAbs().maxCoeff(), 1e-12)
            << "class " << ir::unitaryClassName(Class) << "\n"
            << U;
      }
    } while (std::next_permutation(Qs.begin(), Qs.end()));
  }
}

// Checks reset, projection, outcome weights and partial traces against
// Kraus sums and explicit traces (computed here by brute force).
TEST(DensityKernels, MatchKrausSumsAndPartialTraces) {
  std::mt19937 Rng(11);
  constexpr unsigned N = 4;
  for (unsigned Q = 0; Q < N; ++Q) {
    Mat Rho = randomState(N, Rng);
    BruteForce Lift(N, 0);
    Mat K0 = Lift.lift(oneQubit(1, 0, 0, 0), {Q});
    Mat K1 = Lift.lift(oneQubit(0, 1, 0, 0), {Q});
    Mat P1 = Lift.lift(oneQubit(0, 0, 0, 1), {Q});
    Mat Got = Rho;
    density::resetQubit(Got.data(), N, Q);
    Mat Want = K0 * Rho * K0.adjoint() + K1 * Rho * K1.adjoint();
    EXPECT_LT((Got - Want).cwiseAbs().maxCoeff(), 1e-14);
    for (bool One : {false, true}) {
      Mat P = One ? P1 : K0;
      Got = Rho;
      density::keepOutcome(Got.data(), N, Q, One);
      EXPECT_LT((Got - P * Rho * P).cwiseAbs().maxCoeff(), 1e-14);
      EXPECT_NEAR(density::outcomeWeight(Rho.data(), N, Q, One),
                  (P * Rho).trace().real(), 1e-14);
    }
  }
  Mat Rho = randomState(N, Rng);
  for (std::vector<unsigned> Keep : std::vector<std::vector<unsigned>>{
           {2}, {3, 0}, {1, 2, 3}, {0, 1, 2, 3}}) {
    Mat Want = Mat::Zero(1 << Keep.size(), 1 << Keep.size());
    for (uint64_t R = 0; R < (1u << N); ++R)
      for (uint64_t C = 0; C < (1u << N); ++C) {
        uint64_t KeepMask = 0, LR = 0, LC = 0;
        for (unsigned I = 0; I < Keep.size(); ++I) {
          KeepMask |= uint64_t(1) << Keep[I];
          LR |= (R >> Keep[I] & 1) << I;
          LC |= (C >> Keep[I] & 1) << I;
        }
        if ((R & ~KeepMask) == (C & ~KeepMask))
          Want(Eigen::Index(LR), Eigen::Index(LC)) +=
              Rho(Eigen::Index(R), Eigen::Index(C));
      }
    Mat Got = Mat::Zero(Want.rows(), Want.cols());
    density::addPartialTrace(Rho.data(), N, Keep, Got);
    EXPECT_LT((Got - Want).cwiseAbs().maxCoeff(), 1e-14);
  }
}

} // namespace
} // namespace revbound::semantics
