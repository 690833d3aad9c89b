//===- CheckCommandTest.cpp - `revbound check` as CI runs it --------------===//
//
// Budgets, baselines (a circuit and a saved JSON report), the exit codes of
// DESIGN.md (0 every limit holds, 1 one fails, 2 bad input or usage) and
// the SARIF, JUnit and Markdown files. Metric values are derived by hand in
// the comments beside each circuit.
//
//===----------------------------------------------------------------------===//
#include "ToolRunner.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <set>

namespace {

using revbound::test::Outcome;
using revbound::test::slurp;

class CheckCommand : public revbound::test::ToolTest {};

// Lines 7 to 10. t is a phase (a basis state stays one), cx sets
// a1' = a0 xor a1, ccx sets anc = a0 and a1' = a0 and not a1, the reset
// erases the uniform input bit a0. Each operation shares a[0] with the one
// before: depth 4, two of the layers on two or more qubits; 3 gates (a
// reset is none), 1 T, 3 qubits; erasure events: the reset and the discard
// of the dirty ancilla.
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

// Mixed with one more layer and one more gate: depth 5, 4 gates.
const std::string Longer = std::string(Mixed) + "x a[0];\n";

// The 4-bit ripple-carry adder of Cuccaro, Draper, Kutin and Moulton
// (quant-ph/0410184), b <- a + b with carry-out z: n MAJ and n UMA blocks
// and one CNOT, so 2n = 8 Toffoli and 4n + 1 = 17 CNOT gates, 25 in all, on
// 2n + 2 = 10 qubits; the carry-in ancilla is restored to |0>.
const char *Adder = "OPENQASM 2.0;\n"
                    "include \"qelib1.inc\";\n"
                    "gate maj c, b, a { cx a, b; cx a, c; ccx c, b, a; }\n"
                    "gate uma c, b, a { ccx c, b, a; cx a, c; cx c, b; }\n"
                    "//! input a, b\n"
                    "//! ancilla cin\n"
                    "qreg cin[1];\nqreg a[4];\nqreg b[4];\nqreg z[1];\n"
                    "maj cin[0], b[0], a[0];\n"
                    "maj a[0], b[1], a[1];\n"
                    "maj a[1], b[2], a[2];\n"
                    "maj a[2], b[3], a[3];\n"
                    "cx a[3], z[0];\n"
                    "uma a[2], b[3], a[3];\n"
                    "uma a[1], b[2], a[2];\n"
                    "uma a[0], b[1], a[1];\n"
                    "uma cin[0], b[0], a[0];\n";

TEST_F(CheckCommand, LimitsHoldAtTheirValueAndExitZero) {
  write("mixed.qasm", Mixed);
  write("budget.toml", "[limits]\n"
                       "erasure_events = 2\n"
                       "dirty_ancillas = 1\n"
                       "depth = 4\n"
                       "two_qubit_depth = 2\n"
                       "t_count = 1\n"
                       "gates = 3\n"
                       "qubits = 3\n");
  Outcome R = invoke("check mixed.qasm --budget budget.toml");
  EXPECT_EQ(R.Exit, 0) << R.Out << R.Err;
  EXPECT_EQ(R.Err, "");
  EXPECT_NE(R.Out.find("revbound check: passed: 7 of 7 checks held in 1 "
                       "file; budget budget.toml\n"),
            std::string::npos)
      << R.Out;
}

TEST_F(CheckCommand, OneLimitPastItsValueExitsOne) {
  write("mixed.qasm", Mixed);
  write("budget.toml", "[limits]\ndepth = 3\ngates = 3\n");
  Outcome R = invoke("check mixed.qasm --budget budget.toml");
  EXPECT_EQ(R.Exit, 1) << R.Out << R.Err;
  EXPECT_NE(
      R.Out.find("  FAIL  budget/depth  depth 4 layers, over the limit "
                 "3 layers\n"
                 "        mixed.qasm:7:1: critical path: t a[0]\n"
                 "        mixed.qasm:8:1: critical path: cx a[0], a[1]\n"),
      std::string::npos)
      << R.Out;
  EXPECT_NE(R.Out.find("  pass  budget/gates  3 gates, within the limit 3 "
                       "gates\n"),
            std::string::npos)
      << R.Out;
  EXPECT_NE(R.Out.find("FAILED: 1 of 2 checks failed in 1 file (1 passed)"),
            std::string::npos);
}

TEST_F(CheckCommand, ErasureFailuresNameTheirEvents) {
  write("mixed.qasm", Mixed);
  write("budget.toml", "[limits]\nerasure_events = 1\ndirty_ancillas = 0\n");
  Outcome R = invoke("check mixed.qasm --budget budget.toml");
  EXPECT_EQ(R.Exit, 1);
  // The reset (1 bit: a uniform input bit) and the discard of anc at its
  // last operation, line 9, with H2(1/4) = 0.811278 bits (Shannon, Bell
  // Syst. Tech. J. 27, 379 (1948)).
  EXPECT_NE(
      R.Out.find("2 erasure events, over the limit 1 event\n"
                 "        mixed.qasm:10:1: reset a[0]: 1 bit\n"
                 "        mixed.qasm:9:1: discard anc[0]: 0.811278 bits\n"),
      std::string::npos)
      << R.Out;
  // anc ends at 1 only for a0 = 1, a1 = 0: "01", highest index first.
  EXPECT_NE(
      R.Out.find("1 ancilla not proved clean (anc[0] dirty), over the "
                 "limit 0 ancillas\n"
                 "        mixed.qasm:9:1: ancilla anc[0] dirty (ends at 1 "
                 "for a=01)\n"),
      std::string::npos)
      << R.Out;
}

TEST_F(CheckCommand, EntropyIsHeldAtWhatTheCircuitMayErase) {
  // The structural engine bounds the reset of an input bit by [0, 1]
  // (docs/erasures.md): within 0.5 at its low end, not at its high end.
  write("reset.qasm", "OPENQASM 2.0;\n//! input a\nqreg a[1];\nreset a[0];\n");
  write("budget.toml", "[limits]\nentropy_bits = 0.5\n");
  Outcome R =
      invoke("check reset.qasm --budget budget.toml --engine structural");
  EXPECT_EQ(R.Exit, 1) << R.Err;
  EXPECT_NE(R.Out.find("may erase up to 1 bit (at least 0 bits), over the "
                       "limit 0.5 bits\n"
                       "        reset.qasm:4:1: reset a[0]: 0 to 1 bits\n"),
            std::string::npos)
      << R.Out;
  write("one.toml", "[limits]\nentropy_bits = 1\n");
  EXPECT_EQ(
      invoke("check reset.qasm --budget one.toml --engine structural").Exit, 0);
}

TEST_F(CheckCommand, CuccaroAdderCounts) {
  write("adder.qasm", Adder);
  write("budget.toml", "[limits]\ngates = 25\nqubits = 10\nt_count = 0\n"
                       "dirty_ancillas = 0\nerasure_events = 0\n");
  Outcome R = invoke("check adder.qasm --budget budget.toml");
  EXPECT_EQ(R.Exit, 0) << R.Out << R.Err;
  write("tight.toml", "[limits]\ngates = 24\n");
  EXPECT_EQ(invoke("check adder.qasm --budget tight.toml").Exit, 1);
  // Expanded to U and CX, each Toffoli of qelib1.inc holds 7 T and T-dagger
  // gates (4 t, 3 tdg in its body; 7 is the least possible: Amy, Maslov,
  // Mosca & Roetteler, IEEE TCAD 32, 818 (2013)): 8 x 7 = 56.
  write("t.toml", "[limits]\nt_count = 56\n");
  EXPECT_EQ(
      invoke("check adder.qasm --budget t.toml --granularity primitive").Exit,
      0);
  write("t55.toml", "[limits]\nt_count = 55\n");
  Outcome Tight =
      invoke("check adder.qasm --budget t55.toml --granularity primitive");
  EXPECT_EQ(Tight.Exit, 1);
  EXPECT_NE(Tight.Out.find("T-count 56, over the limit 55"), std::string::npos)
      << Tight.Out;
}

TEST_F(CheckCommand, GrowthOverACircuitBaseline) {
  write("base.qasm", Mixed);
  write("new.qasm", Longer);
  // depth 4 -> 5: 4 x 1.25 = 5 is allowed, 4 x 1.24 = 4.96 is not.
  write("quarter.toml", "[growth]\ndepth = \"25%\"\n");
  Outcome Ok =
      invoke("check new.qasm --budget quarter.toml --baseline base.qasm");
  EXPECT_EQ(Ok.Exit, 0) << Ok.Out << Ok.Err;
  write("less.toml", "[growth]\ndepth = \"24%\"\n");
  Outcome Fail =
      invoke("check new.qasm --budget less.toml --baseline base.qasm");
  EXPECT_EQ(Fail.Exit, 1);
  EXPECT_NE(Fail.Out.find("depth 5 layers, grown past the baseline's 4 layers "
                          "+ 24% (at most 4 layers)"),
            std::string::npos)
      << Fail.Out;
  // The baseline is analysed with the checked files' options: at primitive
  // granularity the ccx counts as its 15 leaves in both.
  write("zero.toml", "[growth]\ngates = \"0%\"\n");
  EXPECT_EQ(invoke("check base.qasm --budget zero.toml --baseline base.qasm "
                   "--granularity primitive")
                .Exit,
            0);
}

TEST_F(CheckCommand, GrowthOverASavedJsonReport) {
  // The baseline on main: Mixed, saved with `revbound report --format json`.
  write("mixed.qasm", Mixed);
  Outcome Saved = invoke("report --format json -o base.json mixed.qasm");
  ASSERT_EQ(Saved.Exit, 0) << Saved.Err;
  // The pull request: mixed.qasm grows by one gate, extra.qasm is new.
  write("mixed.qasm", Longer);
  write("extra.qasm", Longer);
  // 3 gates -> 4: 0% fails; 3 x 1.34 = 4.02 holds.
  write("zero.toml", "[growth]\ngates = \"0%\"\n");
  Outcome Fail = invoke(
      "check mixed.qasm extra.qasm --budget zero.toml --baseline base.json");
  EXPECT_EQ(Fail.Exit, 1) << Fail.Err;
  EXPECT_NE(
      Fail.Out.find("mixed.qasm\n  FAIL  growth/gates  4 gates, grown "
                    "past the baseline's 3 gates + 0% (at most 3 gates)\n"),
      std::string::npos)
      << Fail.Out;
  // A file the baseline does not know is skipped, not failed.
  EXPECT_NE(Fail.Out.find("extra.qasm\n  skip  growth/gates"),
            std::string::npos)
      << Fail.Out;
  EXPECT_NE(Fail.Out.find("  note: not in the baseline base.json (a new file): "
                          "growth checks skipped\n"),
            std::string::npos);
  write("some.toml", "[growth]\ngates = \"34%\"\n");
  Outcome Ok = invoke(
      "check mixed.qasm extra.qasm --budget some.toml --baseline base.json");
  EXPECT_EQ(Ok.Exit, 0) << Ok.Out << Ok.Err;
  EXPECT_NE(Ok.Out.find("passed: 1 of 2 checks held in 2 files (1 skipped)"),
            std::string::npos)
      << Ok.Out;
}

TEST_F(CheckCommand, BudgetErrorsExitTwoWithTheirPosition) {
  write("mixed.qasm", Mixed);
  struct {
    const char *Budget;
    const char *Error;
  } Cases[] = {
      {"[limit]\ndepth = 3\n",
       "budget.toml:1:2: error: unknown table 'limit'; a budget holds only "
       "[limits] and [growth]\n"},
      {"[limits]\ndepth = 3\nqbits = 3\n",
       "budget.toml:3:1: error: unknown metric 'qbits' in [limits]; did you "
       "mean 'qubits'?\n"},
      {"[limits]\ndepth = \"3\"\n",
       "budget.toml:2:9: error: the limit of 'depth' must be a number, not a "
       "string\n"},
      {"[limits]\ngates = -2\n",
       "budget.toml:2:9: error: the limit of 'gates' must be zero or more\n"},
      {"[limits]\ndepth = 3.5\n",
       "budget.toml:2:9: error: the limit of 'depth' must be a whole number "
       "of layers\n"},
      {"[growth]\ndepth = 5\n",
       "budget.toml:2:9: error: the growth of 'depth' must be a percentage "
       "string such as \"5%\"\n"},
      {"[growth]\ndepth = \"5 percent\"\n",
       "budget.toml:2:9: error: '5 percent' is not a percentage; write it "
       "with a percent sign, such as \"5%\"\n"},
      // [growth] on line 2 and no --baseline.
      {"[limits]\n[growth]\ndepth = \"5%\"\n",
       "budget.toml:2:1: error: [growth] compares with a baseline, but no "
       "--baseline was given; pass --baseline FILE (a circuit or a JSON "
       "report)\n"},
  };
  for (const auto &Case : Cases) {
    write("budget.toml", Case.Budget);
    Outcome R =
        invoke("check mixed.qasm --budget budget.toml --sarif out.sarif");
    EXPECT_EQ(R.Exit, 2) << Case.Budget;
    EXPECT_EQ(R.Err, Case.Error);
    EXPECT_EQ(R.Out, "");
    EXPECT_FALSE(std::filesystem::exists(Dir / "out.sarif"));
  }
  Outcome Missing = invoke("check mixed.qasm --budget nowhere.toml");
  EXPECT_EQ(Missing.Exit, 2);
  EXPECT_EQ(Missing.Err, "nowhere.toml: error: cannot open the budget file: No "
                         "such file or directory\n");
  Outcome NoBudget = invoke("check mixed.qasm");
  EXPECT_EQ(NoBudget.Exit, 2);
  EXPECT_NE(NoBudget.Err.find("--budget"), std::string::npos) << NoBudget.Err;
}

TEST_F(CheckCommand, BaselineErrorsExitTwo) {
  write("mixed.qasm", Mixed);
  write("other.qasm", Mixed);
  write("budget.toml", "[growth]\ndepth = \"5%\"\n");
  write("foreign.json", "{\"schema\": \"someone-else/7\", \"circuits\": []}\n");
  Outcome Foreign =
      invoke("check mixed.qasm --budget budget.toml --baseline foreign.json");
  EXPECT_EQ(Foreign.Exit, 2);
  EXPECT_EQ(Foreign.Err, "foreign.json: error: unsupported report schema "
                         "\"someone-else/7\"; this revbound reads "
                         "\"revbound/report-1\"\n");
  Outcome Two = invoke("check mixed.qasm other.qasm --budget budget.toml "
                       "--baseline mixed.qasm");
  EXPECT_EQ(Two.Exit, 2);
  EXPECT_EQ(Two.Err, "revbound: error: --baseline mixed.qasm: a circuit "
                     "baseline stands for one checked file, but 2 are "
                     "checked; give a JSON report (revbound report --format "
                     "json -o FILE) whose circuits are matched by path\n");
  // A baseline circuit that does not parse is bad input too.
  write("broken.qasm", "OPENQASM 2.0;\nqreg q[1]\n");
  Outcome Broken =
      invoke("check mixed.qasm --budget budget.toml --baseline broken.qasm");
  EXPECT_EQ(Broken.Exit, 2);
  EXPECT_NE(Broken.Err.find("broken.qasm:"), std::string::npos) << Broken.Err;
  // So is a checked file that does not parse.
  write("limits.toml", "[limits]\ndepth = 9\n");
  Outcome BadFile = invoke("check broken.qasm --budget limits.toml");
  EXPECT_EQ(BadFile.Exit, 2);
  EXPECT_EQ(BadFile.Out, "");
}

TEST_F(CheckCommand, SarifFileForCodeScanning) {
  write("mixed.qasm", Mixed);
  write("budget.toml", "[limits]\nerasure_events = 0\ngates = 3\n");
  Outcome R = invoke("check mixed.qasm --budget budget.toml --sarif out.sarif");
  EXPECT_EQ(R.Exit, 1);
  nlohmann::json Log = nlohmann::json::parse(slurp(Dir / "out.sarif"));
  // SARIF 2.1.0, OASIS Standard, 27 March 2020 (sections from memory):
  // 3.13.2 version, 3.13.4 runs, 3.18.2 tool.driver, 3.19.8 name.
  EXPECT_EQ(Log["version"], "2.1.0");
  ASSERT_EQ(Log["runs"].size(), 1u);
  const nlohmann::json &Run = Log["runs"][0];
  EXPECT_EQ(Run["tool"]["driver"]["name"], "revbound");
  EXPECT_EQ(Run["tool"]["driver"]["version"], "0.1.0"); // revbound --version
  std::set<std::string> RuleIds;
  for (const nlohmann::json &Rule : Run["tool"]["driver"]["rules"])
    RuleIds.insert(Rule["id"].get<std::string>());
  EXPECT_EQ(RuleIds,
            (std::set<std::string>{"budget/erasure_events", "budget/gates"}));
  // 3.27.5 ruleId (in driver.rules), 3.27.11 message.text, 3.27.12
  // locations with physicalLocation (3.28.3), artifactLocation.uri (3.4.3),
  // region.startLine (3.30.5).
  ASSERT_EQ(Run["results"].size(), 1u);
  const nlohmann::json &Result = Run["results"][0];
  EXPECT_EQ(Result["ruleId"], "budget/erasure_events");
  EXPECT_TRUE(RuleIds.count(Result["ruleId"].get<std::string>()));
  EXPECT_EQ(Result["level"], "error");
  EXPECT_EQ(Result["message"]["text"],
            "mixed.qasm: 2 erasure events, over the limit 0 events");
  const nlohmann::json &First = Result["locations"][0]["physicalLocation"];
  EXPECT_EQ(First["artifactLocation"]["uri"], "mixed.qasm");
  EXPECT_EQ(First["region"]["startLine"], 10);
  EXPECT_EQ(First["region"]["startColumn"], 1);
  // The human text still goes to standard output.
  EXPECT_NE(R.Out.find("FAIL  budget/erasure_events"), std::string::npos);
}

TEST_F(CheckCommand, JunitAndMarkdownFiles) {
  write("mixed.qasm", Mixed);
  write("adder.qasm", Adder);
  write("budget.toml", "[limits]\ngates = 25\ndepth = 4\n");
  Outcome R = invoke("check mixed.qasm adder.qasm --budget budget.toml "
                     "--junit junit.xml --markdown summary.md");
  EXPECT_EQ(R.Exit, 1) << R.Err; // the adder is deeper than 4 layers
  std::string Xml = slurp(Dir / "junit.xml");
  auto count = [](const std::string &Text, const std::string &What) {
    size_t N = 0;
    for (size_t At = Text.find(What); At != std::string::npos;
         At = Text.find(What, At + 1))
      ++N;
    return N;
  };
  // Common practice for JUnit XML: a testsuite per file, a testcase per
  // file and metric, a <failure> in each failing one.
  EXPECT_EQ(Xml.rfind("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n", 0), 0u);
  EXPECT_EQ(count(Xml, "<testsuite "), 2u);
  EXPECT_EQ(count(Xml, "</testsuite>"), 2u);
  EXPECT_EQ(count(Xml, "<testcase "), 4u);
  EXPECT_EQ(count(Xml, "<failure "), 1u);
  EXPECT_EQ(count(Xml, "</failure>"), 1u);
  EXPECT_NE(Xml.find("<testsuites name=\"revbound check\" tests=\"4\" "
                     "failures=\"1\""),
            std::string::npos)
      << Xml;
  std::string Md = slurp(Dir / "summary.md");
  EXPECT_NE(Md.find("| file | metric | value | limit | status |\n"
                    "|---|---|---:|---:|---|\n"
                    "| mixed.qasm | `depth` | 4 | 4 | pass |\n"
                    "| mixed.qasm | `gates` | 3 | 25 | pass |\n"
                    "| adder.qasm | `depth` | "),
            std::string::npos)
      << Md;
  EXPECT_NE(Md.find("| adder.qasm | `gates` | 25 | 25 | pass |\n"),
            std::string::npos)
      << Md;
}

TEST_F(CheckCommand, OneOutputMayTakeStandardOutput) {
  write("mixed.qasm", Mixed);
  write("budget.toml", "[limits]\ngates = 3\n");
  Outcome R = invoke("check mixed.qasm --budget budget.toml --sarif -");
  EXPECT_EQ(R.Exit, 0) << R.Err;
  // Only the SARIF log: it parses as one JSON document.
  nlohmann::json Log = nlohmann::json::parse(R.Out);
  EXPECT_EQ(Log["version"], "2.1.0");
  Outcome Both = invoke("check mixed.qasm --budget budget.toml --sarif - "
                        "--junit -");
  EXPECT_EQ(Both.Exit, 2);
  Outcome Unwritable = invoke("check mixed.qasm --budget budget.toml "
                              "--markdown no/such/dir/summary.md");
  EXPECT_EQ(Unwritable.Exit, 2);
  EXPECT_NE(Unwritable.Err.find("cannot write 'no/such/dir/summary.md'"),
            std::string::npos)
      << Unwritable.Err;
}

TEST_F(CheckCommand, UnusedBaselineIsAWarning) {
  write("mixed.qasm", Mixed);
  write("budget.toml", "[limits]\ngates = 3\n");
  Outcome R =
      invoke("check mixed.qasm --budget budget.toml --baseline mixed.qasm");
  EXPECT_EQ(R.Exit, 0);
  EXPECT_EQ(R.Err, "revbound: warning: --baseline mixed.qasm is not used: the "
                   "budget budget.toml has no [growth]\n");
}

} // namespace
