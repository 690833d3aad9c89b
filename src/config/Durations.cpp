//===- Durations.cpp - A device's gate durations, read from TOML ----------===//
#include "revbound/config/Durations.h"
#include "revbound/support/Units.h"

#include <cctype>
#include <cmath>
#include "llvm/Support/FileSystem.h"
#include <fmt/format.h>
#include <toml++/toml.h>

namespace revbound::config {

std::optional<double> Durations::of(llvm::StringRef Name) const {
  auto It = Seconds.find(Name);
  if (It != Seconds.end())
    return It->second;
  return DefaultSeconds;
}

std::string ConfigError::format() const {
  if (Line == 0)
    return fmt::format("{}: error: {}", File, Message);
  return fmt::format("{}:{}:{}: error: {}", File, Line, Column, Message);
}

static ConfigError at(const std::string &File, const toml::source_region &Where,
                      std::string Message) {
  ConfigError E;
  E.File = File;
  E.Line = Where.begin.line;
  E.Column = Where.begin.column;
  E.Message = std::move(Message);
  return E;
}

std::optional<Durations> readDurations(const std::string &Path,
                                       ConfigError &Error) {
  // A directory or a device would read as an empty table; say so instead.
  llvm::sys::fs::file_status Status;
  if (std::error_code EC = llvm::sys::fs::status(Path, Status)) {
    Error = {Path, 0, 0, fmt::format("cannot open the durations file: {}", EC.message())};
    return std::nullopt;
  }
  if (Status.type() != llvm::sys::fs::file_type::regular_file ||
      Status.getSize() > (uint64_t(1) << 24)) {
    Error = {Path, 0, 0, "the durations file must be a regular file of at most 16 MiB"};
    return std::nullopt;
  }
  toml::table Root;
  try {
    Root = toml::parse_file(Path);
  } catch (const toml::parse_error &E) {
    // TOML's messages start uppercase; ours start lowercase.
    std::string Message(E.description());
    if (!Message.empty())
      Message[0] = char(std::tolower(static_cast<unsigned char>(Message[0])));
    Error = at(Path, E.source(), Message);
    if (Error.Line == 0)
      Error.Message = fmt::format("cannot read durations: {}", E.description());
    return std::nullopt;
  }
  Durations Out;
  for (const auto &[Key, Node] : Root) {
    if (Key.str() != "durations") {
      Error = at(Path, Node.source(),
                 fmt::format("unknown {} '{}'; a durations file holds only "
                             "[durations]",
                             Node.is_table() ? "table" : "key", Key.str()));
      return std::nullopt;
    }
    const toml::table *Table = Node.as_table();
    if (!Table) {
      Error = at(Path, Node.source(), "'durations' must be a table");
      return std::nullopt;
    }
    for (const auto &[Name, Value] : *Table) {
      std::optional<double> Seconds;
      if (auto S = Value.value<std::string>()) {
        llvm::Expected<double> V =
            parseQuantity(*S, Dimension::Time, /*AllowZero=*/true);
        if (!V) {
          Error = at(Path, Value.source(), llvm::toString(V.takeError()));
          return std::nullopt;
        }
        Seconds = *V;
      } else if (Value.is_number()) {
        Seconds = Value.value<double>();
        if (!(*Seconds >= 0) || !std::isfinite(*Seconds)) {
          Error = at(Path, Value.source(), "a duration must be zero or positive");
          return std::nullopt;
        }
      } else {
        Error = at(Path, Value.source(),
                   fmt::format("the duration of '{}' must be a time such as "
                               "\"20ns\" or a number of seconds",
                               Name.str()));
        return std::nullopt;
      }
      if (Name.str() == "default")
        Out.DefaultSeconds = Seconds;
      else
        Out.Seconds[Name.str()] = *Seconds;
    }
  }
  return Out;
}

} // namespace revbound::config
