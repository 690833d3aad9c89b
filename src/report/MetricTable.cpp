//===- MetricTable.cpp - A report's figures as rows of one table ----------===//
#include "revbound/report/MetricTable.h"

#include <fmt/format.h>

#include <cmath>
#include <functional>

namespace revbound::report {
namespace {

std::optional<MetricValue> count(uint64_t N) {
  return MetricValue{true, N, 0};
}
std::optional<MetricValue> real(double X) { return MetricValue{false, 0, X}; }
std::optional<MetricValue> real(const std::optional<double> &X) {
  if (!X)
    return std::nullopt;
  return real(*X);
}

uint64_t dirtyAncillas(const CircuitReport &C) {
  uint64_t Dirty = 0;
  for (const AncillaEntry &A : C.Erasures.Ancillas)
    if (!(A.Clean && *A.Clean))
      ++Dirty;
  return Dirty;
}

struct MetricSpec {
  const char *Key, *Label, *Unit;
  std::function<std::optional<MetricValue>(const CircuitReport &)> Of;
};

/// The catalogue, in print order. Interval figures give their high end
/// (what the circuit may cost), as budgets do; the low end has its own row.
const std::vector<MetricSpec> &catalogue() {
  static const std::vector<MetricSpec> Specs = {
      {"qubits", "qubits", "", [](auto &C) { return count(C.Qubits); }},
      {"clbits", "classical bits", "", [](auto &C) { return count(C.Clbits); }},
      {"gates", "gates", "", [](auto &C) { return count(C.Ops.Gates); }},
      {"two_qubit_gates", "two-qubit gates", "",
       [](auto &C) { return count(C.Ops.TwoQubit); }},
      {"t_count", "T-count", "", [](auto &C) { return count(C.Ops.TCount); }},
      {"measure", "measurements", "",
       [](auto &C) { return count(C.Ops.Measure); }},
      {"reset", "resets", "", [](auto &C) { return count(C.Ops.Reset); }},
      {"depth", "depth", "layers", [](auto &C) { return count(C.DepthAll); }},
      {"two_qubit_depth", "two-qubit depth", "layers",
       [](auto &C) { return count(C.DepthTwoQubit); }},
      {"t_depth", "T-depth", "layers", [](auto &C) { return count(C.DepthT); }},
      {"erasure_events", "erasure events", "",
       [](auto &C) { return count(C.Erasures.Events); }},
      {"entropy_bits", "entropy erased, at most", "bits",
       [](auto &C) { return real(C.Erasures.Entropy.High); }},
      {"entropy_bits_low", "entropy erased, at least", "bits",
       [](auto &C) { return real(C.Erasures.Entropy.Low); }},
      {"dirty_ancillas", "ancillas not proved clean", "",
       [](auto &C) { return count(dirtyAncillas(C)); }},
      {"heat_J", "Landauer heat, at most", "J",
       [](auto &C) { return real(C.Erasures.HeatHighJ); }},
      {"action_Js", "action", "J s",
       [](auto &C) { return real(C.Speed.Bounds.ActionJs); }},
      {"time_pooled_s", "least time, pooled energy", "s",
       [](auto &C) { return real(C.Speed.Bounds.PooledTimeS); }},
      {"time_per_qubit_s", "least time, per-qubit energy", "s",
       [](auto &C) { return real(C.Speed.Bounds.PerQubitTimeS); }},
  };
  return Specs;
}

bool less(const MetricValue &A, const MetricValue &B) {
  return A.IsCount ? A.Count < B.Count : A.Real < B.Real;
}
bool equal(const MetricValue &A, const MetricValue &B) {
  return A.IsCount ? A.Count == B.Count : A.Real == B.Real;
}

MetricDelta deltaOf(const MetricValue &V, const MetricValue &Ref) {
  MetricDelta D;
  D.IsCount = V.IsCount;
  double RefValue = V.IsCount ? double(Ref.Count) : Ref.Real;
  double Diff;
  if (V.IsCount) {
    D.Negative = V.Count < Ref.Count;
    D.CountMagnitude = D.Negative ? Ref.Count - V.Count : V.Count - Ref.Count;
    Diff = (D.Negative ? -1.0 : 1.0) * double(D.CountMagnitude);
  } else {
    D.Real = V.Real - Ref.Real;
    D.Negative = D.Real < 0;
    Diff = D.Real;
  }
  if (RefValue != 0)
    D.Percent = 100 * Diff / std::abs(RefValue);
  return D;
}

} // namespace

std::vector<MetricRow> metricTable(const Report &R) {
  std::vector<MetricRow> Rows;
  size_t N = R.Circuits.size();
  for (const MetricSpec &S : catalogue()) {
    MetricRow Row;
    Row.Key = S.Key;
    Row.Label = S.Label;
    Row.Unit = S.Unit;
    for (const CircuitReport &C : R.Circuits)
      Row.Values.push_back(S.Of(C));
    Row.Deltas.assign(N, std::nullopt);
    Row.Best.assign(N, false);
    const std::optional<MetricValue> &Ref = N ? Row.Values[0] : std::nullopt;
    for (size_t I = 1; I < N; ++I)
      if (Ref && Row.Values[I])
        Row.Deltas[I] = deltaOf(*Row.Values[I], *Ref);
    const MetricValue *Least = nullptr;
    bool AllEqual = true;
    for (const std::optional<MetricValue> &V : Row.Values) {
      if (!V)
        continue;
      if (Least && !equal(*V, *Least))
        AllEqual = false;
      if (!Least || less(*V, *Least))
        Least = &*V;
    }
    if (Least && !AllEqual)
      for (size_t I = 0; I < N; ++I)
        Row.Best[I] = Row.Values[I] && equal(*Row.Values[I], *Least);
    Rows.push_back(std::move(Row));
  }
  return Rows;
}

std::string showMetric(const std::optional<MetricValue> &V) {
  if (!V)
    return "";
  return V->IsCount ? std::to_string(V->Count) : fmt::format("{:.6g}", V->Real);
}

std::string showDelta(const std::optional<MetricDelta> &D, bool WithPercent) {
  if (!D)
    return "";
  std::string Out;
  if (D->IsCount)
    Out = fmt::format("{}{}", D->Negative ? "-" : "+", D->CountMagnitude);
  else
    Out = fmt::format("{:+.6g}", D->Real);
  if (WithPercent && D->Percent)
    Out += fmt::format(" ({:+.1f}%)", *D->Percent);
  return Out;
}

} // namespace revbound::report
