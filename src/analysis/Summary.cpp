//===- Summary.cpp - Memoised per-definition summaries -------------------===//
//
// A body is summarised by running it on symbolic inputs: every local wire
// carries, per depth metric, a vector of longest-path delays from each input
// wire (max-plus algebra, NoPath as minus infinity).
//
//===----------------------------------------------------------------------===//
#include "revbound/analysis/Summary.h"
#include "revbound/support/Checked.h"
#include "revbound/support/Diagnostics.h"

#include "llvm/ADT/DenseMap.h"
#include "llvm/ADT/StringSwitch.h"

#include <algorithm>
#include <cmath>
#include <cstring>
#include <fmt/format.h>
#include <numbers>

namespace revbound::analysis {

static bool isQuarterTurn(double Angle) {
  // remainder(x, 2 pi) is x itself for |x| <= pi, the usual case.
  double A = std::fabs(Angle);
  double R = A <= std::numbers::pi ? A
                                   : std::remainder(Angle, 2 * std::numbers::pi);
  return std::fabs(std::fabs(R) - std::numbers::pi / 4) < 1e-9;
}

bool isTByAngle(bool ThreeAngles, llvm::ArrayRef<double> P) {
  if (!ThreeAngles)
    return isQuarterTurn(P[0]);
  // U(0, phi, lambda) = Rz(phi + lambda) up to global phase.
  return std::fabs(std::remainder(P[0], 2 * std::numbers::pi)) < 1e-9 &&
         isQuarterTurn(P[1] + P[2]);
}

bool isTLeaf(const ir::GateDef &G, llvm::ArrayRef<double> P) {
  if (G.numQubits() != 1)
    return false;
  bool Library = G.Origin == ir::GateOrigin::StandardLibrary;
  if (Library && (G.Name == "t" || G.Name == "tdg"))
    return true;
  bool Builtin = G.Origin == ir::GateOrigin::Builtin;
  if (Library && (G.Name == "rz" || G.Name == "u1" || G.Name == "p") &&
      P.size() == 1)
    return isTByAngle(false, P);
  if ((Builtin || (Library && (G.Name == "u3" || G.Name == "u"))) &&
      P.size() == 3)
    return isTByAngle(true, P);
  return false;
}

static bool isAngleGate(const ir::GateDef &G) {
  return G.Origin == ir::GateOrigin::Builtin ||
         (G.Origin == ir::GateOrigin::StandardLibrary &&
          llvm::StringSwitch<bool>(G.Name)
              .Cases("rz", "u1", "p", "u3", "u", true)
              .Default(false));
}

SummaryCache::SummaryCache(const ir::Circuit &Circ, const LeafPolicy &P)
    : C(Circ), Policy(P), LeafFlags(Circ.Gates.size()),
      ParamSensitive(Circ.Gates.size(), -1), ById(Circ.Gates.size()),
      Primitive(Circ.Gates.size()) {
  TKinds.resize(Circ.Gates.size(), TKind::Never);
  Unitaries = std::make_unique<ir::UnitaryCache>(Circ, 1);
  for (size_t I = 0; I < Circ.Gates.size(); ++I) {
    const ir::GateDef &G = Circ.Gates[I];
    LeafFlags[I] = Policy.isLeaf(G);
    if (!LeafFlags[I] || G.numQubits() != 1)
      continue;
    if (isAngleGate(G) && angleRuleHolds(ir::GateId(I)))
      TKinds[I] = G.numParams() == 3 ? TKind::ByThreeAngles : TKind::ByAngle;
    else if (G.numParams() > 0)
      TKinds[I] = TKind::ByUnitary;
    else
      TKinds[I] = unitaryIsT(ir::GateId(I), {}) ? TKind::Always : TKind::Never;
  }
}

/// The angle rule goes by name; a --stdlib library may define `rz` as
/// something else. Check the rule against the gate's unitary at angles
/// where it says T and where it says not T.
bool SummaryCache::angleRuleHolds(ir::GateId G) {
  const ir::GateDef &D = C.gate(G);
  const double Q = std::numbers::pi / 4;
  std::vector<std::vector<double>> Samples;
  if (D.numParams() == 1)
    Samples = {{Q}, {-Q}, {Q / 2}, {2 * Q}};
  else if (D.numParams() == 3)
    Samples = {{0, Q, 0}, {0, 0, -Q}, {0, Q / 2, 0}, {0.3, Q, 0}};
  else
    return false;
  for (const std::vector<double> &P : Samples)
    if (isTLeaf(D, P) != unitaryIsT(G, P))
      return false;
  return true;
}

bool SummaryCache::unitaryIsT(ir::GateId G, llvm::ArrayRef<double> Params) {
  const ir::Matrix *U = Unitaries->get(G, Params);
  if (!U)
    return false; // opaque: nothing is known
  static const ir::Matrix T = [] {
    ir::Matrix M = ir::Matrix::Identity(2, 2);
    M(1, 1) = std::polar(1.0, std::numbers::pi / 4);
    return M;
  }();
  return ir::equalUpToPhase(*U, T) || ir::equalUpToPhase(*U, T.adjoint());
}

SummaryCache::~SummaryCache() = default;

bool SummaryCache::dependsOnParams(ir::GateId G) {
  if (ParamSensitive[G] >= 0)
    return ParamSensitive[G];
  const ir::GateDef &D = C.gate(G);
  bool Sensitive = false;
  if (D.numParams() > 0 && D.hasBody()) {
    for (const ir::BodyOp &B : D.Body) {
      if (B.IsBarrier)
        continue;
      bool Constant = std::all_of(B.Params.begin(), B.Params.end(),
                                  [](const ir::ParamExpr &E) { return E.isConstant(); });
      if (Constant)
        continue;
      bool LeafDepends = TKinds[B.Callee] == TKind::ByAngle ||
                         TKinds[B.Callee] == TKind::ByUnitary;
      if (LeafFlags[B.Callee] ? LeafDepends : dependsOnParams(B.Callee)) {
        Sensitive = true;
        break;
      }
    }
  }
  ParamSensitive[G] = Sensitive;
  return Sensitive;
}

llvm::Expected<const GateSummary *>
SummaryCache::get(ir::GateId G, llvm::ArrayRef<double> Params, llvm::SMLoc Loc) {
  if (!dependsOnParams(G)) {
    if (!ById[G]) {
      llvm::Expected<std::unique_ptr<GateSummary>> S = compute(G, Params, Loc);
      if (!S)
        return S.takeError();
      ById[G] = std::move(*S);
    }
    return ById[G].get();
  }
  std::string Key = ir::callKey(G, Params);
  auto It = ByParams.find(Key);
  if (It != ByParams.end())
    return It->second.get();
  // Bound the memory of files that call one gate with millions of distinct
  // angles; only safe at the outermost call, where no summary is in use.
  if (Depth == 0 && (ByParams.size() > 65536 ||
                     MatrixEntries > MaxMatrixEntries / 2)) {
    for (const auto &[Key, S] : ByParams) {
      uint64_t K = S->Depth[0].size();
      MatrixEntries -= uint64_t(NumDepthMetrics + 2) * K * K;
    }
    ByParams.clear();
  }
  llvm::Expected<std::unique_ptr<GateSummary>> S = compute(G, Params, Loc);
  if (!S)
    return S.takeError();
  auto &Slot = ByParams[Key];
  Slot = std::move(*S);
  return Slot.get();
}

static llvm::Error overflowAt(llvm::SMLoc Loc, const ir::GateDef &G) {
  return errorAt(Loc, fmt::format("the expansion of gate '{}' passes 2^64-1 "
                                  "operations or layers; revbound counts "
                                  "exactly in 64 bits and will not wrap",
                                  G.Name));
}

llvm::Expected<std::unique_ptr<GateSummary>>
SummaryCache::compute(ir::GateId G, llvm::ArrayRef<double> Params,
                      llvm::SMLoc Loc) {
  const ir::GateDef &Def = C.gate(G);
  unsigned K = Def.numQubits();
  MatrixEntries += uint64_t(NumDepthMetrics + 2) * K * K;
  if (MatrixEntries > MaxMatrixEntries)
    return errorAt(Loc, fmt::format("summarising gate '{}' would take more than "
                                    "{} MiB of delay matrices; the file's gates "
                                    "are too many or too wide",
                                    Def.Name, MaxMatrixEntries * 8 >> 20));
  auto Out = std::make_unique<GateSummary>();
  ++Depth;
  struct Leave {
    unsigned &D;
    ~Leave() { --D; }
  } L{Depth};

  BodyState<uint64_t> State[NumDepthMetrics] = {
      BodyState<uint64_t>(K, /*TrackUses=*/true),
      BodyState<uint64_t>(K, false), BodyState<uint64_t>(K, false)};
  llvm::DenseMap<ir::GateId, uint64_t> Counts;
  llvm::SmallVector<double, 4> CalleeParams;

  for (const ir::BodyOp &B : Def.Body) {
    llvm::ArrayRef<uint32_t> A = B.Qubits;
    if (B.IsBarrier) {
      for (auto &S : State)
        S.barrier(A);
      continue;
    }
    CalleeParams.clear();
    for (const ir::ParamExpr &E : B.Params) {
      CalleeParams.push_back(E.evaluate(Params));
      if (!std::isfinite(CalleeParams.back()))
        return errorAt(Loc, fmt::format("a parameter of '{}' inside gate '{}' "
                                        "evaluates to a non-finite value",
                                        C.gate(B.Callee).Name, Def.Name));
    }

    if (LeafFlags[B.Callee]) {
      bool IsT = isT(B.Callee, CalleeParams);
      bool Multi = A.size() >= 2;
      bool Ok = addChecked(Counts[B.Callee], 1) && addChecked(Out->Gates, 1) &&
                addChecked(Out->MultiQubit, Multi) &&
                addChecked(Out->TCount, IsT) &&
                State[unsigned(DepthMetric::All)].leaf(A, 1) &&
                State[unsigned(DepthMetric::TwoQubit)].leaf(A, Multi) &&
                State[unsigned(DepthMetric::T)].leaf(A, IsT);
      if (!Ok)
        return overflowAt(Loc, Def);
      continue;
    }

    llvm::Expected<const GateSummary *> SubOrErr =
        get(B.Callee, CalleeParams, Loc);
    if (!SubOrErr)
      return SubOrErr.takeError();
    const GateSummary &Sub = **SubOrErr;
    bool Ok = addChecked(Out->Gates, Sub.Gates) &&
              addChecked(Out->MultiQubit, Sub.MultiQubit) &&
              addChecked(Out->TCount, Sub.TCount);
    for (const auto &[Leaf, N] : Sub.LeafCounts)
      Ok = Ok && addChecked(Counts[Leaf], N);
    Ok = Ok &&
         State[unsigned(DepthMetric::All)].call(
             A, Sub.Depth[unsigned(DepthMetric::All)], &Sub.FirstUse,
             &Sub.LastUse) &&
         State[unsigned(DepthMetric::TwoQubit)].call(
             A, Sub.Depth[unsigned(DepthMetric::TwoQubit)]) &&
         State[unsigned(DepthMetric::T)].call(A, Sub.Depth[unsigned(DepthMetric::T)]);
    if (!Ok)
      return overflowAt(Loc, Def);
  }

  for (unsigned M = 0; M < NumDepthMetrics; ++M)
    Out->Depth[M] = State[M].delays();
  Out->FirstUse = State[unsigned(DepthMetric::All)].firstUses();
  Out->LastUse = State[unsigned(DepthMetric::All)].lastUses();
  for (const auto &[Leaf, N] : Counts)
    Out->LeafCounts.push_back({Leaf, N});
  llvm::sort(Out->LeafCounts);
  return std::move(Out);
}

llvm::Expected<PrimitiveCounts> SummaryCache::primitive(ir::GateId G,
                                                        llvm::SMLoc Loc) {
  if (Primitive[G])
    return *Primitive[G];
  const ir::GateDef &Def = C.gate(G);
  PrimitiveCounts P;
  if (G == ir::Circuit::UGate)
    P.U = 1;
  else if (G == ir::Circuit::CXGate)
    P.CX = 1;
  else if (Def.Origin == ir::GateOrigin::Opaque)
    P.Opaque = 1;
  else
    for (const ir::BodyOp &B : Def.Body) {
      if (B.IsBarrier)
        continue;
      llvm::Expected<PrimitiveCounts> Sub = primitive(B.Callee, Loc);
      if (!Sub)
        return Sub.takeError();
      if (!addChecked(P.U, Sub->U) || !addChecked(P.CX, Sub->CX) ||
          !addChecked(P.Opaque, Sub->Opaque))
        return overflowAt(Loc, Def);
    }
  Primitive[G] = std::make_unique<PrimitiveCounts>(P);
  return P;
}

} // namespace revbound::analysis
