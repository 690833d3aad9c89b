//===- PublishedConstructionsTest.cpp - Circuits from published recipes --===//
//
// Circuits generated here from their published construction, with the
// counts and depths the construction implies derived by hand below; and
// nested definitions whose expansion passes 2^60 operations, counted and
// scheduled exactly, and refused past 2^64 - 1 instead of wrapping.
//
//===----------------------------------------------------------------------===//
#include "CorpusSupport.h"

#include "revbound/analysis/Census.h"
#include "revbound/analysis/Schedule.h"
#include "revbound/report/Report.h"

#include <gtest/gtest.h>

#include <fmt/format.h>

using namespace revbound;
using namespace revbound::test;

namespace {

/// Census, schedule and report of one program, or the first error.
struct Analysed {
  Loaded Source;
  std::optional<analysis::Census> Census;
  std::optional<analysis::Schedule> Schedule;
  std::string CensusError, ScheduleError;
  ResolvedLocation CensusErrorAt, ScheduleErrorAt;
};

std::string takeMessage(llvm::Error E, const SourceFiles &Files,
                        ResolvedLocation &At) {
  std::string Out;
  llvm::handleAllErrors(std::move(E), [&](const DiagnosticError &D) {
    At = resolve(Files.mgr(), D.diagnostic().Loc);
    Out = formatDiagnostic(Files.mgr(), D.diagnostic());
  });
  return Out;
}

Analysed analyse(const std::string &Text) {
  Analysed A;
  A.Source = loadText("generated.qasm", Text, {});
  if (!A.Source.Circuit) {
    ADD_FAILURE() << A.Source.ErrorText;
    return A;
  }
  const ir::Circuit &C = *A.Source.Circuit;
  analysis::LeafPolicy Policy; // native granularity
  {
    analysis::SummaryCache Cache(C, Policy);
    llvm::Expected<analysis::Census> Cs = analysis::takeCensus(C, Cache);
    if (Cs)
      A.Census = std::move(*Cs);
    else
      A.CensusError =
          takeMessage(Cs.takeError(), *A.Source.Files, A.CensusErrorAt);
  }
  {
    analysis::SummaryCache Cache(C, Policy);
    llvm::Expected<analysis::Schedule> S = analysis::scheduleCircuit(C, Cache);
    if (S)
      A.Schedule = std::move(*S);
    else
      A.ScheduleError =
          takeMessage(S.takeError(), *A.Source.Files, A.ScheduleErrorAt);
  }
  // The report takes the census on the schedule's walk (Schedule.h); where
  // the schedule succeeds that must give what the two give alone.
  if (A.Schedule) {
    analysis::SummaryCache Cache(C, Policy);
    analysis::CensusTally Tally(C);
    llvm::Expected<analysis::Schedule> S =
        analysis::scheduleCircuit(C, Cache, &Tally);
    llvm::Expected<analysis::Census> Cs =
        S ? Tally.finish(Cache)
          : llvm::Expected<analysis::Census>(S.takeError());
    if (!S || !Cs) {
      ResolvedLocation At;
      std::string Message = takeMessage(Cs.takeError(), *A.Source.Files, At);
      if (A.Census || !S)
        ADD_FAILURE() << "the walk with a tally failed alone: " << Message;
      else
        EXPECT_EQ(Message, A.CensusError);
    } else {
      EXPECT_TRUE(A.Census && *Cs == *A.Census);
      EXPECT_TRUE(*S == *A.Schedule);
    }
  }
  return A;
}

uint64_t depthOf(const analysis::Schedule &S, analysis::DepthMetric M) {
  return S.Depth[unsigned(M)];
}

//===----------------------------------------------------------------------===//
// Cuccaro, Draper, Kutin, Moulton, "A new quantum ripple-carry addition
// circuit", quant-ph/0410184 (2004).
//
// The construction as we remember the paper's figures (from memory; the
// standard's examples/generic/adder.qasm, which cites the same paper, has the
// same two gate bodies): MAJ on (c_i, b_i, a_i) is CNOT a_i -> b_i,
// CNOT a_i -> c_i, Toffoli(c_i, b_i -> a_i), leaving the carry c_{i+1} in
// a_i; UMA, the 2-CNOT version, is Toffoli(c_i, b_i -> a_i),
// CNOT a_i -> c_i, CNOT c_i -> b_i. The n-bit adder with carry-out chains
// MAJ(c_0, b_0, a_0), MAJ(a_{i-1}, b_i, a_i) for i = 1..n-1, copies the
// carry with CNOT a_{n-1} -> z, and undoes the chain with UMA in reverse,
// leaving a + b in b. So it uses 2n Toffoli and 2n + 1 + 2n = 4n + 1 CNOT
// gates, as the paper counts them (from memory) and as counting the
// construction gives.
//===----------------------------------------------------------------------===//

std::string cuccaroAdder(unsigned N) {
  std::string S = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                  "gate majority a,b,c { cx c,b; cx c,a; ccx a,b,c; }\n"
                  "gate unmaj a,b,c { ccx a,b,c; cx c,a; cx a,b; }\n";
  S += fmt::format("qreg cin[1];\nqreg a[{0}];\nqreg b[{0}];\nqreg cout[1];\n",
                   N);
  S += "majority cin[0],b[0],a[0];\n";
  for (unsigned I = 1; I < N; ++I)
    S += fmt::format("majority a[{}],b[{}],a[{}];\n", I - 1, I, I);
  S += fmt::format("cx a[{}],cout[0];\n", N - 1);
  for (unsigned I = N - 1; I >= 1; --I)
    S += fmt::format("unmaj a[{}],b[{}],a[{}];\n", I - 1, I, I);
  S += "unmaj cin[0],b[0],a[0];\n";
  return S;
}

// Checks the gate counts of the Cuccaro et al. adder at native granularity
// (ccx a leaf) and fully expanded.
TEST(CuccaroAdder, GateCountsMatchTheConstruction) {
  for (unsigned N : {1u, 2u, 3u, 4u, 5u, 6u, 7u, 8u, 9u, 10u, 11u, 12u, 13u,
                     14u, 15u, 16u, 32u, 64u}) {
    SCOPED_TRACE(fmt::format("n = {}", N));
    Analysed A = analyse(cuccaroAdder(N));
    ASSERT_TRUE(A.Census) << A.CensusError;
    const analysis::Census &C = *A.Census;
    // Cuccaro et al., quant-ph/0410184: 2n Toffoli, 4n + 1 CNOT.
    EXPECT_EQ(countOf(C.ByName, "ccx"), 2u * N);
    EXPECT_EQ(countOf(C.ByName, "cx"), 4u * N + 1);
    EXPECT_EQ(C.ByName.size(), 2u);
    EXPECT_EQ(C.Gates, 6u * N + 1);
    EXPECT_EQ(C.TwoQubit, 6u * N + 1); // every leaf acts on 2 or 3 qubits
    EXPECT_EQ(countOf(C.AsWritten, "majority"), N);
    EXPECT_EQ(countOf(C.AsWritten, "unmaj"), N);
    EXPECT_EQ(countOf(C.AsWritten, "cx"), 1u);
    // Fully expanded, with the Toffoli as 6 CNOT and 9 one-qubit gates
    // (Nielsen & Chuang, figure 4.9; the standard's qelib1.inc body):
    // 6 * 2n + 4n + 1 CX and 9 * 2n U.
    EXPECT_EQ(C.PrimitiveCX, 16u * N + 1);
    EXPECT_EQ(C.PrimitiveU, 18u * N);
    EXPECT_EQ(C.TCount, 0u); // ccx is a leaf, and not a T gate
  }
}

// Checks the depth of the adder when every gate takes one layer.
//
// Derived by hand (not a figure of the paper). A purely sequential chain,
// one gate per layer, would take as many layers as gates, 6n + 1. Our
// scheduler is as-soon-as-possible, and it finds parallelism: the first
// CNOT of MAJ_i (a_i -> b_i) touches only a_i and b_i, which nothing has
// used before, so all n of these CNOTs run in layer 1. Then, writing T(w)
// for the layer after which wire w is free:
//  - MAJ_0: CNOT a_0 -> c_0 in layer 2, Toffoli in layer 3.
//  - MAJ_i, i >= 1: its CNOT a_i -> a_{i-1} waits for MAJ_{i-1}'s Toffoli,
//    which ends in layer 2(i-1) + 3, so it runs in layer 2i + 2 and its
//    Toffoli in layer 2i + 3. MAJ_{n-1} ends in layer 2n + 1.
//  - CNOT a_{n-1} -> z: layer 2n + 2.
//  - UMA_{n-1} (if n >= 2; for n = 1 read UMA_0 with c_0 for a_{n-2}): its
//    Toffoli needs a_{n-1} (free after 2n + 2), so it runs in 2n + 3, then
//    2n + 4, 2n + 5. Each UMA_i, i < n - 1, starts with a_i, which the last
//    CNOT of UMA_{i+1} (a_i -> b_{i+1}) frees, so UMA_i ends 3 layers after
//    UMA_{i+1}: UMA_0 ends in layer 2n + 5 + 3(n - 1) = 5n + 2.
// Hence depth 5n + 2: the sequential 6n + 1 less the n - 1 CNOTs that share
// layer 1. Every leaf acts on two or more qubits, so the two-qubit depth is
// the same; there is no T leaf, so the T depth is 0.
TEST(CuccaroAdder, AsapDepthIsFiveNPlusTwo) {
  for (unsigned N : {1u, 2u, 3u, 4u, 5u, 6u, 7u, 8u, 9u, 10u, 11u, 12u, 13u,
                     14u, 15u, 16u, 32u, 64u}) {
    SCOPED_TRACE(fmt::format("n = {}", N));
    Analysed A = analyse(cuccaroAdder(N));
    ASSERT_TRUE(A.Schedule) << A.ScheduleError;
    EXPECT_EQ(depthOf(*A.Schedule, analysis::DepthMetric::All), 5u * N + 2);
    EXPECT_EQ(depthOf(*A.Schedule, analysis::DepthMetric::TwoQubit),
              5u * N + 2);
    EXPECT_EQ(depthOf(*A.Schedule, analysis::DepthMetric::T), 0u);
  }
}

// Checks that the leaf graph (a second, independent longest-path
// computation) finds the same 5n + 2 layers, with one leaf per layer on the
// path.
TEST(CuccaroAdder, LeafGraphAgreesOnTheCriticalPath) {
  for (unsigned N : {1u, 4u, 16u, 64u}) {
    SCOPED_TRACE(fmt::format("n = {}", N));
    Loaded L = loadText("adder.qasm", cuccaroAdder(N), {});
    ASSERT_TRUE(L.Circuit) << L.ErrorText;
    llvm::Expected<report::CircuitReport> R = report::analyzeCircuit(
        *L.Circuit, *L.Files, "adder.qasm", report::AnalysisOptions());
    ASSERT_TRUE(bool(R)) << llvm::toString(R.takeError());
    EXPECT_EQ(R->Path.Method, "dag");
    EXPECT_EQ(R->Path.Length, 5u * N + 2);
    EXPECT_EQ(R->Path.Steps, 5u * N + 2);
    EXPECT_EQ(R->DepthAll, 5u * N + 2);
  }
}

// Checks the generated 4-bit adder against the standard's own example of
// the same construction (openqasm/openqasm @0af8b84,
// examples/generic/adder.qasm), which adds 5 x gates to set its inputs.
TEST(CuccaroAdder, MatchesTheStandardsExample) {
  REVBOUND_REQUIRE_SHARED("openqasm2/examples/generic/adder.qasm");
  fs::path P = sharedPath("openqasm2/examples/generic/adder.qasm");
  Loaded L = loadFile(P, {});
  ASSERT_TRUE(L.Circuit) << L.ErrorText;
  analysis::LeafPolicy Policy;
  analysis::SummaryCache Cache(*L.Circuit, Policy);
  llvm::Expected<analysis::Census> Theirs =
      analysis::takeCensus(*L.Circuit, Cache);
  ASSERT_TRUE(bool(Theirs)) << llvm::toString(Theirs.takeError());
  Analysed Ours = analyse(cuccaroAdder(4));
  ASSERT_TRUE(Ours.Census) << Ours.CensusError;
  // adder.qasm: `x a[0];` and `x b;` on a 4-qubit register.
  EXPECT_EQ(countOf(Theirs->ByName, "x"), 5u);
  EXPECT_EQ(countOf(Theirs->ByName, "ccx"),
            countOf(Ours.Census->ByName, "ccx"));
  EXPECT_EQ(countOf(Theirs->ByName, "cx"), countOf(Ours.Census->ByName, "cx"));
  EXPECT_EQ(Theirs->PrimitiveCX, Ours.Census->PrimitiveCX);
}

//===----------------------------------------------------------------------===//
// Nested definitions: g0 a { x a; }, g{k+1} a { g{k} a; g{k} a; }, so g_k
// expands to exactly 2^k x gates in a chain of 2^k layers (by induction).
//===----------------------------------------------------------------------===//

std::string doublingChain(unsigned K, unsigned Qubits = 1) {
  std::string S =
      "OPENQASM 2.0;\ninclude \"qelib1.inc\";\ngate g0 a { x a; }\n";
  for (unsigned J = 1; J <= K; ++J)
    S += fmt::format("gate g{} a {{ g{} a; g{} a; }}\n", J, J - 1, J - 1);
  S += fmt::format("qreg q[{}];\n", Qubits);
  return S;
}

constexpr uint64_t pow2(unsigned K) { return uint64_t(1) << K; }

// Checks that 2^60 leaf applications are counted and scheduled exactly.
TEST(NestedDefinitions, TwoToTheSixtyCountedAndScheduled) {
  std::string Text = doublingChain(60) + "g60 q[0];\n";
  Analysed A = analyse(Text);
  ASSERT_TRUE(A.Census) << A.CensusError;
  ASSERT_TRUE(A.Schedule) << A.ScheduleError;
  EXPECT_EQ(A.Census->Gates, pow2(60));
  EXPECT_EQ(countOf(A.Census->ByName, "x"), pow2(60));
  EXPECT_EQ(countOf(A.Census->AsWritten, "g60"), 1u);
  EXPECT_EQ(A.Census->PrimitiveU, pow2(60)); // x = u3 = one U
  EXPECT_EQ(A.Census->PrimitiveCX, 0u);
  EXPECT_EQ(A.Census->TwoQubit, 0u);
  EXPECT_EQ(depthOf(*A.Schedule, analysis::DepthMetric::All), pow2(60));
  EXPECT_EQ(depthOf(*A.Schedule, analysis::DepthMetric::TwoQubit), 0u);
  EXPECT_EQ(A.Schedule->Volume, pow2(60)); // one qubit busy throughout

  // The report path too: the leaf graph is far too large, so the critical
  // path comes from the summaries.
  llvm::Expected<report::CircuitReport> R =
      report::analyzeCircuit(*A.Source.Circuit, *A.Source.Files,
                             "generated.qasm", report::AnalysisOptions());
  ASSERT_TRUE(bool(R)) << llvm::toString(R.takeError());
  EXPECT_EQ(R->Ops.Gates, pow2(60));
  EXPECT_EQ(R->DepthAll, pow2(60));
  EXPECT_EQ(R->Path.Method, "summary");
  EXPECT_EQ(R->Path.Length, pow2(60));
}

// Checks that depth and count part ways at this size: on two wires,
// p0 a,b { x a; x b; } and p{k+1} a,b { p{k} a,b; p{k} b,a; } make p_k
// 2^(k+1) gates but only 2^k layers, the wires never interacting.
TEST(NestedDefinitions, DepthAndCountPartWaysPastTwoToTheSixty) {
  std::string S = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                  "gate p0 a,b { x a; x b; }\n";
  for (unsigned J = 1; J <= 60; ++J)
    S += fmt::format("gate p{} a,b {{ p{} a,b; p{} b,a; }}\n", J, J - 1, J - 1);
  S += "qreg q[2];\np60 q[0],q[1];\n";
  Analysed A = analyse(S);
  ASSERT_TRUE(A.Census) << A.CensusError;
  ASSERT_TRUE(A.Schedule) << A.ScheduleError;
  EXPECT_EQ(A.Census->Gates, pow2(61));
  EXPECT_EQ(depthOf(*A.Schedule, analysis::DepthMetric::All), pow2(60));
  EXPECT_EQ(A.Schedule->Volume, pow2(61));
}

// Checks 2^63, the largest power of two a 64-bit count holds.
TEST(NestedDefinitions, TwoToTheSixtyThreeCountedAndScheduled) {
  Analysed A = analyse(doublingChain(63) + "g63 q[0];\n");
  ASSERT_TRUE(A.Census) << A.CensusError;
  ASSERT_TRUE(A.Schedule) << A.ScheduleError;
  EXPECT_EQ(A.Census->Gates, pow2(63));
  EXPECT_EQ(countOf(A.Census->ByName, "x"), pow2(63));
  EXPECT_EQ(depthOf(*A.Schedule, analysis::DepthMetric::All), pow2(63));
}

// Checks that 2^64, one past what 64 bits hold, is an error at the call and
// not a wrapped count (DESIGN.md: counts are exact; Census.h: "a count past
// 2^64 - 1 is an error, never a wrapped number").
TEST(NestedDefinitions, TwoToTheSixtyFourIsAnError) {
  std::string Text = doublingChain(64) + "g64 q[0];\n";
  unsigned CallLine = firstLineStartingWith(Text, "g64 q[0];");
  Analysed A = analyse(Text);
  EXPECT_FALSE(A.Census);
  EXPECT_NE(A.CensusError.find("2^64"), std::string::npos) << A.CensusError;
  EXPECT_EQ(A.CensusErrorAt.Line, CallLine) << A.CensusError;
  EXPECT_FALSE(A.Schedule);
  EXPECT_NE(A.ScheduleError.find("2^64"), std::string::npos) << A.ScheduleError;
  EXPECT_EQ(A.ScheduleErrorAt.Line, CallLine) << A.ScheduleError;
  llvm::Expected<report::CircuitReport> R =
      report::analyzeCircuit(*A.Source.Circuit, *A.Source.Files,
                             "generated.qasm", report::AnalysisOptions());
  EXPECT_FALSE(bool(R));
  if (!R)
    llvm::consumeError(R.takeError());
}

// Checks that two calls of g63 on one wire, 2^64 gates in 2^64 layers in
// all, overflow at the top level as well: the second call is the error.
TEST(NestedDefinitions, TopLevelSumPastTwoToTheSixtyFourIsAnError) {
  std::string Text = doublingChain(63) + "g63 q[0];\ng63 q[0];\n";
  Analysed A = analyse(Text);
  EXPECT_FALSE(A.Census);
  EXPECT_NE(A.CensusError.find("2^64"), std::string::npos) << A.CensusError;
  EXPECT_EQ(A.CensusErrorAt.Line, firstLineStartingWith(Text, "g63 q[0];") + 1)
      << A.CensusError;
  EXPECT_FALSE(A.Schedule);
  EXPECT_NE(A.ScheduleError.find("2^64"), std::string::npos) << A.ScheduleError;
}

// Checks that the report gives the census's error where the census and the
// schedule both fail, as when the census ran first on its own: here the
// depth passes 2^64 - 1 at the last x, and the count only at the end.
TEST(NestedDefinitions, ReportGivesTheCensusErrorBeforeTheDepthError) {
  std::string Text = doublingChain(63);
  for (unsigned J = 1; J <= 63; ++J)
    Text += fmt::format("g{} q[0];\n", J);
  Text += "x q[0];\nx q[0];\n";
  Analysed A = analyse(Text);
  ASSERT_FALSE(A.Census);
  ASSERT_FALSE(A.Schedule);
  ASSERT_NE(A.CensusError, A.ScheduleError);
  llvm::Expected<report::CircuitReport> R =
      report::analyzeCircuit(*A.Source.Circuit, *A.Source.Files,
                             "generated.qasm", report::AnalysisOptions());
  ASSERT_FALSE(bool(R));
  ResolvedLocation At;
  EXPECT_EQ(takeMessage(R.takeError(), *A.Source.Files, At), A.CensusError);
}

// Checks the exact boundary: g0 .. g63 on separate wires expand to
// 2^0 + ... + 2^63 = 2^64 - 1 gates, which a 64-bit count still holds.
TEST(NestedDefinitions, CountOfExactlyTwoToTheSixtyFourMinusOne) {
  std::string Text = doublingChain(63, 64);
  for (unsigned J = 0; J <= 63; ++J)
    Text += fmt::format("g{} q[{}];\n", J, J);
  Analysed A = analyse(Text);
  ASSERT_TRUE(A.Census) << A.CensusError;
  EXPECT_EQ(A.Census->Gates, UINT64_MAX);
  EXPECT_EQ(countOf(A.Census->ByName, "x"), UINT64_MAX);
  ASSERT_TRUE(A.Schedule) << A.ScheduleError;
  EXPECT_EQ(depthOf(*A.Schedule, analysis::DepthMetric::All), pow2(63));
}

// Checks that one more top-level leaf after 2^64 - 1 counted gates is an
// error, not a count that wraps to 0.
TEST(NestedDefinitions, LeafAfterTwoToTheSixtyFourMinusOneIsAnError) {
  std::string Text = doublingChain(63, 65);
  for (unsigned J = 0; J <= 63; ++J)
    Text += fmt::format("g{} q[{}];\n", J, J);
  Text += "x q[64];\n";
  Analysed A = analyse(Text);
  EXPECT_FALSE(A.Census) << "census gave Gates = "
                         << (A.Census ? A.Census->Gates : 0);
  EXPECT_NE(A.CensusError.find("2^64"), std::string::npos) << A.CensusError;
  EXPECT_EQ(A.CensusErrorAt.Line, firstLineStartingWith(Text, "x q[64];"))
      << A.CensusError;
}

// The same with an opaque leaf, which counts as a gate (Census.h: "opaque
// ones included") but adds nothing to the U/CX totals, so only the gate
// count itself can catch the overflow.
TEST(NestedDefinitions, OpaqueLeafAfterTwoToTheSixtyFourMinusOneIsAnError) {
  std::string Text = doublingChain(63, 65) + "opaque o a;\n";
  for (unsigned J = 0; J <= 63; ++J)
    Text += fmt::format("g{} q[{}];\n", J, J);
  Text += "o q[64];\n";
  Analysed A = analyse(Text);
  EXPECT_FALSE(A.Census) << "census gave Gates = "
                         << (A.Census ? A.Census->Gates : 0);
  EXPECT_NE(A.CensusError.find("2^64"), std::string::npos) << A.CensusError;
  EXPECT_EQ(A.CensusErrorAt.Line, firstLineStartingWith(Text, "o q[64];"))
      << A.CensusError;
}

// Checks the depth boundary on one wire: g1 .. g63 in a row take
// 2^1 + ... + 2^63 = 2^64 - 2 layers; one more x makes 2^64 - 1, which
// Schedule.h allows ("fails only when a depth passes 2^64 - 1"); a second
// x passes it and must be an error, not a depth that wraps to 0.
TEST(NestedDefinitions, DepthPastTwoToTheSixtyFourMinusOneIsAnError) {
  std::string Base = doublingChain(63);
  for (unsigned J = 1; J <= 63; ++J)
    Base += fmt::format("g{} q[0];\n", J);
  {
    Analysed A = analyse(Base + "x q[0];\n");
    ASSERT_TRUE(A.Schedule) << A.ScheduleError;
    EXPECT_EQ(depthOf(*A.Schedule, analysis::DepthMetric::All), UINT64_MAX);
  }
  {
    std::string Text = Base + "x q[0];\nx q[0];\n";
    Analysed A = analyse(Text);
    EXPECT_FALSE(A.Schedule)
        << "schedule gave depth "
        << (A.Schedule ? depthOf(*A.Schedule, analysis::DepthMetric::All) : 0);
    EXPECT_NE(A.ScheduleError.find("2^64"), std::string::npos)
        << A.ScheduleError;
  }
}

// Checks the spacetime volume past 64 bits: a cx, g63 on the first wire,
// another cx. Both wires are busy from layer 0 to layer 2^63 + 2 (the second
// wire waits for the first), 2^64 + 4 qubit-layers in all, which no uint64_t
// holds, from only 2^63 + 2 gates in 2^63 + 2 layers. The schedule must fail
// rather than report a wrapped volume (DESIGN.md: counts are exact, never
// wrapped); Schedule.h promises failure only for depths, but a wrapped
// volume is never right.
TEST(NestedDefinitions, VolumePastTwoToTheSixtyFourIsAnError) {
  Analysed A = analyse(doublingChain(63, 2) +
                       "cx q[0],q[1];\ng63 q[0];\ncx q[0],q[1];\n");
  ASSERT_TRUE(A.Census) << A.CensusError;
  EXPECT_EQ(A.Census->Gates, pow2(63) + 2);
  EXPECT_FALSE(A.Schedule)
      << "schedule gave depth "
      << (A.Schedule ? depthOf(*A.Schedule, analysis::DepthMetric::All) : 0)
      << " and volume " << (A.Schedule ? A.Schedule->Volume : 0);
}

// Checks that 2^64 - 1 layers reached through a call are allowed too: the
// sum g0 .. g63 on one wire (Schedule.h: "fails only when a depth passes
// 2^64 - 1").
TEST(NestedDefinitions, DepthOfExactlyTwoToTheSixtyFourMinusOneByCalls) {
  std::string Text = doublingChain(63);
  for (unsigned J = 0; J <= 63; ++J)
    Text += fmt::format("g{} q[0];\n", J);
  Analysed A = analyse(Text);
  ASSERT_TRUE(A.Census) << A.CensusError;
  EXPECT_EQ(A.Census->Gates, UINT64_MAX);
  ASSERT_TRUE(A.Schedule) << A.ScheduleError;
  EXPECT_EQ(depthOf(*A.Schedule, analysis::DepthMetric::All), UINT64_MAX);
}

} // namespace
