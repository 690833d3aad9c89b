//===- CheckWriters.cpp - A CheckReport as text, SARIF, JUnit, Markdown ---===//
#include "revbound/policy/CheckWriters.h"

#include "revbound/support/Text.h"

#include "llvm/Support/Path.h"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <map>

namespace revbound::policy {

namespace {

const char *statusWord(CheckStatus S) {
  switch (S) {
  case CheckStatus::Passed:
    return "pass";
  case CheckStatus::Failed:
    return "FAIL";
  case CheckStatus::Skipped:
    return "skip";
  }
  llvm_unreachable("every status has a word");
}

std::string pointText(const report::SourcePoint &P) {
  if (P.Line == 0)
    return P.File;
  return fmt::format("{}:{}:{}", P.File, P.Line, P.Column);
}

std::string plural(uint64_t N, const char *One, const char *Many) {
  return fmt::format("{} {}", N, N == 1 ? One : Many);
}

/// "FAILED: 2 of 8 checks failed in 1 file (5 passed, 1 skipped)".
std::string verdictLine(const CheckReport &R) {
  uint64_t Total = R.Passed + R.Failed + R.Skipped;
  std::string Files = plural(R.Files.size(), "file", "files");
  std::string Skipped =
      R.Skipped ? fmt::format("{} skipped", R.Skipped) : std::string();
  if (R.Failed)
    return fmt::format("FAILED: {} of {} failed in {} ({} passed{}{})",
                       R.Failed, plural(Total, "check", "checks"), Files,
                       R.Passed, Skipped.empty() ? "" : ", ", Skipped);
  return fmt::format("passed: {} of {} held in {}{}", R.Passed,
                     plural(Total, "check", "checks"), Files,
                     Skipped.empty() ? "" : " (" + Skipped + ")");
}

/// Text for one Markdown table cell: no line breaks, no column bars, no
/// HTML, no emphasis.
std::string markdownCell(llvm::StringRef S) {
  std::string Out;
  for (char C : validUtf8(S)) {
    switch (C) {
    case '|':
    case '\\':
    case '`':
    case '*':
    case '_':
    case '[':
    case ']':
      Out += '\\';
      Out += C;
      break;
    case '<':
      Out += "&lt;";
      break;
    case '>':
      Out += "&gt;";
      break;
    case '&':
      Out += "&amp;";
      break;
    case '\n':
    case '\r':
      Out += ' ';
      break;
    default:
      Out += C;
    }
  }
  return Out;
}

/// The check's detail lines for people: its places, then how many more.
std::string placeLines(const CheckResult &C, const char *Indent) {
  std::string Out;
  for (const Place &P : C.Places)
    Out += fmt::format("{}{}: {}\n", Indent, pointText(P.At), P.What);
  if (C.PlacesTotal > C.Places.size())
    Out += fmt::format("{}... and {} more\n", Indent,
                       C.PlacesTotal - C.Places.size());
  return Out;
}

struct RuleKey {
  Metric M;
  CheckKind Kind;
  bool operator<(const RuleKey &O) const {
    return std::tie(M, Kind) < std::tie(O.M, O.Kind);
  }
};

} // namespace

std::string writeCheckText(const CheckReport &R) {
  std::string Out;
  for (const FileVerdict &F : R.Files) {
    Out += F.File + "\n";
    size_t Width = 0;
    for (const CheckResult &C : F.Checks)
      Width = std::max(Width, ruleId(C.M, C.Kind).size());
    for (const CheckResult &C : F.Checks) {
      Out += fmt::format("  {}  {:<{}}  {}\n", statusWord(C.Status),
                         ruleId(C.M, C.Kind), Width, C.Message);
      if (C.Status == CheckStatus::Failed)
        Out += placeLines(C, "        ");
    }
    for (const std::string &N : F.Notes)
      Out += "  note: " + N + "\n";
  }
  Out += fmt::format(
      "revbound check: {}; budget {}{}\n", verdictLine(R), R.BudgetFile,
      R.BaselineFile.empty() ? "" : ", baseline " + R.BaselineFile);
  return Out;
}

std::string pathToUri(llvm::StringRef Path) {
  static const char Hex[] = "0123456789ABCDEF";
  std::string Out;
  bool Absolute =
      llvm::sys::path::is_absolute(Path, llvm::sys::path::Style::posix);
  if (Absolute)
    Out = "file://";
  for (char C : Path) {
    unsigned char U = static_cast<unsigned char>(C);
    if (std::isalnum(U) || C == '-' || C == '.' || C == '_' || C == '~' ||
        C == '/') {
      Out += C;
      continue;
    }
    Out += '%';
    Out += Hex[U >> 4];
    Out += Hex[U & 15];
  }
  return Out;
}

namespace {

using OrderedJson = nlohmann::ordered_json;

OrderedJson amountJson(const Amount &A) {
  return A.IsCount ? OrderedJson(A.Count) : OrderedJson(A.Real);
}

/// A SARIF location (3.28): the file, the region where there is a line.
OrderedJson sarifLocation(const report::SourcePoint &At,
                          const std::string &What) {
  OrderedJson Physical = {{"artifactLocation", {{"uri", pathToUri(At.File)}}}};
  if (At.Line != 0)
    Physical["region"] = {{"startLine", At.Line},
                          {"startColumn", std::max(1u, At.Column)}};
  OrderedJson L = {{"physicalLocation", std::move(Physical)}};
  if (!What.empty())
    L["message"] = {{"text", What}};
  return L;
}

/// A SARIF result (3.27) for one failed check.
OrderedJson sarifResult(const FileVerdict &F, const CheckResult &C,
                        unsigned RuleIndex) {
  OrderedJson Locations = OrderedJson::array();
  for (const Place &P : C.Places)
    Locations.push_back(sarifLocation(P.At, P.What));
  if (Locations.empty())
    Locations.push_back(sarifLocation({F.File, 0, 0}, ""));
  OrderedJson Properties = {{"metric", metricName(C.M).str()},
                            {"value", amountJson(C.Value)},
                            {"allowed", amountJson(C.Allowed)}};
  if (C.BaselineValue) {
    Properties["baseline"] = amountJson(*C.BaselineValue);
    Properties["growth"] = C.Growth;
  }
  if (C.PlacesTotal > C.Places.size())
    Properties["places_not_listed"] = C.PlacesTotal - C.Places.size();
  return {{"ruleId", ruleId(C.M, C.Kind)},
          {"ruleIndex", RuleIndex},
          {"level", "error"},
          {"message", {{"text", fmt::format("{}: {}", F.File, C.Message)}}},
          {"locations", std::move(Locations)},
          {"properties", std::move(Properties)}};
}

/// One JUnit testcase: a file's checks of one metric. Counts a failure or
/// a skip into the suite's totals.
std::string junitCase(const std::string &File,
                      llvm::ArrayRef<const CheckResult *> Checks,
                      uint64_t &Failures, uint64_t &Skipped) {
  std::string Messages, Details, Type;
  bool AllSkipped = true;
  for (const CheckResult *C : Checks) {
    AllSkipped &= C->Status == CheckStatus::Skipped;
    if (C->Status != CheckStatus::Failed)
      continue;
    if (Type.empty())
      Type = ruleId(C->M, C->Kind);
    Messages += (Messages.empty() ? "" : "; ") + C->Message;
    Details += fmt::format("{}: {} (budget {})\n", ruleId(C->M, C->Kind),
                           C->Message, pointText(C->Rule));
    Details += placeLines(*C, "  ");
  }
  std::string Open =
      fmt::format("    <testcase classname=\"{}\" name=\"{}\"", xmlEscape(File),
                  metricName(Checks.front()->M).str());
  if (!Type.empty()) {
    ++Failures;
    return Open + fmt::format(">\n      <failure type=\"{}\" message=\"{}\">{}"
                              "</failure>\n    </testcase>\n",
                              Type, xmlEscape(Messages), xmlEscape(Details));
  }
  if (AllSkipped) {
    ++Skipped;
    return Open + fmt::format(">\n      <skipped message=\"{}\"/>\n    "
                              "</testcase>\n",
                              xmlEscape(Checks.front()->Message));
  }
  return Open + "/>\n";
}

} // namespace

std::string writeCheckSarif(const CheckReport &R) {
  // Rules: every rule of the budget that was checked, in metric order.
  std::map<RuleKey, unsigned> RuleIndex;
  for (const FileVerdict &F : R.Files)
    for (const CheckResult &C : F.Checks)
      RuleIndex.emplace(RuleKey{C.M, C.Kind}, 0);
  OrderedJson Rules = OrderedJson::array();
  for (auto &[Key, Index] : RuleIndex) {
    Index = unsigned(Rules.size());
    Rules.push_back(
        {{"id", ruleId(Key.M, Key.Kind)},
         {"shortDescription", {{"text", ruleSummary(Key.M, Key.Kind)}}},
         {"fullDescription", {{"text", ruleHelp(Key.M, Key.Kind)}}},
         {"help", {{"text", ruleHelp(Key.M, Key.Kind)}}},
         {"defaultConfiguration", {{"level", "error"}}}});
  }
  OrderedJson Results = OrderedJson::array();
  for (const FileVerdict &F : R.Files)
    for (const CheckResult &C : F.Checks)
      if (C.Status == CheckStatus::Failed)
        Results.push_back(sarifResult(F, C, RuleIndex.at({C.M, C.Kind})));
  OrderedJson Driver = {{"name", "revbound"}};
  if (!R.ToolVersion.empty())
    Driver["version"] = R.ToolVersion;
  Driver["rules"] = std::move(Rules);
  OrderedJson Run = {{"tool", {{"driver", std::move(Driver)}}},
                     {"results", std::move(Results)}};
  OrderedJson Log = {{"$schema", SarifSchemaUri},
                     {"version", "2.1.0"},
                     {"runs", OrderedJson::array({std::move(Run)})}};
  return Log.dump(2, ' ', false, OrderedJson::error_handler_t::replace) + "\n";
}

std::string writeCheckJunit(const CheckReport &R) {
  std::string Suites;
  uint64_t AllTests = 0, AllFailures = 0, AllSkipped = 0;
  for (const FileVerdict &F : R.Files) {
    // Checks come by metric; a metric's limit and growth make one case.
    std::vector<std::vector<const CheckResult *>> Cases;
    for (const CheckResult &C : F.Checks) {
      if (Cases.empty() || Cases.back().front()->M != C.M)
        Cases.emplace_back();
      Cases.back().push_back(&C);
    }
    std::string Body;
    uint64_t Failures = 0, Skipped = 0;
    for (const auto &Checks : Cases)
      Body += junitCase(F.File, Checks, Failures, Skipped);
    std::string Notes;
    for (const std::string &N : F.Notes)
      Notes += N + "\n";
    if (!Notes.empty())
      Body +=
          fmt::format("    <system-out>{}</system-out>\n", xmlEscape(Notes));
    Suites +=
        fmt::format("  <testsuite name=\"{}\" tests=\"{}\" failures=\"{}\" "
                    "errors=\"0\" skipped=\"{}\">\n{}  </testsuite>\n",
                    xmlEscape(F.File), Cases.size(), Failures, Skipped, Body);
    AllTests += Cases.size();
    AllFailures += Failures;
    AllSkipped += Skipped;
  }
  return fmt::format("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
                     "<testsuites name=\"revbound check\" tests=\"{}\" "
                     "failures=\"{}\" errors=\"0\" skipped=\"{}\">\n{}"
                     "</testsuites>\n",
                     AllTests, AllFailures, AllSkipped, Suites);
}

std::string writeCheckMarkdown(const CheckReport &R) {
  std::string Out = fmt::format("### revbound check: {}\n\n", verdictLine(R));
  Out += "| file | metric | value | limit | status |\n";
  Out += "|---|---|---:|---:|---|\n";
  for (const FileVerdict &F : R.Files) {
    for (const CheckResult &C : F.Checks) {
      // Our metric names need no escaping inside a code span.
      std::string Metric = fmt::format("`{}`", metricName(C.M).str());
      std::string Limit;
      auto [Value, Allowed] = showAmounts(C.Value, C.Allowed);
      if (C.Kind == CheckKind::Limit) {
        Limit = Allowed;
      } else {
        Metric += " (growth)";
        Limit = C.BaselineValue
                    ? fmt::format(
                          "{} ({} + {})", Allowed,
                          showAmounts(*C.BaselineValue, *C.BaselineValue).first,
                          C.Growth)
                    : "no baseline";
      }
      const char *Status = C.Status == CheckStatus::Failed   ? "**fail**"
                           : C.Status == CheckStatus::Passed ? "pass"
                                                             : "skipped";
      Out += fmt::format("| {} | {} | {} | {} | {} |\n", markdownCell(F.File),
                         Metric, Value, markdownCell(Limit), Status);
    }
  }
  std::string Notes;
  for (const FileVerdict &F : R.Files)
    for (const std::string &N : F.Notes)
      Notes += fmt::format("- {}: {}\n", markdownCell(F.File), markdownCell(N));
  if (!Notes.empty())
    Out += "\n" + Notes;
  return Out;
}

} // namespace revbound::policy
