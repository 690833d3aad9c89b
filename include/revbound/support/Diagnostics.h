//===- Diagnostics.h - Structured diagnostics and their printed form ------===//
//
// A diagnostic stays structured (severity, location, message, notes) until a
// writer turns it into text, JSON or SARIF. Locations are llvm::SMLoc pointers
// into buffers owned by an llvm::SourceMgr; line and column are computed only
// when a diagnostic is resolved for printing.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SUPPORT_DIAGNOSTICS_H
#define REVBOUND_SUPPORT_DIAGNOSTICS_H

#include "llvm/Support/Error.h"
#include "llvm/Support/SMLoc.h"
#include "llvm/Support/SourceMgr.h"

#include <string>
#include <vector>

namespace revbound {

enum class Severity { Error, Warning, Note };

/// Returns "error", "warning" or "note".
const char *severityName(Severity S);

/// One message about one place in the input; `Length` is the number of bytes
/// the `~` range covers after the caret (0 for a bare caret).
struct Diagnostic {
  Severity Sev = Severity::Error;
  llvm::SMLoc Loc;
  unsigned Length = 0;
  std::string Message;
  std::vector<Diagnostic> Notes;
};

/// A diagnostic's location resolved to file, line and column (both 1-based;
/// 0 when the diagnostic has no location).
struct ResolvedLocation {
  std::string File;
  unsigned Line = 0;
  unsigned Column = 0;
  std::string LineText; // without the line break
};

/// Resolves `Loc` through `SM`; an invalid location gives File "" and 0:0.
ResolvedLocation resolve(const llvm::SourceMgr &SM, llvm::SMLoc Loc);

/// Prints `file:line:col: severity: message`, the source line and a caret
/// line (`^` then `~` for the range). The caret line is left out when the
/// source line holds non-ASCII bytes, since it could not be aligned.
std::string formatDiagnostic(const llvm::SourceMgr &SM, const Diagnostic &D);

/// An llvm::Error that carries one structured diagnostic up to the driver.
class DiagnosticError : public llvm::ErrorInfo<DiagnosticError> {
public:
  static char ID;
  explicit DiagnosticError(Diagnostic D) : Diag(std::move(D)) {}
  const Diagnostic &diagnostic() const { return Diag; }
  void log(llvm::raw_ostream &OS) const override;
  std::error_code convertToErrorCode() const override;

private:
  Diagnostic Diag;
};

/// Makes an error diagnostic at `Loc` covering `Length` bytes.
llvm::Error errorAt(llvm::SMLoc Loc, std::string Message, unsigned Length = 0);

/// Collects the warnings of one run; errors travel as DiagnosticError.
class DiagnosticSink {
public:
  void warn(llvm::SMLoc Loc, std::string Message, unsigned Length = 0);
  const std::vector<Diagnostic> &warnings() const { return Warnings; }

private:
  std::vector<Diagnostic> Warnings;
};

} // namespace revbound

#endif
