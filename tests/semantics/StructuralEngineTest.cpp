//===- StructuralEngineTest.cpp - Basis-value propagation -----------------===//
//
// The structural engine proves a value constant only by propagating basis
// values through gates that map basis states to basis states (DESIGN.md,
// "Semantics tiers"); every other erased bit is the interval [0, 1]. The
// expected constants below follow from the gates' truth tables (x, cx, ccx:
// Nielsen & Chuang, Quantum Computation and Quantum Information, 2000,
// section 1.3) and from |0> being the start state of every qubit
// (OpenQASM 2.0 specification, Cross et al., arXiv:1707.03429, section 3).
//
//===----------------------------------------------------------------------===//
#include "TestSupport.h"

#include "revbound/semantics/Engines.h"

#include <gtest/gtest.h>

using namespace revbound;
using semantics::ErasureKind;
using semantics::ErasureStatus;

namespace {

semantics::Ledger structural(const std::string &Body) {
  auto E = test::elaborate("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n" + Body);
  EXPECT_TRUE(E.Circuit) << E.Error;
  if (!E.Circuit)
    return {};
  return semantics::runStructural(*E.Circuit, semantics::EngineOptions());
}

TEST(StructuralEngine, ResetOfAKnownQubitIsConstant) {
  // x then cx from a known 1: both qubits are known to be 1.
  semantics::Ledger L = structural("qreg q[2];\nx q[0];\ncx q[0], q[1];\n"
                                   "reset q[1];\nreset q[0];\n");
  ASSERT_EQ(L.Events.size(), 2u);
  for (const semantics::ErasureEvent &E : L.Events) {
    EXPECT_EQ(E.Kind, ErasureKind::Reset);
    EXPECT_EQ(E.Status, ErasureStatus::Constant);
    EXPECT_EQ(E.BitsHigh, 0);
  }
}

TEST(StructuralEngine, SuperpositionsAndInputsAreUnknown) {
  semantics::Ledger L =
      structural("//! input a\nqreg a[1];\nqreg q[1];\nh q[0];\nreset q[0];\n"
                 "reset a[0];\n");
  ASSERT_EQ(L.Events.size(), 2u);
  for (const semantics::ErasureEvent &E : L.Events) {
    EXPECT_EQ(E.Status, ErasureStatus::Unknown);
    EXPECT_EQ(E.BitsLow, 0);
    EXPECT_EQ(E.BitsHigh, 1);
  }
}

TEST(StructuralEngine, PhasesKeepBasisValues) {
  // t, s, z and rz only add phases, so a known value stays known.
  semantics::Ledger L = structural(
      "qreg q[1];\nx q[0];\nt q[0];\ns q[0];\nz q[0];\nrz(0.3) q[0];\n"
      "reset q[0];\n");
  ASSERT_EQ(L.Events.size(), 1u);
  EXPECT_EQ(L.Events[0].Status, ErasureStatus::Constant);
}

TEST(StructuralEngine, PartlyKnownInputsOfAPermutation) {
  // ccx with one control known 0 leaves the target alone whatever the other
  // control holds; with a control known 1 and the other unknown it does not.
  semantics::Ledger L = structural(
      "//! input a\nqreg a[1];\nqreg z[1];\nqreg t[2];\n"
      "ccx a[0], z[0], t[0];\nx z[0];\nccx a[0], z[0], t[1];\n"
      "reset t[0];\nreset t[1];\n");
  ASSERT_EQ(L.Events.size(), 2u);
  EXPECT_EQ(L.Events[0].Status, ErasureStatus::Constant);
  EXPECT_EQ(L.Events[1].Status, ErasureStatus::Unknown);
}

TEST(StructuralEngine, MeasureIntoAKnownBitIsNoEvent) {
  // The first measure overwrites a bit known to be 0; the second overwrites
  // the unknown outcome of the first.
  semantics::Ledger L =
      structural("qreg q[1];\ncreg c[1];\nh q[0];\nmeasure q[0] -> c[0];\n"
                 "measure q[0] -> c[0];\n");
  ASSERT_EQ(L.Events.size(), 1u);
  EXPECT_EQ(L.Events[0].Kind, ErasureKind::Overwrite);
  EXPECT_EQ(L.Events[0].Wire, 0u);
  EXPECT_EQ(L.Events[0].Status, ErasureStatus::Unknown);
}

TEST(StructuralEngine, KnownConditionsAreDecided) {
  // c is known 0, so `if (c == 1)` never runs and `if (c == 0)` always does.
  semantics::Ledger L =
      structural("qreg q[2];\ncreg c[1];\nmeasure q[0] -> c[0];\n"
                 "if (c == 1) x q[1];\nif (c == 0) x q[1];\nreset q[1];\n");
  ASSERT_EQ(L.Events.size(), 1u);
  EXPECT_EQ(L.Events[0].Status, ErasureStatus::Constant);
  semantics::Ledger Open =
      structural("qreg q[2];\ncreg c[1];\nh q[0];\nmeasure q[0] -> c[0];\n"
                 "if (c == 1) x q[1];\nreset q[1];\n");
  ASSERT_EQ(Open.Events.size(), 1u);
  EXPECT_EQ(Open.Events[0].Status, ErasureStatus::Unknown);
}

TEST(StructuralEngine, AncillaVerdicts) {
  semantics::Ledger L = structural(
      "//! input a\n//! ancilla k, d, u\nqreg a[1];\nqreg k[1];\nqreg d[1];\n"
      "qreg u[1];\nx k[0];\nx k[0];\nx d[0];\ncx a[0], u[0];\n");
  ASSERT_EQ(L.Ancillas.size(), 3u);
  EXPECT_EQ(L.Ancillas[0].Clean, true);  // x x returns it to 0
  EXPECT_EQ(L.Ancillas[1].Clean, false); // known 1: dirty for every input
  EXPECT_TRUE(L.Ancillas[1].HasCounterexample);
  EXPECT_EQ(L.Ancillas[2].Clean, std::nullopt); // copies an input
  // The dirty ones are discards; the constant one removes no entropy.
  ASSERT_EQ(L.Events.size(), 2u);
  EXPECT_EQ(L.Events[0].Kind, ErasureKind::Discard);
  EXPECT_EQ(L.Events[0].Status, ErasureStatus::Constant);
  EXPECT_EQ(L.Events[1].Status, ErasureStatus::Unknown);
  EXPECT_EQ(L.DiscardJoint.High, 1);
  EXPECT_FALSE(L.DiscardJoint.Exact);
}

TEST(StructuralEngine, WholeUserGatesThatArePermutations) {
  // A gate body that makes and undoes a superposition is, as a whole, the
  // identity: taken whole, it keeps the qubit known. h x h = z (a phase).
  semantics::Ledger L = structural(
      "gate hxh a { h a; x a; h a; }\nqreg q[1];\nhxh q[0];\nreset q[0];\n");
  ASSERT_EQ(L.Events.size(), 1u);
  EXPECT_EQ(L.Events[0].Status, ErasureStatus::Constant);
}

std::string nested(const std::string &Leaf, int Levels) {
  std::string Body = "gate g0 a { " + Leaf + " }\n";
  for (int I = 1; I <= Levels; ++I)
    Body += "gate g" + std::to_string(I) + " a { g" + std::to_string(I - 1) +
            " a; g" + std::to_string(I - 1) + " a; }\n";
  return Body + "qreg q[1];\nx q[0];\ng" + std::to_string(Levels) +
         " q[0];\nreset q[0];\n";
}

TEST(StructuralEngine, HugeNestedCircuitsAreTakenWhole) {
  // 2^40 applications of x, far past the expansion budget: the call is
  // taken whole through its unitary, x^(2^40) = identity since x x = I
  // (common practice), so the qubit stays known. (h h = I too, but 40
  // squarings of a rounded h drift past the classifier's tolerance.)
  semantics::Ledger Identity = structural(nested("x a;", 40));
  ASSERT_EQ(Identity.Events.size(), 1u);
  EXPECT_EQ(Identity.Events[0].Status, ErasureStatus::Constant);
  // (h t)^(2^40) is no permutation (h t has eigenvalues that are not roots
  // of unity of small order), so the whole call leaves the qubit unknown.
  semantics::Ledger General = structural(nested("h a; t a;", 40));
  ASSERT_EQ(General.Events.size(), 1u);
  EXPECT_EQ(General.Events[0].Status, ErasureStatus::Unknown);
  EXPECT_EQ(General.Events[0].BitsHigh, 1);
}

TEST(StructuralEngine, NothingToEraseSkipsTheEngines) {
  auto E = test::elaborate("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                           "qreg q[2];\nh q[0];\ncx q[0], q[1];\n");
  ASSERT_TRUE(E.Circuit);
  llvm::Expected<semantics::Ledger> L =
      semantics::runEngine(*E.Circuit, semantics::EngineOptions());
  ASSERT_TRUE(bool(L));
  EXPECT_TRUE(L->Events.empty());
  EXPECT_NE(L->Reason.find("nothing can erase"), std::string::npos);
  // Final measurements into fresh bits erase nothing either.
  auto M = test::elaborate("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                           "qreg q[1];\ncreg c[2];\nh q[0];\nmeasure q[0] -> c[0];\n"
                           "measure q[0] -> c[1];\n");
  ASSERT_TRUE(M.Circuit);
  llvm::Expected<semantics::Ledger> ML =
      semantics::runEngine(*M.Circuit, semantics::EngineOptions());
  ASSERT_TRUE(bool(ML));
  EXPECT_NE(ML->Reason.find("nothing can erase"), std::string::npos);
}

} // namespace
