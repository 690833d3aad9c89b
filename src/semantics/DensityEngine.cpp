//===- DensityEngine.cpp - Exact mixed-state simulation of small circuits -===//
//
// The density engine (DESIGN.md, "Semantics tiers", tier 3) keeps the exact
// classical-quantum state: for every value of the bits that measurements
// write, the unnormalised density matrix of the qubits that some operation
// touches (its trace is the probability of that value). Untouched qubits are
// in product with the rest and are handled in closed form. The kernels that
// update one density matrix (DensityKernels.h) come first, the engine after.
//
//===----------------------------------------------------------------------===//
#include "DensityKernels.h"
#include "EngineSupport.h"

#include "revbound/semantics/Engines.h"
#include "revbound/semantics/GateExpander.h"
#include "revbound/support/Diagnostics.h"

#include <Eigen/Eigenvalues>
#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <map>
#include <optional>
#include <set>
#include <vector>

namespace revbound::semantics {

namespace density {

namespace {
/// Entries a monomial or diagonal kernel drops must be rounding noise; the
/// classification's own tolerance (1e-9) would let ry(1e-10) pass for the
/// identity, and that error would add up over many gates.
constexpr double DroppedEntry = 1e-14;

double conjugate(double A) { return A; }
Complex conjugate(Complex A) { return std::conj(A); }

/// rho -> U rho U^+ for a one-qubit U (row-major, real or complex) on the
/// qubit with bit M: both updates in one pass over the blocks
/// {r, r+M} x {c, c+M}.
template <typename Scalar>
void applyOneQubit(Complex *Rho, uint64_t Dim, uint64_t M, const Scalar *U) {
  Scalar U00 = U[0], U01 = U[1], U10 = U[2], U11 = U[3];
  Scalar V00 = conjugate(U00), V01 = conjugate(U01), V10 = conjugate(U10),
         V11 = conjugate(U11);
  forEachClear(M, Dim, [&](uint64_t C0) {
    Complex *X0 = Rho + C0 * Dim, *X1 = Rho + (C0 + M) * Dim;
    for (uint64_t Hi = 0; Hi < Dim; Hi += 2 * M)
      for (uint64_t R = Hi; R < Hi + M; ++R) {
        Complex A = X0[R], B = X0[R + M], C = X1[R], D = X1[R + M];
        Complex A1 = mul(U00, A) + mul(U01, B), B1 = mul(U10, A) + mul(U11, B);
        Complex C1 = mul(U00, C) + mul(U01, D), D1 = mul(U10, C) + mul(U11, D);
        X0[R] = mul(V00, A1) + mul(V01, C1);
        X1[R] = mul(V10, A1) + mul(V11, C1);
        X0[R + M] = mul(V00, B1) + mul(V01, D1);
        X1[R + M] = mul(V10, B1) + mul(V11, D1);
      }
  });
}
} // namespace

GateKernel::GateKernel(const ir::Matrix &U, ir::UnitaryClass Class,
                       llvm::ArrayRef<unsigned> Qubits, unsigned N)
    : N(N), Dim(uint64_t(1) << N), Size(1u << Qubits.size()) {
  for (unsigned Q : Qubits)
    Mask |= uint64_t(1) << Q;
  for (unsigned L = 0; L < Size; ++L) {
    uint64_t Off = 0;
    for (unsigned I = 0; I < Qubits.size(); ++I)
      if (L >> I & 1)
        Off |= uint64_t(1) << Qubits[I];
    Offsets.push_back(Off);
  }
  switch (Class) {
  case ir::UnitaryClass::Permutation:
  case ir::UnitaryClass::Monomial:
  case ir::UnitaryClass::Diagonal:
    if (prepareMonomial(U))
      return;
    break;
  case ir::UnitaryClass::General:
    break;
  }
  prepareGeneral(U);
}

void GateKernel::prepareGeneral(const ir::Matrix &U) {
  // Without the global phase of its largest entry, h and ry are real.
  Eigen::Index MaxRow = 0, MaxCol = 0;
  U.cwiseAbs().maxCoeff(&MaxRow, &MaxCol);
  Complex Global = U(MaxRow, MaxCol) / std::abs(U(MaxRow, MaxCol));
  bool Real = Size == 2;
  for (unsigned Row = 0; Row < Size; ++Row)
    for (unsigned Col = 0; Col < Size; ++Col) {
      Entries.push_back(mul(U(Row, Col), std::conj(Global)));
      Real &= std::abs(Entries.back().imag()) <= DroppedEntry;
    }
  if (Real) {
    K = Kind::Real1;
    for (unsigned I = 0; I < 4; ++I)
      RealEntries[I] = Entries[I].real();
    return;
  }
  K = Size == 2 ? Kind::General1 : Kind::General;
}

/// U |i> = Phases[i] |Target[i]>, up to a global phase. False when U has
/// more than rounding noise outside that pattern.
bool GateKernel::prepareMonomial(const ir::Matrix &U) {
  llvm::SmallVector<unsigned, 8> To(Size);
  llvm::SmallVector<Complex, 8> Ph(Size);
  llvm::SmallVector<bool, 8> Hit(Size, false);
  for (unsigned Col = 0; Col < Size; ++Col) {
    unsigned Best = 0;
    for (unsigned Row = 1; Row < Size; ++Row)
      if (std::abs(U(Row, Col)) > std::abs(U(Best, Col)))
        Best = Row;
    for (unsigned Row = 0; Row < Size; ++Row)
      if (Row != Best && std::abs(U(Row, Col)) > DroppedEntry)
        return false;
    if (Hit[Best])
      return false;
    Hit[Best] = true;
    To[Col] = Best;
    Ph[Col] = U(Best, Col);
  }
  // The global phase cancels in U rho U^+; dividing it out makes a plain
  // permutation multiply by nothing.
  Complex Global = Ph[0] / std::abs(Ph[0]);
  bool Diagonal = true;
  PurePermutation = true;
  for (unsigned I = 0; I < Size; ++I) {
    Ph[I] = mul(Ph[I], std::conj(Global));
    Diagonal &= To[I] == I;
    PurePermutation &= std::abs(Ph[I] - 1.0) <= DroppedEntry;
  }
  for (unsigned I = 0; I < Size; ++I)
    if (To[I] != I || (!PurePermutation && std::abs(Ph[I] - 1.0) > 0)) {
      Moved.push_back(I);
      Target.push_back(To[I]);
    }
  if (Moved.empty()) {
    K = Kind::Identity;
    return true;
  }
  if (Diagonal) {
    Phases = Ph;
    if (Size == 2) {
      K = Kind::Phase1;
      return true;
    }
    K = Kind::Diagonal;
    LocalIndex.resize(Dim);
    for (uint64_t R = 0; R < Dim; ++R) {
      unsigned L = 0;
      for (unsigned I = 0; (1u << I) < Size; ++I)
        if (R & Offsets[1u << I])
          L |= 1u << I;
      LocalIndex[R] = uint16_t(L);
    }
    return true;
  }
  Phases = Ph;
  K = Kind::Monomial;
  if (!PurePermutation)
    return true;
  // x, cx, ccx, swap, cswap are their own inverses: plain swaps.
  for (unsigned I : Moved) {
    if (To[To[I]] != I)
      return true;
  }
  for (unsigned I : Moved)
    if (I < To[I])
      SwapPairs.push_back({Offsets[I], Offsets[To[I]]});
  SwapWith.assign(To.begin(), To.end());
  K = Kind::Swaps;
  return true;
}

void GateKernel::apply(Complex *Rho) const {
  switch (K) {
  case Kind::Identity:
    return;
  case Kind::Phase1:
    return applyPhase1(Rho);
  case Kind::Diagonal:
    return applyDiagonal(Rho);
  case Kind::Swaps:
    return applySwaps(Rho);
  case Kind::Monomial:
    return applyMonomial(Rho);
  case Kind::Real1:
    return applyOneQubit(Rho, Dim, Mask, RealEntries);
  case Kind::General1:
    return applyOneQubit(Rho, Dim, Mask, Entries.data());
  case Kind::General:
    return applyGeneral(Rho);
  }
}

// diag(d0, d1) multiplies (r, c) by d_r conj(d_c): only the blocks where the
// qubit's row and column bits differ change.
void GateKernel::applyPhase1(Complex *Rho) const {
  uint64_t M = Mask;
  Complex Up = mul(Phases[1], std::conj(Phases[0])), Down = std::conj(Up);
  forEachClear(M, Dim, [&](uint64_t C0) {
    Complex *X0 = Rho + C0 * Dim, *X1 = Rho + (C0 + M) * Dim;
    for (uint64_t Hi = 0; Hi < Dim; Hi += 2 * M)
      for (uint64_t R = Hi; R < Hi + M; ++R) {
        X0[R + M] = mul(X0[R + M], Up);
        X1[R] = mul(X1[R], Down);
      }
  });
}

void GateKernel::applyDiagonal(Complex *Rho) const {
  llvm::SmallVector<Complex, 16> ByRow(Size);
  for (uint64_t C = 0; C < Dim; ++C) {
    Complex ColPhase = std::conj(Phases[LocalIndex[C]]);
    for (unsigned L = 0; L < Size; ++L)
      ByRow[L] = mul(Phases[L], ColPhase);
    Complex *X = Rho + C * Dim;
    for (uint64_t R = 0; R < Dim; ++R)
      X[R] = mul(X[R], ByRow[LocalIndex[R]]);
  }
}

// Rows: (U rho)(T(i), c) = p_i rho(i, c); columns: (X U^+)(r, T(j)) =
// X(r, j) conj(p_j). Only the moved indices are touched.
void GateKernel::applyMonomial(Complex *Rho) const {
  unsigned NumMoved = unsigned(Moved.size());
  llvm::SmallVector<Complex, 8> Tmp(NumMoved);
  llvm::SmallVector<Complex, 8> ColPhase(NumMoved);
  for (unsigned I = 0; I < NumMoved; ++I)
    ColPhase[I] = std::conj(Phases[Moved[I]]);
  for (uint64_t C = 0; C < Dim; ++C) {
    Complex *X = Rho + C * Dim;
    forEachClear(Mask, Dim, [&](uint64_t B) {
      for (unsigned I = 0; I < NumMoved; ++I)
        Tmp[I] = X[B + Offsets[Moved[I]]];
      for (unsigned I = 0; I < NumMoved; ++I)
        X[B + Offsets[Target[I]]] =
            PurePermutation ? Tmp[I] : mul(Tmp[I], Phases[Moved[I]]);
    });
  }
  llvm::SmallVector<Complex *, 8> Src(NumMoved), Dst(NumMoved);
  forEachClear(Mask, Dim, [&](uint64_t B) {
    for (unsigned I = 0; I < NumMoved; ++I) {
      Src[I] = Rho + (B + Offsets[Moved[I]]) * Dim;
      Dst[I] = Rho + (B + Offsets[Target[I]]) * Dim;
    }
    for (uint64_t R = 0; R < Dim; ++R) {
      for (unsigned I = 0; I < NumMoved; ++I)
        Tmp[I] = Src[I][R];
      for (unsigned I = 0; I < NumMoved; ++I)
        Dst[I][R] = PurePermutation ? Tmp[I] : mul(Tmp[I], ColPhase[I]);
    }
  });
}

// rho'(p(r), p(c)) = rho(r, c) in one sweep over the columns: a column
// that p moves trades places with its partner, then both permute their
// rows while they are still in cache.
void GateKernel::applySwaps(Complex *Rho) const {
  auto PermuteRows = [&](Complex *X) {
    forEachClearRun(Mask, Dim, [&](uint64_t B, uint64_t Run) {
      for (auto [From, To] : SwapPairs)
        std::swap_ranges(X + B + From, X + B + From + Run, X + B + To);
    });
  };
  forEachClear(Mask, Dim, [&](uint64_t B) {
    for (unsigned J = 0; J < Size; ++J) {
      unsigned Partner = SwapWith[J];
      if (Partner < J)
        continue;
      Complex *X = Rho + (B + Offsets[J]) * Dim;
      if (Partner != J) {
        Complex *Y = Rho + (B + Offsets[Partner]) * Dim;
        std::swap_ranges(X, X + Dim, Y);
        PermuteRows(Y);
      }
      PermuteRows(X);
    }
  });
}

// Two passes: U on each column's row index, then conj(U) across columns
// (contiguous in the row index, so both passes stream through memory).
void GateKernel::applyGeneral(Complex *Rho) const {
  llvm::SmallVector<Complex, 8> In(Size);
  for (uint64_t C = 0; C < Dim; ++C) {
    Complex *X = Rho + C * Dim;
    forEachClear(Mask, Dim, [&](uint64_t B) {
      for (unsigned I = 0; I < Size; ++I)
        In[I] = X[B + Offsets[I]];
      for (unsigned J = 0; J < Size; ++J) {
        const Complex *Row = Entries.data() + J * Size;
        Complex Sum = 0;
        for (unsigned I = 0; I < Size; ++I)
          Sum += mul(Row[I], In[I]);
        X[B + Offsets[J]] = Sum;
      }
    });
  }
  llvm::SmallVector<Complex *, 8> Cols(Size);
  forEachClear(Mask, Dim, [&](uint64_t B) {
    for (unsigned I = 0; I < Size; ++I)
      Cols[I] = Rho + (B + Offsets[I]) * Dim;
    for (uint64_t R = 0; R < Dim; ++R) {
      for (unsigned I = 0; I < Size; ++I)
        In[I] = Cols[I][R];
      for (unsigned J = 0; J < Size; ++J) {
        const Complex *Row = Entries.data() + J * Size;
        Complex Sum = 0;
        for (unsigned I = 0; I < Size; ++I)
          Sum += mul(std::conj(Row[I]), In[I]);
        Cols[J][R] = Sum;
      }
    }
  });
}

void resetQubit(Complex *Rho, unsigned N, unsigned Q) {
  uint64_t Dim = uint64_t(1) << N, M = uint64_t(1) << Q;
  forEachClear(M, Dim, [&](uint64_t C0) {
    Complex *X0 = Rho + C0 * Dim, *X1 = Rho + (C0 + M) * Dim;
    for (uint64_t Hi = 0; Hi < Dim; Hi += 2 * M)
      for (uint64_t R = Hi; R < Hi + M; ++R) {
        X0[R] += X1[R + M];
        X0[R + M] = X1[R] = X1[R + M] = 0;
      }
  });
}

void keepOutcome(Complex *Rho, unsigned N, unsigned Q, bool One) {
  uint64_t Dim = uint64_t(1) << N, M = uint64_t(1) << Q;
  uint64_t Kept = One ? M : 0, Dropped = One ? 0 : M;
  forEachClear(M, Dim, [&](uint64_t C0) {
    std::fill_n(Rho + (C0 + Dropped) * Dim, Dim, Complex(0));
    Complex *X = Rho + (C0 + Kept) * Dim;
    for (uint64_t Hi = 0; Hi < Dim; Hi += 2 * M)
      std::fill_n(X + Hi + Dropped, M, Complex(0));
  });
}

double outcomeWeight(const Complex *Rho, unsigned N, unsigned Q, bool One) {
  uint64_t Dim = uint64_t(1) << N, M = uint64_t(1) << Q;
  double W = 0;
  for (uint64_t R = 0; R < Dim; ++R)
    if (bool(R & M) == One)
      W += Rho[R + R * Dim].real();
  return W;
}

void addPartialTrace(const Complex *Rho, unsigned N,
                     llvm::ArrayRef<unsigned> Keep, Eigen::MatrixXcd &Out) {
  uint64_t Dim = uint64_t(1) << N, KeepMask = 0;
  unsigned Size = 1u << Keep.size();
  llvm::SmallVector<uint64_t, 16> Deposit(Size, 0);
  for (unsigned L = 0; L < Size; ++L)
    for (unsigned I = 0; I < Keep.size(); ++I)
      if (L >> I & 1)
        Deposit[L] |= uint64_t(1) << Keep[I];
  for (unsigned Q : Keep)
    KeepMask |= uint64_t(1) << Q;
  for (uint64_t C = 0; C < Dim; ++C) {
    unsigned ColLocal = 0;
    for (unsigned I = 0; I < Keep.size(); ++I)
      if (C >> Keep[I] & 1)
        ColLocal |= 1u << I;
    uint64_t Rest = C & ~KeepMask;
    const Complex *X = Rho + C * Dim;
    for (unsigned L = 0; L < Size; ++L)
      Out(L, ColLocal) += X[Rest | Deposit[L]];
  }
}

} // namespace density

namespace {

using density::Complex;

// Numerical tolerances. Every gate application rounds each entry with a
// relative error near 1e-16; over the 1e3 - 1e5 applications of a circuit
// this engine runs, the errors add up to roughly 1e-13 - 1e-11 in entries
// and probabilities. A probability at or below 1e-9 is therefore taken for
// zero (a branch of that weight is dropped, a qubit with that much weight on
// |1> is clean): far above the accumulated noise, far below anything a
// circuit of this size produces on purpose, and what it can hide is at most
// H2(1e-9) ~ 3e-8 bits.
constexpr double ZeroProbability = 1e-9;
// Eigenvalues at or below this are rounding noise of zero eigenvalues; each
// would add less than 5e-13 bits.
constexpr double EigenvalueFloor = 1e-14;
// A pure state (1 - Tr rho^2 below this) has S(A) = S(complement), within
// about 5e-9 bits on 12 qubits.
constexpr double PureTolerance = 1e-10;
// Memory for all the classical branches' density matrices (branches x 4^n
// x 16 bytes), and for their keys and bookkeeping.
constexpr uint64_t MaxStateBytes = uint64_t(1) << 30;
constexpr uint64_t MaxBookkeepingBytes = uint64_t(1) << 28;

/// Values of the tracked bits, bit i of word i / 64 for key position i.
using BitKey = std::vector<uint64_t>;

struct Branch {
  BitKey Key;
  Eigen::MatrixXcd Rho; // unnormalised; trace = probability of Key
};

/// An `if` over the tracked bits: Key & Mask == Want. Register bits that no
/// measurement writes stay 0; a condition that needs one of them at 1 never
/// holds.
struct BitCondition {
  bool Never = false;
  BitKey Mask, Want;
};

/// The eigenvalues of a positive semidefinite M of rank at most MaxRank, but
/// for zeros: those of the small L^+ L, where M = L L^+ is the pivoted
/// Cholesky factorisation that stops when the residual's trace is below
/// 1e-13 (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed.,
/// 2002, section 10.3). The residual is positive semidefinite, so no
/// eigenvalue moves by more than its trace. Nullopt past MaxRank.
std::optional<Eigen::VectorXd> lowRankEigenvalues(const Eigen::MatrixXcd &M,
                                                  Eigen::Index MaxRank) {
  constexpr double ResidualTrace = 1e-13;
  Eigen::Index Size = M.rows();
  Eigen::VectorXd Residual = M.diagonal().real();
  Eigen::MatrixXcd L(Size, MaxRank);
  for (Eigen::Index Rank = 0;; ++Rank) {
    if (Residual.cwiseMax(0.0).sum() <= ResidualTrace) {
      Eigen::MatrixXcd Gram = L.leftCols(Rank).adjoint() * L.leftCols(Rank);
      return Eigen::SelfAdjointEigenSolver<Eigen::MatrixXcd>(
                 Gram, Eigen::EigenvaluesOnly)
          .eigenvalues();
    }
    if (Rank == MaxRank)
      return std::nullopt;
    Eigen::Index Pivot = 0;
    Residual.maxCoeff(&Pivot);
    Eigen::VectorXcd Col =
        M.col(Pivot) - L.leftCols(Rank) * L.row(Pivot).head(Rank).adjoint();
    Col /= std::sqrt(Residual(Pivot));
    L.col(Rank) = Col;
    Residual -= Col.cwiseAbs2();
    Residual(Pivot) = 0;
  }
}

/// -sum lambda log2 lambda over the eigenvalues of an unnormalised density
/// matrix (positive semidefinite).
double entropyBits(const Eigen::MatrixXcd &M) {
  auto Term = [](double L) {
    return L > EigenvalueFloor ? -L * std::log2(L) : 0.0;
  };
  if (M.rows() == 1)
    return Term(M(0, 0).real());
  if (M.rows() == 2) {
    double A = M(0, 0).real(), D = M(1, 1).real();
    double Half = (A + D) / 2;
    double R = std::hypot((A - D) / 2, std::abs(M(1, 0)));
    return Term(Half + R) + Term(Half - R);
  }
  // A wide discard set often has a state of low rank; a full eigensolver
  // on 4096 x 4096 takes minutes. Trying costs at most 1/64 of it.
  std::optional<Eigen::VectorXd> Values;
  if (M.rows() >= 32)
    Values = lowRankEigenvalues(M, M.rows() / 8);
  if (!Values)
    Values = Eigen::SelfAdjointEigenSolver<Eigen::MatrixXcd>(
                 M, Eigen::EigenvaluesOnly)
                 .eigenvalues();
  double H = 0;
  for (Eigen::Index I = 0; I < Values->size(); ++I)
    H += Term((*Values)(I));
  return H;
}

class DensityRun {
public:
  DensityRun(const ir::Circuit &C, const EngineOptions &Opts)
      : C(C), Opts(Opts),
        Expander(C, Opts.MaxMatrixQubits, Opts.MaxExpandedOps),
        MaxWork(Opts.Choice == EngineChoice::Density ? Opts.MaxDensityWork
                                                     : Opts.MaxAutoDensityWork) {}
  llvm::Expected<Ledger> run();

private:
  llvm::Error setUp();
  llvm::Error applyGate(const ir::Op &O);
  void applyReset(const ir::Op &O);
  llvm::Error applyMeasure(const ir::Op &O);
  llvm::Error split(const ir::Op &O, unsigned Q, unsigned Pos,
                    llvm::ArrayRef<size_t> Where);
  void finish();
  BitInterval discardJoint(llvm::ArrayRef<uint32_t> Discarded,
                           llvm::ArrayRef<double> Marginals);

  /// The branches of nonzero weight in which `O` runs.
  std::vector<size_t> branchesRunning(const ir::Op &O);
  const BitCondition &condition(uint32_t Index);
  /// Entropy in bits of the active qubits `Qubits` and the tracked bits in
  /// `Bits` (a key mask), on the whole classical-quantum state.
  double entropy(llvm::ArrayRef<unsigned> Qubits, const BitKey &Bits) const;
  /// The reduced state of global qubit `Q`, summed over all branches.
  Eigen::MatrixXcd qubitState(uint32_t Q) const;
  bool bit(const BitKey &K, unsigned Pos) const {
    return K[Pos / 64] >> (Pos % 64) & 1;
  }
  void setBit(BitKey &K, unsigned Pos, bool V) const {
    uint64_t B = uint64_t(1) << (Pos % 64);
    K[Pos / 64] = V ? K[Pos / 64] | B : K[Pos / 64] & ~B;
  }
  uint64_t matrixBytes() const {
    return (uint64_t(1) << (2 * N)) * sizeof(Complex);
  }
  /// Whether `Count` branches fit the memory budgets. Besides its matrix a
  /// branch holds its key, which a split copies into two maps, and the
  /// allocations' headers.
  bool fits(uint64_t Count) const {
    uint64_t Bookkeeping = 3 * 8 * uint64_t(KeyWords) + 256;
    return Count <= MaxStateBytes / matrixBytes() &&
           Count <= MaxBookkeepingBytes / Bookkeeping;
  }

  const ir::Circuit &C;
  const EngineOptions &Opts;
  GateExpander Expander;
  unsigned N = 0;            // active qubits
  std::vector<int> ActiveOf; // global qubit -> active index, or -1
  std::vector<int> KeyPos;   // bit -> key position, or -1
  unsigned KeyWords = 0;
  std::vector<Branch> Branches;
  std::vector<std::optional<BitCondition>> Conditions;
  bool BudgetNoted = false;
  // Matrix-entry updates so far: 4^N per branch an operation runs in. The
  // branches are known only as the run makes them, so the limit is checked
  // here rather than estimated beforehand.
  const uint64_t MaxWork;
  uint64_t Work = 0;
  /// Counts an operation in `Branches` branches; false once past MaxWork.
  bool addWork(size_t Branches) {
    uint64_t Add;
    if (__builtin_mul_overflow(uint64_t(Branches), uint64_t(1) << (2 * N),
                               &Add) ||
        __builtin_add_overflow(Work, Add, &Work))
      Work = UINT64_MAX;
    return Work <= MaxWork;
  }
  llvm::Error errorTooMuchWork(const ir::Op &O) const;
  Ledger L;
};

llvm::Error DensityRun::setUp() {
  ActiveOf.assign(C.NumQubits, -1);
  KeyPos.assign(C.NumClbits, -1);
  unsigned Tracked = 0;
  for (const ir::Op &O : C.Ops) {
    if (O.Kind == ir::OpKind::Barrier)
      continue;
    llvm::ArrayRef<uint32_t> W = C.wires(O);
    if (O.Kind == ir::OpKind::Measure) {
      if (KeyPos[W[1]] < 0)
        KeyPos[W[1]] = int(Tracked++);
      W = W.take_front(1);
    }
    for (uint32_t Q : W)
      ActiveOf[Q] = 0;
  }
  for (uint32_t Q = 0; Q < C.NumQubits; ++Q)
    if (ActiveOf[Q] == 0)
      ActiveOf[Q] = int(N++);
  if (N > Opts.MaxDensityQubits)
    return llvm::createStringError(
        llvm::inconvertibleErrorCode(),
        fmt::format("the circuit acts on {} qubits, more than the density "
                    "engine's limit of {} (--max-density-qubits)",
                    N, Opts.MaxDensityQubits));
  KeyWords = (Tracked + 63) / 64;
  // 4^N * 16 bytes: 13 qubits already fill the whole budget.
  if (N > 13 || !fits(1))
    return llvm::createStringError(
        llvm::inconvertibleErrorCode(),
        fmt::format("the density matrix of {} qubits needs more than the "
                    "density engine's 1 GiB",
                    N));
  uint64_t Dim = uint64_t(1) << N, InputMask = 0;
  for (uint32_t Q = 0; Q < C.NumQubits; ++Q)
    if (ActiveOf[Q] >= 0 && C.role(Q) == ir::WireRole::Input)
      InputMask |= uint64_t(1) << ActiveOf[Q];
  // Inputs maximally mixed, every other qubit |0>.
  Branch B;
  B.Key.assign(KeyWords, 0);
  B.Rho = Eigen::MatrixXcd::Zero(Eigen::Index(Dim), Eigen::Index(Dim));
  double Weight = std::ldexp(1.0, -__builtin_popcountll(InputMask));
  for (uint64_t R = 0; R < Dim; ++R)
    if ((R & ~InputMask) == 0)
      B.Rho(Eigen::Index(R), Eigen::Index(R)) = Weight;
  Branches.push_back(std::move(B));
  Conditions.resize(C.Conditions.size());
  return llvm::Error::success();
}

const BitCondition &DensityRun::condition(uint32_t Index) {
  std::optional<BitCondition> &Slot = Conditions[Index];
  if (Slot)
    return *Slot;
  const ir::Condition &Cond = C.Conditions[Index];
  BitCondition BC;
  BC.Mask.assign(KeyWords, 0);
  BC.Want.assign(KeyWords, 0);
  BC.Never = Cond.Unsatisfiable;
  std::vector<uint32_t> Bits = conditionBits(C, Cond);
  for (unsigned I = 0; I < Bits.size() && !BC.Never; ++I) {
    bool Want = Cond.Value[I];
    int Pos = KeyPos[Bits[I]];
    if (Pos < 0) {
      BC.Never |= Want;
      continue;
    }
    setBit(BC.Mask, unsigned(Pos), true);
    setBit(BC.Want, unsigned(Pos), Want);
  }
  Slot = std::move(BC);
  return *Slot;
}

std::vector<size_t> DensityRun::branchesRunning(const ir::Op &O) {
  const BitCondition *BC =
      O.Cond == ir::NoCondition ? nullptr : &condition(O.Cond);
  std::vector<size_t> Out;
  if (BC && BC->Never)
    return Out;
  for (size_t I = 0; I < Branches.size(); ++I) {
    const Branch &B = Branches[I];
    bool Holds = true;
    for (unsigned W = 0; BC && W < KeyWords; ++W)
      Holds &= (B.Key[W] & BC->Mask[W]) == BC->Want[W];
    if (Holds && B.Rho.trace().real() > ZeroProbability)
      Out.push_back(I);
  }
  return Out;
}

double DensityRun::entropy(llvm::ArrayRef<unsigned> Qubits,
                           const BitKey &Bits) const {
  // S(A) = H(A's bits) + sum over their values v of p_v S(rho_A | v): the
  // eigenvalues of the summed partial traces of each group, pooled.
  std::map<BitKey, Eigen::MatrixXcd> Groups;
  Eigen::Index Size = Eigen::Index(1) << Qubits.size();
  for (const Branch &B : Branches) {
    BitKey G(KeyWords);
    for (unsigned W = 0; W < KeyWords; ++W)
      G[W] = B.Key[W] & Bits[W];
    auto [It, New] = Groups.try_emplace(std::move(G));
    if (New)
      It->second = Eigen::MatrixXcd::Zero(Size, Size);
    density::addPartialTrace(B.Rho.data(), N, Qubits, It->second);
  }
  double H = 0;
  for (const auto &[Key, M] : Groups)
    H += entropyBits(M);
  return H;
}

Eigen::MatrixXcd DensityRun::qubitState(uint32_t Q) const {
  Eigen::MatrixXcd Rho = Eigen::MatrixXcd::Zero(2, 2);
  if (ActiveOf[Q] < 0) {
    // Untouched: as it started.
    if (C.role(Q) == ir::WireRole::Input)
      Rho(0, 0) = Rho(1, 1) = 0.5;
    else
      Rho(0, 0) = 1;
    return Rho;
  }
  unsigned A = unsigned(ActiveOf[Q]);
  for (const Branch &B : Branches)
    density::addPartialTrace(B.Rho.data(), N, {A}, Rho);
  return Rho;
}

llvm::Error DensityRun::applyGate(const ir::Op &O) {
  std::vector<size_t> Where = branchesRunning(O);
  if (Where.empty())
    return llvm::Error::success();
  std::optional<ir::GateId> Unknown;
  bool TooMuchWork = false;
  llvm::SmallVector<unsigned, 8> Qubits;
  auto Visit = [&](const GateStep &S) {
    if (Unknown || TooMuchWork)
      return;
    if (!addWork(Where.size())) {
      TooMuchWork = true;
      return;
    }
    if (!S.U) {
      Unknown = S.Gate;
      return;
    }
    Qubits.clear();
    for (uint32_t Q : S.Qubits)
      Qubits.push_back(unsigned(ActiveOf[Q]));
    density::GateKernel Kernel(*S.U, S.Class, Qubits, N);
    for (size_t B : Where)
      Kernel.apply(Branches[B].Rho.data());
  };
  auto Take = [](ir::UnitaryClass, unsigned Arity) { return Arity <= 3; };
  bool Expanded = Expander.expand(O.Gate, C.params(O), C.wires(O), Take, Visit);
  if (!Expanded && !BudgetNoted) {
    BudgetNoted = true;
    L.Notes.push_back(fmt::format(
        "density: the expansion budget of {} gate applications ran out; later "
        "calls were simulated by their whole unitaries",
        Opts.MaxExpandedOps));
  }
  if (TooMuchWork)
    return errorTooMuchWork(O);
  if (!Unknown)
    return llvm::Error::success();
  const ir::GateDef &G = C.gate(*Unknown);
  if (G.Origin == ir::GateOrigin::Opaque)
    return errorAt(O.Loc, fmt::format("gate '{}' is opaque; the density "
                                      "engine needs the unitary of every gate",
                                      G.Name));
  return errorAt(O.Loc,
                 fmt::format("the density engine needs the unitary of gate "
                             "'{}', which could not be built (it calls an "
                             "opaque gate, acts on more than {} qubits, or has "
                             "a non-finite parameter)",
                             G.Name, Opts.MaxMatrixQubits));
}

void DensityRun::applyReset(const ir::Op &O) {
  std::vector<size_t> Where = branchesRunning(O);
  if (Where.empty())
    return; // never runs: erases nothing
  (void)addWork(Where.size()); // the next gate or measurement stops the run
  uint32_t Global = C.wires(O)[0];
  unsigned Q = unsigned(ActiveOf[Global]);
  // A = {q} and, for a conditioned reset, the bits it reads. The branches
  // where it runs all agree on those bits, so they form one group of A.
  BitKey Bits =
      O.Cond == ir::NoCondition ? BitKey(KeyWords, 0) : condition(O.Cond).Mask;
  double P0 = 0, P1 = 0;
  for (size_t B : Where) {
    P0 += density::outcomeWeight(Branches[B].Rho.data(), N, Q, false);
    P1 += density::outcomeWeight(Branches[B].Rho.data(), N, Q, true);
  }
  bool Basis = std::min(P0, P1) <= ZeroProbability;
  double Before = Basis ? 0 : entropy({Q}, Bits);
  for (size_t B : Where)
    density::resetQubit(Branches[B].Rho.data(), N, Q);
  ErasureEvent E;
  E.Kind = ErasureKind::Reset;
  E.Wire = Global;
  E.Loc = O.Loc;
  E.Status = Basis ? ErasureStatus::Constant : ErasureStatus::Exact;
  E.BitsLow = E.BitsHigh =
      Basis ? 0 : clampBits(Before - entropy({Q}, Bits), 1);
  L.Events.push_back(E);
}

llvm::Error DensityRun::errorTooMuchWork(const ir::Op &O) const {
  return errorAt(O.Loc,
                 fmt::format("the density engine passed {} matrix-entry "
                             "updates here ({} classical branches of {} "
                             "qubits)",
                             MaxWork, Branches.size(), N));
}

llvm::Error DensityRun::applyMeasure(const ir::Op &O) {
  std::vector<size_t> Where = branchesRunning(O);
  if (Where.empty())
    return llvm::Error::success();
  if (!addWork(Where.size()))
    return errorTooMuchWork(O);
  uint32_t Bit = C.wires(O)[1];
  unsigned Q = unsigned(ActiveOf[C.wires(O)[0]]);
  unsigned Pos = unsigned(KeyPos[Bit]);
  // A = {q, c} and the bits a condition reads: the operation reads them
  // too, and without them a conditioned measurement could be charged for
  // correlations that stay in those bits.
  BitKey Bits =
      O.Cond == ir::NoCondition ? BitKey(KeyWords, 0) : condition(O.Cond).Mask;
  // Where c is known, the branches that run form one group of A and turn
  // into its two outcomes' groups, which are new unless c is one of the
  // condition's bits: S(A) can then only grow (dephasing adds entropy).
  bool Known = !bit(Bits, Pos);
  for (size_t B : Where)
    Known &= bit(Branches[B].Key, Pos) == bit(Branches[Where[0]].Key, Pos);
  setBit(Bits, Pos, true);
  double Before = Known ? 0 : entropy({Q}, Bits);
  if (llvm::Error E = split(O, Q, Pos, Where))
    return E;
  if (Known)
    return llvm::Error::success();
  ErasureEvent E;
  E.Kind = ErasureKind::Overwrite;
  E.Wire = Bit;
  E.Loc = O.Loc;
  E.Status = ErasureStatus::Exact;
  E.BitsLow = E.BitsHigh = clampBits(Before - entropy({Q}, Bits), 1);
  L.Events.push_back(E);
  return llvm::Error::success();
}

/// Projects every branch in `Where` onto q's two outcomes, writes the
/// outcome to key position `Pos`, and merges branches with equal keys.
llvm::Error DensityRun::split(const ir::Op &O, unsigned Q, unsigned Pos,
                              llvm::ArrayRef<size_t> Where) {
  std::vector<std::array<bool, 2>> Keeps(Branches.size(), {false, false});
  std::vector<bool> Runs(Branches.size(), false);
  std::set<BitKey> Keys;
  for (size_t B : Where) {
    Runs[B] = true;
    double W[2];
    for (int Out = 0; Out < 2; ++Out)
      W[Out] = density::outcomeWeight(Branches[B].Rho.data(), N, Q, Out);
    for (int Out = 0; Out < 2; ++Out)
      Keeps[B][Out] = W[Out] > ZeroProbability;
    if (!Keeps[B][0] && !Keeps[B][1])
      Keeps[B][W[1] > W[0]] = true;
    for (int Out = 0; Out < 2; ++Out)
      if (Keeps[B][Out]) {
        BitKey K = Branches[B].Key;
        setBit(K, Pos, Out);
        Keys.insert(std::move(K));
      }
  }
  for (size_t B = 0; B < Branches.size(); ++B)
    if (!Runs[B])
      Keys.insert(Branches[B].Key);
  if (!fits(Keys.size()))
    return errorAt(O.Loc,
                   fmt::format("this measurement splits the state of {} qubits "
                               "into {} classical branches, more than fit in "
                               "the density engine's 1 GiB",
                               N, Keys.size()));
  std::vector<Branch> Out;
  std::map<BitKey, size_t> Index;
  auto Put = [&](BitKey K, Eigen::MatrixXcd &&Rho) {
    auto [It, New] = Index.try_emplace(K, Out.size());
    if (New)
      Out.push_back({std::move(K), std::move(Rho)});
    else
      Out[It->second].Rho += Rho;
  };
  for (size_t B = 0; B < Branches.size(); ++B) {
    Branch &Br = Branches[B];
    if (!Runs[B]) {
      Put(std::move(Br.Key), std::move(Br.Rho));
      continue;
    }
    if (Keeps[B][0] && Keeps[B][1]) {
      Eigen::MatrixXcd One = Br.Rho;
      density::keepOutcome(One.data(), N, Q, true);
      BitKey K = Br.Key;
      setBit(K, Pos, true);
      Put(std::move(K), std::move(One));
    }
    bool Outcome = !Keeps[B][0];
    density::keepOutcome(Br.Rho.data(), N, Q, Outcome);
    setBit(Br.Key, Pos, Outcome);
    Put(std::move(Br.Key), std::move(Br.Rho));
  }
  Branches = std::move(Out);
  return llvm::Error::success();
}

BitInterval DensityRun::discardJoint(llvm::ArrayRef<uint32_t> Discarded,
                                     llvm::ArrayRef<double> Marginals) {
  BitInterval J;
  double Count = double(Discarded.size());
  // Untouched discarded qubits are in product with everything: their
  // entropies add.
  double Closed = 0;
  std::vector<unsigned> Active;
  for (uint32_t Q : Discarded) {
    if (ActiveOf[Q] >= 0)
      Active.push_back(unsigned(ActiveOf[Q]));
    else if (C.role(Q) == ir::WireRole::Input)
      Closed += 1;
  }
  if (Active.size() > Opts.MaxJointWires) {
    // Subadditivity above. Below, the largest marginal would be wrong for
    // entangled qubits (a Bell pair: marginals 1, joint 0); Araki-Lieb,
    // S(AB) >= S(A) - S(B) with S(B) at most the sum of B's marginals
    // (Commun. Math. Phys. 18, 160 (1970)), gives max_i S_i - sum_{j!=i} S_j.
    double Max = 0, Sum = 0;
    for (double M : Marginals) {
      Max = std::max(Max, M);
      Sum += M;
    }
    J.Low = std::max(0.0, 2 * Max - Sum);
    J.High = std::min(Sum, Count);
    L.Notes.push_back(fmt::format(
        "density: {} discarded qubits are more than the {} whose joint "
        "entropy is computed exactly; the joint discard is bounded by "
        "Araki-Lieb below and the sum of the marginals above",
        Active.size(), Opts.MaxJointWires));
    return J;
  }
  double S = 0;
  if (!Active.empty()) {
    // For a pure state S(A) = S(complement): the smaller side is cheaper.
    std::vector<unsigned> Rest;
    for (unsigned A = 0; A < N; ++A)
      if (std::find(Active.begin(), Active.end(), A) == Active.end())
        Rest.push_back(A);
    bool Pure = Branches.size() == 1 && Rest.size() < Active.size() &&
                1 - Branches[0].Rho.squaredNorm() <= PureTolerance;
    BitKey NoBits(KeyWords, 0);
    S = !Pure          ? entropy(Active, NoBits)
        : Rest.empty() ? 0
                       : entropy(Rest, NoBits);
  }
  J.Low = J.High = clampBits(S + Closed, Count);
  J.Exact = true;
  return J;
}

void DensityRun::finish() {
  std::vector<llvm::SMLoc> Last = lastUses(C);
  std::vector<uint32_t> Discarded = discardedQubits(C);
  std::vector<double> Marginals;
  for (uint32_t Q : Discarded) {
    Eigen::MatrixXcd Rho = qubitState(Q);
    double P1 = std::clamp(Rho(1, 1).real(), 0.0, 1.0);
    double S = clampBits(entropyBits(Rho), 1);
    Marginals.push_back(S);
    if (S > ZeroProbability || P1 > ZeroProbability) {
      bool One = P1 >= 1 - ZeroProbability;
      L.Events.push_back(discardEvent(
          Q, Last[Q], One ? ErasureStatus::Constant : ErasureStatus::Exact,
          One ? 0 : S, One ? 0 : S));
    }
    if (C.role(Q) != ir::WireRole::Ancilla)
      continue;
    AncillaVerdict V;
    V.Qubit = Q;
    V.Clean = P1 <= ZeroProbability;
    V.DirtyProbability = P1;
    L.Ancillas.push_back(V);
  }
  L.DiscardJoint = discardJoint(Discarded, Marginals);
}

llvm::Expected<Ledger> DensityRun::run() {
  L.Engine = EngineKind::Density;
  if (llvm::Error E = setUp())
    return E;
  for (const ir::Op &O : C.Ops) {
    switch (O.Kind) {
    case ir::OpKind::Barrier:
      break;
    case ir::OpKind::Gate:
      if (llvm::Error E = applyGate(O))
        return E;
      break;
    case ir::OpKind::Reset:
      applyReset(O);
      break;
    case ir::OpKind::Measure:
      if (llvm::Error E = applyMeasure(O))
        return E;
      break;
    }
  }
  finish();
  return std::move(L);
}

} // namespace

llvm::Expected<Ledger> runDensity(const ir::Circuit &C,
                                  const EngineOptions &Opts) {
  return DensityRun(C, Opts).run();
}
} // namespace revbound::semantics
