//===- StructuralEngine.cpp - Erasures by basis-value propagation ---------===//
//
// Every qubit and bit holds 0, 1 or "unknown". Gates that keep basis states
// basis states (monomial unitaries) map known values to known values; any
// other gate makes its qubits unknown. So a reset proves 0 bits only when
// its qubit is known, and everything else is [0, 1] bit: weak, but sound,
// linear in the circuit and fine on any size.
//
//===----------------------------------------------------------------------===//
#include "revbound/semantics/Engines.h"

#include "EngineSupport.h"
#include "revbound/semantics/GateExpander.h"

#include "llvm/ADT/DenseMap.h"
#include "llvm/ADT/SmallVector.h"

#include <fmt/format.h>

namespace revbound::semantics {
namespace {

enum Value : uint8_t { Zero = 0, One = 1, Unknown = 2 };

Value join(Value A, Value B) { return A == B ? A : Unknown; }

/// Column j's nonzero row: where a monomial unitary sends basis state j.
std::vector<uint32_t> basisPermutation(const ir::Matrix &U) {
  std::vector<uint32_t> To(size_t(U.cols()));
  for (Eigen::Index Col = 0; Col < U.cols(); ++Col) {
    Eigen::Index Row = 0;
    U.col(Col).cwiseAbs().maxCoeff(&Row);
    To[size_t(Col)] = uint32_t(Row);
  }
  return To;
}

class StructuralRun {
public:
  StructuralRun(const ir::Circuit &C, const EngineOptions &Opts)
      : C(C), Expander(C, Opts.MaxMatrixQubits, Opts.MaxExpandedOps),
        Qubits(C.NumQubits, Zero), Bits(C.NumClbits, Zero) {
    for (uint32_t Q = 0; Q < C.NumQubits; ++Q)
      if (C.role(Q) == ir::WireRole::Input)
        Qubits[Q] = Unknown;
  }

  Ledger run();

private:
  /// Whether an op's condition holds: One, Zero, or Unknown.
  Value condition(const ir::Op &O) const;
  void applyGate(const ir::Op &O);
  void applyStep(const GateStep &S);
  void reset(const ir::Op &O, Value Cond);
  void measure(const ir::Op &O, Value Cond);
  void finish(Ledger &L);

  const ir::Circuit &C;
  GateExpander Expander;
  std::vector<Value> Qubits, Bits;
  llvm::DenseMap<const ir::Matrix *, std::vector<uint32_t>> Permutations;
  std::vector<ErasureEvent> Events;
  uint64_t Overapproximated = 0;
};

Value StructuralRun::condition(const ir::Op &O) const {
  if (O.Cond == ir::NoCondition)
    return One;
  const ir::Condition &Cond = C.Conditions[O.Cond];
  if (Cond.Unsatisfiable)
    return Zero;
  const ir::Register &R = C.CRegs[Cond.CReg];
  bool AllKnown = true;
  for (uint32_t I = 0; I < R.Size; ++I) {
    Value B = Bits[R.Offset + I];
    if (B == Unknown) {
      AllKnown = false;
      continue;
    }
    if (bool(B) != Cond.Value[I])
      return Zero; // one known bit already differs
  }
  return AllKnown ? One : Unknown;
}

void StructuralRun::applyStep(const GateStep &S) {
  if (S.U && S.Class == ir::UnitaryClass::Diagonal)
    return; // phases only
  if (!S.U || S.Class == ir::UnitaryClass::General) {
    ++Overapproximated;
    for (uint32_t Q : S.Qubits)
      Qubits[Q] = Unknown;
    return;
  }
  const std::vector<uint32_t> *To;
  std::vector<uint32_t> Local;
  if (S.Params.empty()) {
    auto [It, New] = Permutations.try_emplace(S.U);
    if (New)
      It->second = basisPermutation(*S.U);
    To = &It->second;
  } else {
    Local = basisPermutation(*S.U);
    To = &Local;
  }
  // Every input consistent with the known values; an output bit is known
  // when all of them agree on it.
  uint32_t Known = 0, UnknownMask = 0;
  for (unsigned I = 0; I < S.Qubits.size(); ++I) {
    Value V = Qubits[S.Qubits[I]];
    if (V == Unknown)
      UnknownMask |= 1u << I;
    else if (V == One)
      Known |= 1u << I;
  }
  uint32_t Ones = ~0u, Zeros = ~0u; // bits that are 1 (0) in every image
  uint32_t Sub = UnknownMask;
  while (true) {
    uint32_t Image = (*To)[Known | Sub];
    Ones &= Image;
    Zeros &= ~Image;
    if (Sub == 0)
      break;
    Sub = (Sub - 1) & UnknownMask;
  }
  for (unsigned I = 0; I < S.Qubits.size(); ++I)
    Qubits[S.Qubits[I]] = (Ones >> I & 1) ? One : (Zeros >> I & 1) ? Zero
                                                                  : Unknown;
}

void StructuralRun::applyGate(const ir::Op &O) {
  llvm::ArrayRef<uint32_t> W = C.wires(O);
  auto Take = [](ir::UnitaryClass K, unsigned) {
    return K != ir::UnitaryClass::General;
  };
  auto Visit = [&](const GateStep &S) { applyStep(S); };
  Value Cond = condition(O);
  if (Cond == Zero)
    return;
  if (Cond == One) {
    Expander.expand(O.Gate, C.params(O), W, Take, Visit);
    return;
  }
  llvm::SmallVector<Value, 8> Before;
  for (uint32_t Q : W)
    Before.push_back(Qubits[Q]);
  Expander.expand(O.Gate, C.params(O), W, Take, Visit);
  for (unsigned I = 0; I < W.size(); ++I)
    Qubits[W[I]] = join(Qubits[W[I]], Before[I]);
}

void StructuralRun::reset(const ir::Op &O, Value Cond) {
  if (Cond == Zero)
    return;
  uint32_t Q = C.wires(O)[0];
  ErasureEvent E;
  E.Kind = ErasureKind::Reset;
  E.Wire = Q;
  E.Loc = O.Loc;
  if (Qubits[Q] == Unknown) {
    E.Status = ErasureStatus::Unknown;
    E.BitsLow = 0;
    E.BitsHigh = 1;
  } else {
    E.Status = ErasureStatus::Constant;
    E.BitsLow = E.BitsHigh = 0;
  }
  Events.push_back(E);
  Qubits[Q] = Cond == One ? Zero : join(Zero, Qubits[Q]);
}

void StructuralRun::measure(const ir::Op &O, Value Cond) {
  if (Cond == Zero)
    return;
  uint32_t Q = C.wires(O)[0], Bit = C.wires(O)[1];
  if (Bits[Bit] == Unknown) {
    ErasureEvent E;
    E.Kind = ErasureKind::Overwrite;
    E.Wire = Bit;
    E.Loc = O.Loc;
    E.Status = ErasureStatus::Unknown;
    E.BitsLow = 0;
    E.BitsHigh = 1;
    Events.push_back(E);
  }
  Bits[Bit] = Cond == One ? Qubits[Q] : join(Qubits[Q], Bits[Bit]);
}

void StructuralRun::finish(Ledger &L) {
  std::vector<llvm::SMLoc> Last = lastUses(C);
  std::vector<uint32_t> Inputs = inputQubits(C);
  unsigned Open = 0;
  for (uint32_t Q : discardedQubits(C)) {
    Value V = Qubits[Q];
    if (V == Unknown) {
      ++Open;
      L.Events.push_back(
          discardEvent(Q, Last[Q], ErasureStatus::Unknown, 0, 1));
    } else if (V == One) {
      L.Events.push_back(
          discardEvent(Q, Last[Q], ErasureStatus::Constant, 0, 0));
    }
    if (C.role(Q) != ir::WireRole::Ancilla)
      continue;
    AncillaVerdict A;
    A.Qubit = Q;
    if (V != Unknown)
      A.Clean = V == Zero;
    if (V == One) {
      // A constant 1 is 1 under every input; all-zero inputs will do.
      A.HasCounterexample = true;
      for (uint32_t In : Inputs)
        A.Counterexample.emplace_back(In, false);
    }
    L.Ancillas.push_back(std::move(A));
  }
  L.DiscardJoint.Low = 0;
  L.DiscardJoint.High = Open;
  L.DiscardJoint.Exact = Open == 0;
}

Ledger StructuralRun::run() {
  if (!canErase(C)) {
    // No event can occur, so the gate walk could only fill the note about
    // unknown values; skipping it keeps huge unitary files linear in ops
    // and free of matrix work.
    Ledger L;
    L.Engine = EngineKind::Structural;
    L.DiscardJoint.Exact = true;
    return L;
  }
  for (const ir::Op &O : C.Ops) {
    switch (O.Kind) {
    case ir::OpKind::Gate:
      applyGate(O);
      break;
    case ir::OpKind::Reset:
      reset(O, condition(O));
      break;
    case ir::OpKind::Measure:
      measure(O, condition(O));
      break;
    case ir::OpKind::Barrier:
      break;
    }
  }
  Ledger L;
  L.Engine = EngineKind::Structural;
  L.Events = std::move(Events);
  finish(L);
  if (Overapproximated)
    L.Notes.push_back(fmt::format(
        "{} gate applications that can make superpositions left their "
        "qubits unknown",
        Overapproximated));
  return L;
}

} // namespace

Ledger runStructural(const ir::Circuit &C, const EngineOptions &Opts) {
  return StructuralRun(C, Opts).run();
}

} // namespace revbound::semantics
