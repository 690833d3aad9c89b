//===- GateCost.cpp - What one leaf application costs in time -------------===//
#include "revbound/physics/GateCost.h"
#include "revbound/physics/GateAngle.h"
#include "revbound/physics/SpeedLimit.h"

#include <Eigen/Dense>

#include <cmath>
#include <cstring>
#include <numbers>

namespace revbound::physics {

GateCostModel::GateCostModel(const ir::Circuit &C,
                             llvm::StringMap<double> GivenAngles,
                             unsigned MaxMatrixQubits)
    : C(C), GivenAngles(std::move(GivenAngles)),
      MaxMatrixQubits(MaxMatrixQubits), Unitaries(C, MaxMatrixQubits) {}

/// The 2x2 unitary of a one-qubit gate, by fixed-size products (no heap):
/// one-qubit leaves are most of a flat file and often differ in angle.
static std::optional<Eigen::Matrix2cd> oneQubit(const ir::Circuit &C,
                                                ir::GateId G,
                                                llvm::ArrayRef<double> P) {
  const ir::GateDef &D = C.gate(G);
  if (G == ir::Circuit::UGate)
    return Eigen::Matrix2cd(ir::builtinU(P[0], P[1], P[2]));
  if (!D.hasBody() || D.numQubits() != 1)
    return std::nullopt;
  Eigen::Matrix2cd M = Eigen::Matrix2cd::Identity();
  llvm::SmallVector<double, 4> Sub;
  for (const ir::BodyOp &B : D.Body) {
    if (B.IsBarrier)
      continue;
    Sub.clear();
    for (const ir::ParamExpr &E : B.Params) {
      Sub.push_back(E.evaluate(P));
      if (!std::isfinite(Sub.back()))
        return std::nullopt;
    }
    std::optional<Eigen::Matrix2cd> Step = oneQubit(C, B.Callee, Sub);
    if (!Step)
      return std::nullopt;
    M = *Step * M;
  }
  return M;
}

/// The library's rotation gates, which are most of the parametrised leaves
/// of real files, have closed forms: |tr U(theta, phi, lambda)| =
/// 2 |cos(theta/2) cos((phi + lambda)/2)|, and the angle is arccos of half
/// of it.
static double angleOfU(double Theta, double PhiPlusLambda) {
  return std::acos(std::min(
      1.0, std::abs(std::cos(Theta / 2) * std::cos(PhiPlusLambda / 2))));
}

/// arccos |cos X|, the distance from X to the nearest multiple of pi, for
/// the one-angle rotations (rz, u1, p, rx, ry), without the trigonometry:
/// it is the files' most common parametrised gate, and arccos of a cosine
/// near 1 loses half the digits of a small angle: rz(2e-8) came out as
/// angle 0 rather than 1e-8, rz(1e-7) 1% short.
static double halfTurnDistance(double X) {
  using std::numbers::pi;
  double Y = std::fabs(X);
  if (Y >= pi)
    Y = std::fmod(Y, pi); // exact in IEEE arithmetic
  return std::min(Y, pi - Y);
}

/// Which closed form gate `D` has, by its name and origin.
static RotationForm rotationFormByName(const ir::GateDef &D) {
  bool Builtin = D.Origin == ir::GateOrigin::Builtin;
  bool Library = D.Origin == ir::GateOrigin::StandardLibrary;
  if (Builtin && D.Name == "U")
    return RotationForm::U;
  if (!Library)
    return RotationForm::None;
  llvm::StringRef N = D.Name;
  unsigned P = D.numParams();
  if ((N == "u3" || N == "u") && P == 3)
    return RotationForm::U;
  if (N == "u2" && P == 2)
    return RotationForm::U2;
  if ((N == "u1" || N == "p" || N == "rz") && P == 1)
    return RotationForm::Phase;
  if ((N == "rx" || N == "ry") && P == 1)
    return RotationForm::Tilt;
  return RotationForm::None;
}

static std::optional<double> rotationAngle(RotationForm F,
                                           llvm::ArrayRef<double> P) {
  using std::numbers::pi;
  // A value that is not finite has no angle (angleOf's rule).
  for (double V : P)
    if (!std::isfinite(V))
      return std::nullopt;
  switch (F) {
  case RotationForm::None:
    return std::nullopt;
  case RotationForm::U:
    return angleOfU(P[0], P[1] + P[2]);
  case RotationForm::U2:
    return angleOfU(pi / 2, P[0] + P[1]);
  case RotationForm::Phase:
  case RotationForm::Tilt:
    return halfTurnDistance(P[0] / 2);
  }
  return std::nullopt;
}

std::optional<double> GateCostModel::angleOf(ir::GateId G,
                                             llvm::ArrayRef<double> Params) {
  const ir::GateDef &D = C.gate(G);
  auto Given = GivenAngles.find(D.Name);
  if (Given != GivenAngles.end())
    return std::clamp(Given->second, 0.0, std::numbers::pi / 2);
  if (std::optional<double> Fast = rotationAngle(rotationForm(G), Params))
    return Fast;
  for (double V : Params)
    if (!std::isfinite(V))
      return std::nullopt;
  if (D.numQubits() == 1) {
    // Two eigenvalues always fit an arc of at most pi, so L = arc/2 =
    // arccos(|tr U| / 2) (GateAngle.h's rule for two eigenvalues).
    std::optional<Eigen::Matrix2cd> M = oneQubit(C, G, Params);
    if (!M)
      return std::nullopt;
    return std::acos(std::min(1.0, std::abs(M->trace()) / 2));
  }
  const ir::Matrix *U = Unitaries.get(G, Params);
  if (!U)
    return std::nullopt;
  return gateAngle(*U);
}

/// rotationFormByName goes by name; a --stdlib library may define `rz` as
/// something else, so the closed form is checked once per gate against the
/// unitary at generic angles. A gate with a given angle (--gate-angle) has
/// no closed form here: the given angle wins.
RotationForm GateCostModel::rotationForm(ir::GateId G) {
  if (Forms.size() <= G)
    Forms.resize(C.Gates.size(), -1);
  if (Forms[G] >= 0)
    return RotationForm(Forms[G]);
  const ir::GateDef &D = C.gate(G);
  RotationForm F = GivenAngles.count(D.Name) ? RotationForm::None
                                             : rotationFormByName(D);
  std::vector<double> P(D.numParams());
  for (int Trial = 0; Trial < 3 && F != RotationForm::None; ++Trial) {
    for (unsigned I = 0; I < P.size(); ++I)
      P[I] = 0.37 + 0.61 * Trial + 0.23 * I;
    std::optional<double> Fast = rotationAngle(F, P);
    std::optional<Eigen::Matrix2cd> M =
        D.numQubits() == 1 ? oneQubit(C, G, P) : std::nullopt;
    bool Holds = Fast && M &&
                 std::abs(*Fast - std::acos(std::min(
                                      1.0, std::abs(M->trace()) / 2))) < 1e-9;
    if (!Holds)
      F = RotationForm::None;
  }
  Forms[G] = int8_t(F);
  return F;
}

LeafCost GateCostModel::costOfAngle(double Angle) {
  LeafCost Cost;
  Cost.Known = true;
  Cost.AngleRad = Angle;
  Cost.Orthogonal = reachesOrthogonal(Angle);
  // Files repeat a few angles (pi/4, pi/8) or have all different ones; a
  // direct-mapped cache serves the first at no cost in memory and costs the
  // second one probe.
  uint64_t Bits;
  std::memcpy(&Bits, &Angle, sizeof(Bits));
  ActionSlot &Slot = ActionCache[(Bits ^ Bits >> 29) % ActionCache.size()];
  if (!Slot.Valid || Slot.AngleBits != Bits) {
    Slot.AngleBits = Bits;
    Slot.ActionJs = mlAction(Angle);
    Slot.Valid = true;
  }
  Cost.ActionJs = Slot.ActionJs;
  return Cost;
}

const LeafCost &GateCostModel::cost(ir::GateId G, llvm::ArrayRef<double> Params) {
  // Fast paths: gates without parameters by id, rotations by closed form;
  // only the rest pays for a keyed lookup.
  if (Params.empty()) {
    if (ById.size() <= G)
      ById.resize(C.Gates.size());
    if (!ById[G]) {
      std::optional<double> Angle = angleOf(G, Params);
      ById[G] = Angle ? costOfAngle(*Angle) : LeafCost();
    }
    return *ById[G];
  }
  if (std::optional<double> Angle = rotationAngle(rotationForm(G), Params)) {
    Scratch = costOfAngle(*Angle);
    return Scratch;
  }
  std::string Key = ir::callKey(G, Params);
  auto It = ByCall.find(Key);
  if (It != ByCall.end())
    return It->second;
  if (ByCall.size() > (1u << 18)) // a cache: bound its memory
    ByCall.clear();
  std::optional<double> Angle = angleOf(G, Params);
  LeafCost Cost = Angle ? costOfAngle(*Angle) : LeafCost();
  return ByCall.emplace(std::move(Key), Cost).first->second;
}

} // namespace revbound::physics
