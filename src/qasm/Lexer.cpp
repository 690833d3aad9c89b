//===- Lexer.cpp - Tokens of OpenQASM 2.0 --------------------------------===//
#include "revbound/qasm/Lexer.h"

#include "llvm/ADT/StringSwitch.h"
#include "llvm/Support/ConvertUTF.h"

#include <fmt/format.h>

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

Lexer::Lexer(llvm::StringRef Buffer)
    : Cur(Buffer.begin()), End(Buffer.end()) {}

Token Lexer::make(Tok K, const char *Start) const {
  Token T;
  T.Kind = K;
  T.Text = llvm::StringRef(Start, size_t(Cur - Start));
  T.Loc = llvm::SMLoc::getFromPointer(Start);
  T.End = Cur;
  return T;
}

Token Lexer::error(const char *At, unsigned Length, std::string Message) {
  ErrorMessage = std::move(Message);
  Token T;
  T.Kind = Tok::Error;
  T.Text = llvm::StringRef(At, Length);
  T.Loc = llvm::SMLoc::getFromPointer(At);
  Cur = End; // nothing after a lexical error is trusted
  return T;
}

static bool isIdentStart(char C) {
  return (C >= 'a' && C <= 'z') || (C >= 'A' && C <= 'Z') || C == '_';
}
static bool isIdentBody(char C) {
  return isIdentStart(C) || (C >= '0' && C <= '9');
}
static bool isDigit(char C) { return C >= '0' && C <= '9'; }

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

Token Lexer::lex() {
  while (Cur < End) {
    char C = *Cur;
    if (C == ' ' || C == '\t' || C == '\n' || C == '\r' || C == '\f' ||
        C == '\v') {
      ++Cur;
      continue;
    }
    if (C == '/' && Cur + 1 < End && Cur[1] == '/') {
      const char *Start = Cur;
      if (!skipComment())
        return error(Start, 2, "comment holds invalid UTF-8 or a NUL byte");
      continue;
    }
    break;
  }
  if (Cur >= End) {
    Token T;
    T.Kind = Tok::Eof;
    T.Loc = llvm::SMLoc::getFromPointer(End);
    return T;
  }
  const char *Start = Cur;
  char C = *Cur;
  if (isIdentStart(C))
    return lexIdentifier(Start);
  if (isDigit(C) || (C == '.' && Cur + 1 < End && isDigit(Cur[1])))
    return lexNumber(Start);
  if (C == '"')
    return lexString(Start);
  ++Cur;
  switch (C) {
  case ';': return make(Tok::Semi, Start);
  case ',': return make(Tok::Comma, Start);
  case '(': return make(Tok::LParen, Start);
  case ')': return make(Tok::RParen, Start);
  case '[': return make(Tok::LBracket, Start);
  case ']': return make(Tok::RBracket, Start);
  case '{': return make(Tok::LBrace, Start);
  case '}': return make(Tok::RBrace, Start);
  case '+': return make(Tok::Plus, Start);
  case '*': return make(Tok::Star, Start);
  case '/': return make(Tok::Slash, Start);
  case '^': return make(Tok::Caret, Start);
  case '-':
    if (Cur < End && *Cur == '>') {
      ++Cur;
      return make(Tok::Arrow, Start);
    }
    return make(Tok::Minus, Start);
  case '=':
    if (Cur < End && *Cur == '=') {
      ++Cur;
      return make(Tok::EqEq, Start);
    }
    return error(Start, 1, "unexpected '='; did you mean '=='?");
  default:
    break;
  }
  unsigned char U = static_cast<unsigned char>(C);
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
  return error(Start, 1, fmt::format("unexpected character '{}'", C));
}

Token Lexer::lexIdentifier(const char *Start) {
  while (Cur < End && isIdentBody(*Cur))
    ++Cur;
  llvm::StringRef Text(Start, size_t(Cur - Start));
  Tok K = llvm::StringSwitch<Tok>(Text)
              .Case("OPENQASM", Tok::KwOpenqasm)
              .Case("include", Tok::KwInclude)
              .Case("qreg", Tok::KwQreg)
              .Case("creg", Tok::KwCreg)
              .Case("gate", Tok::KwGate)
              .Case("opaque", Tok::KwOpaque)
              .Case("measure", Tok::KwMeasure)
              .Case("reset", Tok::KwReset)
              .Case("barrier", Tok::KwBarrier)
              .Case("if", Tok::KwIf)
              .Case("pi", Tok::KwPi)
              .Case("U", Tok::KwU)
              .Case("CX", Tok::KwCX)
              .Default(Tok::Identifier);
  return make(K, Start);
}

/// real ::= ([0-9]+ '.' [0-9]* | [0-9]* '.' [0-9]+) ([eE][-+]?[0-9]+)?
///        | [0-9]+ [eE][-+]?[0-9]+          (accepted: published files use it)
/// nninteger ::= [1-9]+[0-9]* | 0
Token Lexer::lexNumber(const char *Start) {
  bool IsReal = false;
  while (Cur < End && isDigit(*Cur))
    ++Cur;
  if (Cur < End && *Cur == '.') {
    IsReal = true;
    ++Cur;
    while (Cur < End && isDigit(*Cur))
      ++Cur;
  }
  if (Cur < End && (*Cur == 'e' || *Cur == 'E')) {
    const char *P = Cur + 1;
    if (P < End && (*P == '+' || *P == '-'))
      ++P;
    if (P < End && isDigit(*P)) {
      IsReal = true;
      Cur = P;
      while (Cur < End && isDigit(*Cur))
        ++Cur;
    } else {
      return error(Start, unsigned(P - Start),
                   "expected digits after the exponent of a number");
    }
  }
  if (Cur < End && isIdentStart(*Cur))
    return error(Start, unsigned(Cur - Start) + 1,
                 "a number runs into a name; put a space or an operator "
                 "between them");
  if (!IsReal && Cur - Start > 1 && *Start == '0')
    return error(Start, unsigned(Cur - Start),
                 "an integer may not start with 0");
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
  Token T;
  T.Kind = Tok::String;
  T.Text = llvm::StringRef(Body, size_t(Cur - Body));
  T.Loc = llvm::SMLoc::getFromPointer(Start);
  ++Cur;
  T.End = Cur;
  return T;
}

} // namespace revbound::qasm
