//===- BaselineReader.h - A saved JSON report read back as a baseline -----===//
//
// `revbound check --baseline FILE` takes either a circuit, analysed like
// the checked files, or a JSON report of ours (schema revbound/report-1,
// docs/json.md). Of a report only the metrics a budget's growth names are
// read; members that can be long (erasure lists, critical paths, counts by
// name) are skipped while parsing, so memory stays proportional to the
// number of circuits and ancillas.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_POLICY_BASELINEREADER_H
#define REVBOUND_POLICY_BASELINEREADER_H

#include "revbound/config/Durations.h"
#include "revbound/policy/Verdict.h"

#include "llvm/ADT/ArrayRef.h"
#include "llvm/ADT/StringRef.h"

#include <cstdint>
#include <optional>
#include <string>

namespace revbound::policy {

/// True when `Path` should be read as a JSON report: its name ends in
/// ".json", or its first byte that is not white space is '{' (a circuit
/// cannot start so). A file that cannot be opened is not one.
bool isJsonReport(const std::string &Path);

/// Parses report text read from `Name`, keeping the `Wanted` metrics of
/// every circuit. Fails on text that is not JSON (with line and column), on
/// another schema, and on a wanted member that is missing or of the wrong
/// type (named by its path, "circuits[1].depth.all").
std::optional<Baseline> parseBaselineReport(llvm::StringRef Text,
                                            const std::string &Name,
                                            llvm::ArrayRef<Metric> Wanted,
                                            config::ConfigError &Error);

/// Reads a report file of at most `MaxBytes` bytes, as parseBaselineReport.
std::optional<Baseline> readBaselineReport(const std::string &Path,
                                           llvm::ArrayRef<Metric> Wanted,
                                           uint64_t MaxBytes,
                                           config::ConfigError &Error);

} // namespace revbound::policy

#endif
