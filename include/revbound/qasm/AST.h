//===- AST.h - Syntax of one OpenQASM 2.0 statement ----------------------===//
//
// The parser hands statements to a StatementSink one at a time, so a flat
// file of millions of operations is never held as a syntax tree. Names are
// StringRefs into source buffers, which live as long as the SourceFiles that
// owns them; expressions live in the parser's arena until the sink returns.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_QASM_AST_H
#define REVBOUND_QASM_AST_H

#include "llvm/ADT/SmallVector.h"
#include "llvm/ADT/StringRef.h"
#include "llvm/Support/Error.h"
#include "llvm/Support/SMLoc.h"

#include <atomic>
#include <cstdint>
#include <memory>
#include <vector>

namespace revbound::qasm {

enum class ExprKind : uint8_t { Number, Pi, Name, Neg, Add, Sub, Mul, Div, Pow, Call };
enum class MathFunc : uint8_t { Sin, Cos, Tan, Exp, Ln, Sqrt };

/// An arithmetic expression over real numbers, pi and gate parameters.
struct Expr {
  ExprKind Kind = ExprKind::Number;
  MathFunc Func = MathFunc::Sin; // for Call
  llvm::SMLoc Loc;
  unsigned Length = 0;           // bytes of the leading token, for diagnostics
  double Value = 0;              // for Number
  llvm::StringRef Name;          // for Name
  const Expr *Lhs = nullptr;     // operand of Neg and Call, left of a binary
  const Expr *Rhs = nullptr;
};

/// A name with where it was written.
struct Ident {
  llvm::StringRef Name;
  llvm::SMLoc Loc;
};

/// `q` or `q[3]` as an operand.
struct Operand {
  Ident Reg;
  bool HasIndex = false;
  uint64_t Index = 0;
  llvm::SMLoc IndexLoc;
  unsigned IndexLength = 0;
  unsigned length() const; // bytes from the name to the closing bracket
};

/// `name(params) args;`, also `U(...) q;` and `CX a,b;`.
struct GateCall {
  Ident Gate;
  llvm::SmallVector<const Expr *, 3> Params;
  llvm::SmallVector<Operand, 3> Args;
};

/// One statement inside a gate body: a call or a barrier over local names.
struct BodyStatement {
  bool IsBarrier = false;
  llvm::SMLoc Loc;
  GateCall Call; // for a barrier only Call.Args is used, without indices
};

/// `gate name(params) qubits { body }` or `opaque name(params) qubits;`.
struct GateDecl {
  Ident Name;
  bool Opaque = false;
  bool FromStandardLibrary = false; // declared by the qelib1.inc in use
  bool FromBuiltinLibrary = false;  // ... and that is the built-in one
  llvm::SmallVector<Ident, 4> Params;
  llvm::SmallVector<Ident, 4> Qubits;
  std::vector<BodyStatement> Body;
};

enum class StmtKind : uint8_t { QReg, CReg, GateDecl, GateCall, Measure, Reset, Barrier };

/// One top-level statement. Only the fields of its kind are meaningful.
struct Statement {
  StmtKind Kind = StmtKind::GateCall;
  llvm::SMLoc Loc;
  // Register declarations.
  Ident RegName;
  uint64_t RegSize = 0;
  llvm::SMLoc RegSizeLoc;
  unsigned RegSizeLength = 0;
  // Quantum operations.
  GateCall Call;                         // GateCall
  Operand Target;                        // Measure source, Reset target
  Operand Result;                        // Measure destination
  llvm::SmallVector<Operand, 4> Barrier; // Barrier
  const GateDecl *Decl = nullptr;        // GateDecl
  // `if (creg == value)` in front of an operation.
  bool HasCondition = false;
  Ident CondReg;
  llvm::StringRef CondValue; // decimal digits as written
  llvm::SMLoc CondValueLoc;
};

/// `reg[index]` in a PlainCall.
struct PlainOperand {
  Ident Reg;
  uint64_t Index = 0;
};

/// A gate call in the form that makes up nearly every line of a large flat
/// file, `name(0.5, -pi/4) q[0], r[3];`: parameters that are products and
/// quotients of numbers and pi (each perhaps negated), indexed operands,
/// only spaces and tabs between the tokens, no condition. The parser reads these straight from the bytes and offers
/// them to StatementSink::tryPlainCall before building a Statement.
struct PlainCall {
  Ident Gate; // its location is the statement's
  llvm::SmallVector<double, 3> Params;
  llvm::SmallVector<PlainOperand, 3> Args;
};

/// Takes plain calls, each only when it is certain to succeed.
class PlainCallSink {
public:
  virtual ~PlainCallSink();
  /// Applies `Call` and returns true only when it is certain to succeed.
  /// False changes nothing: the parser then reads the same statement the
  /// ordinary way and hands it to onStatement, so every diagnostic comes
  /// from one place.
  virtual bool tryPlainCall(const PlainCall &Call) = 0;

  /// Takes the plain calls that follow one another from `P`, a point
  /// between two statements, each as tryPlainCall would, until one is
  /// refused, anything else comes (a keyword, a comment, the end of the
  /// buffer), a call would start at or past `Limit` (when not null), or
  /// `Cancel` is set. Returns the byte after the last call taken, or null
  /// if none was. This one offers each call to tryPlainCall; a sink that
  /// resolves names as it reads may do the same work in one pass.
  virtual const char *takePlainRun(const char *P,
                                   const std::atomic<bool> &Cancel,
                                   const char *Limit);
};

/// Receives statements in source order; an error stops the parse.
class StatementSink : public PlainCallSink {
public:
  virtual llvm::Error onStatement(const Statement &S) = 0;
  /// Refuses every call unless overridden.
  bool tryPlainCall(const PlainCall &Call) override;
  /// Defines the built-in qelib1.inc's gates at once, exactly as reading
  /// its text (builtinLibraryText(), added with SourceFiles::addStaticBuffer
  /// so that locations agree) would, and returns true; or returns false and
  /// changes nothing, and the parser reads the text.
  virtual bool defineBuiltinLibrary();

  /// For reading the plain calls of a later part of a large file on a
  /// second thread while the parser reads up to it
  /// (ParserOptions::MinBytesForSecondThread): a sink that resolves calls
  /// as this one would now, against copies of its names, so that it reads
  /// nothing this sink writes. Null when unsupported. `Between` is what
  /// the parser reads on this thread before the fork's part, `Text`, for
  /// placing and sizing what the fork writes: this sink's own statements
  /// there may still pass any bound it infers, and are read all the same.
  virtual std::unique_ptr<PlainCallSink> forkPlainCalls(llvm::StringRef Between,
                                                        llvm::StringRef Text);
  /// Adds what `Fork` (made by forkPlainCalls) took, as if each call had
  /// come through tryPlainCall here and now, and returns true; or returns
  /// false and changes nothing, when that would not be the same: a name
  /// was declared since the fork, or a limit would be passed.
  virtual bool joinPlainCalls(PlainCallSink &Fork);
};

} // namespace revbound::qasm

#endif
