//===- SpeedLimitTest.cpp - Margolus-Levitin and Mandelstam-Tamm ----------===//
#include "revbound/physics/SpeedLimit.h"
#include "revbound/support/Constants.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <numbers>
#include <vector>

using namespace revbound;
using std::numbers::pi;

// An independent brute-force minimisation of the same expression (a dense
// grid), for checking the solver: Giovannetti, Lloyd & Maccone, PRA 67,
// 052109 (2003), the minimisation that defines alpha(epsilon).
static double bruteAlpha(double Eps) {
  double Lo = (1 - std::sqrt(Eps)) / 2, Hi = (1 + std::sqrt(Eps)) / 2;
  double Best = 1e300;
  const int N = 400000;
  for (int I = 0; I <= N; ++I) {
    double P = Lo + (Hi - Lo) * I / N;
    double G = std::clamp(1 - (1 - Eps) / (2 * P * (1 - P)), -1.0, 1.0);
    Best = std::min(Best, P * std::acos(G));
  }
  return 2 / pi * Best;
}

TEST(SpeedLimit, AlphaAgainstBruteForce) {
  for (double Eps : {0.01, 0.1, 0.25, 0.5, 0.75, 0.9, 0.99})
    EXPECT_NEAR(physics::mlFactor(Eps), bruteAlpha(Eps), 1e-8) << Eps;
  // DESIGN.md's values of the same minimisation (computed, not printed in a
  // paper): alpha(0.25) = 0.463461, alpha(0.5) = 0.264995.
  EXPECT_NEAR(physics::mlFactor(0.25), 0.463461, 5e-7);
  EXPECT_NEAR(physics::mlFactor(0.5), 0.264995, 5e-7);
}

// The same minimisation by ternary search on the objective, which is
// unimodal on its interval, to full double precision: a second,
// independent solver for the tabulated fast path.
static double ternaryAlpha(double Eps) {
  auto F = [Eps](double P) {
    double G = std::clamp(1 - (1 - Eps) / (2 * P * (1 - P)), -1.0, 1.0);
    return P * std::acos(G);
  };
  double Lo = (1 - std::sqrt(Eps)) / 2, Hi = (1 + std::sqrt(Eps)) / 2;
  for (int I = 0; I < 300; ++I) {
    double A = Lo + (Hi - Lo) / 3, B = Hi - (Hi - Lo) / 3;
    (F(A) < F(B) ? Hi : Lo) = F(A) < F(B) ? B : A;
  }
  return 2 / pi * std::min(F(Lo), F(Hi));
}

TEST(SpeedLimit, AlphaFastPathAgreesWithSolverEverywhere) {
  // s = sqrt(eps) over (0, 1), the tables' borders (s = 0.02 and 0.98),
  // grid points and midpoints of the middle table, and both ends closely.
  std::vector<double> Roots;
  for (int I = 1; I < 2000; ++I)
    Roots.push_back(I / 2000.0);
  for (double T : {1e-9, 1e-7, 1e-5, 1e-4, 1e-3}) {
    Roots.push_back(T);
    Roots.push_back(std::sqrt(1 - T * T)); // sqrt(1 - eps) = T
  }
  for (double S : {0.02, 0.98, 0.0199999, 0.0200001, 0.9799999, 0.9800001,
                   1000.0 / 4096, 1000.5 / 4096, 4000.0 / 4096})
    Roots.push_back(S);
  // The middle of every interval of the three tables (src/physics/
  // MinimiserTables.h: s over [0.02, 0.98] in 4096 steps, s over [0, 0.02]
  // and sqrt(1 - eps) over [0, 0.2] in 1024), so that each entry is used.
  for (int I = 0; I < 4096; ++I)
    Roots.push_back(0.02 + 0.96 * (I + 0.5) / 4096);
  for (int I = 0; I < 1024; ++I) {
    Roots.push_back(0.02 * (I + 0.5) / 1024);
    double V = 0.2 * (I + 0.5) / 1024;
    Roots.push_back(std::sqrt(1 - V * V));
  }
  for (double S : Roots) {
    double Eps = S * S;
    double Fast = physics::mlFactor(Eps), Slow = ternaryAlpha(Eps);
    // Near s = 0 any evaluation loses digits: the objective's argument lies
    // within s^2 of -1, where arccos turns a rounding of 1e-16 into about
    // 1e-16 / s. Hence the second term (common practice in error analysis).
    EXPECT_LE(std::abs(Fast - Slow), 1e-12 * Slow + 4e-16 / S) << "s = " << S;
  }
}

// Properties the issue lists: alpha(0) = 1 at orthogonality, monotone
// decreasing, never below beta^2 with beta = (2/pi) arccos sqrt(eps) (the
// Mandelstam-Tamm-type factor), continuous at both ends.
TEST(SpeedLimit, AlphaProperties) {
  EXPECT_EQ(physics::mlFactor(0), 1.0);
  EXPECT_EQ(physics::mlFactor(1), 0.0);
  double Prev = 1.0;
  for (int I = 1; I < 1000; ++I) {
    double Eps = I / 1000.0;
    double A = physics::mlFactor(Eps);
    EXPECT_LE(A, Prev + 1e-12) << Eps;
    double Beta = physics::mtFactor(Eps);
    EXPECT_GE(A, Beta * Beta - 1e-12) << Eps;
    Prev = A;
  }
  EXPECT_NEAR(physics::mlFactor(1e-9), 1.0, 1e-3);
  EXPECT_NEAR(physics::mlFactor(1 - 1e-9), 0.0, 1e-3);
}

// One orthogonal step at E = 1 J: pi hbar / 2 = h / 4 = 1.65651754e-34 s
// (computed from the SI 2019 h).
TEST(SpeedLimit, OrthogonalStepAtOneJoule) {
  EXPECT_NEAR(physics::marginalMLTime(pi / 2, 1.0), 1.65651754e-34, 1e-42);
  EXPECT_NEAR(physics::mlAction(pi / 2), si::PlanckJouleSeconds / 4, 1e-48);
}

// Lloyd, "Ultimate physical limits to computation", Nature 406, 1047 (2000):
// a 1 kg computer, E = m c^2, performs at most 2E/(pi hbar) = 5.4258e50
// operations per second as printed; 5.4256e50 with the SI 2019 constants.
TEST(SpeedLimit, LloydsLaptop) {
  double E = 1.0 * si::LightMetresPerSecond * si::LightMetresPerSecond;
  double Rate = 1.0 / physics::marginalMLTime(pi / 2, E);
  EXPECT_NEAR(Rate / 5.4256e50, 1.0, 1e-4);
  EXPECT_NEAR(Rate / 5.4258e50, 1.0, 1e-3); // the printed figure
}

// Margolus & Levitin, Physica D 120, 188 (1998), abstract: "about 3 x 10^33
// operations per second per joule" for long sequences, i.e. 2E/h.
TEST(SpeedLimit, MargolusLevitinAbstract) {
  double PerJoule = 2.0 / si::PlanckJouleSeconds;
  EXPECT_NEAR(PerJoule / 3e33, 1.0, 0.01);
}

TEST(SpeedLimit, MandelstamTamm) {
  // t >= hbar L / dE: a T gate (L = pi/8) at a spread of 1 J.
  EXPECT_DOUBLE_EQ(physics::mandelstamTammTime(pi / 8, 1.0),
                   si::ReducedPlanckJouleSeconds * pi / 8);
}
