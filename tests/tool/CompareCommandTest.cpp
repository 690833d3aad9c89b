//===- CompareCommandTest.cpp - `revbound compare` as users run it --------===//
//
// The adder of Cuccaro et al. (arXiv:quant-ph/0410184) against its variants
// (tests/ReversibleAdders.h): the table in every format, the verdicts and
// the exit codes of DESIGN.md (0 ok, 1 not equivalent, 2 bad input).
//
//===----------------------------------------------------------------------===//
#include "ReversibleAdders.h"
#include "ToolRunner.h"

#include <nlohmann/json.hpp>

#include <gtest/gtest.h>

#include <algorithm>
#include <cstring>

namespace revbound::test {
namespace {

class CompareCommand : public ToolTest {
protected:
  void SetUp() override {
    ToolTest::SetUp();
    write("ref.qasm", cuccaroQasm(2));
    AdderVariant CT;
    CT.CliffordT = 2;
    write("ct.qasm", cuccaroQasm(2, CT));
    AdderVariant Drop;
    Drop.Dropped = 4;
    write("drop.qasm", cuccaroQasm(2, Drop));
    AdderVariant Renamed;
    Renamed.RenameA = "x";
    write("renamed.qasm", cuccaroQasm(2, Renamed));
  }

  const nlohmann::json *metric(const nlohmann::json &J, const std::string &Key) {
    for (const nlohmann::json &M : J["metrics"])
      if (M["key"] == Key)
        return &M;
    return nullptr;
  }
};

/// Splits one CSV line (RFC 4180, section 2) into its fields.
std::vector<std::string> csvFields(const std::string &Line) {
  std::vector<std::string> Out(1);
  bool Quoted = false;
  for (size_t I = 0; I < Line.size(); ++I) {
    char C = Line[I];
    if (Quoted) {
      if (C == '"' && I + 1 < Line.size() && Line[I + 1] == '"') {
        Out.back() += '"';
        ++I;
      } else if (C == '"') {
        Quoted = false;
      } else {
        Out.back() += C;
      }
    } else if (C == '"') {
      Quoted = true;
    } else if (C == ',') {
      Out.emplace_back();
    } else {
      Out.back() += C;
    }
  }
  return Out;
}

std::vector<std::string> lines(const std::string &Text, const char *Break) {
  std::vector<std::string> Out;
  size_t Start = 0, End;
  while ((End = Text.find(Break, Start)) != std::string::npos) {
    Out.push_back(Text.substr(Start, End - Start));
    Start = End + std::strlen(Break);
  }
  return Out;
}

// The Clifford+T Toffoli has 15 gates for the Toffoli's one (Nielsen &
// Chuang figure 4.9): 13 + 14 = 27 gates, T-count 7.
TEST_F(CompareCommand, JsonTableHasDeltasAndTheBest) {
  Outcome R = invoke("compare ref.qasm ct.qasm --format json");
  ASSERT_EQ(R.Exit, 0) << R.Err;
  nlohmann::json J = nlohmann::json::parse(R.Out);
  EXPECT_EQ(J["schema"], "revbound/compare-1");
  EXPECT_EQ(J["reference"], "ref.qasm");
  EXPECT_TRUE(J["equivalence"].is_null());
  const nlohmann::json *Gates = metric(J, "gates");
  ASSERT_TRUE(Gates);
  EXPECT_EQ((*Gates)["values"], nlohmann::json::array({13, 27}));
  EXPECT_TRUE((*Gates)["deltas"][0].is_null());
  EXPECT_EQ((*Gates)["deltas"][1], 14);
  EXPECT_EQ((*Gates)["best"], nlohmann::json::array({0}));
  const nlohmann::json *T = metric(J, "t_count");
  ASSERT_TRUE(T);
  EXPECT_EQ((*T)["values"], nlohmann::json::array({0, 7}));
  // Equal values mark no best.
  const nlohmann::json *Qubits = metric(J, "qubits");
  ASSERT_TRUE(Qubits);
  EXPECT_TRUE((*Qubits)["best"].empty());
}

TEST_F(CompareCommand, EquivalentCandidateExitsZero) {
  Outcome R = invoke("compare --equivalence ref.qasm ct.qasm --format json");
  ASSERT_EQ(R.Exit, 0) << R.Err;
  nlohmann::json J = nlohmann::json::parse(R.Out);
  ASSERT_EQ(J["equivalence"].size(), 1u);
  EXPECT_EQ(J["equivalence"][0]["candidate"], "ct.qasm");
  EXPECT_EQ(J["equivalence"][0]["verdict"], "equivalent");
  EXPECT_EQ(J["equivalence"][0]["method"], "exact");
  EXPECT_EQ(J["equivalence"][0]["ancillas_clean"]["candidate"], true);
}

TEST_F(CompareCommand, DroppedGateExitsOneWithAWitness) {
  Outcome R =
      invoke("compare --equivalence ref.qasm ct.qasm drop.qasm --format json");
  ASSERT_EQ(R.Exit, 1) << R.Err;
  nlohmann::json J = nlohmann::json::parse(R.Out);
  ASSERT_EQ(J["equivalence"].size(), 2u);
  const nlohmann::json &V = J["equivalence"][1];
  EXPECT_EQ(V["verdict"], "not_equivalent");
  ASSERT_TRUE(V["witness"].is_object());
  std::string A = V["witness"]["input"]["a"], B = V["witness"]["input"]["b"];
  std::map<std::string, bool> Ref = runGates(cuccaroGates(2), adderInput(A, B));
  std::map<std::string, bool> Drop =
      runGates(cuccaroGates(2), adderInput(A, B), 4);
  Ref.erase("cin[0]");
  Drop.erase("cin[0]");
  EXPECT_NE(Ref, Drop) << "witness a=" << A << " b=" << B;
  // The text says so too.
  Outcome Text = invoke("compare --equivalence ref.qasm drop.qasm");
  EXPECT_EQ(Text.Exit, 1);
  EXPECT_NE(Text.Out.find("drop.qasm: NOT equivalent"), std::string::npos)
      << Text.Out;
  EXPECT_NE(Text.Out.find("witness: input a="), std::string::npos);
}

TEST_F(CompareCommand, RenamedRegisterIsBadInput) {
  Outcome R = invoke("compare --equivalence ref.qasm renamed.qasm");
  EXPECT_EQ(R.Exit, 2);
  EXPECT_NE(R.Err.find("renamed.qasm: error: against the reference ref.qasm: "
                       "interfaces differ"),
            std::string::npos)
      << R.Err;
  // Without --equivalence the costs are still compared.
  EXPECT_EQ(invoke("compare ref.qasm renamed.qasm").Exit, 0);
}

TEST_F(CompareCommand, NeedsTwoFiles) {
  Outcome R = invoke("compare ref.qasm");
  EXPECT_EQ(R.Exit, 2);
  EXPECT_NE(R.Err.find("at least two circuits"), std::string::npos) << R.Err;
}

// RFC 4180: CRLF line ends, a field with a comma is quoted.
TEST_F(CompareCommand, CsvIsOneLinePerMetricAndFile) {
  write("with,comma.qasm", cuccaroQasm(2));
  Outcome R = invoke("compare ref.qasm 'with,comma.qasm' --format csv");
  ASSERT_EQ(R.Exit, 0) << R.Err;
  std::vector<std::string> L = lines(R.Out, "\r\n");
  ASSERT_GT(L.size(), 3u);
  EXPECT_EQ(L[0], "metric,unit,file,value,delta,delta_percent,best");
  EXPECT_EQ((L.size() - 1) % 2, 0u);
  bool SawQuoted = false;
  for (size_t I = 1; I < L.size(); ++I) {
    std::vector<std::string> F = csvFields(L[I]);
    ASSERT_EQ(F.size(), 7u) << L[I];
    SawQuoted |= F[2] == "with,comma.qasm";
    if (F[0] == "gates")
      EXPECT_EQ(F[3], "13");
  }
  EXPECT_TRUE(SawQuoted);
}

TEST_F(CompareCommand, MarkdownIsATable) {
  Outcome R = invoke("compare --equivalence ref.qasm ct.qasm --format markdown");
  ASSERT_EQ(R.Exit, 0) << R.Err;
  EXPECT_NE(R.Out.find("- ct.qasm: equivalent"), std::string::npos) << R.Out;
  EXPECT_NE(R.Out.find("| metric | unit | ref.qasm (reference) | ct.qasm |\n"
                       "|---|---|---:|---:|\n"),
            std::string::npos)
      << R.Out;
  EXPECT_NE(R.Out.find("| gates |  | **13** | 27 +14 (+107.7%) |"),
            std::string::npos)
      << R.Out;
}

// `report --format csv|markdown` print the same figures as compare, without
// changes: one CSV line per circuit, one Markdown row per metric.
TEST_F(CompareCommand, ReportTablesShareTheMetrics) {
  Outcome Csv = invoke("report ref.qasm ct.qasm --format csv");
  ASSERT_EQ(Csv.Exit, 0) << Csv.Err;
  std::vector<std::string> L = lines(Csv.Out, "\r\n");
  ASSERT_EQ(L.size(), 3u) << Csv.Out;
  std::vector<std::string> Keys = csvFields(L[0]);
  ASSERT_GE(Keys.size(), 4u);
  EXPECT_EQ(Keys[0], "file");
  auto Column = [&](const std::string &Key) {
    return size_t(std::find(Keys.begin(), Keys.end(), Key) - Keys.begin());
  };
  ASSERT_LT(Column("gates"), Keys.size());
  ASSERT_LT(Column("t_count"), Keys.size());
  std::vector<std::string> Ct = csvFields(L[2]);
  ASSERT_EQ(Ct.size(), Keys.size());
  EXPECT_EQ(Ct[0], "ct.qasm");
  EXPECT_EQ(Ct[Column("gates")], "27");
  EXPECT_EQ(Ct[Column("t_count")], "7");

  Outcome Md = invoke("report ref.qasm ct.qasm --format markdown");
  ASSERT_EQ(Md.Exit, 0) << Md.Err;
  EXPECT_NE(Md.Out.find("| gates |  | 13 | 27 |"), std::string::npos) << Md.Out;
}

} // namespace
} // namespace revbound::test
