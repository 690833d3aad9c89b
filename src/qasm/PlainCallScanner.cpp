//===- PlainCallScanner.cpp - Gate calls read straight from the bytes -----===//
#include "PlainCallScanner.h"
#include "CharClasses.h"

#include <charconv>

namespace revbound::qasm {

using namespace chars;

namespace {

// The buffer ends in a NUL that no class and no punctuation matches, so each
// loop stops at it; one byte past a non-NUL byte is still in the buffer.

const char *skipBlanks(const char *P) {
  while (*P == ' ' || *P == '\t')
    ++P;
  return P;
}

/// A number by Lexer::lexNumber's grammar, or nullptr where the lexer would
/// report an error or the value is out of a double's range (the parser's
/// messages for those).
const char *scanNumber(const char *P, double &Value) {
  const char *Start = P;
  if (!isDigit(*P) && !(*P == '.' && isDigit(P[1])))
    return nullptr;
  while (isDigit(*P))
    ++P;
  bool IsReal = false;
  if (*P == '.') {
    IsReal = true;
    ++P;
    while (isDigit(*P))
      ++P;
  }
  if (*P == 'e' || *P == 'E') {
    const char *Digits = P + 1;
    if (*Digits == '+' || *Digits == '-')
      ++Digits;
    if (!isDigit(*Digits))
      return nullptr;
    IsReal = true;
    P = Digits;
    while (isDigit(*P))
      ++P;
  }
  if (isIdentStart(*P) || (!IsReal && P - Start > 1 && *Start == '0'))
    return nullptr;
  auto [End, Ec] = std::from_chars(Start, P, Value);
  if (Ec != std::errc() || End != P)
    return nullptr;
  return P;
}

/// `name [ index ]`, the name not a keyword, the index a nninteger.
const char *scanOperand(const char *P, PlainOperand &Out) {
  if (!isIdentStart(*P))
    return nullptr;
  const char *Start = P;
  while (isIdentBody(*P))
    ++P;
  Out.Reg.Name = llvm::StringRef(Start, size_t(P - Start));
  Out.Reg.Loc = llvm::SMLoc::getFromPointer(Start);
  if (keywordKind(Out.Reg.Name) != Tok::Identifier)
    return nullptr;
  P = skipBlanks(P);
  if (*P != '[')
    return nullptr;
  P = skipBlanks(P + 1);
  const char *Digits = P;
  uint64_t Index = 0;
  while (isDigit(*P)) {
    if (__builtin_mul_overflow(Index, 10, &Index) ||
        __builtin_add_overflow(Index, uint64_t(*P - '0'), &Index))
      return nullptr;
    ++P;
  }
  if (P == Digits || (P - Digits > 1 && *Digits == '0') || isIdentStart(*P) ||
      *P == '.' || *P == 'e' || *P == 'E')
    return nullptr;
  Out.Index = Index;
  P = skipBlanks(P);
  return *P == ']' ? P + 1 : nullptr;
}

} // namespace

const char *scanPlainCall(const Ident &Gate, const char *After,
                          PlainCall &Out) {
  Out.Gate = Gate;
  Out.Params.clear();
  Out.Args.clear();
  const char *P = skipBlanks(After);
  if (*P == '(') {
    P = skipBlanks(P + 1);
    if (*P != ')') {
      while (true) {
        bool Negated = *P == '-';
        if (Negated)
          P = skipBlanks(P + 1);
        double V = 0;
        P = scanNumber(P, V);
        if (!P)
          return nullptr;
        Out.Params.push_back(Negated ? -V : V);
        P = skipBlanks(P);
        if (*P != ',')
          break;
        P = skipBlanks(P + 1);
      }
      if (*P != ')')
        return nullptr;
    }
    P = skipBlanks(P + 1);
  }
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

} // namespace revbound::qasm
