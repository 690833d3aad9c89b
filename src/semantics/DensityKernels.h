//===- DensityKernels.h - In-place updates of one density matrix ----------===//
//
// Internal to the density engine. A density matrix on N qubits is a
// column-major 2^N x 2^N array, entry (r, c) at r + c * 2^N, qubit q being
// bit q of both r and c (the basis order of ir/Unitary.h). rho -> U rho U^+
// is U on the row index and conj(U) on the column index; every kernel here
// works in place with buffers of the gate's size only, never of the
// matrix's. Each class of gate gets the cheapest pass: a diagonal gate only
// rephases (a one-qubit one leaves the half of the entries where the qubit's
// row and column bits agree alone), a permutation only moves entries, and a
// general one-qubit gate does both updates in one pass over blocks of four.
// Defined in DensityEngine.cpp, their one user; the tests check them
// against full matrix products.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SEMANTICS_DENSITYKERNELS_H
#define REVBOUND_SEMANTICS_DENSITYKERNELS_H

#include "revbound/ir/Unitary.h"

#include "llvm/ADT/ArrayRef.h"
#include "llvm/ADT/SmallVector.h"

#include <complex>
#include <cstdint>
#include <utility>
#include <vector>

namespace revbound::semantics::density {

using Complex = std::complex<double>;

/// a * b without std::complex's NaN recovery path, which keeps the loops
/// from being vectorised; every entry here is finite.
inline Complex mul(Complex A, Complex B) {
  return {A.real() * B.real() - A.imag() * B.imag(),
          A.real() * B.imag() + A.imag() * B.real()};
}
/// A real factor costs a third of a complex one.
inline Complex mul(double A, Complex B) { return {A * B.real(), A * B.imag()}; }

/// Calls F(I) for every I below End (a power of two above Mask) whose bits
/// in Mask are clear, in increasing order.
template <typename Fn>
inline void forEachClear(uint64_t Mask, uint64_t End, Fn F) {
  for (uint64_t I = 0; I < End; I = ((I | Mask) + 1) & ~Mask)
    F(I);
}

/// Calls F(I, Run) for each run of Run consecutive indices below End whose
/// bits in Mask (nonzero) are clear; Run is Mask's lowest bit.
template <typename Fn>
inline void forEachClearRun(uint64_t Mask, uint64_t End, Fn F) {
  uint64_t Run = Mask & (~Mask + 1);
  forEachClear(Mask | (Run - 1), End, [&](uint64_t I) { F(I, Run); });
}

/// rho -> U rho U^+ for one gate, prepared once and applied to the density
/// matrix of every classical branch.
class GateKernel {
public:
  /// `Qubits[i]` is bit i of U's basis index; distinct, below N.
  GateKernel(const ir::Matrix &U, ir::UnitaryClass Class,
             llvm::ArrayRef<unsigned> Qubits, unsigned N);
  void apply(Complex *Rho) const;

private:
  enum class Kind {
    Identity,
    Phase1,   // one-qubit diagonal
    Diagonal, // wider diagonal
    Swaps,    // a permutation made of transpositions (x, cx, ccx, swap)
    Monomial, // any other permutation with phases
    Real1,    // one-qubit, real up to a global phase (h, ry)
    General1, // any other one-qubit gate
    General,
  };
  bool prepareMonomial(const ir::Matrix &U);
  void prepareGeneral(const ir::Matrix &U);
  void applyPhase1(Complex *Rho) const;
  void applyDiagonal(Complex *Rho) const;
  void applySwaps(Complex *Rho) const;
  void applyMonomial(Complex *Rho) const;
  void applyGeneral(Complex *Rho) const;

  Kind K = Kind::Identity;
  unsigned N;
  uint64_t Dim;
  uint64_t Mask = 0;                      // the gate's bits
  unsigned Size;                          // 2^arity
  llvm::SmallVector<uint64_t, 8> Offsets; // local basis index -> bits
  llvm::SmallVector<Complex, 16> Entries; // U row-major (General*)
  double RealEntries[4] = {};             // Real1: U row-major
  llvm::SmallVector<std::pair<uint64_t, uint64_t>, 4> SwapPairs; // offsets
  llvm::SmallVector<unsigned, 8> SwapWith; // Swaps: the local permutation
  llvm::SmallVector<Complex, 8> Phases;    // diagonal or monomial phases
  llvm::SmallVector<unsigned, 8> Moved;    // monomial: indices not fixed
  llvm::SmallVector<unsigned, 8> Target;   // monomial: where each goes
  bool PurePermutation = false;
  std::vector<uint16_t> LocalIndex; // Diagonal: per basis index
};

/// The non-unitary updates, on the qubit Q of an N-qubit density matrix.
/// Reset: Kraus operators |0><0| and |0><1|.
void resetQubit(Complex *Rho, unsigned N, unsigned Q);
/// Keeps the block where qubit Q reads `One` on both sides (P rho P).
void keepOutcome(Complex *Rho, unsigned N, unsigned Q, bool One);
/// <One| rho_Q |One>, unnormalised.
double outcomeWeight(const Complex *Rho, unsigned N, unsigned Q, bool One);
/// Adds the partial trace onto `Keep` (bit i of the result's index is
/// Keep[i]) to `Out`, a 2^|Keep| square matrix.
void addPartialTrace(const Complex *Rho, unsigned N,
                     llvm::ArrayRef<unsigned> Keep, Eigen::MatrixXcd &Out);

} // namespace revbound::semantics::density

#endif
