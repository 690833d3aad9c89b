//===- ClassicalSteps.h - Gate steps as actions on basis values -----------===//
//
// Internal to the classical engine. Both of its simulations (Boolean
// functions as BDDs, and bit-parallel words of random inputs) see a gate
// step the same way: a monomial unitary moves basis state j to basis state
// Perm[j] and changes nothing else that a classical value can see (phases);
// any other step may change some of its qubits to values no basis function
// describes, which they over-approximate with fresh random variables.
// This header decodes steps into those actions once per gate and walks a
// circuit's operations for either simulation.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SEMANTICS_CLASSICALSTEPS_H
#define REVBOUND_SEMANTICS_CLASSICALSTEPS_H

#include "revbound/ir/Circuit.h"
#include "revbound/ir/Unitary.h"
#include "revbound/semantics/Engines.h"
#include "revbound/semantics/GateExpander.h"

#include "llvm/ADT/SmallVector.h"

#include <array>
#include <cmath>
#include <cstdint>
#include <optional>
#include <vector>

namespace revbound::semantics::classical {

/// What one gate step does to the basis values of its qubits (argument i is
/// bit i of a basis index, as in ir/Unitary.h).
struct BasisAction {
  enum class Kind {
    Identity, // phases only
    Flip,     // Target flips when (index & ControlMask) == ControlValue
    Relabel,  // the value of argument i moves to argument Dest[i]
    Table,    // basis index j goes to Perm[j]
    Fresh,    // the arguments in Changed get values no basis function gives
  };
  Kind K = Kind::Identity;
  unsigned Arity = 0;
  unsigned Target = 0;
  uint32_t ControlMask = 0, ControlValue = 0;
  llvm::SmallVector<uint8_t, 4> Dest;
  std::vector<uint32_t> Perm;
  llvm::SmallVector<uint32_t, 4> Changed;
  /// Table: bit i set when output argument i can differ from its input.
  uint32_t Written = 0;
};

/// Decodes steps into basis actions, memoised per parameterless gate.
class StepDecoder {
public:
  const BasisAction &decode(const GateStep &S) {
    if (!S.Params.empty()) {
      Scratch = build(S);
      return Scratch;
    }
    if (S.Gate >= ByGate.size())
      ByGate.resize(S.Gate + 1);
    std::optional<BasisAction> &Slot = ByGate[S.Gate][S.U ? 1 : 0];
    if (!Slot)
      Slot = build(S);
    return *Slot;
  }

private:
  static constexpr double Tolerance = 1e-9;

  static BasisAction allChanged(unsigned Arity) {
    BasisAction A;
    A.K = BasisAction::Kind::Fresh;
    A.Arity = Arity;
    for (unsigned I = 0; I < Arity; ++I)
      A.Changed.push_back(I);
    return A;
  }

  static BasisAction build(const GateStep &S) {
    unsigned Arity = unsigned(S.Qubits.size());
    if (!S.U || Arity > 20 || S.U->rows() != (int64_t(1) << Arity))
      return allChanged(Arity);
    switch (S.Class) {
    case ir::UnitaryClass::Diagonal: {
      BasisAction A;
      A.Arity = Arity;
      return A;
    }
    case ir::UnitaryClass::General:
      return superposing(*S.U, Arity);
    case ir::UnitaryClass::Permutation:
    case ir::UnitaryClass::Monomial:
      break;
    }
    std::optional<std::vector<uint32_t>> Perm = permutationOf(*S.U);
    if (!Perm)
      return allChanged(Arity);
    return classify(std::move(*Perm), Arity);
  }

  /// A general step leaves argument i alone when U never connects basis
  /// states that differ in bit i (a control of a controlled rotation): each
  /// branch of the superposition keeps the value it had.
  static BasisAction superposing(const ir::Matrix &U, unsigned Arity) {
    BasisAction A;
    A.K = BasisAction::Kind::Fresh;
    A.Arity = Arity;
    for (unsigned I = 0; I < Arity; ++I) {
      bool Keeps = true;
      for (int64_t J = 0; J < U.cols() && Keeps; ++J)
        for (int64_t R = 0; R < U.rows() && Keeps; ++R)
          if (std::abs(U(R, J)) > Tolerance && ((R ^ J) >> I & 1))
            Keeps = false;
      if (!Keeps)
        A.Changed.push_back(I);
    }
    return A;
  }

  /// The permutation of a monomial matrix, or nothing when U is not one.
  static std::optional<std::vector<uint32_t>>
  permutationOf(const ir::Matrix &U) {
    int64_t N = U.rows();
    std::vector<uint32_t> Perm(static_cast<size_t>(N));
    std::vector<bool> Hit(static_cast<size_t>(N), false);
    for (int64_t J = 0; J < N; ++J) {
      int64_t Best = 0;
      for (int64_t R = 1; R < N; ++R)
        if (std::abs(U(R, J)) > std::abs(U(Best, J)))
          Best = R;
      if (Hit[size_t(Best)] || std::abs(U(Best, J)) < 0.5)
        return std::nullopt;
      Hit[size_t(Best)] = true;
      Perm[size_t(J)] = uint32_t(Best);
    }
    return Perm;
  }

  static BasisAction classify(std::vector<uint32_t> Perm, unsigned Arity) {
    BasisAction A;
    A.Arity = Arity;
    uint32_t N = uint32_t(Perm.size());
    bool Identity = true;
    for (uint32_t J = 0; J < N; ++J)
      Identity &= Perm[J] == J;
    if (Identity)
      return A;
    if (flipOf(Perm, Arity, A) || relabelOf(Perm, Arity, A))
      return A;
    A.K = BasisAction::Kind::Table;
    for (uint32_t J = 0; J < N; ++J)
      A.Written |= Perm[J] ^ J;
    A.Perm = std::move(Perm);
    return A;
  }

  /// Multi-controlled X with any control polarities (x, cx, ccx, ...).
  static bool flipOf(const std::vector<uint32_t> &Perm, unsigned Arity,
                     BasisAction &A) {
    uint32_t N = uint32_t(Perm.size());
    for (unsigned T = 0; T < Arity; ++T) {
      uint32_t Bit = 1u << T, Count = 0, Agree = ~Bit, First = 0;
      bool Ok = true;
      for (uint32_t J = 0; J < N && Ok; ++J) {
        if (Perm[J] == J)
          continue;
        Ok = Perm[J] == (J ^ Bit);
        if (Count++ == 0)
          First = J;
        Agree &= ~(J ^ First);
      }
      Agree &= (N - 1);
      if (!Ok || Count == 0 ||
          Count != (N >> unsigned(__builtin_popcount(Agree))))
        continue;
      A.K = BasisAction::Kind::Flip;
      A.Target = T;
      A.ControlMask = Agree;
      A.ControlValue = First & Agree;
      return true;
    }
    return false;
  }

  /// A permutation of the wires themselves (swap and its relatives).
  static bool relabelOf(const std::vector<uint32_t> &Perm, unsigned Arity,
                        BasisAction &A) {
    if (Perm[0] != 0)
      return false;
    llvm::SmallVector<uint8_t, 4> Dest;
    for (unsigned I = 0; I < Arity; ++I) {
      uint32_t Image = Perm[size_t(1) << I];
      if (__builtin_popcount(Image) != 1)
        return false;
      Dest.push_back(uint8_t(__builtin_ctz(Image)));
    }
    for (uint32_t J = 0; J < Perm.size(); ++J) {
      uint32_t Image = 0;
      for (unsigned I = 0; I < Arity; ++I)
        if (J >> I & 1)
          Image |= 1u << Dest[I];
      if (Image != Perm[J])
        return false;
    }
    A.K = BasisAction::Kind::Relabel;
    A.Dest = std::move(Dest);
    return true;
  }

  std::vector<std::array<std::optional<BasisAction>, 2>> ByGate;
  BasisAction Scratch;
};

/// Where a walk stopped, and whether the expansion budget ran out.
struct WalkOutcome {
  bool Finished = true;
  size_t StoppedAt = 0; // index into C.Ops when !Finished
  bool BudgetRanOut = false;
  size_t BudgetRanOutAt = 0;
};

/// Walks the operations of `C` in program order for a simulation `D`, which
/// offers setCondition(const ir::Condition *), step(GateStep, BasisAction),
/// reset(Qubit, Op), measure(Qubit, Bit, Op) and stopped(). A condition that
/// can never hold reaches the simulation too, which then does nothing and
/// lists no event; barriers do nothing.
template <class Simulation>
WalkOutcome walkCircuit(const ir::Circuit &C, const EngineOptions &Opts,
                        Simulation &D) {
  WalkOutcome Out;
  GateExpander Expander(C, Opts.MaxMatrixQubits, Opts.MaxExpandedOps);
  StepDecoder Decoder;
  auto Take = [](ir::UnitaryClass K, unsigned) {
    return K != ir::UnitaryClass::General;
  };
  auto Visit = [&](const GateStep &S) {
    if (!D.stopped())
      D.step(S, Decoder.decode(S));
  };
  for (size_t I = 0; I < C.Ops.size(); ++I) {
    const ir::Op &O = C.Ops[I];
    if (O.Kind == ir::OpKind::Barrier)
      continue;
    const ir::Condition *Cond =
        O.Cond == ir::NoCondition ? nullptr : &C.Conditions[O.Cond];
    D.setCondition(Cond);
    llvm::ArrayRef<uint32_t> W = C.wires(O);
    switch (O.Kind) {
    case ir::OpKind::Gate:
      if (!Expander.expand(O.Gate, C.params(O), W, Take, Visit) &&
          !Out.BudgetRanOut) {
        Out.BudgetRanOut = true;
        Out.BudgetRanOutAt = I;
      }
      break;
    case ir::OpKind::Reset:
      D.reset(W[0], O);
      break;
    case ir::OpKind::Measure:
      D.measure(W[0], W[1], O);
      break;
    case ir::OpKind::Barrier:
      break;
    }
    if (D.stopped()) {
      Out.Finished = false;
      Out.StoppedAt = I;
      return Out;
    }
  }
  return Out;
}

/// splitmix64 (Steele, Lea & Flood, OOPSLA 2014): a small, well-mixed
/// deterministic stream for the random inputs.
class SplitMix64 {
public:
  explicit SplitMix64(uint64_t Seed) : State(Seed) {}
  uint64_t next() {
    uint64_t Z = (State += 0x9e3779b97f4a7c15ULL);
    Z = (Z ^ (Z >> 30)) * 0xbf58476d1ce4e5b9ULL;
    Z = (Z ^ (Z >> 27)) * 0x94d049bb133111ebULL;
    return Z ^ (Z >> 31);
  }

private:
  uint64_t State;
};

/// The order of the input variables: inputs in the order operations first
/// touch them, then the untouched ones. Neighbours in the data flow are
/// neighbours in the order, which keeps BDDs of arithmetic small (a
/// first-touch ordering, common practice for circuit BDDs); it is
/// `Order[v]` = the input index (in qubit order) of variable v.
inline std::vector<uint32_t> inputOrder(const ir::Circuit &C,
                                        const std::vector<uint32_t> &Inputs) {
  std::vector<int64_t> IndexOf(C.NumQubits, -1);
  for (size_t I = 0; I < Inputs.size(); ++I)
    IndexOf[Inputs[I]] = int64_t(I);
  std::vector<bool> Placed(Inputs.size(), false);
  std::vector<uint32_t> Order;
  Order.reserve(Inputs.size());
  for (const ir::Op &O : C.Ops) {
    if (Order.size() == Inputs.size())
      break;
    if (O.Kind == ir::OpKind::Barrier)
      continue;
    llvm::ArrayRef<uint32_t> W = C.wires(O);
    if (O.Kind == ir::OpKind::Measure)
      W = W.take_front(1);
    for (uint32_t Q : W) {
      int64_t In = Q < IndexOf.size() ? IndexOf[Q] : -1;
      if (In >= 0 && !Placed[size_t(In)]) {
        Placed[size_t(In)] = true;
        Order.push_back(uint32_t(In));
      }
    }
  }
  for (size_t I = 0; I < Inputs.size(); ++I)
    if (!Placed[I])
      Order.push_back(uint32_t(I));
  return Order;
}

} // namespace revbound::semantics::classical

#endif
