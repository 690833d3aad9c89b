//===- GateExpander.cpp - A call as the gate steps an engine simulates ----===//
#include "revbound/semantics/GateExpander.h"

#include "llvm/ADT/SmallVector.h"

namespace revbound::semantics {

GateExpander::GateExpander(const ir::Circuit &C, unsigned MaxMatrixQubits,
                           uint64_t Budget)
    : C(C), Unitaries(C, MaxMatrixQubits), MaxMatrixQubits(MaxMatrixQubits),
      Left(Budget), Sizes(C.Gates.size(), 1), Fixed(C.Gates.size()) {
  // A body calls only gates declared before it, so one forward pass sizes
  // every definition.
  for (ir::GateId G = 0; G < C.Gates.size(); ++G) {
    const ir::GateDef &D = C.gate(G);
    if (!D.hasBody())
      continue;
    uint64_t Total = 0;
    for (const ir::BodyOp &B : D.Body) {
      if (B.IsBarrier)
        continue;
      uint64_t S = Sizes[B.Callee];
      Total = Total > UINT64_MAX - S ? UINT64_MAX : Total + S;
    }
    Sizes[G] = Total;
  }
}

const ir::Matrix *GateExpander::unitary(ir::GateId G,
                                        llvm::ArrayRef<double> Params) {
  if (C.gate(G).numQubits() > MaxMatrixQubits)
    return nullptr;
  return Unitaries.get(G, Params);
}

void GateExpander::visitStep(ir::GateId G, llvm::ArrayRef<double> Params,
                             llvm::ArrayRef<uint32_t> Qubits,
                             const ir::Matrix *U, VisitFn Visit) {
  GateStep S;
  S.Gate = G;
  S.Params = Params;
  S.Qubits = Qubits;
  S.U = U;
  if (U)
    S.Class = ir::classify(*U);
  Visit(S);
}

bool GateExpander::expand(ir::GateId G, llvm::ArrayRef<double> Params,
                          llvm::ArrayRef<uint32_t> Qubits, TakeFn Take,
                          VisitFn Visit) {
  if (Sizes[G] > Left) {
    Left = 0;
    visitStep(G, Params, Qubits, unitary(G, Params), Visit);
    return false;
  }
  Left -= Sizes[G];
  expandBody(G, Params, Qubits, Take, Visit);
  return true;
}

void GateExpander::expandBody(ir::GateId G, llvm::ArrayRef<double> Params,
                              llvm::ArrayRef<uint32_t> Qubits, TakeFn Take,
                              VisitFn Visit) {
  const ir::GateDef &D = C.gate(G);
  if (D.numParams() == 0) {
    std::optional<FixedUnitary> &F = Fixed[G];
    if (!F) {
      F.emplace();
      if (const ir::Matrix *U = unitary(G, {})) {
        F->U = &FixedStore.emplace_back(*U);
        F->Class = ir::classify(*U);
      }
    }
    if (F->U && (!D.hasBody() || Take(F->Class, D.numQubits()))) {
      GateStep S;
      S.Gate = G;
      S.Qubits = Qubits;
      S.U = F->U;
      S.Class = F->Class;
      Visit(S);
      return;
    }
    if (!D.hasBody()) {
      visitStep(G, {}, Qubits, nullptr, Visit);
      return;
    }
  } else {
    // Classified once here: the class decides Take and goes with the step.
    const ir::Matrix *U = unitary(G, Params);
    ir::UnitaryClass Class = U ? ir::classify(*U) : ir::UnitaryClass::General;
    if (!D.hasBody() || (U && Take(Class, D.numQubits()))) {
      GateStep S;
      S.Gate = G;
      S.Params = Params;
      S.Qubits = Qubits;
      S.U = U;
      S.Class = Class;
      Visit(S);
      return;
    }
  }
  llvm::SmallVector<double, 4> Sub;
  llvm::SmallVector<uint32_t, 8> On;
  for (const ir::BodyOp &B : D.Body) {
    if (B.IsBarrier)
      continue;
    Sub.clear();
    for (const ir::ParamExpr &E : B.Params)
      Sub.push_back(E.evaluate(Params));
    On.clear();
    for (uint32_t Local : B.Qubits)
      On.push_back(Qubits[Local]);
    expandBody(B.Callee, Sub, On, Take, Visit);
  }
}

} // namespace revbound::semantics
