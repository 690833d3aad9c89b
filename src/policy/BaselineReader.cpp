//===- BaselineReader.cpp - A saved JSON report read back as a baseline ---===//
#include "revbound/policy/BaselineReader.h"

#include "llvm/ADT/SmallVector.h"
#include "llvm/Support/FileSystem.h"
#include "llvm/Support/MemoryBuffer.h"
#include "llvm/Support/Path.h"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <cctype>
#include <cmath>
#include <fstream>

namespace revbound::policy {

namespace {

using Json = nlohmann::json;

/// Where docs/json.md keeps each metric in a circuit object.
struct MemberPath {
  Metric M;
  llvm::SmallVector<const char *, 3> Keys;
};

const MemberPath Members[] = {
    {Metric::ErasureEvents, {"erasures", "events"}},
    {Metric::EntropyBits, {"erasures", "entropy_bits", "high"}},
    {Metric::DirtyAncillas, {"ancillas"}},
    {Metric::Depth, {"depth", "all"}},
    {Metric::TwoQubitDepth, {"depth", "two_qubit"}},
    {Metric::TCount, {"ops", "t_count"}},
    {Metric::Gates, {"ops", "gates"}},
    {Metric::Qubits, {"qubits"}},
    {Metric::ActionJs, {"speed", "action_Js"}},
    {Metric::HeatJ, {"landauer", "heat_J", "high"}},
};

const MemberPath &memberOf(Metric M) {
  for (const MemberPath &P : Members)
    if (P.M == M)
      return P;
  llvm_unreachable("every metric has a member path");
}

/// Members of a report that a baseline never needs and that can be long.
bool isSkipped(const std::string &Key) {
  static const char *const Skipped[] = {
      "list",  "critical_path", "as_written",     "by_name", "warnings",
      "notes", "device",        "counterexample", "reason",  "primitive"};
  for (const char *S : Skipped)
    if (Key == S)
      return true;
  return false;
}

/// Line and column (1-based) of byte `Offset` of `Text`.
std::pair<unsigned, unsigned> lineColumn(llvm::StringRef Text, size_t Offset) {
  Offset = std::min(Offset, Text.size());
  llvm::StringRef Before = Text.take_front(Offset);
  unsigned Line = 1 + unsigned(Before.count('\n'));
  size_t LastBreak = Before.rfind('\n');
  unsigned Column = unsigned(
      LastBreak == llvm::StringRef::npos ? Offset + 1 : Offset - LastBreak);
  return {Line, Column};
}

/// Reads one metric of circuit `Index`; on failure sets `Why`.
std::optional<Amount> readMetric(const Json &Circuit, size_t Index, Metric M,
                                 std::string &Why) {
  const MemberPath &P = memberOf(M);
  std::string Path = fmt::format("circuits[{}]", Index);
  for (const char *Key : P.Keys)
    Path += fmt::format(".{}", Key);
  const Json *Node = &Circuit;
  for (const char *Key : P.Keys) {
    if (!Node->is_object() || !Node->contains(Key)) {
      Why = fmt::format("{} is missing (needed for the growth of '{}')", Path,
                        metricName(M).str());
      return std::nullopt;
    }
    Node = &(*Node)[Key];
  }
  if (M == Metric::DirtyAncillas) {
    if (!Node->is_array()) {
      Why = fmt::format("{} must be an array", Path);
      return std::nullopt;
    }
    uint64_t Dirty = 0;
    for (size_t I = 0; I < Node->size(); ++I) {
      const Json &A = (*Node)[I];
      const Json *Clean =
          A.is_object() && A.contains("clean") ? &A["clean"] : nullptr;
      if (!Clean || !(Clean->is_boolean() || Clean->is_null())) {
        Why = fmt::format("{}[{}].clean must be true, false or null", Path, I);
        return std::nullopt;
      }
      if (!(Clean->is_boolean() && Clean->get<bool>()))
        ++Dirty;
    }
    return Amount::count(Dirty);
  }
  if (isCountMetric(M)) {
    if (!Node->is_number_unsigned()) {
      Why = fmt::format("{} must be a whole number, zero or more", Path);
      return std::nullopt;
    }
    return Amount::count(Node->get<uint64_t>());
  }
  if (!Node->is_number() || !std::isfinite(Node->get<double>())) {
    Why = fmt::format("{} must be a number", Path);
    return std::nullopt;
  }
  return Amount::real(Node->get<double>());
}

} // namespace

bool isJsonReport(const std::string &Path) {
  if (llvm::sys::path::extension(Path).equals_insensitive(".json"))
    return true;
  std::ifstream In(Path, std::ios::binary);
  char C;
  while (In.get(C))
    if (!std::isspace(static_cast<unsigned char>(C)))
      return C == '{';
  return false;
}

std::optional<Baseline> parseBaselineReport(llvm::StringRef Text,
                                            const std::string &Name,
                                            llvm::ArrayRef<Metric> Wanted,
                                            config::ConfigError &Error) {
  Error = {Name, 0, 0, ""};
  Json Root;
  try {
    Json::parser_callback_t Keep = [](int, Json::parse_event_t Event,
                                      Json &Parsed) {
      return Event != Json::parse_event_t::key || !Parsed.is_string() ||
             !isSkipped(Parsed.get_ref<const std::string &>());
    };
    Root = Json::parse(Text.begin(), Text.end(), Keep);
  } catch (const Json::parse_error &E) {
    // E.byte is the 1-based position of the byte that stopped the parser.
    auto [Line, Column] = lineColumn(Text, E.byte ? E.byte - 1 : 0);
    std::string What = E.what();
    // nlohmann's text: "[json.exception.parse_error.101] parse error at
    // line 1, column 2: syntax error while parsing value - ..."
    size_t Colon = What.find(": ");
    Error.Line = Line;
    Error.Column = Column;
    Error.Message =
        "not a JSON report: " +
        (Colon == std::string::npos ? What : What.substr(Colon + 2));
    return std::nullopt;
  } catch (const Json::exception &E) {
    // A number past the range of a double, which has no position.
    std::string What = E.what();
    size_t Bracket = What.find("] ");
    Error.Message =
        "not a JSON report: " +
        (Bracket == std::string::npos ? What : What.substr(Bracket + 2));
    return std::nullopt;
  }
  if (!Root.is_object() || !Root.contains("schema")) {
    Error.Message =
        fmt::format("not a revbound report: it has no \"schema\"; "
                    "expected \"{}\" (revbound report --format json)",
                    report::SchemaVersion);
    return std::nullopt;
  }
  const Json &Schema = Root["schema"];
  if (!Schema.is_string() ||
      Schema.get<std::string>() != report::SchemaVersion) {
    Error.Message =
        fmt::format("unsupported report schema {}; this revbound reads \"{}\"",
                    Schema.dump(-1, ' ', false, Json::error_handler_t::replace),
                    report::SchemaVersion);
    return std::nullopt;
  }
  if (!Root.contains("circuits") || !Root["circuits"].is_array()) {
    Error.Message = "\"circuits\" must be an array";
    return std::nullopt;
  }
  Baseline Out;
  Out.Source = Name;
  const Json &Circuits = Root["circuits"];
  for (size_t I = 0; I < Circuits.size(); ++I) {
    const Json &C = Circuits[I];
    if (!C.is_object() || !C.contains("file") || !C["file"].is_string()) {
      Error.Message = fmt::format("circuits[{}].file must be a string", I);
      return std::nullopt;
    }
    MetricSet Set;
    for (Metric M : Wanted) {
      std::string Why;
      std::optional<Amount> V = readMetric(C, I, M, Why);
      if (!V) {
        Error.Message = Why;
        return std::nullopt;
      }
      Set[M] = *V;
    }
    Out.Circuits.emplace_back(C["file"].get<std::string>(), std::move(Set));
  }
  return Out;
}

std::optional<Baseline> readBaselineReport(const std::string &Path,
                                           llvm::ArrayRef<Metric> Wanted,
                                           uint64_t MaxBytes,
                                           config::ConfigError &Error) {
  llvm::sys::fs::file_status Status;
  if (std::error_code EC = llvm::sys::fs::status(Path, Status)) {
    Error = {Path, 0, 0,
             fmt::format("cannot open the baseline: {}", EC.message())};
    return std::nullopt;
  }
  if (Status.type() != llvm::sys::fs::file_type::regular_file ||
      Status.getSize() > MaxBytes) {
    Error = {Path, 0, 0,
             fmt::format("the baseline must be a regular file of at most {} "
                         "bytes (--max-file-bytes)",
                         MaxBytes)};
    return std::nullopt;
  }
  // Mapped rather than copied where the system allows it.
  llvm::ErrorOr<std::unique_ptr<llvm::MemoryBuffer>> Buffer =
      llvm::MemoryBuffer::getFile(Path, /*IsText=*/false,
                                  /*RequiresNullTerminator=*/false);
  if (!Buffer) {
    Error = {Path, 0, 0,
             fmt::format("cannot read the baseline: {}",
                         Buffer.getError().message())};
    return std::nullopt;
  }
  return parseBaselineReport((*Buffer)->getBuffer(), Path, Wanted, Error);
}

} // namespace revbound::policy
