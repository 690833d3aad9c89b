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
// there, and the minimum is at its one sign change, found by bisection for
// the entries of tables that the evaluation interpolates (below).
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

/// The minimiser to full precision by bisection on the slope's sign: slow,
/// for the tables' entries only. Bisection halves the bracket's width, so
/// tiny minimisers (near epsilon = 1, p* ~ 0.3 (1 - epsilon)) keep their
/// relative precision, which the solver's absolute 1e-8 does not.
static double exactMinimiser(double Epsilon) {
  double Root = std::sqrt(Epsilon);
  double A = (1 - Root) / 2, B = (1 + Root) / 2;
  for (int I = 0; I < 80 && A < B; ++I) {
    double M = (A + B) / 2;
    if (M <= A || M >= B)
      break;
    (slope(M, Epsilon) < 0 ? A : B) = M;
  }
  return objective(A, Epsilon) <= objective(B, Epsilon) ? A : B;
}

// Files with many distinct rotation angles (random rz) would pay one solve
// per angle; three tables of the minimiser make each one evaluation of the
// objective. Each table is in the variable in which p* is smooth:
//  - Middle: s = sqrt(epsilon) in [0.02, 0.98], p* itself;
//  - NearZero: s in [0, 0.02], (1/2 - p*) / (s/2), since p* -> 1/2 like s;
//  - NearOne: v = sqrt(1 - epsilon) in [0, 0.2], p* / v^2, since p* -> 0
//    like v^2.
// Linear interpolation between entries is good to about 1e-8 relative in
// p*, and f is flat at its minimum, so f at the interpolated point exceeds
// the minimum by about 1e-14 relative (SpeedLimitTest checks it against an
// independent ternary search). Entries are filled on first use; a fill is
// a pure function of its index, so threads that race on one store the same
// value.
namespace {
enum class Band { Middle, NearZero, NearOne };
constexpr int Steps[3] = {4096, 1024, 1024};
constexpr double Low[3] = {0.02, 0.0, 0.0}, High[3] = {0.98, 0.02, 0.2};

/// The minimiser at table variable X of `B`, from the stored scaled value.
double unscale(Band B, double X, double Scaled) {
  switch (B) {
  case Band::Middle:
    return Scaled;
  case Band::NearZero:
    return 0.5 - Scaled * X / 2;
  case Band::NearOne:
    return Scaled * X * X;
  }
  return Scaled;
}

double scaledEntry(Band B, int I);

double computeEntry(Band B, int I) {
  unsigned K = unsigned(B);
  if (B != Band::Middle && I == 0) // the scaled value at X = 0: extrapolated
    return 2 * scaledEntry(B, 1) - scaledEntry(B, 2);
  double X = Low[K] + (High[K] - Low[K]) * I / Steps[K];
  double Epsilon = B == Band::NearOne ? 1 - X * X : X * X;
  double P = exactMinimiser(Epsilon);
  switch (B) {
  case Band::Middle:
    return P;
  case Band::NearZero:
    return (0.5 - P) / (X / 2);
  case Band::NearOne:
    return P / (X * X);
  }
  return P;
}

double scaledEntry(Band B, int I) {
  static std::array<std::atomic<double>, 4097> Middle{};
  static std::array<std::atomic<double>, 1025> NearZero{}, NearOne{};
  std::atomic<double> &Slot = B == Band::Middle     ? Middle[size_t(I)]
                              : B == Band::NearZero ? NearZero[size_t(I)]
                                                    : NearOne[size_t(I)];
  double V = Slot.load(std::memory_order_relaxed);
  if (V == 0) { // no scaled minimiser is 0
    V = computeEntry(B, I);
    Slot.store(V, std::memory_order_relaxed);
  }
  return V;
}

/// The tabulated minimiser for 0 < epsilon < 1.
double tabulatedMinimiser(double Epsilon) {
  double S = std::sqrt(Epsilon);
  Band B = S < Low[0] ? Band::NearZero : S <= High[0] ? Band::Middle
                                                       : Band::NearOne;
  unsigned K = unsigned(B);
  double X = B == Band::NearOne ? std::sqrt(1 - Epsilon) : S;
  double At = (X - Low[K]) / (High[K] - Low[K]) * Steps[K];
  int I = std::clamp(int(At), 0, Steps[K] - 1);
  double Lo = scaledEntry(B, I), Hi = scaledEntry(B, I + 1);
  double P = unscale(B, X, Lo + (Hi - Lo) * (At - I));
  return std::clamp(P, (1 - S) / 2, (1 + S) / 2);
}
} // namespace

double mlFactor(double Epsilon) {
  Epsilon = std::clamp(Epsilon, 0.0, 1.0);
  if (Epsilon == 0)
    return 1;
  if (Epsilon == 1)
    return 0;
  double P = tabulatedMinimiser(Epsilon);
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
