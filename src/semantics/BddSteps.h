//===- BddSteps.h - Monomial gate steps on wires held as BDDs -------------===//
//
// Internal to the engines that track wires as Boolean functions of the
// inputs. A step's basis action (ClassicalSteps.h) becomes BDD operations on
// the functions of its qubits; under a condition `Guard` each wire becomes
// ite(Guard, new, old).
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SEMANTICS_BDDSTEPS_H
#define REVBOUND_SEMANTICS_BDDSTEPS_H

#include "ClassicalSteps.h"

#include "llvm/ADT/SmallVector.h"

#include <bdd.h>

#include <vector>

namespace revbound::semantics::classical {

/// Wire = Guard ? New : Wire (New when there is no guard).
inline void assignGuarded(bdd &Wire, const bdd &New, const bdd *Guard) {
  Wire = Guard ? bdd_ite(*Guard, New, Wire) : New;
}

/// A multi-controlled X: the target flips where the controls match.
inline void applyFlip(std::vector<bdd> &Wires, const GateStep &S,
                      const BasisAction &A, const bdd *Guard) {
  bdd Ctrl = Guard ? *Guard : bddtrue;
  for (unsigned I = 0; I < A.Arity; ++I)
    if (A.ControlMask >> I & 1) {
      const bdd &W = Wires[S.Qubits[I]];
      Ctrl &= (A.ControlValue >> I & 1) ? W : !W;
    }
  // The condition folds into the control: ite(g, t ^ c, t) = t ^ (g & c).
  Wires[S.Qubits[A.Target]] ^= Ctrl;
}

/// A permutation of the wires themselves: argument i moves to Dest[i].
inline void applyRelabel(std::vector<bdd> &Wires, const GateStep &S,
                         const BasisAction &A, const bdd *Guard) {
  llvm::SmallVector<bdd, 4> Old;
  for (uint32_t Qb : S.Qubits)
    Old.push_back(Wires[Qb]);
  for (unsigned I = 0; I < A.Arity; ++I) {
    const bdd &Moved = Old[I];
    Wires[S.Qubits[A.Dest[I]]] =
        Guard ? bdd_ite(*Guard, Moved, Old[A.Dest[I]]) : Moved;
  }
}

/// Output bit `Out` of the permutation table over the index range
/// [Base, Base + 2^Level), as a function of the first Level arguments.
inline bdd tableOutput(const BasisAction &A, unsigned Out, uint32_t Base,
                       unsigned Level, llvm::ArrayRef<bdd> In) {
  uint32_t Size = uint32_t(1) << Level;
  bool First = A.Perm[Base] >> Out & 1, Same = true;
  for (uint32_t J = Base + 1; J < Base + Size && Same; ++J)
    Same = bool(A.Perm[J] >> Out & 1) == First;
  if (Same)
    return First ? bddtrue : bddfalse;
  bdd Lo = tableOutput(A, Out, Base, Level - 1, In);
  bdd Hi = tableOutput(A, Out, Base + Size / 2, Level - 1, In);
  return bdd_ite(In[Level - 1], Hi, Lo);
}

/// Any other permutation of basis states, output bit by output bit.
inline void applyTable(std::vector<bdd> &Wires, const GateStep &S,
                       const BasisAction &A, const bdd *Guard) {
  llvm::SmallVector<bdd, 4> Old, New;
  for (uint32_t Qb : S.Qubits)
    Old.push_back(Wires[Qb]);
  New = Old;
  for (unsigned I = 0; I < A.Arity; ++I)
    if (A.Written >> I & 1)
      New[I] = tableOutput(A, I, 0, A.Arity, Old);
  for (unsigned I = 0; I < A.Arity; ++I)
    if (A.Written >> I & 1)
      assignGuarded(Wires[S.Qubits[I]], New[I], Guard);
}

} // namespace revbound::semantics::classical

#endif
