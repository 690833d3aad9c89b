//===- bench_analysis.cpp - Census, schedule, summaries and analyzeCircuit -===//
//
// Analyses run on circuits elaborated once (BenchSupport.h); every iteration
// starts from a fresh SummaryCache, as one `revbound report` run does.
//
//===----------------------------------------------------------------------===//
#include "BenchSupport.h"

#include "revbound/analysis/Census.h"
#include "revbound/analysis/LeafDag.h"
#include "revbound/analysis/Schedule.h"
#include "revbound/qasm/Frontend.h"
#include "revbound/report/Report.h"
#include "revbound/report/Writers.h"

#include <benchmark/benchmark.h>

#include <cmath>

namespace revbound::perf {
namespace {

/// The cached circuit, or nullptr after marking the benchmark failed.
const ir::Circuit *circuitOr(benchmark::State &State, const Elaborated &E) {
  if (!E.Circuit) {
    State.SkipWithError(E.Error.c_str());
    return nullptr;
  }
  return &*E.Circuit;
}

void setOps(benchmark::State &State, uint64_t Ops) {
  State.SetItemsProcessed(int64_t(State.iterations()) * int64_t(Ops));
}

// Counts by name, leaves, primitives and T-count over the flat file.
void BM_Census(benchmark::State &State) {
  const ir::Circuit *C = circuitOr(State, flatCircuit(uint64_t(State.range(0))));
  if (!C)
    return;
  analysis::LeafPolicy Policy;
  for (auto _ : State) {
    analysis::SummaryCache Cache(*C, Policy);
    llvm::Expected<analysis::Census> R = analysis::takeCensus(*C, Cache);
    if (!R) {
      llvm::consumeError(R.takeError());
      State.SkipWithError("census failed");
      return;
    }
    benchmark::DoNotOptimize(R->Gates);
  }
  setOps(State, C->Ops.size());
}
BENCHMARK(BM_Census)->Arg(100'000)->Arg(1'000'000)->Unit(benchmark::kMillisecond);

// The streaming ASAP schedule (three depths, volume, critical path).
void BM_Schedule(benchmark::State &State) {
  const ir::Circuit *C = circuitOr(State, flatCircuit(uint64_t(State.range(0))));
  if (!C)
    return;
  analysis::LeafPolicy Policy;
  for (auto _ : State) {
    analysis::SummaryCache Cache(*C, Policy);
    llvm::Expected<analysis::Schedule> S = analysis::scheduleCircuit(*C, Cache);
    if (!S) {
      llvm::consumeError(S.takeError());
      State.SkipWithError("schedule failed");
      return;
    }
    benchmark::DoNotOptimize(S->Depth[0]);
  }
  setOps(State, C->Ops.size());
}
BENCHMARK(BM_Schedule)->Arg(100'000)->Arg(1'000'000)->Unit(benchmark::kMillisecond);

// Census then schedule, as analyzeCircuit runs them (one shared cache).
void BM_CensusSchedule(benchmark::State &State) {
  const ir::Circuit *C = circuitOr(State, flatCircuit(uint64_t(State.range(0))));
  if (!C)
    return;
  analysis::LeafPolicy Policy;
  for (auto _ : State) {
    analysis::SummaryCache Cache(*C, Policy);
    llvm::Expected<analysis::Census> R = analysis::takeCensus(*C, Cache);
    llvm::Expected<analysis::Schedule> S = analysis::scheduleCircuit(*C, Cache);
    if (!R || !S) {
      if (!R)
        llvm::consumeError(R.takeError());
      if (!S)
        llvm::consumeError(S.takeError());
      State.SkipWithError("census or schedule failed");
      return;
    }
    benchmark::DoNotOptimize(S->Depth[0]);
  }
  setOps(State, C->Ops.size());
}
BENCHMARK(BM_CensusSchedule)->Arg(100'000)->Arg(1'000'000)->Unit(benchmark::kMillisecond);

// The leaf graph for the exact critical path, at the default 200,000-node
// limit: 100k ops fit, 1M ops expand 200,000 nodes and then give up.
void BM_LeafDag(benchmark::State &State) {
  const ir::Circuit *C = circuitOr(State, flatCircuit(uint64_t(State.range(0))));
  if (!C)
    return;
  analysis::LeafPolicy Policy;
  bool Built = false;
  for (auto _ : State) {
    analysis::SummaryCache Cache(*C, Policy);
    auto Dag = analysis::LeafDag::build(*C, Cache, 200'000);
    if (!Dag) {
      llvm::consumeError(Dag.takeError());
      State.SkipWithError("leaf graph failed");
      return;
    }
    Built = Dag->has_value();
    if (Built) {
      std::vector<uint32_t> Path;
      benchmark::DoNotOptimize((*Dag)->longestPath(Path));
    }
  }
  State.counters["built"] = Built ? 1 : 0;
  setOps(State, C->Ops.size());
}
BENCHMARK(BM_LeafDag)->Arg(100'000)->Arg(1'000'000)->Unit(benchmark::kMillisecond);

// The memoised summary of the nested file's top gate: 2^K leaves from K
// definitions. Items are definitions summarised.
void BM_NestedSummary(benchmark::State &State) {
  unsigned K = unsigned(State.range(0));
  const ir::Circuit *C = circuitOr(State, nestedCircuit(K));
  if (!C)
    return;
  std::string TopName = "n";
  TopName += std::to_string(K - 1);
  ir::GateId Top = C->GateByName.lookup(TopName);
  analysis::LeafPolicy Policy;
  for (auto _ : State) {
    analysis::SummaryCache Cache(*C, Policy);
    llvm::Expected<const analysis::GateSummary *> S =
        Cache.get(Top, {}, llvm::SMLoc());
    if (!S) {
      llvm::consumeError(S.takeError());
      State.SkipWithError("summary failed");
      return;
    }
    benchmark::DoNotOptimize((*S)->Gates);
  }
  State.SetItemsProcessed(int64_t(State.iterations()) * K);
  State.counters["leaves"] = std::ldexp(1.0, int(K));
}
BENCHMARK(BM_NestedSummary)->Arg(20)->Arg(61)->Unit(benchmark::kMicrosecond);

// analyzeCircuit on the nested file: census, schedule and the leaf-graph
// attempt that stops at its node limit.
void BM_AnalyzeNested(benchmark::State &State) {
  unsigned K = unsigned(State.range(0));
  const Elaborated &E = nestedCircuit(K);
  const ir::Circuit *C = circuitOr(State, E);
  if (!C)
    return;
  report::AnalysisOptions Opts;
  for (auto _ : State) {
    auto R = report::analyzeCircuit(*C, *E.Files, "nested.qasm", Opts);
    if (!R) {
      llvm::consumeError(R.takeError());
      State.SkipWithError("analysis failed");
      return;
    }
    benchmark::DoNotOptimize(R->DepthAll);
  }
  State.counters["leaves"] = std::ldexp(1.0, int(K));
}
BENCHMARK(BM_AnalyzeNested)->Arg(61)->Unit(benchmark::kMillisecond);

// analyzeCircuit on the flat file (everything after elaboration but JSON).
void BM_AnalyzeFlat(benchmark::State &State) {
  const Elaborated &E = flatCircuit(uint64_t(State.range(0)));
  const ir::Circuit *C = circuitOr(State, E);
  if (!C)
    return;
  report::AnalysisOptions Opts;
  for (auto _ : State) {
    auto R = report::analyzeCircuit(*C, *E.Files, "flat.qasm", Opts);
    if (!R) {
      llvm::consumeError(R.takeError());
      State.SkipWithError("analysis failed");
      return;
    }
    benchmark::DoNotOptimize(R->DepthAll);
  }
  setOps(State, C->Ops.size());
}
BENCHMARK(BM_AnalyzeFlat)->Arg(100'000)->Arg(1'000'000)->Unit(benchmark::kMillisecond);

/// Elaborates `Text`, analyses it and writes the JSON report; false on any
/// error. What `revbound report --format json` does, minus file reading.
bool reportFromMemory(const std::string &Text, const char *Name, size_t &JsonBytes) {
  SourceFiles Files;
  unsigned Id = Files.addBuffer(Name, Text);
  DiagnosticSink Warnings;
  llvm::Expected<ir::Circuit> C =
      qasm::buildCircuit(Files, Id, qasm::FrontendOptions(), Warnings);
  if (!C) {
    llvm::consumeError(C.takeError());
    return false;
  }
  auto R = report::analyzeCircuit(*C, Files, Name, report::AnalysisOptions());
  if (!R) {
    llvm::consumeError(R.takeError());
    return false;
  }
  report::Report Rep;
  Rep.Circuits.push_back(std::move(*R));
  JsonBytes = report::writeJson(Rep).size();
  return true;
}

// Text in memory to JSON text: the library's whole pipeline.
void BM_EndToEnd(benchmark::State &State) {
  uint64_t Ops = uint64_t(State.range(0));
  const std::string &Text = flatText(Ops);
  for (auto _ : State) {
    size_t JsonBytes = 0;
    if (!reportFromMemory(Text, "flat.qasm", JsonBytes)) {
      State.SkipWithError("report failed");
      return;
    }
    benchmark::DoNotOptimize(JsonBytes);
  }
  State.SetBytesProcessed(int64_t(State.iterations()) * int64_t(Text.size()));
  setOps(State, Ops);
}
BENCHMARK(BM_EndToEnd)->Arg(100'000)->Arg(1'000'000)->Unit(benchmark::kMillisecond);

// Many calls of small parameterised user gates with fresh angles: one
// summary per call (the by-parameter cache of SummaryCache).
void BM_ParamGates(benchmark::State &State) {
  uint64_t Calls = uint64_t(State.range(0));
  const std::string &Text = paramsText(Calls);
  for (auto _ : State) {
    size_t JsonBytes = 0;
    if (!reportFromMemory(Text, "params.qasm", JsonBytes)) {
      State.SkipWithError("report failed");
      return;
    }
    benchmark::DoNotOptimize(JsonBytes);
  }
  State.SetBytesProcessed(int64_t(State.iterations()) * int64_t(Text.size()));
  setOps(State, Calls);
}
BENCHMARK(BM_ParamGates)->Arg(100'000)->Unit(benchmark::kMillisecond);

} // namespace
} // namespace revbound::perf
