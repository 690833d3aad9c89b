//===- GateTable.h - The gate library as plain rows (`revbound gates`) ----===//
//
// One row per gate definition: where it comes from, its arity, its class on
// basis states (ir/Unitary.h), its gate angle L(U) (physics/GateAngle.h) and
// the energy-free Margolus-Levitin action of one application
// (physics/SpeedLimit.h), and its full expansion to U and CX. Like a Report,
// a table is plain data: the writers below only format it.
//
// A parametrised gate has one unitary per set of values. With values (from
// `--params`) it is evaluated there. Without, the angle depends on the
// values and is left null, while the class is the one that holds for
// generic values: it is read off the unitary at GenericSamples sets of
// values that no identity of the library singles out.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_REPORT_GATETABLE_H
#define REVBOUND_REPORT_GATETABLE_H

#include "revbound/ir/Circuit.h"
#include "revbound/ir/Unitary.h"
#include "revbound/support/SourceFiles.h"

#include "llvm/Support/Error.h"

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace revbound::report {

inline constexpr const char *GateTableSchemaVersion = "revbound/gates-1";

/// Unitaries are built for gates on at most this many qubits (a 2^10 x 2^10
/// complex matrix is 16 MiB); larger gates get no class and no angle.
inline constexpr unsigned MaxTableQubits = 10;

/// Sets of generic values a parametrised gate is classified at. Parameter i
/// of sample s is 0.3 + 0.4 s + 0.17 i radians: no multiple of pi/8, and
/// distinct across parameters so that differences of parameters do not
/// vanish.
inline constexpr unsigned GenericSamples = 3;
double genericSampleValue(unsigned Sample, unsigned Param);

/// Values given for the gates named `Gate` (from `--params NAME=v1,v2,...`);
/// `Loc` and `Length` cover the name, for diagnostics.
struct ParamAssignment {
  std::string Gate;
  std::vector<double> Values;
  llvm::SMLoc Loc;
  unsigned Length = 0;
};

/// Parses `NAME=v1,v2,...` into an assignment. Each value is an OpenQASM 2.0
/// constant expression (`pi/4`, `-0.5`, `sqrt(2)/2`), read by the language's
/// own parser so that it means what it would mean in a file.
/// The text is added to `Files` as a buffer named "--params" so that a
/// DiagnosticError for a malformed or non-finite value points into it.
llvm::Expected<ParamAssignment> parseParamAssignment(SourceFiles &Files,
                                                     llvm::StringRef Text);

/// How a row's class and angle were obtained.
enum class Evaluation {
  Fixed,   // the gate has no parameters
  Values,  // at the values given for it
  Generic, // class at generic values; the angle depends on the values
  None,    // no unitary: see GateRow::Note
};

/// "fixed", "values", "generic" or "none".
const char *evaluationName(Evaluation E);

struct GateRow {
  std::string Name;
  ir::GateOrigin Origin = ir::GateOrigin::User;
  /// A library gate that the file's own definition of the same name replaces.
  bool Replaced = false;
  std::string File; // where it is defined ("" for U and CX)
  unsigned Line = 0, Column = 0;
  unsigned Qubits = 0;
  std::vector<std::string> Params;
  std::vector<double> Values; // empty unless Evaluation::Values
  Evaluation Eval = Evaluation::None;
  std::optional<ir::UnitaryClass> Class;
  std::optional<double> AngleRad; // L(U) in [0, pi/2]
  std::optional<bool> Orthogonal; // L(U) = pi/2
  std::optional<double> ActionJs; // pi hbar alpha(cos^2 L) / 2, in J s
  std::string Note; // why class or angle is null ("" when both are known)
  uint64_t PrimitiveU = 0, PrimitiveCX = 0, PrimitiveOpaque = 0;
};

struct GateTable {
  std::string File;    // the file whose gates are listed ("" for none)
  std::string Library; // the qelib1.inc in use: built-in name or path
  /// Whether the file includes qelib1.inc; the library rows are listed
  /// either way. Always true without a file.
  bool LibraryIncluded = true;
  std::vector<GateRow> Rows; // builtins, then library, then the file's own
};

/// Rows for every gate of `C` (replaced library gates included), grouped
/// builtins, library, then user and opaque gates in declaration order.
/// `Assignments` give values to every row of that name with as many
/// parameters; an assignment that fits no row is a DiagnosticError at its
/// name, and so is a U/CX count past 2^64 - 1.
llvm::Expected<std::vector<GateRow>>
tabulateGates(const ir::Circuit &C, const SourceFiles &Files,
              llvm::ArrayRef<ParamAssignment> Assignments);

/// The table `revbound gates` prints: the rows of `Library` (a program that
/// only includes qelib1.inc) when `File` is null; otherwise those of `File`,
/// with the library rows taken from `Library` when the file does not include
/// qelib1.inc itself.
llvm::Expected<GateTable>
buildGateTable(const ir::Circuit &Library, const ir::Circuit *File,
               const SourceFiles &Files, llvm::StringRef FileName,
               llvm::StringRef LibraryName,
               llvm::ArrayRef<ParamAssignment> Assignments);

/// The table for people: one line per gate, then notes on the null entries.
std::string writeGateTableText(const GateTable &T);

/// One JSON object `{"schema": "revbound/gates-1", ...}` as documented in
/// docs/json.md ("revbound gates"); deterministic, ends with a newline.
std::string writeGateTableJson(const GateTable &T);

} // namespace revbound::report

#endif
