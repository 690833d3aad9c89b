//===- DeviceSchedule.h - A device's real schedule against the bounds -----===//
//
// Given gate durations, the schedule length is the longest path through the
// circuit with each leaf (and measure, reset) weighing its duration; qubits
// order the steps, classical bits do not. Each gate kind is then compared
// with its speed limit: duration / (action / E_step), how many times slower
// than physics allows the device runs it.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_ANALYSIS_DEVICESCHEDULE_H
#define REVBOUND_ANALYSIS_DEVICESCHEDULE_H

#include "revbound/analysis/SpeedBounds.h"
#include "revbound/config/Durations.h"

#include <optional>
#include <string>
#include <vector>

namespace revbound::analysis {

struct GateKindTiming {
  std::string Name;
  uint64_t Count = 0;
  double DurationS = 0;
  double MaxActionJs = 0;           // its costliest application
  double LeastEnergyJ = 0;          // MaxActionJs / DurationS (inf if 0 s)
  std::optional<double> LimitS;     // MaxActionJs / E_step at the energy
  std::optional<double> SlowerBy;   // DurationS / LimitS
};

struct DeviceComparison {
  double ScheduleS = 0;
  std::optional<double> BoundS;  // per-qubit time if given, else pooled
  std::optional<double> Ratio;   // BoundS / ScheduleS
  std::vector<GateKindTiming> Kinds; // furthest from the limit first
};

/// Fails, at the op, when a leaf has no duration and there is no default.
llvm::Expected<DeviceComparison>
compareWithDevice(const ir::Circuit &C, SummaryCache &Cache,
                  physics::GateCostModel &Costs, const config::Durations &D,
                  const EnergyOptions &Energy, const SpeedBounds &Bounds);

} // namespace revbound::analysis

#endif
