//===- Circuit.h - The hierarchical circuit IR ---------------------------===//
//
// A Circuit keeps every gate definition as a definition (a body over local
// qubits with parameter expressions) and the top level as a flat list of
// operations on global qubits and bits. Nothing is expanded here: analyses
// expand through memoised per-definition summaries when they need to.
//
// Storage is compact because flat files hold millions of operations: an Op
// is 32 bytes and indexes shared pools of wires, parameter values and
// conditions.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_IR_CIRCUIT_H
#define REVBOUND_IR_CIRCUIT_H

#include "revbound/ir/ParamExpr.h"

#include "llvm/ADT/APInt.h"
#include "llvm/ADT/ArrayRef.h"
#include "llvm/ADT/SmallVector.h"
#include "llvm/ADT/StringMap.h"
#include "llvm/Support/SMLoc.h"

#include <cstdint>
#include <memory>
#include <optional>
#include <string>
#include <type_traits>
#include <utility>
#include <vector>

namespace revbound::ir {

using GateId = uint32_t;

/// Where a gate comes from; it decides what counts as a leaf (DESIGN.md,
/// "Levels of a circuit").
enum class GateOrigin : uint8_t {
  Builtin,         // U and CX
  StandardLibrary, // declared by the qelib1.inc in use
  User,            // a `gate` in the user's files
  Opaque,          // an `opaque` declaration
};

/// One statement of a gate body: a call of an earlier gate on local qubits,
/// or a barrier over local qubits.
struct BodyOp {
  bool IsBarrier = false;
  GateId Callee = 0;
  llvm::SmallVector<uint32_t, 3> Qubits; // indices of the gate's qubit args
  llvm::SmallVector<ParamExpr, 1> Params;
  llvm::SMLoc Loc;
};

struct GateDef {
  std::string Name;
  GateOrigin Origin = GateOrigin::User;
  std::vector<std::string> ParamNames;
  std::vector<std::string> QubitNames;
  std::vector<BodyOp> Body;
  llvm::SMLoc Loc;
  /// 0 for gates without a body; otherwise 1 + the deepest callee's level.
  unsigned NestingLevel = 0;

  unsigned numParams() const { return unsigned(ParamNames.size()); }
  unsigned numQubits() const { return unsigned(QubitNames.size()); }
  bool hasBody() const {
    return Origin != GateOrigin::Builtin && Origin != GateOrigin::Opaque;
  }
};

/// A declared register; its wires are Offset .. Offset + Size - 1 in the
/// qubit or the bit numbering.
struct Register {
  std::string Name;
  uint32_t Offset = 0;
  uint32_t Size = 0;
  llvm::SMLoc Loc;
};

enum class OpKind : uint8_t { Gate, Measure, Reset, Barrier };

/// `if (creg == value)`: the op runs when the register reads `Value`, its
/// first bit the least significant (OpenQASM 2.0 specification).
struct Condition {
  uint32_t CReg = 0;  // index into Circuit::CRegs
  llvm::APInt Value;  // as wide as the register
  bool Unsatisfiable = false; // the value needs more bits than the register
};

inline constexpr uint32_t NoCondition = UINT32_MAX;

/// Ops and the pools' entries are indexed in 32 bits, and UINT32_MAX is
/// kept free as a "none" mark (NoCondition, the schedule's no-op), so a
/// circuit holds at most this many ops, wires of ops, parameter values and
/// conditions.
inline constexpr uint64_t MaxPoolEntries = UINT32_MAX - 1;

/// What a qubit holds at the start and what happens to it at the end
/// (DESIGN.md, "Roles of wires").
enum class WireRole : uint8_t {
  Output,  // starts |0>, kept (the default)
  Input,   // starts uniformly random over basis states, kept
  Ancilla, // starts |0>, must end |0>; discarded
  Garbage, // starts |0>, discarded
};

/// "output", "input", "ancilla" or "garbage".
const char *wireRoleName(WireRole R);
/// The role spelled `Name`, if it is one.
std::optional<WireRole> parseWireRole(llvm::StringRef Name);
/// True for the roles whose wires are discarded at the end.
inline bool isDiscarded(WireRole R) {
  return R == WireRole::Ancilla || R == WireRole::Garbage;
}

/// One top-level operation after broadcasting.
///  - Gate:    Wires are the qubits, in argument order.
///  - Measure: Wires[0] is the qubit, Wires[1] the bit.
///  - Reset:   Wires[0] is the qubit.
///  - Barrier: Wires are the qubits named.
struct Op {
  OpKind Kind = OpKind::Gate;
  uint32_t NumWires = 0;
  GateId Gate = 0;              // Kind::Gate
  uint32_t FirstWire = 0;       // into Circuit::Wires
  uint32_t FirstParam = 0;      // into Circuit::Params (the gate's numParams)
  uint32_t Cond = NoCondition;  // into Circuit::Conditions
  llvm::SMLoc Loc;
};

/// The pools' allocator. It leaves a new element unwritten where
/// std::allocator would zero it, so that a pool can be sized first and
/// filled after, from two threads at once (the front end joining the two
/// halves of a large file): zeroing first would fault in every page of the
/// new part on one thread. Only for element types that need no
/// construction: ops, integers, doubles.
template <typename T> struct PoolAllocator : std::allocator<T> {
  using value_type = T;
  PoolAllocator() = default;
  template <typename U> PoolAllocator(const PoolAllocator<U> &) noexcept {}

  template <typename U> void construct(U *) noexcept {
    static_assert(std::is_trivially_copyable_v<U> &&
                  std::is_trivially_destructible_v<U>);
  }
  template <typename U, typename... Args>
  void construct(U *P, Args &&...A) {
    ::new (static_cast<void *>(P)) U(std::forward<Args>(A)...);
  }
};

/// A pool of a circuit: resize() leaves new entries for the caller to write.
template <typename T> using Pool = std::vector<T, PoolAllocator<T>>;

/// A map key for a call of gate `G` with parameter values `Params`: their
/// bytes, so that equal calls (to the bit) share one memo entry.
std::string callKey(GateId G, llvm::ArrayRef<double> Params);

class Circuit {
public:
  Circuit();

  std::vector<GateDef> Gates;          // U, CX first, then in declaration order
  llvm::StringMap<GateId> GateByName;  // the definition each name means now
  std::vector<Register> QRegs, CRegs;
  uint32_t NumQubits = 0;
  uint32_t NumClbits = 0;

  // The pools a large file fills.
  Pool<Op> Ops;
  Pool<uint32_t> Wires;
  Pool<double> Params;
  std::vector<Condition> Conditions;

  /// One role per qubit (empty means every qubit is an output), and where
  /// each was declared (an invalid location for the default and for roles
  /// given on the command line).
  std::vector<WireRole> QubitRoles;
  std::vector<llvm::SMLoc> QubitRoleLocs;

  static constexpr GateId UGate = 0;
  static constexpr GateId CXGate = 1;

  const GateDef &gate(GateId Id) const { return Gates[Id]; }
  llvm::ArrayRef<uint32_t> wires(const Op &O) const {
    return {Wires.data() + O.FirstWire, O.NumWires};
  }
  llvm::ArrayRef<double> params(const Op &O) const {
    if (O.Kind != OpKind::Gate)
      return {};
    return {Params.data() + O.FirstParam, Gates[O.Gate].numParams()};
  }
  WireRole role(uint32_t Q) const {
    return Q < QubitRoles.size() ? QubitRoles[Q] : WireRole::Output;
  }
  llvm::SMLoc roleLoc(uint32_t Q) const {
    return Q < QubitRoleLocs.size() ? QubitRoleLocs[Q] : llvm::SMLoc();
  }
  /// Name of qubit `Q` as "reg[i]".
  std::string qubitName(uint32_t Q) const;
  /// Name of bit `C` as "reg[i]".
  std::string clbitName(uint32_t C) const;
  /// For each register holding an input qubit, its name and the bits of
  /// `ValueByQubit` over it, highest index first (a binary numeral): how
  /// a basis input is shown.
  std::vector<std::pair<std::string, std::string>>
  inputRegisterBits(const std::vector<bool> &ValueByQubit) const;
};

} // namespace revbound::ir

#endif
