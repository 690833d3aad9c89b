//===- GateAngle.h - How far a unitary can move a state -------------------===//
//
// L(U) = max over states psi of arccos |<psi|U|psi>|. |<psi|U|psi>| is the
// modulus of a convex combination of U's eigenvalues, so when they all lie
// on an arc of the unit circle shorter than pi the least modulus is the
// chord midpoint's, cos(arc/2), and L = arc/2; when no such arc exists the
// origin is in their convex hull and L = pi/2 (some state is mapped to an
// orthogonal one). X, H, CX, CZ, CCX: pi/2; S: pi/4; T: pi/8.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_PHYSICS_GATEANGLE_H
#define REVBOUND_PHYSICS_GATEANGLE_H

#include "revbound/ir/Unitary.h"

namespace revbound::physics {

/// L(U) in radians, in [0, pi/2]. Arcs within 1e-12 of pi count as pi.
double gateAngle(const ir::Matrix &U);

/// True when L(U) = pi/2: U can map some state to an orthogonal one.
bool reachesOrthogonal(double Angle);

} // namespace revbound::physics

#endif
