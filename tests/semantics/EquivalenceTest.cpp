//===- EquivalenceTest.cpp - Do two circuits compute the same thing? ------===//
//
// Published constructions against their variants: the Cuccaro adder with a
// Toffoli in Clifford+T (equivalent), with a gate dropped (checked against
// a basis-state simulation written here), gates equal up to global phase,
// phases that only superpositions see, and measurement semantics.
//
//===----------------------------------------------------------------------===//
#include "ReversibleAdders.h"
#include "TestSupport.h"

#include "revbound/semantics/Equivalence.h"

#include <gtest/gtest.h>

namespace revbound::test {
namespace {

using semantics::checkEquivalence;
using semantics::EquivalenceMethod;
using semantics::EquivalenceOptions;
using semantics::EquivalenceResult;
using semantics::EquivalenceVerdict;

const char *Header = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n";

/// Elaborates both texts and compares them; fails the test on an error.
std::optional<EquivalenceResult> compare(const std::string &A,
                                         const std::string &B,
                                         const EquivalenceOptions &Opts = {},
                                         std::string *Error = nullptr) {
  Elaborated EA = elaborate(A), EB = elaborate(B);
  EXPECT_TRUE(EA.Circuit) << EA.Error;
  EXPECT_TRUE(EB.Circuit) << EB.Error;
  if (!EA.Circuit || !EB.Circuit)
    return std::nullopt;
  llvm::Expected<EquivalenceResult> R =
      checkEquivalence(*EA.Circuit, *EB.Circuit, Opts);
  if (!R) {
    std::string Message = llvm::toString(R.takeError());
    if (Error)
      *Error = Message;
    else
      ADD_FAILURE() << Message;
    return std::nullopt;
  }
  return std::move(*R);
}

std::string bitsOf(const semantics::RegisterBits &Bits,
                   const std::string &Reg) {
  for (const auto &[Name, Value] : Bits)
    if (Name == Reg)
      return Value;
  return "";
}

/// The adder's kept wires (a, b, cout) on input a, b, with gate `Dropped`
/// left out; simulated here, apart from the library.
std::map<std::string, bool> adderOutput(unsigned N, const std::string &A,
                                        const std::string &B, int Dropped) {
  std::map<std::string, bool> V =
      runGates(cuccaroGates(N), adderInput(A, B), Dropped);
  V.erase("cin[0]");
  return V;
}

/// True when dropping gate `Dropped` changes a kept wire on some input.
bool dropChangesFunction(unsigned N, int Dropped) {
  for (uint64_t X = 0; X < (uint64_t(1) << (2 * N)); ++X) {
    std::string A, B;
    for (unsigned I = N; I-- > 0;) {
      A += (X >> I & 1) ? '1' : '0';
      B += (X >> (N + I) & 1) ? '1' : '0';
    }
    if (adderOutput(N, A, B, -1) != adderOutput(N, A, B, Dropped))
      return true;
  }
  return false;
}

// The adder against itself with one Toffoli in Clifford+T: equivalent,
// whichever Toffoli is replaced (Nielsen & Chuang figure 4.9 is an exact
// decomposition of the Toffoli).
TEST(Equivalence, CliffordTToffoliKeepsTheAdder) {
  for (unsigned N : {1u, 2u, 3u}) {
    std::vector<NamedGate> G = cuccaroGates(N);
    for (size_t I = 0; I < G.size(); ++I) {
      if (G[I].Name != "ccx")
        continue;
      AdderVariant V;
      V.CliffordT = int(I);
      std::optional<EquivalenceResult> R =
          compare(cuccaroQasm(N), cuccaroQasm(N, V));
      ASSERT_TRUE(R);
      EXPECT_EQ(R->Verdict, EquivalenceVerdict::Equivalent)
          << "n=" << N << " gate " << I << ": " << R->Reason;
      EXPECT_EQ(R->Method, EquivalenceMethod::Exact);
      EXPECT_EQ(R->AncillasCleanA, true);
      EXPECT_EQ(R->AncillasCleanB, true);
    }
  }
}

// Every single dropped gate of the 2- and 3-bit adders: the verdict agrees
// with a basis-state simulation of the adder, and each witness really
// gives different kept outputs when simulated.
TEST(Equivalence, DroppedGateWitnessesReallyDiffer) {
  for (unsigned N : {2u, 3u}) {
    std::vector<NamedGate> G = cuccaroGates(N);
    for (size_t I = 0; I < G.size(); ++I) {
      AdderVariant V;
      V.Dropped = int(I);
      std::optional<EquivalenceResult> R =
          compare(cuccaroQasm(N), cuccaroQasm(N, V));
      ASSERT_TRUE(R);
      bool Changes = dropChangesFunction(N, int(I));
      SCOPED_TRACE(fmt::format("n={} dropped gate {}", N, I));
      EXPECT_EQ(R->Verdict, Changes ? EquivalenceVerdict::NotEquivalent
                                    : EquivalenceVerdict::Equivalent);
      if (!Changes)
        continue;
      ASSERT_TRUE(R->Witness);
      EXPECT_FALSE(R->Witness->Second); // a basis input shows it
      std::string A = bitsOf(R->Witness->First, "a");
      std::string B = bitsOf(R->Witness->First, "b");
      ASSERT_EQ(A.size(), N);
      ASSERT_EQ(B.size(), N);
      EXPECT_NE(adderOutput(N, A, B, -1), adderOutput(N, A, B, int(I)))
          << "witness a=" << A << " b=" << B;
      EXPECT_FALSE(R->Witness->DifferingWires.empty());
    }
  }
}

// 16-bit adders have 32 inputs, too many to run one by one: the BDD method
// decides, with a witness that the simulation here confirms.
TEST(Equivalence, WideClassicalAddersUseBdds) {
  const unsigned N = 16;
  std::optional<EquivalenceResult> Same =
      compare(cuccaroQasm(N), cuccaroQasm(N));
  ASSERT_TRUE(Same);
  EXPECT_EQ(Same->Verdict, EquivalenceVerdict::Equivalent);
  EXPECT_EQ(Same->Method, EquivalenceMethod::Bdd);
  AdderVariant V;
  V.Dropped = 20; // a CNOT of the MAJ chain
  std::optional<EquivalenceResult> R = compare(cuccaroQasm(N), cuccaroQasm(N, V));
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Method, EquivalenceMethod::Bdd);
  ASSERT_EQ(R->Verdict, EquivalenceVerdict::NotEquivalent);
  ASSERT_TRUE(R->Witness);
  std::string A = bitsOf(R->Witness->First, "a");
  std::string B = bitsOf(R->Witness->First, "b");
  EXPECT_NE(adderOutput(N, A, B, -1), adderOutput(N, A, B, 20))
      << "witness a=" << A << " b=" << B;
}

// The interface is the kept wires by name: renaming an input register is an
// error naming it, not a verdict.
TEST(Equivalence, DifferentRegisterNamesAreAnError) {
  AdderVariant V;
  V.RenameA = "x";
  std::string Error;
  std::optional<EquivalenceResult> R =
      compare(cuccaroQasm(2), cuccaroQasm(2, V), {}, &Error);
  EXPECT_FALSE(R);
  EXPECT_NE(Error.find("interfaces differ"), std::string::npos) << Error;
  EXPECT_NE(Error.find("a[0]"), std::string::npos) << Error;
}

TEST(Equivalence, RoleMismatchIsAnError) {
  std::string A = std::string(Header) + "//! input q\nqreg q[2];\ncx q[0],q[1];\n";
  std::string B = std::string(Header) + "//! input q[0]\nqreg q[2];\ncx q[0],q[1];\n";
  std::string Error;
  EXPECT_FALSE(compare(A, B, {}, &Error));
  EXPECT_NE(Error.find("q[1] is input in the reference but output in the "
                       "candidate"),
            std::string::npos)
      << Error;
}

// rz(theta) = exp(-i theta/2) u1(theta) (OpenQASM 2.0 specification,
// qelib1.inc): equal up to a global phase, which no measurement sees.
TEST(Equivalence, GlobalPhaseDoesNotCount) {
  std::string A = std::string(Header) +
                  "//! input q\nqreg q[2];\nrz(0.7) q[0];\ncx q[0],q[1];\n";
  std::string B = std::string(Header) +
                  "//! input q\nqreg q[2];\nu1(0.7) q[0];\ncx q[0],q[1];\n";
  std::optional<EquivalenceResult> R = compare(A, B);
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Verdict, EquivalenceVerdict::Equivalent) << R->Reason;
}

// cz = diag(1, 1, 1, -1) changes no basis state, so only a superposition
// shows it: the witness is (|x> + phase |y>)/sqrt 2 with x or y = 11.
TEST(Equivalence, RelativePhaseNeedsASuperposedWitness) {
  std::string A = std::string(Header) + "//! input q\nqreg q[2];\ncz q[0],q[1];\n";
  std::string B = std::string(Header) + "//! input q\nqreg q[2];\nid q[0];\n";
  std::optional<EquivalenceResult> R = compare(A, B);
  ASSERT_TRUE(R);
  ASSERT_EQ(R->Verdict, EquivalenceVerdict::NotEquivalent);
  EXPECT_EQ(R->Method, EquivalenceMethod::Exact);
  ASSERT_TRUE(R->Witness);
  ASSERT_TRUE(R->Witness->Second);
  std::string X = bitsOf(R->Witness->First, "q");
  std::string Y = bitsOf(*R->Witness->Second, "q");
  EXPECT_TRUE(X == "11" || Y == "11") << X << " " << Y;
}

// A classical circuit compared by BDDs does not see that phase: the result
// says so rather than claiming more.
TEST(Equivalence, BddMethodSaysPhasesAreNotCompared) {
  EquivalenceOptions Opts;
  Opts.MaxExactInputs = 0; // as if the circuits were too wide
  std::string A = std::string(Header) + "//! input q\nqreg q[2];\ncz q[0],q[1];\n";
  std::string B = std::string(Header) + "//! input q\nqreg q[2];\nid q[0];\n";
  std::optional<EquivalenceResult> R = compare(A, B, Opts);
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Method, EquivalenceMethod::Bdd);
  EXPECT_EQ(R->Verdict, EquivalenceVerdict::Equivalent);
  ASSERT_FALSE(R->Notes.empty());
  EXPECT_NE(R->Notes.back().find("relative phases are not compared"),
            std::string::npos);
}

// After a measurement the qubit is classical: a Z on it changes nothing
// (Z rho Z = rho for diagonal rho), while before it, it does (|+> vs |->).
TEST(Equivalence, MeasurementDephases) {
  std::string Measured = std::string(Header) +
                         "qreg q[1];\ncreg c[1];\nh q[0];\nmeasure q[0] -> c[0];\n";
  std::optional<EquivalenceResult> After =
      compare(Measured, Measured + "z q[0];\n");
  ASSERT_TRUE(After);
  EXPECT_EQ(After->Verdict, EquivalenceVerdict::Equivalent) << After->Reason;

  std::string Plus = std::string(Header) + "qreg q[1];\nh q[0];\n";
  std::optional<EquivalenceResult> Before = compare(Plus, Plus + "z q[0];\n");
  ASSERT_TRUE(Before);
  EXPECT_EQ(Before->Verdict, EquivalenceVerdict::NotEquivalent);
}

// Measure and flip on 1 is a reset (common practice: active reset). The
// candidate's extra classical register is not part of the interface.
TEST(Equivalence, MeasureAndCorrectIsAReset) {
  std::string A = std::string(Header) + "//! input q\nqreg q[1];\nreset q[0];\n";
  std::string B = std::string(Header) +
                  "//! input q\nqreg q[1];\ncreg m[1];\nmeasure q[0] -> m[0];\n"
                  "if (m == 1) x q[0];\n";
  std::optional<EquivalenceResult> R = compare(A, B);
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Verdict, EquivalenceVerdict::Equivalent) << R->Reason;
  ASSERT_FALSE(R->Notes.empty());
  EXPECT_NE(R->Notes.front().find("m is only in the candidate"),
            std::string::npos);
  // Without the correction the qubit keeps its value: not a reset.
  std::string C = std::string(Header) +
                  "//! input q\nqreg q[1];\ncreg m[1];\nmeasure q[0] -> m[0];\n";
  std::optional<EquivalenceResult> S = compare(A, C);
  ASSERT_TRUE(S);
  EXPECT_EQ(S->Verdict, EquivalenceVerdict::NotEquivalent);
  ASSERT_TRUE(S->Witness);
  EXPECT_EQ(bitsOf(S->Witness->First, "q"), "1");
}

// When neither exact method fits, random trials never claim a proof; the
// stated chance of a miss is (1 - p)^basis trials.
TEST(Equivalence, RandomTrialsAreNeverAProof) {
  EquivalenceOptions Opts;
  Opts.MaxExactInputs = 0;
  Opts.Trials = 40;
  AdderVariant V;
  V.CliffordT = 2;
  std::optional<EquivalenceResult> R =
      compare(cuccaroQasm(3), cuccaroQasm(3, V), Opts);
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Method, EquivalenceMethod::Random);
  EXPECT_EQ(R->Verdict, EquivalenceVerdict::Unknown);
  EXPECT_EQ(R->Trials, 40u);
  EXPECT_NEAR(R->MissChance, std::pow(0.9, 20), 1e-12);
  EXPECT_FALSE(R->AncillasCleanB.has_value()); // sampled, not proved

  // Without the CNOT that copies the carry out, cout reads 0 where
  // a + b >= 8: 28 of the 64 inputs, so a basis trial finds it.
  AdderVariant D;
  D.CliffordT = 2;
  D.Dropped = 9; // cx a[2],cout[0], after the three MAJ blocks
  ASSERT_EQ(cuccaroGates(3)[9].Wires.back(), "cout[0]");
  std::optional<EquivalenceResult> Found =
      compare(cuccaroQasm(3), cuccaroQasm(3, D), Opts);
  ASSERT_TRUE(Found);
  EXPECT_EQ(Found->Verdict, EquivalenceVerdict::NotEquivalent);
  ASSERT_TRUE(Found->Witness);
  std::string A = bitsOf(Found->Witness->First, "a");
  std::string B = bitsOf(Found->Witness->First, "b");
  EXPECT_NE(adderOutput(3, A, B, -1), adderOutput(3, A, B, D.Dropped));
}

} // namespace
} // namespace revbound::test
