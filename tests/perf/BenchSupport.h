//===- BenchSupport.h - Inputs shared by the revbound benchmarks ---------===//
//
// Each generated text and each elaborated circuit is built once per process
// and cached, so that a benchmark times only the stage it names.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_TESTS_PERF_BENCHSUPPORT_H
#define REVBOUND_TESTS_PERF_BENCHSUPPORT_H

#include "revbound/ir/Circuit.h"
#include "revbound/support/SourceFiles.h"

#include <cstdint>
#include <memory>
#include <optional>
#include <string>

namespace revbound::perf {

/// The generated flat, nested and parameterised-gate texts (CircuitGenerator.h
/// with default seeds), cached by size.
const std::string &flatText(uint64_t Ops);
const std::string &nestedText(unsigned Levels);
const std::string &paramsText(uint64_t Calls);

/// A circuit elaborated from memory with the sources its locations point
/// into; `Circuit` is empty and `Error` holds the printed diagnostic when
/// elaboration failed.
struct Elaborated {
  std::unique_ptr<SourceFiles> Files;
  std::optional<ir::Circuit> Circuit;
  std::string Error;
};

/// Elaborates `Text` (a buffer named `Name`) with the default options.
Elaborated elaborate(const std::string &Text, const std::string &Name);

/// Cached elaborations of flatText and nestedText.
const Elaborated &flatCircuit(uint64_t Ops);
const Elaborated &nestedCircuit(unsigned Levels);

} // namespace revbound::perf

#endif
