//===- Frontend.h - From OpenQASM 2.0 text to the circuit IR -------------===//
//
// Parsing streams statements into the elaborator, which resolves names,
// checks the language's rules (declarations, arities, broadcasting, repeated
// qubits) and builds the ir::Circuit. Every error is a DiagnosticError with a
// location in `Files`, so `Files` must outlive the printing of the error.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_QASM_FRONTEND_H
#define REVBOUND_QASM_FRONTEND_H

#include "revbound/ir/Circuit.h"
#include "revbound/qasm/Parser.h"
#include "revbound/qasm/Roles.h"
#include "revbound/support/Diagnostics.h"
#include "revbound/support/SourceFiles.h"

#include <cstdint>

namespace revbound::qasm {

/// Input limits (docs/limits.md); exceeding one is a diagnostic, not a crash.
struct FrontendLimits {
  uint32_t MaxQubits = 1u << 20;
  uint32_t MaxClbits = 1u << 20;
  /// Levels of gate definitions calling gates. Analyses recurse once per
  /// level, so the driver caps it at MaxNestingCap.
  unsigned MaxNesting = 1000;
  uint64_t MaxOps = 100'000'000;     // top-level operations after broadcasting
  unsigned MaxGateQubits = 256;      // qubit arguments of one gate definition
  /// Wires of all top-level ops together, and their parameter values: the
  /// IR's 32-bit indices bound them (ir::MaxPoolEntries). Not an option;
  /// tests lower it to reach the diagnostic.
  uint64_t MaxPoolEntries = ir::MaxPoolEntries;
};

inline constexpr unsigned MaxNestingCap = 2000;

struct FrontendOptions {
  ParserOptions Parser;
  FrontendLimits Limits;
  std::vector<RoleOption> Roles; // --role, applied over the file's roles
  /// Takes the built-in qelib1.inc's gates from a copy read once per
  /// process instead of reading its text again. Off, it is read every time;
  /// the circuit is the same, which the tests and a fuzz target check.
  bool ReuseBuiltinLibrary = true;
};

/// Parses and elaborates buffer `BufferId` of `Files` into a circuit.
llvm::Expected<ir::Circuit> buildCircuit(SourceFiles &Files, unsigned BufferId,
                                         const FrontendOptions &Opts,
                                         DiagnosticSink &Warnings);

} // namespace revbound::qasm

#endif
