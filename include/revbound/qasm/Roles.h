//===- Roles.h - Roles of wires from annotations and the command line ----===//
//
// A role says what a qubit holds at the start and what happens to it at the
// end (DESIGN.md, "Roles of wires"). Files give roles in comments, so that
// they stay valid OpenQASM 2.0 (docs/formats.md):
//
//   //! input a, b
//   //! ancilla anc, work[3]
//
// and the command line gives `--role NAME=ROLE`, which wins over the file.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_QASM_ROLES_H
#define REVBOUND_QASM_ROLES_H

#include "revbound/ir/Circuit.h"

#include "llvm/ADT/ArrayRef.h"
#include "llvm/ADT/StringRef.h"
#include "llvm/Support/Error.h"

#include <string>

namespace revbound::qasm {

/// `--role NAME=ROLE`: a register or one qubit of it ("anc", "anc[2]").
struct RoleOption {
  std::string Target;
  ir::WireRole Role = ir::WireRole::Output;
};

/// Parses "NAME=ROLE"; the error says what was expected.
llvm::Expected<RoleOption> parseRoleOption(llvm::StringRef Text);

/// Sets C.QubitRoles and C.QubitRoleLocs from the `//!` comments the lexer
/// collected (each from `//` to the end of its line) and then from the
/// command line. Unknown roles, names that are not quantum registers,
/// indices out of range and two different roles for one qubit from the
/// same source are errors: DiagnosticErrors located in the comment for the
/// file, plain errors for the command line.
llvm::Error assignRoles(ir::Circuit &C,
                        llvm::ArrayRef<llvm::StringRef> Annotations,
                        llvm::ArrayRef<RoleOption> Options);

} // namespace revbound::qasm

#endif
