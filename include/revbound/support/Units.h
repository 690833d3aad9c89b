//===- Units.h - Physical quantities written with units -------------------===//
//
// Parses "300K", "20 mK", "1eV", "2.5e-3 J", "10ns". A bare number is in the
// SI base unit of the quantity. Units carry SI prefixes (f p n u µ m k M G T,
// also "mu" for micro); a unit of another dimension is an error.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SUPPORT_UNITS_H
#define REVBOUND_SUPPORT_UNITS_H

#include "llvm/ADT/StringRef.h"
#include "llvm/Support/Error.h"

namespace revbound {

enum class Dimension { Energy, Temperature, Time };

/// "energy", "temperature" or "time".
const char *dimensionName(Dimension D);

/// The value of `Text` in the SI base unit of `D` (joules, kelvins,
/// seconds). Fails with a message naming the accepted units; negative values
/// and non-finite values are errors, and zero is an error unless `AllowZero`.
llvm::Expected<double> parseQuantity(llvm::StringRef Text, Dimension D,
                                     bool AllowZero = false);

} // namespace revbound

#endif
