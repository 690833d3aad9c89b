//===- SpeedLimit.cpp - Quantum speed limits for one operation ------------===//
#include "revbound/physics/SpeedLimit.h"
#include "revbound/support/Constants.h"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace revbound::physics {

using std::numbers::pi;

// The objective is only defined where (1 - eps) / (2 p (1 - p)) <= 2, i.e.
// for p in [(1 - sqrt eps)/2, (1 + sqrt eps)/2]; it is smooth there and
// the minimum is found by a grid search refined by golden sections.
static double objective(double P, double Epsilon) {
  double Arg = 1 - (1 - Epsilon) / (2 * P * (1 - P));
  return P * std::acos(std::clamp(Arg, -1.0, 1.0));
}

double mlFactor(double Epsilon) {
  Epsilon = std::clamp(Epsilon, 0.0, 1.0);
  if (Epsilon == 0)
    return 1;
  if (Epsilon == 1)
    return 0;
  double Root = std::sqrt(Epsilon);
  double Lo = (1 - Root) / 2, Hi = (1 + Root) / 2;
  const int Grid = 512;
  int Best = 0;
  double BestValue = objective(Lo, Epsilon);
  for (int I = 1; I <= Grid; ++I) {
    double V = objective(Lo + (Hi - Lo) * I / Grid, Epsilon);
    if (V < BestValue) {
      BestValue = V;
      Best = I;
    }
  }
  double A = Lo + (Hi - Lo) * std::max(0, Best - 1) / Grid;
  double B = Lo + (Hi - Lo) * std::min(Grid, Best + 1) / Grid;
  const double Ratio = (std::sqrt(5.0) - 1) / 2;
  double X1 = B - Ratio * (B - A), X2 = A + Ratio * (B - A);
  double F1 = objective(X1, Epsilon), F2 = objective(X2, Epsilon);
  for (int I = 0; I < 200 && B - A > 1e-15; ++I) {
    if (F1 < F2) {
      B = X2;
      X2 = X1;
      F2 = F1;
      X1 = B - Ratio * (B - A);
      F1 = objective(X1, Epsilon);
    } else {
      A = X1;
      X1 = X2;
      F1 = F2;
      X2 = A + Ratio * (B - A);
      F2 = objective(X2, Epsilon);
    }
  }
  double Min = std::min({BestValue, F1, F2});
  return std::clamp(2 / pi * Min, 0.0, 1.0);
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
