//===- EquivalenceSupport.h - What the equivalence methods share ----------===//
//
// Internal to the equivalence checker. The interface pairs the wires of the
// two circuits by name; every method numbers the inputs the same way, so
// that basis input x sets input i to bit i of x in both circuits.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SEMANTICS_EQUIVALENCESUPPORT_H
#define REVBOUND_SEMANTICS_EQUIVALENCESUPPORT_H

#include "revbound/ir/Circuit.h"
#include "revbound/semantics/Equivalence.h"

#include <cstdint>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace revbound::semantics::equivalence {

/// Wires of A and B paired by name.
struct Interface {
  /// Input qubits (A, B), in A's qubit order: input i of every method.
  std::vector<std::pair<uint32_t, uint32_t>> Inputs;
  /// Kept qubits (inputs and outputs), in A's qubit order.
  std::vector<std::pair<uint32_t, uint32_t>> KeptQubits;
  /// Bits of the classical registers both circuits declare.
  std::vector<std::pair<uint32_t, uint32_t>> KeptBits;
  /// Bits of A and of B that are not compared (registers on one side).
  std::vector<bool> UnmatchedBitA, UnmatchedBitB;
  std::vector<std::string> Notes;
};

/// Pairs the wires, or fails naming the first difference.
llvm::Expected<Interface> matchInterfaces(const ir::Circuit &A,
                                          const ir::Circuit &B);

/// The input registers' bit strings for basis input `X` (bit i of X is
/// input i of the interface), named as in A.
RegisterBits inputBits(const ir::Circuit &A, const Interface &I,
                       const std::vector<bool> &X);

/// A method's answer, or why it could not give one.
struct Attempt {
  std::optional<EquivalenceResult> Result;
  std::string WhyNot;
};

/// Channels on the kept wires compared exactly (`Random` false) or on
/// random inputs (`Random` true); see EquivalenceStates.cpp.
Attempt compareStates(const ir::Circuit &A, const ir::Circuit &B,
                      const Interface &I, const EquivalenceOptions &Opts,
                      bool Random);

/// Boolean functions of the kept wires compared with BDDs; see
/// EquivalenceBdd.cpp.
Attempt compareFunctions(const ir::Circuit &A, const ir::Circuit &B,
                         const Interface &I, const EquivalenceOptions &Opts);

} // namespace revbound::semantics::equivalence

#endif
