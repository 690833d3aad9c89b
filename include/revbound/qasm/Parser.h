//===- Parser.h - Recursive-descent parser for OpenQASM 2.0 --------------===//
#ifndef REVBOUND_QASM_PARSER_H
#define REVBOUND_QASM_PARSER_H

#include "revbound/qasm/AST.h"
#include "revbound/support/Diagnostics.h"
#include "revbound/support/SourceFiles.h"

#include <cstdint>
#include <string>
#include <vector>

namespace revbound::qasm {

struct ParserOptions {
  /// A file that replaces the built-in qelib1.inc ("" for the built-in one).
  std::string StandardLibraryPath;
  unsigned MaxIncludeDepth = 16;
  /// Reads plain gate calls (AST.h, PlainCall) straight from the bytes.
  /// Off, every statement goes token by token; the results are the same,
  /// which the tests and a fuzz target check by comparing the two.
  bool ReadPlainCalls = true;
  /// When the main file still holds this many bytes after its first plain
  /// call, a second thread reads the plain calls of its second half while
  /// the parser reads up to there (StatementSink::forkPlainCalls); the
  /// result is the same as reading on one thread, and is discarded for it
  /// whenever it might not be. 0 splits every file; UINT64_MAX none.
  uint64_t MinBytesForSecondThread = uint64_t(1) << 20;
};

/// Parses buffer `BufferId` of `Files` and streams its statements, and those
/// of the files it includes, to `Sink`. Returns the first error, which is a
/// DiagnosticError; warnings go to `Warnings`. With `Annotations`, the
/// `//!` comments of every file read are appended to it.
llvm::Error parseProgram(SourceFiles &Files, unsigned BufferId,
                         const ParserOptions &Opts, StatementSink &Sink,
                         DiagnosticSink &Warnings,
                         std::vector<llvm::StringRef> *Annotations = nullptr);

} // namespace revbound::qasm

#endif
