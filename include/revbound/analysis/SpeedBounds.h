//===- SpeedBounds.h - The least time a circuit needs for an energy -------===//
//
// Two energy models (docs/methods.md):
//  - pooled: one budget E shared by the machine (Lloyd, Nature 406, 1047
//    (2000)); steps run one after another at best, so T >= sum of t_g;
//  - per qubit: every qubit holds E_q and a step on k qubits may use k E_q;
//    T >= the longest path through the circuit with step weights t_g.
// A step's t_g is the larger of its Margolus-Levitin-type bound, action_g /
// E_step, and, when an energy spread is given, its Mandelstam-Tamm bound
// hbar L / dE_step. Only unitary leaves take time; measurements, resets,
// barriers and classical conditions add neither time nor ordering, and ops
// under `if` are left out, since they may not run: each of those choices can
// only lower the figure, which keeps it a lower bound.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_ANALYSIS_SPEEDBOUNDS_H
#define REVBOUND_ANALYSIS_SPEEDBOUNDS_H

#include "revbound/analysis/Summary.h"
#include "revbound/physics/GateCost.h"

#include <optional>
#include <string>
#include <vector>

namespace revbound::analysis {

struct EnergyOptions {
  std::optional<double> EnergyJ;          // pooled budget above the ground state
  std::optional<double> EnergyPerQubitJ;  // per-qubit model
  std::optional<double> SpreadJ;          // energy spread (pooled); per qubit
                                          // with EnergyPerQubitJ
  std::optional<double> TargetTimeS;      // for the least-energy inverse
};

struct SpeedBounds {
  double ActionJs = 0;        // sum of the steps' actions
  double AngleSumRad = 0;     // sum of the steps' angles (for Mandelstam-Tamm)
  double PathActionJs = 0;    // longest path with weights action_g / k
  uint64_t Steps = 0;         // unitary leaf applications counted
  uint64_t OrthogonalSteps = 0;
  uint64_t UnknownSteps = 0;  // no angle known: counted as zero
  uint64_t ConditionalSkipped = 0;
  std::vector<std::string> UnknownGates; // sorted names
  std::optional<double> PooledTimeS, PerQubitTimeS;
  std::optional<double> PooledEnergyForTargetJ, PerQubitEnergyForTargetJ;
};

/// Computes the bounds of `C` on the leaves of `Cache`'s policy. Fails only
/// on a count past 2^64 - 1.
llvm::Expected<SpeedBounds> boundSpeed(const ir::Circuit &C, SummaryCache &Cache,
                                       physics::GateCostModel &Costs,
                                       const EnergyOptions &Energy);

} // namespace revbound::analysis

#endif
