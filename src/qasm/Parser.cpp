//===- Parser.cpp - Recursive-descent parser for OpenQASM 2.0 ------------===//
//
// One token of lookahead, one function per grammar rule. The grammar is the
// one of the OpenQASM 2.0 specification (Cross et al., arXiv:1707.03429,
// appendix); where it is silent (operator precedence) docs/language.md says
// what we chose.
//
//===----------------------------------------------------------------------===//
#include "revbound/qasm/Parser.h"
#include "PlainCallScanner.h"
#include "revbound/qasm/Lexer.h"
#include "revbound/qasm/StandardLibrary.h"

#include "llvm/ADT/ScopeExit.h"
#include "llvm/ADT/StringSwitch.h"
#include "llvm/Support/Allocator.h"
#include "llvm/Support/Compiler.h"
#include "llvm/Support/MemoryBuffer.h"

#include <atomic>
#include <charconv>
#include <cstdlib>
#include <cstring>
#include <optional>
#include <system_error>
#include <thread>
#include <fmt/format.h>

namespace revbound::qasm {

PlainCallSink::~PlainCallSink() = default;

bool StatementSink::tryPlainCall(const PlainCall &) { return false; }

const char *PlainCallSink::takePlainRun(const char *P,
                                        const std::atomic<bool> &Cancel,
                                        const char *Limit) {
  return scanPlainRun(P, *this, Cancel, Limit);
}

std::unique_ptr<PlainCallSink> StatementSink::forkPlainCalls(llvm::StringRef,
                                                             llvm::StringRef) {
  return nullptr;
}

bool StatementSink::joinPlainCalls(PlainCallSink &) { return false; }

bool StatementSink::defineBuiltinLibrary() { return false; }

unsigned Operand::length() const {
  if (!HasIndex)
    return unsigned(Reg.Name.size());
  return unsigned(IndexLoc.getPointer() - Reg.Loc.getPointer()) + IndexLength + 1;
}

namespace {

class Parser {
public:
  /// Where the lexers put `//!` comments (none when null).
  std::vector<llvm::StringRef> *Annotations = nullptr;

  Parser(SourceFiles &Files, const ParserOptions &Opts, StatementSink &Sink,
         DiagnosticSink &Warnings)
      : Files(Files), Opts(Opts), Sink(Sink), Warnings(Warnings) {}

  llvm::Error parseFile(unsigned BufferId, bool IsMain, bool IsLibrary,
                        unsigned Depth);

private:
  // Token handling.
  void lex() {
    PrevEnd = Cur.end();
    Cur = L->lex();
  }
  bool at(Tok K) const { return Cur.Kind == K; }
  bool eatIfPresent(Tok K) {
    if (!at(K))
      return false;
    lex();
    return true;
  }
  /// Consumes a `K`; otherwise the error saying what was expected.
  llvm::Error expect(Tok K, const char *Context) {
    if (eatIfPresent(K))
      return llvm::Error::success();
    return errorExpected(K, Context);
  }
  llvm::Expected<Ident> expectIdent(const char *Context);

  // Diagnostics about the current token. Out of line, so that the rules that
  // call them on every line keep small frames.
  LLVM_ATTRIBUTE_NOINLINE llvm::Error unexpected(const char *What);
  LLVM_ATTRIBUTE_NOINLINE llvm::Error errorExpected(Tok K, const char *Context);
  LLVM_ATTRIBUTE_NOINLINE llvm::Error errorExpectedIdent(const char *Context);
  LLVM_ATTRIBUTE_NOINLINE llvm::Error errorExpectedInteger(const char *Context);
  LLVM_ATTRIBUTE_NOINLINE llvm::Error errorIntegerRange();

  // Grammar rules.
  llvm::Error parseHeader(bool IsMain);
  llvm::Error parseStatement(unsigned Depth);
  llvm::Error parseInclude(unsigned Depth);
  llvm::Error parseRegisterDecl(StmtKind Kind);
  llvm::Error parseGateDecl(bool Opaque);
  llvm::Error parseGateBody(GateDecl &D);
  llvm::Error parseQuantumOp(Statement &S);
  llvm::Error parseGateCall(GateCall &C, bool AllowIndex);
  llvm::Error parseOperand(Operand &O, bool AllowIndex);
  llvm::Error parseIf();
  llvm::Expected<uint64_t> parseInteger(const char *Context);
  llvm::Expected<const Expr *> parseExpr();
  llvm::Expected<const Expr *> parseTerm();
  llvm::Expected<const Expr *> parseUnary();
  llvm::Expected<const Expr *> parsePower();
  llvm::Expected<const Expr *> parsePrimary();

  Expr *newExpr(ExprKind K, const Token &At) {
    Expr *E = new (Arena.Allocate<Expr>()) Expr();
    E->Kind = K;
    E->Loc = At.loc();
    E->Length = At.length();
    return E;
  }
  llvm::Error emit() {
    llvm::Error E = Sink.onStatement(Stmt);
    if (Arena.getBytesAllocated() != 0) // most statements have no expression
      Arena.Reset();
    return E;
  }

  SourceFiles &Files;
  const ParserOptions &Opts;
  StatementSink &Sink;
  DiagnosticSink &Warnings;
  Lexer *L = nullptr;
  Token Cur;
  const char *PrevEnd = nullptr; // end of the last token consumed
  bool InLibrary = false;
  bool LibraryIncluded = false;
  llvm::BumpPtrAllocator Arena;
  unsigned ExprDepth = 0;
  static constexpr unsigned MaxExprDepth = 200;
  Statement Stmt; // reused so that a flat file costs no allocation per line
  PlainCall Plain; // likewise, for the plain calls read past the lexer
  std::vector<std::string> IncludeStack;

  /// The main file's second half, read by a second thread
  /// (ParserOptions::MinBytesForSecondThread).
  struct SecondReader {
    std::unique_ptr<PlainCallSink> Fork;
    const char *Start = nullptr; // the first byte of a line
    const char *End = nullptr;   // after its last call taken, or null
    std::atomic<bool> Cancel{false};
    std::thread Thread;
    ~SecondReader() {
      Cancel = true;
      if (Thread.joinable())
        Thread.join();
    }
  };
  void startSecondReader(const char *From);
  void joinSecondReader();
  std::unique_ptr<SecondReader> Second;
  bool SecondTried = false;
  bool InMain = false;
};

// Splits what is left after the main file's first plain call at the line
// that starts past its middle, and reads from there on another thread. The
// split point needs no other care: whatever might make the two readings
// differ makes joinSecondReader discard the second one.
void Parser::startSecondReader(const char *From) {
  SecondTried = true;
  const char *End = L->bufferEnd();
  uint64_t Left = uint64_t(End - From);
  if (Left < Opts.MinBytesForSecondThread || Left < 2)
    return;
  const char *Mid = From + Left / 2;
  const void *LineEnd = std::memchr(Mid, '\n', size_t(End - Mid));
  if (!LineEnd)
    return;
  const char *Start = static_cast<const char *>(LineEnd) + 1;
  std::unique_ptr<PlainCallSink> Fork =
      Sink.forkPlainCalls(llvm::StringRef(From, size_t(Start - From)),
                          llvm::StringRef(Start, size_t(End - Start)));
  if (!Fork)
    return;
  auto R = std::make_unique<SecondReader>();
  R->Fork = std::move(Fork);
  R->Start = Start;
  SecondReader *Reader = R.get();
  try {
    R->Thread = std::thread([Reader] {
      Reader->End = Reader->Fork->takePlainRun(Reader->Start, Reader->Cancel,
                                               /*Limit=*/nullptr);
    });
  } catch (const std::system_error &) {
    return; // no thread to be had: everything is read on this one
  }
  Second = std::move(R);
}

// Called at the first statement that starts at or past the second reader's
// start. Its calls stand for ours only when no statement of ours straddles
// that start, so that ours would begin there too, and when the sink agrees
// that nothing they depend on has changed.
void Parser::joinSecondReader() {
  std::unique_ptr<SecondReader> R = std::move(Second);
  R->Thread.join();
  if (!R->End || PrevEnd > R->Start || !Sink.joinPlainCalls(*R->Fork))
    return;
  L->resumeAt(R->End);
  PrevEnd = R->End;
  Cur = L->lex();
}

llvm::Error Parser::unexpected(const char *What) {
  if (at(Tok::Error))
    return errorAt(Cur.loc(), L->errorMessage(), Cur.length());
  return errorAt(Cur.loc(),
                 fmt::format("expected {}, got {}", What, describe(Cur)),
                 Cur.length());
}

llvm::Error Parser::errorExpected(Tok K, const char *Context) {
  if (at(Tok::Error))
    return unexpected("");
  // A missing ';' belongs to the line it should end, as in clang.
  if (K == Tok::Semi && PrevEnd)
    return errorAt(llvm::SMLoc::getFromPointer(PrevEnd),
                   fmt::format("expected ';' {}", Context));
  return errorAt(Cur.loc(),
                 fmt::format("expected {} {}, got {}", tokenName(K), Context,
                             describe(Cur)),
                 Cur.length());
}

llvm::Error Parser::errorExpectedIdent(const char *Context) {
  if (at(Tok::Error))
    return unexpected("");
  return errorAt(
      Cur.loc(),
      fmt::format("expected a name {}, got {}", Context, describe(Cur)),
      Cur.length());
}

llvm::Expected<Ident> Parser::expectIdent(const char *Context) {
  if (!at(Tok::Identifier))
    return errorExpectedIdent(Context);
  Ident I{Cur.Text, Cur.loc()};
  lex();
  return I;
}

llvm::Error Parser::parseFile(unsigned BufferId, bool IsMain, bool IsLibrary,
                              unsigned Depth) {
  Lexer Lex(Files.mgr().getMemoryBuffer(BufferId)->getBuffer());
  Lexer *SavedL = L;
  Token SavedCur = Cur;
  const char *SavedPrevEnd = PrevEnd;
  PrevEnd = nullptr;
  bool SavedLib = InLibrary, SavedMain = InMain;
  L = &Lex;
  Lex.collectAnnotations(Annotations);
  InLibrary = IsLibrary;
  InMain = IsMain;
  lex();
  llvm::Error Err = parseHeader(IsMain);
  while (!Err && !at(Tok::Eof)) {
    if (IsMain && Second && Cur.loc().getPointer() >= Second->Start) {
      joinSecondReader();
      continue; // it may have read to the end
    }
    Err = parseStatement(Depth);
  }
  if (IsMain)
    Second.reset(); // never joined: an error came first, or only blanks
                    // followed its start
  L = SavedL;
  Cur = SavedCur;
  PrevEnd = SavedPrevEnd;
  InLibrary = SavedLib;
  InMain = SavedMain;
  return Err;
}

///   header ::= 'OPENQASM' real ';'
llvm::Error Parser::parseHeader(bool IsMain) {
  if (!at(Tok::KwOpenqasm)) {
    if (IsMain && !at(Tok::Error))
      Warnings.warn(Cur.loc(),
                    "missing 'OPENQASM 2.0;' header; reading the file "
                    "as OpenQASM 2.0",
                    Cur.length());
    return llvm::Error::success();
  }
  llvm::SMLoc HeaderLoc = Cur.loc();
  lex();
  if (!at(Tok::Real) && !at(Tok::Integer))
    return unexpected("a version number after 'OPENQASM'");
  if (Cur.Text != "2.0" && Cur.Text != "2")
    return errorAt(Cur.loc(),
                   fmt::format("unsupported OpenQASM version '{}'; revbound "
                               "reads OpenQASM 2.0",
                               Cur.Text.str()),
                   Cur.length());
  (void)HeaderLoc;
  lex();
  return expect(Tok::Semi, "after the version");
}

llvm::Error Parser::parseStatement(unsigned Depth) {
  switch (Cur.Kind) {
  case Tok::KwInclude:
    return parseInclude(Depth);
  case Tok::KwQreg:
    return parseRegisterDecl(StmtKind::QReg);
  case Tok::KwCreg:
    return parseRegisterDecl(StmtKind::CReg);
  case Tok::KwGate:
    return parseGateDecl(/*Opaque=*/false);
  case Tok::KwOpaque:
    return parseGateDecl(/*Opaque=*/true);
  case Tok::KwIf:
    return parseIf();
  case Tok::KwOpenqasm:
    return errorAt(Cur.loc(), "the 'OPENQASM' header may only open a file",
                   Cur.length());
  case Tok::Identifier:
    if (const char *After =
            Opts.ReadPlainCalls
                ? scanPlainCall({Cur.Text, Cur.loc()}, L->position(), Plain)
                : nullptr;
        After && Sink.tryPlainCall(Plain)) {
      if (InMain && !SecondTried)
        startSecondReader(After);
      // Plain calls come in long runs: read the rest of this one straight
      // from the bytes too, as the second reader does, and stop short of
      // its start so that the join sees the statement there.
      static const std::atomic<bool> NeverCancelled{false};
      if (const char *RunEnd =
              Sink.takePlainRun(After, NeverCancelled,
                                InMain && Second ? Second->Start : nullptr))
        After = RunEnd;
      L->resumeAt(After);
      PrevEnd = After;
      Cur = L->lex();
      return llvm::Error::success();
    }
    [[fallthrough]];
  case Tok::KwU:
  case Tok::KwCX:
  case Tok::KwMeasure:
  case Tok::KwReset:
  case Tok::KwBarrier: {
    Stmt.HasCondition = false;
    if (llvm::Error E = parseQuantumOp(Stmt))
      return E;
    return emit();
  }
  case Tok::Eof:
  case Tok::Error:
  case Tok::Integer:
  case Tok::Real:
  case Tok::String:
  case Tok::KwPi:
  case Tok::Semi:
  case Tok::Comma:
  case Tok::LParen:
  case Tok::RParen:
  case Tok::LBracket:
  case Tok::RBracket:
  case Tok::LBrace:
  case Tok::RBrace:
  case Tok::Arrow:
  case Tok::EqEq:
  case Tok::Plus:
  case Tok::Minus:
  case Tok::Star:
  case Tok::Slash:
  case Tok::Caret:
    break;
  }
  return unexpected("a statement");
}

///   include ::= 'include' string ';'
llvm::Error Parser::parseInclude(unsigned Depth) {
  lex();
  if (!at(Tok::String))
    return unexpected("a quoted file name after 'include'");
  Token NameTok = Cur;
  lex();
  if (llvm::Error E = expect(Tok::Semi, "after the include file name"))
    return E;
  if (Depth + 1 > Opts.MaxIncludeDepth)
    return errorAt(NameTok.loc(),
                   fmt::format("includes nest deeper than {} files "
                               "(--max-include-depth)",
                               Opts.MaxIncludeDepth),
                   NameTok.length() + 2);
  unsigned Id;
  bool IsLibrary = NameTok.Text == "qelib1.inc";
  if (IsLibrary && LibraryIncluded) {
    Warnings.warn(NameTok.loc(),
                  "'qelib1.inc' is included again; the second "
                  "include is ignored",
                  NameTok.length() + 2);
    return llvm::Error::success();
  }
  LibraryIncluded |= IsLibrary;
  if (IsLibrary && Opts.StandardLibraryPath.empty()) {
    Id = Files.addStaticBuffer(BuiltinLibraryName, builtinLibraryText());
    if (Sink.defineBuiltinLibrary())
      return llvm::Error::success();
  } else if (IsLibrary) {
    llvm::Expected<unsigned> Loaded =
        Files.loadNamed(Opts.StandardLibraryPath, NameTok.loc(),
                        NameTok.length() + 2);
    if (!Loaded)
      return Loaded.takeError();
    Id = *Loaded;
  } else {
    llvm::Expected<unsigned> Loaded =
        Files.loadInclude(NameTok.Text, NameTok.loc(), NameTok.length() + 2);
    if (!Loaded)
      return Loaded.takeError();
    Id = *Loaded;
  }
  std::string Canon = Files.canonicalPath(Id).str();
  if (!Canon.empty()) {
    for (const std::string &Open : IncludeStack)
      if (Open == Canon)
        return errorAt(NameTok.loc(),
                       fmt::format("include cycle: '{}' is already being "
                                   "read further up the include chain",
                                   NameTok.Text.str()),
                       NameTok.length() + 2);
    IncludeStack.push_back(Canon);
  }
  llvm::Error E = parseFile(Id, /*IsMain=*/false, IsLibrary || InLibrary,
                            Depth + 1);
  if (!Canon.empty())
    IncludeStack.pop_back();
  return E;
}

///   decl ::= ('qreg' | 'creg') id '[' nninteger ']' ';'
llvm::Error Parser::parseRegisterDecl(StmtKind Kind) {
  Stmt.Kind = Kind;
  Stmt.Loc = Cur.loc();
  Stmt.HasCondition = false;
  lex();
  llvm::Expected<Ident> Name = expectIdent(Kind == StmtKind::QReg
                                               ? "for the quantum register"
                                               : "for the classical register");
  if (!Name)
    return Name.takeError();
  Stmt.RegName = *Name;
  if (llvm::Error E = expect(Tok::LBracket, "after the register name"))
    return E;
  Stmt.RegSizeLoc = Cur.loc();
  Stmt.RegSizeLength = Cur.length();
  llvm::Expected<uint64_t> Size = parseInteger("for the register size");
  if (!Size)
    return Size.takeError();
  Stmt.RegSize = *Size;
  if (llvm::Error E = expect(Tok::RBracket, "after the register size"))
    return E;
  if (llvm::Error E = expect(Tok::Semi, "after the register declaration"))
    return E;
  return emit();
}

llvm::Error Parser::errorExpectedInteger(const char *Context) {
  if (at(Tok::Error))
    return unexpected("");
  return errorAt(Cur.loc(),
                 fmt::format("expected a non-negative integer {}, got {}",
                             Context, describe(Cur)),
                 Cur.length());
}

llvm::Error Parser::errorIntegerRange() {
  return errorAt(Cur.loc(),
                 fmt::format("integer '{}' is out of range (at most {})",
                             Cur.Text.str(), UINT64_MAX),
                 Cur.length());
}

llvm::Expected<uint64_t> Parser::parseInteger(const char *Context) {
  if (!at(Tok::Integer))
    return errorExpectedInteger(Context);
  // The lexer lets only digits through, so overflow is all that can fail.
  uint64_t V = 0;
  for (char Digit : Cur.Text)
    if (__builtin_mul_overflow(V, 10, &V) ||
        __builtin_add_overflow(V, uint64_t(Digit - '0'), &V))
      return errorIntegerRange();
  lex();
  return V;
}

///   gatedecl ::= 'gate' id ('(' idlist? ')')? idlist '{' goplist? '}'
///   opaque   ::= 'opaque' id ('(' idlist? ')')? idlist ';'
llvm::Error Parser::parseGateDecl(bool Opaque) {
  Stmt.Kind = StmtKind::GateDecl;
  Stmt.Loc = Cur.loc();
  Stmt.HasCondition = false;
  lex();
  GateDecl Decl;
  GateDecl *D = &Decl;
  D->Opaque = Opaque;
  D->FromStandardLibrary = InLibrary;
  D->FromBuiltinLibrary = InLibrary && Opts.StandardLibraryPath.empty();
  if (at(Tok::KwU) || at(Tok::KwCX))
    return errorAt(Cur.loc(),
                   fmt::format("cannot redefine the built-in gate '{}'",
                               Cur.Text.str()),
                   Cur.length());
  llvm::Expected<Ident> Name = expectIdent("for the gate");
  if (!Name)
    return Name.takeError();
  D->Name = *Name;
  if (eatIfPresent(Tok::LParen)) {
    if (!at(Tok::RParen)) {
      do {
        llvm::Expected<Ident> P = expectIdent("for a gate parameter");
        if (!P)
          return P.takeError();
        D->Params.push_back(*P);
      } while (eatIfPresent(Tok::Comma));
    }
    if (llvm::Error E = expect(Tok::RParen, "after the gate parameters"))
      return E;
  }
  do {
    llvm::Expected<Ident> Q = expectIdent("for a gate qubit argument");
    if (!Q)
      return Q.takeError();
    D->Qubits.push_back(*Q);
  } while (eatIfPresent(Tok::Comma));
  if (Opaque) {
    if (llvm::Error E = expect(Tok::Semi, "after the opaque gate declaration"))
      return E;
  } else {
    if (llvm::Error E = parseGateBody(*D))
      return E;
  }
  Stmt.Decl = D;
  return emit();
}

///   goplist ::= (uop | 'barrier' idlist ';')*
llvm::Error Parser::parseGateBody(GateDecl &D) {
  llvm::SMLoc Open = Cur.loc();
  if (llvm::Error E = expect(Tok::LBrace, "to open the gate body"))
    return E;
  while (!at(Tok::RBrace)) {
    BodyStatement B;
    B.Loc = Cur.loc();
    switch (Cur.Kind) {
    case Tok::Eof: {
      llvm::Error E =
          errorAt(Cur.loc(), "unterminated gate body; expected '}'");
      Diagnostic Note;
      Note.Sev = Severity::Note;
      Note.Loc = Open;
      Note.Length = 1;
      Note.Message = "the gate body opened here";
      return llvm::handleErrors(std::move(E), [&](DiagnosticError &DE) {
        Diagnostic Full = DE.diagnostic();
        Full.Notes.push_back(Note);
        return llvm::make_error<DiagnosticError>(std::move(Full));
      });
    }
    case Tok::KwBarrier:
      B.IsBarrier = true;
      lex();
      do {
        if (llvm::Error E =
                parseOperand(B.Call.Args.emplace_back(), /*AllowIndex=*/false))
          return E;
      } while (eatIfPresent(Tok::Comma));
      if (llvm::Error E = expect(Tok::Semi, "after the barrier"))
        return E;
      break;
    case Tok::Identifier:
    case Tok::KwU:
    case Tok::KwCX:
      if (llvm::Error E = parseGateCall(B.Call, /*AllowIndex=*/false))
        return E;
      break;
    case Tok::KwMeasure:
    case Tok::KwReset:
    case Tok::KwIf:
    case Tok::KwGate:
    case Tok::KwOpaque:
    case Tok::KwQreg:
    case Tok::KwCreg:
    case Tok::KwInclude:
      return errorAt(Cur.loc(),
                     fmt::format("{} is not allowed inside a gate body; a gate "
                                 "body holds only gate calls and barriers",
                                 tokenName(Cur.Kind)),
                     Cur.length());
    default:
      return unexpected("a gate call, 'barrier' or '}' in the gate body");
    }
    D.Body.push_back(std::move(B));
  }
  lex(); // '}'
  return llvm::Error::success();
}

///   qop ::= uop | 'measure' argument '->' argument ';' | 'reset' argument ';'
///         | 'barrier' anylist ';'
llvm::Error Parser::parseQuantumOp(Statement &S) {
  S.Loc = Cur.loc();
  switch (Cur.Kind) {
  case Tok::KwMeasure:
    S.Kind = StmtKind::Measure;
    lex();
    if (llvm::Error E = parseOperand(S.Target, true))
      return E;
    if (llvm::Error E = expect(Tok::Arrow, "between the measured qubit and the bit"))
      return E;
    if (llvm::Error E = parseOperand(S.Result, true))
      return E;
    return expect(Tok::Semi, "after the measurement");
  case Tok::KwReset:
    S.Kind = StmtKind::Reset;
    lex();
    if (llvm::Error E = parseOperand(S.Target, true))
      return E;
    return expect(Tok::Semi, "after the reset");
  case Tok::KwBarrier:
    S.Kind = StmtKind::Barrier;
    S.Barrier.clear();
    lex();
    do {
      if (llvm::Error E = parseOperand(S.Barrier.emplace_back(), true))
        return E;
    } while (eatIfPresent(Tok::Comma));
    return expect(Tok::Semi, "after the barrier");
  case Tok::Identifier:
  case Tok::KwU:
  case Tok::KwCX:
    S.Kind = StmtKind::GateCall;
    return parseGateCall(S.Call, /*AllowIndex=*/true);
  default:
    return unexpected("a gate call, 'measure' or 'reset'");
  }
}

///   uop ::= 'U' '(' explist ')' argument ';' | 'CX' argument ',' argument ';'
///         | id anylist ';' | id '(' explist? ')' anylist ';'
llvm::Error Parser::parseGateCall(GateCall &C, bool AllowIndex) {
  C.Gate = Ident{Cur.Text, Cur.loc()};
  C.Params.clear();
  C.Args.clear();
  lex();
  if (eatIfPresent(Tok::LParen)) {
    if (!at(Tok::RParen)) {
      do {
        llvm::Expected<const Expr *> P = parseExpr();
        if (!P)
          return P.takeError();
        C.Params.push_back(*P);
      } while (eatIfPresent(Tok::Comma));
    }
    if (llvm::Error E = expect(Tok::RParen, "after the gate parameters"))
      return E;
  }
  do {
    if (llvm::Error E = parseOperand(C.Args.emplace_back(), AllowIndex))
      return E;
  } while (eatIfPresent(Tok::Comma));
  return expect(Tok::Semi, "after the gate call");
}

///   argument ::= id | id '[' nninteger ']'
llvm::Error Parser::parseOperand(Operand &O, bool AllowIndex) {
  if (!at(Tok::Identifier))
    return errorExpectedIdent("for a qubit or bit");
  O.Reg = Ident{Cur.Text, Cur.loc()};
  O.HasIndex = false;
  lex();
  if (!at(Tok::LBracket))
    return llvm::Error::success();
  if (!AllowIndex)
    return errorAt(Cur.loc(),
                   "gate body arguments are names of the gate's "
                   "qubits and cannot be indexed",
                   1);
  lex();
  O.HasIndex = true;
  O.IndexLoc = Cur.loc();
  O.IndexLength = Cur.length();
  llvm::Expected<uint64_t> Index = parseInteger("for the index");
  if (!Index)
    return Index.takeError();
  O.Index = *Index;
  return expect(Tok::RBracket, "after the index");
}

///   if ::= 'if' '(' id '==' nninteger ')' qop
llvm::Error Parser::parseIf() {
  llvm::SMLoc IfLoc = Cur.loc();
  lex();
  if (llvm::Error E = expect(Tok::LParen, "after 'if'"))
    return E;
  llvm::Expected<Ident> Reg = expectIdent("of a classical register in 'if'");
  if (!Reg)
    return Reg.takeError();
  if (at(Tok::LBracket))
    return errorAt(Cur.loc(),
                   "'if' compares a whole classical register; "
                   "single bits cannot be tested in OpenQASM 2.0",
                   1);
  if (llvm::Error E = expect(Tok::EqEq, "after the register in 'if'"))
    return E;
  if (!at(Tok::Integer))
    return unexpected("a non-negative integer to compare with");
  Stmt.CondValue = Cur.Text;
  Stmt.CondValueLoc = Cur.loc();
  lex();
  if (llvm::Error E = expect(Tok::RParen, "after the condition"))
    return E;
  if (!(at(Tok::Identifier) || at(Tok::KwU) || at(Tok::KwCX) ||
        at(Tok::KwMeasure) || at(Tok::KwReset)))
    return unexpected("a gate call, 'measure' or 'reset' after the condition");
  if (llvm::Error E = parseQuantumOp(Stmt))
    return E;
  Stmt.Loc = IfLoc;
  Stmt.HasCondition = true;
  Stmt.CondReg = *Reg;
  return emit();
}

// Precedence, loosest first (docs/language.md):
//   expr  ::= term (('+' | '-') term)*
//   term  ::= unary (('*' | '/') unary)*
//   unary ::= '-' unary | power
//   power ::= primary ('^' unary)?        right-associative, so -2^2 = -4
llvm::Expected<const Expr *> Parser::parseExpr() {
  llvm::Expected<const Expr *> Lhs = parseTerm();
  if (!Lhs)
    return Lhs;
  const Expr *Acc = *Lhs;
  while (at(Tok::Plus) || at(Tok::Minus)) {
    Expr *B = newExpr(at(Tok::Plus) ? ExprKind::Add : ExprKind::Sub, Cur);
    lex();
    llvm::Expected<const Expr *> Rhs = parseTerm();
    if (!Rhs)
      return Rhs;
    B->Lhs = Acc;
    B->Rhs = *Rhs;
    Acc = B;
  }
  return Acc;
}

llvm::Expected<const Expr *> Parser::parseTerm() {
  llvm::Expected<const Expr *> Lhs = parseUnary();
  if (!Lhs)
    return Lhs;
  const Expr *Acc = *Lhs;
  while (at(Tok::Star) || at(Tok::Slash)) {
    Expr *B = newExpr(at(Tok::Star) ? ExprKind::Mul : ExprKind::Div, Cur);
    lex();
    llvm::Expected<const Expr *> Rhs = parseUnary();
    if (!Rhs)
      return Rhs;
    B->Lhs = Acc;
    B->Rhs = *Rhs;
    Acc = B;
  }
  return Acc;
}

llvm::Expected<const Expr *> Parser::parseUnary() {
  // Each nesting level is a few stack frames; bound it so that hostile input
  // cannot overflow the stack.
  if (++ExprDepth > MaxExprDepth)
    return errorAt(Cur.loc(),
                   fmt::format("expression nests deeper than {} levels",
                               MaxExprDepth),
                   Cur.length());
  auto Leave = llvm::make_scope_exit([&] { --ExprDepth; });
  if (at(Tok::Minus)) {
    Expr *N = newExpr(ExprKind::Neg, Cur);
    lex();
    llvm::Expected<const Expr *> Operand = parseUnary();
    if (!Operand)
      return Operand;
    N->Lhs = *Operand;
    return N;
  }
  return parsePower();
}

llvm::Expected<const Expr *> Parser::parsePower() {
  llvm::Expected<const Expr *> Base = parsePrimary();
  if (!Base || !at(Tok::Caret))
    return Base;
  Expr *P = newExpr(ExprKind::Pow, Cur);
  lex();
  llvm::Expected<const Expr *> Exponent = parseUnary();
  if (!Exponent)
    return Exponent;
  P->Lhs = *Base;
  P->Rhs = *Exponent;
  return P;
}

///   primary ::= real | nninteger | 'pi' | id | unaryop '(' expr ')' | '(' expr ')'
llvm::Expected<const Expr *> Parser::parsePrimary() {
  switch (Cur.Kind) {
  case Tok::Real:
  case Tok::Integer: {
    Expr *N = newExpr(ExprKind::Number, Cur);
    auto [Ptr, Ec] = std::from_chars(Cur.Text.begin(), Cur.Text.end(), N->Value);
    // from_chars reports underflow as out of range too; a tiny number is 0.
    if (Ec == std::errc::result_out_of_range && Ptr == Cur.Text.end() &&
        std::strtod(std::string(Cur.Text).c_str(), nullptr) == 0) {
      N->Value = 0;
      Ec = std::errc();
    }
    if (Ec != std::errc() || Ptr != Cur.Text.end())
      return errorAt(Cur.loc(),
                     fmt::format("number '{}' is out of the range of a double",
                                 Cur.Text.str()),
                     Cur.length());
    lex();
    return N;
  }
  case Tok::KwPi: {
    Expr *N = newExpr(ExprKind::Pi, Cur);
    lex();
    return N;
  }
  case Tok::LParen: {
    lex();
    llvm::Expected<const Expr *> Inner = parseExpr();
    if (!Inner)
      return Inner;
    if (llvm::Error E = expect(Tok::RParen, "to close the parenthesis"))
      return std::move(E);
    return Inner;
  }
  case Tok::Identifier: {
    Token NameTok = Cur;
    lex();
    if (!at(Tok::LParen)) {
      Expr *N = newExpr(ExprKind::Name, NameTok);
      N->Name = NameTok.Text;
      return N;
    }
    std::optional<MathFunc> F = llvm::StringSwitch<std::optional<MathFunc>>(NameTok.Text)
                                    .Case("sin", MathFunc::Sin)
                                    .Case("cos", MathFunc::Cos)
                                    .Case("tan", MathFunc::Tan)
                                    .Case("exp", MathFunc::Exp)
                                    .Case("ln", MathFunc::Ln)
                                    .Case("sqrt", MathFunc::Sqrt)
                                    .Default(std::nullopt);
    if (!F)
      return errorAt(NameTok.loc(),
                     fmt::format("unknown function '{}'; expected one of sin, "
                                 "cos, tan, exp, ln, sqrt",
                                 NameTok.Text.str()),
                     NameTok.length());
    Expr *C = newExpr(ExprKind::Call, NameTok);
    C->Func = *F;
    lex(); // '('
    llvm::Expected<const Expr *> Arg = parseExpr();
    if (!Arg)
      return Arg;
    if (llvm::Error E = expect(Tok::RParen, "after the function argument"))
      return std::move(E);
    C->Lhs = *Arg;
    return C;
  }
  default:
    return unexpected("an expression");
  }
}

} // namespace

llvm::Error parseProgram(SourceFiles &Files, unsigned BufferId,
                         const ParserOptions &Opts, StatementSink &Sink,
                         DiagnosticSink &Warnings,
                         std::vector<llvm::StringRef> *Annotations) {
  Parser P(Files, Opts, Sink, Warnings);
  P.Annotations = Annotations;
  return P.parseFile(BufferId, /*IsMain=*/true, /*IsLibrary=*/false, 0);
}

} // namespace revbound::qasm
