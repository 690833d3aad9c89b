//===- Diagnostics.cpp - Structured diagnostics and their printed form ----===//
#include "revbound/support/Diagnostics.h"

#include "llvm/Support/MemoryBuffer.h"
#include "llvm/Support/raw_ostream.h"

#include <fmt/format.h>

namespace revbound {

char DiagnosticError::ID = 0;

const char *severityName(Severity S) {
  switch (S) {
  case Severity::Error:
    return "error";
  case Severity::Warning:
    return "warning";
  case Severity::Note:
    return "note";
  }
  return "error";
}

ResolvedLocation resolve(const llvm::SourceMgr &SM, llvm::SMLoc Loc) {
  ResolvedLocation R;
  if (!Loc.isValid())
    return R;
  unsigned BufId = SM.FindBufferContainingLoc(Loc);
  if (BufId == 0)
    return R;
  const llvm::MemoryBuffer *Buf = SM.getMemoryBuffer(BufId);
  R.File = Buf->getBufferIdentifier().str();
  auto [Line, Col] = SM.getLineAndColumn(Loc, BufId);
  R.Line = Line;
  R.Column = Col;
  const char *Begin = Loc.getPointer();
  const char *BufStart = Buf->getBufferStart();
  const char *BufEnd = Buf->getBufferEnd();
  while (Begin > BufStart && Begin[-1] != '\n' && Begin[-1] != '\r')
    --Begin;
  const char *End = Loc.getPointer();
  while (End < BufEnd && *End != '\n' && *End != '\r')
    ++End;
  R.LineText.assign(Begin, End);
  return R;
}

static bool isPlainAscii(llvm::StringRef Text) {
  for (unsigned char C : Text)
    if (C >= 0x80 || C == 0)
      return false;
  return true;
}

static void formatOne(const llvm::SourceMgr &SM, const Diagnostic &D,
                      std::string &Out) {
  ResolvedLocation R = resolve(SM, D.Loc);
  if (!R.File.empty())
    Out += fmt::format("{}:{}:{}: ", R.File, R.Line, R.Column);
  Out += fmt::format("{}: {}\n", severityName(D.Sev), D.Message);
  if (R.File.empty())
    return;
  // Tabs are kept as they are so that the caret line, which copies them,
  // stays aligned in any terminal.
  Out += R.LineText;
  Out += '\n';
  if (!isPlainAscii(R.LineText))
    return;
  std::string Caret;
  for (unsigned I = 0; I + 1 < R.Column && I < R.LineText.size(); ++I)
    Caret += R.LineText[I] == '\t' ? '\t' : ' ';
  Caret += '^';
  unsigned Room = R.LineText.size() > R.Column ? R.LineText.size() - R.Column : 0;
  unsigned Tildes = D.Length > 1 ? std::min(D.Length - 1, Room) : 0;
  Caret.append(Tildes, '~');
  Out += Caret;
  Out += '\n';
}

std::string formatDiagnostic(const llvm::SourceMgr &SM, const Diagnostic &D) {
  std::string Out;
  formatOne(SM, D, Out);
  for (const Diagnostic &N : D.Notes)
    formatOne(SM, N, Out);
  return Out;
}

void DiagnosticError::log(llvm::raw_ostream &OS) const { OS << Diag.Message; }

std::error_code DiagnosticError::convertToErrorCode() const {
  return llvm::inconvertibleErrorCode();
}

llvm::Error errorAt(llvm::SMLoc Loc, std::string Message, unsigned Length) {
  Diagnostic D;
  D.Sev = Severity::Error;
  D.Loc = Loc;
  D.Length = Length;
  D.Message = std::move(Message);
  return llvm::make_error<DiagnosticError>(std::move(D));
}

void DiagnosticSink::warn(llvm::SMLoc Loc, std::string Message,
                          unsigned Length) {
  Diagnostic D;
  D.Sev = Severity::Warning;
  D.Loc = Loc;
  D.Length = Length;
  D.Message = std::move(Message);
  Warnings.push_back(std::move(D));
}

} // namespace revbound
