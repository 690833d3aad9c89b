//===- SpeedLimit.cpp - Quantum speed limits for one operation ------------===//
#include "revbound/physics/SpeedLimit.h"
#include "revbound/support/Constants.h"
#include "MinimiserTables.h"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace revbound::physics {

using std::numbers::pi;

namespace {

using namespace minimiser;

#include "MinimiserTables.inc"

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

double scaledEntry(Band B, int I) {
  return B == Band::Middle     ? MiddleTable[I]
         : B == Band::NearZero ? NearZeroTable[I]
                               : NearOneTable[I];
}

/// The tabulated minimiser for 0 < epsilon < 1. Linear interpolation
/// between entries is good to about 1e-8 relative in p*, and f is flat at
/// its minimum, so f at the interpolated point exceeds the minimum by about
/// 1e-14 relative (SpeedLimitTest checks it against an independent ternary
/// search).
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
