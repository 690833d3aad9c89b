//===- ReplayMain.cpp - Runs a fuzz harness on saved inputs -----------===//
//
// Linked with one harness of tests/fuzz, this replays every file named on
// the command line (folders are walked) through LLVMFuzzerTestOneInput, so
// that each fuzzer finding stays a regression test under any compiler, the
// sanitizer build included. A crash or a sanitizer report fails the test;
// so does finding no input at all, so that a moved folder is noticed.
//
//===----------------------------------------------------------------------===//
#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>
#include <vector>

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *Data, size_t Size);

namespace fs = std::filesystem;

int main(int Argc, char **Argv) {
  std::vector<fs::path> Inputs;
  for (int I = 1; I < Argc; ++I) {
    fs::path P = Argv[I];
    if (fs::is_directory(P)) {
      for (const fs::directory_entry &E : fs::recursive_directory_iterator(P))
        if (E.is_regular_file())
          Inputs.push_back(E.path());
    } else if (fs::is_regular_file(P)) {
      Inputs.push_back(P);
    } else {
      std::fprintf(stderr, "replay: %s: no such file or folder\n", Argv[I]);
      return 2;
    }
  }
  if (Inputs.empty()) {
    std::fprintf(stderr, "replay: no inputs\n");
    return 2;
  }
  std::sort(Inputs.begin(), Inputs.end()); // a stable order for the log
  for (const fs::path &P : Inputs) {
    std::ifstream In(P, std::ios::binary);
    std::string Bytes((std::istreambuf_iterator<char>(In)),
                      std::istreambuf_iterator<char>());
    std::fprintf(stderr, "replay: %s (%zu bytes)\n", P.string().c_str(),
                 Bytes.size());
    // A copy in its own allocation, so that AddressSanitizer sees a read
    // past the end as libFuzzer's run would.
    std::vector<uint8_t> Copy(Bytes.begin(), Bytes.end());
    LLVMFuzzerTestOneInput(Copy.data(), Copy.size());
  }
  std::printf("replay: %zu inputs, no failure\n", Inputs.size());
  return 0;
}
