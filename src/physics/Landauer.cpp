//===- Landauer.cpp - The least heat of erasing information ---------------===//
#include "revbound/physics/Landauer.h"

#include "revbound/support/Constants.h"

#include <numbers>

namespace revbound::physics {

double landauerJoulesPerBit(double TemperatureKelvin) {
  return si::BoltzmannJoulesPerKelvin * TemperatureKelvin * std::numbers::ln2;
}

double landauerHeat(double Bits, double TemperatureKelvin) {
  return Bits * landauerJoulesPerBit(TemperatureKelvin);
}

} // namespace revbound::physics
