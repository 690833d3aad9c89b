//===- StandardLibrary.h - The built-in qelib1.inc -----------------------===//
#ifndef REVBOUND_QASM_STANDARDLIBRARY_H
#define REVBOUND_QASM_STANDARDLIBRARY_H

#include "llvm/ADT/StringRef.h"

namespace revbound::qasm {

/// The buffer name diagnostics show for the built-in library.
inline constexpr const char *BuiltinLibraryName = "<built-in qelib1.inc>";

/// OpenQASM text of the built-in library: the 23 gates of the standard's
/// qelib1.inc with the same definitions, then the gates that published
/// circuits call beyond it, each written from its textbook definition. Every
/// gate here is weak: a file's own `gate` of the same name replaces it.
llvm::StringRef builtinLibraryText();

} // namespace revbound::qasm

#endif
