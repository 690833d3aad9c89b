//===- JsonWriter.cpp - The report as JSON (docs/json.md) ----------------===//
#include "revbound/report/Writers.h"

#include "revbound/support/Constants.h"

#include <nlohmann/json.hpp>

#include <cmath>

namespace revbound::report {

using Json = nlohmann::ordered_json;

static Json counts(const analysis::NamedCounts &C) {
  Json J = Json::object();
  for (const auto &[Name, N] : C)
    J[Name] = N;
  return J;
}

static Json point(const SourcePoint &P) {
  Json J = Json::object();
  J["file"] = P.File;
  J["line"] = P.Line;
  J["column"] = P.Column;
  return J;
}

static Json interval(const semantics::BitInterval &I) {
  return {{"low", I.Low}, {"high", I.High}, {"exact", I.Exact}};
}

/// DESIGN.md's `erasures`, `ancillas` and `landauer` members.
static void erasuresJson(const ErasureReport &E, Json &J) {
  Json List = Json::array();
  for (const ErasureEntry &X : E.List) {
    Json Item = {{"kind", X.Kind},     {"wire", X.Wire},
                 {"file", X.At.File},  {"line", X.At.Line},
                 {"column", X.At.Column}, {"layer", X.Layer},
                 {"bits_low", X.BitsLow},
                 {"bits_high", X.BitsHigh}, {"status", X.Status}};
    if (X.Samples)
      Item["sampled"] = {{"samples", X.Samples},
                         {"estimate_bits", X.BitsEstimate}};
    List.push_back(std::move(Item));
  }
  Json Hotspots = Json::array();
  for (const ErasureHotspot &H : E.Hotspots)
    Hotspots.push_back({{"file", H.File},
                        {"line", H.Line},
                        {"events", H.Events},
                        {"bits_low", H.BitsLow},
                        {"bits_high", H.BitsHigh}});
  J["erasures"] = {{"engine", E.Engine},
                   {"reason", E.Reason},
                   {"events", E.Events},
                   {"entropy_bits", interval(E.Entropy)},
                   {"discard_joint_bits", interval(E.DiscardJoint)},
                   {"list", std::move(List)},
                   {"hotspots", std::move(Hotspots)},
                   {"notes", E.Notes}};
  Json Ancillas = Json::array();
  for (const AncillaEntry &A : E.Ancillas) {
    Json Item = {{"wire", A.Wire},
                 {"clean", A.Clean ? Json(*A.Clean) : Json(nullptr)}};
    Json Counter = nullptr;
    if (A.HasCounterexample) {
      Counter = Json::object();
      for (const auto &[Register, Bits] : A.Counterexample)
        Counter[Register] = Bits;
    }
    Item["counterexample"] = std::move(Counter);
    if (A.DirtyProbability)
      Item["dirty_probability"] = *A.DirtyProbability;
    if (A.Samples)
      Item["sampled"] = {{"samples", A.Samples},
                         {"dirty_samples", A.DirtySamples}};
    Ancillas.push_back(std::move(Item));
  }
  J["ancillas"] = std::move(Ancillas);
  J["landauer"] = {{"temperature_K", E.TemperatureK},
                   {"heat_J", {{"low", E.HeatLowJ}, {"high", E.HeatHighJ}}}};
}

static Json circuitJson(const CircuitReport &C) {
  Json J;
  J["file"] = C.File;
  J["qubits"] = C.Qubits;
  J["clbits"] = C.Clbits;
  J["granularity"] = C.Granularity;
  const analysis::Census &O = C.Ops;
  J["ops"] = {
      {"as_written", counts(O.AsWritten)},
      {"by_name", counts(O.ByName)},
      {"primitive",
       {{"U", O.PrimitiveU}, {"CX", O.PrimitiveCX}, {"opaque", O.PrimitiveOpaque}}},
      {"gates", O.Gates},
      {"measure", O.Measure},
      {"reset", O.Reset},
      {"barrier", O.Barrier},
      {"t_count", O.TCount},
      {"two_qubit", O.TwoQubit},
      {"conditional", O.Conditional},
  };
  J["depth"] = {{"all", C.DepthAll}, {"two_qubit", C.DepthTwoQubit}, {"t", C.DepthT}};
  J["volume"] = C.Volume;
  Json Steps = Json::array();
  for (const PathStep &S : C.Path.Listed) {
    Json Step;
    Step["gate"] = S.Gate;
    Step["wires"] = S.Wires;
    Step["file"] = S.At.File;
    Step["line"] = S.At.Line;
    Step["column"] = S.At.Column;
    if (S.Inside.Line != 0)
      Step["inside"] = point(S.Inside);
    Steps.push_back(std::move(Step));
  }
  J["critical_path"] = {{"method", C.Path.Method},
                        {"length", C.Path.Length},
                        {"steps", C.Path.Steps},
                        {"listed", std::move(Steps)}};
  const analysis::SpeedBounds &B = C.Speed.Bounds;
  const analysis::EnergyOptions &E = C.Speed.Energy;
  auto orNull = [](const std::optional<double> &V) {
    return V ? Json(*V) : Json(nullptr);
  };
  J["speed"] = {
      {"granularity", C.Granularity},
      {"action_Js", B.ActionJs},
      {"action_h", B.ActionJs / si::PlanckJouleSeconds},
      {"path_action_Js", B.PathActionJs},
      {"steps", B.Steps},
      {"orthogonal_ops", B.OrthogonalSteps},
      {"unknown_ops", B.UnknownSteps},
      {"conditional_skipped", B.ConditionalSkipped},
      {"energy_J", orNull(E.EnergyJ)},
      {"energy_per_qubit_J", orNull(E.EnergyPerQubitJ)},
      {"energy_spread_J", orNull(E.SpreadJ)},
      {"time_s", {{"pooled", orNull(B.PooledTimeS)},
                  {"per_qubit", orNull(B.PerQubitTimeS)}}},
      {"target_time_s", orNull(E.TargetTimeS)},
      {"least_energy_J", {{"pooled", orNull(B.PooledEnergyForTargetJ)},
                          {"per_qubit", orNull(B.PerQubitEnergyForTargetJ)}}},
  };
  Json Frontier = Json::array();
  for (const analysis::FrontierPoint &P : C.Speed.Frontier.Points)
    Frontier.push_back({{"energy_J", P.EnergyJ},
                        {"pooled_s", P.PooledTimeS},
                        {"per_qubit_s", P.PerQubitTimeS}});
  J["speed"]["frontier"] = {
      {"anchor", analysis::frontierAnchorName(C.Speed.Frontier.Anchor)},
      {"anchor_J", C.Speed.Frontier.AnchorJ},
      {"points", std::move(Frontier)}};
  if (C.Speed.Device) {
    const analysis::DeviceComparison &D = *C.Speed.Device;
    Json Kinds = Json::array();
    for (const analysis::GateKindTiming &K : D.Kinds)
      Kinds.push_back({{"gate", K.Name},
                       {"count", K.Count},
                       {"duration_s", K.DurationS},
                       {"action_Js", K.MaxActionJs},
                       {"least_energy_J", std::isfinite(K.LeastEnergyJ)
                                              ? Json(K.LeastEnergyJ)
                                              : Json(nullptr)},
                       {"limit_s", orNull(K.LimitS)},
                       {"slower_by", orNull(K.SlowerBy)}});
    J["speed"]["device"] = {{"schedule_s", D.ScheduleS},
                            {"bound_s", orNull(D.BoundS)},
                            {"bound_over_schedule", orNull(D.Ratio)},
                            {"gates", std::move(Kinds)}};
  }
  erasuresJson(C.Erasures, J);
  Json Warnings = Json::array();
  for (const Finding &F : C.Warnings) {
    Json W = point(F.At);
    W["message"] = F.Message;
    Warnings.push_back(std::move(W));
  }
  J["warnings"] = std::move(Warnings);
  return J;
}

std::string writeJson(const Report &R) {
  Json Root;
  Root["schema"] = SchemaVersion;
  Json Circuits = Json::array();
  for (const CircuitReport &C : R.Circuits)
    Circuits.push_back(circuitJson(C));
  Root["circuits"] = std::move(Circuits);
  // File names need not be UTF-8; invalid bytes become U+FFFD rather than
  // an exception.
  return Root.dump(2, ' ', false, Json::error_handler_t::replace) + "\n";
}

std::string writeJsonLine(const CircuitReport &C) {
  Json Line;
  Line["schema"] = SchemaVersion;
  Json Circuit = circuitJson(C);
  for (auto It = Circuit.begin(); It != Circuit.end(); ++It)
    Line[It.key()] = std::move(It.value());
  // Compact: JSON escapes control characters in strings, so the one line
  // holds no newline.
  return Line.dump(-1, ' ', false, Json::error_handler_t::replace) + "\n";
}

} // namespace revbound::report
