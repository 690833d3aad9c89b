//===- BudgetTest.cpp - Reading budget files: values, errors, positions ---===//
//
// Budgets are TOML (TOML v1.0.0, https://toml.io/en/v1.0.0); the tables and
// metric names are DESIGN.md's interface contract. Positions in expected
// errors are counted by hand in the text of each test: lines and columns
// from 1, a key's column where the key is wrong, the value's where the value
// is.
//
//===----------------------------------------------------------------------===//
#include "revbound/policy/Budget.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

namespace {

using namespace revbound;
using namespace revbound::policy;

/// The printed error of a budget that must fail.
std::string errorOf(const std::string &Text) {
  config::ConfigError Error;
  std::optional<Budget> B = parseBudget(Text, "b.toml", Error);
  EXPECT_FALSE(B) << "accepted: " << Text;
  return Error.format();
}

TEST(Budget, ReadsLimitsAndGrowthInMetricOrder) {
  // checks that each table's rules come out by metric (DESIGN.md's order),
  // with the key's position, counts as integers and doubles as doubles.
  config::ConfigError Error;
  std::optional<Budget> B = parseBudget("# CI budget\n"
                                        "[limits]\n"
                                        "depth = 12\n"
                                        "erasure_events = 0\n"
                                        "entropy_bits = 1.5\n"
                                        "\n"
                                        "[growth]\n"
                                        "gates = \"2.5%\"\n",
                                        "b.toml", Error);
  ASSERT_TRUE(B) << Error.format();
  ASSERT_EQ(B->Limits.size(), 3u);
  EXPECT_EQ(B->Limits[0].M, Metric::ErasureEvents);
  EXPECT_TRUE(B->Limits[0].Ceiling.IsCount);
  EXPECT_EQ(B->Limits[0].Ceiling.Count, 0u);
  EXPECT_EQ(B->Limits[0].At.Line, 4u);
  EXPECT_EQ(B->Limits[0].At.Column, 1u);
  EXPECT_EQ(B->Limits[1].M, Metric::EntropyBits);
  EXPECT_FALSE(B->Limits[1].Ceiling.IsCount);
  EXPECT_EQ(B->Limits[1].Ceiling.Real, 1.5);
  EXPECT_EQ(B->Limits[2].M, Metric::Depth);
  EXPECT_EQ(B->Limits[2].Ceiling.Count, 12u);
  EXPECT_EQ(B->Limits[2].At.Line, 3u);
  ASSERT_EQ(B->Growth.size(), 1u);
  EXPECT_EQ(B->Growth[0].M, Metric::Gates);
  EXPECT_EQ(B->Growth[0].PercentMicros, 2'500'000u); // 2.5 x 10^6
  EXPECT_EQ(B->Growth[0].Written, "2.5%");
  EXPECT_EQ(B->Growth[0].At.Line, 8u);
  ASSERT_TRUE(B->HasGrowthTable);
  EXPECT_EQ(B->GrowthTable.Line, 7u); // the '[' of [growth]
  EXPECT_EQ(B->GrowthTable.Column, 1u);
}

TEST(Budget, EveryMetricNameIsAccepted) {
  // checks the ten names of DESIGN.md's contract, each as a limit.
  std::string Text = "[limits]\n";
  const char *Names[] = {"erasure_events", "entropy_bits",    "dirty_ancillas",
                         "depth",          "two_qubit_depth", "t_count",
                         "gates",          "qubits",          "action_Js",
                         "heat_J"};
  for (const char *N : Names)
    Text += std::string(N) + " = 1\n";
  config::ConfigError Error;
  std::optional<Budget> B = parseBudget(Text, "b.toml", Error);
  ASSERT_TRUE(B) << Error.format();
  ASSERT_EQ(B->Limits.size(), 10u);
  for (unsigned I = 0; I < 10; ++I)
    EXPECT_EQ(metricName(B->Limits[I].M), Names[I]);
  // entropy_bits, action_Js and heat_J are real-valued: 1 reads as 1.0.
  EXPECT_FALSE(B->Limits[1].Ceiling.IsCount);
  EXPECT_EQ(B->Limits[1].Ceiling.Real, 1.0);
  EXPECT_FALSE(B->Limits[9].Ceiling.IsCount);
}

TEST(Budget, UnknownTablesAndKeysAreErrors) {
  EXPECT_EQ(errorOf("[limit]\ndepth = 3\n"),
            "b.toml:1:2: error: unknown table 'limit'; a budget holds only "
            "[limits] and [growth]");
  EXPECT_EQ(errorOf("depth = 3\n"),
            "b.toml:1:1: error: unknown key 'depth'; a budget holds only "
            "[limits] and [growth]");
  // One edit from a metric: suggested.
  EXPECT_EQ(errorOf("[limits]\ndepth = 3\ndpth = 3\n"),
            "b.toml:3:1: error: unknown metric 'dpth' in [limits]; did you "
            "mean 'depth'?");
  EXPECT_EQ(errorOf("[growth]\ncolour = \"1%\"\n"),
            "b.toml:2:1: error: unknown metric 'colour' in [growth]; expected "
            "one of erasure_events, entropy_bits, dirty_ancillas, depth, "
            "two_qubit_depth, t_count, gates, qubits, action_Js, heat_J");
  EXPECT_EQ(errorOf("limits = 3\n"),
            "b.toml:1:10: error: 'limits' must be a table: [limits]");
}

TEST(Budget, WrongLimitTypesAreErrorsAtTheValue) {
  EXPECT_EQ(errorOf("[limits]\ndepth = \"12\"\n"),
            "b.toml:2:9: error: the limit of 'depth' must be a number, not a "
            "string");
  EXPECT_EQ(errorOf("[limits]\ngates = -1\n"),
            "b.toml:2:9: error: the limit of 'gates' must be zero or more");
  EXPECT_EQ(errorOf("[limits]\nqubits = 2.5\n"),
            "b.toml:2:10: error: the limit of 'qubits' must be a whole number "
            "of qubits");
  // A float that happens to be whole is still not a TOML integer.
  EXPECT_EQ(errorOf("[limits]\nt_count = 3.0\n"),
            "b.toml:2:11: error: the limit of 't_count' must be a whole number "
            "of T gates");
  EXPECT_EQ(errorOf("[limits]\nheat_J = -1e-21\n"),
            "b.toml:2:10: error: the limit of 'heat_J' must be a finite "
            "number, zero or more");
  EXPECT_EQ(errorOf("[limits]\nentropy_bits = nan\n"),
            "b.toml:2:16: error: the limit of 'entropy_bits' must be a finite "
            "number, zero or more");
  EXPECT_EQ(errorOf("[limits]\naction_Js = true\n"),
            "b.toml:2:13: error: the limit of 'action_Js' must be a number of "
            "J s");
}

TEST(Budget, GrowthMustBeAPercentageString) {
  EXPECT_EQ(errorOf("[growth]\ndepth = 5\n"),
            "b.toml:2:9: error: the growth of 'depth' must be a percentage "
            "string such as \"5%\"");
  EXPECT_EQ(errorOf("[growth]\ndepth = \"5\"\n"),
            "b.toml:2:9: error: '5' is not a percentage; write it with a "
            "percent sign, such as \"5%\"");
  EXPECT_EQ(errorOf("[growth]\ndepth = \"-5%\"\n"),
            "b.toml:2:9: error: '-5%': a growth must be zero or more");
  EXPECT_EQ(errorOf("[growth]\ndepth = \"five%\"\n"),
            "b.toml:2:9: error: 'five%' is not a percentage such as \"5%\" or "
            "\"2.5%\"");
}

TEST(Budget, TomlSyntaxErrorsKeepTheirPosition) {
  // "depth = " with no value: the value is missing at the line break,
  // column 9.
  EXPECT_EQ(errorOf("[limits]\ndepth = \n"),
            "b.toml:2:9: error: expected value, saw '\\n' (while parsing "
            "key-value pair)");
  // TOML v1.0.0, "Keys": defining a key twice is invalid.
  EXPECT_NE(errorOf("[limits]\ndepth = 1\ndepth = 2\n").find("b.toml:3:"),
            std::string::npos);
}

TEST(Budget, AnEmptyBudgetIsAnError) {
  EXPECT_EQ(errorOf(""), "b.toml: error: the budget sets no limit; give "
                         "metrics under [limits] or [growth] (docs/check.md)");
  EXPECT_EQ(errorOf("[limits]\n"),
            "b.toml: error: the budget sets no limit; give metrics under "
            "[limits] or [growth] (docs/check.md)");
}

TEST(Budget, GrowthPercentages) {
  // checks the exact fixed-point form: percent x 10^6.
  auto micros = [](const char *S) -> int64_t {
    llvm::Expected<uint64_t> V = parseGrowthPercent(S);
    if (!V) {
      llvm::consumeError(V.takeError());
      return -1;
    }
    return int64_t(*V);
  };
  EXPECT_EQ(micros("0%"), 0);
  EXPECT_EQ(micros("5%"), 5'000'000);
  EXPECT_EQ(micros("2.5%"), 2'500'000);
  EXPECT_EQ(micros("007%"), 7'000'000);
  EXPECT_EQ(micros("0.000001%"), 1);
  EXPECT_EQ(micros("1000000%"), 1'000'000'000'000);
  EXPECT_EQ(micros("0.0000001%"), -1); // seven decimals
  EXPECT_EQ(micros("1000000.5%"), -1);
  EXPECT_EQ(micros("99999999999999999999%"), -1);
  EXPECT_EQ(micros("5.%"), -1);
  EXPECT_EQ(micros(".5%"), -1);
  EXPECT_EQ(micros("5 %"), -1);
  EXPECT_EQ(micros("%"), -1);
  EXPECT_EQ(micros(""), -1);
}

TEST(Budget, FilesThatAreNotBudgets) {
  std::filesystem::path Dir = std::filesystem::temp_directory_path() /
                              ("revbound-budget-" + std::to_string(::getpid()));
  std::filesystem::create_directories(Dir);
  config::ConfigError Error;
  EXPECT_FALSE(readBudget(Dir.string(), Error));
  EXPECT_EQ(Error.format(), Dir.string() + ": error: the budget file must be a "
                                           "regular file of at most 16 MiB");
  EXPECT_FALSE(readBudget((Dir / "absent.toml").string(), Error));
  EXPECT_EQ(Error.format(), (Dir / "absent.toml").string() +
                                ": error: cannot open the budget file: No such "
                                "file or directory");
  std::ofstream((Dir / "ok.toml").string()) << "[limits]\nqubits = 4\n";
  std::optional<Budget> B = readBudget((Dir / "ok.toml").string(), Error);
  ASSERT_TRUE(B) << Error.format();
  EXPECT_EQ(B->File, (Dir / "ok.toml").string());
  EXPECT_EQ(B->Limits.at(0).At.File, (Dir / "ok.toml").string());
  std::filesystem::remove_all(Dir);
}

} // namespace
