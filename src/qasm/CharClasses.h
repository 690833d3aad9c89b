//===- CharClasses.h - Byte classes and keywords of OpenQASM 2.0 ----------===//
//
// Internal to src/qasm: shared by the lexer and the plain-call scanner, so
// that both read names, numbers and keywords by one set of rules.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_QASM_CHARCLASSES_H
#define REVBOUND_QASM_CHARCLASSES_H

#include "revbound/qasm/Lexer.h"

#include <array>
#include <cstdint>

namespace revbound::qasm::chars {

/// Byte classes, one bit each, so that "may continue a name" is one test.
enum CharClass : uint8_t {
  ClassSpace = 1,
  ClassIdentStart = 2,
  ClassDigit = 4
};

constexpr std::array<uint8_t, 256> makeCharClasses() {
  std::array<uint8_t, 256> Classes{};
  for (char C : {' ', '\t', '\n', '\r', '\f', '\v'})
    Classes[static_cast<unsigned char>(C)] = ClassSpace;
  for (int C = 'a'; C <= 'z'; ++C)
    Classes[C] = ClassIdentStart;
  for (int C = 'A'; C <= 'Z'; ++C)
    Classes[C] = ClassIdentStart;
  Classes['_'] = ClassIdentStart;
  for (int C = '0'; C <= '9'; ++C)
    Classes[C] = ClassDigit;
  return Classes;
}

inline constexpr std::array<uint8_t, 256> CharClasses = makeCharClasses();

inline bool hasClass(char C, uint8_t Mask) {
  return CharClasses[static_cast<unsigned char>(C)] & Mask;
}
inline bool isSpace(char C) { return hasClass(C, ClassSpace); }
inline bool isIdentStart(char C) { return hasClass(C, ClassIdentStart); }
inline bool isIdentBody(char C) {
  return hasClass(C, ClassIdentStart | ClassDigit);
}
inline bool isDigit(char C) { return hasClass(C, ClassDigit); }

/// One past the name that starts at `Start` (an isIdentStart byte).
inline const char *identifierEnd(const char *Start) {
  const char *P = Start + 1;
  while (isIdentBody(*P))
    ++P;
  return P;
}

/// The extent of a number by the lexer's grammar:
///   real ::= ([0-9]+ '.' [0-9]* | [0-9]* '.' [0-9]+) ([eE][-+]?[0-9]+)?
///          | [0-9]+ [eE][-+]?[0-9]+
/// from `Start`, a digit or a '.' before a digit.
struct NumberExtent {
  const char *End = nullptr;         // one past the last byte
  bool IsReal = false;               // a dot or an exponent
  const char *BadExponent = nullptr; // set when an exponent has no digits:
                                     // the byte where they should start
};

inline NumberExtent scanNumberExtent(const char *Start) {
  NumberExtent N;
  const char *P = Start;
  while (isDigit(*P))
    ++P;
  if (*P == '.') {
    N.IsReal = true;
    ++P;
    while (isDigit(*P))
      ++P;
  }
  if (*P == 'e' || *P == 'E') {
    const char *Digits = P + 1;
    if (*Digits == '+' || *Digits == '-')
      ++Digits;
    if (!isDigit(*Digits)) {
      N.BadExponent = Digits;
      N.End = Digits;
      return N;
    }
    N.IsReal = true;
    P = Digits;
    while (isDigit(*P))
      ++P;
  }
  N.End = P;
  return N;
}

/// The keyword spelled by `Name`, or Tok::Identifier. The first letter
/// leaves at most two candidates, so ordinary names (q, cx, rz) cost a
/// length comparison or none.
inline Tok keywordKind(llvm::StringRef Name) {
  auto Match = [&](llvm::StringRef Keyword, Tok K) {
    return Name == Keyword ? K : Tok::Identifier;
  };
  switch (Name[0]) {
  case 'O': return Match("OPENQASM", Tok::KwOpenqasm);
  case 'i': return Name.size() == 2 ? Match("if", Tok::KwIf)
                                    : Match("include", Tok::KwInclude);
  case 'q': return Match("qreg", Tok::KwQreg);
  case 'c': return Match("creg", Tok::KwCreg);
  case 'g': return Match("gate", Tok::KwGate);
  case 'o': return Match("opaque", Tok::KwOpaque);
  case 'm': return Match("measure", Tok::KwMeasure);
  case 'r': return Match("reset", Tok::KwReset);
  case 'b': return Match("barrier", Tok::KwBarrier);
  case 'p': return Match("pi", Tok::KwPi);
  case 'U': return Match("U", Tok::KwU);
  case 'C': return Match("CX", Tok::KwCX);
  default: return Tok::Identifier;
  }
}

} // namespace revbound::qasm::chars

#endif
