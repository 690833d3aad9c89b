//===- EngineSupport.h - What every semantic engine needs -----------------===//
//
// Internal to src/semantics: the parts of a ledger that do not depend on
// the engine (which qubits are discarded, where each was last used) and
// small entropy helpers.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SEMANTICS_ENGINESUPPORT_H
#define REVBOUND_SEMANTICS_ENGINESUPPORT_H

#include "revbound/ir/Circuit.h"
#include "revbound/semantics/Ledger.h"

#include "llvm/Support/SMLoc.h"

#include <cstdint>
#include <vector>

namespace revbound::semantics {

/// Binary entropy H2(p) in bits; 0 at p = 0 and p = 1.
double binaryEntropy(double P);

/// Shannon entropy in bits of a distribution given by nonnegative weights
/// (normalised here; zero weights are skipped).
double shannonEntropy(const std::vector<double> &Weights);

/// How far (relative, and absolute below one bit) an entropy computed in
/// floating point may lie from a whole number of bits and still be taken
/// for it.
inline constexpr double WholeBitsTolerance = 1e-12;

/// Clamps an entropy computed in floating point into [0, MaxBits] and
/// snaps it to a whole number of bits within WholeBitsTolerance, so that
/// -1e-16 prints as 0 and 0.9999999999999999 as 1.
double clampBits(double Bits, double MaxBits);

/// Per qubit, the location of the last top-level operation on it (barriers
/// excluded), or its role declaration when no operation touches it.
std::vector<llvm::SMLoc> lastUses(const ir::Circuit &C);

/// False when no erasure event can occur: no reset, no bit measured twice
/// and no discarded qubit. Unitary gates change no entropy, and a measure
/// into a bit nothing wrote before overwrites a known 0, so no engine needs
/// to walk the gates.
bool canErase(const ir::Circuit &C);

/// The qubits whose role is discarded at the end (ancilla, garbage), in
/// index order.
std::vector<uint32_t> discardedQubits(const ir::Circuit &C);

/// The qubits with the input role, in index order.
std::vector<uint32_t> inputQubits(const ir::Circuit &C);

/// The bits of the register an `if` reads, least significant first.
std::vector<uint32_t> conditionBits(const ir::Circuit &C,
                                    const ir::Condition &Cond);

/// A discard event for qubit `Q` with the given interval and status.
ErasureEvent discardEvent(uint32_t Q, llvm::SMLoc Loc, ErasureStatus Status,
                          double Low, double High);

} // namespace revbound::semantics

#endif
