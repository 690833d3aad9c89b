//===- GateCost.h - What one leaf application costs in time ---------------===//
//
// For each leaf and parameter values: its gate angle L (GateAngle.h) and the
// energy-free action of the Margolus-Levitin-type bound, pi hbar
// alpha(cos^2 L) / 2 in J s, so that the step takes at least action / E.
// Opaque leaves and leaves too wide for a matrix have no known angle; they
// cost nothing (a valid lower bound) unless the user gives their angle.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_PHYSICS_GATECOST_H
#define REVBOUND_PHYSICS_GATECOST_H

#include "revbound/ir/Unitary.h"

#include "llvm/ADT/DenseMap.h"
#include "llvm/ADT/StringMap.h"

#include <array>
#include <optional>
#include <string>
#include <vector>
#include <unordered_map>

namespace revbound::physics {

struct LeafCost {
  bool Known = false;     // the angle is known (computed or given)
  double AngleRad = 0;    // L in [0, pi/2]
  double ActionJs = 0;    // pi hbar alpha(cos^2 L) / 2
  bool Orthogonal = false; // L = pi/2
};

/// The closed form of a library rotation's angle (GateCost.cpp).
enum class RotationForm : int8_t { None, U, U2, Phase, Tilt };

class GateCostModel {
public:
  /// `GivenAngles` maps gate names to their angle in radians (--gate-angle);
  /// a given angle wins over the computed one.
  GateCostModel(const ir::Circuit &C, llvm::StringMap<double> GivenAngles,
                unsigned MaxMatrixQubits = 10);

  /// The cost of one application of leaf `G` with `Params`, memoised per
  /// gate and parameter values. The reference is valid until the next call.
  const LeafCost &cost(ir::GateId G, llvm::ArrayRef<double> Params);

  /// The cost of a step of angle `Angle` (memoised per value).
  LeafCost costOfAngle(double Angle);

private:
  std::optional<double> angleOf(ir::GateId G, llvm::ArrayRef<double> Params);
  RotationForm rotationForm(ir::GateId G);
  std::vector<int8_t> Forms; // per gate: -1 not yet known, else a RotationForm

  const ir::Circuit &C;
  llvm::StringMap<double> GivenAngles;
  unsigned MaxMatrixQubits;
  ir::UnitaryCache Unitaries;
  std::unordered_map<std::string, LeafCost> ByCall;
  std::vector<std::optional<LeafCost>> ById; // gates without parameters
  LeafCost Scratch;
  struct ActionSlot {
    uint64_t AngleBits = 0; // the angle's bits
    double ActionJs = 0;
    bool Valid = false;
  };
  std::array<ActionSlot, 4096> ActionCache{};
};

} // namespace revbound::physics

#endif
