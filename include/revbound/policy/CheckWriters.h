//===- CheckWriters.h - A CheckReport as text, SARIF, JUnit XML, Markdown -===//
//
// Writers only format: every figure and message they print is in the
// CheckReport. Output is deterministic (same CheckReport, same bytes).
// docs/check.md describes each form.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_POLICY_CHECKWRITERS_H
#define REVBOUND_POLICY_CHECKWRITERS_H

#include "revbound/policy/Verdict.h"

#include <string>

namespace revbound::policy {

/// The SARIF 2.1.0 schema of the OASIS Standard (27 March 2020).
inline constexpr const char *SarifSchemaUri =
    "https://docs.oasis-open.org/sarif/sarif/v2.1.0/os/schemas/"
    "sarif-schema-2.1.0.json";

/// For people: one block per file, failures with their places, and a
/// closing verdict line.
std::string writeCheckText(const CheckReport &R);

/// A SARIF 2.1.0 log with one run: a rule per checked rule of the budget,
/// a result (level "error") per failed check, located where it can be.
std::string writeCheckSarif(const CheckReport &R);

/// JUnit XML: a testsuite per file, a testcase per file and metric, with a
/// <failure> when any check of that metric failed.
std::string writeCheckJunit(const CheckReport &R);

/// A short Markdown summary and table (file, metric, value, limit, status)
/// for a pull-request comment or a CI job summary.
std::string writeCheckMarkdown(const CheckReport &R);

/// `Path` as a URI reference for SARIF's artifactLocation.uri: relative
/// paths stay relative, absolute ones become file:// URIs; bytes outside
/// RFC 3986's unreserved set (and '/') are percent-encoded.
std::string pathToUri(llvm::StringRef Path);

} // namespace revbound::policy

#endif
