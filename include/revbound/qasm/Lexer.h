//===- Lexer.h - Tokens of OpenQASM 2.0 ----------------------------------===//
//
// Splits one buffer into tokens with one token of lookahead. Comments run
// from `//` to the end of the line and may hold any valid UTF-8; outside
// comments and strings only ASCII is allowed. A bad byte becomes an Error
// token whose diagnostic the parser reports first, so the most specific
// message wins.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_QASM_LEXER_H
#define REVBOUND_QASM_LEXER_H

#include "llvm/ADT/StringRef.h"
#include "llvm/Support/SMLoc.h"

#include <string>

namespace revbound::qasm {

enum class Tok {
  Eof,
  Error,
  Identifier,
  Integer, // nninteger: 0 or [1-9][0-9]*
  Real,    // with a dot or an exponent
  String,  // "..." without the quotes in Text
  // Keywords.
  KwOpenqasm,
  KwInclude,
  KwQreg,
  KwCreg,
  KwGate,
  KwOpaque,
  KwMeasure,
  KwReset,
  KwBarrier,
  KwIf,
  KwPi,
  KwU,
  KwCX,
  // Punctuation and operators.
  Semi,
  Comma,
  LParen,
  RParen,
  LBracket,
  RBracket,
  LBrace,
  RBrace,
  Arrow,   // ->
  EqEq,    // ==
  Plus,
  Minus,
  Star,
  Slash,
  Caret,
};

/// A short human name for a token kind, as used in "expected X, got Y".
const char *tokenName(Tok K);

struct Token {
  Tok Kind = Tok::Eof;
  llvm::StringRef Text; // the spelling (string contents for Tok::String)
  llvm::SMLoc Loc;
  const char *End = nullptr; // one past the token's last byte (quotes included)
  unsigned length() const { return unsigned(Text.size()); }
};

/// Describes a token for a diagnostic: "identifier 'cx'", "';'", "end of file".
std::string describe(const Token &T);

class Lexer {
public:
  /// `Buffer` must stay alive and end with a NUL (llvm::MemoryBuffer does).
  explicit Lexer(llvm::StringRef Buffer);

  /// Returns the next token and advances.
  Token lex();
  /// For an Error token: what is wrong (set when lex() returned Tok::Error).
  const std::string &errorMessage() const { return ErrorMessage; }

private:
  Token make(Tok K, const char *Start) const;
  Token error(const char *At, unsigned Length, std::string Message);
  Token lexNumber(const char *Start);
  Token lexIdentifier(const char *Start);
  Token lexString(const char *Start);
  bool skipComment(); // false if the comment held invalid UTF-8

  const char *Cur;
  const char *End;
  std::string ErrorMessage;
};

} // namespace revbound::qasm

#endif
