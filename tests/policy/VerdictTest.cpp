//===- VerdictTest.cpp - Reports held to budgets and baselines ------------===//
//
// The circuits are small enough that every metric is derived by hand in the
// comments; the budget semantics (value == limit passes, growth rounds
// down, entropy and heat held at the high end) are docs/check.md's.
//
//===----------------------------------------------------------------------===//
#include "revbound/policy/Verdict.h"

#include "TestSupport.h"

#include <gtest/gtest.h>

#include <cmath>

namespace {

using namespace revbound;
using namespace revbound::policy;

// Lines 7 to 10 hold the operations.
//  t a[0]            phase only: a stays a basis state (DESIGN.md, monomial)
//  cx a[0], a[1]     a1' = a0 xor a1
//  ccx a[0], a[1], anc[0]   anc = a0 and a1' = a0 and not a1
//  reset a[0]
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

// Binary entropy H2(1/4) = 2 - (3/4) log2 3 (Shannon, Bell Syst. Tech. J.
// 27, 379 (1948)): anc = a0 and not a1 is 1 for one input in four.
const double H2Quarter = 2 - 0.75 * std::log2(3.0);
// The reset erases the uniform input bit a0: its marginal entropy, 1 bit
// (Reeb & Wolf, New J. Phys. 16, 103011 (2014), as DESIGN.md's ledger
// charges it). The dirty ancilla is discarded with H2(1/4) more.
const double MixedBits = 1 + H2Quarter;
// k_B T ln 2 per bit at 300 K, k_B = 1.380649e-23 J/K exactly (SI 2019;
// Landauer, IBM J. Res. Dev. 5, 183 (1961)).
const double JoulesPerBitAt300K = 1.380649e-23 * 300 * std::log(2.0);
// h = 6.62607015e-34 J s exactly (SI 2019). An X flips a basis state to an
// orthogonal one, which takes t >= pi hbar / (2E) (Margolus & Levitin,
// Physica D 120, 188 (1998)): an action of pi hbar / 2 = h / 4 per X.
const double PlanckJs = 6.62607015e-34;

report::CircuitReport
analyzed(const char *Text,
         semantics::EngineChoice Engine = semantics::EngineChoice::Auto) {
  report::AnalysisOptions Opts;
  Opts.Engine.Choice = Engine;
  std::optional<report::CircuitReport> R = test::analyzeText(Text, Opts);
  EXPECT_TRUE(R) << "does not analyse:\n" << Text;
  return R ? std::move(*R) : report::CircuitReport{};
}

Budget limitBudget(Metric M, Amount Ceiling) {
  Budget B;
  B.File = "b.toml";
  B.Limits.push_back({M, Ceiling, {"b.toml", 2, 1}});
  return B;
}

CheckResult onlyCheck(const Budget &B, const report::CircuitReport &C,
                      const Baseline *Base = nullptr) {
  llvm::Expected<CheckReport> R = evaluate(B, {C}, Base);
  EXPECT_TRUE(bool(R));
  if (!R) {
    llvm::consumeError(R.takeError());
    return {};
  }
  EXPECT_EQ(R->Files.size(), 1u);
  EXPECT_EQ(R->Files[0].Checks.size(), 1u);
  return R->Files[0].Checks[0];
}

TEST(Verdict, MetricsOfAHandCountedCircuit) {
  report::CircuitReport C = analyzed(Mixed);
  MetricSet S = metricsOf(C);
  EXPECT_EQ(S[Metric::Qubits]->Count, 3u); // a[2] and anc[1]
  EXPECT_EQ(S[Metric::Gates]->Count, 3u);  // t, cx, ccx; a reset is no gate
  EXPECT_EQ(S[Metric::TCount]->Count, 1u); // the one t
  // Each operation shares a[0] with the one before it: 4 layers, two of
  // them (cx, ccx) on two or more qubits.
  EXPECT_EQ(S[Metric::Depth]->Count, 4u);
  EXPECT_EQ(S[Metric::TwoQubitDepth]->Count, 2u);
  // The reset and the discard of the dirty ancilla.
  EXPECT_EQ(S[Metric::ErasureEvents]->Count, 2u);
  EXPECT_EQ(S[Metric::DirtyAncillas]->Count, 1u);
  EXPECT_NEAR(S[Metric::EntropyBits]->Real, MixedBits, 1e-12);
  EXPECT_NEAR(S[Metric::HeatJ]->Real / (MixedBits * JoulesPerBitAt300K), 1,
              1e-12);
}

TEST(Verdict, CountLimitsHoldAtTheirValueAndFailOneBelow) {
  report::CircuitReport C = analyzed(Mixed);
  struct {
    Metric M;
    uint64_t Value; // derived in MetricsOfAHandCountedCircuit
  } Cases[] = {{Metric::Qubits, 3},        {Metric::Gates, 3},
               {Metric::TCount, 1},        {Metric::Depth, 4},
               {Metric::TwoQubitDepth, 2}, {Metric::ErasureEvents, 2},
               {Metric::DirtyAncillas, 1}};
  for (const auto &Case : Cases) {
    SCOPED_TRACE(metricName(Case.M).str());
    CheckResult At =
        onlyCheck(limitBudget(Case.M, Amount::count(Case.Value)), C);
    EXPECT_EQ(At.Status, CheckStatus::Passed) << At.Message;
    EXPECT_NE(At.Message.find("within the limit"), std::string::npos);
    CheckResult Below =
        onlyCheck(limitBudget(Case.M, Amount::count(Case.Value - 1)), C);
    EXPECT_EQ(Below.Status, CheckStatus::Failed) << Below.Message;
    EXPECT_EQ(Below.Value.Count, Case.Value);
    EXPECT_EQ(Below.Allowed.Count, Case.Value - 1);
    EXPECT_NE(
        Below.Message.find("over the limit " + std::to_string(Case.Value - 1)),
        std::string::npos)
        << Below.Message;
  }
}

TEST(Verdict, RealLimitsHoldAtTheirValueAndFailJustBelow) {
  report::CircuitReport C = analyzed(Mixed);
  report::CircuitReport Flips =
      analyzed("OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[2];\n"
               "x q[0];\nx q[1];\n");
  struct {
    Metric M;
    double Value;
    const report::CircuitReport *Circuit;
  } Cases[] = {{Metric::EntropyBits, MixedBits, &C},
               {Metric::HeatJ, MixedBits * JoulesPerBitAt300K, &C},
               {Metric::ActionJs, 2 * PlanckJs / 4, &Flips}};
  for (const auto &Case : Cases) {
    SCOPED_TRACE(metricName(Case.M).str());
    CheckResult At =
        onlyCheck(limitBudget(Case.M, Amount::real(Case.Value)), *Case.Circuit);
    EXPECT_EQ(At.Status, CheckStatus::Passed) << At.Message;
    CheckResult Below =
        onlyCheck(limitBudget(Case.M, Amount::real(Case.Value * (1 - 1e-6))),
                  *Case.Circuit);
    EXPECT_EQ(Below.Status, CheckStatus::Failed) << Below.Message;
  }
}

TEST(Verdict, EntropyIsHeldAtTheHighEndOfItsInterval) {
  // The structural engine knows nothing of an input bit: its reset erases
  // between 0 and 1 bit (docs/erasures.md, "Engines").
  const char *ResetInput =
      "OPENQASM 2.0;\n//! input a\nqreg a[1];\nreset a[0];\n";
  report::CircuitReport Vague =
      analyzed(ResetInput, semantics::EngineChoice::Structural);
  CheckResult Half =
      onlyCheck(limitBudget(Metric::EntropyBits, Amount::real(0.5)), Vague);
  EXPECT_EQ(Half.Status, CheckStatus::Failed);
  EXPECT_EQ(Half.Message, "may erase up to 1 bit (at least 0 bits), over the "
                          "limit 0.5 bits");
  ASSERT_EQ(Half.Places.size(), 1u);
  EXPECT_EQ(Half.Places[0].At.Line, 4u);
  EXPECT_EQ(Half.Places[0].What, "reset a[0]: 0 to 1 bits");
  CheckResult One =
      onlyCheck(limitBudget(Metric::EntropyBits, Amount::real(1)), Vague);
  EXPECT_EQ(One.Status, CheckStatus::Passed);
  // The classical engine proves the bit uniform: exactly 1 bit.
  report::CircuitReport Exact = analyzed(ResetInput);
  CheckResult E =
      onlyCheck(limitBudget(Metric::EntropyBits, Amount::real(0.5)), Exact);
  EXPECT_EQ(E.Message, "erases 1 bit, over the limit 0.5 bits");
}

TEST(Verdict, FailuresPointAtTheirPlaces) {
  report::CircuitReport C = analyzed(Mixed);
  CheckResult Events =
      onlyCheck(limitBudget(Metric::ErasureEvents, Amount::count(0)), C);
  EXPECT_EQ(Events.Message, "2 erasure events, over the limit 0 events");
  ASSERT_EQ(Events.Places.size(), 2u);
  // The reset on line 10; the discard at the ancilla's last operation, the
  // ccx of line 9 (docs/erasures.md).
  EXPECT_EQ(Events.Places[0].At.Line, 10u);
  EXPECT_EQ(Events.Places[0].At.File, "test.qasm");
  EXPECT_EQ(Events.Places[0].What.substr(0, 11), "reset a[0]:");
  EXPECT_EQ(Events.Places[1].At.Line, 9u);
  EXPECT_EQ(Events.Places[1].What.substr(0, 16), "discard anc[0]: ");

  CheckResult Dirty =
      onlyCheck(limitBudget(Metric::DirtyAncillas, Amount::count(0)), C);
  EXPECT_EQ(Dirty.Message, "1 ancilla not proved clean (anc[0] dirty), over "
                           "the limit 0 ancillas");
  ASSERT_EQ(Dirty.Places.size(), 1u);
  EXPECT_EQ(Dirty.Places[0].At.Line, 9u);
  // anc = a0 and not a1 is 1 only for a0 = 1, a1 = 0: "01" with the
  // highest index first (docs/json.md).
  EXPECT_EQ(Dirty.Places[0].What, "ancilla anc[0] dirty (ends at 1 for a=01)");

  CheckResult Depth =
      onlyCheck(limitBudget(Metric::Depth, Amount::count(3)), C);
  EXPECT_EQ(Depth.Message, "depth 4 layers, over the limit 3 layers");
  ASSERT_EQ(Depth.Places.size(), 4u);
  EXPECT_EQ(Depth.PlacesTotal, 4u);
  EXPECT_EQ(Depth.Places[0].At.Line, 7u);
  EXPECT_EQ(Depth.Places[0].What, "critical path: t a[0]");
  EXPECT_EQ(Depth.Places[2].What, "critical path: ccx a[0], a[1], anc[0]");
  EXPECT_EQ(Depth.Places[3].At.Line, 10u);
}

TEST(Verdict, PlacesAreCapped) {
  // Thirty resets of an input register: thirty events, twenty listed.
  std::string Text = "OPENQASM 2.0;\n//! input a\nqreg a[30];\nreset a;\n";
  report::CircuitReport C = analyzed(Text.c_str());
  CheckResult R =
      onlyCheck(limitBudget(Metric::ErasureEvents, Amount::count(29)), C);
  EXPECT_EQ(R.Status, CheckStatus::Failed);
  EXPECT_EQ(R.PlacesTotal, 30u);
  EXPECT_EQ(R.Places.size(), 20u); // CheckOptions::MaxPlaces
}

Baseline circuitBaseline(const report::CircuitReport &C) {
  Baseline B;
  B.Source = "base.qasm";
  B.SingleCircuit = true;
  B.Circuits.emplace_back(C.File, metricsOf(C));
  return B;
}

Budget growthBudget(Metric M, const char *Percent) {
  Budget B;
  B.File = "b.toml";
  B.HasGrowthTable = true;
  B.GrowthTable = {"b.toml", 1, 1};
  llvm::Expected<uint64_t> Micros = parseGrowthPercent(Percent);
  EXPECT_TRUE(bool(Micros));
  B.Growth.push_back({M, Micros ? *Micros : 0, Percent, {"b.toml", 2, 1}});
  return B;
}

TEST(Verdict, CountGrowthIsExactAndRoundsDown) {
  report::CircuitReport Old = analyzed(Mixed);
  // One more layer: x a[0] after the reset (depth 5).
  std::string Longer = std::string(Mixed) + "x a[0];\n";
  report::CircuitReport New = analyzed(Longer.c_str());
  Baseline Base = circuitBaseline(Old);
  // 4 x 1.25 = 5: allowed; 4 x 1.24999 = 4.99996, a depth of at most 4.
  CheckResult Quarter =
      onlyCheck(growthBudget(Metric::Depth, "25%"), New, &Base);
  EXPECT_EQ(Quarter.Status, CheckStatus::Passed) << Quarter.Message;
  EXPECT_EQ(Quarter.Allowed.Count, 5u);
  CheckResult Under =
      onlyCheck(growthBudget(Metric::Depth, "24.999%"), New, &Base);
  EXPECT_EQ(Under.Status, CheckStatus::Failed);
  EXPECT_EQ(Under.Allowed.Count, 4u);
  ASSERT_TRUE(Under.BaselineValue);
  EXPECT_EQ(Under.BaselineValue->Count, 4u);
  EXPECT_EQ(Under.Message, "depth 5 layers, grown past the baseline's 4 "
                           "layers + 24.999% (at most 4 layers)");
  // Gates 3 -> 4: 3 x 1.33 = 3.99 fails, 3 x 1.334 = 4.002 holds.
  EXPECT_EQ(onlyCheck(growthBudget(Metric::Gates, "33%"), New, &Base).Status,
            CheckStatus::Failed);
  EXPECT_EQ(onlyCheck(growthBudget(Metric::Gates, "33.4%"), New, &Base).Status,
            CheckStatus::Passed);
  // The same circuit does not grow: 0% holds, for the doubles too.
  Baseline Same = circuitBaseline(Old);
  for (Metric M : allMetrics())
    EXPECT_EQ(onlyCheck(growthBudget(M, "0%"), Old, &Same).Status,
              CheckStatus::Passed)
        << metricName(M).str();
}

TEST(Verdict, GrowthFromZeroAllowsNothing) {
  // No erasure in the baseline: any erasure is more than any percentage of 0.
  report::CircuitReport Clean =
      analyzed("OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[1];\nx q[0];\n");
  report::CircuitReport Erasing = analyzed(Mixed);
  Baseline Base = circuitBaseline(Clean);
  CheckResult R = onlyCheck(growthBudget(Metric::ErasureEvents, "1000000%"),
                            Erasing, &Base);
  EXPECT_EQ(R.Status, CheckStatus::Failed);
  EXPECT_EQ(R.Allowed.Count, 0u);
}

TEST(Verdict, FilesAreMatchedByPathAndNewFilesSkipGrowth) {
  report::CircuitReport C = analyzed(Mixed); // File "test.qasm"
  Baseline Base;
  Base.Source = "base.json";
  Base.Circuits.emplace_back("./test.qasm", metricsOf(C));
  Budget B = growthBudget(Metric::Depth, "0%");
  EXPECT_EQ(onlyCheck(B, C, &Base).Status, CheckStatus::Passed);
  Base.Circuits[0].first = "other.qasm";
  llvm::Expected<CheckReport> R = evaluate(B, {C}, &Base);
  ASSERT_TRUE(bool(R));
  ASSERT_EQ(R->Files[0].Checks.size(), 1u);
  EXPECT_EQ(R->Files[0].Checks[0].Status, CheckStatus::Skipped);
  EXPECT_EQ(R->Skipped, 1u);
  EXPECT_EQ(R->Failed, 0u);
  ASSERT_EQ(R->Files[0].Notes.size(), 1u);
  EXPECT_EQ(R->Files[0].Notes[0], "not in the baseline base.json (a new file): "
                                  "growth checks skipped");
}

TEST(Verdict, BaselineMisuseIsAnError) {
  Budget B = growthBudget(Metric::Depth, "5%");
  B.GrowthTable = {"b.toml", 7, 1};
  llvm::Error Missing = checkBaselineUse(B, "", false, 1);
  EXPECT_EQ(llvm::toString(std::move(Missing)),
            "b.toml:7:1: error: [growth] compares with a baseline, but no "
            "--baseline was given; pass --baseline FILE (a circuit or a JSON "
            "report)");
  llvm::Error Several = checkBaselineUse(B, "base.qasm", true, 2);
  EXPECT_EQ(llvm::toString(std::move(Several)),
            "--baseline base.qasm: a circuit baseline stands for one checked "
            "file, but 2 are checked; give a JSON report (revbound report "
            "--format json -o FILE) whose circuits are matched by path");
  EXPECT_FALSE(bool(checkBaselineUse(B, "base.json", false, 2)));
  // Limits alone need no baseline, even beside an empty [growth].
  Budget EmptyGrowth = limitBudget(Metric::Depth, Amount::count(1));
  EmptyGrowth.HasGrowthTable = true;
  EXPECT_FALSE(bool(checkBaselineUse(EmptyGrowth, "", false, 1)));
  EXPECT_FALSE(bool(checkBaselineUse(
      limitBudget(Metric::Depth, Amount::count(1)), "", false, 3)));
  report::CircuitReport C = analyzed(Mixed);
  llvm::Expected<CheckReport> R = evaluate(B, {C}, nullptr);
  EXPECT_FALSE(bool(R));
  llvm::consumeError(R.takeError());
}

TEST(Verdict, TotalsCountEveryCheck) {
  report::CircuitReport C = analyzed(Mixed);
  Budget B = limitBudget(Metric::Depth, Amount::count(4));    // passes
  B.Limits.push_back({Metric::Gates, Amount::count(2), {}});  // fails
  B.Limits.push_back({Metric::Qubits, Amount::count(3), {}}); // passes
  llvm::Expected<CheckReport> R = evaluate(B, {C, C}, nullptr);
  ASSERT_TRUE(bool(R));
  EXPECT_EQ(R->Files.size(), 2u);
  EXPECT_EQ(R->Passed, 4u);
  EXPECT_EQ(R->Failed, 2u);
  EXPECT_EQ(R->Skipped, 0u);
}

} // namespace
