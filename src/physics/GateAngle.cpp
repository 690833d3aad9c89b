//===- GateAngle.cpp - How far a unitary can move a state -----------------===//
#include "revbound/physics/GateAngle.h"

#include <Eigen/Eigenvalues>

#include <algorithm>
#include <cmath>
#include <numbers>
#include <vector>

namespace revbound::physics {

using std::numbers::pi;

double gateAngle(const ir::Matrix &U) {
  Eigen::ComplexEigenSolver<ir::Matrix> Solver(U, /*computeEigenvectors=*/false);
  std::vector<double> Phases;
  for (Eigen::Index I = 0; I < Solver.eigenvalues().size(); ++I) {
    double A = std::arg(Solver.eigenvalues()(I));
    Phases.push_back(A < 0 ? A + 2 * pi : A);
  }
  if (Phases.size() <= 1)
    return 0;
  std::sort(Phases.begin(), Phases.end());
  // The smallest arc holding every eigenvalue leaves out the largest gap.
  double Gap = Phases.front() + 2 * pi - Phases.back();
  for (size_t I = 1; I < Phases.size(); ++I)
    Gap = std::max(Gap, Phases[I] - Phases[I - 1]);
  double Arc = std::max(0.0, 2 * pi - Gap);
  if (Arc >= pi - 1e-12)
    return pi / 2;
  return Arc / 2;
}

bool reachesOrthogonal(double Angle) { return Angle >= pi / 2 - 1e-12; }

} // namespace revbound::physics
