//===- CircuitTimeTest.cpp - Pooled and per-qubit time bounds -------------===//
//
// Pooled model (Lloyd, Nature 406, 1047 (2000)): T >= sum of step actions /
// E. Per-qubit model: the longest path with step weights action / (k E_q).
// Step actions pi hbar alpha(cos^2 L) / 2 with the gate angles of DESIGN.md
// (X, CX: pi/2; T: pi/8).
//
//===----------------------------------------------------------------------===//
#include "TestSupport.h"
#include "revbound/physics/SpeedLimit.h"
#include "revbound/support/Constants.h"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

using namespace revbound;
using std::numbers::pi;

static const char *Header = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n";
static const double Orthogonal = si::PlanckJouleSeconds / 4; // pi hbar / 2

static std::optional<report::CircuitReport>
run(const std::string &Body, analysis::EnergyOptions E = {},
    llvm::StringMap<double> Angles = {}) {
  report::AnalysisOptions Opts;
  Opts.Energy = E;
  Opts.GivenAngles = std::move(Angles);
  return test::analyzeText(std::string(Header) + Body, Opts);
}

TEST(CircuitTime, PooledSumsPerQubitTakesTheLongestPath) {
  analysis::EnergyOptions E;
  E.EnergyJ = 1.0;
  E.EnergyPerQubitJ = 2.0;
  auto R = run("qreg q[2];\nx q[0];\nx q[1];\ncx q[0], q[1];\n", E);
  ASSERT_TRUE(R);
  const analysis::SpeedBounds &B = R->Speed.Bounds;
  EXPECT_EQ(B.Steps, 3u);
  EXPECT_EQ(B.OrthogonalSteps, 3u);
  EXPECT_NEAR(B.ActionJs, 3 * Orthogonal, 1e-48);
  EXPECT_NEAR(*B.PooledTimeS, 3 * Orthogonal / 1.0, 1e-48);
  // Path: x (1 qubit: action / 2 J) then cx (2 qubits: action / 4 J).
  EXPECT_NEAR(*B.PerQubitTimeS, Orthogonal / 2 + Orthogonal / 4, 1e-48);
}

TEST(CircuitTime, NonOrthogonalStepsAndNesting) {
  double T = pi * si::ReducedPlanckJouleSeconds / 2 *
             physics::mlFactor(std::pow(std::cos(pi / 8), 2));
  auto R = run("gate tt a { t a; t a; }\nqreg q[1];\ntt q[0];\nt q[0];\n");
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Speed.Bounds.Steps, 3u);
  EXPECT_EQ(R->Speed.Bounds.OrthogonalSteps, 0u);
  EXPECT_NEAR(R->Speed.Bounds.ActionJs, 3 * T, 1e-48);
  EXPECT_NEAR(R->Speed.Bounds.PathActionJs, 3 * T, 1e-48);
}

TEST(CircuitTime, InverseGivesTheLeastEnergy) {
  analysis::EnergyOptions E;
  E.TargetTimeS = 1e-9;
  auto R = run("qreg q[1];\nx q[0];\nx q[0];\n", E);
  ASSERT_TRUE(R);
  EXPECT_NEAR(*R->Speed.Bounds.PooledEnergyForTargetJ, 2 * Orthogonal / 1e-9, 1e-36);
  EXPECT_FALSE(R->Speed.Bounds.PooledTimeS);
}

TEST(CircuitTime, MandelstamTammWithASpread) {
  analysis::EnergyOptions E;
  E.EnergyJ = 1.0;
  E.SpreadJ = 1e-3;
  auto R = run("qreg q[1];\nrz(0.2) q[0];\n", E);
  ASSERT_TRUE(R);
  // rz(0.2) has L = 0.1; hbar L / dE dominates with a small spread.
  EXPECT_NEAR(*R->Speed.Bounds.PooledTimeS,
              si::ReducedPlanckJouleSeconds * 0.1 / 1e-3, 1e-40);
}

TEST(CircuitTime, ConditionalAndOpaqueSteps) {
  auto R = run("opaque magic a;\nqreg q[1];\ncreg c[1];\nif(c==1) x q[0];\n"
               "magic q[0];\n");
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Speed.Bounds.ConditionalSkipped, 1u);
  EXPECT_EQ(R->Speed.Bounds.UnknownSteps, 1u);
  EXPECT_EQ(R->Speed.Bounds.ActionJs, 0.0);
  ASSERT_EQ(R->Speed.Bounds.UnknownGates, (std::vector<std::string>{"magic"}));
  llvm::StringMap<double> Angles;
  Angles["magic"] = pi / 2;
  R = run("opaque magic a;\nqreg q[1];\nmagic q[0];\n", {}, Angles);
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Speed.Bounds.UnknownSteps, 0u);
  EXPECT_NEAR(R->Speed.Bounds.ActionJs, Orthogonal, 1e-48);
}

// A native leaf whose body angle is not finite has no known angle: it is
// counted as unknown, never as a step of angle 0 (found in review).
TEST(CircuitTime, NonFiniteAngleInsideANativeLeaf) {
  report::AnalysisOptions Opts;
  Opts.Policy.NativeNames.insert("g");
  auto R = test::analyzeText(std::string(Header) + "gate g(a) q { rz(1/a) q; }\n"
                                                   "qreg q[1];\ng(0) q[0];\n",
                             Opts);
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Speed.Bounds.UnknownSteps, 1u);
}

// The gate angle of rz(l), rx(l) and ry(l) is arccos |cos(l/2)| (half
// their trace, DESIGN.md's rule for two eigenvalues), the distance of l/2
// to the nearest multiple of pi. Tiny angles must keep their digits:
// arccos of a rounded cosine gave 0 for rz(2e-8).
TEST(CircuitTime, OneAngleRotationsKeepTinyAnglesAndFoldLargeOnes) {
  for (const char *Gate : {"rz", "rx", "ry"}) {
    std::string Call = std::string(Gate) + "(2e-8) q[0];\n";
    auto R = run("qreg q[1];\n" + Call);
    ASSERT_TRUE(R) << Gate;
    EXPECT_NEAR(R->Speed.Bounds.AngleSumRad, 1e-8, 1e-22) << Gate;
  }
  for (double L : {5.0, 13.0, -7.5, 100.25}) {
    auto R = run("qreg q[1];\nrz(" + std::to_string(L) + ") q[0];\n");
    ASSERT_TRUE(R) << L;
    // The values print exactly, so the file holds L itself.
    double Expected = std::acos(std::abs(std::cos(L / 2)));
    EXPECT_NEAR(R->Speed.Bounds.AngleSumRad, Expected, 1e-12) << L;
  }
}
