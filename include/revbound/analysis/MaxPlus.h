//===- MaxPlus.h - Longest paths through gate bodies, in max-plus algebra -===//
//
// A gate body is summarised by running it on symbolic inputs: every local
// wire carries a vector of longest-path weights from each input wire. A leaf
// of weight w on wires A sets all of A to max(A) + w; a barrier sets A to
// max(A); a call applies the callee's matrix: row'[j] = max_l(row[a_l] +
// D[l][j]). The same code serves layer counts (exact uint64, an overflow is
// reported) and times in seconds (double).
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_ANALYSIS_MAXPLUS_H
#define REVBOUND_ANALYSIS_MAXPLUS_H

#include "llvm/ADT/ArrayRef.h"
#include "llvm/ADT/SmallVector.h"

#include <algorithm>
#include <cstdint>
#include <limits>
#include <vector>

namespace revbound::analysis {

/// Minus infinity and checked addition for one weight type.
template <typename T> struct MaxPlusTraits;

template <> struct MaxPlusTraits<uint64_t> {
  static constexpr uint64_t none() { return UINT64_MAX; }
  /// False when A + B would reach none().
  static bool add(uint64_t A, uint64_t B, uint64_t &Out) {
    return !__builtin_add_overflow(A, B, &Out) && Out != none();
  }
};

template <> struct MaxPlusTraits<double> {
  static constexpr double none() { return -std::numeric_limits<double>::infinity(); }
  static bool add(double A, double B, double &Out) {
    Out = A + B;
    return true;
  }
};

/// Longest path from input wire i to output wire j; none() where j does
/// not depend on i.
template <typename T> class MaxPlusMatrix {
public:
  MaxPlusMatrix() = default;
  explicit MaxPlusMatrix(unsigned N)
      : N(N), D(size_t(N) * N, MaxPlusTraits<T>::none()) {}
  unsigned size() const { return N; }
  T at(unsigned From, unsigned To) const { return D[size_t(From) * N + To]; }
  T &at(unsigned From, unsigned To) { return D[size_t(From) * N + To]; }

private:
  unsigned N = 0;
  std::vector<T> D;
};

/// Applies a call summarised by `D` to concrete ready times: for each of the
/// call's wires W[j], Ready'[W[j]] = max_i(Ready[W[i]] + D[i][j]). For
/// double weights, where sums cannot overflow.
inline void applyCall(std::vector<double> &Ready, llvm::ArrayRef<uint32_t> W,
                      const MaxPlusMatrix<double> &D,
                      llvm::SmallVectorImpl<double> &Scratch) {
  Scratch.assign(W.begin(), W.end());
  for (unsigned I = 0; I < W.size(); ++I)
    Scratch[I] = Ready[W[I]];
  for (unsigned J = 0; J < W.size(); ++J) {
    double Best = 0;
    for (unsigned I = 0; I < W.size(); ++I) {
      double Dl = D.at(I, J);
      if (Dl != MaxPlusTraits<double>::none())
        Best = std::max(Best, Scratch[I] + Dl);
    }
    Ready[W[J]] = Best;
  }
}

/// The symbolic state of a K-wire body. With `TrackUses`, it also records,
/// per wire, the paths to the start of its first leaf and the end of its
/// last leaf (for the spacetime volume).
template <typename T> class BodyState {
  using Tr = MaxPlusTraits<T>;

public:
  BodyState(unsigned K, bool TrackUses)
      : K(K), Rows(size_t(K) * K, Tr::none()), Start(K), Scratch(),
        TrackUses(TrackUses) {
    for (unsigned W = 0; W < K; ++W)
      Rows[size_t(W) * K + W] = T();
    if (TrackUses) {
      First.assign(size_t(K) * K, Tr::none());
      Last.assign(size_t(K) * K, Tr::none());
      Touched.assign(K, false);
    }
  }

  /// A leaf of weight `Weight` on local wires `A`; false on overflow.
  bool leaf(llvm::ArrayRef<uint32_t> A, T Weight) {
    joinRows(A);
    if (TrackUses)
      for (uint32_t X : A)
        if (!Touched[X]) {
          Touched[X] = true;
          std::copy(Start.begin(), Start.end(), First.begin() + size_t(X) * K);
        }
    for (T &V : Start)
      if (V != Tr::none() && !Tr::add(V, Weight, V))
        return false;
    for (uint32_t X : A) {
      std::copy(Start.begin(), Start.end(), Rows.begin() + size_t(X) * K);
      if (TrackUses)
        std::copy(Start.begin(), Start.end(), Last.begin() + size_t(X) * K);
    }
    return true;
  }

  /// A barrier on local wires `A`: aligns them, adds no weight.
  void barrier(llvm::ArrayRef<uint32_t> A) {
    joinRows(A);
    for (uint32_t X : A)
      std::copy(Start.begin(), Start.end(), Rows.begin() + size_t(X) * K);
  }

  /// A call on local wires `A` of a gate summarised by `D` (and, when uses
  /// are tracked, its first- and last-use matrices); false on overflow.
  bool call(llvm::ArrayRef<uint32_t> A, const MaxPlusMatrix<T> &D,
            const MaxPlusMatrix<T> *FirstUse = nullptr,
            const MaxPlusMatrix<T> *LastUse = nullptr) {
    if (TrackUses) {
      for (unsigned J = 0; J < A.size(); ++J) {
        if (!Touched[A[J]] && product(A, *FirstUse, J, Start)) {
          Touched[A[J]] = true;
          std::copy(Start.begin(), Start.end(), First.begin() + size_t(A[J]) * K);
        }
        if (Overflow)
          return false;
        if (product(A, *LastUse, J, Start))
          std::copy(Start.begin(), Start.end(), Last.begin() + size_t(A[J]) * K);
        if (Overflow)
          return false;
      }
    }
    Scratch.assign(A.size() * size_t(K), Tr::none());
    for (unsigned J = 0; J < A.size(); ++J) {
      product(A, D, J, Start);
      if (Overflow)
        return false;
      std::copy(Start.begin(), Start.end(), Scratch.begin() + size_t(J) * K);
    }
    for (unsigned J = 0; J < A.size(); ++J)
      std::copy(Scratch.begin() + size_t(J) * K, Scratch.begin() + size_t(J + 1) * K,
                Rows.begin() + size_t(A[J]) * K);
    return true;
  }

  MaxPlusMatrix<T> delays() const { return transpose(Rows); }
  MaxPlusMatrix<T> firstUses() const { return transpose(First); }
  MaxPlusMatrix<T> lastUses() const { return transpose(Last); }

private:
  static T join(T A, T B) {
    if (A == Tr::none())
      return B;
    if (B == Tr::none())
      return A;
    return std::max(A, B);
  }

  void joinRows(llvm::ArrayRef<uint32_t> A) {
    std::fill(Start.begin(), Start.end(), Tr::none());
    for (uint32_t X : A)
      for (unsigned I = 0; I < K; ++I)
        Start[I] = join(Start[I], Rows[size_t(X) * K + I]);
  }

  /// Out[i] = max_l(Rows[A[l]][i] + M[l][J]); true if any entry is a path.
  bool product(llvm::ArrayRef<uint32_t> A, const MaxPlusMatrix<T> &M,
               unsigned J, std::vector<T> &Out) {
    std::fill(Out.begin(), Out.end(), Tr::none());
    bool Any = false;
    for (unsigned L = 0; L < A.size(); ++L) {
      T W = M.at(L, J);
      if (W == Tr::none())
        continue;
      for (unsigned I = 0; I < K; ++I) {
        T R = Rows[size_t(A[L]) * K + I];
        if (R == Tr::none())
          continue;
        T V;
        if (!Tr::add(R, W, V)) {
          Overflow = true;
          return false;
        }
        Out[I] = join(Out[I], V);
        Any = true;
      }
    }
    return Any;
  }

  MaxPlusMatrix<T> transpose(const std::vector<T> &ByWire) const {
    MaxPlusMatrix<T> M(K);
    if (ByWire.empty())
      return M;
    for (unsigned J = 0; J < K; ++J)
      for (unsigned I = 0; I < K; ++I)
        M.at(I, J) = ByWire[size_t(J) * K + I];
    return M;
  }

  unsigned K;
  std::vector<T> Rows; // Rows[w * K + i]: path from input i to wire w's end
  std::vector<T> Start, Scratch;
  bool TrackUses;
  bool Overflow = false;
  std::vector<T> First, Last;
  std::vector<bool> Touched;
};

} // namespace revbound::analysis

#endif
