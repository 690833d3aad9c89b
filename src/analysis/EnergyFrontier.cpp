//===- EnergyFrontier.cpp - Least time against energy, sampled -----------===//
#include "revbound/analysis/EnergyFrontier.h"
#include "revbound/support/Constants.h"

#include <cmath>

namespace revbound::analysis {

const char *frontierAnchorName(FrontierAnchor A) {
  switch (A) {
  case FrontierAnchor::Energy:
    return "energy";
  case FrontierAnchor::EnergyPerQubit:
    return "energy_per_qubit";
  case FrontierAnchor::Default:
    return "default";
  }
  return "default";
}

EnergyFrontier sampleFrontier(const SpeedBounds &B, const EnergyOptions &E) {
  EnergyFrontier F;
  if (E.EnergyJ) {
    F.Anchor = FrontierAnchor::Energy;
    F.AnchorJ = *E.EnergyJ;
  } else if (E.EnergyPerQubitJ) {
    F.Anchor = FrontierAnchor::EnergyPerQubit;
    F.AnchorJ = *E.EnergyPerQubitJ;
  } else {
    F.Anchor = FrontierAnchor::Default;
    F.AnchorJ = si::ElectronvoltJoules;
  }
  for (int K = -FrontierHalfDecades; K <= FrontierHalfDecades; ++K) {
    FrontierPoint P;
    // K = 0 multiplies by exactly 1, so the anchor is reproduced exactly.
    P.EnergyJ = F.AnchorJ * std::pow(10.0, K / 2.0);
    // The same expressions as boundSpeed's, so the anchor's times agree.
    P.PooledTimeS = B.ActionJs / P.EnergyJ;
    P.PerQubitTimeS = B.PathActionJs / P.EnergyJ;
    F.Points.push_back(P);
  }
  return F;
}

} // namespace revbound::analysis
