//===- Landauer.h - The least heat of erasing information -----------------===//
//
// Landauer, IBM J. Res. Dev. 5, 183 (1961): removing one bit of entropy
// from a system in contact with a bath at temperature T dissipates at least
// k_B T ln 2 of heat. For a finite system the bound is k_B T ln 2 times the
// entropy drop of the erased part (Reeb & Wolf, New J. Phys. 16, 103011
// (2014)). Both are lower bounds; real devices dissipate far more.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_PHYSICS_LANDAUER_H
#define REVBOUND_PHYSICS_LANDAUER_H

namespace revbound::physics {

/// k_B T ln 2 in joules, the least heat per bit at `TemperatureKelvin`.
double landauerJoulesPerBit(double TemperatureKelvin);

/// The least heat of removing `Bits` bits of entropy at the temperature.
double landauerHeat(double Bits, double TemperatureKelvin);

} // namespace revbound::physics

#endif
