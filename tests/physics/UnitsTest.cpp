//===- UnitsTest.cpp - Quantities with units, and the SI constants --------===//
#include "revbound/support/Constants.h"
#include "revbound/support/Units.h"

#include <gtest/gtest.h>

using namespace revbound;

// The defining constants, exact since 2019 (BIPM, SI Brochure, 9th edition,
// 2019, table 1).
TEST(Constants, Si2019Exact) {
  EXPECT_EQ(si::BoltzmannJoulesPerKelvin, 1.380649e-23);
  EXPECT_EQ(si::PlanckJouleSeconds, 6.62607015e-34);
  EXPECT_EQ(si::ElementaryChargeCoulombs, 1.602176634e-19);
  EXPECT_EQ(si::LightMetresPerSecond, 299792458.0);
  // hbar = h / 2 pi = 1.054571817...e-34 J s (CODATA 2018, exact digits).
  EXPECT_NEAR(si::ReducedPlanckJouleSeconds, 1.054571817e-34, 1e-43);
}

static double value(const char *Text, Dimension D) {
  llvm::Expected<double> V = parseQuantity(Text, D);
  if (!V) {
    ADD_FAILURE() << Text << ": " << llvm::toString(V.takeError());
    return -1;
  }
  return *V;
}

static std::string error(const char *Text, Dimension D) {
  llvm::Expected<double> V = parseQuantity(Text, D);
  if (V)
    return "";
  return llvm::toString(V.takeError());
}

TEST(Units, EnergiesTemperaturesTimes) {
  EXPECT_DOUBLE_EQ(value("1eV", Dimension::Energy), 1.602176634e-19);
  EXPECT_DOUBLE_EQ(value("3 meV", Dimension::Energy), 3e-3 * 1.602176634e-19);
  EXPECT_DOUBLE_EQ(value("2.5keV", Dimension::Energy), 2.5e3 * 1.602176634e-19);
  EXPECT_DOUBLE_EQ(value("2e-20 J", Dimension::Energy), 2e-20);
  EXPECT_DOUBLE_EQ(value("4 uJ", Dimension::Energy), 4e-6);
  EXPECT_DOUBLE_EQ(value("7", Dimension::Energy), 7); // bare: SI base unit
  EXPECT_DOUBLE_EQ(value("300K", Dimension::Temperature), 300);
  EXPECT_DOUBLE_EQ(value("20 mK", Dimension::Temperature), 0.02);
  EXPECT_DOUBLE_EQ(value("10uK", Dimension::Temperature), 1e-5);
  EXPECT_DOUBLE_EQ(value("10ns", Dimension::Time), 1e-8);
  EXPECT_DOUBLE_EQ(value("3 us", Dimension::Time), 3e-6);
  EXPECT_DOUBLE_EQ(value("1 fs", Dimension::Time), 1e-15);
  // Prefixes go through the decimal text: the nearest double, exactly.
  EXPECT_EQ(value("50ns", Dimension::Time), 5e-8);
  EXPECT_EQ(value("2.5e3 us", Dimension::Time), 2.5e-3);
  EXPECT_EQ(value("7 \xCE\xBCs", Dimension::Time), 7e-6);   // Greek mu
  EXPECT_EQ(value("7 \xC2\xB5s", Dimension::Time), 7e-6);   // micro sign
}

TEST(Units, WrongUnitsAreErrors) {
  EXPECT_EQ(error("1 K", Dimension::Energy),
            "'K' is not a unit of energy; use J or eV with an SI prefix (e.g. "
            "1eV, 3 meV, 2e-20 J)");
  EXPECT_EQ(error("5 eV", Dimension::Time),
            "'eV' is not a unit of time; use s with an SI prefix (e.g. 1s, "
            "20ns, 3 us)");
  EXPECT_EQ(error("-1 J", Dimension::Energy),
            "the energy '-1 J' must be positive");
  EXPECT_EQ(error("0 K", Dimension::Temperature),
            "the temperature '0 K' must be positive");
  EXPECT_NE(error("eV", Dimension::Energy), "");
  EXPECT_EQ(error("1e999 J", Dimension::Energy),
            "the energy '1e999 J' is out of range");
  EXPECT_EQ(error("1e400eV", Dimension::Energy),
            "the energy '1e400eV' is out of range");
}
