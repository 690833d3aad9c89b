//===- Unitary.h - The matrix a gate stands for ----------------------------===//
//
// A leaf's unitary is built from its definition down to U and CX, as the
// OpenQASM 2.0 specification defines them (Cross et al., arXiv:1707.03429,
// section 3): U(theta, phi, lambda) = Rz(phi) Ry(theta) Rz(lambda), and CX
// with the first argument as control. Basis order: qubit argument i is bit
// i of the basis index (the first argument is the least significant bit).
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_IR_UNITARY_H
#define REVBOUND_IR_UNITARY_H

#include "revbound/ir/Circuit.h"

#include <Eigen/Dense>

#include <map>
#include <optional>
#include <utility>
#include <vector>

namespace revbound::ir {

using Matrix = Eigen::MatrixXcd;

/// How a unitary acts on basis states.
enum class UnitaryClass {
  Permutation, // a permutation matrix (x, cx, ccx, swap, cswap, ...)
  Diagonal,    // phases only (z, s, t, rz, u1, cz, crz, ...)
  Monomial,    // a permutation with phases (y, cy, iswap, ...)
  General,     // maps some basis state to a superposition (h, rx, ...)
};

/// "permutation", "diagonal", "monomial" or "general".
const char *unitaryClassName(UnitaryClass C);

/// The class of `U` up to global phase, entries within `Tolerance` of zero
/// counting as zero.
/// A diagonal matrix that is also a permutation (the identity) is a
/// Permutation.
UnitaryClass classify(const Matrix &U, double Tolerance = 1e-9);

/// True when A = e^{i phi} B for some phase, entry by entry within Tolerance.
bool equalUpToPhase(const Matrix &A, const Matrix &B, double Tolerance = 1e-9);

/// The 2x2 matrix of U(theta, phi, lambda).
Matrix builtinU(double Theta, double Phi, double Lambda);

/// Builds and memoises gate unitaries for one circuit.
class UnitaryCache {
public:
  explicit UnitaryCache(const Circuit &C, unsigned MaxQubits = 10)
      : C(C), MaxQubits(MaxQubits) {}

  /// The unitary of gate `G` with `Params`; nullptr for opaque gates, gates
  /// that call one, gates on more than MaxQubits qubits, non-finite
  /// parameters, and matrices that would take more than MaxWork
  /// multiply-adds to build. The pointer is valid until the next call.
  const Matrix *get(GateId G, llvm::ArrayRef<double> Params);

private:
  std::optional<Matrix> build(GateId G, llvm::ArrayRef<double> Params);

  const Circuit &C;
  unsigned MaxQubits;
  std::map<std::pair<GateId, std::vector<double>>, std::optional<Matrix>> Cache;
  static constexpr uint64_t MaxWork = uint64_t(1) << 30;
  static constexpr size_t MaxEntries = 4096;
  uint64_t WorkLeft = MaxWork;
  unsigned Depth = 0;
};

} // namespace revbound::ir

#endif
