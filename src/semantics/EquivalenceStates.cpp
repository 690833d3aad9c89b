//===- EquivalenceStates.cpp - Circuits compared as channels --------------===//
//
// Each circuit becomes an isometry on a larger register (its Stinespring
// dilation, Stinespring, Proc. AMS 6, 211 (1955)): a classical bit is a
// wire, `measure q -> c` copies q into c (a CX; the deferred-measurement
// principle, Nielsen & Chuang section 4.4), a reset or a second write to a
// bit first swaps the old value into a fresh environment wire, and
// `if (creg == v)` controls the operation on the bits' values. The channel
// on the kept wires is then Tr_discarded of the dilated state, with kept
// bits dephased (they are classical).
//
// Two channels are equal iff their Choi matrices J = M M^dagger are, with
// M the dilated states stacked by input basis state and kept value (rows)
// against the discarded wires' value (columns). With G_AB = M_A^dagger M_B,
// ||J_A - J_B||_F^2 = ||G_AA||^2 - 2 ||G_AB||^2 + ||G_BB||^2, so only
// matrices as wide as the discarded wires are formed. The same identity per
// input compares output states on basis inputs (witnesses) and, in the
// random method, on random inputs.
//
//===----------------------------------------------------------------------===//
#include "EngineSupport.h"
#include "EquivalenceSupport.h"

#include "revbound/ir/Unitary.h"
#include "revbound/semantics/GateExpander.h"

#include "llvm/ADT/DenseMap.h"
#include "llvm/ADT/SmallVector.h"
#include "llvm/ADT/StringMap.h"

#include <Eigen/Dense>
#include <fmt/format.h>

#include <cmath>
#include <complex>
#include <map>
#include <random>

namespace revbound::semantics::equivalence {
namespace {

using Amp = std::complex<double>;
using CMatrix = Eigen::MatrixXcd;

/// Widest call taken whole: its matrix is copied into the program.
constexpr unsigned MaxStepArity = 4;
/// Basis inputs in each random superposition.
constexpr unsigned SuperposedInputs = 4;
/// Bytes of per-input Gram matrices kept for the search of a two-state
/// witness.
constexpr uint64_t MaxWitnessBytes = uint64_t(256) << 20;
/// Below this squared distance of two output states (or Choi matrices per
/// unit of 4^inputs) two results are the same up to round-off.
constexpr double ChoiRoundOff = 1e-12;

/// One operation of the dilated circuit, controlled on some wires' values.
struct Step {
  enum class Kind : uint8_t { Matrix, Swap, Copy } K = Kind::Matrix;
  uint32_t MatrixIndex = 0;
  llvm::SmallVector<uint32_t, 4> Wires; // Swap: a, b; Copy: from, to
  uint64_t CtrlMask = 0, CtrlValue = 0;
};

/// A circuit as an isometry: wires are its qubits, then its bits, then one
/// environment wire per reset and per overwrite.
struct Dilation {
  unsigned Wires = 0;
  std::vector<Step> Steps;
  std::vector<ir::Matrix> Matrices;
  std::vector<uint32_t> InputWires; // interface input order
  std::vector<uint32_t> Kept;       // kept qubits, then kept bits
  std::vector<uint32_t> Discarded;  // the rest, then the kept bits again
  std::vector<uint32_t> Ancillas;
};

class Dilator {
public:
  Dilator(const ir::Circuit &C, const EquivalenceOptions &Opts)
      : C(C), MaxMatrixQubits(Opts.MaxMatrixQubits),
        Expander(C, Opts.MaxMatrixQubits, Opts.MaxExpandedOps) {}

  /// Builds the program; false with `Why` when a gate has no unitary or the
  /// expansion budget ran out.
  bool build(Dilation &D, std::string &Why) {
    Written.assign(C.NumClbits, false);
    Env = 0;
    auto Take = [](ir::UnitaryClass, unsigned Arity) {
      return Arity <= MaxStepArity;
    };
    for (const ir::Op &O : C.Ops) {
      if (O.Kind == ir::OpKind::Barrier)
        continue;
      uint64_t Mask = 0, Value = 0;
      if (O.Cond != ir::NoCondition) {
        const ir::Condition &Cond = C.Conditions[O.Cond];
        if (Cond.Unsatisfiable)
          continue; // never runs
        std::vector<uint32_t> Bits = conditionBits(C, Cond);
        for (size_t I = 0; I < Bits.size(); ++I) {
          uint64_t W = uint64_t(1) << bitWire(Bits[I]);
          Mask |= W;
          if (I < Cond.Value.getBitWidth() && Cond.Value[unsigned(I)])
            Value |= W;
        }
      }
      llvm::ArrayRef<uint32_t> W = C.wires(O);
      switch (O.Kind) {
      case ir::OpKind::Gate: {
        bool Known = true;
        const ir::GateDef *Unknown = nullptr;
        bool Fits = Expander.expand(
            O.Gate, C.params(O), W, Take, [&](const GateStep &S) {
              if (!S.U) {
                Known = false;
                Unknown = &C.gate(S.Gate);
                return;
              }
              Step St;
              St.MatrixIndex = matrixIndex(D, S);
              St.Wires.assign(S.Qubits.begin(), S.Qubits.end());
              St.CtrlMask = Mask;
              St.CtrlValue = Value;
              D.Steps.push_back(std::move(St));
            });
        if (!Fits) {
          Why = "the gate expansion budget ran out";
          return false;
        }
        if (!Known) {
          Why = fmt::format("gate {} has no unitary (opaque, or wider than "
                            "{} qubits)",
                            Unknown->Name, MaxMatrixQubits);
          return false;
        }
        break;
      }
      case ir::OpKind::Reset:
        D.Steps.push_back(swapStep(W[0], envWire(), Mask, Value));
        break;
      case ir::OpKind::Measure: {
        uint32_t Bit = bitWire(W[1]);
        if (Written[W[1]])
          D.Steps.push_back(swapStep(Bit, envWire(), Mask, Value));
        Written[W[1]] = true;
        Step St;
        St.K = Step::Kind::Copy;
        St.Wires = {W[0], Bit};
        St.CtrlMask = Mask;
        St.CtrlValue = Value;
        D.Steps.push_back(std::move(St));
        break;
      }
      case ir::OpKind::Barrier:
        break;
      }
    }
    D.Wires = C.NumQubits + C.NumClbits + Env;
    return true;
  }

  uint32_t bitWire(uint32_t Bit) const { return C.NumQubits + Bit; }

private:
  uint32_t envWire() { return C.NumQubits + C.NumClbits + Env++; }

  static Step swapStep(uint32_t A, uint32_t B, uint64_t Mask, uint64_t Value) {
    Step St;
    St.K = Step::Kind::Swap;
    St.Wires = {A, B};
    St.CtrlMask = Mask;
    St.CtrlValue = Value;
    return St;
  }

  /// The step's matrix copied once per distinct call (the expander's
  /// pointer lasts only until its next lookup).
  uint32_t matrixIndex(Dilation &D, const GateStep &S) {
    std::string Key = ir::callKey(S.Gate, S.Params);
    auto [It, New] = MatrixOf.try_emplace(Key, uint32_t(D.Matrices.size()));
    if (New)
      D.Matrices.push_back(*S.U);
    return It->second;
  }

  const ir::Circuit &C;
  unsigned MaxMatrixQubits;
  GateExpander Expander;
  std::vector<bool> Written;
  uint32_t Env = 0;
  llvm::StringMap<uint32_t> MatrixOf;
};

/// The dilation of one side, with the interface's wires in its numbering.
bool dilateSide(const ir::Circuit &C, const Interface &I, bool SideB,
                const EquivalenceOptions &Opts, Dilation &D,
                std::string &Why) {
  Dilator Builder(C, Opts);
  if (!Builder.build(D, Why))
    return false;
  auto Pick = [&](const std::pair<uint32_t, uint32_t> &P) {
    return SideB ? P.second : P.first;
  };
  std::vector<bool> IsKept(D.Wires, false);
  for (const auto &P : I.Inputs)
    D.InputWires.push_back(Pick(P));
  for (const auto &P : I.KeptQubits) {
    D.Kept.push_back(Pick(P));
    IsKept[Pick(P)] = true;
  }
  std::vector<uint32_t> KeptBits;
  for (const auto &P : I.KeptBits) {
    uint32_t W = Builder.bitWire(Pick(P));
    D.Kept.push_back(W);
    KeptBits.push_back(W);
    IsKept[W] = true;
  }
  for (uint32_t W = 0; W < D.Wires; ++W)
    if (!IsKept[W])
      D.Discarded.push_back(W);
  // Kept bits are classical: listing them among the discarded wires too
  // dephases them (no coherence between their values survives).
  D.Discarded.insert(D.Discarded.end(), KeptBits.begin(), KeptBits.end());
  for (uint32_t Q = 0; Q < C.NumQubits; ++Q)
    if (C.role(Q) == ir::WireRole::Ancilla)
      D.Ancillas.push_back(Q);
  return true;
}

//===----------------------------------------------------------------------===//
// Sparse simulation of a dilation
//===----------------------------------------------------------------------===//

/// The nonzero amplitudes of a state, by basis index. Circuits that keep
/// basis states basis states (the reversible part of most synthesised
/// circuits) keep states of one or a few entries.
using State = std::vector<std::pair<uint64_t, Amp>>;

/// Amplitudes below this magnitude squared are round-off and dropped.
constexpr double DroppedNorm = 1e-30;

/// A matrix prepared for the kernel: monomial matrices move entries.
struct Kernel {
  bool Monomial = true;
  std::vector<uint32_t> Image; // column j -> its only nonzero row
  std::vector<Amp> Factor;     // that entry
};

Kernel kernelOf(const ir::Matrix &U) {
  Kernel K;
  for (int64_t J = 0; J < U.cols() && K.Monomial; ++J) {
    int64_t Row = -1;
    for (int64_t R = 0; R < U.rows(); ++R)
      if (std::norm(U(R, J)) > 1e-24) {
        K.Monomial = Row < 0;
        Row = R;
      }
    if (Row < 0)
      K.Monomial = false;
    if (K.Monomial) {
      K.Image.push_back(uint32_t(Row));
      K.Factor.push_back(U(Row, J));
    }
  }
  return K;
}

uint64_t scatter(uint64_t Local, llvm::ArrayRef<uint32_t> Wires) {
  uint64_t Out = 0;
  for (size_t T = 0; T < Wires.size(); ++T)
    if (Local >> T & 1)
      Out |= uint64_t(1) << Wires[T];
  return Out;
}

uint64_t gather(uint64_t I, llvm::ArrayRef<uint32_t> Wires) {
  uint64_t Out = 0;
  for (size_t K = 0; K < Wires.size(); ++K)
    Out |= (I >> Wires[K] & 1) << K;
  return Out;
}

/// Runs dilations on sparse states, counting the work.
class Simulator {
public:
  Simulator(const Dilation &D, uint64_t MaxEntries)
      : D(D), MaxEntries(MaxEntries) {
    for (const ir::Matrix &U : D.Matrices)
      Kernels.push_back(kernelOf(U));
  }

  /// The output for an input given as amplitudes of basis inputs; false
  /// when a state outgrew MaxEntries.
  bool run(const std::vector<std::pair<uint64_t, Amp>> &Input, State &Psi) {
    Psi.clear();
    for (const auto &[X, A] : Input)
      Psi.push_back({scatter(X, D.InputWires), A});
    for (const Step &St : D.Steps) {
      Work += Psi.size();
      if (!apply(St, Psi))
        return false;
    }
    return true;
  }

  uint64_t Work = 0;

private:
  bool apply(const Step &St, State &Psi) {
    auto Runs = [&](uint64_t I) {
      return (I & St.CtrlMask) == St.CtrlValue;
    };
    switch (St.K) {
    case Step::Kind::Swap: {
      uint64_t A = uint64_t(1) << St.Wires[0], B = uint64_t(1) << St.Wires[1];
      for (auto &E : Psi)
        if (Runs(E.first) && bool(E.first & A) != bool(E.first & B))
          E.first ^= A | B;
      return true;
    }
    case Step::Kind::Copy: {
      uint64_t From = uint64_t(1) << St.Wires[0];
      uint64_t To = uint64_t(1) << St.Wires[1];
      for (auto &E : Psi)
        if (Runs(E.first) && (E.first & From))
          E.first ^= To;
      return true;
    }
    case Step::Kind::Matrix:
      break;
    }
    const Kernel &K = Kernels[St.MatrixIndex];
    uint64_t Targets = scatter((uint64_t(1) << St.Wires.size()) - 1, St.Wires);
    if (K.Monomial) {
      for (auto &E : Psi) {
        if (!Runs(E.first))
          continue;
        uint64_t J = gather(E.first, St.Wires);
        E.first = (E.first & ~Targets) | scatter(K.Image[J], St.Wires);
        E.second *= K.Factor[J];
      }
      return true;
    }
    // A general matrix mixes the entries that differ only on its wires:
    // group them by the rest of the index, in order of first appearance.
    const ir::Matrix &U = D.Matrices[St.MatrixIndex];
    size_t Dim = size_t(1) << St.Wires.size();
    Slots.clear();
    Groups.clear();
    State Next;
    for (const auto &E : Psi) {
      if (!Runs(E.first)) {
        Next.push_back(E);
        continue;
      }
      auto [It, New] = Slots.try_emplace(E.first & ~Targets, Groups.size());
      if (New)
        Groups.push_back({E.first & ~Targets, std::vector<Amp>(Dim, Amp(0))});
      Groups[It->second].second[gather(E.first, St.Wires)] += E.second;
    }
    for (const auto &[Base, In] : Groups)
      for (size_t R = 0; R < Dim; ++R) {
        Amp Sum = 0;
        for (size_t J = 0; J < Dim; ++J)
          if (In[J] != Amp(0))
            Sum += U(int64_t(R), int64_t(J)) * In[J];
        if (std::norm(Sum) > DroppedNorm)
          Next.push_back({Base | scatter(R, St.Wires), Sum});
      }
    Work += Groups.size() * Dim * Dim;
    Psi = std::move(Next);
    return Psi.size() <= MaxEntries;
  }

  const Dilation &D;
  uint64_t MaxEntries;
  std::vector<Kernel> Kernels;
  llvm::DenseMap<uint64_t, size_t> Slots;
  std::vector<std::pair<uint64_t, std::vector<Amp>>> Groups;
};

/// Gram matrices of one input's output states: with M_A the output of A as
/// (kept value x discarded value), AA = M_A^dagger M_A, AB = M_A^dagger M_B.
struct Grams {
  CMatrix AA, AB, BB;
};

/// Entries grouped by kept value: kept value -> (discarded value, amp).
using ByKept =
    std::map<uint64_t, std::vector<std::pair<uint64_t, Amp>>>;

ByKept split(const Dilation &D, const State &Psi) {
  ByKept Out;
  for (const auto &[I, A] : Psi)
    Out[gather(I, D.Kept)].push_back({gather(I, D.Discarded), A});
  return Out;
}

void accumulate(CMatrix &G, const std::vector<std::pair<uint64_t, Amp>> &X,
                const std::vector<std::pair<uint64_t, Amp>> &Y) {
  for (const auto &[D, A] : X)
    for (const auto &[E, B] : Y)
      G(int64_t(D), int64_t(E)) += std::conj(A) * B;
}

Grams gramsOf(const Dilation &DA, const State &PA, const Dilation &DB,
              const State &PB) {
  int64_t NA = int64_t(1) << DA.Discarded.size();
  int64_t NB = int64_t(1) << DB.Discarded.size();
  Grams G{CMatrix::Zero(NA, NA), CMatrix::Zero(NA, NB), CMatrix::Zero(NB, NB)};
  ByKept SA = split(DA, PA), SB = split(DB, PB);
  for (const auto &[Kept, X] : SA) {
    accumulate(G.AA, X, X);
    auto It = SB.find(Kept);
    if (It != SB.end())
      accumulate(G.AB, X, It->second);
  }
  for (const auto &[Kept, Y] : SB)
    accumulate(G.BB, Y, Y);
  return G;
}

/// ||rho_A - rho_B||_F^2 from the Gram matrices of the same input.
double distance2(const Grams &G) {
  return G.AA.squaredNorm() - 2 * G.AB.squaredNorm() + G.BB.squaredNorm();
}

/// ||rho_A,xy - rho_B,xy||_F^2 for the off-diagonal block of inputs x, y.
double pairDistance2(const Grams &X, const Grams &Y) {
  double AA = (X.AA * Y.AA).trace().real();
  double BB = (X.BB * Y.BB).trace().real();
  double AB = (X.AB * Y.AB.adjoint()).trace().real();
  return AA - 2 * AB + BB;
}

std::vector<bool> bitsOf(uint64_t X, size_t Count) {
  std::vector<bool> Out(Count);
  for (size_t K = 0; K < Count; ++K)
    Out[K] = X >> K & 1;
  return Out;
}

double probabilityOfOne(const State &Psi, uint32_t Wire) {
  double P = 0;
  for (const auto &[I, A] : Psi)
    if (I >> Wire & 1)
      P += std::norm(A);
  return P;
}

/// Kept wires whose probability of reading 1 differs on this input.
std::vector<std::string> differingWires(const ir::Circuit &A,
                                        const Interface &I, const Dilation &DA,
                                        const State &PA, const Dilation &DB,
                                        const State &PB) {
  std::vector<std::string> Out;
  for (size_t K = 0; K < DA.Kept.size(); ++K)
    if (std::abs(probabilityOfOne(PA, DA.Kept[K]) -
                 probabilityOfOne(PB, DB.Kept[K])) > 1e-6)
      Out.push_back(K < I.KeptQubits.size()
                        ? A.qubitName(I.KeptQubits[K].first)
                        : A.clbitName(
                              I.KeptBits[K - I.KeptQubits.size()].first));
  return Out;
}

/// The largest probability that an ancilla reads 1 on this output.
double ancillaDirt(const Dilation &D, const State &Psi) {
  double Worst = 0;
  for (uint32_t Q : D.Ancillas)
    Worst = std::max(Worst, probabilityOfOne(Psi, Q));
  return Worst;
}

using Input = std::vector<std::pair<uint64_t, Amp>>;

/// Runs both sides on inputs and compares their kept outputs.
class Comparison {
public:
  Comparison(const ir::Circuit &A, const Interface &I, const Dilation &DA,
             const Dilation &DB, const EquivalenceOptions &Opts)
      : A(A), I(I), DA(DA), DB(DB), SimA(DA, Opts.MaxStateEntries),
        SimB(DB, Opts.MaxStateEntries), Tolerance(Opts.Tolerance) {}

  /// The Gram matrices of the outputs on `In`; sets `Differs` when the
  /// kept outputs differ, and records a witness for a basis input. False
  /// when a state grew too large.
  bool compare(const Input &In, std::optional<uint64_t> Basis, Grams &G,
               bool &Differs) {
    if (!SimA.run(In, PA) || !SimB.run(In, PB))
      return false;
    DirtA = std::max(DirtA, ancillaDirt(DA, PA));
    DirtB = std::max(DirtB, ancillaDirt(DB, PB));
    G = gramsOf(DA, PA, DB, PB);
    Differs = distance2(G) > Tolerance;
    if (Differs && Basis && !Witness) {
      EquivalenceWitness W;
      W.First = inputBits(A, I, bitsOf(*Basis, I.Inputs.size()));
      W.DifferingWires = differingWires(A, I, DA, PA, DB, PB);
      Witness = std::move(W);
    }
    return true;
  }

  /// Tries (|x> + |y>)/sqrt 2, then (|x> + i|y>)/sqrt 2.
  bool superposedWitness(uint64_t X, uint64_t Y) {
    for (Amp Phase : {Amp(1), Amp(0, 1)}) {
      Input In = {{X, Amp(std::sqrt(0.5))}, {Y, Phase * std::sqrt(0.5)}};
      Grams G;
      bool Differs = false;
      if (!compare(In, std::nullopt, G, Differs))
        return false;
      if (!Differs)
        continue;
      EquivalenceWitness W;
      W.First = inputBits(A, I, bitsOf(X, I.Inputs.size()));
      W.Second = inputBits(A, I, bitsOf(Y, I.Inputs.size()));
      W.Phase = Phase == Amp(1) ? "1" : "i";
      Witness = std::move(W);
      return true;
    }
    return false;
  }

  uint64_t work() const { return SimA.Work + SimB.Work; }

  std::optional<EquivalenceWitness> Witness;
  double DirtA = 0, DirtB = 0;

private:
  const ir::Circuit &A;
  const Interface &I;
  const Dilation &DA, &DB;
  Simulator SimA, SimB;
  State PA, PB;
  double Tolerance;
};

std::optional<bool> cleanVerdict(const Dilation &D, double Dirt, bool Proof,
                                 double Tolerance) {
  if (D.Ancillas.empty())
    return std::nullopt;
  if (Dirt > Tolerance)
    return false;
  if (Proof)
    return true;
  return std::nullopt;
}

} // namespace

Attempt compareStates(const ir::Circuit &A, const ir::Circuit &B,
                      const Interface &I, const EquivalenceOptions &Opts,
                      bool Random) {
  Attempt Out;
  unsigned Inputs = unsigned(I.Inputs.size());
  if (!Random && Inputs > Opts.MaxExactInputs) {
    Out.WhyNot = fmt::format("{} inputs exceed the limit of {} for running "
                             "every basis input",
                             Inputs, Opts.MaxExactInputs);
    return Out;
  }
  Dilation DA, DB;
  std::string Why;
  if (!dilateSide(A, I, false, Opts, DA, Why)) {
    Out.WhyNot = "reference: " + Why;
    return Out;
  }
  if (!dilateSide(B, I, true, Opts, DB, Why)) {
    Out.WhyNot = "candidate: " + Why;
    return Out;
  }
  unsigned Widest = std::max(DA.Wires, DB.Wires);
  if (Widest > 64) {
    Out.WhyNot = fmt::format("{} wires with resets and measurements dilated "
                             "exceed the limit of 64",
                             Widest);
    return Out;
  }
  size_t Discarded = std::max(DA.Discarded.size(), DB.Discarded.size());
  if (Discarded > Opts.MaxDiscardedWires) {
    Out.WhyNot = fmt::format("{} discarded wires (ancillas, garbage, one per "
                             "reset or overwrite, and the dephased kept bits) "
                             "exceed the limit of {}",
                             Discarded, Opts.MaxDiscardedWires);
    return Out;
  }
  uint64_t Runs = Random ? Opts.Trials : uint64_t(1) << Inputs;
  uint64_t MaxWork = Random ? Opts.MaxRandomWork : Opts.MaxExactWork;
  // Every run touches every step at least once.
  double Least = double(Runs) * double(DA.Steps.size() + DB.Steps.size());
  if (Least > double(MaxWork)) {
    Out.WhyNot = fmt::format("{} runs of {} steps exceed the budget of {:.3g} "
                             "amplitude updates",
                             Runs, DA.Steps.size() + DB.Steps.size(),
                             double(MaxWork));
    return Out;
  }
  auto OverBudget = [&](const Comparison &Cmp, uint64_t Done) {
    return fmt::format("the budget of {:.3g} amplitude updates ran out after "
                       "{} of {} runs ({:.3g} used)",
                       double(MaxWork), Done, Runs, double(Cmp.work()));
  };
  auto TooLarge = [&](uint64_t Done) {
    return fmt::format("a state grew past {} amplitudes (run {} of {})",
                       Opts.MaxStateEntries, Done + 1, Runs);
  };

  EquivalenceResult R;
  Comparison Cmp(A, I, DA, DB, Opts);
  if (!Random) {
    R.Method = EquivalenceMethod::Exact;
    R.Reason = fmt::format("every basis input run ({} inputs, {} and {} "
                           "wires with resets and measurements dilated)",
                           Inputs, DA.Wires, DB.Wires);
    uint64_t GramEntries = (uint64_t(1) << DA.Discarded.size()) +
                           (uint64_t(1) << DB.Discarded.size());
    GramEntries *= GramEntries;
    bool KeepGrams = 16 * GramEntries <= MaxWitnessBytes >> Inputs;
    std::vector<Grams> PerInput;
    CMatrix TAA, TAB, TBB;
    bool Differs = false;
    for (uint64_t X = 0; X < Runs && !Differs; ++X) {
      Grams G;
      if (!Cmp.compare({{X, Amp(1)}}, X, G, Differs)) {
        Out.WhyNot = TooLarge(X);
        return Out;
      }
      if (Cmp.work() > MaxWork) {
        Out.WhyNot = OverBudget(Cmp, X + 1);
        return Out;
      }
      if (X == 0) {
        TAA = G.AA;
        TAB = G.AB;
        TBB = G.BB;
      } else {
        TAA += G.AA;
        TAB += G.AB;
        TBB += G.BB;
      }
      if (KeepGrams)
        PerInput.push_back(std::move(G));
    }
    if (!Differs) {
      double Choi =
          TAA.squaredNorm() - 2 * TAB.squaredNorm() + TBB.squaredNorm();
      double Scale = std::ldexp(1.0, int(2 * Inputs));
      Differs = Choi > std::max(Opts.Tolerance, ChoiRoundOff * Scale);
      if (Differs) {
        // Equal on every basis input: the difference is in relative
        // phases between inputs. Find a pair that shows it.
        bool Found = false;
        for (uint64_t X = 0; X < PerInput.size() && !Found; ++X)
          for (uint64_t Y = X + 1; Y < PerInput.size() && !Found; ++Y)
            if (pairDistance2(PerInput[X], PerInput[Y]) > Opts.Tolerance)
              Found = Cmp.superposedWitness(X, Y);
        R.Notes.push_back(
            "the circuits agree on every basis input and differ only on "
            "superpositions of inputs: a relative phase, or a discarded wire "
            "(a dirty ancilla, garbage) that holds information about the "
            "inputs");
        if (!Found)
          R.Notes.push_back("no two-state witness was located");
      }
    }
    R.Verdict = Differs ? EquivalenceVerdict::NotEquivalent
                        : EquivalenceVerdict::Equivalent;
    R.Witness = Cmp.Witness;
    R.AncillasCleanA = cleanVerdict(DA, Cmp.DirtA, true, Opts.Tolerance);
    R.AncillasCleanB = cleanVerdict(DB, Cmp.DirtB, true, Opts.Tolerance);
    Out.Result = std::move(R);
    return Out;
  }

  // Random inputs: first basis states, which bound the chance of a miss,
  // then superpositions of a few basis states with complex Gaussian
  // amplitudes, which also see relative phases between them.
  R.Method = EquivalenceMethod::Random;
  std::mt19937_64 Rng(Opts.Seed);
  std::normal_distribution<double> Gauss;
  uint64_t Mask = Inputs >= 64 ? ~uint64_t(0) : (uint64_t(1) << Inputs) - 1;
  uint64_t BasisTrials = (uint64_t(Opts.Trials) + 1) / 2;
  bool Differs = false;
  uint64_t Ran = 0, BasisRan = 0;
  for (uint64_t T = 0; T < Opts.Trials && !Differs; ++T) {
    Input In;
    std::optional<uint64_t> Basis;
    if (T < BasisTrials) {
      Basis = Rng() & Mask;
      In.push_back({*Basis, Amp(1)});
    } else {
      for (unsigned K = 0; K < SuperposedInputs; ++K) {
        uint64_t X = Rng() & Mask;
        Amp V(Gauss(Rng), Gauss(Rng));
        bool Merged = false;
        for (auto &E : In)
          if (E.first == X) {
            E.second += V;
            Merged = true;
          }
        if (!Merged)
          In.push_back({X, V});
      }
      double Norm = 0;
      for (const auto &E : In)
        Norm += std::norm(E.second);
      for (auto &E : In)
        E.second /= std::sqrt(Norm);
    }
    Grams G;
    if (!Cmp.compare(In, Basis, G, Differs)) {
      Out.WhyNot = TooLarge(T);
      return Out;
    }
    ++Ran;
    BasisRan += Basis.has_value();
    if (Cmp.work() > MaxWork && !Differs) {
      Out.WhyNot = OverBudget(Cmp, T + 1);
      return Out;
    }
  }
  R.Trials = Ran;
  R.StatedFraction = Opts.StatedFraction;
  R.MissChance = std::pow(1 - Opts.StatedFraction, double(BasisRan));
  if (Differs) {
    R.Verdict = EquivalenceVerdict::NotEquivalent;
    R.Witness = Cmp.Witness;
    R.Reason = fmt::format("random trial {} of {} found a difference", Ran,
                           Opts.Trials);
    if (!R.Witness)
      R.Notes.push_back(fmt::format(
          "the difference showed on a random superposition of {} basis "
          "inputs (seed {}); no basis witness was located",
          SuperposedInputs, Opts.Seed));
  } else {
    R.Verdict = EquivalenceVerdict::Unknown;
    R.Reason = fmt::format(
        "no difference in {} random trials ({} basis inputs, {} random "
        "superpositions); a difference on at least {:g}% of the basis inputs "
        "would have gone unseen with chance at most {:.3g}",
        Ran, BasisRan, Ran - BasisRan, 100 * Opts.StatedFraction,
        R.MissChance);
  }
  R.AncillasCleanA = cleanVerdict(DA, Cmp.DirtA, false, Opts.Tolerance);
  R.AncillasCleanB = cleanVerdict(DB, Cmp.DirtB, false, Opts.Tolerance);
  Out.Result = std::move(R);
  return Out;
}

} // namespace revbound::semantics::equivalence
