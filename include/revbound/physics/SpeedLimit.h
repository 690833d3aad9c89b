//===- SpeedLimit.h - Quantum speed limits for one operation --------------===//
//
// The least time a unitary step can take, from the energy available to it.
// For a step of gate angle L (the largest Fubini-Study angle it moves any
// state through, see GateAngle.h), with fidelity epsilon = cos^2 L between a
// state and its image:
//  - Margolus-Levitin type (Margolus & Levitin, Physica D 120, 188 (1998);
//    arbitrary fidelity: Giovannetti, Lloyd & Maccone, PRA 67, 052109
//    (2003), exact form proven by Hoernedal & Soennerborn, arXiv:2301.10063):
//      t >= pi hbar alpha(epsilon) / (2 E), E the mean energy above the
//      ground state, alpha(0) = 1.
//  - Mandelstam-Tamm (J. Phys. USSR 9, 249 (1945)): t >= hbar L / dE, dE
//    the energy spread.
// Both assume a time-independent Hamiltonian during the step. They are lower
// bounds from physics, not predictions for any hardware.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_PHYSICS_SPEEDLIMIT_H
#define REVBOUND_PHYSICS_SPEEDLIMIT_H

namespace revbound::physics {

/// alpha(epsilon) = (2/pi) min over p in (0,1) of
///   p * arccos(1 - (1 - epsilon) / (2 p (1 - p))),
/// the exact Margolus-Levitin factor for reaching fidelity epsilon in [0, 1]
/// (values outside are clamped). alpha(0) = 1, alpha(1) = 0, decreasing.
double mlFactor(double Epsilon);

/// (2/pi) arccos(sqrt(epsilon)), whose square lower-bounds mlFactor.
double mtFactor(double Epsilon);

/// Margolus-Levitin-type time in seconds for a step of angle `Angle`
/// (radians, in [0, pi/2]) at mean energy `EnergyJ` above the ground state.
double marginalMLTime(double Angle, double EnergyJ);

/// The energy-free part of that bound, in J s: the step's action
/// pi hbar alpha(cos^2 Angle) / 2, so that t >= action / E.
double mlAction(double Angle);

/// Mandelstam-Tamm time in seconds: hbar * Angle / SpreadJ.
double mandelstamTammTime(double Angle, double SpreadJ);

} // namespace revbound::physics

#endif
