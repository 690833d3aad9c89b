//===- FuzzPlainCalls.cpp - libFuzzer: both ways of reading agree ---------===//
//
// Builds the input token by token, with the parser's plain-call path
// (ParserOptions::ReadPlainCalls), and with it split over two threads
// whatever the input's size (ParserOptions::MinBytesForSecondThread), and
// stops on the first difference in the circuit, the error or the warnings
// (tests/qasm/PlainCallCheck.h). No
// analysis runs, so inputs go through fast; a difference, a crash or a
// sanitizer report is a finding.
//
//===----------------------------------------------------------------------===//
#include "../qasm/PlainCallCheck.h"
#include "FuzzLimits.h"

#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *Data, size_t Size) {
  using namespace revbound;
  qasm::FrontendOptions Opts = fuzz::smallFrontendOptions(1024, 100'000);
  std::string Difference = test::plainCallDifference(
      llvm::StringRef(reinterpret_cast<const char *>(Data), Size), Opts);
  if (!Difference.empty()) {
    std::fprintf(stderr, "the two ways of reading differ: %s\n",
                 Difference.c_str());
    std::abort();
  }
  return 0;
}
