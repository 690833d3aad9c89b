//===- Equivalence.h - Do two circuits compute the same thing? ------------===//
//
// Two circuits are compared on the wires they keep (inputs, outputs and the
// classical registers both declare), with inputs arbitrary and every other
// qubit starting |0>; ancilla and garbage qubits are internal and may
// differ. Three methods, tried in this order (docs/compare.md):
//  - exact: both circuits as isometries (measure and reset dilated into
//    extra wires), compared as channels on the kept wires through their
//    Choi matrices, so global phase does not count and relative phases do;
//  - bdd: circuits of monomial gates as Boolean functions of the inputs
//    (one BDD per kept wire): exact on basis states, relative phases are
//    not compared;
//  - random: random input states, never reported as a proof.
// A mismatch of the interfaces is an error, not a verdict.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SEMANTICS_EQUIVALENCE_H
#define REVBOUND_SEMANTICS_EQUIVALENCE_H

#include "revbound/ir/Circuit.h"

#include "llvm/Support/Error.h"

#include <cstdint>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace revbound::semantics {

struct EquivalenceOptions {
  /// The exact method runs every basis input: at most 2^MaxExactInputs.
  unsigned MaxExactInputs = 20;
  /// Amplitude updates a method may spend on both circuits (states are
  /// sparse, so circuits that keep basis states basis states are cheap).
  uint64_t MaxExactWork = uint64_t(1) << 32;
  uint64_t MaxRandomWork = uint64_t(1) << 32;
  /// Nonzero amplitudes one state may hold.
  uint64_t MaxStateEntries = uint64_t(1) << 22;
  /// Discarded wires per side (ancillas, garbage, one environment wire per
  /// reset or overwrite, and the kept bits, which are dephased): the
  /// channel comparison forms 2^discarded x 2^discarded matrices.
  unsigned MaxDiscardedWires = 10;
  /// Random trials: half random basis inputs, half random superpositions
  /// of a few basis inputs.
  unsigned Trials = 64;
  uint64_t Seed = 0x5eed;
  /// The fraction of basis inputs a difference is assumed to touch when the
  /// chance that the random method misses it is stated.
  double StatedFraction = 0.1;
  uint64_t MaxBddNodes = uint64_t(1) << 22;
  uint64_t MaxExpandedOps = 100'000'000;
  unsigned MaxMatrixQubits = 10;
  /// Squared distance between two output states (Frobenius) below which
  /// they count as equal: floating-point round-off.
  double Tolerance = 1e-7;
};

enum class EquivalenceVerdict { Equivalent, NotEquivalent, Unknown };
enum class EquivalenceMethod { None, Exact, Bdd, Random };
const char *equivalenceVerdictName(EquivalenceVerdict V); // "equivalent", ...
const char *equivalenceMethodName(EquivalenceMethod M);   // "exact", ...

/// Register name -> bit string, highest index first (a binary numeral);
/// qubits of the register that are not inputs read 0.
using RegisterBits = std::vector<std::pair<std::string, std::string>>;

/// An input on which the circuits' kept wires differ: a basis state, or
/// (|First> + Phase |Second>) / sqrt 2 when they differ only on
/// superpositions (relative phases).
struct EquivalenceWitness {
  RegisterBits First;
  std::optional<RegisterBits> Second;
  std::string Phase; // "1" or "i" when Second is set
  /// Kept wires ("s[2]", "c[0]") whose value differs on a basis witness.
  std::vector<std::string> DifferingWires;
};

struct EquivalenceResult {
  EquivalenceVerdict Verdict = EquivalenceVerdict::Unknown;
  EquivalenceMethod Method = EquivalenceMethod::None;
  /// Why this method ran, or why the verdict is unknown.
  std::string Reason;
  std::optional<EquivalenceWitness> Witness;
  /// Random method: trials run, and the chance that a difference touching
  /// at least StatedFraction of the basis inputs went unseen.
  uint64_t Trials = 0;
  double StatedFraction = 0;
  double MissChance = 0;
  /// Per side (reference, candidate): whether every ancilla ends |0>
  /// (nullopt: not decided by the method that ran, or no ancilla).
  std::optional<bool> AncillasCleanA, AncillasCleanB;
  std::vector<std::string> Notes;
};

/// Compares `B` (the candidate) with `A` (the reference). Fails with a
/// message naming the wire or register when the interfaces differ: the same
/// input and kept qubits by name ("reg[i]") and role, and equal sizes for
/// classical registers of one name.
llvm::Expected<EquivalenceResult>
checkEquivalence(const ir::Circuit &A, const ir::Circuit &B,
                 const EquivalenceOptions &Opts);

} // namespace revbound::semantics

#endif
