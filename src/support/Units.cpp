//===- Units.cpp - Physical quantities written with units -----------------===//
#include "revbound/support/Units.h"
#include "revbound/support/Constants.h"

#include "llvm/ADT/StringSwitch.h"

#include <charconv>
#include <cstdlib>
#include <string>
#include <cmath>
#include <fmt/format.h>
#include <optional>

namespace revbound {

const char *dimensionName(Dimension D) {
  switch (D) {
  case Dimension::Energy:
    return "energy";
  case Dimension::Temperature:
    return "temperature";
  case Dimension::Time:
    return "time";
  }
  return "quantity";
}

static const char *acceptedUnits(Dimension D) {
  switch (D) {
  case Dimension::Energy:
    return "J or eV with an SI prefix (e.g. 1eV, 3 meV, 2e-20 J)";
  case Dimension::Temperature:
    return "K with an SI prefix (e.g. 300K, 20mK, 10uK)";
  case Dimension::Time:
    return "s with an SI prefix (e.g. 1s, 20ns, 3 us)";
  }
  return "";
}

static std::optional<double> prefixFactor(llvm::StringRef P) {
  return llvm::StringSwitch<std::optional<double>>(P)
      .Case("", 1.0)
      .Case("f", 1e-15)
      .Case("p", 1e-12)
      .Case("n", 1e-9)
      .Cases("u", "\xC2\xB5", "\xCE\xBC", "mu", 1e-6) // u, micro sign, Greek mu
      .Case("m", 1e-3)
      .Case("k", 1e3)
      .Case("M", 1e6)
      .Case("G", 1e9)
      .Case("T", 1e12)
      .Default(std::nullopt);
}

/// The factor to the base unit of `D` for `Unit` ("meV", "K", ...).
static std::optional<double> unitFactor(llvm::StringRef Unit, Dimension D) {
  if (Unit.empty())
    return 1.0;
  struct Base {
    const char *Symbol;
    double Factor;
  };
  Base Energy[] = {{"eV", si::ElectronvoltJoules}, {"J", 1.0}};
  Base Temperature[] = {{"K", 1.0}};
  Base Time[] = {{"s", 1.0}};
  llvm::ArrayRef<Base> Bases = D == Dimension::Energy ? llvm::ArrayRef<Base>(Energy)
                               : D == Dimension::Temperature
                                   ? llvm::ArrayRef<Base>(Temperature)
                                   : llvm::ArrayRef<Base>(Time);
  for (const Base &B : Bases) {
    if (!Unit.endswith(B.Symbol))
      continue;
    std::optional<double> P = prefixFactor(Unit.drop_back(strlen(B.Symbol)));
    if (P)
      return *P * B.Factor;
  }
  return std::nullopt;
}

llvm::Expected<double> parseQuantity(llvm::StringRef Text, Dimension D,
                                     bool AllowZero) {
  llvm::StringRef T = Text.trim();
  double Value = 0;
  auto [Ptr, Ec] = std::from_chars(T.begin(), T.end(), Value);
  auto fail = [&](std::string Why) {
    return llvm::createStringError(llvm::inconvertibleErrorCode(), "%s",
                                   Why.c_str());
  };
  if (Ec == std::errc::result_out_of_range)
    return fail(fmt::format("the {} '{}' is out of range", dimensionName(D),
                            Text.str()));
  if (Ec != std::errc() || Ptr == T.begin())
    return fail(fmt::format("'{}' is not a valid {}: expected a number then {}",
                            Text.str(), dimensionName(D), acceptedUnits(D)));
  llvm::StringRef Unit = llvm::StringRef(Ptr, size_t(T.end() - Ptr)).trim();
  std::optional<double> Factor = unitFactor(Unit, D);
  if (!Factor)
    return fail(fmt::format("'{}' is not a unit of {}; use {}", Unit.str(),
                            dimensionName(D), acceptedUnits(D)));
  // Apply a power of ten through the decimal text when the unit is one, so
  // that "50ns" is the double nearest to 5e-8, not 50 * 1e-9.
  double SI = Value * *Factor;
  int Exp = int(std::lround(std::log10(*Factor)));
  if (std::pow(10.0, Exp) == *Factor && Exp != 0) {
    std::string Text(T.begin(), Ptr);
    size_t E = Text.find_first_of("eE");
    long Total = Exp;
    if (E != std::string::npos) {
      Total += std::strtol(Text.c_str() + E + 1, nullptr, 10);
      Text.resize(E);
    }
    SI = std::strtod((Text + "e" + std::to_string(Total)).c_str(), nullptr);
  }
  if (!std::isfinite(SI))
    return fail(fmt::format("the {} '{}' is out of range", dimensionName(D),
                            Text.str()));
  if (SI < 0 || (SI == 0 && !AllowZero))
    return fail(fmt::format("the {} '{}' must be positive", dimensionName(D),
                            Text.str()));
  return SI;
}

} // namespace revbound
