//===- CheckWritersTest.cpp - SARIF, JUnit XML and Markdown of a check ----===//
//
// Structural checks against the formats' own definitions:
//  - SARIF: Static Analysis Results Interchange Format Version 2.1.0, OASIS
//    Standard, 27 March 2020. Section numbers are cited from memory of that
//    document, not looked up here.
//  - JUnit XML: no standard exists; the checks are XML 1.0 well-formedness
//    (W3C Recommendation, Fifth Edition, 26 November 2008) plus the element
//    and attribute names CI servers commonly read (common practice):
//    testsuites > testsuite[name, tests, failures] > testcase[classname,
//    name] > failure[message] | skipped.
//  - Markdown tables: GitHub Flavored Markdown Spec 0.29-gfm, section 4.10
//    "Tables (extension)".
//
//===----------------------------------------------------------------------===//
#include "revbound/policy/CheckWriters.h"

#include "TestSupport.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cctype>
#include <cstring>
#include <map>

namespace {

using namespace revbound;
using namespace revbound::policy;
using Json = nlohmann::json;

// t, cx, ccx and a reset of the input a[0]; anc ends dirty. Hand-derived
// metrics in VerdictTest.cpp: depth 4, 3 gates, 2 erasure events.
const char *Mixed = "OPENQASM 2.0;\n"
                    "include \"qelib1.inc\";\n"
                    "//! input a\n"
                    "//! ancilla anc\n"
                    "qreg a[2];\n"
                    "qreg anc[1];\n"
                    "t a[0];\n"
                    "cx a[0], a[1];\n"
                    "ccx a[0], a[1], anc[0];\n"
                    "reset a[0];\n";

/// A check of Mixed against: erasure_events <= 0 (fails), depth <= 4
/// (holds), gates <= 2 (fails), and 0% growth of depth over a baseline
/// that has no entry for the file (skipped).
CheckReport mixedCheck() {
  std::optional<report::CircuitReport> C = test::analyzeText(Mixed);
  EXPECT_TRUE(C);
  Budget B;
  B.File = "b.toml";
  B.Limits = {{Metric::ErasureEvents, Amount::count(0), {"b.toml", 2, 1}},
              {Metric::Depth, Amount::count(4), {"b.toml", 3, 1}},
              {Metric::Gates, Amount::count(2), {"b.toml", 4, 1}}};
  B.HasGrowthTable = true;
  B.GrowthTable = {"b.toml", 5, 1};
  B.Growth = {{Metric::Depth, 0, "0%", {"b.toml", 6, 1}}};
  Baseline Base;
  Base.Source = "base.json";
  Base.Circuits.emplace_back("elsewhere.qasm", MetricSet{});
  CheckOptions Opts;
  Opts.ToolVersion = "9.8.7";
  llvm::Expected<CheckReport> R = evaluate(B, {*C}, &Base, Opts);
  EXPECT_TRUE(bool(R));
  if (!R) {
    llvm::consumeError(R.takeError());
    return {};
  }
  return std::move(*R);
}

TEST(SarifWriter, RequiredPropertiesOfTheLog) {
  CheckReport R = mixedCheck();
  Json Log = Json::parse(writeCheckSarif(R));
  // 3.13.2 version: "2.1.0"; 3.13.3 $schema: a URI of the schema;
  // 3.13.4 runs: an array.
  EXPECT_EQ(Log["version"], "2.1.0");
  EXPECT_EQ(Log["$schema"], "https://docs.oasis-open.org/sarif/sarif/v2.1.0/os/"
                            "schemas/sarif-schema-2.1.0.json");
  ASSERT_TRUE(Log["runs"].is_array());
  ASSERT_EQ(Log["runs"].size(), 1u);
  const Json &Run = Log["runs"][0];
  // 3.14.6 run.tool (required); 3.18.2 tool.driver (required); 3.19.8
  // toolComponent.name (required).
  const Json &Driver = Run["tool"]["driver"];
  EXPECT_EQ(Driver["name"], "revbound");
  EXPECT_EQ(Driver["version"], "9.8.7");
  EXPECT_FALSE(Driver.contains("informationUri"));
  // 3.19.23 rules: reportingDescriptor objects, each with an id (3.49.3).
  ASSERT_TRUE(Driver["rules"].is_array());
  std::vector<std::string> Ids;
  for (const Json &Rule : Driver["rules"]) {
    ASSERT_TRUE(Rule["id"].is_string());
    Ids.push_back(Rule["id"]);
    EXPECT_FALSE(Rule["help"]["text"].get<std::string>().empty());
    EXPECT_FALSE(Rule["shortDescription"]["text"].get<std::string>().empty());
  }
  // A rule for every rule of the budget, failed or not.
  EXPECT_EQ(Ids,
            (std::vector<std::string>{"budget/erasure_events", "budget/depth",
                                      "growth/depth", "budget/gates"}));
}

TEST(SarifWriter, OneLocatedResultPerFailure) {
  CheckReport R = mixedCheck();
  Json Log = Json::parse(writeCheckSarif(R));
  const Json &Run = Log["runs"][0];
  const Json &Rules = Run["tool"]["driver"]["rules"];
  const Json &Results = Run["results"];
  ASSERT_TRUE(Results.is_array());
  ASSERT_EQ(Results.size(), 2u); // erasure_events and gates fail
  std::map<std::string, const Json *> ById;
  for (const Json &Result : Results) {
    // 3.27.5 ruleId; 3.27.6 ruleIndex, the index of that rule in
    // tool.driver.rules; 3.27.10 level; 3.27.11 message with text (3.11.8).
    std::string Id = Result["ruleId"];
    ById[Id] = &Result;
    unsigned Index = Result["ruleIndex"];
    ASSERT_LT(Index, Rules.size());
    EXPECT_EQ(Rules[Index]["id"], Id);
    EXPECT_EQ(Result["level"], "error");
    EXPECT_FALSE(Result["message"]["text"].get<std::string>().empty());
    // 3.27.12 locations; 3.28.3 physicalLocation; 3.29.3 artifactLocation
    // with a uri (3.4.3); 3.29.4 region, whose startLine (3.30.5) and
    // startColumn (3.30.6) are 1-based.
    ASSERT_TRUE(Result["locations"].is_array());
    ASSERT_FALSE(Result["locations"].empty());
    for (const Json &L : Result["locations"]) {
      const Json &P = L["physicalLocation"];
      EXPECT_EQ(P["artifactLocation"]["uri"], "test.qasm");
      if (P.contains("region")) {
        EXPECT_GE(P["region"]["startLine"].get<int>(), 1);
        EXPECT_GE(P["region"]["startColumn"].get<int>(), 1);
      }
    }
  }
  ASSERT_TRUE(ById.count("budget/erasure_events"));
  const Json &Events = *ById["budget/erasure_events"];
  EXPECT_EQ(Events["message"]["text"],
            "test.qasm: 2 erasure events, over the limit 0 events");
  // The reset on line 10 and the discard at the ccx of line 9.
  ASSERT_EQ(Events["locations"].size(), 2u);
  EXPECT_EQ(Events["locations"][0]["physicalLocation"]["region"]["startLine"],
            10);
  EXPECT_EQ(Events["locations"][0]["physicalLocation"]["region"]["startColumn"],
            1);
  EXPECT_EQ(Events["locations"][1]["physicalLocation"]["region"]["startLine"],
            9);
  // A gate count has no line: the location is the whole file, no region.
  ASSERT_TRUE(ById.count("budget/gates"));
  const Json &Gates = *ById["budget/gates"];
  ASSERT_EQ(Gates["locations"].size(), 1u);
  EXPECT_FALSE(Gates["locations"][0]["physicalLocation"].contains("region"));
  EXPECT_EQ(Gates["properties"]["value"], 3);
  EXPECT_EQ(Gates["properties"]["allowed"], 2);
}

TEST(SarifWriter, NoFailureMeansNoResult) {
  CheckReport R = mixedCheck();
  for (FileVerdict &F : R.Files)
    for (CheckResult &C : F.Checks)
      C.Status = CheckStatus::Passed;
  Json Log = Json::parse(writeCheckSarif(R));
  ASSERT_TRUE(Log["runs"][0]["results"].is_array());
  EXPECT_TRUE(Log["runs"][0]["results"].empty());
}

TEST(SarifWriter, PathsBecomeUriReferences) {
  // RFC 3986: unreserved characters (section 2.3) stay, others are
  // percent-encoded (2.1) with uppercase hex; a path with '/' is a valid
  // relative reference (4.2); absolute paths take the file scheme (RFC 8089).
  EXPECT_EQ(pathToUri("circuits/adder.qasm"), "circuits/adder.qasm");
  EXPECT_EQ(pathToUri("my circuits/a+b.qasm"), "my%20circuits/a%2Bb.qasm");
  EXPECT_EQ(pathToUri("/srv/ci/x.qasm"), "file:///srv/ci/x.qasm");
  EXPECT_EQ(pathToUri("<stdin>"), "%3Cstdin%3E");
  EXPECT_EQ(pathToUri("caf\xC3\xA9.qasm"), "caf%C3%A9.qasm"); // UTF-8 bytes
}

TEST(CheckWriters, OutputIsDeterministic) {
  CheckReport R = mixedCheck();
  EXPECT_EQ(writeCheckSarif(R), writeCheckSarif(R));
  EXPECT_EQ(writeCheckJunit(R), writeCheckJunit(R));
  EXPECT_EQ(writeCheckMarkdown(R), writeCheckMarkdown(R));
  EXPECT_EQ(writeCheckText(R), writeCheckText(R));
}

/// A minimal XML 1.0 reader, enough to check well-formedness of what the
/// JUnit writer emits: matched tags (section 3, "element type match"),
/// quoted attributes (3.1), no '<' or bare '&' in character data (2.4) or
/// attribute values (3.1, AttValue), only the predefined entities (4.6),
/// no control characters but tab, LF and CR (2.2).
struct XmlElement {
  std::string Name;
  std::map<std::string, std::string> Attributes;
  std::vector<XmlElement> Children;
  std::string Text;
};

class XmlReader {
public:
  explicit XmlReader(std::string T) : S(std::move(T)) {}

  /// The root element, or a failure with `Error` set.
  std::optional<XmlElement> read() {
    if (S.rfind("<?xml", 0) == 0)
      P = S.find("?>") + 2;
    skipSpace();
    std::optional<XmlElement> Root = element();
    skipSpace();
    if (Root && P != S.size())
      return fail("content after the root element");
    return Root;
  }
  std::string Error;

private:
  std::optional<XmlElement> fail(const std::string &Why) {
    if (Error.empty())
      Error = Why + " at byte " + std::to_string(P);
    return std::nullopt;
  }
  void skipSpace() {
    while (P < S.size() && std::isspace(static_cast<unsigned char>(S[P])))
      ++P;
  }
  std::string name() {
    size_t Start = P;
    while (P < S.size() && (std::isalnum(static_cast<unsigned char>(S[P])) ||
                            S[P] == '-' || S[P] == '_' || S[P] == ':'))
      ++P;
    return S.substr(Start, P - Start);
  }
  bool text(char Stop, std::string &Out) {
    while (P < S.size() && S[P] != Stop) {
      unsigned char C = S[P];
      if (C == '<' || (C < 0x20 && C != '\t' && C != '\n' && C != '\r'))
        return false;
      if (C == '&') {
        static const char *Entities[][2] = {{"&amp;", "&"},
                                            {"&lt;", "<"},
                                            {"&gt;", ">"},
                                            {"&quot;", "\""},
                                            {"&apos;", "'"}};
        bool Known = false;
        for (auto &E : Entities)
          if (S.compare(P, std::strlen(E[0]), E[0]) == 0) {
            Out += E[1];
            P += std::strlen(E[0]);
            Known = true;
            break;
          }
        if (!Known)
          return false;
        continue;
      }
      Out += S[P++];
    }
    return true;
  }
  std::optional<XmlElement> element() {
    if (P >= S.size() || S[P] != '<')
      return fail("expected '<'");
    ++P;
    XmlElement E;
    E.Name = name();
    if (E.Name.empty())
      return fail("expected an element name");
    for (;;) {
      skipSpace();
      if (S.compare(P, 2, "/>") == 0) {
        P += 2;
        return E;
      }
      if (P < S.size() && S[P] == '>') {
        ++P;
        break;
      }
      std::string Attribute = name();
      if (Attribute.empty() || P + 1 >= S.size() || S[P] != '=' ||
          S[P + 1] != '"')
        return fail("expected name=\"value\"");
      P += 2;
      std::string Value;
      if (!text('"', Value) || P >= S.size())
        return fail("bad attribute value");
      ++P;
      if (!E.Attributes.emplace(Attribute, Value).second)
        return fail("attribute given twice");
    }
    for (;;) {
      if (!text('<', E.Text) || P >= S.size())
        return fail("bad character data");
      if (S.compare(P, 2, "</") == 0) {
        P += 2;
        if (name() != E.Name || P >= S.size() || S[P] != '>')
          return fail("end tag does not match <" + E.Name + ">");
        ++P;
        return E;
      }
      std::optional<XmlElement> Child = element();
      if (!Child)
        return std::nullopt;
      E.Children.push_back(std::move(*Child));
    }
  }

  std::string S;
  size_t P = 0;
};

TEST(JunitWriter, SuitesCasesAndFailures) {
  CheckReport R = mixedCheck();
  XmlReader Reader(writeCheckJunit(R));
  std::optional<XmlElement> Root = Reader.read();
  ASSERT_TRUE(Root) << Reader.Error;
  EXPECT_EQ(Root->Name, "testsuites");
  ASSERT_EQ(Root->Children.size(), 1u); // one testsuite per checked file
  const XmlElement &Suite = Root->Children[0];
  EXPECT_EQ(Suite.Name, "testsuite");
  EXPECT_EQ(Suite.Attributes.at("name"), "test.qasm");
  // One testcase per metric: erasure_events, depth (its limit and growth
  // together) and gates.
  std::vector<std::string> Names;
  unsigned Failures = 0;
  for (const XmlElement &Case : Suite.Children) {
    if (Case.Name == "system-out") // the suite's notes
      continue;
    ASSERT_EQ(Case.Name, "testcase");
    EXPECT_EQ(Case.Attributes.at("classname"), "test.qasm");
    Names.push_back(Case.Attributes.at("name"));
    for (const XmlElement &Child : Case.Children)
      if (Child.Name == "failure") {
        ++Failures;
        EXPECT_FALSE(Child.Attributes.at("message").empty());
      }
  }
  EXPECT_EQ(Names,
            (std::vector<std::string>{"erasure_events", "depth", "gates"}));
  EXPECT_EQ(Failures, 2u);
  EXPECT_EQ(Suite.Attributes.at("tests"), "3");
  EXPECT_EQ(Suite.Attributes.at("failures"), "2");
  EXPECT_EQ(Root->Attributes.at("tests"), "3");
  EXPECT_EQ(Root->Attributes.at("failures"), "2");
  // The failure names its places: the reset's line.
  const XmlElement &Events = Suite.Children[0];
  ASSERT_EQ(Events.Children.size(), 1u);
  EXPECT_NE(Events.Children[0].Text.find("test.qasm:10:1: reset a[0]"),
            std::string::npos)
      << Events.Children[0].Text;
}

TEST(JunitWriter, EscapesWhatXmlForbids) {
  CheckReport R;
  R.BudgetFile = "b.toml";
  FileVerdict F;
  F.File = "a&b<\"c\">\x01\xFF.qasm"; // markup, a control byte, bad UTF-8
  CheckResult C;
  C.M = Metric::Qubits;
  C.Status = CheckStatus::Failed;
  C.Message = "5 qubits <over> & out";
  F.Checks.push_back(C);
  F.Notes.push_back("note with ]]> and <tags>");
  R.Files.push_back(F);
  R.Failed = 1;
  XmlReader Reader(writeCheckJunit(R));
  std::optional<XmlElement> Root = Reader.read();
  ASSERT_TRUE(Root) << Reader.Error;
  const XmlElement &Suite = Root->Children.at(0);
  // U+FFFD replaces both the control byte and the stray 0xFF.
  EXPECT_EQ(Suite.Attributes.at("name"),
            "a&b<\"c\">\xEF\xBF\xBD\xEF\xBF\xBD.qasm");
  EXPECT_EQ(Suite.Children.at(0).Children.at(0).Attributes.at("message"),
            "5 qubits <over> & out");
}

TEST(JunitWriter, SkippedGrowthIsASkippedCase) {
  CheckReport R = mixedCheck();
  // Keep only the skipped growth of depth.
  std::vector<CheckResult> Kept;
  for (const CheckResult &C : R.Files[0].Checks)
    if (C.Status == CheckStatus::Skipped)
      Kept.push_back(C);
  ASSERT_EQ(Kept.size(), 1u);
  R.Files[0].Checks = Kept;
  XmlReader Reader(writeCheckJunit(R));
  std::optional<XmlElement> Root = Reader.read();
  ASSERT_TRUE(Root) << Reader.Error;
  const XmlElement &Case = Root->Children.at(0).Children.at(0);
  ASSERT_EQ(Case.Children.size(), 1u);
  EXPECT_EQ(Case.Children[0].Name, "skipped");
  EXPECT_EQ(Root->Children.at(0).Attributes.at("skipped"), "1");
  // The note of the new file goes to the suite's output.
  EXPECT_EQ(Root->Children.at(0).Children.at(1).Name, "system-out");
}

/// Cells of a GFM table row: split at pipes not escaped by a backslash,
/// leading and trailing pipes dropped (GFM 0.29, section 4.10).
std::vector<std::string> cells(const std::string &Row) {
  std::vector<std::string> Out;
  std::string Cell;
  for (size_t I = 0; I < Row.size(); ++I) {
    if (Row[I] == '\\' && I + 1 < Row.size()) {
      Cell += Row.substr(I, 2);
      ++I;
      continue;
    }
    if (Row[I] == '|') {
      Out.push_back(Cell);
      Cell.clear();
      continue;
    }
    Cell += Row[I];
  }
  Out.push_back(Cell);
  // The text before the first and after the last pipe is no cell.
  if (!Out.empty() && Out.front().find_first_not_of(' ') == std::string::npos)
    Out.erase(Out.begin());
  if (!Out.empty() && Out.back().find_first_not_of(' ') == std::string::npos)
    Out.pop_back();
  for (std::string &C : Out) {
    size_t A = C.find_first_not_of(' '), B = C.find_last_not_of(' ');
    C = A == std::string::npos ? "" : C.substr(A, B - A + 1);
  }
  return Out;
}

std::vector<std::string> lines(const std::string &Text) {
  std::vector<std::string> Out;
  size_t Start = 0;
  for (size_t I; (I = Text.find('\n', Start)) != std::string::npos;
       Start = I + 1)
    Out.push_back(Text.substr(Start, I - Start));
  return Out;
}

TEST(MarkdownWriter, ATableWithOneRowPerCheck) {
  CheckReport R = mixedCheck();
  std::vector<std::string> L = lines(writeCheckMarkdown(R));
  ASSERT_GE(L.size(), 7u);
  EXPECT_EQ(L[0], "### revbound check: FAILED: 2 of 4 checks failed in 1 "
                  "file (1 passed, 1 skipped)");
  EXPECT_EQ(L[1], "");
  EXPECT_EQ(cells(L[2]), (std::vector<std::string>{"file", "metric", "value",
                                                   "limit", "status"}));
  // The delimiter row has as many cells as the header, each of dashes with
  // optional alignment colons.
  std::vector<std::string> Delimiter = cells(L[3]);
  ASSERT_EQ(Delimiter.size(), 5u);
  for (const std::string &D : Delimiter)
    EXPECT_EQ(D.find_first_not_of("-:"), std::string::npos) << D;
  // Four checks: erasure_events, depth, depth growth, gates.
  std::vector<std::vector<std::string>> Rows;
  for (size_t I = 4; I < L.size() && !L[I].empty(); ++I)
    Rows.push_back(cells(L[I]));
  ASSERT_EQ(Rows.size(), 4u);
  for (const auto &Row : Rows)
    ASSERT_EQ(Row.size(), 5u);
  EXPECT_EQ(Rows[0], (std::vector<std::string>{"test.qasm", "`erasure_events`",
                                               "2", "0", "**fail**"}));
  EXPECT_EQ(Rows[1], (std::vector<std::string>{"test.qasm", "`depth`", "4", "4",
                                               "pass"}));
  EXPECT_EQ(Rows[2][1], "`depth` (growth)");
  EXPECT_EQ(Rows[2][4], "skipped");
  EXPECT_EQ(Rows[3][4], "**fail**");
  // The note of the new file follows the table.
  EXPECT_NE(L.back().find("not in the baseline base.json (a new file)"),
            std::string::npos);
}

TEST(MarkdownWriter, FileNamesCannotBreakTheTable) {
  CheckReport R;
  FileVerdict F;
  F.File = "a|b\n<img>.qasm";
  CheckResult C;
  C.M = Metric::Gates;
  F.Checks.push_back(C);
  R.Files.push_back(F);
  R.Passed = 1;
  std::vector<std::string> L = lines(writeCheckMarkdown(R));
  ASSERT_EQ(L.size(), 5u); // title, blank, header, delimiter, one row
  std::vector<std::string> Row = cells(L[4]);
  ASSERT_EQ(Row.size(), 5u);
  EXPECT_EQ(Row[0], "a\\|b &lt;img&gt;.qasm");
}

TEST(TextWriter, FailuresListTheirPlaces) {
  CheckReport R = mixedCheck();
  std::string T = writeCheckText(R);
  EXPECT_NE(T.find("  FAIL  budget/erasure_events  2 erasure events, over the "
                   "limit 0 events\n"
                   "        test.qasm:10:1: reset a[0]: 1 bit\n"),
            std::string::npos)
      << T;
  EXPECT_NE(T.find("  pass  budget/depth           depth 4 layers, within "
                   "the limit 4 layers\n"),
            std::string::npos)
      << T;
  EXPECT_NE(T.find("  note: not in the baseline base.json (a new file): "
                   "growth checks skipped\n"),
            std::string::npos);
  EXPECT_NE(T.find("revbound check: FAILED: 2 of 4 checks failed in 1 file (1 "
                   "passed, 1 skipped); budget b.toml, baseline base.json\n"),
            std::string::npos)
      << T;
}

} // namespace
