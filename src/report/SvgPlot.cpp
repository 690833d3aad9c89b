//===- SvgPlot.cpp - Markup helpers and the two SVG plots of the HTML page ===//
#include "SvgPlot.h"

#include "revbound/support/Text.h"

#include <algorithm>
#include <cmath>
#include <fmt/format.h>
#include <map>
#include <tuple>

namespace revbound::report::markup {

std::string figure(double V) { return fmt::format("{:.4g}", V); }
std::string exact(double V) { return fmt::format("{}", V); }
static std::string px(double V) { return fmt::format("{:.2f}", V); }

//===-- The erasure timeline ----------------------------------------------===//

namespace {

// Colour bins by the upper bound on the bits an event erases; constant
// events (proved 0 bits) have their own neutral colour.
struct Bin {
  double UpTo;
  const char *Colour;
  const char *Label;
};
constexpr const char *ConstantColour = "#a3a9b3";
constexpr Bin Bins[] = {{0.25, "#f0dfa8", "up to 0.25 bit"},
                        {0.5, "#e5b25d", "up to 0.5 bit"},
                        {0.75, "#d27a3c", "up to 0.75 bit"},
                        {1.0, "#ab3f2a", "up to 1 bit"},
                        {INFINITY, "#5f1d1d", "more than 1 bit"}};

const char *colourOf(const ErasureEntry &X) {
  if (X.Status == "constant" || X.BitsHigh <= 0)
    return ConstantColour;
  for (const Bin &B : Bins)
    if (X.BitsHigh <= B.UpTo)
      return B.Colour;
  return Bins[std::size(Bins) - 1].Colour;
}

/// Sort key of a wire "reg[i]": qubits before bits, then register, index.
std::tuple<bool, std::string, uint64_t> wireKey(const ErasureEntry &X) {
  const std::string &W = X.Wire;
  size_t Open = W.rfind('[');
  uint64_t Index = 0;
  std::string Name = W;
  if (Open != std::string::npos) {
    Name = W.substr(0, Open);
    for (size_t I = Open + 1; I < W.size() && W[I] >= '0' && W[I] <= '9'; ++I)
      Index = Index * 10 + unsigned(W[I] - '0');
  }
  return {X.Kind == "overwrite", Name, Index};
}

// The frame of the timeline, in SVG user units.
constexpr double TimelineX = 110, TimelineWidth = 600, RowHeight = 22,
                 TimelineTop = 12;

std::string mark(const ErasureEntry &X, double Cx, double Cy, double Size) {
  std::string Shape;
  double H = Size / 2;
  std::string Common = fmt::format(
      "class=\"erasure kind-{}{}\" fill=\"{}\" data-kind=\"{}\" "
      "data-wire=\"{}\" "
      "data-layer=\"{}\" data-bits-low=\"{}\" data-bits-high=\"{}\" "
      "data-status=\"{}\" data-line=\"{}\"",
      xmlEscape(X.Kind), X.Status == "unknown" ? " open" : "", colourOf(X),
      xmlEscape(X.Kind), xmlEscape(X.Wire), X.Layer, exact(X.BitsLow),
      exact(X.BitsHigh), xmlEscape(X.Status), X.At.Line);
  std::string Title = fmt::format(
      "<title>{} {} at layer {}, {}:{}: {} bits{}</title>", xmlEscape(X.Kind),
      xmlEscape(X.Wire), X.Layer, xmlEscape(X.At.File), X.At.Line,
      X.BitsLow == X.BitsHigh ? figure(X.BitsLow)
                              : figure(X.BitsLow) + " to " + figure(X.BitsHigh),
      X.Status == "constant" ? " (proved constant)" : "");
  if (X.Kind == "reset")
    return fmt::format("<rect {} x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" "
                       "data-cx=\"{}\">{}</rect>\n",
                       Common, px(Cx - H), px(Cy - H), px(Size), px(Size),
                       px(Cx), Title);
  if (X.Kind == "overwrite")
    return fmt::format("<polygon {} points=\"{},{} {},{} {},{} {},{}\" "
                       "data-cx=\"{}\">{}</polygon>\n",
                       Common, px(Cx), px(Cy - H), px(Cx + H), px(Cy), px(Cx),
                       px(Cy + H), px(Cx - H), px(Cy), px(Cx), Title);
  return fmt::format("<circle {} cx=\"{}\" cy=\"{}\" r=\"{}\" data-cx=\"{}\">"
                     "{}</circle>\n",
                     Common, px(Cx), px(Cy), px(H), px(Cx), Title);
}

/// Layer ticks: 0, the end slot, and round steps between.
std::vector<uint64_t> layerTicks(uint64_t Depth) {
  std::vector<uint64_t> Ticks;
  uint64_t Step = 1;
  while (Depth / Step > 8) {
    if (Step > UINT64_MAX / 10)
      break;
    uint64_t Next = Step * 10;
    if (Depth / (Step * 2) <= 8)
      Next = Step * 2;
    else if (Depth / (Step * 5) <= 8)
      Next = Step * 5;
    Step = Next;
  }
  for (uint64_t T = 0; T < Depth; T += Step) {
    Ticks.push_back(T);
    if (T > UINT64_MAX - Step)
      break;
  }
  return Ticks;
}

} // namespace

std::string erasureTimeline(const CircuitReport &C, unsigned MaxWires,
                            unsigned MaxMarks) {
  const std::vector<ErasureEntry> &List = C.Erasures.List;
  if (List.empty())
    return {};
  std::map<std::tuple<bool, std::string, uint64_t>, std::vector<size_t>> Rows;
  for (size_t I = 0; I < List.size(); ++I)
    Rows[wireKey(List[I])].push_back(I);
  size_t Drawn = std::min<size_t>(Rows.size(), MaxWires);
  double Slots = double(C.DepthAll) + 1; // the layers, then the end
  double Slot = TimelineWidth / Slots;
  double Size = std::clamp(Slot * 0.8, 3.0, 12.0);
  double Height = TimelineTop + Drawn * RowHeight + 44;
  std::string Out = fmt::format(
      "<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"plot timeline\" "
      "viewBox=\"0 0 740 {0}\" width=\"740\" height=\"{0}\" role=\"img\" "
      "data-depth=\"{1}\" data-frame-x=\"{2}\" "
      "data-frame-width=\"{3}\">\n<title>Erasures by layer and wire</title>\n",
      px(Height), C.DepthAll, px(TimelineX), px(TimelineWidth));
  double Bottom = TimelineTop + Drawn * RowHeight;
  // The end slot, where discards sit.
  Out += fmt::format("<rect class=\"end-slot\" x=\"{}\" y=\"{}\" width=\"{}\" "
                     "height=\"{}\"/>\n",
                     px(TimelineX + C.DepthAll * Slot), px(TimelineTop),
                     px(Slot), px(Bottom - TimelineTop));
  size_t Marks = 0, Row = 0;
  for (const auto &[Key, Events] : Rows) {
    if (Row == Drawn)
      break;
    double Cy = TimelineTop + (Row + 0.5) * RowHeight;
    Out += fmt::format("<g class=\"wire-row\" data-wire=\"{}\">\n",
                       xmlEscape(List[Events[0]].Wire));
    Out += fmt::format("<line class=\"wire\" x1=\"{}\" y1=\"{}\" x2=\"{}\" "
                       "y2=\"{}\"/>\n",
                       px(TimelineX), px(Cy), px(TimelineX + TimelineWidth),
                       px(Cy));
    Out += fmt::format(
        "<text class=\"wire-label\" x=\"{}\" y=\"{}\">{}</text>\n",
        px(TimelineX - 8), px(Cy + 4), xmlEscape(List[Events[0]].Wire));
    for (size_t I : Events) {
      if (Marks == MaxMarks)
        break;
      ++Marks;
      double Cx = TimelineX + (double(List[I].Layer) + 0.5) * Slot;
      Out += mark(List[I], Cx, Cy, Size);
    }
    Out += "</g>\n";
    ++Row;
  }
  Out += fmt::format("<line class=\"axis\" x1=\"{}\" y1=\"{}\" x2=\"{}\" "
                     "y2=\"{}\"/>\n",
                     px(TimelineX), px(Bottom), px(TimelineX + TimelineWidth),
                     px(Bottom));
  for (uint64_t T : layerTicks(C.DepthAll)) {
    double X = TimelineX + (double(T) + 0.5) * Slot;
    Out += fmt::format("<line class=\"tick\" x1=\"{0}\" y1=\"{1}\" x2=\"{0}\" "
                       "y2=\"{2}\"/><text class=\"tick-label\" x=\"{0}\" "
                       "y=\"{3}\">{4}</text>\n",
                       px(X), px(Bottom), px(Bottom + 5), px(Bottom + 17), T);
  }
  Out +=
      fmt::format("<text class=\"tick-label\" x=\"{}\" y=\"{}\">end</text>\n",
                  px(TimelineX + (C.DepthAll + 0.5) * Slot), px(Bottom + 17));
  Out += fmt::format("<text class=\"axis-title\" x=\"{}\" y=\"{}\">layer "
                     "(depth.all schedule, from 0)</text>\n",
                     px(TimelineX + TimelineWidth / 2), px(Bottom + 36));
  Out += "</svg>\n";
  if (Drawn < Rows.size() || Marks < List.size())
    Out += fmt::format("<p class=\"note\">Drawn: {} of {} wires, {} of {} "
                       "events.</p>\n",
                       Drawn, Rows.size(), Marks, List.size());
  return Out;
}

std::string timelineLegend() {
  std::string Out = "<ul class=\"legend\">\n";
  Out +=
      fmt::format("<li><span class=\"swatch\" style=\"background:{}\"></span>"
                  "proved constant (0 bits)</li>\n",
                  ConstantColour);
  for (const Bin &B : Bins)
    Out += fmt::format("<li><span class=\"swatch\" style=\"background:{}\">"
                       "</span>{}</li>\n",
                       B.Colour, B.Label);
  Out += "<li>square: reset; diamond: overwrite of a bit; disc: discard at the "
         "end; dashed outline: only an interval is known (the colour is its "
         "upper end)</li>\n</ul>\n";
  return Out;
}

//===-- The energy-time frontier ------------------------------------------===//

namespace {

constexpr double FrameX = 90, FrameY = 16, FrameWidth = 520, FrameHeight = 300;

/// A decade range [Lo, Hi] covering positive values, at least one decade.
struct LogRange {
  int Lo = 0, Hi = 1;
  bool Any = false;
  void cover(double V) {
    if (!(V > 0) || !std::isfinite(V))
      return;
    int L = int(std::floor(std::log10(V))), H = int(std::ceil(std::log10(V)));
    if (!Any) {
      Lo = L;
      Hi = H;
      Any = true;
    }
    Lo = std::min(Lo, L);
    Hi = std::max(Hi, H);
  }
  void finish() {
    if (Hi <= Lo)
      Hi = Lo + 1;
  }
  double frac(double V) const { return (std::log10(V) - Lo) / (Hi - Lo); }
};

struct Frame {
  LogRange X, Y;
  double x(double E) const { return FrameX + X.frac(E) * FrameWidth; }
  double y(double T) const { return FrameY + (1 - Y.frac(T)) * FrameHeight; }
};

bool plottable(double V) { return V > 0 && std::isfinite(V); }

std::string point(const Frame &F, const char *Class, const char *Model,
                  double E, double T, const std::string &Label) {
  return fmt::format(
      "<circle class=\"{}\" data-model=\"{}\" "
      "data-energy-j=\"{}\" data-time-s=\"{}\" cx=\"{}\" "
      "cy=\"{}\" r=\"{}\"><title>{}: {} J, {} s</title>"
      "</circle>\n",
      Class, Model, exact(E), exact(T), px(F.x(E)), px(F.y(T)),
      std::string_view(Class).find("given") != std::string::npos ? "5.5" : "3",
      Label, figure(E), figure(T));
}

/// Decade grid lines and labels 10^k, every `Step` decades.
std::string grid(const Frame &F) {
  std::string Out;
  int StepX = std::max(1, (F.X.Hi - F.X.Lo + 7) / 8);
  int StepY = std::max(1, (F.Y.Hi - F.Y.Lo + 7) / 8);
  for (int K = F.X.Lo; K <= F.X.Hi; K += StepX) {
    double X = FrameX + double(K - F.X.Lo) / (F.X.Hi - F.X.Lo) * FrameWidth;
    Out += fmt::format("<line class=\"grid\" x1=\"{0}\" y1=\"{1}\" x2=\"{0}\" "
                       "y2=\"{2}\"/><text class=\"tick-label\" x=\"{0}\" "
                       "y=\"{3}\">10<tspan class=\"exp\" dy=\"-6\">{4}</tspan>"
                       "</text>\n",
                       px(X), px(FrameY), px(FrameY + FrameHeight),
                       px(FrameY + FrameHeight + 18), K);
  }
  for (int K = F.Y.Lo; K <= F.Y.Hi; K += StepY) {
    double Y =
        FrameY + (1 - double(K - F.Y.Lo) / (F.Y.Hi - F.Y.Lo)) * FrameHeight;
    Out += fmt::format("<line class=\"grid\" x1=\"{0}\" y1=\"{1}\" x2=\"{2}\" "
                       "y2=\"{1}\"/><text class=\"tick-label y\" x=\"{3}\" "
                       "y=\"{4}\">10<tspan class=\"exp\" dy=\"-6\">{5}</tspan>"
                       "</text>\n",
                       px(FrameX), px(Y), px(FrameX + FrameWidth),
                       px(FrameX - 6), px(Y + 4), K);
  }
  return Out;
}

} // namespace

std::string energyFrontier(const CircuitReport &C) {
  const analysis::SpeedBounds &B = C.Speed.Bounds;
  const analysis::EnergyOptions &E = C.Speed.Energy;
  const std::vector<analysis::FrontierPoint> &P = C.Speed.Frontier.Points;
  if (!(B.ActionJs > 0) || P.empty())
    return {};
  Frame F;
  for (const analysis::FrontierPoint &Q : P) {
    F.X.cover(Q.EnergyJ);
    F.Y.cover(Q.PooledTimeS);
    F.Y.cover(Q.PerQubitTimeS);
  }
  // The given points, with the model each belongs to.
  struct Given {
    const char *Model;
    double EnergyJ, TimeS;
    std::string Label;
  };
  std::vector<Given> Marks;
  if (E.EnergyJ && B.PooledTimeS)
    Marks.push_back(
        {"pooled", *E.EnergyJ, *B.PooledTimeS, "pooled time at --energy"});
  if (E.EnergyPerQubitJ && B.PerQubitTimeS)
    Marks.push_back({"per_qubit", *E.EnergyPerQubitJ, *B.PerQubitTimeS,
                     "per-qubit time at --energy-per-qubit"});
  if (E.TargetTimeS && B.PooledEnergyForTargetJ)
    Marks.push_back({"pooled", *B.PooledEnergyForTargetJ, *E.TargetTimeS,
                     "least pooled energy for --target-time"});
  if (E.TargetTimeS && B.PerQubitEnergyForTargetJ)
    Marks.push_back({"per_qubit", *B.PerQubitEnergyForTargetJ, *E.TargetTimeS,
                     "least per-qubit energy for --target-time"});
  std::optional<double> DeviceS;
  if (C.Speed.Device && plottable(C.Speed.Device->ScheduleS)) {
    DeviceS = C.Speed.Device->ScheduleS;
    F.Y.cover(*DeviceS);
    // The bound the device is compared with (per qubit when given).
    if (C.Speed.Device->BoundS) {
      bool PerQubit = B.PerQubitTimeS.has_value();
      double At = PerQubit ? *E.EnergyPerQubitJ : *E.EnergyJ;
      Marks.push_back({"device", At, *DeviceS,
                       PerQubit ? "device schedule, at --energy-per-qubit"
                                : "device schedule, at --energy"});
    }
  }
  for (const Given &G : Marks) {
    F.X.cover(G.EnergyJ);
    F.Y.cover(G.TimeS);
  }
  F.X.finish();
  F.Y.finish();
  std::string Out = fmt::format(
      "<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"plot frontier\" "
      "viewBox=\"0 0 640 372\" width=\"640\" height=\"372\" role=\"img\" "
      "data-x-log10-min=\"{}\" data-x-log10-max=\"{}\" data-y-log10-min=\"{}\" "
      "data-y-log10-max=\"{}\" data-frame-x=\"{}\" data-frame-y=\"{}\" "
      "data-frame-width=\"{}\" data-frame-height=\"{}\">\n"
      "<title>Least time against energy</title>\n",
      F.X.Lo, F.X.Hi, F.Y.Lo, F.Y.Hi, px(FrameX), px(FrameY), px(FrameWidth),
      px(FrameHeight));
  Out += fmt::format("<rect class=\"frame\" x=\"{}\" y=\"{}\" width=\"{}\" "
                     "height=\"{}\"/>\n",
                     px(FrameX), px(FrameY), px(FrameWidth), px(FrameHeight));
  Out += grid(F);
  if (DeviceS)
    Out += fmt::format("<line class=\"device-line\" data-time-s=\"{}\" "
                       "x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\"/>\n",
                       exact(*DeviceS), px(FrameX), px(F.y(*DeviceS)),
                       px(FrameX + FrameWidth), px(F.y(*DeviceS)));
  for (const char *Model : {"pooled", "per_qubit"}) {
    bool Pooled = Model == std::string_view("pooled");
    // Energies far out (an --energy near the largest double) can make a
    // sample overflow; such a sample is left out of the plot, not drawn.
    auto timeOf = [&](const analysis::FrontierPoint &Q) {
      return Pooled ? Q.PooledTimeS : Q.PerQubitTimeS;
    };
    std::string Points;
    for (const analysis::FrontierPoint &Q : P)
      if (plottable(Q.EnergyJ) && plottable(timeOf(Q)))
        Points += fmt::format("{}{},{}", Points.empty() ? "" : " ",
                              px(F.x(Q.EnergyJ)), px(F.y(timeOf(Q))));
    Out += fmt::format("<polyline class=\"line {}\" points=\"{}\"/>\n", Model,
                       Points);
    for (const analysis::FrontierPoint &Q : P)
      if (plottable(Q.EnergyJ) && plottable(timeOf(Q)))
        Out += point(F, Pooled ? "point pooled" : "point per_qubit", Model,
                     Q.EnergyJ, timeOf(Q), Pooled ? "pooled" : "per qubit");
  }
  for (const Given &G : Marks)
    if (plottable(G.EnergyJ) && plottable(G.TimeS))
      Out += point(F,
                   G.Model == std::string_view("device")   ? "given device"
                   : G.Model == std::string_view("pooled") ? "given pooled"
                                                           : "given per_qubit",
                   G.Model, G.EnergyJ, G.TimeS, G.Label);
  Out +=
      fmt::format("<text class=\"axis-title\" x=\"{}\" y=\"{}\">energy "
                  "(J): the whole machine's (pooled) or each qubit's "
                  "(per qubit)</text>\n",
                  px(FrameX + FrameWidth / 2), px(FrameY + FrameHeight + 44));
  Out += fmt::format("<text class=\"axis-title\" transform=\"translate({},{}) "
                     "rotate(-90)\">least time (s)</text>\n",
                     px(22), px(FrameY + FrameHeight / 2));
  Out += "</svg>\n";
  return Out;
}

std::string frontierLegend(const CircuitReport &C) {
  std::string Out = "<ul class=\"legend\">\n";
  Out += "<li><span class=\"swatch pooled\"></span>pooled: T = action / E, one "
         "budget E for the whole machine</li>\n";
  Out += "<li><span class=\"swatch per_qubit\"></span>per qubit: T = path "
         "action / E, every qubit holding E</li>\n";
  Out +=
      "<li><span class=\"swatch given\"></span>large marks: the times at "
      "the energies given, and the least energies for the target time</li>\n";
  if (C.Speed.Device)
    Out += "<li><span class=\"swatch device\"></span>dashed: the device's "
           "schedule under the given durations</li>\n";
  if (C.Speed.Energy.SpreadJ)
    Out +=
        "<li>with --energy-spread the given times include the "
        "Mandelstam&#8211;Tamm bound, so they may lie above the lines</li>\n";
  Out += "</ul>\n";
  return Out;
}

} // namespace revbound::report::markup
