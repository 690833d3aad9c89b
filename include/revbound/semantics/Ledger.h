//===- Ledger.h - Erasure events and ancilla verdicts, as plain data -----===//
//
// What a semantic engine finds (DESIGN.md, "Erasure ledger"): every
// operation that may erase information, with the entropy it removes as an
// interval in bits, and for every ancilla whether it comes back to |0>.
// One rule covers every event: an operation on the set A of wires removes
// max(0, S(A before) - S(A after)) bits (Reeb & Wolf, New J. Phys. 16,
// 103011 (2014)), S the von Neumann entropy (Shannon for classical states)
// with the input wires uniformly random.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SEMANTICS_LEDGER_H
#define REVBOUND_SEMANTICS_LEDGER_H

#include "llvm/Support/SMLoc.h"

#include <cstdint>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace revbound::semantics {

enum class EngineKind { Structural, Classical, Density };
/// "structural", "classical" or "density".
const char *engineName(EngineKind K);

enum class ErasureKind {
  Reset,     // reset q: A = {q}
  Overwrite, // measure q -> c: A = {q, c}
  Discard,   // an ancilla or garbage qubit dropped at the end
};
/// "reset", "overwrite" or "discard".
const char *erasureKindName(ErasureKind K);

enum class ErasureStatus {
  Constant, // the erased wire is proved to hold a constant: 0 bits
  Exact,    // BitsLow == BitsHigh, computed exactly
  Unknown,  // only the interval is known
};
/// "constant", "exact" or "unknown".
const char *erasureStatusName(ErasureStatus S);

struct ErasureEvent {
  ErasureKind Kind = ErasureKind::Reset;
  /// The qubit (reset, discard) or the bit (overwrite) that loses its data.
  uint32_t Wire = 0;
  /// The top-level operation; for a discard, the last operation on the
  /// qubit, or its role declaration when nothing touched it.
  llvm::SMLoc Loc;
  ErasureStatus Status = ErasureStatus::Unknown;
  double BitsLow = 0, BitsHigh = 1;
  /// When nonzero, BitsEstimate is an estimate from this many random
  /// samples; it is not a bound, and Status stays Unknown.
  uint64_t Samples = 0;
  double BitsEstimate = 0;
};

struct AncillaVerdict {
  uint32_t Qubit = 0;
  /// true: proved |0> at the end; false: proved not; nullopt: unknown.
  std::optional<bool> Clean;
  /// For a dirty ancilla from the classical engine: input qubits and the
  /// basis value under which the ancilla ends at 1 (input qubits not listed
  /// are 0).
  std::vector<std::pair<uint32_t, bool>> Counterexample;
  bool HasCounterexample = false;
  /// From the density engine: the probability that the ancilla is not |0>
  /// at the end, inputs uniformly random.
  std::optional<double> DirtyProbability;
  /// Sampling fallback: samples drawn and how many ended at 1.
  uint64_t Samples = 0, DirtySamples = 0;
};

/// An interval of entropy in bits.
struct BitInterval {
  double Low = 0, High = 0;
  bool Exact = false;
};

struct Ledger {
  EngineKind Engine = EngineKind::Structural;
  /// Why this engine ran and on what (one sentence for people).
  std::string Reason;
  /// Resets and overwrites in program order, then the discards by qubit.
  std::vector<ErasureEvent> Events;
  /// The joint entropy of every discarded qubit at the end: the discard is
  /// one operation, so the totals charge this, not the sum of the
  /// discard events' marginals.
  BitInterval DiscardJoint;
  /// One per ancilla qubit, by qubit index.
  std::vector<AncillaVerdict> Ancillas;
  /// Fallbacks taken and limits hit, for people.
  std::vector<std::string> Notes;
};

/// Event count and entropy interval over a whole ledger: resets and
/// overwrites add their own intervals, discards add DiscardJoint.
struct LedgerTotals {
  uint64_t Events = 0;
  BitInterval Entropy;
};
LedgerTotals totals(const Ledger &L);

} // namespace revbound::semantics

#endif
