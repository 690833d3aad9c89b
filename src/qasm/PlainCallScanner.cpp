//===- PlainCallScanner.cpp - Gate calls read straight from the bytes -----===//
#include "PlainCallScanner.h"
#include "CharClasses.h"

#include <charconv>
#include <cmath>
#include <numbers>

namespace revbound::qasm {

using namespace chars;

namespace {

// The buffer ends in a NUL that no class and no punctuation matches, so each
// loop stops at it; one byte past a non-NUL byte is still in the buffer.

/// A number by Lexer::lexNumber's grammar, or nullptr where the lexer would
/// report an error or the value is out of a double's range (the parser's
/// messages for those).
const char *scanNumber(const char *P, double &Value) {
  const char *Start = P;
  if (!isDigit(*P) && !(*P == '.' && isDigit(P[1])))
    return nullptr;
  NumberExtent N = scanNumberExtent(Start);
  if (N.BadExponent)
    return nullptr;
  P = N.End;
  bool IsReal = N.IsReal;
  if (isIdentStart(*P) || (!IsReal && P - Start > 1 && *Start == '0'))
    return nullptr;
  auto [End, Ec] = std::from_chars(Start, P, Value);
  if (Ec != std::errc() || End != P)
    return nullptr;
  return P;
}

/// A number or `pi`, perhaps negated.
const char *scanFactor(const char *P, double &Value) {
  bool Negated = *P == '-';
  if (Negated)
    P = skipBlanks(P + 1);
  if (P[0] == 'p' && P[1] == 'i' && !isIdentBody(P[2])) {
    Value = std::numbers::pi;
    P += 2;
  } else if (!(P = scanNumber(P, Value))) {
    return nullptr;
  }
  if (Negated)
    Value = -Value;
  return P;
}

} // namespace

const char *scanParam(const char *P, double &Value) {
  if (!(P = scanFactor(P, Value)))
    return nullptr;
  while (true) {
    P = skipBlanks(P);
    char Op = *P;
    if (Op != '*' && Op != '/')
      break;
    double Rhs = 0;
    if (!(P = scanFactor(skipBlanks(P + 1), Rhs)))
      return nullptr;
    Value = Op == '*' ? Value * Rhs : Value / Rhs;
  }
  return std::isfinite(Value) && *P != '^' ? P : nullptr;
}

const char *scanIndex(const char *P, uint64_t &Index) {
  P = skipBlanks(P);
  if (*P != '[')
    return nullptr;
  P = skipBlanks(P + 1);
  const char *Digits = P;
  uint64_t Value = 0;
  while (isDigit(*P))
    Value = Value * 10 + unsigned(*P++ - '0');
  // Up to 19 digits cannot overflow 64 bits; no register is that large,
  // so longer indices are left to the parser's range diagnostic.
  if (P == Digits || P - Digits > 19 || (P - Digits > 1 && *Digits == '0'))
    return nullptr;
  Index = Value;
  if (*P == ']')
    return P + 1;
  // A letter ('e' too) or a '.' would make this a different token.
  if (isIdentStart(*P) || *P == '.')
    return nullptr;
  P = skipBlanks(P);
  return *P == ']' ? P + 1 : nullptr;
}

namespace {

/// `name [ index ]`, the name not a keyword, the index a nninteger.
const char *scanOperand(const char *P, PlainOperand &Out) {
  if (!isIdentStart(*P))
    return nullptr;
  const char *Start = P;
  P = identifierEnd(Start);
  Out.Reg.Name = llvm::StringRef(Start, size_t(P - Start));
  Out.Reg.Loc = llvm::SMLoc::getFromPointer(Start);
  if (keywordKind(Out.Reg.Name) != Tok::Identifier)
    return nullptr;
  return scanIndex(P, Out.Index);
}

} // namespace

const char *scanPlainCall(const Ident &Gate, const char *After,
                          PlainCall &Out) {
  Out.Gate = Gate;
  Out.Params.clear();
  Out.Args.clear();
  const char *P = scanParamList(After, [&](double Value) {
    Out.Params.push_back(Value);
    return true;
  });
  if (!P)
    return nullptr;
  while (true) {
    P = scanOperand(P, Out.Args.emplace_back());
    if (!P)
      return nullptr;
    P = skipBlanks(P);
    if (*P == ';')
      return P + 1;
    if (*P != ',')
      return nullptr;
    P = skipBlanks(P + 1);
  }
}

const char *scanPlainRun(const char *P, PlainCallSink &Sink,
                         const std::atomic<bool> &Cancel, const char *Limit) {
  PlainCall Call;
  const char *LastEnd = nullptr;
  for (unsigned N = 1;; ++N) {
    // What the lexer would skip before the next token, less comments: a
    // `//!` one must reach the lexer's list of annotations.
    while (isSpace(*P))
      ++P;
    if (!isIdentStart(*P) || (Limit && P >= Limit))
      break;
    const char *Start = P;
    P = identifierEnd(Start);
    Ident Gate{llvm::StringRef(Start, size_t(P - Start)),
               llvm::SMLoc::getFromPointer(Start)};
    if (keywordKind(Gate.Name) != Tok::Identifier)
      break;
    const char *After = scanPlainCall(Gate, P, Call);
    if (!After || !Sink.tryPlainCall(Call))
      break;
    P = LastEnd = After;
    if (N % 4096 == 0 && Cancel.load(std::memory_order_relaxed))
      break;
  }
  return LastEnd;
}

} // namespace revbound::qasm
