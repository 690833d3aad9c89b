//===- FuzzLimits.h - The small limits every fuzz target runs under -------===//
//
// Small enough that each input takes milliseconds and bounded memory, as a
// CI job's budget would; the front end and the engines are fuzzed under
// the same ones. The defaults allow seconds of density simulation in a
// release build, tens of seconds under the sanitizers
// (regressions/frontend/density_branches.qasm).
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_TESTS_FUZZLIMITS_H
#define REVBOUND_TESTS_FUZZLIMITS_H

#include "revbound/qasm/Frontend.h"
#include "revbound/semantics/Engines.h"

#include <cstdint>

namespace revbound::fuzz {

/// Front-end limits with room for `MaxWires` qubits and as many bits.
inline qasm::FrontendOptions smallFrontendOptions(uint32_t MaxWires,
                                                  uint64_t MaxOps) {
  qasm::FrontendOptions Front;
  Front.Limits.MaxQubits = MaxWires;
  Front.Limits.MaxClbits = MaxWires;
  Front.Limits.MaxOps = MaxOps;
  Front.Limits.MaxNesting = 64;
  return Front;
}

inline semantics::EngineOptions
smallEngineOptions(semantics::EngineChoice Choice = semantics::EngineChoice::Auto) {
  semantics::EngineOptions Opts;
  Opts.Choice = Choice;
  Opts.MaxDensityQubits = 6;
  Opts.MaxAutoDensityWork = uint64_t(1) << 24;
  Opts.MaxDensityWork = uint64_t(1) << 26;
  Opts.MaxAutoClassicalOps = 20'000;
  Opts.MaxBddNodes = uint64_t(1) << 14;
  Opts.MaxExpandedOps = 100'000;
  Opts.MaxMatrixQubits = 6;
  Opts.Samples = 64;
  Opts.MaxJointWires = 8;
  return Opts;
}

} // namespace revbound::fuzz

#endif
