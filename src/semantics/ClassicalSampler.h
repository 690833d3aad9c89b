//===- ClassicalSampler.h - Bit-parallel simulation of random inputs ------===//
//
// Internal to the classical engine. Every wire holds 64-bit words, one
// random input per bit lane, so one pass simulates 64 inputs per word.
// The classical engine runs it twice over:
//  - first, on a few words, to find dirty ancillas fast: a lane that ends
//    with an ancilla at 1 is a counterexample as long as no step made a
//    superposition (then every lane is a real run of the circuit);
//  - as the fallback when the BDDs outgrow their limits, on Opts.Samples
//    inputs: the erased entropies become plug-in estimates beside honest
//    [0, 1] intervals.
// Beside the words it propagates known constant values (as basis values,
// independent of the samples), so the fallback still proves what constant
// propagation proves: resets of known values and clean ancillas.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SEMANTICS_CLASSICALSAMPLER_H
#define REVBOUND_SEMANTICS_CLASSICALSAMPLER_H

#include "ClassicalSteps.h"
#include "EngineSupport.h"

#include "revbound/semantics/Ledger.h"

#include "llvm/ADT/SmallVector.h"

#include <algorithm>
#include <cstdint>
#include <optional>
#include <unordered_map>
#include <utility>
#include <vector>

namespace revbound::semantics::classical {

/// Plug-in (maximum-likelihood) estimate of the joint Shannon entropy of
/// the given wires over the first `Lanes` lanes of their words.
inline double patternEntropy(llvm::ArrayRef<const uint64_t *> Wires,
                             uint64_t Lanes) {
  if (Lanes == 0 || Wires.empty())
    return 0;
  // Past 64 wires a pattern is keyed by the XOR of per-wire random salts.
  std::vector<uint64_t> Salt;
  if (Wires.size() > 64) {
    SplitMix64 Rng(0x5a17);
    for (size_t I = 0; I < Wires.size(); ++I)
      Salt.push_back(Rng.next());
  }
  std::unordered_map<uint64_t, uint64_t> Counts;
  for (uint64_t L = 0; L < Lanes; ++L) {
    uint64_t Word = L / 64, Shift = L % 64, Key = 0;
    for (size_t I = 0; I < Wires.size(); ++I) {
      uint64_t Bit = Wires[I][Word] >> Shift & 1;
      if (Salt.empty())
        Key |= Bit << I;
      else if (Bit)
        Key ^= Salt[I];
    }
    ++Counts[Key];
  }
  std::vector<double> Weights;
  Weights.reserve(Counts.size());
  for (const auto &[Key, N] : Counts)
    Weights.push_back(double(N));
  return shannonEntropy(Weights);
}

/// Bit-parallel simulation of `Lanes` random inputs (see the file comment).
/// Known values: -1 unknown, 0 or 1 proved for every input.
class WordSimulation {
public:
  /// `Record` asks for erasure events with estimates (the fallback); the
  /// counterexample search leaves it off.
  WordSimulation(const ir::Circuit &C, uint64_t Lanes, uint64_t Seed,
                 bool Record)
      : C(C), Words(unsigned((Lanes + 63) / 64)), Lanes(Lanes),
        Record(Record), Rng(Seed), Q(size_t(C.NumQubits) * Words, 0),
        B(size_t(C.NumClbits) * Words, 0), KnownQ(C.NumQubits, 0),
        KnownB(C.NumClbits, 0), Guard(Words, ~uint64_t(0)) {
    Inputs = inputQubits(C);
    InputWords.reserve(Inputs.size() * Words);
    for (uint32_t In : Inputs) {
      KnownQ[In] = -1;
      for (unsigned W = 0; W < Words; ++W) {
        uint64_t R = Rng.next();
        qubit(In)[W] = R;
        InputWords.push_back(R);
      }
    }
  }

  // The walk interface of walkCircuit.
  bool stopped() const { return false; }

  void setCondition(const ir::Condition *Cond) {
    Guarded = Cond != nullptr;
    GuardBits.clear();
    if (!Guarded)
      return;
    GuardBits = conditionBits(C, *Cond);
    GuardKnown = Cond->Unsatisfiable ? 0 : 1;
    std::fill(Guard.begin(), Guard.end(),
              Cond->Unsatisfiable ? 0 : ~uint64_t(0));
    for (size_t I = 0; I < GuardBits.size(); ++I) {
      bool Want = I < Cond->Value.getBitWidth() && Cond->Value[unsigned(I)];
      int8_t K = KnownB[GuardBits[I]];
      if (K >= 0 && bool(K) != Want)
        GuardKnown = 0;
      else if (K < 0 && GuardKnown == 1)
        GuardKnown = -1;
      const uint64_t *Bits = bit(GuardBits[I]);
      for (unsigned W = 0; W < Words; ++W)
        Guard[W] &= Want ? Bits[W] : ~Bits[W];
    }
  }

  void step(const GateStep &S, const BasisAction &A) {
    if (Guarded && GuardKnown == 0)
      return;
    llvm::SmallVector<int8_t, 8> Old, New;
    for (uint32_t Qb : S.Qubits)
      Old.push_back(KnownQ[Qb]);
    New = Old;
    switch (A.K) {
    case BasisAction::Kind::Identity:
      return;
    case BasisAction::Kind::Flip:
      flip(S, A, Old, New);
      break;
    case BasisAction::Kind::Relabel:
      relabel(S, A, Old, New);
      break;
    case BasisAction::Kind::Table:
      table(S, A, Old, New);
      break;
    case BasisAction::Kind::Fresh:
      if (A.Changed.empty())
        return;
      ++FreshGates;
      for (uint32_t I : A.Changed) {
        uint64_t *Wire = qubit(S.Qubits[I]);
        for (unsigned W = 0; W < Words; ++W)
          Wire[W] = blend(W, Rng.next(), Wire[W]);
        New[I] = -1;
      }
      break;
    }
    for (size_t I = 0; I < S.Qubits.size(); ++I)
      KnownQ[S.Qubits[I]] = merged(Old[I], New[I]);
  }

  void reset(uint32_t Qb, const ir::Op &O) {
    if (Guarded && GuardKnown == 0)
      return; // provably never runs: no operation, no event
    uint64_t *Wire = qubit(Qb);
    if (Record) {
      ErasureEvent E = event(ErasureKind::Reset, Qb, O, KnownQ[Qb] >= 0);
      if (E.Status == ErasureStatus::Unknown) {
        std::vector<uint64_t> After(Wire, Wire + Words);
        for (unsigned W = 0; W < Words; ++W)
          After[W] = blend(W, 0, Wire[W]);
        E.BitsEstimate = guardedChange(Wire, After.data(), nullptr);
      }
      Events.push_back(E);
    }
    for (unsigned W = 0; W < Words; ++W)
      Wire[W] = blend(W, 0, Wire[W]);
    KnownQ[Qb] = merged(KnownQ[Qb], 0);
  }

  void measure(uint32_t Qb, uint32_t Cb, const ir::Op &O) {
    if (Guarded && GuardKnown == 0)
      return;
    uint64_t *Src = qubit(Qb), *Dst = bit(Cb);
    if (Record && KnownB[Cb] < 0) {
      ErasureEvent E = event(ErasureKind::Overwrite, Cb, O, false);
      std::vector<uint64_t> After(Dst, Dst + Words);
      for (unsigned W = 0; W < Words; ++W)
        After[W] = blend(W, Src[W], Dst[W]);
      E.BitsEstimate = guardedChange(Dst, After.data(), Src);
      Events.push_back(E);
    }
    for (unsigned W = 0; W < Words; ++W)
      Dst[W] = blend(W, Src[W], Dst[W]);
    KnownB[Cb] = merged(KnownB[Cb], KnownQ[Qb]);
  }

  // Results.
  uint64_t lanes() const { return Lanes; }
  uint64_t freshGates() const { return FreshGates; }
  int8_t known(uint32_t Qb) const { return KnownQ[Qb]; }
  uint64_t ones(uint32_t Qb) const {
    const uint64_t *Wire = words(Qb);
    uint64_t N = 0;
    for (unsigned W = 0; W < Words; ++W)
      N += uint64_t(__builtin_popcountll(Wire[W] & laneMask(W)));
    return N;
  }
  const uint64_t *words(uint32_t Qb) const {
    return Q.data() + size_t(Qb) * Words;
  }
  /// The first lane where qubit `Qb` ends at 1.
  std::optional<uint64_t> firstOne(uint32_t Qb) const {
    const uint64_t *Wire = words(Qb);
    for (unsigned W = 0; W < Words; ++W)
      if (uint64_t M = Wire[W] & laneMask(W))
        return uint64_t(W) * 64 + uint64_t(__builtin_ctzll(M));
    return std::nullopt;
  }
  /// The input values of lane `L`, every input qubit in index order.
  std::vector<std::pair<uint32_t, bool>> inputsOfLane(uint64_t L) const {
    std::vector<std::pair<uint32_t, bool>> Out;
    for (size_t I = 0; I < Inputs.size(); ++I)
      Out.push_back({Inputs[I],
                     bool(InputWords[I * Words + L / 64] >> (L % 64) & 1)});
    return Out;
  }

  /// Resets and overwrites in program order (when recording).
  std::vector<ErasureEvent> Events;

private:
  uint64_t *qubit(uint32_t Qb) { return Q.data() + size_t(Qb) * Words; }
  uint64_t *bit(uint32_t Cb) { return B.data() + size_t(Cb) * Words; }
  uint64_t laneMask(unsigned W) const {
    uint64_t Rest = Lanes - uint64_t(W) * 64;
    return Rest >= 64 ? ~uint64_t(0) : (uint64_t(1) << Rest) - 1;
  }
  /// The new value where the condition holds, the old one elsewhere.
  uint64_t blend(unsigned W, uint64_t New, uint64_t Old) const {
    if (!Guarded)
      return New;
    return (Guard[W] & New) | (~Guard[W] & Old);
  }
  /// A written wire's known value: under a condition of unknown outcome it
  /// stays known only when both outcomes agree.
  int8_t merged(int8_t Old, int8_t New) const {
    if (!Guarded || GuardKnown == 1)
      return New;
    if (GuardKnown == 0)
      return Old;
    return Old == New ? Old : int8_t(-1);
  }

  void flip(const GateStep &S, const BasisAction &A,
            llvm::ArrayRef<int8_t> Old, llvm::SmallVectorImpl<int8_t> &New) {
    uint64_t *T = qubit(S.Qubits[A.Target]);
    for (unsigned W = 0; W < Words; ++W) {
      uint64_t Ctrl = Guarded ? Guard[W] : ~uint64_t(0);
      for (unsigned I = 0; I < A.Arity; ++I)
        if (A.ControlMask >> I & 1) {
          uint64_t V = qubit(S.Qubits[I])[W];
          Ctrl &= (A.ControlValue >> I & 1) ? V : ~V;
        }
      T[W] ^= Ctrl;
    }
    int Fires = 1; // 1 always, 0 never, -1 depends on the input
    for (unsigned I = 0; I < A.Arity && Fires != 0; ++I)
      if (A.ControlMask >> I & 1) {
        if (Old[I] < 0)
          Fires = -1;
        else if (bool(Old[I]) != bool(A.ControlValue >> I & 1))
          Fires = 0;
      }
    if (Fires == 1 && Old[A.Target] >= 0)
      New[A.Target] = int8_t(1 - Old[A.Target]);
    else if (Fires != 0)
      New[A.Target] = -1;
  }

  void relabel(const GateStep &S, const BasisAction &A,
               llvm::ArrayRef<int8_t> Old, llvm::SmallVectorImpl<int8_t> &New) {
    std::vector<uint64_t> Before;
    for (uint32_t Qb : S.Qubits)
      Before.insert(Before.end(), qubit(Qb), qubit(Qb) + Words);
    for (unsigned I = 0; I < A.Arity; ++I) {
      uint64_t *To = qubit(S.Qubits[A.Dest[I]]);
      for (unsigned W = 0; W < Words; ++W)
        To[W] = blend(W, Before[size_t(I) * Words + W],
                      Before[size_t(A.Dest[I]) * Words + W]);
      New[A.Dest[I]] = Old[I];
    }
  }

  void table(const GateStep &S, const BasisAction &A,
             llvm::ArrayRef<int8_t> Old, llvm::SmallVectorImpl<int8_t> &New) {
    unsigned K = A.Arity;
    llvm::SmallVector<uint64_t, 8> In(K), Out(K);
    for (unsigned W = 0; W < Words; ++W) {
      for (unsigned I = 0; I < K; ++I)
        In[I] = qubit(S.Qubits[I])[W];
      std::fill(Out.begin(), Out.end(), 0);
      for (uint32_t J = 0; J < A.Perm.size(); ++J) {
        uint64_t Minterm = ~uint64_t(0);
        for (unsigned I = 0; I < K; ++I)
          Minterm &= (J >> I & 1) ? In[I] : ~In[I];
        for (unsigned I = 0; I < K; ++I)
          if (A.Perm[J] >> I & 1)
            Out[I] |= Minterm;
      }
      for (unsigned I = 0; I < K; ++I)
        if (A.Written >> I & 1)
          qubit(S.Qubits[I])[W] = blend(W, Out[I], In[I]);
    }
    bool AllKnown = std::all_of(Old.begin(), Old.end(),
                                [](int8_t V) { return V >= 0; });
    uint32_t J = 0;
    for (unsigned I = 0; I < K && AllKnown; ++I)
      J |= uint32_t(Old[I]) << I;
    for (unsigned I = 0; I < K; ++I)
      if (A.Written >> I & 1)
        New[I] = AllKnown ? int8_t(A.Perm[J] >> I & 1) : int8_t(-1);
  }

  ErasureEvent event(ErasureKind Kind, uint32_t Wire, const ir::Op &O,
                     bool Constant) const {
    ErasureEvent E;
    E.Kind = Kind;
    E.Wire = Wire;
    E.Loc = O.Loc;
    if (Constant) {
      E.Status = ErasureStatus::Constant;
      E.BitsLow = E.BitsHigh = 0;
      return E;
    }
    E.Status = ErasureStatus::Unknown;
    E.BitsLow = 0;
    E.BitsHigh = 1;
    E.Samples = Lanes;
    return E;
  }

  /// Estimate of max(0, H(A before) - H(A after)) when one wire of A goes
  /// from `Before` to `After`; A is that wire, `Extra` (the measured qubit)
  /// when given, and the condition's bits.
  double guardedChange(const uint64_t *Before, const uint64_t *After,
                       const uint64_t *Extra) const {
    llvm::SmallVector<const uint64_t *, 8> A{Before}, Z{After};
    if (Extra) {
      A.push_back(Extra);
      Z.push_back(Extra);
    }
    for (uint32_t Cb : GuardBits) {
      const uint64_t *Bits = B.data() + size_t(Cb) * Words;
      if (Bits == Before)
        continue; // the overwritten bit is A's first wire already
      A.push_back(Bits);
      Z.push_back(Bits);
    }
    return clampBits(patternEntropy(A, Lanes) - patternEntropy(Z, Lanes), 1);
  }

  const ir::Circuit &C;
  unsigned Words;
  uint64_t Lanes;
  bool Record;
  SplitMix64 Rng;
  std::vector<uint64_t> Q, B; // by wire, then word
  std::vector<int8_t> KnownQ, KnownB;
  std::vector<uint32_t> Inputs;
  std::vector<uint64_t> InputWords; // by input index, then word
  uint64_t FreshGates = 0;
  bool Guarded = false;
  int8_t GuardKnown = 1; // 1 holds, 0 fails, -1 depends on the input
  std::vector<uint64_t> Guard;
  std::vector<uint32_t> GuardBits;
};

} // namespace revbound::semantics::classical

#endif
