//===- HtmlWriterTest.cpp - The HTML page, read back as strict XML --------===//
//
// The page is parsed with libxml2 as XML 1.0 (W3C Recommendation, fifth
// edition, 2008): it must be well-formed, so HTML and XML readers agree on
// it. Then its marks are read back: each carries the report value it stands
// for, and its position on the plot maps back to that value. Expected values:
//  - the action of an orthogonal step is pi hbar / 2 = h / 4 and pooled
//    T = action / E (Margolus & Levitin, Physica D 120, 188 (1998);
//    h = 6.62607015e-34 J s exact, SI Brochure, 9th edition, 2019);
//  - layers from the as-soon-as-possible schedule (common practice), as
//    derived in each test;
//  - escaping: XML 1.0 section 2.4 (& and < must be escaped in text, " in
//    attributes), section 2.2 (the characters allowed; no C0 control but
//    tab, newline, return); bytes that are not UTF-8 become U+FFFD (Unicode
//    15.0, section 3.9, "U+FFFD substitution").
//
//===----------------------------------------------------------------------===//
#include "revbound/report/HtmlWriter.h"
#include "TestSupport.h"
#include "revbound/report/Writers.h"

#include <gtest/gtest.h>
#include <libxml/parser.h>
#include <libxml/xpath.h>
#include <libxml/xpathInternals.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <cstdlib>
#include <string>
#include <vector>

using namespace revbound;

namespace {

constexpr double H = 6.62607015e-34; // J s, exact (SI 2019)

/// A page parsed as strict XML, with XPath over it (prefixes h for XHTML,
/// s for SVG).
class Page {
public:
  explicit Page(const std::string &Text) {
    xmlSetStructuredErrorFunc(this, [](void *Self, xmlErrorPtr E) {
      static_cast<Page *>(Self)->Errors += E && E->message ? E->message : "?";
    });
    Doc = xmlReadMemory(Text.data(), int(Text.size()), "page.html", "UTF-8",
                        XML_PARSE_NONET);
    xmlSetStructuredErrorFunc(nullptr, nullptr);
  }
  ~Page() { xmlFreeDoc(Doc); }
  Page(const Page &) = delete;
  Page &operator=(const Page &) = delete;

  bool ok() const { return Doc && Errors.empty(); }
  std::string Errors;

  std::vector<xmlNodePtr> select(const std::string &Path) const {
    std::vector<xmlNodePtr> Out;
    xmlXPathContextPtr Ctx = xmlXPathNewContext(Doc);
    xmlXPathRegisterNs(Ctx, BAD_CAST "h",
                       BAD_CAST "http://www.w3.org/1999/xhtml");
    xmlXPathRegisterNs(Ctx, BAD_CAST "s",
                       BAD_CAST "http://www.w3.org/2000/svg");
    xmlXPathObjectPtr R = xmlXPathEvalExpression(BAD_CAST Path.c_str(), Ctx);
    if (R && R->nodesetval)
      for (int I = 0; I < R->nodesetval->nodeNr; ++I)
        Out.push_back(R->nodesetval->nodeTab[I]);
    xmlXPathFreeObject(R);
    xmlXPathFreeContext(Ctx);
    return Out;
  }

  static std::string attr(xmlNodePtr N, const char *Name) {
    xmlChar *V = xmlGetProp(N, BAD_CAST Name);
    std::string S = V ? reinterpret_cast<const char *>(V) : "";
    xmlFree(V);
    return S;
  }
  static double number(xmlNodePtr N, const char *Name) {
    return std::strtod(attr(N, Name).c_str(), nullptr);
  }
  static std::string text(xmlNodePtr N) {
    xmlChar *V = xmlNodeGetContent(N);
    std::string S = V ? reinterpret_cast<const char *>(V) : "";
    xmlFree(V);
    return S;
  }

private:
  xmlDocPtr Doc = nullptr;
};

std::optional<report::CircuitReport>
analyze(const std::string &Text, const report::AnalysisOptions &Opts = {}) {
  return test::analyzeText("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n" + Text,
                           Opts);
}

/// A report with energies, a target time and durations, and erasures of
/// every kind.
report::Report fullReport() {
  report::AnalysisOptions Opts;
  Opts.Energy.EnergyJ = 1e-20;
  Opts.Energy.EnergyPerQubitJ = 1e-21;
  Opts.Energy.TargetTimeS = 1e-9;
  config::Durations D;
  D.DefaultSeconds = 50e-9;
  D.Seconds["cx"] = 300e-9;
  Opts.Durations = D;
  report::Report R;
  auto A = analyze("//! ancilla a\nqreg q[2];\nqreg a[1];\ncreg c[1];\n"
                   "h q[0];\ncx q[0],q[1];\nreset q[1];\ncx q[0],a[0];\n"
                   "measure q[0] -> c[0];\nh q[0];\nmeasure q[0] -> c[0];\n"
                   "t q[1];\n",
                   Opts);
  auto B = analyze("qreg q[2];\nh q[0];\ncx q[0],q[1];\n");
  if (A && B) {
    R.Circuits.push_back(std::move(*A));
    R.Circuits.push_back(std::move(*B));
  }
  return R;
}

} // namespace

TEST(HtmlWriter, ParsesAsStrictXmlAndNeedsNothingElse) {
  report::Report R = fullReport();
  ASSERT_EQ(R.Circuits.size(), 2u);
  std::string Html = report::writeHtml(R);
  Page P(Html);
  ASSERT_TRUE(P.ok()) << P.Errors;
  EXPECT_EQ(Html, report::writeHtml(R)); // same report, same bytes
  EXPECT_EQ(Html.rfind("<!DOCTYPE html>\n", 0), 0u);
  EXPECT_EQ(P.select("/h:html/h:head/h:style").size(), 1u);
  // Self-contained: no script, no event handler, no link or source outside
  // the page.
  EXPECT_TRUE(P.select("//h:script | //s:script").empty());
  EXPECT_TRUE(P.select("//@*[starts-with(name(), 'on')]").empty());
  EXPECT_TRUE(P.select("//@src").empty());
  EXPECT_TRUE(P.select("//h:link").empty());
  for (xmlNodePtr N : P.select("//@href"))
    EXPECT_EQ(Page::text(N).rfind("#", 0), 0u) << Page::text(N);
  EXPECT_EQ(Html.find("url("), std::string::npos);
  // One summary row per circuit, one section per circuit.
  std::vector<xmlNodePtr> Rows =
      P.select("//h:section[@id='summary']//h:tbody/h:tr");
  ASSERT_EQ(Rows.size(), 2u);
  EXPECT_EQ(P.select("//h:section[starts-with(@id, 'circuit-')]").size(), 2u);
  // The first row: 3 qubits; gates h, cx, cx, h, t = 5 (measurements and
  // resets are not gates, docs/metrics.md); the depth as in the report.
  std::vector<xmlNodePtr> Cells =
      P.select("//h:section[@id='summary']//h:tbody/h:tr[1]/h:td");
  ASSERT_GE(Cells.size(), 10u);
  EXPECT_EQ(Page::text(Cells[1]), "3");
  EXPECT_EQ(Page::text(Cells[2]), "5");
  EXPECT_EQ(Page::text(Cells[3]), std::to_string(R.Circuits[0].DepthAll));
  // Time columns appear because the first circuit has energies; the second
  // has none and shows a dash (U+2014).
  std::vector<xmlNodePtr> Second =
      P.select("//h:section[@id='summary']//h:tbody/h:tr[2]/h:td");
  ASSERT_EQ(Second.size(), Cells.size());
  EXPECT_EQ(Page::text(Second[10]), "\xE2\x80\x94");
  // Each circuit has the two plots (the second circuit has no erasures and
  // so no timeline), the path listing and the hotspot table.
  EXPECT_EQ(P.select("//s:svg[contains(@class, 'frontier')]").size(), 2u);
  EXPECT_EQ(P.select("//s:svg[contains(@class, 'timeline')]").size(), 1u);
  EXPECT_EQ(P.select("//h:ol[@class='path']").size(), 2u);
  EXPECT_EQ(P.select("//h:table[@class='hotspots']").size(), 1u);
}

TEST(HtmlWriter, FrontierMarksAreTheReportsNumbers) {
  // Four x gates: action 4 h/4 = h; three in a row on q[0]: path action
  // 3h/4 (each step on one qubit).
  report::AnalysisOptions Opts;
  Opts.Energy.EnergyJ = 1e-20;
  auto C = analyze("qreg q[2];\nx q[0];\nx q[0];\nx q[0];\nx q[1];\n", Opts);
  ASSERT_TRUE(C);
  report::Report R;
  R.Circuits.push_back(*C);
  Page P(report::writeHtml(R));
  ASSERT_TRUE(P.ok()) << P.Errors;
  std::vector<xmlNodePtr> Svg =
      P.select("//s:svg[contains(@class, 'frontier')]");
  ASSERT_EQ(Svg.size(), 1u);
  double X0 = Page::number(Svg[0], "data-frame-x");
  double Y0 = Page::number(Svg[0], "data-frame-y");
  double W = Page::number(Svg[0], "data-frame-width");
  double Ht = Page::number(Svg[0], "data-frame-height");
  double XLo = Page::number(Svg[0], "data-x-log10-min");
  double XHi = Page::number(Svg[0], "data-x-log10-max");
  double YLo = Page::number(Svg[0], "data-y-log10-min");
  double YHi = Page::number(Svg[0], "data-y-log10-max");
  const auto &Points = C->Speed.Frontier.Points;
  for (const char *Model : {"pooled", "per_qubit"}) {
    std::vector<xmlNodePtr> Marks =
        P.select(std::string("//s:circle[@class='point ") + Model + "']");
    ASSERT_EQ(Marks.size(), Points.size()) << Model;
    bool Pooled = Model == std::string("pooled");
    for (size_t I = 0; I < Marks.size(); ++I) {
      double E = Page::number(Marks[I], "data-energy-j");
      double T = Page::number(Marks[I], "data-time-s");
      // The attributes are the report's doubles, to the bit.
      EXPECT_EQ(E, Points[I].EnergyJ);
      EXPECT_EQ(T, Pooled ? Points[I].PooledTimeS : Points[I].PerQubitTimeS);
      // Margolus-Levitin: T E = action (h pooled, 3h/4 per qubit).
      EXPECT_NEAR(T * E / (Pooled ? H : 0.75 * H), 1.0, 1e-12);
      // The position maps back to the values (coordinates have 2 decimals).
      double LogE = XLo + (Page::number(Marks[I], "cx") - X0) / W * (XHi - XLo);
      double LogT =
          YLo + (1 - (Page::number(Marks[I], "cy") - Y0) / Ht) * (YHi - YLo);
      EXPECT_NEAR(LogE, std::log10(E), 0.006 * (XHi - XLo) / W * 2);
      EXPECT_NEAR(LogT, std::log10(T), 0.006 * (YHi - YLo) / Ht * 2);
    }
  }
  // The time at the given energy is marked, with the report's time.
  std::vector<xmlNodePtr> Given = P.select("//s:circle[@class='given pooled']");
  ASSERT_EQ(Given.size(), 1u);
  EXPECT_EQ(Page::number(Given[0], "data-energy-j"), 1e-20);
  EXPECT_EQ(Page::number(Given[0], "data-time-s"),
            *C->Speed.Bounds.PooledTimeS);
  EXPECT_NEAR(Page::number(Given[0], "data-time-s") * 1e-20 / H, 1.0, 1e-12);
}

TEST(HtmlWriter, DeviceScheduleIsDrawnAtItsTime) {
  report::Report R = fullReport();
  ASSERT_EQ(R.Circuits.size(), 2u);
  ASSERT_TRUE(R.Circuits[0].Speed.Device);
  Page P(report::writeHtml(R));
  ASSERT_TRUE(P.ok()) << P.Errors;
  std::vector<xmlNodePtr> Line = P.select("//s:line[@class='device-line']");
  ASSERT_EQ(Line.size(), 1u);
  EXPECT_EQ(Page::number(Line[0], "data-time-s"),
            R.Circuits[0].Speed.Device->ScheduleS);
  // Compared with the per-qubit bound, so marked at --energy-per-qubit.
  std::vector<xmlNodePtr> Mark = P.select("//s:circle[@class='given device']");
  ASSERT_EQ(Mark.size(), 1u);
  EXPECT_EQ(Page::number(Mark[0], "data-energy-j"), 1e-21);
  // The target time's least energies lie on the lines: E = action / T.
  std::vector<xmlNodePtr> Pooled =
      P.select("//s:circle[@class='given pooled']");
  ASSERT_EQ(Pooled.size(), 2u); // at --energy, and for --target-time
  EXPECT_EQ(Page::number(Pooled[1], "data-time-s"), 1e-9);
  EXPECT_NEAR(Page::number(Pooled[1], "data-energy-j") * 1e-9 /
                  R.Circuits[0].Speed.Bounds.ActionJs,
              1.0, 1e-12);
}

TEST(HtmlWriter, TimelinePlacesEventsAtTheirJsonLayers) {
  // h q[0] L0, cx q[0],q[1] L1, reset q[1] L2 (waits for the cx); the
  // ancilla, entangled with q[0] by cx q[0],a[0] (L2), is discarded after
  // the last layer: depth 3.
  auto C = analyze("//! ancilla a\nqreg q[2];\nqreg a[1];\nh q[0];\n"
                   "cx q[0],q[1];\nreset q[1];\ncx q[0],a[0];\n");
  ASSERT_TRUE(C);
  report::Report R;
  R.Circuits.push_back(*C);
  nlohmann::json J = nlohmann::json::parse(report::writeJson(R));
  uint64_t JsonReset = 99, JsonDiscard = 99;
  for (const nlohmann::json &X : J["circuits"][0]["erasures"]["list"]) {
    if (X["kind"] == "reset")
      JsonReset = X["layer"];
    if (X["kind"] == "discard")
      JsonDiscard = X["layer"];
  }
  EXPECT_EQ(JsonReset, 2u);
  EXPECT_EQ(J["circuits"][0]["depth"]["all"], 3);
  EXPECT_EQ(JsonDiscard, 3u);

  Page P(report::writeHtml(R));
  ASSERT_TRUE(P.ok()) << P.Errors;
  std::vector<xmlNodePtr> Svg =
      P.select("//s:svg[contains(@class, 'timeline')]");
  ASSERT_EQ(Svg.size(), 1u);
  double X0 = Page::number(Svg[0], "data-frame-x");
  double W = Page::number(Svg[0], "data-frame-width");
  double Slots = Page::number(Svg[0], "data-depth") + 1;
  auto layerAt = [&](xmlNodePtr N) {
    return (Page::number(N, "data-cx") - X0) / (W / Slots) - 0.5;
  };
  std::vector<xmlNodePtr> Reset = P.select("//s:*[@data-kind='reset']");
  ASSERT_EQ(Reset.size(), 1u);
  EXPECT_EQ(Page::attr(Reset[0], "data-layer"), std::to_string(JsonReset));
  EXPECT_EQ(Page::attr(Reset[0], "data-wire"), "q[1]");
  EXPECT_NEAR(layerAt(Reset[0]), 2.0, 0.01);
  // The reset's square is centred on its layer.
  EXPECT_NEAR(Page::number(Reset[0], "x") + Page::number(Reset[0], "width") / 2,
              Page::number(Reset[0], "data-cx"), 0.011);
  std::vector<xmlNodePtr> Discard = P.select("//s:*[@data-kind='discard']");
  ASSERT_EQ(Discard.size(), 1u);
  EXPECT_EQ(Page::attr(Discard[0], "data-layer"), "3");
  EXPECT_NEAR(layerAt(Discard[0]), 3.0, 0.01);
  EXPECT_EQ(Page::number(Discard[0], "cx"),
            Page::number(Discard[0], "data-cx"));
  // Both sit in the row of their wire.
  EXPECT_EQ(P.select("//s:g[@data-wire='q[1]']/s:*[@data-kind='reset']").size(),
            1u);
  EXPECT_EQ(
      P.select("//s:g[@data-wire='a[0]']/s:*[@data-kind='discard']").size(),
      1u);
}

TEST(HtmlWriter, EscapesHostileNames) {
  // A name with markup, quotes, an ampersand, a C0 control character, a byte
  // that is not UTF-8 and a CDATA end: none may break the page or add an
  // element.
  const std::string Hostile =
      "<script>alert(\"x\")</script>&amp;'\x01]]>\xff--.qasm";
  const std::string Expected =
      std::string("<script>alert(\"x\")</script>&amp;'") + "\xEF\xBF\xBD" +
      "]]>" + "\xEF\xBF\xBD" + "--.qasm";
  report::CircuitReport C;
  C.File = Hostile;
  C.Granularity = "native";
  C.DepthAll = 1;
  report::ErasureEntry X;
  X.Kind = "reset";
  X.Wire = "q<1>[0]";
  X.At = {Hostile, 3, 1};
  X.Status = "exact";
  X.BitsLow = X.BitsHigh = 1;
  C.Erasures.List.push_back(X);
  C.Erasures.Hotspots.push_back({Hostile, 3, 1, 1, 1});
  C.Erasures.Engine = "structural";
  report::PathStep S;
  S.Gate = "h\"><b>";
  S.Wires = {"q[0]"};
  S.At = {Hostile, 3, 1};
  C.Path.Listed.push_back(S);
  C.Path.Steps = 1;
  C.Warnings.push_back(
      {"warning", {Hostile, 1, 1}, "message with <tags> & \x02"});
  report::Report R;
  R.Circuits.push_back(C);
  std::string Html = report::writeHtml(R);
  Page P(Html);
  ASSERT_TRUE(P.ok()) << P.Errors;
  EXPECT_EQ(Html.find("<script"), std::string::npos);
  EXPECT_EQ(Html.find("<b>"), std::string::npos);
  EXPECT_TRUE(P.select("//h:script | //h:b").empty());
  std::vector<xmlNodePtr> Title = P.select("//h:section[@id='circuit-1']/h:h2");
  ASSERT_EQ(Title.size(), 1u);
  EXPECT_EQ(Page::text(Title[0]), Expected);
  EXPECT_EQ(Page::text(P.select("/h:html/h:head/h:title")[0]),
            "revbound report: " + Expected);
  std::vector<xmlNodePtr> Mark = P.select("//s:*[@data-kind='reset']");
  ASSERT_EQ(Mark.size(), 1u);
  EXPECT_EQ(Page::attr(Mark[0], "data-wire"), "q<1>[0]");
  std::vector<xmlNodePtr> Hot =
      P.select("//h:table[@class='hotspots']//h:code");
  ASSERT_EQ(Hot.size(), 1u);
  EXPECT_EQ(Page::text(Hot[0]), Expected + ":3");
  std::vector<xmlNodePtr> Step = P.select("//h:ol[@class='path']/h:li/h:code");
  ASSERT_EQ(Step.size(), 1u);
  EXPECT_EQ(Page::text(Step[0]), "h\"><b>");
}

TEST(HtmlWriter, NoErasuresNoActionStillAPage) {
  // An empty circuit: no events, no step takes time; the page says so
  // instead of drawing empty plots.
  auto C = analyze("qreg q[1];\n");
  ASSERT_TRUE(C);
  report::Report R;
  R.Circuits.push_back(*C);
  Page P(report::writeHtml(R));
  ASSERT_TRUE(P.ok()) << P.Errors;
  EXPECT_TRUE(P.select("//s:svg").empty());
  EXPECT_EQ(
      P.select("//h:section[@id='circuit-1']//h:p[@class='facts']").size(),
      5u); // sizes, no erasures, no time, the path, no hotspots
}
