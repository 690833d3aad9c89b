//===- Verdict.cpp - Holding circuit reports to a budget ------------------===//
#include "revbound/policy/Verdict.h"

#include "llvm/ADT/SmallString.h"
#include "llvm/Support/Path.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>

namespace revbound::policy {

namespace {

/// Growth percentages are held in millionths of a percent.
constexpr uint64_t MicrosPerWhole = 100'000'000; // 100% in millionths

llvm::Error usageError(const std::string &Message) {
  return llvm::createStringError(llvm::inconvertibleErrorCode(), "%s",
                                 Message.c_str());
}

std::string show(const Amount &A) { return showAmounts(A, A).first; }

/// "3 layers", "1 layer", "2.5e-21 J".
std::string withUnit(const std::string &Shown, Metric M) {
  std::string Unit = metricUnit(M).str();
  if (Shown == "1" && Unit.back() == 's' && Unit != "J s")
    Unit.pop_back();
  return Shown + " " + Unit;
}

bool within(const Amount &Value, const Amount &Allowed) {
  if (Value.IsCount)
    return Value.Count <= Allowed.Count;
  return Value.Real <= Allowed.Real + RealTolerance * std::fabs(Allowed.Real);
}

/// The baseline grown by `Micros` millionths of a percent; counts exact,
/// rounded down (a count passes when it is at most the exact product).
Amount grow(const Amount &Base, uint64_t Micros) {
  if (!Base.IsCount)
    return Amount::real(Base.Real +
                        Base.Real * (double(Micros) / MicrosPerWhole));
  unsigned __int128 Scaled = (unsigned __int128)Base.Count *
                             (MicrosPerWhole + Micros) / MicrosPerWhole;
  uint64_t Max = std::numeric_limits<uint64_t>::max();
  return Amount::count(Scaled > Max ? Max : uint64_t(Scaled));
}

/// "dirty", "not decided", with the density engine's probability if any.
std::string ancillaState(const report::AncillaEntry &A) {
  std::string State = A.Clean ? "dirty" : "not decided";
  if (A.DirtyProbability)
    State +=
        fmt::format(" (not |0> with probability {:.6g})", *A.DirtyProbability);
  return State;
}

/// What the circuit's figure says, before any comparison.
std::string describeValue(Metric M, const Amount &V,
                          const report::CircuitReport &C,
                          const std::string &Shown) {
  const report::ErasureReport &E = C.Erasures;
  switch (M) {
  case Metric::ErasureEvents:
    return Shown + (V.Count == 1 ? " erasure event" : " erasure events");
  case Metric::EntropyBits: {
    std::string Bits = withUnit(Shown, M);
    if (E.Entropy.Exact || E.Entropy.Low == E.Entropy.High)
      return "erases " + Bits;
    return fmt::format("may erase up to {} (at least {:.6g} bits)", Bits,
                       E.Entropy.Low);
  }
  case Metric::DirtyAncillas: {
    std::string Which;
    unsigned Named = 0;
    for (const report::AncillaEntry &A : E.Ancillas) {
      if (A.Clean && *A.Clean)
        continue;
      if (Named++ == 4) {
        Which += ", ...";
        break;
      }
      Which += fmt::format("{}{} {}", Which.empty() ? "" : ", ", A.Wire,
                           ancillaState(A));
    }
    std::string Text = withUnit(Shown, M) + " not proved clean";
    return Which.empty() ? Text : Text + " (" + Which + ")";
  }
  case Metric::Depth:
    return "depth " + withUnit(Shown, M);
  case Metric::TwoQubitDepth:
    return "two-qubit depth " + withUnit(Shown, M);
  case Metric::TCount:
    return "T-count " + Shown;
  case Metric::Gates:
    return withUnit(Shown, M);
  case Metric::Qubits:
    return withUnit(Shown, M);
  case Metric::ActionJs:
    return "action " + withUnit(Shown, M);
  case Metric::HeatJ: {
    std::string Heat = withUnit(Shown, M);
    std::string At = fmt::format("at {} K", E.TemperatureK);
    if (E.Entropy.Exact || E.HeatLowJ == E.HeatHighJ)
      return fmt::format("Landauer heat {} {}", Heat, At);
    return fmt::format("Landauer heat may reach {} {} (at least {:.6g} J)",
                       Heat, At, E.HeatLowJ);
  }
  }
  llvm_unreachable("every metric is described");
}

std::string counterexample(const report::AncillaEntry &A) {
  std::string Text;
  for (const auto &[Register, Bits] : A.Counterexample)
    Text += fmt::format("{}{}={}", Text.empty() ? "" : " ", Register, Bits);
  return Text;
}

/// The places a failed metric comes from, at most `Max` of them.
void placesOf(Metric M, const report::CircuitReport &C, unsigned Max,
              CheckResult &R) {
  auto add = [&](const report::SourcePoint &At, std::string What) {
    if (R.PlacesTotal++ < Max)
      R.Places.push_back({At, std::move(What)});
  };
  const report::ErasureReport &E = C.Erasures;
  switch (M) {
  case Metric::ErasureEvents:
  case Metric::EntropyBits:
  case Metric::HeatJ:
    for (const report::ErasureEntry &X : E.List) {
      if (M != Metric::ErasureEvents && !(X.BitsHigh > 0))
        continue;
      std::string Bits =
          X.BitsLow == X.BitsHigh
              ? withUnit(fmt::format("{:.6g}", X.BitsHigh), Metric::EntropyBits)
              : fmt::format("{:.6g} to {:.6g} bits", X.BitsLow, X.BitsHigh);
      add(X.At, fmt::format("{} {}: {}", X.Kind, X.Wire, Bits));
    }
    return;
  case Metric::DirtyAncillas:
    for (const report::AncillaEntry &A : E.Ancillas) {
      if (A.Clean && *A.Clean)
        continue;
      // The discard of the ancilla is listed at its last operation.
      report::SourcePoint At{C.File, 0, 0};
      for (const report::ErasureEntry &X : E.List)
        if (X.Kind == "discard" && X.Wire == A.Wire)
          At = X.At;
      std::string What = fmt::format("ancilla {} {}", A.Wire, ancillaState(A));
      if (A.HasCounterexample)
        What += fmt::format(" (ends at 1 for {})", counterexample(A));
      add(At, std::move(What));
    }
    return;
  case Metric::Depth:
    for (const report::PathStep &S : C.Path.Listed) {
      std::string Wires;
      for (const std::string &W : S.Wires)
        Wires += (Wires.empty() ? "" : ", ") + W;
      add(S.At, fmt::format("critical path: {} {}", S.Gate, Wires));
    }
    // The report lists a prefix of the path; count all of its steps.
    R.PlacesTotal = std::max<uint64_t>(R.PlacesTotal, C.Path.Steps);
    return;
  case Metric::TwoQubitDepth:
  case Metric::TCount:
  case Metric::Gates:
  case Metric::Qubits:
  case Metric::ActionJs:
    return;
  }
}

CheckResult checkLimit(const LimitRule &L, const Amount &Value,
                       const report::CircuitReport &C, unsigned MaxPlaces) {
  CheckResult R;
  R.M = L.M;
  R.Kind = CheckKind::Limit;
  R.Value = Value;
  R.Allowed = L.Ceiling;
  R.Rule = L.At;
  bool Ok = within(Value, L.Ceiling);
  R.Status = Ok ? CheckStatus::Passed : CheckStatus::Failed;
  auto [V, Limit] = showAmounts(Value, L.Ceiling);
  R.Message =
      fmt::format("{}, {} the limit {}", describeValue(L.M, Value, C, V),
                  Ok ? "within" : "over", withUnit(Limit, L.M));
  if (!Ok)
    placesOf(L.M, C, MaxPlaces, R);
  return R;
}

CheckResult checkGrowth(const GrowthRule &G, const Amount &Value,
                        const Amount &Base, const report::CircuitReport &C,
                        unsigned MaxPlaces) {
  CheckResult R;
  R.M = G.M;
  R.Kind = CheckKind::Growth;
  R.Value = Value;
  R.BaselineValue = Base;
  R.Allowed = grow(Base, G.PercentMicros);
  R.Growth = G.Written;
  R.Rule = G.At;
  bool Ok = within(Value, R.Allowed);
  R.Status = Ok ? CheckStatus::Passed : CheckStatus::Failed;
  auto [V, Allowed] = showAmounts(Value, R.Allowed);
  R.Message =
      fmt::format("{}, {} the baseline's {} + {} (at most {})",
                  describeValue(G.M, Value, C, V), Ok ? "within" : "grown past",
                  withUnit(show(Base), G.M), G.Written, withUnit(Allowed, G.M));
  if (!Ok)
    placesOf(G.M, C, MaxPlaces, R);
  return R;
}

/// A growth check without a baseline value: the file is new.
CheckResult skipGrowth(const GrowthRule &G, const Amount &Value,
                       const report::CircuitReport &C) {
  CheckResult R;
  R.M = G.M;
  R.Kind = CheckKind::Growth;
  R.Status = CheckStatus::Skipped;
  R.Value = Value;
  R.Allowed = Value;
  R.Growth = G.Written;
  R.Rule = G.At;
  R.Message = fmt::format("{}; no baseline value, growth not checked",
                          describeValue(G.M, Value, C, show(Value)));
  return R;
}

std::string normalPath(llvm::StringRef Path) {
  llvm::SmallString<256> P(Path);
  llvm::sys::path::remove_dots(P, /*remove_dot_dot=*/false);
  return std::string(P.str());
}

const MetricSet *baselineFor(const Baseline &Base, const std::string &File) {
  if (Base.SingleCircuit)
    return Base.Circuits.empty() ? nullptr : &Base.Circuits.front().second;
  std::string Wanted = normalPath(File);
  for (const auto &[Name, Set] : Base.Circuits)
    if (normalPath(Name) == Wanted)
      return &Set;
  return nullptr;
}

} // namespace

MetricSet metricsOf(const report::CircuitReport &C) {
  MetricSet S;
  uint64_t Dirty = 0;
  for (const report::AncillaEntry &A : C.Erasures.Ancillas)
    if (!(A.Clean && *A.Clean))
      ++Dirty;
  S[Metric::ErasureEvents] = Amount::count(C.Erasures.Events);
  S[Metric::EntropyBits] = Amount::real(C.Erasures.Entropy.High);
  S[Metric::DirtyAncillas] = Amount::count(Dirty);
  S[Metric::Depth] = Amount::count(C.DepthAll);
  S[Metric::TwoQubitDepth] = Amount::count(C.DepthTwoQubit);
  S[Metric::TCount] = Amount::count(C.Ops.TCount);
  S[Metric::Gates] = Amount::count(C.Ops.Gates);
  S[Metric::Qubits] = Amount::count(C.Qubits);
  S[Metric::ActionJs] = Amount::real(C.Speed.Bounds.ActionJs);
  S[Metric::HeatJ] = Amount::real(C.Erasures.HeatHighJ);
  return S;
}

std::string ruleId(Metric M, CheckKind K) {
  return (K == CheckKind::Limit ? "budget/" : "growth/") + metricName(M).str();
}

std::string ruleHelp(Metric M, CheckKind K) {
  const char *What = "";
  switch (M) {
  case Metric::ErasureEvents:
    What = "The circuit's erasure events (resets, measurements that overwrite "
           "data, ancilla and garbage qubits discarded at the end)";
    break;
  case Metric::EntropyBits:
    What = "The most entropy the circuit may erase, in bits (the high end of "
           "its interval)";
    break;
  case Metric::DirtyAncillas:
    What = "The number of ancillas not proved to return to |0> (dirty or not "
           "decided)";
    break;
  case Metric::Depth:
    What = "The circuit's depth in layers";
    break;
  case Metric::TwoQubitDepth:
    What = "The circuit's depth counting only gates on two or more qubits";
    break;
  case Metric::TCount:
    What = "The circuit's number of T and T-dagger gates";
    break;
  case Metric::Gates:
    What = "The circuit's number of unitary gate applications";
    break;
  case Metric::Qubits:
    What = "The circuit's number of qubits";
    break;
  case Metric::ActionJs:
    What = "The circuit's energy-free speed-limit action, in J s";
    break;
  case Metric::HeatJ:
    What = "The least heat the circuit's erasures may need (Landauer), in J "
           "(the high end of its interval)";
    break;
  }
  if (K == CheckKind::Limit)
    return fmt::format("{} may not exceed '{}' of the budget's [limits] "
                       "(docs/check.md).",
                       What, metricName(M).str());
  return fmt::format("{} may not grow past its baseline value by more than "
                     "'{}' of the budget's [growth] (docs/check.md).",
                     What, metricName(M).str());
}

std::string ruleSummary(Metric M, CheckKind K) {
  return fmt::format("{} {}", metricName(M).str(),
                     K == CheckKind::Limit ? "within the budget's limit"
                                           : "within the allowed growth over "
                                             "the baseline");
}

llvm::Error checkBaselineUse(const Budget &B, const std::string &BaselinePath,
                             bool BaselineIsCircuit, size_t CheckedFiles) {
  if (!B.Growth.empty() && BaselinePath.empty()) {
    config::ConfigError E{B.File, B.GrowthTable.Line, B.GrowthTable.Column,
                          "[growth] compares with a baseline, but no "
                          "--baseline was given; pass --baseline FILE (a "
                          "circuit or a JSON report)"};
    return usageError(E.format());
  }
  if (!BaselinePath.empty() && BaselineIsCircuit && CheckedFiles > 1)
    return usageError(fmt::format(
        "--baseline {}: a circuit baseline stands for one checked file, but "
        "{} are checked; give a JSON report (revbound report --format json "
        "-o FILE) whose circuits are matched by path",
        BaselinePath, CheckedFiles));
  return llvm::Error::success();
}

llvm::Expected<CheckReport>
evaluate(const Budget &B, llvm::ArrayRef<report::CircuitReport> Circuits,
         const Baseline *Base, const CheckOptions &Opts) {
  if (llvm::Error E =
          checkBaselineUse(B, Base ? Base->Source : "",
                           Base && Base->SingleCircuit, Circuits.size()))
    return E;
  CheckReport Out;
  Out.BudgetFile = B.File;
  Out.BaselineFile = Base ? Base->Source : "";
  Out.ToolVersion = Opts.ToolVersion;
  for (const report::CircuitReport &C : Circuits) {
    FileVerdict F;
    F.File = C.File;
    MetricSet Values = metricsOf(C);
    for (const LimitRule &L : B.Limits)
      F.Checks.push_back(checkLimit(L, *Values[L.M], C, Opts.MaxPlaces));
    const MetricSet *Old =
        Base && !B.Growth.empty() ? baselineFor(*Base, C.File) : nullptr;
    if (!B.Growth.empty() && !Old)
      F.Notes.push_back(fmt::format(
          "not in the baseline {} (a new file): growth checks skipped",
          Base ? Base->Source : ""));
    for (const GrowthRule &G : B.Growth)
      F.Checks.push_back(
          Old && (*Old)[G.M]
              ? checkGrowth(G, *Values[G.M], *(*Old)[G.M], C, Opts.MaxPlaces)
              : skipGrowth(G, *Values[G.M], C));
    std::stable_sort(
        F.Checks.begin(), F.Checks.end(),
        [](const CheckResult &A, const CheckResult &B) { return A.M < B.M; });
    for (const CheckResult &R : F.Checks)
      ++(R.Status == CheckStatus::Passed   ? Out.Passed
         : R.Status == CheckStatus::Failed ? Out.Failed
                                           : Out.Skipped);
    Out.Files.push_back(std::move(F));
  }
  return Out;
}

} // namespace revbound::policy
