//===- ScheduleTest.cpp - Depths, volume and the critical path ------------===//
//
// Hand-computed schedules, then random nested circuits checked against a
// reference written separately here: a naive expansion to leaves with one
// ready time per wire (the textbook as-soon-as-possible layering, common
// practice), which the summary method must match exactly.
//
//===----------------------------------------------------------------------===//
#include "TestSupport.h"
#include "revbound/analysis/LeafDag.h"
#include "revbound/analysis/Schedule.h"

#include <gtest/gtest.h>

#include <fmt/format.h>
#include <random>

using namespace revbound;
using test::analyzeText;

static const char *Header = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n";

TEST(Schedule, ChainAndVolume) {
  auto R = analyzeText(std::string(Header) +
                       "qreg q[3];\nh q[0];\ncx q[0], q[1];\nh q[1];\n");
  ASSERT_TRUE(R);
  EXPECT_EQ(R->DepthAll, 3u);
  EXPECT_EQ(R->DepthTwoQubit, 1u);
  // q[0]: layers 0..2 -> 2; q[1]: 1..3 -> 2; q[2] unused.
  EXPECT_EQ(R->Volume, 4u);
  EXPECT_EQ(R->Path.Method, "dag");
  ASSERT_EQ(R->Path.Steps, 3u);
  EXPECT_EQ(R->Path.Listed[0].Gate, "h");
  EXPECT_EQ(R->Path.Listed[1].Gate, "cx");
  EXPECT_EQ(R->Path.Listed[1].At.Line, 5u);
  EXPECT_EQ(R->Path.Listed[2].Wires, (std::vector<std::string>{"q[1]"}));
}

TEST(Schedule, BarriersAlignWithoutALayer) {
  auto Without = analyzeText(std::string(Header) + "qreg q[2];\nh q[0];\nh q[1];\n");
  auto With = analyzeText(std::string(Header) +
                          "qreg q[2];\nh q[0];\nbarrier q;\nh q[1];\n");
  ASSERT_TRUE(Without && With);
  EXPECT_EQ(Without->DepthAll, 1u);
  EXPECT_EQ(With->DepthAll, 2u);
  EXPECT_EQ(With->Path.Steps, 2u); // the barrier is not a step
}

TEST(Schedule, MeasureResetAndIfTakeLayers) {
  auto R = analyzeText(std::string(Header) +
                       "qreg q[2];\ncreg c[1];\nh q[0];\nmeasure q[0] -> c[0];\n"
                       "if(c==1) x q[1];\nreset q[0];\n");
  ASSERT_TRUE(R);
  // h (1), measure (2), then x waits for c: 3; reset after measure: 3.
  EXPECT_EQ(R->DepthAll, 3u);
  EXPECT_EQ(R->DepthTwoQubit, 0u);
}

// Conditions read bits: readers run side by side, and a later measurement
// into the bit waits for all of them.
TEST(Schedule, ConditionsReadBitsMeasurementsWriteThem) {
  auto R = analyzeText(std::string(Header) +
                       "qreg q[3];\ncreg c[1];\nif(c==1) h q;\n");
  ASSERT_TRUE(R);
  EXPECT_EQ(R->DepthAll, 1u);
  R = analyzeText(std::string(Header) +
                  "qreg q[3];\ncreg c[1];\nh q[0];\nh q[0];\n"
                  "if(c==1) x q[1];\nmeasure q[0] -> c[0];\nif(c==1) x q[2];\n");
  ASSERT_TRUE(R);
  // x q[1] at layer 1; measure after h h: layer 3; x q[2] reads it: 4.
  EXPECT_EQ(R->DepthAll, 4u);
  R = analyzeText(std::string(Header) +
                  "qreg q[2];\ncreg c[1];\nh q[1];\nh q[1];\nh q[1];\n"
                  "if(c==0) x q[1];\nmeasure q[0] -> c[0];\n");
  ASSERT_TRUE(R);
  // The measurement may not overwrite c before the reader at layer 4 ends.
  EXPECT_EQ(R->DepthAll, 5u);
}

TEST(Schedule, TDepthCountsOnlyTLayers) {
  auto R = analyzeText(std::string(Header) +
                       "qreg q[2];\nt q[0];\nt q[1];\ncx q[0], q[1];\nt q[1];\n"
                       "h q[0];\n");
  ASSERT_TRUE(R);
  EXPECT_EQ(R->DepthT, 2u);
  EXPECT_EQ(R->DepthAll, 3u);
}

namespace {

/// Reference: expand to leaves by brute force and layer them naively. Bits
/// are read by conditions (readers do not wait for each other) and written
/// by measurements (a write waits for the last write and for every reader
/// since); docs/metrics.md states this rule.
struct Reference {
  const ir::Circuit &C;
  analysis::SummaryCache &Cache;
  std::vector<uint64_t> Ready[3], Free[3];
  std::vector<uint64_t> First, Last;

  Reference(const ir::Circuit &C, analysis::SummaryCache &Cache)
      : C(C), Cache(Cache), First(C.NumQubits, UINT64_MAX),
        Last(C.NumQubits, 0) {
    for (int M = 0; M < 3; ++M) {
      Ready[M].assign(C.NumQubits + C.NumClbits, 0);
      Free[M].assign(C.NumQubits + C.NumClbits, 0);
    }
  }

  void place(const std::vector<uint32_t> &Wires, bool Barrier, bool TwoQ,
             bool IsT, const std::vector<uint32_t> &Reads = {}) {
    uint64_t W[3] = {Barrier ? 0u : 1u, TwoQ ? 1u : 0u, IsT ? 1u : 0u};
    for (int M = 0; M < 3; ++M) {
      uint64_t Start = 0;
      for (uint32_t X : Wires)
        Start = std::max(Start, X < C.NumQubits ? Ready[M][X] : Free[M][X]);
      for (uint32_t B : Reads)
        Start = std::max(Start, Ready[M][B]);
      if (M == 0 && !Barrier)
        for (uint32_t X : Wires)
          if (X < C.NumQubits) {
            First[X] = std::min(First[X], Start);
            Last[X] = std::max(Last[X], Start + 1);
          }
      for (uint32_t X : Wires)
        Ready[M][X] = Free[M][X] = Start + W[M];
      for (uint32_t B : Reads)
        Free[M][B] = std::max(Free[M][B], Start + W[M]);
    }
  }

  /// A conditional call: every argument waits for the condition bits, the
  /// body runs, and the bits are free when the last argument is done.
  void conditionalCall(ir::GateId G, const std::vector<uint32_t> &Wires,
                       const std::vector<double> &Params,
                       const std::vector<uint32_t> &Cond) {
    if (Cache.isLeaf(G) || Cond.empty()) {
      if (Cache.isLeaf(G))
        place(Wires, false, Wires.size() >= 2,
              analysis::isTLeaf(C.gate(G), Params), Cond);
      else
        call(G, Wires, Params);
      return;
    }
    for (int M = 0; M < 3; ++M) {
      uint64_t CondReady = 0;
      for (uint32_t B : Cond)
        CondReady = std::max(CondReady, Ready[M][B]);
      for (uint32_t W : Wires)
        Ready[M][W] = std::max(Ready[M][W], CondReady);
    }
    call(G, Wires, Params);
    for (int M = 0; M < 3; ++M) {
      uint64_t Done = 0;
      for (uint32_t X : Wires)
        Done = std::max(Done, Ready[M][X]);
      for (uint32_t B : Cond)
        Free[M][B] = std::max(Free[M][B], Done);
    }
  }

  void call(ir::GateId G, const std::vector<uint32_t> &Wires,
            const std::vector<double> &Params) {
    if (Cache.isLeaf(G)) {
      place(Wires, false, Wires.size() >= 2,
            analysis::isTLeaf(C.gate(G), Params));
      return;
    }
    for (const ir::BodyOp &B : C.gate(G).Body) {
      std::vector<uint32_t> W;
      for (uint32_t L : B.Qubits)
        W.push_back(Wires[L]);
      if (B.IsBarrier) {
        place(W, true, false, false);
        continue;
      }
      std::vector<double> P;
      for (const ir::ParamExpr &E : B.Params)
        P.push_back(E.evaluate(Params));
      call(B.Callee, W, P);
    }
  }
};

/// A random program: nested definitions with barriers and angles, top-level
/// calls, measures and conditions.
std::string randomProgram(std::mt19937 &Rng) {
  auto Pick = [&](int N) { return int(Rng() % unsigned(N)); };
  std::string Text = std::string(Header);
  struct Def {
    std::string Name;
    int Arity;
    bool HasParam;
  };
  std::vector<Def> Defs = {{"h", 1, false}, {"t", 1, false}, {"cx", 2, false},
                           {"ccx", 3, false}, {"rz", 1, true}};
  int NumDefs = 2 + Pick(4);
  for (int D = 0; D < NumDefs; ++D) {
    int Arity = 1 + Pick(4);
    std::string Name = fmt::format("g{}", D);
    Text += fmt::format("gate {}(a) ", Name);
    for (int Q = 0; Q < Arity; ++Q)
      Text += fmt::format("{}w{}", Q ? "," : "", Q);
    Text += " {\n";
    int Len = 1 + Pick(6);
    for (int S = 0; S < Len; ++S) {
      if (Pick(8) == 0) {
        Text += fmt::format("  barrier w{};\n", Pick(Arity));
        continue;
      }
      std::vector<const Def *> Fits;
      for (const Def &X : Defs)
        if (X.Arity <= Arity)
          Fits.push_back(&X);
      const Def &Callee = *Fits[Pick(int(Fits.size()))];
      std::vector<int> Order(Arity);
      for (int I = 0; I < Arity; ++I)
        Order[I] = I;
      std::shuffle(Order.begin(), Order.end(), Rng);
      Text += "  " + Callee.Name;
      if (Callee.HasParam)
        Text += Pick(2) ? "(a)" : "(pi/4)";
      Text += " ";
      for (int I = 0; I < Callee.Arity; ++I)
        Text += fmt::format("{}w{}", I ? "," : "", Order[I]);
      Text += ";\n";
    }
    Text += "}\n";
    Defs.push_back({Name, Arity, true});
  }
  Text += "qreg q[6];\ncreg c[2];\n";
  int Top = 5 + Pick(25);
  for (int S = 0; S < Top; ++S) {
    int Kind = Pick(10);
    if (Kind == 0) {
      Text += fmt::format("measure q[{}] -> c[{}];\n", Pick(6), Pick(2));
      continue;
    }
    if (Kind == 1) {
      Text += fmt::format("barrier q[{}], q[{}];\n", Pick(6), Pick(6));
      continue;
    }
    if (Kind == 3) {
      Text += fmt::format("if(c=={}) measure q[{}] -> c[{}];\n", Pick(4),
                          Pick(6), Pick(2));
      continue;
    }
    const Def &Callee = Defs[Pick(int(Defs.size()))];
    std::vector<int> Order = {0, 1, 2, 3, 4, 5};
    std::shuffle(Order.begin(), Order.end(), Rng);
    if (Kind == 2)
      Text += fmt::format("if(c=={}) ", Pick(4));
    Text += Callee.Name;
    if (Callee.HasParam)
      Text += Pick(2) ? "(pi/4)" : "(0.3)";
    Text += " ";
    for (int I = 0; I < Callee.Arity; ++I)
      Text += fmt::format("{}q[{}]", I ? "," : "", Order[I]);
    Text += ";\n";
  }
  return Text;
}

} // namespace

// Checks that summaries (max-plus matrices) give exactly what a brute-force
// expansion gives, for all three depths and the volume, and that the
// Boost.Graph leaf DAG's longest path has the same length.
TEST(Schedule, SummariesMatchBruteForceOnRandomNestedCircuits) {
  std::mt19937 Rng(20261201);
  for (int Trial = 0; Trial < 300; ++Trial) {
    std::string Text = randomProgram(Rng);
    test::Elaborated E = test::elaborate(Text);
    ASSERT_TRUE(E.Circuit) << E.Error << "\n" << Text;
    const ir::Circuit &C = *E.Circuit;
    analysis::LeafPolicy Policy;
    analysis::SummaryCache Cache(C, Policy);
    llvm::Expected<analysis::Schedule> S = analysis::scheduleCircuit(C, Cache);
    ASSERT_TRUE(bool(S));
    Reference Ref(C, Cache);
    for (const ir::Op &O : C.Ops) {
      auto W = C.wires(O);
      std::vector<uint32_t> Cond;
      if (O.Cond != ir::NoCondition) {
        const ir::Register &R = C.CRegs[C.Conditions[O.Cond].CReg];
        for (uint32_t B = 0; B < R.Size; ++B)
          Cond.push_back(C.NumQubits + R.Offset + B);
      }
      if (O.Kind == ir::OpKind::Measure) {
        Ref.place({W[0], C.NumQubits + W[1]}, false, false, false, Cond);
      } else if (O.Kind == ir::OpKind::Barrier) {
        Ref.place(std::vector<uint32_t>(W.begin(), W.end()), true, false, false);
      } else {
        auto P = C.params(O);
        Ref.conditionalCall(O.Gate, std::vector<uint32_t>(W.begin(), W.end()),
                            std::vector<double>(P.begin(), P.end()), Cond);
      }
    }
    uint64_t Volume = 0;
    for (uint32_t Q = 0; Q < C.NumQubits; ++Q)
      if (Ref.First[Q] != UINT64_MAX)
        Volume += Ref.Last[Q] - Ref.First[Q];
    for (int M = 0; M < 3; ++M) {
      uint64_t Want = 0;
      for (uint64_t V : Ref.Ready[M])
        Want = std::max(Want, V);
      ASSERT_EQ(S->Depth[M], Want) << "metric " << M << "\n" << Text;
    }
    ASSERT_EQ(S->Volume, Volume) << Text;
    auto Dag = analysis::LeafDag::build(C, Cache, 1'000'000);
    ASSERT_TRUE(Dag && *Dag);
    std::vector<uint32_t> Path;
    ASSERT_EQ((*Dag)->longestPath(Path), S->Depth[0]) << Text;
    ASSERT_EQ(Path.size(), S->Depth[0]);
  }
}

// Checks that the summary-method path leaves a call through the wire it
// came in on: here the second one, q[1], which three h put three layers
// deep, while q[0] is fresh and g keeps its wires apart (the path out of
// its first wire starts nowhere). The expected steps follow from ASAP
// layering (common practice): g ends at layer 4 on q[1], after the h.
TEST(Schedule, SummaryPathEntersCallsThroughTheirWire) {
  std::string Text = std::string(Header) +
                     "gate g a, b { x a; x b; }\nqreg q[3];\n"
                     "h q[1];\nh q[1];\nh q[1];\ng q[0], q[1];\n";
  report::AnalysisOptions Opts;
  Opts.MaxDagNodes = 1;
  auto R = analyzeText(Text, Opts);
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Path.Method, "summary");
  EXPECT_EQ(R->DepthAll, 4u);
  std::vector<std::string> Gates;
  for (const auto &S : R->Path.Listed)
    Gates.push_back(S.Gate + "@" + std::to_string(S.At.Line));
  EXPECT_EQ(Gates, (std::vector<std::string>{"h@5", "h@6", "h@7", "g@8"}));
}

// Checks the summary-method critical path: consecutive steps share a wire
// and the steps' own delays add up to the depth, on a circuit too large for
// the leaf DAG.
TEST(Schedule, SummaryPathIsConnected) {
  std::string Text = std::string(Header) +
                     "gate blk a, b { h a; cx a, b; t b; cx b, a; }\n"
                     "qreg q[4];\nblk q[0], q[1];\nblk q[1], q[2];\nh q[3];\n"
                     "blk q[2], q[3];\nblk q[0], q[3];\n";
  report::AnalysisOptions Opts;
  Opts.MaxDagNodes = 3;
  auto R = analyzeText(Text, Opts);
  ASSERT_TRUE(R);
  EXPECT_EQ(R->Path.Method, "summary");
  auto Full = analyzeText(Text);
  ASSERT_TRUE(Full);
  EXPECT_EQ(Full->Path.Method, "dag");
  EXPECT_EQ(R->DepthAll, Full->DepthAll);
  EXPECT_EQ(Full->Path.Steps, Full->DepthAll);
  ASSERT_GE(R->Path.Listed.size(), 2u);
  for (size_t I = 1; I < R->Path.Listed.size(); ++I) {
    const auto &A = R->Path.Listed[I - 1].Wires, &B = R->Path.Listed[I].Wires;
    bool Shared = false;
    for (const auto &X : A)
      for (const auto &Y : B)
        Shared |= X == Y;
    EXPECT_TRUE(Shared) << "steps " << I - 1 << " and " << I;
  }
}
