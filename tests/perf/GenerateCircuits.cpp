//===- GenerateCircuits.cpp - Writes the benchmark circuits to a folder ---===//
//
// revbound_gen_circuits [options] OUTDIR writes OUTDIR/flat.qasm and
// OUTDIR/nested.qasm (and OUTDIR/params.qasm with --params) for the
// end-to-end script and the CTest smoke test. Exit 0 on success, 2 on bad
// usage or a write error.
//
//===----------------------------------------------------------------------===//
#include "CircuitGenerator.h"

#include <cerrno>
#include <charconv>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <string>
#include <string_view>

namespace {

constexpr const char *Usage =
    "usage: revbound_gen_circuits [options] OUTDIR\n"
    "  --ops N           flat.qasm operations, measures included (1000000)\n"
    "  --qubits N        flat.qasm qubits (64)\n"
    "  --levels K        nested.qasm expands to 2^K leaves (61)\n"
    "  --params          also write params.qasm\n"
    "  --param-gates N   params.qasm gate definitions (1000)\n"
    "  --param-calls N   params.qasm calls (100000)\n"
    "  --seed N          seed of the flat and params files\n";

struct Options {
  std::string OutDir;
  revbound::perf::FlatSpec Flat;
  revbound::perf::NestedSpec Nested;
  revbound::perf::ParamSpec Params;
  bool WriteParams = false;
};

bool parseNumber(std::string_view Text, uint64_t &Out) {
  auto [End, Ec] = std::from_chars(Text.data(), Text.data() + Text.size(), Out);
  return Ec == std::errc() && End == Text.data() + Text.size();
}

/// Fills `O` from the command line; prints the problem and returns false on
/// bad usage.
bool parseArgs(int Argc, char **Argv, Options &O) {
  for (int I = 1; I < Argc; ++I) {
    std::string_view Arg = Argv[I];
    if (Arg == "--help" || Arg == "-h") {
      std::fputs(Usage, stdout);
      std::exit(0);
    }
    if (Arg == "--params") {
      O.WriteParams = true;
      continue;
    }
    if (Arg.substr(0, 2) != "--") {
      if (!O.OutDir.empty()) {
        std::fprintf(stderr, "error: more than one output folder\n%s", Usage);
        return false;
      }
      O.OutDir = std::string(Arg);
      continue;
    }
    uint64_t V = 0;
    if (I + 1 >= Argc || !parseNumber(Argv[I + 1], V)) {
      std::fprintf(stderr, "error: '%s' needs a non-negative integer\n%s",
                   Argv[I], Usage);
      return false;
    }
    ++I;
    if (Arg == "--ops")
      O.Flat.Ops = V;
    else if (Arg == "--qubits" && V <= (1u << 20))
      O.Flat.Qubits = uint32_t(V);
    else if (Arg == "--levels" && V >= 1 && V <= 63)
      O.Nested.Levels = unsigned(V);
    else if (Arg == "--param-gates" && V >= 1 && V <= 1'000'000)
      O.Params.Gates = unsigned(V);
    else if (Arg == "--param-calls")
      O.Params.Calls = V;
    else if (Arg == "--seed")
      O.Flat.Seed = O.Params.Seed = V;
    else {
      std::fprintf(stderr, "error: unknown option or value out of range: %s %s\n%s",
                   Argv[I - 1], Argv[I], Usage);
      return false;
    }
  }
  if (O.OutDir.empty()) {
    std::fprintf(stderr, "error: no output folder\n%s", Usage);
    return false;
  }
  return true;
}

bool writeFile(const std::string &Path, const std::string &Text) {
  std::FILE *F = std::fopen(Path.c_str(), "wb");
  if (!F) {
    std::fprintf(stderr, "error: cannot write '%s': %s\n", Path.c_str(),
                 std::strerror(errno));
    return false;
  }
  bool Ok = std::fwrite(Text.data(), 1, Text.size(), F) == Text.size();
  Ok = std::fclose(F) == 0 && Ok;
  if (!Ok)
    std::fprintf(stderr, "error: cannot write '%s'\n", Path.c_str());
  else
    std::printf("%s: %zu bytes\n", Path.c_str(), Text.size());
  return Ok;
}

} // namespace

int main(int Argc, char **Argv) {
  Options O;
  if (!parseArgs(Argc, Argv, O))
    return 2;
  std::string Base = O.OutDir + "/";
  if (!writeFile(Base + "flat.qasm", revbound::perf::generateFlat(O.Flat)) ||
      !writeFile(Base + "nested.qasm",
                 revbound::perf::generateNested(O.Nested)))
    return 2;
  if (O.WriteParams &&
      !writeFile(Base + "params.qasm", revbound::perf::generateParams(O.Params)))
    return 2;
  return 0;
}
