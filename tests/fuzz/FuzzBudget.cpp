//===- FuzzBudget.cpp - libFuzzer entry over the budget TOML reader -------===//
//
// Arbitrary bytes through policy::parseBudget. Beyond crashes, the harness
// traps on results that break docs/check.md: a failure without a message,
// a budget with no metric, rules out of metric order or twice in a table,
// a count limit that is no integer, a negative or non-finite real limit, a
// growth past MaxGrowthPercent.
//
//===----------------------------------------------------------------------===//
#include "revbound/policy/Budget.h"

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>

namespace {

[[noreturn]] void broken(const char *What) {
  std::fprintf(stderr, "revbound_fuzz_budget: budget invariant broken: %s\n",
               What);
  std::abort();
}

} // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *Data, size_t Size) {
  using namespace revbound;
  llvm::StringRef Text(reinterpret_cast<const char *>(Data), Size);
  config::ConfigError Error;
  std::optional<policy::Budget> B =
      policy::parseBudget(Text, "fuzz.toml", Error);
  if (!B) {
    if (Error.Message.empty() || Error.File != "fuzz.toml")
      broken("an error without a message or a file");
    if (Error.format().empty())
      broken("an error that formats to nothing");
    return 0;
  }
  if (B->Limits.empty() && B->Growth.empty())
    broken("a budget that sets no metric");
  for (size_t I = 0; I < B->Limits.size(); ++I) {
    const policy::LimitRule &R = B->Limits[I];
    if (I > 0 && unsigned(B->Limits[I - 1].M) >= unsigned(R.M))
      broken("limits out of metric order");
    if (R.Ceiling.IsCount != policy::isCountMetric(R.M))
      broken("a limit of the wrong kind");
    if (!R.Ceiling.IsCount &&
        (!std::isfinite(R.Ceiling.Real) || R.Ceiling.Real < 0))
      broken("a negative or non-finite real limit");
    (void)policy::showAmounts(R.Ceiling, R.Ceiling);
  }
  for (size_t I = 0; I < B->Growth.size(); ++I) {
    const policy::GrowthRule &R = B->Growth[I];
    if (I > 0 && unsigned(B->Growth[I - 1].M) >= unsigned(R.M))
      broken("growth rules out of metric order");
    if (R.PercentMicros > policy::MaxGrowthPercent * 1'000'000)
      broken("a growth past the largest allowed");
    llvm::Expected<uint64_t> Again = policy::parseGrowthPercent(R.Written);
    if (!Again || *Again != R.PercentMicros)
      broken("a growth that does not read back as written");
  }
  if (!B->Growth.empty() && !B->HasGrowthTable)
    broken("growth rules without a [growth] table");
  return 0;
}
