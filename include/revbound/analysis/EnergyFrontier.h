//===- EnergyFrontier.h - Least time against energy, sampled -------------===//
//
// The Margolus-Levitin-type bounds of SpeedBounds.h as functions of the
// energy: pooled T(E) = action / E (E the whole machine's energy), per qubit
// T(E_q) = path action / E_q (E_q each qubit's energy). Both are straight
// lines of slope -1 on log-log axes; the frontier samples them at a fixed set
// of energies so that a plot shows numbers that are in the report. The
// Mandelstam-Tamm term of --energy-spread is left out: with a spread the
// report's own times may lie above these lines, never below.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_ANALYSIS_ENERGYFRONTIER_H
#define REVBOUND_ANALYSIS_ENERGYFRONTIER_H

#include "revbound/analysis/SpeedBounds.h"

#include <vector>

namespace revbound::analysis {

/// What the sampled range is centred on: --energy, else --energy-per-qubit,
/// else 1 eV.
enum class FrontierAnchor { Energy, EnergyPerQubit, Default };
/// "energy", "energy_per_qubit" or "default".
const char *frontierAnchorName(FrontierAnchor A);

struct FrontierPoint {
  double EnergyJ = 0;
  double PooledTimeS = 0;   // action / EnergyJ
  double PerQubitTimeS = 0; // path action / EnergyJ, EnergyJ per qubit
};

/// Energies AnchorJ * 10^(k/2) for k = -FrontierHalfDecades ...
/// FrontierHalfDecades: three decades either side in half-decade steps; the
/// middle point is the anchor itself, so at a given energy (without a
/// spread) the frontier's time is the report's time to the bit.
inline constexpr int FrontierHalfDecades = 6;

struct EnergyFrontier {
  FrontierAnchor Anchor = FrontierAnchor::Default;
  double AnchorJ = 0;
  std::vector<FrontierPoint> Points; // by increasing energy
};

/// Samples the frontier of `B` around the energy given in `E`.
EnergyFrontier sampleFrontier(const SpeedBounds &B, const EnergyOptions &E);

} // namespace revbound::analysis

#endif
