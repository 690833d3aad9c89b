//===- PlainCallScanner.h - Gate calls read straight from the bytes -------===//
//
// Internal to src/qasm. Most lines of a large flat file are one gate call of
// the plainest form; reading them token by token through the general parser
// costs most of the front end's time. scanPlainCall reads exactly the
// PlainCall form (AST.h) by the lexer's own rules (CharClasses.h) and gives
// up on anything else: a comment, a line break, a sum or a power, a
// lexical error. Giving up costs nothing, since the parser then reads the
// statement as usual from where it was. readPlainRun reads a run of such calls
// the same way for a sink that resolves names as it goes, without a PlainCall
// per call.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_QASM_PLAINCALLSCANNER_H
#define REVBOUND_QASM_PLAINCALLSCANNER_H

#include "CharClasses.h"
#include "revbound/qasm/AST.h"

#include <atomic>

namespace revbound::qasm {

/// Skips spaces and tabs, never line breaks (the lexer's list of
/// annotations wants to see each line's start).
inline const char *skipBlanks(const char *P) {
  // Most tokens follow one another with no blank: one comparison says so
  // (every byte above ' ' is not a blank).
  if (static_cast<unsigned char>(*P) > ' ')
    return P;
  while (*P == ' ' || *P == '\t')
    ++P;
  return P;
}

/// A parameter: factors (numbers and `pi`, each perhaps negated) joined by
/// '*' and '/', as in `-pi/4` or `3*pi/8`, evaluated left to right with the
/// same double operations as the elaborator's ParamExpr, so the value is
/// the same to the bit. Returns the byte after it, blanks skipped, or
/// nullptr for anything else: other operators ('+', '^', calls,
/// parentheses), a lexical error, a value that is not finite (all left to
/// the parser and its diagnostics).
const char *scanParam(const char *P, double &Value);

/// `[ index ]` after an operand's name, blanks allowed before and inside,
/// the index a nninteger of at most 19 digits. Returns the byte after the
/// ']' or nullptr.
const char *scanIndex(const char *P, uint64_t &Index);

/// Reads the rest of a plain call whose gate name `Gate` has just been
/// lexed; `After` points right after the name. Returns the byte after the
/// closing ';' with `Out` filled, or nullptr when the statement is not of
/// the plain form. `After` must lie in a NUL-terminated buffer.
const char *scanPlainCall(const Ident &Gate, const char *After,
                          PlainCall &Out);

/// Reads plain calls from `P`, a point between two statements, and hands
/// each to `Sink` until one is refused, anything else comes (a keyword, a
/// comment, the end of the buffer), a call would start at or past `Limit`
/// (when not null), or `Cancel` is set. Returns the byte after the last
/// call taken, or nullptr if none was.
const char *scanPlainRun(const char *P, PlainCallSink &Sink,
                         const std::atomic<bool> &Cancel,
                         const char *Limit = nullptr);

/// A gate as readPlainRun needs it, resolved by the target from its name.
struct PlainGate {
  uint32_t Id = 0;
  unsigned NumParams = 0, NumQubits = 0;
};

/// The most parameters and qubits of a call that readPlainRun keeps on its
/// stack; calls of wider gates go through scanPlainCall and a PlainCall.
constexpr unsigned PlainRunMaxParams = 8, PlainRunMaxQubits = 8;

/// A parameter list, `(p, p, ...)` or `()`, or none, from `P` (blanks
/// skipped first): each value goes to `Take`, which returns false to refuse
/// it. Returns the byte after the list, blanks skipped, or nullptr.
template <typename TakeT>
const char *scanParamList(const char *P, TakeT &&Take) {
  P = skipBlanks(P);
  if (*P != '(')
    return P;
  P = skipBlanks(P + 1);
  if (*P != ')') {
    while (true) {
      double Value = 0;
      if (!(P = scanParam(P, Value)) || !Take(Value))
        return nullptr;
      if (*P != ',')
        break;
      P = skipBlanks(P + 1);
    }
    if (*P != ')')
      return nullptr;
  }
  return skipBlanks(P + 1);
}

/// The arguments of a plain call of `G` after its name (`P` right after
/// it): exactly G.NumParams parameters and G.NumQubits indexed operands,
/// each resolved through `T.qubit`, then the ';'. Returns the byte after
/// the ';' with `Params` and `Wires` filled, or nullptr.
template <typename Target>
const char *scanPlainArgs(const char *P, const PlainGate &G, Target &T,
                          double *Params, uint32_t *Wires) {
  unsigned NumParams = 0;
  P = scanParamList(P, [&](double Value) {
    if (NumParams == G.NumParams)
      return false;
    Params[NumParams++] = Value;
    return true;
  });
  if (!P || NumParams != G.NumParams || G.NumQubits == 0)
    return nullptr;
  for (unsigned A = 0; A < G.NumQubits; ++A) {
    if (A != 0) {
      if (*P != ',')
        return nullptr;
      P = skipBlanks(P + 1);
    }
    if (!chars::isIdentStart(*P))
      return nullptr;
    const char *Name = P;
    P = chars::identifierEnd(Name);
    llvm::StringRef Register(Name, size_t(P - Name));
    uint64_t Index = 0;
    if (!(P = scanIndex(P, Index)) || !T.qubit(Register, Index, Wires[A]))
      return nullptr;
    P = skipBlanks(P);
  }
  return *P == ';' ? P + 1 : nullptr;
}

/// scanPlainRun for a target that resolves names as the bytes are read,
/// with no PlainCall in between (the front end's, where nearly all of a
/// large flat file's time goes). `Target` provides
///   const PlainGate *gate(llvm::StringRef Name);
///       // null for a name that is no gate, or a keyword (U, CX)
///   bool qubit(llvm::StringRef Register, uint64_t Index, uint32_t &Wire);
///       // a qubit of a quantum register, else false
///   bool add(const PlainGate &G, llvm::SMLoc Loc, const double *Params,
///            const uint32_t *Wires); // tryPlainCall's remaining rules
///   bool takeCall(const PlainCall &Call); // tryPlainCall itself
///   bool cancelled(); // asked every 4096 calls
/// and a false from any of the first four ends the run before that call,
/// as a refusal ends scanPlainRun's.
template <typename Target>
const char *readPlainRun(const char *P, Target &T, const char *Limit) {
  PlainCall Wide; // for gates wider than the arrays below
  const char *LastEnd = nullptr;
  for (unsigned N = 1;; ++N) {
    while (chars::isSpace(*P))
      ++P;
    if (!chars::isIdentStart(*P) || (Limit && P >= Limit))
      break;
    const char *Start = P;
    P = chars::identifierEnd(Start);
    llvm::StringRef Name(Start, size_t(P - Start));
    llvm::SMLoc Loc = llvm::SMLoc::getFromPointer(Start);
    const PlainGate *G = T.gate(Name);
    if (!G)
      break;
    const char *After;
    if (G->NumParams <= PlainRunMaxParams &&
        G->NumQubits <= PlainRunMaxQubits) {
      double Params[PlainRunMaxParams];
      uint32_t Wires[PlainRunMaxQubits];
      After = scanPlainArgs(P, *G, T, Params, Wires);
      if (!After || !T.add(*G, Loc, Params, Wires))
        break;
    } else {
      After = scanPlainCall({Name, Loc}, P, Wide);
      if (!After || !T.takeCall(Wide))
        break;
    }
    P = LastEnd = After;
    if (N % 4096 == 0 && T.cancelled())
      break;
  }
  return LastEnd;
}

} // namespace revbound::qasm

#endif
