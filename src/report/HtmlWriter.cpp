//===- HtmlWriter.cpp - The report as one self-contained HTML page -------===//
#include "revbound/report/HtmlWriter.h"

#include "SvgPlot.h"

#include "revbound/support/Text.h"

#include <fmt/format.h>

namespace revbound::report {

using markup::figure;

namespace {

constexpr unsigned MaxTimelineWires = 48, MaxTimelineMarks = 4000;
constexpr unsigned MaxHotspots = 20;

// Our own palette: warm paper, dark ink, teal and plum for the two energy
// models, ochre for the device, a sand-to-rust ramp for erased bits. No
// character here needs escaping in XML text.
constexpr const char *Style = R"(
:root { --ink: #23262d; --muted: #5d6470; --paper: #f7f5f0; --card: #fffdf8;
  --rule: #ddd6c8; --pooled: #1d6f72; --perq: #7b3f8c; --device: #b5780f; }
* { box-sizing: border-box; }
body { margin: 0; padding: 1.5rem 2rem 3rem; background: var(--paper);
  color: var(--ink); font: 15px/1.45 system-ui, sans-serif; }
h1 { font-size: 1.5rem; margin: 0 0 0.2rem; letter-spacing: 0.01em; }
h2 { font-size: 1.2rem; margin: 0 0 0.6rem; word-break: break-all; }
h3 { font-size: 1rem; margin: 1.2rem 0 0.4rem; color: var(--muted);
  text-transform: lowercase; font-variant: small-caps; letter-spacing: 0.04em; }
.lede { color: var(--muted); margin: 0 0 1.4rem; }
section.card { background: var(--card); border: 1px solid var(--rule);
  border-left: 6px solid var(--pooled); border-radius: 4px;
  padding: 1rem 1.3rem; margin: 0 0 1.4rem; }
table { border-collapse: collapse; font-variant-numeric: tabular-nums; }
th, td { padding: 0.25rem 0.7rem; border-bottom: 1px solid var(--rule);
  text-align: right; vertical-align: top; }
th { font-weight: 600; color: var(--muted); font-size: 0.85rem; }
td { white-space: nowrap; }
td.name, th.name { text-align: left; white-space: normal; min-width: 14em;
  overflow-wrap: anywhere; }
.scroll { overflow-x: auto; }
.facts { color: var(--muted); margin: 0 0 0.5rem; }
svg.plot { display: block; max-width: 100%; height: auto; background: #fff;
  border: 1px solid var(--rule); border-radius: 3px; }
svg text { font: 11px system-ui, sans-serif; fill: var(--ink); }
svg .tick-label { text-anchor: middle; fill: var(--muted); }
svg .tick-label.y { text-anchor: end; }
svg .exp { font-size: 8px; }
svg .axis-title { text-anchor: middle; fill: var(--muted); font-size: 12px; }
svg .wire-label { text-anchor: end; font-family: ui-monospace, monospace; }
svg .wire { stroke: #cfc8b9; stroke-width: 1; }
svg .axis, svg .tick, svg .frame { stroke: #8b8475; fill: none; }
svg .grid { stroke: #ece7dc; }
svg .end-slot { fill: #f2efe8; }
svg .erasure { stroke: #3b2a20; stroke-width: 0.8; }
svg .erasure.open { stroke-dasharray: 2 1.5; }
svg .line { fill: none; stroke-width: 2; }
svg .line.pooled { stroke: var(--pooled); }
svg .line.per_qubit { stroke: var(--perq); stroke-dasharray: 6 3; }
svg .point.pooled { fill: var(--pooled); }
svg .point.per_qubit { fill: var(--perq); }
svg .given { stroke: var(--ink); stroke-width: 1.5; }
svg .given.pooled { fill: var(--pooled); }
svg .given.per_qubit { fill: var(--perq); }
svg .given.device { fill: var(--device); }
svg .device-line { stroke: var(--device); stroke-width: 1.5; stroke-dasharray: 3 3; }
ul.legend { list-style: none; padding: 0; margin: 0.4rem 0 0; color: var(--muted);
  font-size: 0.85rem; }
ul.legend li { display: inline-block; margin: 0 1.1rem 0.2rem 0; }
.swatch { display: inline-block; width: 0.9em; height: 0.9em; margin-right: 0.35em;
  vertical-align: -0.1em; border: 1px solid #3b2a20; }
.swatch.pooled { background: var(--pooled); }
.swatch.per_qubit { background: var(--perq); }
.swatch.given { background: #fff; border-radius: 50%; border-width: 2px; }
.swatch.device { background: var(--device); }
ol.path { margin: 0; padding-left: 2.2rem; font-size: 0.9rem; }
ol.path code, td code { font-family: ui-monospace, monospace; }
.where { color: var(--muted); }
.note { color: var(--muted); font-size: 0.85rem; }
footer { color: var(--muted); font-size: 0.85rem; margin-top: 2rem; }
)";

std::string bitsText(double Low, double High) {
  return Low == High ? figure(Low) : figure(Low) + "&#8211;" + figure(High);
}

std::string orDash(const std::optional<double> &V) {
  return V ? figure(*V) : std::string("&#8212;");
}

std::string where(const SourcePoint &P) {
  return fmt::format("{}:{}:{}", xmlEscape(P.File), P.Line, P.Column);
}

void summaryTable(const Report &R, std::string &Out) {
  bool Times = false, Device = false;
  for (const CircuitReport &C : R.Circuits) {
    Times |= C.Speed.Bounds.PooledTimeS || C.Speed.Bounds.PerQubitTimeS;
    Device |= C.Speed.Device.has_value();
  }
  Out += "<section class=\"card\" id=\"summary\">\n<h2>Summary</h2>\n"
         "<div class=\"scroll\"><table>\n<thead><tr><th class=\"name\">circuit"
         "</th><th>qubits</th><th>gates</th><th>depth</th><th>two-qubit depth"
         "</th><th>T-count</th><th>erasure events</th><th>entropy (bits)</th>"
         "<th>heat (J)</th><th>action (J s)</th>";
  if (Times)
    Out += "<th>pooled time (s)</th><th>per-qubit time (s)</th>";
  if (Device)
    Out += "<th>device schedule (s)</th>";
  Out += "</tr></thead>\n<tbody>\n";
  for (size_t I = 0; I < R.Circuits.size(); ++I) {
    const CircuitReport &C = R.Circuits[I];
    const ErasureReport &E = C.Erasures;
    Out += fmt::format(
        "<tr><td class=\"name\"><a href=\"#circuit-{}\">{}</a></td><td>{}</td>"
        "<td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td>"
        "<td>{}</td><td>{}</td>",
        I + 1, xmlEscape(C.File), C.Qubits, C.Ops.Gates, C.DepthAll,
        C.DepthTwoQubit, C.Ops.TCount, E.Events,
        bitsText(E.Entropy.Low, E.Entropy.High),
        bitsText(E.HeatLowJ, E.HeatHighJ), figure(C.Speed.Bounds.ActionJs));
    if (Times)
      Out += fmt::format("<td>{}</td><td>{}</td>",
                         orDash(C.Speed.Bounds.PooledTimeS),
                         orDash(C.Speed.Bounds.PerQubitTimeS));
    if (Device)
      Out += fmt::format("<td>{}</td>", C.Speed.Device
                                            ? figure(C.Speed.Device->ScheduleS)
                                            : std::string("&#8212;"));
    Out += "</tr>\n";
  }
  Out += "</tbody></table></div>\n</section>\n";
}

void pathListing(const CriticalPath &P, std::string &Out) {
  Out += fmt::format("<h3>Critical path</h3>\n<p class=\"facts\">{} steps over "
                     "{} layers, {}.</p>\n",
                     P.Steps, P.Length,
                     P.Method == "dag" ? "through the leaf graph"
                                       : "over top-level operations");
  if (P.Listed.empty())
    return;
  Out += "<ol class=\"path\">\n";
  for (const PathStep &S : P.Listed) {
    std::string Wires;
    for (const std::string &W : S.Wires)
      Wires += (Wires.empty() ? "" : ", ") + xmlEscape(W);
    Out += fmt::format("<li><code>{}</code> {} <span class=\"where\">{}",
                       xmlEscape(S.Gate), Wires, where(S.At));
    if (S.Inside.Line != 0)
      Out += fmt::format(", in the body at {}", where(S.Inside));
    Out += "</span></li>\n";
  }
  Out += "</ol>\n";
  if (P.Steps > P.Listed.size())
    Out += fmt::format("<p class=\"note\">{} more steps are not listed.</p>\n",
                       P.Steps - P.Listed.size());
}

void hotspotTable(const ErasureReport &E, std::string &Out) {
  Out += "<h3>Erasure hotspots</h3>\n";
  if (E.Hotspots.empty()) {
    Out += "<p class=\"facts\">No erasure events.</p>\n";
    return;
  }
  Out += "<div class=\"scroll\"><table class=\"hotspots\">\n<thead><tr><th "
         "class=\"name\">where</th><th>events</th><th>bits (sum)</th></tr>"
         "</thead>\n<tbody>\n";
  unsigned Shown = 0;
  for (const ErasureHotspot &H : E.Hotspots) {
    if (Shown++ == MaxHotspots)
      break;
    Out += fmt::format("<tr><td class=\"name\"><code>{}:{}</code></td><td>{}"
                       "</td><td>{}</td></tr>\n",
                       xmlEscape(H.File), H.Line, H.Events,
                       bitsText(H.BitsLow, H.BitsHigh));
  }
  Out += "</tbody></table></div>\n";
  if (E.Hotspots.size() > MaxHotspots)
    Out += fmt::format("<p class=\"note\">{} more lines erase less.</p>\n",
                       E.Hotspots.size() - MaxHotspots);
  Out += "<p class=\"note\">Line 0: a role given on the command line. A "
         "discard is charged at the last operation on its qubit.</p>\n";
}

void ancillaList(const ErasureReport &E, std::string &Out) {
  if (E.Ancillas.empty())
    return;
  Out += "<h3>Ancillas</h3>\n<ul>\n";
  for (const AncillaEntry &A : E.Ancillas) {
    const char *Verdict = !A.Clean   ? "not decided"
                          : *A.Clean ? "returns to |0&#10217;"
                                     : "left dirty";
    Out += fmt::format("<li><code>{}</code> {}", xmlEscape(A.Wire), Verdict);
    if (A.HasCounterexample) {
      std::string Inputs;
      for (const auto &[Register, Bits] : A.Counterexample)
        Inputs += fmt::format("{}{} = {}", Inputs.empty() ? "" : ", ",
                              xmlEscape(Register), xmlEscape(Bits));
      Out += fmt::format(" (ends at 1 for input {})",
                         Inputs.empty() ? std::string("none") : Inputs);
    }
    Out += "</li>\n";
  }
  Out += "</ul>\n";
}

void circuitSection(const CircuitReport &C, size_t Index, std::string &Out) {
  const ErasureReport &E = C.Erasures;
  Out +=
      fmt::format("<section class=\"card\" id=\"circuit-{}\">\n<h2>{}</h2>\n",
                  Index + 1, xmlEscape(C.File));
  Out += fmt::format("<p class=\"facts\">{} qubits, {} classical bits; {} "
                     "leaves; engine {}; {} K.</p>\n",
                     C.Qubits, C.Clbits, xmlEscape(C.Granularity),
                     xmlEscape(E.Engine), figure(E.TemperatureK));
  Out += "<h3>Erasure timeline</h3>\n";
  std::string Timeline =
      markup::erasureTimeline(C, MaxTimelineWires, MaxTimelineMarks);
  if (Timeline.empty()) {
    Out += "<p class=\"facts\">No erasure events: this circuit erases "
           "nothing that the engine could see.</p>\n";
  } else {
    Out += "<div class=\"scroll\">\n" + Timeline + "</div>\n";
    Out += markup::timelineLegend();
  }
  Out += "<h3>Energy and least time</h3>\n";
  std::string Plot = markup::energyFrontier(C);
  if (Plot.empty()) {
    Out += "<p class=\"facts\">No step takes time (the action is 0 J s), so "
           "every time bound is 0 s.</p>\n";
  } else {
    Out += fmt::format(
        "<p class=\"facts\">action {} J s; path action {} J s; "
        "lines sampled around {}.</p>\n",
        figure(C.Speed.Bounds.ActionJs), figure(C.Speed.Bounds.PathActionJs),
        C.Speed.Frontier.Anchor == analysis::FrontierAnchor::Default
            ? std::string("1 eV (no energy was given)")
            : figure(C.Speed.Frontier.AnchorJ) + " J");
    Out += "<div class=\"scroll\">\n" + Plot + "</div>\n";
    Out += markup::frontierLegend(C);
  }
  pathListing(C.Path, Out);
  hotspotTable(E, Out);
  ancillaList(E, Out);
  if (!C.Warnings.empty()) {
    Out += "<h3>Warnings</h3>\n<ul>\n";
    for (const Finding &F : C.Warnings)
      Out += fmt::format("<li><span class=\"where\">{}</span> {}</li>\n",
                         where(F.At), xmlEscape(F.Message));
    Out += "</ul>\n";
  }
  Out += "</section>\n";
}

} // namespace

std::string writeHtml(const Report &R) {
  std::string Out =
      "<!DOCTYPE html>\n<html xmlns=\"http://www.w3.org/1999/xhtml\" "
      "lang=\"en\" xml:lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n"
      "<meta name=\"viewport\" content=\"width=device-width, "
      "initial-scale=1\"/>\n";
  Out += fmt::format("<title>revbound report: {}</title>\n",
                     R.Circuits.size() == 1
                         ? xmlEscape(R.Circuits[0].File)
                         : fmt::format("{} circuits", R.Circuits.size()));
  Out += fmt::format("<style>{}</style>\n</head>\n<body>\n", Style);
  Out += fmt::format(
      "<header>\n<h1>revbound report</h1>\n<p class=\"lede\">{} "
      "circuit{}; the same numbers as <code>--format json</code> "
      "(schema {}).</p>\n</header>\n",
      R.Circuits.size(), R.Circuits.size() == 1 ? "" : "s", SchemaVersion);
  summaryTable(R, Out);
  for (size_t I = 0; I < R.Circuits.size(); ++I)
    circuitSection(R.Circuits[I], I, Out);
  Out += "<footer>Every physics figure on this page is a lower bound from "
         "physics (Landauer; Margolus&#8211;Levitin, Mandelstam&#8211;Tamm), "
         "not a prediction for any hardware.</footer>\n</body>\n</html>\n";
  return Out;
}

} // namespace revbound::report
