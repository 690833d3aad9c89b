//===- Durations.h - A device's gate durations, read from TOML ------------===//
//
//   [durations]            # docs/formats.md
//   default = "50ns"       # for every gate not named below (optional)
//   cx = "300ns"           # a time with a unit, or a number of seconds
//   measure = "1us"        # measure and reset are named like gates
//
// Unknown tables and keys of the wrong type are errors with the file's line.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_CONFIG_DURATIONS_H
#define REVBOUND_CONFIG_DURATIONS_H

#include "revbound/support/Diagnostics.h"

#include "llvm/ADT/StringMap.h"

#include <optional>
#include <string>

namespace revbound::config {

struct Durations {
  llvm::StringMap<double> Seconds; // by gate name, "measure", "reset"
  std::optional<double> DefaultSeconds;

  /// The duration of `Name`, or std::nullopt when neither it nor a default
  /// is given.
  std::optional<double> of(llvm::StringRef Name) const;
};

/// A failure to read a configuration file: where and what.
struct ConfigError {
  std::string File;
  unsigned Line = 0, Column = 0;
  std::string Message;
  std::string format() const; // "file:line:col: error: message"
};

/// Reads a durations file; on failure returns the error.
std::optional<Durations> readDurations(const std::string &Path, ConfigError &Error);

} // namespace revbound::config

#endif
