//===- FuzzBaseline.cpp - libFuzzer entry over the baseline JSON reader ---===//
//
// Arbitrary bytes through policy::parseBaselineReport, once wanting every
// metric and once wanting the metrics picked by the bits of the first and
// last bytes (so that a report missing some members still gets past the
// schema checks). Beyond crashes, the harness traps on results that break
// BaselineReader.h and docs/check.md: a failure without a message, a
// circuit whose metrics are not exactly the wanted ones, a metric of the
// wrong kind, a real value that is not finite.
//
//===----------------------------------------------------------------------===//
#include "revbound/policy/BaselineReader.h"

#include "llvm/ADT/STLExtras.h"

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <vector>

namespace {

using namespace revbound;

[[noreturn]] void broken(const char *What) {
  std::fprintf(stderr,
               "revbound_fuzz_baseline: baseline invariant broken: %s\n", What);
  std::abort();
}

void readWanting(llvm::StringRef Text, llvm::ArrayRef<policy::Metric> Wanted) {
  config::ConfigError Error;
  std::optional<policy::Baseline> B =
      policy::parseBaselineReport(Text, "fuzz.json", Wanted, Error);
  if (!B) {
    if (Error.Message.empty() || Error.File != "fuzz.json")
      broken("an error without a message or a file");
    return;
  }
  if (B->Source != "fuzz.json" || B->SingleCircuit)
    broken("a report baseline that names another source");
  for (const auto &[File, Set] : B->Circuits) {
    for (policy::Metric M : policy::allMetrics()) {
      bool IsWanted = llvm::is_contained(Wanted, M);
      const std::optional<policy::Amount> &V = Set[M];
      if (V.has_value() != IsWanted)
        broken("a metric read that was not wanted, or one missing");
      if (!V)
        continue;
      if (V->IsCount != policy::isCountMetric(M))
        broken("a metric of the wrong kind");
      if (!V->IsCount && !std::isfinite(V->Real))
        broken("a real metric that is not finite");
    }
  }
}

} // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *Data, size_t Size) {
  llvm::StringRef Text(reinterpret_cast<const char *>(Data), Size);
  readWanting(Text, policy::allMetrics());
  unsigned Bits = Size ? Data[0] | unsigned(Data[Size - 1]) << 8 : 0;
  std::vector<policy::Metric> Some;
  for (policy::Metric M : policy::allMetrics())
    if (Bits & (1u << unsigned(M)))
      Some.push_back(M);
  readWanting(Text, Some);
  return 0;
}
