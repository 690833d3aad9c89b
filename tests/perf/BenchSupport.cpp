//===- BenchSupport.cpp - Inputs shared by the revbound benchmarks -------===//
#include "BenchSupport.h"
#include "CircuitGenerator.h"

#include "revbound/qasm/Frontend.h"
#include "revbound/support/Diagnostics.h"

#include <map>

namespace revbound::perf {

const std::string &flatText(uint64_t Ops) {
  static std::map<uint64_t, std::string> Cache;
  auto [It, New] = Cache.try_emplace(Ops);
  if (New) {
    FlatSpec S;
    S.Ops = Ops;
    It->second = generateFlat(S);
  }
  return It->second;
}

const std::string &nestedText(unsigned Levels) {
  static std::map<unsigned, std::string> Cache;
  auto [It, New] = Cache.try_emplace(Levels);
  if (New) {
    NestedSpec S;
    S.Levels = Levels;
    It->second = generateNested(S);
  }
  return It->second;
}

const std::string &paramsText(uint64_t Calls) {
  static std::map<uint64_t, std::string> Cache;
  auto [It, New] = Cache.try_emplace(Calls);
  if (New) {
    ParamSpec S;
    S.Calls = Calls;
    It->second = generateParams(S);
  }
  return It->second;
}

Elaborated elaborate(const std::string &Text, const std::string &Name) {
  Elaborated E;
  E.Files = std::make_unique<SourceFiles>();
  unsigned Id = E.Files->addBuffer(Name, Text);
  DiagnosticSink Warnings;
  llvm::Expected<ir::Circuit> C =
      qasm::buildCircuit(*E.Files, Id, qasm::FrontendOptions(), Warnings);
  if (!C) {
    llvm::handleAllErrors(C.takeError(), [&](const DiagnosticError &D) {
      E.Error = formatDiagnostic(E.Files->mgr(), D.diagnostic());
    });
    return E;
  }
  E.Circuit = std::move(*C);
  return E;
}

const Elaborated &flatCircuit(uint64_t Ops) {
  static std::map<uint64_t, Elaborated> Cache;
  auto It = Cache.find(Ops);
  if (It == Cache.end())
    It = Cache.emplace(Ops, elaborate(flatText(Ops), "flat.qasm")).first;
  return It->second;
}

const Elaborated &nestedCircuit(unsigned Levels) {
  static std::map<unsigned, Elaborated> Cache;
  auto It = Cache.find(Levels);
  if (It == Cache.end())
    It = Cache.emplace(Levels, elaborate(nestedText(Levels), "nested.qasm")).first;
  return It->second;
}

} // namespace revbound::perf
