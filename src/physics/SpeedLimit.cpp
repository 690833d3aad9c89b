//===- SpeedLimit.cpp - Quantum speed limits for one operation ------------===//
#include "revbound/physics/SpeedLimit.h"
#include "revbound/support/Constants.h"

#include <algorithm>
#include <array>
#include <atomic>
#include <cmath>
#include <numbers>

namespace revbound::physics {

using std::numbers::pi;

// The objective f(p) = p arccos(g(p)), g = 1 - (1 - eps) / (2 p (1 - p)),
// is defined for p in [(1 - sqrt eps)/2, (1 + sqrt eps)/2], where g runs
// from -1 up to 2 eps - 1 and back; f' goes from minus to plus infinity
// there, and the minimum is at its one sign change. The root of f' is found
// by bisection, then the Illinois variant of regula falsi, to 1e-8 in p;
// f is flat at its minimum, so the value is exact to about 1e-12.
static double objective(double P, double Epsilon) {
  double Arg = 1 - (1 - Epsilon) / (2 * P * (1 - P));
  return P * std::acos(std::clamp(Arg, -1.0, 1.0));
}

static double slope(double P, double Epsilon) {
  double Q = P * (1 - P);
  double G = std::clamp(1 - (1 - Epsilon) / (2 * Q), -1.0, 1.0);
  double DG = (1 - Epsilon) * (1 - 2 * P) / (2 * Q * Q);
  double Root = std::sqrt(std::max(0.0, 1 - G * G));
  if (Root == 0)
    return DG > 0 ? -INFINITY : INFINITY;
  return std::acos(G) - P * DG / Root;
}

static double solveMinimiser(double Epsilon);

/// The minimiser p* at 65 points of epsilon, linearly interpolated: only a
/// starting point, so its accuracy does not matter for the result.
static double minimiserGuess(double Epsilon) {
  static const std::array<double, 65> Table = [] {
    std::array<double, 65> T{};
    for (int I = 0; I <= 64; ++I)
      T[I] = solveMinimiser(std::clamp(I / 64.0, 1e-6, 1 - 1e-6));
    return T;
  }();
  double X = Epsilon * 64;
  int I = std::clamp(int(X), 0, 63);
  return Table[I] + (Table[I + 1] - Table[I]) * (X - I);
}

/// The minimiser by bisection from the whole interval (slow; builds the table).
static double solveMinimiser(double Epsilon) {
  double Root = std::sqrt(Epsilon);
  double A = (1 - Root) / 2, B = (1 + Root) / 2;
  for (int I = 0; I < 60; ++I) {
    double M = (A + B) / 2;
    (slope(M, Epsilon) < 0 ? A : B) = M;
  }
  return (A + B) / 2;
}

/// The minimiser of the objective for 0 < epsilon < 1: the bracket is
/// narrowed around a tabulated guess, then closed to 1e-8 by bisection and
/// the Illinois variant of regula falsi.
static double refineMinimiser(double Epsilon) {
  double Root = std::sqrt(Epsilon);
  double A = (1 - Root) / 2, B = (1 + Root) / 2;
  // Narrow the bracket around a tabulated guess of the minimiser before
  // bisecting; the bracket is kept only where the slope's signs confirm it.
  double Guess = minimiserGuess(Epsilon);
  double Width = (B - A) / 64;
  if (Guess - Width > A && slope(Guess - Width, Epsilon) < 0)
    A = Guess - Width;
  if (Guess + Width < B && slope(Guess + Width, Epsilon) > 0)
    B = Guess + Width;
  for (int I = 0; I < 4; ++I) {
    double M = (A + B) / 2;
    (slope(M, Epsilon) < 0 ? A : B) = M;
  }
  double FA = slope(A, Epsilon), FB = slope(B, Epsilon);
  int Side = 0;
  for (int I = 0; I < 100 && B - A > 1e-8; ++I) {
    double M = std::isfinite(FA) && std::isfinite(FB) && FB != FA
                   ? B - FB * (B - A) / (FB - FA)
                   : (A + B) / 2;
    if (!(M > A && M < B))
      M = (A + B) / 2;
    double FM = slope(M, Epsilon);
    if (FM < 0) {
      A = M;
      FA = FM;
      if (Side == -1)
        FB /= 2;
      Side = -1;
    } else {
      B = M;
      FB = FM;
      if (Side == 1)
        FA /= 2;
      Side = 1;
    }
  }
  return objective(A, Epsilon) <= objective(B, Epsilon) ? A : B;
}

// Files with many distinct rotation angles (random rz) pay one solve per
// angle; a fine table of the minimiser over s = sqrt(epsilon) makes most of
// them one evaluation of the objective. Between grid points the minimiser
// is linear to about 1e-8 for s in [0.02, 0.98], and f is flat at its
// minimum, so f at the interpolated point exceeds the minimum by less than
// 1e-13 relative (SpeedLimitTest checks it against the solver). Near the
// ends p* bends like a square root and the solver is used. Entries are
// filled on first use; the fill is a pure function of the index, so
// threads that race on one entry store the same value.
static constexpr int FineSteps = 4096;
static constexpr double FineLow = 0.02, FineHigh = 0.98;

static double fineEntry(int I) {
  static std::array<std::atomic<double>, FineSteps + 1> Table{};
  double P = Table[size_t(I)].load(std::memory_order_relaxed);
  if (P == 0) { // no minimiser is 0: p* lies inside (0, 1)
    double S = double(I) / FineSteps;
    P = refineMinimiser(std::clamp(S * S, 1e-12, 1 - 1e-12));
    Table[size_t(I)].store(P, std::memory_order_relaxed);
  }
  return P;
}

double mlFactor(double Epsilon) {
  Epsilon = std::clamp(Epsilon, 0.0, 1.0);
  if (Epsilon == 0)
    return 1;
  if (Epsilon == 1)
    return 0;
  double S = std::sqrt(Epsilon);
  double P;
  if (S >= FineLow && S <= FineHigh) {
    double X = S * FineSteps;
    int I = std::min(int(X), FineSteps - 1);
    double Lo = fineEntry(I), Hi = fineEntry(I + 1);
    P = std::clamp(Lo + (Hi - Lo) * (X - I), (1 - S) / 2, (1 + S) / 2);
  } else {
    P = refineMinimiser(Epsilon);
  }
  return std::clamp(2 / pi * objective(P, Epsilon), 0.0, 1.0);
}

double mtFactor(double Epsilon) {
  return 2 / pi * std::acos(std::sqrt(std::clamp(Epsilon, 0.0, 1.0)));
}

double mlAction(double Angle) {
  double C = std::cos(std::clamp(Angle, 0.0, pi / 2));
  return pi * si::ReducedPlanckJouleSeconds * mlFactor(C * C) / 2;
}

double marginalMLTime(double Angle, double EnergyJ) {
  return mlAction(Angle) / EnergyJ;
}

double mandelstamTammTime(double Angle, double SpreadJ) {
  return si::ReducedPlanckJouleSeconds * Angle / SpreadJ;
}

} // namespace revbound::physics
