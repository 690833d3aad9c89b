//===- bench_main.cpp - Entry point of the revbound_bench program ---------===//
//
// Run e.g. `revbound_bench --benchmark_repetitions=5
// --benchmark_report_aggregates_only=true` and read the medians: the build
// machine is shared and noisy.
//
//===----------------------------------------------------------------------===//
#include <benchmark/benchmark.h>

BENCHMARK_MAIN();
