//===- PlainCallScanner.h - Gate calls read straight from the bytes -------===//
//
// Internal to src/qasm. Most lines of a large flat file are one gate call of
// the plainest form; reading them token by token through the general parser
// costs most of the front end's time. scanPlainCall reads exactly the
// PlainCall form (AST.h) by the lexer's own rules (CharClasses.h) and gives
// up on anything else: a comment, a line break, a sum or a power, a
// lexical error. Giving up costs nothing, since the parser then reads the statement
// as usual from where it was.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_QASM_PLAINCALLSCANNER_H
#define REVBOUND_QASM_PLAINCALLSCANNER_H

#include "revbound/qasm/AST.h"

#include <atomic>

namespace revbound::qasm {

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

} // namespace revbound::qasm

#endif
