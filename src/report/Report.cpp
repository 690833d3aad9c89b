//===- Report.cpp - Running the analyses into a Report --------------------===//
#include "revbound/report/Report.h"
#include "revbound/analysis/LeafDag.h"
#include "revbound/analysis/OpLayers.h"
#include "revbound/analysis/Schedule.h"
#include "revbound/physics/Landauer.h"

#include <algorithm>
#include <fmt/format.h>
#include <future>
#include <optional>
#include <map>
#include <tuple>

namespace revbound::report {

static SourcePoint pointOf(const SourceFiles &Files, llvm::SMLoc Loc) {
  SourceFiles::Point L = Files.locate(Loc);
  SourcePoint P;
  P.File = L.File.str();
  P.Line = L.Line;
  P.Column = L.Column;
  return P;
}

static std::vector<std::string> wireNames(const ir::Circuit &C,
                                          llvm::ArrayRef<uint32_t> Wires) {
  std::vector<std::string> Out;
  for (uint32_t W : Wires)
    Out.push_back(W < C.NumQubits ? C.qubitName(W)
                                  : C.clbitName(W - C.NumQubits));
  return Out;
}

static std::string opName(const ir::Circuit &C, ir::OpKind K, ir::GateId G) {
  switch (K) {
  case ir::OpKind::Gate:
    return C.gate(G).Name;
  case ir::OpKind::Measure:
    return "measure";
  case ir::OpKind::Reset:
    return "reset";
  case ir::OpKind::Barrier:
    return "barrier";
  }
  return "?";
}

static llvm::Error fillPath(const ir::Circuit &C, const SourceFiles &Files,
                            analysis::SummaryCache &Cache,
                            const analysis::Census &Ops,
                            const analysis::Schedule &S,
                            const AnalysisOptions &Opts, CriticalPath &Out) {
  Out.Length = S.Depth[unsigned(analysis::DepthMetric::All)];
  // The census is a lower bound on the leaf graph's size: skip building a
  // graph that is certain to pass the limit.
  uint64_t AtLeast = Ops.Gates + Ops.Measure + Ops.Reset + Ops.Barrier;
  std::optional<analysis::LeafDag> Graph;
  if (AtLeast <= Opts.MaxDagNodes) {
    llvm::Expected<std::optional<analysis::LeafDag>> Dag =
        analysis::LeafDag::build(C, Cache, Opts.MaxDagNodes);
    if (!Dag)
      return Dag.takeError();
    Graph = std::move(*Dag);
  }
  if (Graph) {
    Out.Method = "dag";
    std::vector<uint32_t> Nodes;
    Graph->longestPath(Nodes);
    Out.Steps = Nodes.size();
    for (uint32_t N : Nodes) {
      if (Out.Listed.size() >= Opts.MaxPathSteps)
        break;
      const analysis::LeafNode &L = Graph->node(N);
      PathStep P;
      P.Gate = opName(C, L.Kind, L.Gate);
      P.Wires = wireNames(C, L.Wires);
      P.At = pointOf(Files, C.Ops[L.TopOp].Loc);
      P.Inside = pointOf(Files, L.BodyLoc);
      Out.Listed.push_back(std::move(P));
    }
    return llvm::Error::success();
  }
  Out.Method = "summary";
  Out.Steps = S.CriticalOps.size();
  for (uint32_t Index : S.CriticalOps) {
    if (Out.Listed.size() >= Opts.MaxPathSteps)
      break;
    const ir::Op &O = C.Ops[Index];
    PathStep P;
    P.Gate = opName(C, O.Kind, O.Gate);
    llvm::SmallVector<uint32_t, 4> Wires(C.wires(O).begin(), C.wires(O).end());
    if (O.Kind == ir::OpKind::Measure)
      Wires[1] += C.NumQubits;
    P.Wires = wireNames(C, Wires);
    P.At = pointOf(Files, O.Loc);
    Out.Listed.push_back(std::move(P));
  }
  return llvm::Error::success();
}

/// True when top-level op `O` is the one erasure event `E` (a reset or an
/// overwrite) comes from: the engines record the op's location and wire.
static bool isEventOp(const ir::Circuit &C, const ir::Op &O,
                      const semantics::ErasureEvent &E) {
  if (O.Loc != E.Loc)
    return false;
  if (E.Kind == semantics::ErasureKind::Reset)
    return O.Kind == ir::OpKind::Reset && C.wires(O)[0] == E.Wire;
  return O.Kind == ir::OpKind::Measure && C.wires(O)[1] == E.Wire;
}

/// Sets each event's Layer: resets and overwrites the start layer of their
/// op in the depth.all schedule, discards `DepthAll`.
static llvm::Error fillLayers(const ir::Circuit &C,
                              analysis::SummaryCache &Cache,
                              const semantics::Ledger &L, uint64_t DepthAll,
                              std::vector<ErasureEntry> &List) {
  constexpr uint32_t None = UINT32_MAX;
  std::vector<uint32_t> OpOf(L.Events.size(), None);
  std::vector<uint32_t> Wanted;
  uint32_t Cursor = 0; // events come in program order, one per op at most
  for (size_t I = 0; I < L.Events.size(); ++I) {
    const semantics::ErasureEvent &E = L.Events[I];
    if (E.Kind == semantics::ErasureKind::Discard)
      continue;
    uint32_t N = uint32_t(C.Ops.size());
    for (uint32_t Step = 0; Step < N && OpOf[I] == None; ++Step) {
      uint32_t Index = (Cursor + Step) % N;
      if (isEventOp(C, C.Ops[Index], E))
        OpOf[I] = Index;
    }
    if (OpOf[I] == None)
      return llvm::createStringError(
          llvm::inconvertibleErrorCode(),
          "internal error: an erasure event matches no operation");
    Cursor = OpOf[I] + 1;
    Wanted.push_back(OpOf[I]);
  }
  for (size_t I = 0; I < List.size(); ++I)
    List[I].Layer = DepthAll;
  if (Wanted.empty())
    return llvm::Error::success();
  std::sort(Wanted.begin(), Wanted.end());
  Wanted.erase(std::unique(Wanted.begin(), Wanted.end()), Wanted.end());
  llvm::Expected<analysis::OpLayers> Layers =
      analysis::startLayers(C, Cache, Wanted);
  if (!Layers)
    return Layers.takeError();
  for (size_t I = 0; I < List.size(); ++I) {
    if (OpOf[I] == None)
      continue;
    auto At = std::lower_bound(Wanted.begin(), Wanted.end(), OpOf[I]);
    List[I].Layer = Layers->Start[size_t(At - Wanted.begin())];
  }
  return llvm::Error::success();
}

/// Groups the events by file and line, largest first.
static std::vector<ErasureHotspot>
hotspotsOf(const std::vector<ErasureEntry> &List) {
  std::map<std::pair<std::string, unsigned>, ErasureHotspot> ByLine;
  for (const ErasureEntry &X : List) {
    ErasureHotspot &H = ByLine[{X.At.File, X.At.Line}];
    H.File = X.At.File;
    H.Line = X.At.Line;
    ++H.Events;
    H.BitsLow += X.BitsLow;
    H.BitsHigh += X.BitsHigh;
  }
  std::vector<ErasureHotspot> Out;
  for (auto &[Key, H] : ByLine)
    Out.push_back(std::move(H));
  std::stable_sort(Out.begin(), Out.end(),
                   [](const ErasureHotspot &A, const ErasureHotspot &B) {
                     return std::tie(B.BitsHigh, B.BitsLow, B.Events) <
                            std::tie(A.BitsHigh, A.BitsLow, A.Events);
                   });
  return Out;
}

static llvm::Error fillErasures(const ir::Circuit &C, const SourceFiles &Files,
                                analysis::SummaryCache &Cache,
                                const semantics::Ledger &L, uint64_t DepthAll,
                                double TemperatureK, ErasureReport &Out) {
  Out.Engine = semantics::engineName(L.Engine);
  Out.Reason = L.Reason;
  Out.Notes = L.Notes;
  semantics::LedgerTotals T = semantics::totals(L);
  Out.Events = T.Events;
  Out.Entropy = T.Entropy;
  Out.DiscardJoint = L.DiscardJoint;
  for (const semantics::ErasureEvent &E : L.Events) {
    ErasureEntry X;
    X.Kind = semantics::erasureKindName(E.Kind);
    X.Wire = E.Kind == semantics::ErasureKind::Overwrite ? C.clbitName(E.Wire)
                                                         : C.qubitName(E.Wire);
    X.At = pointOf(Files, E.Loc);
    X.Status = semantics::erasureStatusName(E.Status);
    X.BitsLow = E.BitsLow;
    X.BitsHigh = E.BitsHigh;
    X.Samples = E.Samples;
    X.BitsEstimate = E.BitsEstimate;
    Out.List.push_back(std::move(X));
  }
  if (llvm::Error E = fillLayers(C, Cache, L, DepthAll, Out.List))
    return E;
  Out.Hotspots = hotspotsOf(Out.List);
  for (const semantics::AncillaVerdict &A : L.Ancillas) {
    AncillaEntry X;
    X.Wire = C.qubitName(A.Qubit);
    X.Clean = A.Clean;
    X.DirtyProbability = A.DirtyProbability;
    X.Samples = A.Samples;
    X.DirtySamples = A.DirtySamples;
    X.HasCounterexample = A.HasCounterexample;
    if (A.HasCounterexample) {
      std::vector<bool> Value(C.NumQubits, false);
      for (auto [Q, Bit] : A.Counterexample)
        Value[Q] = Bit;
      X.Counterexample = C.inputRegisterBits(Value);
    }
    Out.Ancillas.push_back(std::move(X));
  }
  Out.TemperatureK = TemperatureK;
  Out.HeatLowJ = physics::landauerHeat(Out.Entropy.Low, TemperatureK);
  Out.HeatHighJ = physics::landauerHeat(Out.Entropy.High, TemperatureK);
  return llvm::Error::success();
}

llvm::Expected<CircuitReport> analyzeCircuit(const ir::Circuit &C,
                                             const SourceFiles &Files,
                                             llvm::StringRef DisplayName,
                                             const AnalysisOptions &Opts) {
  CircuitReport R;
  R.File = DisplayName.str();
  R.Qubits = C.NumQubits;
  R.Clbits = C.NumClbits;
  R.Granularity = Opts.Policy.Custom
                      ? "custom"
                      : analysis::granularityName(Opts.Policy.Level);
  for (const auto &Name : Opts.Policy.NativeNames) {
    auto It = C.GateByName.find(Name.getKey());
    if (It == C.GateByName.end() || C.gate(It->second).Origin != ir::GateOrigin::User)
      R.Warnings.push_back({"warning", {R.File, 0, 0},
                            fmt::format("--native names '{}', which is not a "
                                        "gate the file defines",
                                        Name.getKey().str())});
  }
  std::sort(R.Warnings.begin(), R.Warnings.end(),
            [](const Finding &A, const Finding &B) { return A.Message < B.Message; });
  analysis::SummaryCache Cache(C, Opts.Policy);
  // The speed bounds read only the circuit and the cache's leaf flags, which
  // are fixed at construction, so on large circuits they run beside the
  // census and the schedule, on the second core a CI machine usually has.
  // Each part computes what it would alone: the report is the same either
  // way.
  auto SpeedPart = [&]() -> llvm::Error {
    physics::GateCostModel Costs(C, Opts.GivenAngles, Opts.MaxMatrixQubits);
    llvm::Expected<analysis::SpeedBounds> Speed =
        analysis::boundSpeed(C, Cache, Costs, Opts.Energy);
    if (!Speed)
      return Speed.takeError();
    R.Speed.Energy = Opts.Energy;
    R.Speed.Bounds = std::move(*Speed);
    R.Speed.Frontier = analysis::sampleFrontier(R.Speed.Bounds, Opts.Energy);
    if (Opts.Durations) {
      llvm::Expected<analysis::DeviceComparison> Device =
          analysis::compareWithDevice(C, Cache, Costs, *Opts.Durations,
                                      Opts.Energy, R.Speed.Bounds);
      if (!Device)
        return Device.takeError();
      R.Speed.Device = std::move(*Device);
    }
    return llvm::Error::success();
  };
  // The engine reads only the circuit, so it follows the speed part on the
  // second thread: of the two sides that one is the shorter on a flat file.
  // The speed part's error still comes first.
  std::optional<semantics::Ledger> Ledger;
  auto AsidePart = [&]() -> llvm::Error {
    if (llvm::Error E = SpeedPart())
      return E;
    llvm::Expected<semantics::Ledger> L = semantics::runEngine(C, Opts.Engine);
    if (!L)
      return L.takeError();
    Ledger = std::move(*L);
    return llvm::Error::success();
  };
  std::optional<std::future<llvm::Error>> Aside;
  if (C.Ops.size() >= Opts.MinOpsForSecondThread)
    Aside = std::async(std::launch::async, AsidePart);
  // Waits for the second thread however this function returns.
  auto JoinAside = [&]() -> llvm::Error {
    if (!Aside)
      return llvm::Error::success();
    llvm::Error E = Aside->get();
    Aside.reset();
    return E;
  };
  auto Fail = [&](llvm::Error E) -> llvm::Error {
    llvm::consumeError(JoinAside());
    return E;
  };
  // The census rides on the schedule's walk over the ops.
  analysis::CensusTally Tally(C);
  llvm::Expected<analysis::Schedule> S =
      analysis::scheduleCircuit(C, Cache, &Tally);
  if (!S) {
    // The census's own error comes first wherever it has one, as when it
    // ran alone before the schedule.
    llvm::Expected<analysis::Census> Alone = analysis::takeCensus(C, Cache);
    if (!Alone) {
      llvm::consumeError(S.takeError());
      return Fail(Alone.takeError());
    }
    return Fail(S.takeError());
  }
  llvm::Expected<analysis::Census> Ops = Tally.finish(Cache);
  if (!Ops)
    return Fail(Ops.takeError());
  R.Ops = std::move(*Ops);
  R.DepthAll = S->Depth[unsigned(analysis::DepthMetric::All)];
  R.DepthTwoQubit = S->Depth[unsigned(analysis::DepthMetric::TwoQubit)];
  R.DepthT = S->Depth[unsigned(analysis::DepthMetric::T)];
  R.Volume = S->Volume;
  if (llvm::Error E = fillPath(C, Files, Cache, R.Ops, *S, Opts, R.Path))
    return Fail(std::move(E));
  if (llvm::Error E = Aside ? JoinAside() : AsidePart())
    return E;
  if (llvm::Error E = fillErasures(C, Files, Cache, *Ledger, R.DepthAll,
                                   Opts.TemperatureK, R.Erasures))
    return E;
  if (!R.Speed.Bounds.UnknownGates.empty()) {
    std::string Names;
    for (const std::string &N : R.Speed.Bounds.UnknownGates)
      Names += (Names.empty() ? "" : ", ") + N;
    R.Warnings.push_back(
        {"warning", {R.File, 0, 0},
         fmt::format("no gate angle is known for {}; {} step{} as taking "
                     "no time (give one with --gate-angle NAME=RADIANS)",
                     Names, R.Speed.Bounds.UnknownSteps,
                     R.Speed.Bounds.UnknownSteps == 1 ? " counts" : "s count")});
  }
  if (R.Speed.Device && R.Speed.Device->Ratio && *R.Speed.Device->Ratio > 1) {
    R.Warnings.push_back(
        {"warning", {R.File, 0, 0},
         fmt::format("the durations give a schedule {:.3g} times shorter than "
                     "physics allows at the stated energy; check the durations "
                     "or the energy",
                     *R.Speed.Device->Ratio)});
  }
  return R;
}

llvm::Expected<CircuitReport> analyzeFile(SourceFiles &Files,
                                          llvm::StringRef Path,
                                          const qasm::FrontendOptions &Front,
                                          const AnalysisOptions &Opts,
                                          DiagnosticSink &Warnings) {
  llvm::Expected<unsigned> Buffer = Files.loadMain(Path);
  if (!Buffer)
    return Buffer.takeError();
  llvm::Expected<ir::Circuit> C =
      qasm::buildCircuit(Files, *Buffer, Front, Warnings);
  if (!C)
    return C.takeError();
  llvm::Expected<CircuitReport> R =
      analyzeCircuit(*C, Files, Path == "-" ? "<stdin>" : Path, Opts);
  if (!R)
    return R.takeError();
  for (const Diagnostic &D : Warnings.warnings())
    R->Warnings.push_back({"warning", pointOf(Files, D.Loc), D.Message});
  return R;
}

} // namespace revbound::report
