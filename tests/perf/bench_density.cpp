//===- bench_density.cpp - The density engine on random circuits ---------===//
//
// Random circuits of 1,000 gates (h, t, cx, ccx, rz, ry) and a few resets
// on 8, 10 and 12 qubits, elaborated once; each iteration is one whole
// runDensity. Items are gate applications, so items/s is the engine's gate
// rate at that width (each application touches up to all 4^n entries).
//
//===----------------------------------------------------------------------===//
#include "BenchSupport.h"

#include "revbound/semantics/Engines.h"

#include <benchmark/benchmark.h>
#include <fmt/format.h>

#include <algorithm>
#include <map>
#include <numbers>
#include <random>

namespace revbound::perf {
namespace {

constexpr unsigned DensityGates = 1000;

/// The text of the random circuit on `Qubits` qubits (fixed seed): gates
/// h, t, cx, ccx, rz, ry, and a reset about every hundredth operation.
std::string randomDensityText(unsigned Qubits) {
  std::mt19937_64 Rng(0xd3175 + Qubits);
  auto Pick = [&](unsigned N) { return unsigned(Rng() % N); };
  auto Distinct = [&](unsigned Count) {
    std::vector<unsigned> On;
    while (On.size() < Count) {
      unsigned Q = Pick(Qubits);
      if (std::find(On.begin(), On.end(), Q) == On.end())
        On.push_back(Q);
    }
    return On;
  };
  std::string Text = fmt::format(
      "OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[{}];\n", Qubits);
  for (unsigned Gates = 0; Gates < DensityGates;) {
    unsigned Kind = Pick(100);
    double Angle =
        (Pick(1 << 20) / double(1 << 20) - 0.5) * 4 * std::numbers::pi;
    if (Kind < 1) {
      Text += fmt::format("reset q[{}];\n", Pick(Qubits));
      continue;
    }
    ++Gates;
    if (Kind < 22) {
      Text += fmt::format("h q[{}];\n", Pick(Qubits));
    } else if (Kind < 42) {
      Text += fmt::format("t q[{}];\n", Pick(Qubits));
    } else if (Kind < 52) {
      Text += fmt::format("rz({:.17g}) q[{}];\n", Angle, Pick(Qubits));
    } else if (Kind < 62) {
      Text += fmt::format("ry({:.17g}) q[{}];\n", Angle, Pick(Qubits));
    } else if (Kind < 88) {
      std::vector<unsigned> On = Distinct(2);
      Text += fmt::format("cx q[{}],q[{}];\n", On[0], On[1]);
    } else {
      std::vector<unsigned> On = Distinct(3);
      Text += fmt::format("ccx q[{}],q[{}],q[{}];\n", On[0], On[1], On[2]);
    }
  }
  return Text;
}

/// The elaborated circuit, cached by width, with q[0] an input and the last
/// qubit an ancilla so that the end of the run has something to discard.
const Elaborated &randomDensityCircuit(unsigned Qubits) {
  static std::map<unsigned, Elaborated> Cache;
  auto It = Cache.find(Qubits);
  if (It != Cache.end())
    return It->second;
  Elaborated E = elaborate(randomDensityText(Qubits), "density.qasm");
  if (E.Circuit) {
    ir::Circuit &C = *E.Circuit;
    C.QubitRoles.assign(C.NumQubits, ir::WireRole::Output);
    C.QubitRoleLocs.assign(C.NumQubits, llvm::SMLoc());
    C.QubitRoles.front() = ir::WireRole::Input;
    C.QubitRoles.back() = ir::WireRole::Ancilla;
  }
  return Cache.emplace(Qubits, std::move(E)).first->second;
}

// One whole density run: the gates, the resets' entropies, the ancilla's
// verdict and the joint discard.
void BM_DensityRandom(benchmark::State &State) {
  const Elaborated &E = randomDensityCircuit(unsigned(State.range(0)));
  if (!E.Circuit) {
    State.SkipWithError(E.Error.c_str());
    return;
  }
  semantics::EngineOptions Opts;
  for (auto _ : State) {
    llvm::Expected<semantics::Ledger> L =
        semantics::runDensity(*E.Circuit, Opts);
    if (!L) {
      State.SkipWithError(llvm::toString(L.takeError()).c_str());
      return;
    }
    benchmark::DoNotOptimize(L->Events.size());
  }
  State.SetItemsProcessed(int64_t(State.iterations()) * DensityGates);
}
BENCHMARK(BM_DensityRandom)
    ->Arg(8)
    ->Arg(10)
    ->Arg(12)
    ->Unit(benchmark::kMillisecond);

} // namespace
} // namespace revbound::perf
