//===- MinimiserTables.h - The Margolus-Levitin minimiser and its tables --===//
//
// Internal to src/physics. The objective f(p) = p arccos(g(p)),
// g = 1 - (1 - eps) / (2 p (1 - p)), is defined for p in
// [(1 - sqrt eps)/2, (1 + sqrt eps)/2], where g runs from -1 up to 2 eps - 1
// and back; f' goes from minus to plus infinity there, and the minimum is
// at its one sign change, found by bisection.
//
// Files with many distinct rotation angles (random rz) would pay one solve
// per angle; three tables of the minimiser make each one evaluation of the
// objective. Each table is in the variable in which p* is smooth:
//  - Middle: s = sqrt(epsilon) in [0.02, 0.98], p* itself;
//  - NearZero: s in [0, 0.02], (1/2 - p*) / (s/2), since p* -> 1/2 like s;
//  - NearOne: v = sqrt(1 - epsilon) in [0, 0.2], p* / v^2, since p* -> 0
//    like v^2.
// The 6,147 entries take about 330,000 evaluations of the slope, some 12 ms,
// so they are computed once, at build time, by revbound_gen_minimiser_tables
// from the functions here, and compiled in (MinimiserTables.inc).
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_PHYSICS_MINIMISERTABLES_H
#define REVBOUND_PHYSICS_MINIMISERTABLES_H

#include <algorithm>
#include <cmath>

namespace revbound::physics::minimiser {

inline double objective(double P, double Epsilon) {
  double Arg = 1 - (1 - Epsilon) / (2 * P * (1 - P));
  return P * std::acos(std::clamp(Arg, -1.0, 1.0));
}

inline double slope(double P, double Epsilon) {
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
inline double exactMinimiser(double Epsilon) {
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

enum class Band { Middle, NearZero, NearOne };
inline constexpr int Steps[3] = {4096, 1024, 1024};
inline constexpr double Low[3] = {0.02, 0.0, 0.0}, High[3] = {0.98, 0.02, 0.2};

/// The stored value of `B` at entry `I`, computed; entry 0 of the scaled
/// bands (X = 0, where the scaling divides by zero) is extrapolated from
/// entries 1 and 2.
inline double computeEntry(Band B, int I) {
  unsigned K = unsigned(B);
  if (B != Band::Middle && I == 0)
    return 2 * computeEntry(B, 1) - computeEntry(B, 2);
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

} // namespace revbound::physics::minimiser

#endif
