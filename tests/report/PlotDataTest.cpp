//===- PlotDataTest.cpp - Erasure layers, hotspots and the energy frontier ===//
//
// Checks the report fields the HTML plots are drawn from, against values
// derived by hand here:
//  - layers from the as-soon-as-possible schedule (common practice: an
//    operation starts once every wire it uses is free; one layer per leaf,
//    measure and reset), with the OpenQASM 2.0 barrier aligning the wires it
//    names (Cross et al., arXiv:1707.03429, section 3: "barrier" prevents
//    reordering across it), and a measurement into a bit waiting for the
//    operations that read the bit before it (write-after-read ordering,
//    common practice; docs/metrics.md states the rule);
//  - the pooled frontier T = action / E with the action of an orthogonal
//    step pi hbar / 2 = h / 4 (Margolus & Levitin, Physica D 120, 188
//    (1998); h = 6.62607015e-34 J s exact, SI Brochure, 9th edition, 2019).
//
//===----------------------------------------------------------------------===//
#include "TestSupport.h"
#include "revbound/analysis/OpLayers.h"
#include "revbound/analysis/Schedule.h"
#include "revbound/report/Writers.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>

using namespace revbound;

namespace {

const report::ErasureEntry *find(const report::CircuitReport &R,
                                 const std::string &Kind,
                                 const std::string &Wire) {
  for (const report::ErasureEntry &X : R.Erasures.List)
    if (X.Kind == Kind && X.Wire == Wire)
      return &X;
  return nullptr;
}

constexpr double H = 6.62607015e-34; // J s, exact (SI 2019)

} // namespace

TEST(PlotData, ResetStartsWhenItsQubitIsFree) {
  // h q[0] takes layer 0, cx q[0],q[1] layer 1, so reset q[1] waits for
  // the cx: layer 2. reset q[0] after cx q[0],a[0] (layer 2): layer 3.
  auto R = test::analyzeText("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                             "qreg q[2];\nh q[0];\ncx q[0],q[1];\n"
                             "reset q[1];\nx q[0];\nreset q[0];\n");
  ASSERT_TRUE(R);
  ASSERT_EQ(R->DepthAll, 4u); // h, cx, x, reset on q[0]
  const report::ErasureEntry *Q1 = find(*R, "reset", "q[1]");
  const report::ErasureEntry *Q0 = find(*R, "reset", "q[0]");
  ASSERT_TRUE(Q1 && Q0);
  EXPECT_EQ(Q1->Layer, 2u);
  EXPECT_EQ(Q0->Layer, 3u);
}

TEST(PlotData, BarrierAlignsBeforeReset) {
  // q[0] is busy for layers 0 and 1; the barrier holds q[1] back to 2.
  auto R = test::analyzeText("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                             "qreg q[2];\nh q[0];\nh q[0];\n"
                             "barrier q[0],q[1];\nreset q[1];\n");
  ASSERT_TRUE(R);
  const report::ErasureEntry *X = find(*R, "reset", "q[1]");
  ASSERT_TRUE(X);
  EXPECT_EQ(X->Layer, 2u);
}

TEST(PlotData, ResetAfterACallSeesTheBody) {
  // In `two`, wire a ends after cx (layer 1), wire b after h b (layer 2):
  // expanding by hand, h a is layer 0, cx a,b layer 1, h b layer 2.
  auto R = test::analyzeText("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                             "gate two a,b { h a; cx a,b; h b; }\n"
                             "qreg q[2];\ntwo q[0],q[1];\n"
                             "reset q[0];\nreset q[1];\n");
  ASSERT_TRUE(R);
  const report::ErasureEntry *Q0 = find(*R, "reset", "q[0]");
  const report::ErasureEntry *Q1 = find(*R, "reset", "q[1]");
  ASSERT_TRUE(Q0 && Q1);
  EXPECT_EQ(Q0->Layer, 2u);
  EXPECT_EQ(Q1->Layer, 3u);
}

TEST(PlotData, OverwriteWaitsForTheReadersOfItsBit) {
  // h q[0] L0; measure q[0]->c[0] L1 (c known from 2); h q[1] x3 L0-2;
  // if (c==1) x q[1] starts at max(3, 2) = 3 and reads c until 4;
  // h q[2] L0; measure q[2]->c[0] overwrites c: q[2] is free at 1, but the
  // write waits for the reader, so layer 4.
  auto R = test::analyzeText("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                             "qreg q[3];\ncreg c[1];\nh q[0];\n"
                             "measure q[0] -> c[0];\nh q[1];\nh q[1];\n"
                             "h q[1];\nif (c==1) x q[1];\nh q[2];\n"
                             "measure q[2] -> c[0];\n");
  ASSERT_TRUE(R);
  const report::ErasureEntry *X = find(*R, "overwrite", "c[0]");
  ASSERT_TRUE(X);
  EXPECT_EQ(X->Layer, 4u);
  EXPECT_EQ(X->At.Line, 12u);
  EXPECT_EQ(R->DepthAll, 5u);
}

TEST(PlotData, DiscardSitsAfterTheLastLayer) {
  // The ancilla ends entangled with q[0], so it is discarded at the end:
  // layer depth.all (h L0, cx L1: depth 2).
  auto R = test::analyzeText("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                             "//! ancilla a\nqreg q[1];\nqreg a[1];\n"
                             "h q[0];\ncx q[0],a[0];\n");
  ASSERT_TRUE(R);
  const report::ErasureEntry *X = find(*R, "discard", "a[0]");
  ASSERT_TRUE(X);
  EXPECT_EQ(R->DepthAll, 2u);
  EXPECT_EQ(X->Layer, 2u);
}

TEST(PlotData, StartLayersAgreeWithTheScheduleDepth) {
  // The walk behind the layers and the depth schedule must be one schedule:
  // their depths agree on circuits with calls, conditions, barriers and
  // bits measured twice.
  const char *Programs[] = {
      "qreg q[3];\ncreg c[2];\nh q[0];\nmeasure q[0] -> c[0];\n"
      "if (c==1) cx q[1],q[2];\nif (c==1) x q[0];\nmeasure q[1] -> c[1];\n"
      "barrier q;\nreset q[2];\n",
      "gate g a,b,c { cx a,b; barrier a,c; h c; ccx a,b,c; }\nqreg q[4];\n"
      "creg k[1];\ng q[0],q[1],q[2];\nmeasure q[3] -> k[0];\n"
      "if (k==0) g q[1],q[2],q[3];\nreset q[0];\n",
      "qreg q[2];\ncreg c[1];\nmeasure q[0] -> c[0];\nif (c==1) h q[1];\n"
      "if (c==1) h q[0];\nmeasure q[0] -> c[0];\n",
  };
  for (const char *Body : Programs) {
    test::Elaborated E = test::elaborate(
        std::string("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n") + Body);
    ASSERT_TRUE(E.Circuit) << E.Error;
    analysis::LeafPolicy Policy;
    analysis::SummaryCache Cache(*E.Circuit, Policy);
    llvm::Expected<analysis::Schedule> S =
        analysis::scheduleCircuit(*E.Circuit, Cache);
    ASSERT_TRUE(bool(S));
    std::vector<uint32_t> All(E.Circuit->Ops.size());
    for (uint32_t I = 0; I < All.size(); ++I)
      All[I] = I;
    llvm::Expected<analysis::OpLayers> L =
        analysis::startLayers(*E.Circuit, Cache, All);
    ASSERT_TRUE(bool(L));
    EXPECT_EQ(L->Depth, S->Depth[unsigned(analysis::DepthMetric::All)]) << Body;
    EXPECT_EQ(L->Start.size(), All.size());
  }
}

TEST(PlotData, MetricsExampleLayers) {
  // docs/metrics.md's example: the first measurement takes the first layer,
  // both x share the second, the second measurement the third.
  test::Elaborated E = test::elaborate(
      "OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[3];\ncreg c[1];\n"
      "measure q[0] -> c[0];\nif (c==1) x q[1];\nif (c==1) x q[2];\n"
      "measure q[0] -> c[0];\n");
  ASSERT_TRUE(E.Circuit) << E.Error;
  analysis::LeafPolicy Policy;
  analysis::SummaryCache Cache(*E.Circuit, Policy);
  llvm::Expected<analysis::OpLayers> L =
      analysis::startLayers(*E.Circuit, Cache, {0, 1, 2, 3});
  ASSERT_TRUE(bool(L));
  EXPECT_EQ(L->Start, (std::vector<uint64_t>{0, 1, 1, 2}));
  EXPECT_EQ(L->Depth, 3u);
}

TEST(PlotData, HotspotsGroupByLine) {
  // `reset q;` broadcasts to two resets on line 4, of qubits still |0>:
  // 0 bits each. After h and cx, q[0] is half of a Bell pair, its reduced
  // state I/2 (Nielsen & Chuang (2000), section 2.4.3): 1 bit of entropy,
  // which the reset on line 7 removes (Reeb & Wolf, New J. Phys. 16,
  // 103011 (2014)). So line 7 comes first although line 4 has two events.
  auto R = test::analyzeText("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                             "qreg q[2];\nreset q;\nh q[0];\ncx q[0],q[1];\n"
                             "reset q[0];\n");
  ASSERT_TRUE(R);
  const auto &Hot = R->Erasures.Hotspots;
  ASSERT_EQ(Hot.size(), 2u);
  double Sum4Low = 0, Sum4High = 0;
  for (const report::ErasureEntry &X : R->Erasures.List)
    if (X.At.Line == 4) {
      Sum4Low += X.BitsLow;
      Sum4High += X.BitsHigh;
    }
  EXPECT_EQ(Hot[0].Line, 7u);
  EXPECT_EQ(Hot[0].Events, 1u);
  EXPECT_DOUBLE_EQ(Hot[0].BitsHigh, 1.0);
  EXPECT_EQ(Hot[1].Line, 4u);
  EXPECT_EQ(Hot[1].Events, 2u);
  EXPECT_EQ(Hot[1].BitsLow, Sum4Low);
  EXPECT_EQ(Hot[1].BitsHigh, Sum4High);
  EXPECT_EQ(Hot[1].BitsHigh, 0.0);
}

TEST(PlotData, PooledFrontierIsActionOverEnergy) {
  // Four x gates, each an orthogonal step of action h/4: action = h. Three
  // run on q[0] one after another: path action 3h/4 at one qubit each.
  report::AnalysisOptions Opts;
  Opts.Energy.EnergyJ = 1e-20;
  auto R = test::analyzeText("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                             "qreg q[2];\nx q[0];\nx q[0];\nx q[0];\n"
                             "x q[1];\n",
                             Opts);
  ASSERT_TRUE(R);
  const analysis::EnergyFrontier &F = R->Speed.Frontier;
  EXPECT_EQ(F.Anchor, analysis::FrontierAnchor::Energy);
  ASSERT_EQ(F.Points.size(), 2u * analysis::FrontierHalfDecades + 1);
  for (size_t I = 0; I < F.Points.size(); ++I) {
    const analysis::FrontierPoint &P = F.Points[I];
    EXPECT_NEAR(P.PooledTimeS * P.EnergyJ / H, 1.0, 1e-12);
    EXPECT_NEAR(P.PerQubitTimeS * P.EnergyJ / (0.75 * H), 1.0, 1e-12);
    if (I > 0) // half a decade apart
      EXPECT_NEAR(P.EnergyJ / F.Points[I - 1].EnergyJ, std::sqrt(10.0), 1e-12);
  }
  // The middle point is the given energy, and its time the report's.
  const analysis::FrontierPoint &Mid = F.Points[analysis::FrontierHalfDecades];
  EXPECT_EQ(Mid.EnergyJ, 1e-20);
  EXPECT_EQ(Mid.PooledTimeS, *R->Speed.Bounds.PooledTimeS);
  EXPECT_NEAR(F.Points.front().EnergyJ, 1e-23, 1e-35);
  EXPECT_NEAR(F.Points.back().EnergyJ, 1e-17, 1e-29);
}

TEST(PlotData, FrontierWithoutEnergyIsAroundOneElectronvolt) {
  auto R = test::analyzeText("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                             "qreg q[1];\nh q[0];\n");
  ASSERT_TRUE(R);
  const analysis::EnergyFrontier &F = R->Speed.Frontier;
  EXPECT_EQ(F.Anchor, analysis::FrontierAnchor::Default);
  // 1 eV = 1.602176634e-19 J exactly (SI Brochure, 9th edition, 2019).
  EXPECT_EQ(F.AnchorJ, 1.602176634e-19);
  EXPECT_EQ(F.Points[analysis::FrontierHalfDecades].EnergyJ, 1.602176634e-19);
}

TEST(PlotData, JsonCarriesLayersHotspotsAndFrontier) {
  report::AnalysisOptions Opts;
  Opts.Energy.EnergyPerQubitJ = 2e-21;
  auto R = test::analyzeText("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                             "qreg q[2];\nh q[0];\ncx q[0],q[1];\n"
                             "reset q[1];\n",
                             Opts);
  ASSERT_TRUE(R);
  report::Report Rep;
  Rep.Circuits.push_back(*R);
  nlohmann::json J = nlohmann::json::parse(report::writeJson(Rep));
  const nlohmann::json &C = J["circuits"][0];
  ASSERT_EQ(C["erasures"]["list"].size(), 1u);
  EXPECT_EQ(C["erasures"]["list"][0]["layer"], 2); // h L0, cx L1, reset L2
  ASSERT_EQ(C["erasures"]["hotspots"].size(), 1u);
  EXPECT_EQ(C["erasures"]["hotspots"][0]["line"], 6);
  EXPECT_EQ(C["erasures"]["hotspots"][0]["events"], 1);
  const nlohmann::json &F = C["speed"]["frontier"];
  EXPECT_EQ(F["anchor"], "energy_per_qubit");
  EXPECT_EQ(F["anchor_J"].get<double>(), 2e-21);
  ASSERT_EQ(F["points"].size(), 13u);
  const nlohmann::json &Mid = F["points"][6];
  EXPECT_EQ(Mid["energy_J"].get<double>(), 2e-21);
  EXPECT_EQ(Mid["per_qubit_s"].get<double>(),
            C["speed"]["time_s"]["per_qubit"].get<double>());
  EXPECT_NEAR(Mid["pooled_s"].get<double>() * 2e-21 /
                  C["speed"]["action_Js"].get<double>(),
              1.0, 1e-15);
}
