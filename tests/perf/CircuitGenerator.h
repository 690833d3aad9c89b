//===- CircuitGenerator.h - Deterministic OpenQASM 2.0 benchmark circuits -===//
//
// The benchmark program and the revbound_gen_circuits tool both build their
// inputs here, so that the in-memory buffers the benchmarks time are the same
// bytes as the files the end-to-end script measures. Output depends only on
// the spec (fixed seeds, our own PRNG), never on the platform.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_TESTS_PERF_CIRCUITGENERATOR_H
#define REVBOUND_TESTS_PERF_CIRCUITGENERATOR_H

#include <cstdint>
#include <string>

namespace revbound::perf {

/// A flat circuit: `Ops` top-level operations on `Qubits` qubits, a mix of
/// h, cx, rz(angle), t, tdg, x and ccx, then one measure per qubit at the end
/// (the measures are part of `Ops`, which is exact). About 13.8 bytes per op
/// at 64 qubits.
struct FlatSpec {
  uint64_t Ops = 1'000'000;
  uint32_t Qubits = 64;
  uint64_t Seed = 0x5EED0001;
};

/// Nested definitions: n0 holds two leaves and n(k) calls n(k-1) twice with
/// its arguments rotated, so one top-level call of n(Levels-1) expands to
/// exactly 2^Levels leaves on three qubits (then three measures).
struct NestedSpec {
  unsigned Levels = 61;
};

/// `Gates` small user gates with two parameters each, called `Calls` times
/// with fresh angles, so that nearly every call needs its own summary.
struct ParamSpec {
  unsigned Gates = 1000;
  uint64_t Calls = 100'000;
  uint32_t Qubits = 16;
  uint64_t Seed = 0x5EED0003;
};

/// The OpenQASM 2.0 text of each circuit; `Qubits` below 3 is raised to 3 so
/// that ccx always has three distinct qubits.
std::string generateFlat(const FlatSpec &S);
std::string generateNested(const NestedSpec &S);
std::string generateParams(const ParamSpec &S);

} // namespace revbound::perf

#endif
