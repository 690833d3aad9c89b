//===- ReferenceSimulator.h - Brute-force reference for the engines ------===//
//
// A deliberately naive model of what the semantic engines compute, written
// apart from them (it shares no code with src/semantics or src/ir) so that
// the cross-checks compare two independent derivations. Clarity wins over
// speed everywhere: circuits here have at most a few qubits.
//
// A circuit is a list of RefOps over a small gate set (x, cx, ccx, swap,
// cswap, h, t, s, ry, rz), reset, measure and `if (creg == k)`. It prints
// itself as OpenQASM 2.0 so that the engines see the same circuit.
//
// Two simulators give a RefOutcome:
//  - simulateDensity keeps the classical-quantum state sum_c |c><c| (x) rho_c
//    as one dense matrix rho_c per value c of the classical bits;
//  - simulateClassical (reversible gates only) enumerates every basis input
//    and counts, giving Shannon entropies directly.
// Inputs are uniformly random (maximally mixed), every other qubit starts
// |0>, every bit 0. Each reset and measure removes
// max(0, S(A before) - S(A after)) bits (Reeb & Wolf, New J. Phys. 16,
// 103011 (2014)) with A = {q} plus the condition's bits for a reset and
// A = {q, c} for a measure.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_TESTS_SEMANTICS_REFERENCESIMULATOR_H
#define REVBOUND_TESTS_SEMANTICS_REFERENCESIMULATOR_H

#include <Eigen/Dense>
#include <unsupported/Eigen/KroneckerProduct>

#include <cmath>
#include <complex>
#include <cstdint>
#include <map>
#include <numbers>
#include <optional>
#include <sstream>
#include <stdexcept>
#include <string>
#include <vector>

namespace revbound::test::reference {

enum class RefRole { Output, Input, Ancilla, Garbage };

inline bool isDiscardedRole(RefRole R) {
  return R == RefRole::Ancilla || R == RefRole::Garbage;
}

enum class RefGate { X, CX, CCX, Swap, CSwap, H, T, S, RY, RZ };
enum class RefOpKind { Gate, Reset, Measure };

inline const char *refGateName(RefGate G) {
  switch (G) {
  case RefGate::X:
    return "x";
  case RefGate::CX:
    return "cx";
  case RefGate::CCX:
    return "ccx";
  case RefGate::Swap:
    return "swap";
  case RefGate::CSwap:
    return "cswap";
  case RefGate::H:
    return "h";
  case RefGate::T:
    return "t";
  case RefGate::S:
    return "s";
  case RefGate::RY:
    return "ry";
  case RefGate::RZ:
    return "rz";
  }
  return "?";
}

inline unsigned refGateArity(RefGate G) {
  switch (G) {
  case RefGate::CX:
  case RefGate::Swap:
    return 2;
  case RefGate::CCX:
  case RefGate::CSwap:
    return 3;
  case RefGate::X:
  case RefGate::H:
  case RefGate::T:
  case RefGate::S:
  case RefGate::RY:
  case RefGate::RZ:
    return 1;
  }
  return 1;
}

/// Permutations of basis states: the gates the classical brute force runs.
inline bool isPermutationGate(RefGate G) {
  return G == RefGate::X || G == RefGate::CX || G == RefGate::CCX ||
         G == RefGate::Swap || G == RefGate::CSwap;
}

inline bool hasAngle(RefGate G) { return G == RefGate::RY || G == RefGate::RZ; }

/// `if (CRegs[CReg] == Value)`, the register's first bit least significant
/// (OpenQASM 2.0 specification).
struct RefCondition {
  unsigned CReg = 0;
  uint64_t Value = 0;
};

struct RefOp {
  RefOpKind Kind = RefOpKind::Gate;
  RefGate Gate = RefGate::X;
  /// Gate arguments in order; for reset and measure, the one qubit.
  std::vector<unsigned> Qubits;
  double Theta = 0; // ry, rz
  unsigned Bit = 0; // measure: the global bit index written
  std::optional<RefCondition> Cond;
};

struct RefRegister {
  std::string Name;
  unsigned Size = 0;
};

/// Global numbering follows declaration order, as in OpenQASM 2.0.
struct RefCircuit {
  std::vector<RefRegister> QRegs, CRegs;
  std::vector<RefRole> Roles; // one per qubit
  std::vector<RefOp> Ops;

  unsigned numQubits() const {
    unsigned N = 0;
    for (const RefRegister &R : QRegs)
      N += R.Size;
    return N;
  }
  unsigned numBits() const {
    unsigned N = 0;
    for (const RefRegister &R : CRegs)
      N += R.Size;
    return N;
  }
  unsigned cregOffset(unsigned Reg) const {
    unsigned Off = 0;
    for (unsigned I = 0; I < Reg; ++I)
      Off += CRegs[I].Size;
    return Off;
  }
  std::vector<unsigned> conditionBits(const RefCondition &Cond) const {
    std::vector<unsigned> Bits;
    for (unsigned I = 0; I < CRegs[Cond.CReg].Size; ++I)
      Bits.push_back(cregOffset(Cond.CReg) + I);
    return Bits;
  }
  RefRole role(unsigned Q) const {
    return Q < Roles.size() ? Roles[Q] : RefRole::Output;
  }
  bool isReversible() const {
    for (const RefOp &O : Ops)
      if (O.Kind == RefOpKind::Gate && !isPermutationGate(O.Gate))
        return false;
    return true;
  }
  std::vector<unsigned> qubitsWithRole(RefRole R) const {
    std::vector<unsigned> Out;
    for (unsigned Q = 0; Q < numQubits(); ++Q)
      if (role(Q) == R)
        Out.push_back(Q);
    return Out;
  }
  std::vector<unsigned> discardedQubits() const {
    std::vector<unsigned> Out;
    for (unsigned Q = 0; Q < numQubits(); ++Q)
      if (isDiscardedRole(role(Q)))
        Out.push_back(Q);
    return Out;
  }

  static std::string wireName(const std::vector<RefRegister> &Regs,
                              unsigned Index) {
    for (const RefRegister &R : Regs) {
      if (Index < R.Size)
        return R.Name + "[" + std::to_string(Index) + "]";
      Index -= R.Size;
    }
    throw std::out_of_range("wire index past the registers");
  }

  /// One OpenQASM statement per op, so op I of this list is top-level
  /// operation I of the elaborated circuit.
  std::string toQasm() const {
    std::ostringstream OS;
    OS.precision(17); // round-trips every double through the lexer
    OS << "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n";
    for (const RefRegister &R : QRegs)
      OS << "qreg " << R.Name << "[" << R.Size << "];\n";
    for (const RefRegister &R : CRegs)
      OS << "creg " << R.Name << "[" << R.Size << "];\n";
    for (const RefOp &O : Ops) {
      if (O.Cond)
        OS << "if(" << CRegs[O.Cond->CReg].Name << "==" << O.Cond->Value
           << ") ";
      switch (O.Kind) {
      case RefOpKind::Gate:
        OS << refGateName(O.Gate);
        if (hasAngle(O.Gate))
          OS << "(" << O.Theta << ")";
        for (size_t I = 0; I < O.Qubits.size(); ++I)
          OS << (I ? "," : " ") << wireName(QRegs, O.Qubits[I]);
        break;
      case RefOpKind::Reset:
        OS << "reset " << wireName(QRegs, O.Qubits[0]);
        break;
      case RefOpKind::Measure:
        OS << "measure " << wireName(QRegs, O.Qubits[0]) << " -> "
           << wireName(CRegs, O.Bit);
        break;
      }
      OS << ";\n";
    }
    return OS.str();
  }

  RefCircuit &gate(RefGate G, std::vector<unsigned> Qs, double Theta = 0,
                   std::optional<RefCondition> Cond = std::nullopt) {
    RefOp O;
    O.Gate = G;
    O.Qubits = std::move(Qs);
    O.Theta = Theta;
    O.Cond = Cond;
    Ops.push_back(std::move(O));
    return *this;
  }
  RefCircuit &reset(unsigned Q,
                    std::optional<RefCondition> Cond = std::nullopt) {
    RefOp O;
    O.Kind = RefOpKind::Reset;
    O.Qubits = {Q};
    O.Cond = Cond;
    Ops.push_back(std::move(O));
    return *this;
  }
  RefCircuit &measure(unsigned Q, unsigned Bit) {
    RefOp O;
    O.Kind = RefOpKind::Measure;
    O.Qubits = {Q};
    O.Bit = Bit;
    Ops.push_back(std::move(O));
    return *this;
  }
};

/// One reset or measure and the entropy it removes.
struct RefEvent {
  size_t OpIndex = 0;
  RefOpKind Kind = RefOpKind::Reset;
  unsigned Wire = 0; // the qubit of a reset, the bit of a measure
  double Bits = 0;
  /// Measure: the probability of the less likely value of the bit just
  /// before; 0 when the bit held a constant.
  double BitMinorityBefore = 0;
  /// The probability that the op's condition holds (1 without one).
  double RunProbability = 1;
};

struct RefOutcome {
  /// Every reset and measure, in program order.
  std::vector<RefEvent> Events;
  /// The ancilla and garbage qubits, by index, with their marginal
  /// entropies at the end and the joint entropy of all of them.
  std::vector<unsigned> Discarded;
  std::vector<double> DiscardMarginal;
  double DiscardJoint = 0;
  /// Per qubit, the probability that it is not |0> at the end.
  std::vector<double> ProbOne;
};

/// Basis values for the input qubits (others listed are ignored; inputs
/// not listed are 0). Without one, inputs are uniformly random.
using BasisInput = std::map<unsigned, bool>;

namespace detail {

inline double shannonBitsOfCounts(const std::map<uint64_t, uint64_t> &Counts) {
  uint64_t Total = 0;
  for (const auto &KV : Counts)
    Total += KV.second;
  double H = 0;
  for (const auto &KV : Counts) {
    double P = double(KV.second) / double(Total);
    H -= P * std::log2(P);
  }
  return H;
}

/// The values of the qubits `Qs` in basis index `I`, Qs[0] least
/// significant; qubit q is bit q of a basis index.
inline uint64_t gatherBits(uint64_t I, const std::vector<unsigned> &Qs) {
  uint64_t A = 0;
  for (size_t T = 0; T < Qs.size(); ++T)
    A |= ((I >> Qs[T]) & 1) << T;
  return A;
}

/// Basis index `I` with the qubits `Qs` set to the bits of `A`.
inline uint64_t scatterBits(uint64_t I, const std::vector<unsigned> &Qs,
                            uint64_t A) {
  for (size_t T = 0; T < Qs.size(); ++T)
    I = (I & ~(uint64_t(1) << Qs[T])) | (((A >> T) & 1) << Qs[T]);
  return I;
}

inline bool conditionHolds(const RefCircuit &C, const RefOp &O, uint64_t Bits) {
  if (!O.Cond)
    return true;
  return gatherBits(Bits, C.conditionBits(*O.Cond)) == O.Cond->Value;
}

using Matrix = Eigen::MatrixXcd;
using Complex = std::complex<double>;

/// The gate's matrix on its own qubits, argument t at bit t of the local
/// index. Eigen's kroneckerProduct(A, B) puts A on the high bits, so
/// factors are written last argument first.
inline Matrix gateMatrix(RefGate G, double Theta) {
  const Complex I(0, 1);
  Matrix Id = Matrix::Identity(2, 2);
  Matrix X(2, 2), Y(2, 2), Z(2, 2), P0(2, 2), P1(2, 2);
  X << 0, 1, 1, 0;
  Y << 0, -I, I, 0;
  Z << 1, 0, 0, -1;
  P0 << 1, 0, 0, 0;
  P1 << 0, 0, 0, 1;
  // (1 + XX + YY + ZZ) / 2 exchanges two qubits (common practice).
  Matrix Swap = (Eigen::kroneckerProduct(Id, Id).eval() +
                 Eigen::kroneckerProduct(X, X).eval() +
                 Eigen::kroneckerProduct(Y, Y).eval() +
                 Eigen::kroneckerProduct(Z, Z).eval()) /
                2.0;
  Matrix M;
  switch (G) {
  case RefGate::X:
    return X;
  case RefGate::CX: // control bit 0, target bit 1
    return Eigen::kroneckerProduct(Id, P0).eval() +
           Eigen::kroneckerProduct(X, P1).eval();
  case RefGate::CCX: {
    Matrix BothSet = Eigen::kroneckerProduct(P1, P1).eval();
    return Matrix::Identity(8, 8) +
           Eigen::kroneckerProduct(Matrix(X - Id), BothSet).eval();
  }
  case RefGate::Swap:
    return Swap;
  case RefGate::CSwap: // control bit 0, swapped bits 1 and 2
    return Eigen::kroneckerProduct(Matrix::Identity(4, 4), P0).eval() +
           Eigen::kroneckerProduct(Swap, P1).eval();
  case RefGate::H:
    M = Matrix(2, 2);
    M << 1, 1, 1, -1;
    return M / std::sqrt(2.0);
  case RefGate::T:
    M = Matrix(2, 2);
    M << 1, 0, 0, std::exp(I * (std::numbers::pi / 4));
    return M;
  case RefGate::S:
    M = Matrix(2, 2);
    M << 1, 0, 0, I;
    return M;
  case RefGate::RY:
    M = Matrix(2, 2);
    M << std::cos(Theta / 2), -std::sin(Theta / 2), std::sin(Theta / 2),
        std::cos(Theta / 2);
    return M;
  case RefGate::RZ:
    // exp(-i theta Z / 2); qelib1's u1(theta) differs by a global phase,
    // which no density matrix sees.
    M = Matrix(2, 2);
    M << std::exp(-I * (Theta / 2)), 0, 0, std::exp(I * (Theta / 2));
    return M;
  }
  return Id;
}

/// (G (x) 1) Rho with G acting on the qubits `Qs`.
inline Matrix leftMultiply(const Matrix &G, const std::vector<unsigned> &Qs,
                           const Matrix &Rho) {
  Matrix Out = Matrix::Zero(Rho.rows(), Rho.cols());
  for (Eigen::Index Row = 0; Row < Rho.rows(); ++Row) {
    uint64_t A = gatherBits(uint64_t(Row), Qs);
    for (Eigen::Index B = 0; B < G.cols(); ++B)
      if (G(Eigen::Index(A), B) != Complex(0))
        Out.row(Row) += G(Eigen::Index(A), B) *
                        Rho.row(Eigen::Index(scatterBits(Row, Qs, B)));
  }
  return Out;
}

/// K Rho K^dagger with K acting on the qubits `Qs`.
inline Matrix conjugate(const Matrix &K, const std::vector<unsigned> &Qs,
                        const Matrix &Rho) {
  Matrix KRho = leftMultiply(K, Qs, Rho);
  return leftMultiply(K, Qs, KRho.adjoint()).adjoint();
}

/// The reduced matrix of the qubits `Keep` (Keep[0] the low bit).
inline Matrix partialTrace(const Matrix &Rho,
                           const std::vector<unsigned> &Keep) {
  Eigen::Index Dim = Eigen::Index(1) << Keep.size();
  Matrix Out = Matrix::Zero(Dim, Dim);
  uint64_t KeepMask = 0;
  for (unsigned Q : Keep)
    KeepMask |= uint64_t(1) << Q;
  for (Eigen::Index I = 0; I < Rho.rows(); ++I)
    for (Eigen::Index J = 0; J < Rho.cols(); ++J)
      if ((uint64_t(I) & ~KeepMask) == (uint64_t(J) & ~KeepMask))
        Out(Eigen::Index(gatherBits(I, Keep)),
            Eigen::Index(gatherBits(J, Keep))) += Rho(I, J);
  return Out;
}

/// -sum lambda log2 lambda over the eigenvalues of a (sub-normalised)
/// positive matrix: one block's share of a block-diagonal state's entropy.
inline double entropyShareBits(const Matrix &Rho) {
  Eigen::SelfAdjointEigenSolver<Matrix> Solver(Rho, Eigen::EigenvaluesOnly);
  double H = 0;
  for (Eigen::Index K = 0; K < Solver.eigenvalues().size(); ++K) {
    double L = Solver.eigenvalues()(K);
    if (L > 1e-300)
      H -= L * std::log2(L);
  }
  return H;
}

/// sum_c |c><c| (x) rho_c, keyed by the bits' values c (bit b at bit b).
using CqState = std::map<uint64_t, Matrix>;

/// Von Neumann entropy in bits of the reduced state of qubits `Qs` and
/// bits `Bs`: block diagonal in the bits, so the spectra of the blocks
/// make up its spectrum.
inline double entropyBits(const CqState &State, const std::vector<unsigned> &Qs,
                          const std::vector<unsigned> &Bs) {
  std::map<uint64_t, Matrix> Reduced;
  for (const auto &[Bits, Rho] : State) {
    Matrix Part = partialTrace(Rho, Qs);
    uint64_t Key = gatherBits(Bits, Bs);
    auto It = Reduced.find(Key);
    if (It == Reduced.end())
      Reduced.emplace(Key, Part);
    else
      It->second += Part;
  }
  double H = 0;
  for (const auto &KV : Reduced)
    H += entropyShareBits(KV.second);
  return H;
}

inline double probBitOne(const CqState &State, unsigned Bit) {
  double P = 0;
  for (const auto &[Bits, Rho] : State)
    if ((Bits >> Bit) & 1)
      P += Rho.trace().real();
  return P;
}

inline void addBlock(CqState &State, uint64_t Bits, const Matrix &Rho) {
  if (!(Rho.trace().real() > 0)) // a zero block: that value never occurs
    return;
  auto It = State.find(Bits);
  if (It == State.end())
    State.emplace(Bits, Rho);
  else
    It->second += Rho;
}

} // namespace detail

/// The largest circuit simulateDensity takes: 4^8 entries per block.
inline constexpr unsigned MaxDensityQubits = 8;

/// Exact classical-quantum simulation (see the file comment).
inline RefOutcome simulateDensity(const RefCircuit &C,
                                  const std::optional<BasisInput> &Basis = {}) {
  using namespace detail;
  const unsigned N = C.numQubits();
  if (N > MaxDensityQubits)
    throw std::length_error("reference density simulation: too many qubits");
  const Eigen::Index Dim = Eigen::Index(1) << N;

  // The initial state is diagonal: a product of I/2 on random inputs and
  // |0><0| (or the given basis value) elsewhere.
  Matrix Rho0 = Matrix::Zero(Dim, Dim);
  for (Eigen::Index I = 0; I < Dim; ++I) {
    double W = 1;
    for (unsigned Q = 0; Q < N; ++Q) {
      bool One = (uint64_t(I) >> Q) & 1;
      bool Input = C.role(Q) == RefRole::Input;
      if (Input && !Basis)
        W *= 0.5;
      else if (Input && Basis->count(Q) && Basis->at(Q))
        W *= One ? 1 : 0;
      else
        W *= One ? 0 : 1;
    }
    Rho0(I, I) = W;
  }
  CqState State;
  State.emplace(0, Rho0);

  Matrix Ket0Bra0(2, 2), Ket0Bra1(2, 2), Ket1Bra1(2, 2);
  Ket0Bra0 << 1, 0, 0, 0;
  Ket0Bra1 << 0, 1, 0, 0;
  Ket1Bra1 << 0, 0, 0, 1;

  RefOutcome Out;
  for (size_t OpIndex = 0; OpIndex < C.Ops.size(); ++OpIndex) {
    const RefOp &O = C.Ops[OpIndex];
    std::vector<unsigned> AQubits = O.Qubits, ABits;
    if (O.Kind == RefOpKind::Reset && O.Cond)
      ABits = C.conditionBits(*O.Cond);
    if (O.Kind == RefOpKind::Measure)
      ABits = {O.Bit};
    double Before =
        O.Kind == RefOpKind::Gate ? 0 : entropyBits(State, AQubits, ABits);
    double PBit = O.Kind == RefOpKind::Measure ? probBitOne(State, O.Bit) : 0;
    double PRun = 0;

    CqState Next;
    for (const auto &[Bits, Rho] : State) {
      if (!conditionHolds(C, O, Bits)) {
        addBlock(Next, Bits, Rho);
        continue;
      }
      PRun += Rho.trace().real();
      switch (O.Kind) {
      case RefOpKind::Gate:
        addBlock(Next, Bits,
                 conjugate(gateMatrix(O.Gate, O.Theta), O.Qubits, Rho));
        break;
      case RefOpKind::Reset: // Kraus operators |0><0| and |0><1|
        addBlock(Next, Bits,
                 conjugate(Ket0Bra0, O.Qubits, Rho) +
                     conjugate(Ket0Bra1, O.Qubits, Rho));
        break;
      case RefOpKind::Measure: {
        uint64_t Cleared = Bits & ~(uint64_t(1) << O.Bit);
        addBlock(Next, Cleared, conjugate(Ket0Bra0, O.Qubits, Rho));
        addBlock(Next, Cleared | (uint64_t(1) << O.Bit),
                 conjugate(Ket1Bra1, O.Qubits, Rho));
        break;
      }
      }
    }
    State = std::move(Next);

    if (O.Kind == RefOpKind::Gate)
      continue;
    RefEvent E;
    E.OpIndex = OpIndex;
    E.Kind = O.Kind;
    E.Wire = O.Kind == RefOpKind::Measure ? O.Bit : O.Qubits[0];
    E.Bits = std::max(0.0, Before - entropyBits(State, AQubits, ABits));
    E.BitMinorityBefore = std::min(PBit, 1 - PBit);
    E.RunProbability = PRun;
    Out.Events.push_back(E);
  }

  Out.ProbOne.assign(N, 0);
  for (const auto &[Bits, Rho] : State)
    for (Eigen::Index I = 0; I < Dim; ++I)
      for (unsigned Q = 0; Q < N; ++Q)
        if ((uint64_t(I) >> Q) & 1)
          Out.ProbOne[Q] += Rho(I, I).real();
  Out.Discarded = C.discardedQubits();
  for (unsigned Q : Out.Discarded)
    Out.DiscardMarginal.push_back(entropyBits(State, {Q}, {}));
  Out.DiscardJoint = entropyBits(State, Out.Discarded, {});
  return Out;
}

/// Runs a reversible circuit on every basis input (or the one given) and
/// counts: the Shannon entropies of the uniform mixture of the runs.
inline RefOutcome
simulateClassical(const RefCircuit &C,
                  const std::optional<BasisInput> &Basis = {}) {
  using namespace detail;
  if (!C.isReversible())
    throw std::invalid_argument(
        "classical reference: not a reversible circuit");
  const unsigned N = C.numQubits();
  const std::vector<unsigned> Inputs = C.qubitsWithRole(RefRole::Input);
  if (N > 62 || Inputs.size() > 20)
    throw std::length_error("classical reference: too many qubits");

  struct Run {
    uint64_t Qubits = 0, Bits = 0;
  };
  std::vector<Run> Runs;
  if (Basis) {
    Run R;
    for (unsigned Q : Inputs)
      if (Basis->count(Q) && Basis->at(Q))
        R.Qubits |= uint64_t(1) << Q;
    Runs.push_back(R);
  } else {
    for (uint64_t V = 0; V < (uint64_t(1) << Inputs.size()); ++V)
      Runs.push_back({scatterBits(0, Inputs, V), 0});
  }
  auto QubitOf = [](const Run &R, unsigned Q) { return (R.Qubits >> Q) & 1; };
  auto SetQubit = [](Run &R, unsigned Q, uint64_t V) {
    R.Qubits = (R.Qubits & ~(uint64_t(1) << Q)) | (V << Q);
  };
  // The value of A = {Q} u Bs in one run, as a histogram key.
  auto KeyOf = [&](const Run &R, unsigned Q, const std::vector<unsigned> &Bs) {
    return QubitOf(R, Q) | (gatherBits(R.Bits, Bs) << 1);
  };
  auto EntropyOf = [&](unsigned Q, const std::vector<unsigned> &Bs) {
    std::map<uint64_t, uint64_t> Counts;
    for (const Run &R : Runs)
      ++Counts[KeyOf(R, Q, Bs)];
    return shannonBitsOfCounts(Counts);
  };

  RefOutcome Out;
  for (size_t OpIndex = 0; OpIndex < C.Ops.size(); ++OpIndex) {
    const RefOp &O = C.Ops[OpIndex];
    const std::vector<unsigned> &Qs = O.Qubits;
    std::vector<unsigned> ABits;
    if (O.Kind == RefOpKind::Reset && O.Cond)
      ABits = C.conditionBits(*O.Cond);
    if (O.Kind == RefOpKind::Measure)
      ABits = {O.Bit};
    double Before = O.Kind == RefOpKind::Gate ? 0 : EntropyOf(Qs[0], ABits);
    uint64_t BitOnes = 0, Running = 0;

    for (Run &R : Runs) {
      if (O.Kind == RefOpKind::Measure)
        BitOnes += (R.Bits >> O.Bit) & 1;
      if (!conditionHolds(C, O, R.Bits))
        continue;
      ++Running;
      switch (O.Kind) {
      case RefOpKind::Gate:
        switch (O.Gate) {
        case RefGate::X:
          SetQubit(R, Qs[0], !QubitOf(R, Qs[0]));
          break;
        case RefGate::CX:
          if (QubitOf(R, Qs[0]))
            SetQubit(R, Qs[1], !QubitOf(R, Qs[1]));
          break;
        case RefGate::CCX:
          if (QubitOf(R, Qs[0]) && QubitOf(R, Qs[1]))
            SetQubit(R, Qs[2], !QubitOf(R, Qs[2]));
          break;
        case RefGate::Swap: {
          uint64_t A = QubitOf(R, Qs[0]), B = QubitOf(R, Qs[1]);
          SetQubit(R, Qs[0], B);
          SetQubit(R, Qs[1], A);
          break;
        }
        case RefGate::CSwap:
          if (QubitOf(R, Qs[0])) {
            uint64_t A = QubitOf(R, Qs[1]), B = QubitOf(R, Qs[2]);
            SetQubit(R, Qs[1], B);
            SetQubit(R, Qs[2], A);
          }
          break;
        default:
          break; // excluded by isReversible()
        }
        break;
      case RefOpKind::Reset:
        SetQubit(R, Qs[0], 0);
        break;
      case RefOpKind::Measure:
        R.Bits =
            (R.Bits & ~(uint64_t(1) << O.Bit)) | (QubitOf(R, Qs[0]) << O.Bit);
        break;
      }
    }
    if (O.Kind == RefOpKind::Gate)
      continue;
    RefEvent E;
    E.OpIndex = OpIndex;
    E.Kind = O.Kind;
    E.Wire = O.Kind == RefOpKind::Measure ? O.Bit : Qs[0];
    E.Bits = std::max(0.0, Before - EntropyOf(Qs[0], ABits));
    uint64_t Minority = std::min<uint64_t>(BitOnes, Runs.size() - BitOnes);
    E.BitMinorityBefore = double(Minority) / double(Runs.size());
    E.RunProbability = double(Running) / double(Runs.size());
    Out.Events.push_back(E);
  }

  Out.ProbOne.assign(N, 0);
  for (unsigned Q = 0; Q < N; ++Q) {
    uint64_t Ones = 0;
    for (const Run &R : Runs)
      Ones += QubitOf(R, Q);
    Out.ProbOne[Q] = double(Ones) / double(Runs.size());
  }
  Out.Discarded = C.discardedQubits();
  std::map<uint64_t, uint64_t> Joint;
  for (unsigned Q : Out.Discarded)
    Out.DiscardMarginal.push_back(EntropyOf(Q, {}));
  for (const Run &R : Runs)
    ++Joint[gatherBits(R.Qubits, Out.Discarded)];
  Out.DiscardJoint = shannonBitsOfCounts(Joint);
  return Out;
}

/// Binary entropy H2(p) in bits (Shannon, Bell Syst. Tech. J. 27, 379
/// (1948)).
inline double binaryEntropyBits(double P) {
  if (P <= 0 || P >= 1)
    return 0;
  return -P * std::log2(P) - (1 - P) * std::log2(1 - P);
}

} // namespace revbound::test::reference

#endif
