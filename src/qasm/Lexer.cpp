//===- Lexer.cpp - Tokens of OpenQASM 2.0 --------------------------------===//
#include "revbound/qasm/Lexer.h"
#include "CharClasses.h"

#include "llvm/Support/Compiler.h"
#include "llvm/Support/ConvertUTF.h"

#include <fmt/format.h>

#include <algorithm>
#include <cassert>

namespace revbound::qasm {

const char *tokenName(Tok K) {
  switch (K) {
  case Tok::Eof: return "end of file";
  case Tok::Error: return "invalid token";
  case Tok::Identifier: return "identifier";
  case Tok::Integer: return "integer";
  case Tok::Real: return "real number";
  case Tok::String: return "string";
  case Tok::KwOpenqasm: return "'OPENQASM'";
  case Tok::KwInclude: return "'include'";
  case Tok::KwQreg: return "'qreg'";
  case Tok::KwCreg: return "'creg'";
  case Tok::KwGate: return "'gate'";
  case Tok::KwOpaque: return "'opaque'";
  case Tok::KwMeasure: return "'measure'";
  case Tok::KwReset: return "'reset'";
  case Tok::KwBarrier: return "'barrier'";
  case Tok::KwIf: return "'if'";
  case Tok::KwPi: return "'pi'";
  case Tok::KwU: return "'U'";
  case Tok::KwCX: return "'CX'";
  case Tok::Semi: return "';'";
  case Tok::Comma: return "','";
  case Tok::LParen: return "'('";
  case Tok::RParen: return "')'";
  case Tok::LBracket: return "'['";
  case Tok::RBracket: return "']'";
  case Tok::LBrace: return "'{'";
  case Tok::RBrace: return "'}'";
  case Tok::Arrow: return "'->'";
  case Tok::EqEq: return "'=='";
  case Tok::Plus: return "'+'";
  case Tok::Minus: return "'-'";
  case Tok::Star: return "'*'";
  case Tok::Slash: return "'/'";
  case Tok::Caret: return "'^'";
  }
  return "token";
}

std::string describe(const Token &T) {
  switch (T.Kind) {
  case Tok::Identifier:
  case Tok::Integer:
  case Tok::Real:
    return fmt::format("{} '{}'", tokenName(T.Kind), T.Text.str());
  case Tok::String:
    return fmt::format("string \"{}\"", T.Text.str());
  default:
    return tokenName(T.Kind);
  }
}

Lexer::Lexer(llvm::StringRef Buffer) : Cur(Buffer.begin()), End(Buffer.end()) {
  assert(*End == '\0' && "the lexer relies on the buffer's NUL terminator");
}

Token Lexer::error(const char *At, unsigned Length, llvm::StringRef Message) {
  ErrorMessage = Message.str();
  Cur = End; // nothing after a lexical error is trusted
  return Token{Tok::Error, llvm::StringRef(At, Length)};
}

using namespace chars;

bool Lexer::skipComment() {
  const char *Start = Cur;
  bool Ascii = true;
  while (Cur < End && *Cur != '\n') {
    if (static_cast<unsigned char>(*Cur) >= 0x80 || *Cur == '\0')
      Ascii = false;
    ++Cur;
  }
  if (Ascii)
    return true;
  const llvm::UTF8 *P = reinterpret_cast<const llvm::UTF8 *>(Start);
  const llvm::UTF8 *E = reinterpret_cast<const llvm::UTF8 *>(Cur);
  if (std::find(Start, Cur, '\0') != Cur)
    return false;
  return llvm::isLegalUTF8String(&P, E);
}

// *End is a NUL, which no class and no punctuation matches, so the loops
// here stop at it without comparing with End, and looking one byte past a
// byte that is not NUL stays inside the buffer. The loops advance a local
// pointer: a char store through `Cur` could alias anything, which would keep
// the compiler writing it back on every byte.
Token Lexer::lex() {
  const char *P = Cur;
  while (isSpace(*P))
    ++P;
  Cur = P;
  char C = *P;
  if (isIdentStart(C))
    return lexIdentifier(P);
  if (isDigit(C) || (C == '.' && isDigit(P[1])))
    return lexNumber(P);
  switch (C) {
  case ';': return punct(Tok::Semi, 1);
  case ',': return punct(Tok::Comma, 1);
  case '(': return punct(Tok::LParen, 1);
  case ')': return punct(Tok::RParen, 1);
  case '[': return punct(Tok::LBracket, 1);
  case ']': return punct(Tok::RBracket, 1);
  case '{': return punct(Tok::LBrace, 1);
  case '}': return punct(Tok::RBrace, 1);
  case '+': return punct(Tok::Plus, 1);
  case '*': return punct(Tok::Star, 1);
  case '^': return punct(Tok::Caret, 1);
  case '-': return P[1] == '>' ? punct(Tok::Arrow, 2) : punct(Tok::Minus, 1);
  case '/': return P[1] == '/' ? lexAfterComments() : punct(Tok::Slash, 1);
  default: return lexOther();
  }
}

/// Skips comments and the space between them, then lexes the token after
/// them. That token does not start a comment, so lex() does not come back
/// here: a file of many comment lines costs no stack.
LLVM_ATTRIBUTE_NOINLINE Token Lexer::lexAfterComments() {
  while (Cur[0] == '/' && Cur[1] == '/') {
    const char *Start = Cur;
    if (!skipComment())
      return error(Start, 2, "comment holds invalid UTF-8 or a NUL byte");
    if (Annotations && Start[2] == '!')
      Annotations->push_back(llvm::StringRef(Start, size_t(Cur - Start)));
    while (isSpace(*Cur))
      ++Cur;
  }
  return lex();
}

/// The end of the buffer, strings, '==' and every byte that is an error;
/// kept out of lex() so that the common path stays small.
LLVM_ATTRIBUTE_NOINLINE Token Lexer::lexOther() {
  const char *Start = Cur;
  unsigned char U = static_cast<unsigned char>(*Cur);
  if (U == '\0' && Cur == End)
    return make(Tok::Eof, Start);
  if (U == '"')
    return lexString(Start);
  if (U == '=') {
    if (Cur[1] == '=')
      return punct(Tok::EqEq, 2);
    return error(Start, 1, "unexpected '='; did you mean '=='?");
  }
  if (U == 0)
    return error(Start, 1, "unexpected NUL byte");
  if (U >= 0x80)
    return error(Start, 1,
                 fmt::format("unexpected non-ASCII byte 0x{:02X} outside a "
                             "comment",
                             unsigned(U)));
  if (U < 0x20 || U == 0x7F)
    return error(Start, 1,
                 fmt::format("unexpected control byte 0x{:02X}", unsigned(U)));
  return error(Start, 1, fmt::format("unexpected character '{}'", char(U)));
}

// Names and numbers are most of the tokens, and a call costs about as much
// as lexing a short one, so both are inlined into lex().
LLVM_ATTRIBUTE_ALWAYS_INLINE Token Lexer::lexIdentifier(const char *Start) {
  const char *P = identifierEnd(Start);
  Cur = P;
  llvm::StringRef Text(Start, size_t(P - Start));
  return Token{keywordKind(Text), Text};
}

/// real ::= ([0-9]+ '.' [0-9]* | [0-9]* '.' [0-9]+) ([eE][-+]?[0-9]+)?
///        | [0-9]+ [eE][-+]?[0-9]+          (accepted: published files use it)
/// nninteger ::= [1-9]+[0-9]* | 0
LLVM_ATTRIBUTE_ALWAYS_INLINE Token Lexer::lexNumber(const char *Start) {
  NumberExtent N = scanNumberExtent(Start);
  if (N.BadExponent)
    return error(Start, unsigned(N.BadExponent - Start),
                 "expected digits after the exponent of a number");
  const char *P = N.End;
  bool IsReal = N.IsReal;
  Cur = P;
  if (isIdentStart(*P))
    return error(Start, unsigned(P - Start) + 1,
                 "a number runs into a name; put a space or an operator "
                 "between them");
  if (!IsReal && P - Start > 1 && *Start == '0')
    return error(Start, unsigned(P - Start), "an integer may not start with 0");
  return make(IsReal ? Tok::Real : Tok::Integer, Start);
}

Token Lexer::lexString(const char *Start) {
  ++Cur; // opening quote
  const char *Body = Cur;
  while (Cur < End && *Cur != '"' && *Cur != '\n') {
    unsigned char U = static_cast<unsigned char>(*Cur);
    if (U == 0 || U >= 0x80)
      return error(Cur, 1, "include file names must be plain ASCII");
    ++Cur;
  }
  if (Cur >= End || *Cur != '"')
    return error(Start, 1, "unterminated string; expected a closing '\"'");
  llvm::StringRef Text(Body, size_t(Cur - Body));
  ++Cur; // closing quote
  return Token{Tok::String, Text};
}

} // namespace revbound::qasm
