//===- GateExpander.h - A call as the gate steps an engine simulates ------===//
//
// Engines simulate gates by their unitaries. A call is taken whole when its
// unitary is known and the engine accepts it (a whole `majority` gate is one
// permutation for the classical engine, which is more precise than its
// pieces); otherwise its body is expanded, down to gates without a body.
// Expansion is bounded: a call whose full expansion would exceed the budget
// is passed whole, with its unitary when known and without one otherwise,
// and the engine must over-approximate it.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SEMANTICS_GATEEXPANDER_H
#define REVBOUND_SEMANTICS_GATEEXPANDER_H

#include "revbound/ir/Circuit.h"
#include "revbound/ir/Unitary.h"

#include "llvm/ADT/ArrayRef.h"
#include "llvm/ADT/STLFunctionalExtras.h"

#include <cstdint>
#include <deque>
#include <optional>
#include <vector>

namespace revbound::semantics {

/// One gate application, on global qubits.
struct GateStep {
  ir::GateId Gate = 0;
  llvm::ArrayRef<double> Params;
  llvm::ArrayRef<uint32_t> Qubits; // argument order: qubit i is bit i of U
  const ir::Matrix *U = nullptr;   // nullptr: unknown (opaque, too wide, ...)
  ir::UnitaryClass Class = ir::UnitaryClass::General; // when U is set
};

class GateExpander {
public:
  /// `Take(Class, Arity)` says whether a gate with a known unitary is taken
  /// whole rather than expanded.
  using TakeFn = llvm::function_ref<bool(ir::UnitaryClass, unsigned)>;
  using VisitFn = llvm::function_ref<void(const GateStep &)>;

  GateExpander(const ir::Circuit &C, unsigned MaxMatrixQubits,
               uint64_t Budget);

  /// Visits the steps of the call of `G` with `Params` on `Qubits`. Returns
  /// false when the budget ran out before this call, which was then visited
  /// whole (U set only if known).
  bool expand(ir::GateId G, llvm::ArrayRef<double> Params,
              llvm::ArrayRef<uint32_t> Qubits, TakeFn Take, VisitFn Visit);

  /// The unitary of a gate, memoised (nullptr when unknown).
  const ir::Matrix *unitary(ir::GateId G, llvm::ArrayRef<double> Params);

  /// Leaf applications of the full expansion of `G` (saturating).
  uint64_t expandedSize(ir::GateId G) const { return Sizes[G]; }
  uint64_t budgetLeft() const { return Left; }

private:
  void expandBody(ir::GateId G, llvm::ArrayRef<double> Params,
                  llvm::ArrayRef<uint32_t> Qubits, TakeFn Take,
                  VisitFn Visit);
  void visitStep(ir::GateId G, llvm::ArrayRef<double> Params,
                 llvm::ArrayRef<uint32_t> Qubits, const ir::Matrix *U,
                 VisitFn Visit);

  const ir::Circuit &C;
  ir::UnitaryCache Unitaries;
  unsigned MaxMatrixQubits;
  uint64_t Left;
  std::vector<uint64_t> Sizes;
  /// Unitaries of parameterless gates, by gate: the common case is looked
  /// up without building a key.
  struct FixedUnitary {
    const ir::Matrix *U = nullptr;
    ir::UnitaryClass Class = ir::UnitaryClass::General;
  };
  std::vector<std::optional<FixedUnitary>> Fixed;
  std::deque<ir::Matrix> FixedStore; // owns what Fixed points to
};

} // namespace revbound::semantics

#endif
