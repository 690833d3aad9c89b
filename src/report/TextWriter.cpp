//===- TextWriter.cpp - The report as a human summary --------------------===//
#include "revbound/report/Writers.h"

#include <fmt/format.h>

namespace revbound::report {

static std::string joinCounts(const analysis::NamedCounts &C) {
  std::string Out;
  for (const auto &[Name, N] : C) {
    if (!Out.empty())
      Out += ", ";
    Out += fmt::format("{} {}", Name, N);
  }
  return Out.empty() ? "none" : Out;
}

static std::string stepText(const PathStep &S) {
  std::string Wires;
  for (const std::string &W : S.Wires)
    Wires += (Wires.empty() ? "" : ",") + W;
  std::string Where = fmt::format("{}:{}", S.At.Line, S.At.Column);
  if (S.Inside.Line != 0)
    Where += fmt::format(" via {}:{}", S.Inside.Line, S.Inside.Column);
  return fmt::format("{} {} ({})", S.Gate, Wires, Where);
}

static std::string seconds(double S) { return fmt::format("{:.4g} s", S); }

static void writeSpeed(const CircuitReport &C, std::string &Out) {
  const analysis::SpeedBounds &B = C.Speed.Bounds;
  const analysis::EnergyOptions &E = C.Speed.Energy;
  Out += fmt::format("  action       {:.4g} J s over {} steps, {} of them able to "
                     "reach an orthogonal state\n",
                     B.ActionJs, B.Steps, B.OrthogonalSteps);
  if (B.PooledTimeS)
    Out += fmt::format("  pooled       time >= {} with {:.4g} J for the whole "
                       "machine{}\n",
                       seconds(*B.PooledTimeS), *E.EnergyJ,
                       E.SpreadJ ? " (and the given spread)" : "");
  if (B.PerQubitTimeS)
    Out += fmt::format("  per qubit    time >= {} with {:.4g} J per qubit, on the "
                       "longest path\n",
                       seconds(*B.PerQubitTimeS), *E.EnergyPerQubitJ);
  if (E.TargetTimeS)
    Out += fmt::format("  to finish in {}: energy >= {:.4g} J pooled, {:.4g} J "
                       "per qubit\n",
                       seconds(*E.TargetTimeS), *B.PooledEnergyForTargetJ,
                       *B.PerQubitEnergyForTargetJ);
  if (C.Speed.Device) {
    const analysis::DeviceComparison &D = *C.Speed.Device;
    Out += fmt::format("  device       schedule {} with the given durations", seconds(D.ScheduleS));
    if (D.Ratio)
      Out += fmt::format("; the bound is {:.3g} of it", *D.Ratio);
    Out += "\n";
    unsigned Shown = 0;
    for (const analysis::GateKindTiming &K : D.Kinds) {
      if (++Shown > 3)
        break;
      if (K.DurationS == 0) {
        Out += fmt::format("               {} ({}x) takes 0 s on the device: no "
                           "physical evolution to bound\n",
                           K.Name, K.Count);
        continue;
      }
      Out += fmt::format("               {} ({}x) {}: needs >= {:.3g} J per step{}\n",
                         K.Name, K.Count, seconds(K.DurationS), K.LeastEnergyJ,
                         K.SlowerBy ? fmt::format(", {:.3g}x slower than the "
                                                  "limit", *K.SlowerBy)
                                    : std::string());
    }
  }
  if (!B.PooledTimeS && !B.PerQubitTimeS && !E.TargetTimeS)
    Out += "               time >= action / energy; give --energy or "
           "--energy-per-qubit\n";
}

static std::string bits(double Low, double High) {
  if (Low == High) {
    // The plural follows what is printed: 0.9999999999999999 reads "1 bit".
    std::string Shown = fmt::format("{:.6g}", Low);
    return Shown + (Shown == "1" ? " bit" : " bits");
  }
  return fmt::format("{:.6g} to {:.6g} bits", Low, High);
}

static void writeErasures(const ErasureReport &E, std::string &Out) {
  Out += fmt::format("  erasures     {} event{}, {}{}; engine {}\n", E.Events,
                     E.Events == 1 ? "" : "s",
                     bits(E.Entropy.Low, E.Entropy.High),
                     E.Entropy.Exact ? " (exact)" : "", E.Engine);
  Out += fmt::format("               {}\n", E.Reason);
  for (const ErasureEntry &X : E.List) {
    std::string Figure = X.Status == "constant"
                             ? "0 bits (proved constant)"
                             : bits(X.BitsLow, X.BitsHigh);
    if (X.Samples)
      Figure += fmt::format(", about {:.3g} from {} samples", X.BitsEstimate,
                            X.Samples);
    Out += fmt::format("               {}:{}:{} {} {}: {}\n", X.At.File,
                       X.At.Line, X.At.Column, X.Kind, X.Wire, Figure);
  }
  if (E.DiscardJoint.High > 0 || !E.DiscardJoint.Exact)
    Out += fmt::format("               discarded wires together: {}\n",
                       bits(E.DiscardJoint.Low, E.DiscardJoint.High));
  for (const std::string &N : E.Notes)
    Out += fmt::format("               note: {}\n", N);
  for (const AncillaEntry &A : E.Ancillas) {
    std::string Verdict = !A.Clean ? "unknown" : *A.Clean ? "clean" : "dirty";
    if (A.HasCounterexample) {
      std::string Inputs;
      for (const auto &[Register, Bits] : A.Counterexample)
        Inputs += fmt::format("{}{}={}", Inputs.empty() ? "" : " ", Register,
                              Bits);
      Verdict += fmt::format(" (ends at 1 for input {})",
                             Inputs.empty() ? "none" : Inputs);
    }
    if (A.DirtyProbability && !(A.Clean && *A.Clean))
      Verdict += fmt::format(" (not |0> with probability {:.6g})",
                             *A.DirtyProbability);
    if (A.Samples && !A.Clean)
      Verdict += fmt::format(" ({} of {} random inputs left it at 1)",
                             A.DirtySamples, A.Samples);
    Out += fmt::format("  ancilla      {} {}\n", A.Wire, Verdict);
  }
  Out += fmt::format("  landauer     heat >= {:.4g} J at {:.4g} K", E.HeatLowJ,
                     E.TemperatureK);
  if (E.HeatHighJ != E.HeatLowJ)
    Out += fmt::format(" (up to {:.4g} J if every open bit is erased)",
                       E.HeatHighJ);
  Out += "\n";
}

static void writeCircuit(const CircuitReport &C, std::string &Out) {
  const analysis::Census &O = C.Ops;
  Out += fmt::format("== {}\n", C.File);
  Out += fmt::format("  size         {} qubits, {} classical bits\n", C.Qubits,
                     C.Clbits);
  Out += fmt::format("  leaves       {} granularity\n", C.Granularity);
  Out += fmt::format("  gates        {} ({} on two or more qubits, T-count {})\n",
                     O.Gates, O.TwoQubit, O.TCount);
  Out += fmt::format("  non-unitary  {} measure, {} reset; {} barrier, "
                     "{} under if\n",
                     O.Measure, O.Reset, O.Barrier, O.Conditional);
  Out += fmt::format("  by leaf      {}\n", joinCounts(O.ByName));
  Out += fmt::format("  as written   {}\n", joinCounts(O.AsWritten));
  Out += fmt::format("  to U and CX  {} U, {} CX{}\n", O.PrimitiveU, O.PrimitiveCX,
                     O.PrimitiveOpaque
                         ? fmt::format(" (and {} opaque)", O.PrimitiveOpaque)
                         : std::string());
  Out += fmt::format("  depth        {} layers ({} two-qubit, {} T)\n",
                     C.DepthAll, C.DepthTwoQubit, C.DepthT);
  Out += fmt::format("  volume       {} qubit-layers\n", C.Volume);
  if (C.Path.Steps > 0) {
    Out += fmt::format("  longest path {} steps ({} graph)\n", C.Path.Steps,
                       C.Path.Method == "dag" ? "leaf" : "top-level");
    unsigned Shown = 0;
    for (const PathStep &S : C.Path.Listed) {
      if (++Shown > 8)
        break;
      Out += fmt::format("               {}\n", stepText(S));
    }
    if (C.Path.Steps > 8)
      Out += fmt::format("               ... {} more (see --format json)\n",
                         C.Path.Steps - 8);
  }
  writeSpeed(C, Out);
  writeErasures(C.Erasures, Out);
  if (!C.Warnings.empty())
    Out += fmt::format("  warnings     {}\n", C.Warnings.size());
}

std::string writeText(const Report &R) {
  std::string Out;
  for (size_t I = 0; I < R.Circuits.size(); ++I) {
    if (I)
      Out += '\n';
    writeCircuit(R.Circuits[I], Out);
  }
  return Out;
}

} // namespace revbound::report
