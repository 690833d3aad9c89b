//===- bench_classical.cpp - The classical engine on ripple-carry adders --===//
//
// Proving the carry-in ancilla of an n-bit ripple-carry adder (Cuccaro,
// Draper, Kutin & Moulton, arXiv:quant-ph/0410184) clean, as one
// `revbound report --engine classical` run does: the counterexample search,
// then BuDDy from bdd_init to bdd_done. The target is the 64-bit adder in
// under 100 ms.
//
//===----------------------------------------------------------------------===//
#include "BenchSupport.h"

#include "revbound/semantics/Engines.h"

#include <benchmark/benchmark.h>

#include <fmt/format.h>

#include <map>

namespace revbound::perf {
namespace {

/// The adder with MAJ and UMA as gates, cin an ancilla, a and b inputs.
std::string cuccaroText(unsigned N) {
  std::string S = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                  "gate majority a,b,c { cx c,b; cx c,a; ccx a,b,c; }\n"
                  "gate unmaj a,b,c { ccx a,b,c; cx c,a; cx a,b; }\n";
  S += fmt::format("qreg cin[1];\nqreg a[{0}];\nqreg b[{0}];\nqreg cout[1];\n",
                   N);
  S += "majority cin[0],b[0],a[0];\n";
  for (unsigned I = 1; I < N; ++I)
    S += fmt::format("majority a[{}],b[{}],a[{}];\n", I - 1, I, I);
  S += fmt::format("cx a[{}],cout[0];\n", N - 1);
  for (unsigned I = N - 1; I >= 1; --I)
    S += fmt::format("unmaj a[{}],b[{}],a[{}];\n", I - 1, I, I);
  return S + "unmaj cin[0],b[0],a[0];\n";
}

/// The elaborated adder with its roles, cached by width.
const Elaborated &cuccaroCircuit(unsigned N) {
  static std::map<unsigned, Elaborated> Cache;
  auto It = Cache.find(N);
  if (It != Cache.end())
    return It->second;
  Elaborated E = elaborate(cuccaroText(N), "cuccaro.qasm");
  if (E.Circuit) {
    ir::Circuit &C = *E.Circuit;
    C.QubitRoles.assign(C.NumQubits, ir::WireRole::Input);
    C.QubitRoleLocs.assign(C.NumQubits, llvm::SMLoc());
    C.QubitRoles.front() = ir::WireRole::Ancilla; // cin
    C.QubitRoles.back() = ir::WireRole::Output;   // cout
  }
  return Cache.emplace(N, std::move(E)).first->second;
}

// The whole classical engine on the n-bit adder; items are gate calls.
void BM_ClassicalCuccaroCleanCarry(benchmark::State &State) {
  const Elaborated &E = cuccaroCircuit(unsigned(State.range(0)));
  if (!E.Circuit) {
    State.SkipWithError(E.Error.c_str());
    return;
  }
  semantics::EngineOptions Opts;
  Opts.Choice = semantics::EngineChoice::Classical;
  for (auto _ : State) {
    semantics::Ledger L = semantics::runClassical(*E.Circuit, Opts);
    if (L.Ancillas.size() != 1 || L.Ancillas[0].Clean != true) {
      State.SkipWithError("the carry-in was not proved clean");
      return;
    }
    benchmark::DoNotOptimize(L.Ancillas.data());
  }
  State.SetItemsProcessed(int64_t(State.iterations()) *
                          int64_t(E.Circuit->Ops.size()));
}
BENCHMARK(BM_ClassicalCuccaroCleanCarry)
    ->Arg(16)
    ->Arg(64)
    ->Arg(256)
    ->Unit(benchmark::kMillisecond);

// The classical engine on the generated flat circuit (h, cx, rz, t, x, ccx
// on 64 qubits): superpositions everywhere, so this times the fresh
// variables, the limits and the sampling fallback; items are operations.
void BM_ClassicalFlat(benchmark::State &State) {
  const Elaborated &E = flatCircuit(uint64_t(State.range(0)));
  if (!E.Circuit) {
    State.SkipWithError(E.Error.c_str());
    return;
  }
  semantics::EngineOptions Opts;
  Opts.Choice = semantics::EngineChoice::Classical;
  for (auto _ : State) {
    semantics::Ledger L = semantics::runClassical(*E.Circuit, Opts);
    benchmark::DoNotOptimize(L.Events.data());
  }
  State.SetItemsProcessed(int64_t(State.iterations()) *
                          int64_t(E.Circuit->Ops.size()));
}
BENCHMARK(BM_ClassicalFlat)->Arg(100'000)->Unit(benchmark::kMillisecond);

} // namespace
} // namespace revbound::perf
