//===- Unitary.cpp - The matrix a gate stands for --------------------------===//
#include "revbound/ir/Unitary.h"

#include <cmath>
#include <complex>

namespace revbound::ir {

using Complex = std::complex<double>;

const char *unitaryClassName(UnitaryClass C) {
  switch (C) {
  case UnitaryClass::Permutation:
    return "permutation";
  case UnitaryClass::Diagonal:
    return "diagonal";
  case UnitaryClass::Monomial:
    return "monomial";
  case UnitaryClass::General:
    return "general";
  }
  return "general";
}

UnitaryClass classify(const Matrix &U, double Tolerance) {
  // Classes are up to global phase: a permutation times e^{i phi} is one.
  bool Monomial = true, Diagonal = true, SamePhase = true;
  std::optional<Complex> Phase;
  for (Eigen::Index Col = 0; Col < U.cols(); ++Col) {
    int NonZero = 0;
    for (Eigen::Index Row = 0; Row < U.rows(); ++Row) {
      Complex V = U(Row, Col);
      if (std::abs(V) <= Tolerance)
        continue;
      ++NonZero;
      if (Row != Col)
        Diagonal = false;
      if (!Phase)
        Phase = V;
      else if (std::abs(V - *Phase) > Tolerance)
        SamePhase = false;
    }
    if (NonZero != 1)
      Monomial = false;
  }
  if (!Monomial)
    return UnitaryClass::General;
  if (SamePhase)
    return UnitaryClass::Permutation;
  return Diagonal ? UnitaryClass::Diagonal : UnitaryClass::Monomial;
}

bool equalUpToPhase(const Matrix &A, const Matrix &B, double Tolerance) {
  if (A.rows() != B.rows() || A.cols() != B.cols())
    return false;
  // The phase comes from the largest entry of B, the best conditioned one.
  Eigen::Index R = 0, Cl = 0;
  B.cwiseAbs().maxCoeff(&R, &Cl);
  if (std::abs(B(R, Cl)) <= Tolerance)
    return A.cwiseAbs().maxCoeff() <= Tolerance;
  Complex Phase = A(R, Cl) / B(R, Cl);
  if (std::abs(std::abs(Phase) - 1) > Tolerance)
    return false;
  return (A - Phase * B).cwiseAbs().maxCoeff() <= Tolerance;
}

Matrix builtinU(double Theta, double Phi, double Lambda) {
  // Rz(phi) Ry(theta) Rz(lambda), specification section 3.
  const Complex I(0, 1);
  double C = std::cos(Theta / 2), S = std::sin(Theta / 2);
  Matrix U(2, 2);
  U(0, 0) = std::exp(-I * (Phi + Lambda) / 2.0) * C;
  U(0, 1) = -std::exp(-I * (Phi - Lambda) / 2.0) * S;
  U(1, 0) = std::exp(I * (Phi - Lambda) / 2.0) * S;
  U(1, 1) = std::exp(I * (Phi + Lambda) / 2.0) * C;
  return U;
}

/// Left-multiplies the 2^K x 2^K matrix `M` by `G` acting on the local
/// qubits `On` (qubit On[i] of M is bit i of G's basis index).
static void applyOn(Matrix &M, const Matrix &G, llvm::ArrayRef<uint32_t> On) {
  const Eigen::Index Dim = M.rows();
  const unsigned Arity = unsigned(On.size());
  const Eigen::Index Sub = Eigen::Index(1) << Arity;
  uint64_t Mask = 0;
  for (uint32_t Q : On)
    Mask |= uint64_t(1) << Q;
  std::vector<Eigen::Index> Index(Sub);
  Eigen::VectorXcd In(Sub), Out(Sub);
  for (Eigen::Index Base = 0; Base < Dim; ++Base) {
    if (uint64_t(Base) & Mask)
      continue; // visit each group once, from its all-zero member
    for (Eigen::Index S = 0; S < Sub; ++S) {
      uint64_t Idx = uint64_t(Base);
      for (unsigned B = 0; B < Arity; ++B)
        if (S >> B & 1)
          Idx |= uint64_t(1) << On[B];
      Index[S] = Eigen::Index(Idx);
    }
    for (Eigen::Index Col = 0; Col < Dim; ++Col) {
      for (Eigen::Index S = 0; S < Sub; ++S)
        In(S) = M(Index[S], Col);
      Out = G * In;
      for (Eigen::Index S = 0; S < Sub; ++S)
        M(Index[S], Col) = Out(S);
    }
  }
}

std::optional<Matrix> UnitaryCache::build(GateId G, llvm::ArrayRef<double> P) {
  const GateDef &D = C.gate(G);
  for (double V : P)
    if (!std::isfinite(V))
      return std::nullopt; // e.g. 1/a at a = 0 inside a native leaf
  if (G == Circuit::UGate)
    return builtinU(P[0], P[1], P[2]);
  if (G == Circuit::CXGate) {
    Matrix CX = Matrix::Zero(4, 4);
    // Control is qubit 0 (bit 0), target qubit 1 (bit 1).
    CX(0, 0) = CX(2, 2) = 1;
    CX(3, 1) = CX(1, 3) = 1;
    return CX;
  }
  if (!D.hasBody() || D.numQubits() > MaxQubits)
    return std::nullopt;
  Eigen::Index Dim = Eigen::Index(1) << D.numQubits();
  Matrix M = Matrix::Identity(Dim, Dim);
  std::vector<double> Sub;
  for (const BodyOp &B : D.Body) {
    if (B.IsBarrier)
      continue;
    Sub.clear();
    for (const ParamExpr &E : B.Params)
      Sub.push_back(E.evaluate(P));
    // Each application costs 2^K * 2^K * 2^k multiply-adds; past the budget
    // the unitary is unknown rather than slow.
    uint64_t Cost = uint64_t(Dim) * uint64_t(Dim) << B.Qubits.size();
    if (Cost > WorkLeft)
      return std::nullopt;
    WorkLeft -= Cost;
    const Matrix *Callee = get(B.Callee, Sub);
    if (!Callee)
      return std::nullopt;
    applyOn(M, *Callee, B.Qubits);
  }
  return M;
}

const Matrix *UnitaryCache::get(GateId G, llvm::ArrayRef<double> Params) {
  for (double V : Params)
    if (!std::isfinite(V))
      return nullptr; // and NaN would break the map's ordering
  auto Key = std::make_pair(G, std::vector<double>(Params.begin(), Params.end()));
  auto It = Cache.find(Key);
  if (It != Cache.end())
    return It->second ? &*It->second : nullptr;
  if (Depth == 0) {
    // A cache: bound its memory, and give each outermost request its budget.
    if (Cache.size() > MaxEntries)
      Cache.clear();
    WorkLeft = MaxWork;
  }
  ++Depth;
  std::optional<Matrix> M = build(G, Params);
  --Depth;
  It = Cache.emplace(std::move(Key), std::move(M)).first;
  return It->second ? &*It->second : nullptr;
}

} // namespace revbound::ir
