//===- Constants.h - Exact SI constants ------------------------------------===//
//
// The defining constants of the SI since 2019 (BIPM, The International System
// of Units, 9th edition, 2019, table 1): exact by definition.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SUPPORT_CONSTANTS_H
#define REVBOUND_SUPPORT_CONSTANTS_H

#include <numbers>

namespace revbound::si {

inline constexpr double BoltzmannJoulesPerKelvin = 1.380649e-23;
inline constexpr double PlanckJouleSeconds = 6.62607015e-34;
inline constexpr double ReducedPlanckJouleSeconds =
    PlanckJouleSeconds / (2 * std::numbers::pi);
inline constexpr double ElementaryChargeCoulombs = 1.602176634e-19;
inline constexpr double LightMetresPerSecond = 299792458.0;
/// One electronvolt in joules: e times one volt.
inline constexpr double ElectronvoltJoules = ElementaryChargeCoulombs;

} // namespace revbound::si

#endif
