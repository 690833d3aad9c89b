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

#include <cstdint>
#include <string>
#include <vector>

namespace revbound::qasm {

enum class Tok : uint8_t {
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

/// A token is its kind and its bytes in the buffer, 24 bytes, since one is
/// copied for every token of files with millions of lines. Where it starts
/// and ends is derived from Text.
struct Token {
  Tok Kind = Tok::Eof;
  llvm::StringRef Text; // the spelling (string contents for Tok::String)

  /// First byte; a string's Text leaves out the opening quote.
  const char *begin() const { return Text.data() - (Kind == Tok::String); }
  /// One past the last byte, a string's closing quote included.
  const char *end() const { return Text.end() + (Kind == Tok::String); }
  llvm::SMLoc loc() const { return llvm::SMLoc::getFromPointer(begin()); }
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
  /// From now on, appends every comment that starts with `//!` (a role
  /// annotation, docs/formats.md) to `Out`, from `//` to the end of line.
  void collectAnnotations(std::vector<llvm::StringRef> *Out) {
    Annotations = Out;
  }
  /// Where the next token will be looked for.
  const char *position() const { return Cur; }
  /// Continues lexing at `P`, a point of this buffer after position() that
  /// another reader (the plain-call scanner) has consumed up to.
  void resumeAt(const char *P) { Cur = P; }
  /// One past the buffer's last byte (its NUL).
  const char *bufferEnd() const { return End; }

  /// For an Error token: what is wrong (set when lex() returned Tok::Error).
  const std::string &errorMessage() const { return ErrorMessage; }

private:
  Token make(Tok K, const char *Start) const {
    return Token{K, llvm::StringRef(Start, size_t(Cur - Start))};
  }
  Token punct(Tok K, unsigned Length) {
    Cur += Length;
    return make(K, Cur - Length);
  }
  Token error(const char *At, unsigned Length, llvm::StringRef Message);
  Token lexAfterComments();
  Token lexOther();
  Token lexNumber(const char *Start);
  Token lexIdentifier(const char *Start);
  Token lexString(const char *Start);
  bool skipComment(); // false if the comment held invalid UTF-8

  const char *Cur;
  const char *End; // *End is the buffer's NUL, a sentinel for the hot loops
  std::string ErrorMessage;
  std::vector<llvm::StringRef> *Annotations = nullptr;
};

} // namespace revbound::qasm

#endif
