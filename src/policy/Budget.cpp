//===- Budget.cpp - The budget file of `revbound check`, read from TOML ---===//
#include "revbound/policy/Budget.h"

#include "llvm/Support/FileSystem.h"
#include "llvm/Support/MemoryBuffer.h"

#include <algorithm>
#include <array>
#include <cctype>
#include <cmath>
#include <fmt/format.h>
#include <toml++/toml.h>

namespace revbound::policy {

namespace {

struct MetricInfo {
  Metric M;
  const char *Name;
  bool IsCount;
  const char *Unit;
};

// In enum order, so that a metric indexes its own row.
constexpr std::array<MetricInfo, NumMetrics> Metrics = {{
    {Metric::ErasureEvents, "erasure_events", true, "events"},
    {Metric::EntropyBits, "entropy_bits", false, "bits"},
    {Metric::DirtyAncillas, "dirty_ancillas", true, "ancillas"},
    {Metric::Depth, "depth", true, "layers"},
    {Metric::TwoQubitDepth, "two_qubit_depth", true, "layers"},
    {Metric::TCount, "t_count", true, "T gates"},
    {Metric::Gates, "gates", true, "gates"},
    {Metric::Qubits, "qubits", true, "qubits"},
    {Metric::ActionJs, "action_Js", false, "J s"},
    {Metric::HeatJ, "heat_J", false, "J"},
}};

constexpr std::array<Metric, NumMetrics> MetricList = {
    Metric::ErasureEvents, Metric::EntropyBits,   Metric::DirtyAncillas,
    Metric::Depth,         Metric::TwoQubitDepth, Metric::TCount,
    Metric::Gates,         Metric::Qubits,        Metric::ActionJs,
    Metric::HeatJ};

const MetricInfo &info(Metric M) { return Metrics[unsigned(M)]; }

config::ConfigError errorAt(const std::string &File,
                            const toml::source_region &Where,
                            std::string Message) {
  config::ConfigError E;
  E.File = File;
  E.Line = Where.begin.line;
  E.Column = Where.begin.column;
  E.Message = std::move(Message);
  return E;
}

report::SourcePoint pointOf(const std::string &File,
                            const toml::source_region &Where) {
  return {File, Where.begin.line, Where.begin.column};
}

std::string metricNames() {
  std::string Names;
  for (const MetricInfo &I : Metrics)
    Names += (Names.empty() ? "" : ", ") + std::string(I.Name);
  return Names;
}

/// "unknown metric 'dpth' in [limits]; did you mean 'depth'?", or the list
/// of every metric when no name is close.
std::string unknownMetric(llvm::StringRef Key, llvm::StringRef Table) {
  const char *Best = nullptr;
  unsigned BestDistance = 3; // suggest only names within two edits
  for (const MetricInfo &I : Metrics) {
    unsigned D = Key.edit_distance(I.Name, /*AllowReplacements=*/true, 3);
    if (D < BestDistance) {
      BestDistance = D;
      Best = I.Name;
    }
  }
  if (Best)
    return fmt::format("unknown metric '{}' in [{}]; did you mean '{}'?",
                       Key.str(), Table.str(), Best);
  return fmt::format("unknown metric '{}' in [{}]; expected one of {}",
                     Key.str(), Table.str(), metricNames());
}

/// A `[limits]` value: a TOML integer for counts, any finite number for the
/// real-valued metrics, never negative.
std::optional<Amount> readLimit(Metric M, const toml::node &Value,
                                std::string &Why) {
  llvm::StringRef Name = info(M).Name;
  if (Value.is_string()) {
    Why = fmt::format("the limit of '{}' must be a number, not a string",
                      Name.str());
    return std::nullopt;
  }
  if (isCountMetric(M)) {
    std::optional<int64_t> N = Value.value_exact<int64_t>();
    if (!Value.is_integer() || !N) {
      Why = fmt::format("the limit of '{}' must be a whole number of {}",
                        Name.str(), info(M).Unit);
      return std::nullopt;
    }
    if (*N < 0) {
      Why = fmt::format("the limit of '{}' must be zero or more", Name.str());
      return std::nullopt;
    }
    return Amount::count(uint64_t(*N));
  }
  if (!Value.is_number()) {
    Why = fmt::format("the limit of '{}' must be a number of {}", Name.str(),
                      info(M).Unit);
    return std::nullopt;
  }
  double X = *Value.value<double>();
  if (!std::isfinite(X) || X < 0) {
    Why = fmt::format("the limit of '{}' must be a finite number, zero or more",
                      Name.str());
    return std::nullopt;
  }
  return Amount::real(X);
}

/// Reads one of the two tables into `Out`; returns false with `Error` set.
bool readTable(const std::string &File, llvm::StringRef TableName,
               const toml::table &Table, Budget &Out,
               config::ConfigError &Error) {
  bool IsGrowth = TableName == "growth";
  for (const auto &[Key, Value] : Table) {
    std::optional<Metric> M = parseMetric(Key.str());
    if (!M) {
      Error = errorAt(File, Key.source(), unknownMetric(Key.str(), TableName));
      return false;
    }
    if (!IsGrowth) {
      std::string Why;
      std::optional<Amount> Ceiling = readLimit(*M, Value, Why);
      if (!Ceiling) {
        Error = errorAt(File, Value.source(), Why);
        return false;
      }
      Out.Limits.push_back({*M, *Ceiling, pointOf(File, Key.source())});
      continue;
    }
    std::optional<std::string> Text = Value.value_exact<std::string>();
    if (!Text) {
      Error = errorAt(File, Value.source(),
                      fmt::format("the growth of '{}' must be a percentage "
                                  "string such as \"5%\"",
                                  Key.str()));
      return false;
    }
    llvm::Expected<uint64_t> Micros = parseGrowthPercent(*Text);
    if (!Micros) {
      Error = errorAt(File, Value.source(), llvm::toString(Micros.takeError()));
      return false;
    }
    Out.Growth.push_back({*M, *Micros, *Text, pointOf(File, Key.source())});
  }
  return true;
}

/// toml++'s "Error while parsing key-value pair: expected value" as ours:
/// "expected value (while parsing key-value pair)", lowercase first.
std::string tomlMessage(std::string_view Text) {
  std::string S(Text);
  llvm::StringRef Ref(S);
  if (Ref.consume_front("Error while parsing ")) {
    auto [What, Why] = Ref.split(": ");
    if (!Why.empty())
      S = fmt::format("{} (while parsing {})", Why.str(), What.str());
  }
  if (!S.empty())
    S[0] = char(std::tolower(static_cast<unsigned char>(S[0])));
  return S;
}

} // namespace

llvm::ArrayRef<Metric> allMetrics() { return MetricList; }

llvm::StringRef metricName(Metric M) { return info(M).Name; }

std::optional<Metric> parseMetric(llvm::StringRef Name) {
  for (const MetricInfo &I : Metrics)
    if (Name == I.Name)
      return I.M;
  return std::nullopt;
}

bool isCountMetric(Metric M) { return info(M).IsCount; }

llvm::StringRef metricUnit(Metric M) { return info(M).Unit; }

std::pair<std::string, std::string> showAmounts(const Amount &A,
                                                const Amount &B) {
  auto show = [](const Amount &X, bool Full) {
    if (X.IsCount)
      return std::to_string(X.Count);
    return Full ? fmt::format("{}", X.Real) : fmt::format("{:.6g}", X.Real);
  };
  std::pair<std::string, std::string> Short = {show(A, false), show(B, false)};
  if (Short.first != Short.second || A.IsCount != B.IsCount || A.Real == B.Real)
    return Short;
  return {show(A, true), show(B, true)};
}

llvm::Expected<uint64_t> parseGrowthPercent(llvm::StringRef Text) {
  auto fail = [&](const std::string &Why) {
    return llvm::createStringError(llvm::inconvertibleErrorCode(), "%s",
                                   Why.c_str());
  };
  llvm::StringRef S = Text;
  if (S.startswith("-"))
    return fail(fmt::format("'{}': a growth must be zero or more", Text.str()));
  if (!S.consume_back("%"))
    return fail(fmt::format("'{}' is not a percentage; write it with a "
                            "percent sign, such as \"5%\"",
                            Text.str()));
  llvm::StringRef Whole = S.take_while([](char C) { return std::isdigit(C); });
  llvm::StringRef Rest = S.drop_front(Whole.size());
  llvm::StringRef Fraction;
  bool HasPoint = Rest.consume_front(".");
  if (HasPoint) {
    Fraction = Rest.take_while([](char C) { return std::isdigit(C); });
    Rest = Rest.drop_front(Fraction.size());
  }
  if (Whole.empty() || !Rest.empty() || (HasPoint && Fraction.empty()))
    return fail(fmt::format("'{}' is not a percentage such as \"5%\" or "
                            "\"2.5%\"",
                            Text.str()));
  if (Fraction.size() > MaxGrowthDecimals)
    return fail(fmt::format("'{}': a growth has at most {} decimals",
                            Text.str(), MaxGrowthDecimals));
  Whole = Whole.ltrim('0');
  uint64_t Percent = 0;
  if (Whole.size() > 7 || (!Whole.empty() && Whole.getAsInteger(10, Percent)) ||
      Percent > MaxGrowthPercent ||
      (Percent == MaxGrowthPercent &&
       Fraction.find_first_not_of('0') != llvm::StringRef::npos))
    return fail(fmt::format("'{}': a growth is at most {}%", Text.str(),
                            MaxGrowthPercent));
  uint64_t Micros = Percent * 1'000'000;
  uint64_t Scale = 100'000;
  for (char C : Fraction) {
    Micros += uint64_t(C - '0') * Scale;
    Scale /= 10;
  }
  return Micros;
}

std::optional<Budget> parseBudget(llvm::StringRef Text, const std::string &Name,
                                  config::ConfigError &Error) {
  toml::table Root;
  try {
    Root = toml::parse(std::string_view(Text.data(), Text.size()), Name);
  } catch (const toml::parse_error &E) {
    Error = errorAt(Name, E.source(), tomlMessage(E.description()));
    if (Error.Line == 0)
      Error.Message =
          fmt::format("cannot read the budget: {}", E.description());
    return std::nullopt;
  }
  Budget Out;
  Out.File = Name;
  for (const auto &[Key, Node] : Root) {
    llvm::StringRef TableName = Key.str();
    if (TableName != "limits" && TableName != "growth") {
      Error = errorAt(Name, Key.source(),
                      fmt::format("unknown {} '{}'; a budget holds only "
                                  "[limits] and [growth]",
                                  Node.is_table() ? "table" : "key",
                                  TableName.str()));
      return std::nullopt;
    }
    const toml::table *Table = Node.as_table();
    if (!Table) {
      Error = errorAt(Name, Node.source(),
                      fmt::format("'{}' must be a table: [{}]", TableName.str(),
                                  TableName.str()));
      return std::nullopt;
    }
    if (TableName == "growth") {
      Out.HasGrowthTable = true;
      Out.GrowthTable = pointOf(Name, Node.source());
    }
    if (!readTable(Name, TableName, *Table, Out, Error))
      return std::nullopt;
  }
  if (Out.Limits.empty() && Out.Growth.empty()) {
    Error = {Name, 0, 0,
             "the budget sets no limit; give metrics under [limits] or "
             "[growth] (docs/check.md)"};
    return std::nullopt;
  }
  auto ByMetric = [](const auto &A, const auto &B) { return A.M < B.M; };
  std::sort(Out.Limits.begin(), Out.Limits.end(), ByMetric);
  std::sort(Out.Growth.begin(), Out.Growth.end(), ByMetric);
  return Out;
}

std::optional<Budget> readBudget(const std::string &Path,
                                 config::ConfigError &Error) {
  // A directory or a device would read as an empty table; say so instead.
  llvm::sys::fs::file_status Status;
  if (std::error_code EC = llvm::sys::fs::status(Path, Status)) {
    Error = {Path, 0, 0,
             fmt::format("cannot open the budget file: {}", EC.message())};
    return std::nullopt;
  }
  if (Status.type() != llvm::sys::fs::file_type::regular_file ||
      Status.getSize() > (uint64_t(1) << 24)) {
    Error = {Path, 0, 0,
             "the budget file must be a regular file of at most 16 MiB"};
    return std::nullopt;
  }
  llvm::ErrorOr<std::unique_ptr<llvm::MemoryBuffer>> Buffer =
      llvm::MemoryBuffer::getFile(Path, /*IsText=*/false,
                                  /*RequiresNullTerminator=*/false);
  if (!Buffer) {
    Error = {Path, 0, 0,
             fmt::format("cannot read the budget file: {}",
                         Buffer.getError().message())};
    return std::nullopt;
  }
  return parseBudget((*Buffer)->getBuffer(), Path, Error);
}

} // namespace revbound::policy
