//===- BaselineReaderTest.cpp - Saved JSON reports read back as baselines -===//
//
// The members read are those docs/json.md documents for schema
// revbound/report-1; JSON itself is RFC 8259. Hand-written reports below
// hold only the members a baseline needs.
//
//===----------------------------------------------------------------------===//
#include "revbound/policy/BaselineReader.h"
#include "revbound/report/Writers.h"

#include "TestSupport.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

namespace {

using namespace revbound;
using namespace revbound::policy;

std::vector<Metric> everyMetric() {
  return {allMetrics().begin(), allMetrics().end()};
}

std::optional<Baseline> parse(const std::string &Text,
                              std::vector<Metric> Wanted,
                              std::string *Message = nullptr) {
  config::ConfigError Error;
  std::optional<Baseline> B =
      parseBaselineReport(Text, "base.json", Wanted, Error);
  if (Message)
    *Message = B ? "" : Error.format();
  return B;
}

// One circuit with every member a baseline can need, as docs/json.md lays
// them out; a long member (critical_path) that the reader skips.
const char *TwoCircuits = R"({
  "schema": "revbound/report-1",
  "circuits": [
    {"file": "a.qasm", "qubits": 5,
     "ops": {"gates": 25, "t_count": 7, "by_name": {"cx": 17}},
     "depth": {"all": 19, "two_qubit": 17, "t": 3},
     "critical_path": {"listed": [{"gate": "cx"}]},
     "speed": {"action_Js": 4.1e-33},
     "erasures": {"events": 3, "entropy_bits": {"low": 0.5, "high": 2.25,
                  "exact": false}, "list": []},
     "ancillas": [{"wire": "anc[0]", "clean": true},
                  {"wire": "anc[1]", "clean": false},
                  {"wire": "anc[2]", "clean": null}],
     "landauer": {"temperature_K": 300, "heat_J": {"low": 1e-21, "high": 6e-21}}},
    {"file": "b.qasm", "qubits": 1, "ops": {"gates": 0, "t_count": 0},
     "depth": {"all": 0, "two_qubit": 0}, "speed": {"action_Js": 0},
     "erasures": {"events": 0, "entropy_bits": {"high": 0}},
     "ancillas": [], "landauer": {"heat_J": {"high": 0}}}
  ]
})";

TEST(BaselineReader, ReadsEveryMetricOfEveryCircuit) {
  std::string Message;
  std::optional<Baseline> B = parse(TwoCircuits, everyMetric(), &Message);
  ASSERT_TRUE(B) << Message;
  EXPECT_FALSE(B->SingleCircuit);
  ASSERT_EQ(B->Circuits.size(), 2u);
  EXPECT_EQ(B->Circuits[0].first, "a.qasm");
  const MetricSet &A = B->Circuits[0].second;
  EXPECT_EQ(A[Metric::Qubits]->Count, 5u);
  EXPECT_EQ(A[Metric::Gates]->Count, 25u);
  EXPECT_EQ(A[Metric::TCount]->Count, 7u);
  EXPECT_EQ(A[Metric::Depth]->Count, 19u);
  EXPECT_EQ(A[Metric::TwoQubitDepth]->Count, 17u);
  EXPECT_EQ(A[Metric::ErasureEvents]->Count, 3u);
  EXPECT_EQ(A[Metric::EntropyBits]->Real, 2.25); // the high end
  EXPECT_EQ(A[Metric::HeatJ]->Real, 6e-21);      // the high end
  EXPECT_EQ(A[Metric::ActionJs]->Real, 4.1e-33);
  // clean false and null are both "not proved clean".
  EXPECT_EQ(A[Metric::DirtyAncillas]->Count, 2u);
  EXPECT_EQ(B->Circuits[1].second[Metric::DirtyAncillas]->Count, 0u);
}

TEST(BaselineReader, ReadsOnlyTheWantedMetrics) {
  // A report without `speed` still serves a budget that grows only depth.
  std::string Text = R"({"schema": "revbound/report-1", "circuits": [
    {"file": "a.qasm", "depth": {"all": 4}}]})";
  std::string Message;
  std::optional<Baseline> B = parse(Text, {Metric::Depth}, &Message);
  ASSERT_TRUE(B) << Message;
  EXPECT_EQ(B->Circuits[0].second[Metric::Depth]->Count, 4u);
  EXPECT_FALSE(B->Circuits[0].second[Metric::ActionJs]);
  EXPECT_FALSE(parse(Text, {Metric::ActionJs}, &Message));
  EXPECT_EQ(Message, "base.json: error: circuits[0].speed.action_Js is "
                     "missing (needed for the growth of 'action_Js')");
}

TEST(BaselineReader, OurOwnReportReadsBackExactly) {
  // The JSON writer prints doubles so that they read back to the same
  // double and counts as integers past 2^53 (docs/json.md, "Fields").
  std::optional<report::CircuitReport> C =
      test::analyzeText("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                        "//! input a\n//! ancilla anc\nqreg a[2];\n"
                        "qreg anc[1];\nccx a[0], a[1], anc[0];\nreset a[0];\n");
  ASSERT_TRUE(C);
  C->Ops.Gates = (uint64_t(1) << 60) + 1; // not a double: 2^60 + 1
  report::Report R;
  R.Circuits.push_back(*C);
  std::string Message;
  std::optional<Baseline> B =
      parse(report::writeJson(R), everyMetric(), &Message);
  ASSERT_TRUE(B) << Message;
  MetricSet Expected = metricsOf(*C);
  for (Metric M : allMetrics()) {
    SCOPED_TRACE(metricName(M).str());
    const Amount &Want = *Expected[M];
    const Amount &Got = *B->Circuits[0].second[M];
    EXPECT_EQ(Got.IsCount, Want.IsCount);
    EXPECT_EQ(Got.Count, Want.Count);
    EXPECT_EQ(Got.Real, Want.Real);
  }
  EXPECT_EQ(B->Circuits[0].second[Metric::Gates]->Count,
            1152921504606846977u); // 2^60 + 1
}

TEST(BaselineReader, OtherSchemasAreRejected) {
  std::string Message;
  EXPECT_FALSE(parse(R"({"schema": "revbound/report-2", "circuits": []})",
                     everyMetric(), &Message));
  EXPECT_EQ(Message, "base.json: error: unsupported report schema "
                     "\"revbound/report-2\"; this revbound reads "
                     "\"revbound/report-1\"");
  EXPECT_FALSE(parse(R"({"circuits": []})", everyMetric(), &Message));
  EXPECT_EQ(Message, "base.json: error: not a revbound report: it has no "
                     "\"schema\"; expected \"revbound/report-1\" (revbound "
                     "report --format json)");
  EXPECT_FALSE(parse(R"([1, 2])", everyMetric(), &Message));
  EXPECT_EQ(Message.substr(0, 39), "base.json: error: not a revbound report");
  EXPECT_FALSE(parse(R"({"schema": "revbound/report-1", "circuits": {}})",
                     everyMetric(), &Message));
  EXPECT_EQ(Message, "base.json: error: \"circuits\" must be an array");
}

TEST(BaselineReader, TextThatIsNotJsonIsLocated) {
  std::string Message;
  // Line 2 is `  "schema": 'x'`: the quote ' is at column 13, where RFC 8259
  // allows no single-quoted string.
  EXPECT_FALSE(parse("{\n  \"schema\": 'x'\n}\n", everyMetric(), &Message));
  EXPECT_EQ(Message.substr(0, 40), "base.json:2:13: error: not a JSON report")
      << Message;
  // RFC 8259 section 6 lets a number exceed what a double holds; we refuse
  // it instead of guessing (found by mutating reports).
  EXPECT_FALSE(parse(R"({"schema": "revbound/report-1", "circuits": [
    {"file": "a.qasm", "speed": {"action_Js": 4.1e999}}]})",
                     everyMetric(), &Message));
  EXPECT_EQ(Message, "base.json: error: not a JSON report: number overflow "
                     "parsing '4.1e999'");
  EXPECT_FALSE(parse("", everyMetric(), &Message));
  EXPECT_EQ(Message.substr(0, 39), "base.json:1:1: error: not a JSON report")
      << Message;
}

TEST(BaselineReader, WrongMembersAreNamedByPath) {
  std::string Message;
  auto one = [](const std::string &Circuit) {
    return R"({"schema": "revbound/report-1", "circuits": [)" + Circuit + "]}";
  };
  EXPECT_FALSE(parse(one(R"({"file": "a.qasm", "depth": {"all": -1}})"),
                     {Metric::Depth}, &Message));
  EXPECT_EQ(Message, "base.json: error: circuits[0].depth.all must be a "
                     "whole number, zero or more");
  EXPECT_FALSE(parse(one(R"({"file": "a.qasm", "depth": {"all": 2.5}})"),
                     {Metric::Depth}, &Message));
  EXPECT_EQ(Message, "base.json: error: circuits[0].depth.all must be a "
                     "whole number, zero or more");
  EXPECT_FALSE(parse(one(R"({"file": "a.qasm", "speed": {"action_Js": "1"}})"),
                     {Metric::ActionJs}, &Message));
  EXPECT_EQ(Message, "base.json: error: circuits[0].speed.action_Js must be "
                     "a number");
  EXPECT_FALSE(
      parse(one(R"({"file": "a.qasm", "ancillas": [{"clean": "yes"}]})"),
            {Metric::DirtyAncillas}, &Message));
  EXPECT_EQ(Message, "base.json: error: circuits[0].ancillas[0].clean must "
                     "be true, false or null");
  EXPECT_FALSE(
      parse(one(R"({"depth": {"all": 1}})"), {Metric::Depth}, &Message));
  EXPECT_EQ(Message, "base.json: error: circuits[0].file must be a string");
}

TEST(BaselineReader, FilesAreToldApart) {
  std::filesystem::path Dir =
      std::filesystem::temp_directory_path() /
      ("revbound-baseline-" + std::to_string(::getpid()));
  std::filesystem::create_directories(Dir);
  std::ofstream(Dir / "report.txt") << "\n  {\"schema\": 1}";
  std::ofstream(Dir / "old.json") << "OPENQASM 2.0;";
  std::ofstream(Dir / "old.qasm") << "OPENQASM 2.0;\nqreg q[1];\n";
  EXPECT_TRUE(isJsonReport((Dir / "report.txt").string())); // by its '{'
  EXPECT_TRUE(isJsonReport((Dir / "old.json").string()));   // by its name
  EXPECT_FALSE(isJsonReport((Dir / "old.qasm").string()));
  EXPECT_FALSE(isJsonReport((Dir / "absent").string()));
  config::ConfigError Error;
  EXPECT_FALSE(readBaselineReport((Dir / "old.json").string(), {Metric::Depth},
                                  1 << 20, Error));
  EXPECT_EQ(Error.Line, 1u);
  EXPECT_FALSE(readBaselineReport((Dir / "report.txt").string(),
                                  {Metric::Depth}, 4, Error));
  EXPECT_EQ(Error.format(), (Dir / "report.txt").string() +
                                ": error: the baseline must be a regular file "
                                "of at most 4 bytes (--max-file-bytes)");
  std::filesystem::remove_all(Dir);
}

} // namespace
