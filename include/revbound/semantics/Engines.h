//===- Engines.h - The three semantic engines and how one is chosen ------===//
//
// DESIGN.md, "Semantics tiers". Each engine walks the circuit once in
// program order and fills a Ledger:
//  - structural: any size; basis-value constant propagation only;
//  - classical: wires as Boolean functions of the input bits (BDDs), exact
//    for circuits of monomial gates, a sound over-approximation otherwise;
//  - density: the exact mixed state of a small circuit.
// `Auto` picks the strongest engine that fits and says why.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SEMANTICS_ENGINES_H
#define REVBOUND_SEMANTICS_ENGINES_H

#include "revbound/ir/Circuit.h"
#include "revbound/semantics/Ledger.h"

#include "llvm/ADT/StringRef.h"
#include "llvm/Support/Error.h"

#include <cstdint>
#include <optional>

namespace revbound::semantics {

enum class EngineChoice { Auto, Structural, Classical, Density };
/// Parses "auto", "structural", "classical" or "density".
std::optional<EngineChoice> parseEngineChoice(llvm::StringRef Name);

struct EngineOptions {
  EngineChoice Choice = EngineChoice::Auto;
  /// The density engine's widest circuit (--max-density-qubits).
  unsigned MaxDensityQubits = 12;
  /// `Auto` runs the density engine only while 4^qubits times the gate
  /// applications stays under this, so that it stays within seconds; the
  /// run itself stops there too, counting every classical branch a gate
  /// runs in (measurements multiply them), and auto falls back.
  uint64_t MaxAutoDensityWork = uint64_t(1) << 33;
  /// `Auto` runs the classical engine only on circuits that expand to at
  /// most this many operations; larger ones get the structural engine, so
  /// that auto stays within seconds: on flat reversible circuits the
  /// classical engine (BDDs, then 4096 sampled inputs) adds about 1.3 s per
  /// million operations (docs/limits.md). `--engine classical` still runs
  /// larger ones.
  uint64_t MaxAutoClassicalOps = 1'000'000;
  /// An explicit density run refuses more than this (a few minutes),
  /// beforehand and, counting branches, while it runs.
  uint64_t MaxDensityWork = uint64_t(1) << 38;
  /// BDD nodes the classical engine may hold before it falls back to
  /// sampling.
  uint64_t MaxBddNodes = uint64_t(1) << 22;
  /// Gate applications an engine may expand to; calls past it are
  /// over-approximated as a whole (unknown values on their qubits).
  uint64_t MaxExpandedOps = 100'000'000;
  /// Widest gate whose unitary an engine builds (ir::UnitaryCache).
  unsigned MaxMatrixQubits = 10;
  /// Random inputs for the sampling fallback, and its seed.
  uint64_t Samples = 4096;
  uint64_t Seed = 0x5eed;
  /// Largest discard set whose joint entropy is computed exactly.
  unsigned MaxJointWires = 16;
};

/// Runs the engine `Opts.Choice` names, or for Auto the strongest that fits.
/// An explicit choice that cannot run (a density run on too many qubits)
/// is an error whose message names the limit.
llvm::Expected<Ledger> runEngine(const ir::Circuit &C,
                                 const EngineOptions &Opts);

Ledger runStructural(const ir::Circuit &C, const EngineOptions &Opts);
Ledger runClassical(const ir::Circuit &C, const EngineOptions &Opts);
/// Fails when more than MaxDensityQubits qubits are in use (touched by an
/// operation other than a barrier), on a gate without a unitary (an opaque
/// gate), and once the run passes its work limit in matrix-entry updates,
/// counted over the classical branches as they arise: MaxDensityWork for
/// an explicit choice (Choice == Density), MaxAutoDensityWork otherwise.
llvm::Expected<Ledger> runDensity(const ir::Circuit &C,
                                  const EngineOptions &Opts);

} // namespace revbound::semantics

#endif
