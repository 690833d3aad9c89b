//===- Equivalence.cpp - The interface match and the choice of method -----===//
#include "EquivalenceSupport.h"

#include "revbound/semantics/Equivalence.h"

#include "llvm/ADT/StringMap.h"

#include <fmt/format.h>

namespace revbound::semantics {

const char *equivalenceVerdictName(EquivalenceVerdict V) {
  switch (V) {
  case EquivalenceVerdict::Equivalent:
    return "equivalent";
  case EquivalenceVerdict::NotEquivalent:
    return "not_equivalent";
  case EquivalenceVerdict::Unknown:
    return "unknown";
  }
  return "unknown";
}

const char *equivalenceMethodName(EquivalenceMethod M) {
  switch (M) {
  case EquivalenceMethod::None:
    return "none";
  case EquivalenceMethod::Exact:
    return "exact";
  case EquivalenceMethod::Bdd:
    return "bdd";
  case EquivalenceMethod::Random:
    return "random";
  }
  return "none";
}

namespace equivalence {
namespace {

llvm::Error mismatch(const std::string &Message) {
  return llvm::createStringError(llvm::inconvertibleErrorCode(),
                                 "interfaces differ: " + Message);
}

bool isKept(ir::WireRole R) { return !isDiscarded(R); }

/// Qubit names ("reg[i]") of the kept qubits, each with its qubit.
llvm::StringMap<uint32_t> keptByName(const ir::Circuit &C) {
  llvm::StringMap<uint32_t> Out;
  for (uint32_t Q = 0; Q < C.NumQubits; ++Q)
    if (isKept(C.role(Q)))
      Out[C.qubitName(Q)] = Q;
  return Out;
}

} // namespace

llvm::Expected<Interface> matchInterfaces(const ir::Circuit &A,
                                          const ir::Circuit &B) {
  Interface I;
  llvm::StringMap<uint32_t> KeptB = keptByName(B);
  for (uint32_t Q = 0; Q < A.NumQubits; ++Q) {
    ir::WireRole RA = A.role(Q);
    if (!isKept(RA))
      continue;
    std::string Name = A.qubitName(Q);
    auto It = KeptB.find(Name);
    if (It == KeptB.end())
      return mismatch(fmt::format(
          "{} {} of the reference is not a kept qubit (input or output) of "
          "the candidate",
          ir::wireRoleName(RA), Name));
    ir::WireRole RB = B.role(It->second);
    if (RA != RB)
      return mismatch(fmt::format("{} is {} in the reference but {} in the "
                                  "candidate",
                                  Name, ir::wireRoleName(RA),
                                  ir::wireRoleName(RB)));
    I.KeptQubits.push_back({Q, It->second});
    if (RA == ir::WireRole::Input)
      I.Inputs.push_back({Q, It->second});
    KeptB.erase(It);
  }
  if (!KeptB.empty()) {
    // Name the first left over in B's qubit order, for a stable message.
    uint32_t First = UINT32_MAX;
    for (const auto &E : KeptB)
      First = std::min(First, E.second);
    return mismatch(fmt::format(
        "{} {} of the candidate is not a kept qubit (input or output) of the "
        "reference",
        ir::wireRoleName(B.role(First)), B.qubitName(First)));
  }

  I.UnmatchedBitA.assign(A.NumClbits, true);
  I.UnmatchedBitB.assign(B.NumClbits, true);
  llvm::StringMap<const ir::Register *> RegsB;
  for (const ir::Register &R : B.CRegs)
    RegsB[R.Name] = &R;
  for (const ir::Register &R : A.CRegs) {
    auto It = RegsB.find(R.Name);
    if (It == RegsB.end()) {
      I.Notes.push_back(fmt::format(
          "classical register {} is only in the reference; not compared",
          R.Name));
      continue;
    }
    const ir::Register &RB = *It->second;
    if (RB.Size != R.Size)
      return mismatch(fmt::format("classical register {} has {} bits in the "
                                  "reference but {} in the candidate",
                                  R.Name, R.Size, RB.Size));
    for (uint32_t K = 0; K < R.Size; ++K) {
      I.KeptBits.push_back({R.Offset + K, RB.Offset + K});
      I.UnmatchedBitA[R.Offset + K] = false;
      I.UnmatchedBitB[RB.Offset + K] = false;
    }
    RegsB.erase(It);
  }
  for (const ir::Register &R : B.CRegs)
    if (RegsB.count(R.Name))
      I.Notes.push_back(fmt::format(
          "classical register {} is only in the candidate; not compared",
          R.Name));
  return I;
}

RegisterBits inputBits(const ir::Circuit &A, const Interface &I,
                       const std::vector<bool> &X) {
  std::vector<bool> Value(A.NumQubits, false);
  for (size_t K = 0; K < I.Inputs.size() && K < X.size(); ++K)
    Value[I.Inputs[K].first] = X[K];
  return A.inputRegisterBits(Value);
}

} // namespace equivalence

llvm::Expected<EquivalenceResult>
checkEquivalence(const ir::Circuit &A, const ir::Circuit &B,
                 const EquivalenceOptions &Opts) {
  using namespace equivalence;
  llvm::Expected<Interface> I = matchInterfaces(A, B);
  if (!I)
    return I.takeError();
  std::vector<std::string> WhyNot;
  auto Finish = [&](EquivalenceResult R) {
    R.Notes.insert(R.Notes.begin(), I->Notes.begin(), I->Notes.end());
    return R;
  };
  // Strongest first: the exact channel comparison sees relative phases;
  // BDDs scale to wide classical circuits; random trials prove nothing.
  Attempt Exact = compareStates(A, B, *I, Opts, /*Random=*/false);
  if (Exact.Result)
    return Finish(std::move(*Exact.Result));
  WhyNot.push_back("exact: " + Exact.WhyNot);
  Attempt Functions = compareFunctions(A, B, *I, Opts);
  if (Functions.Result) {
    Functions.Result->Reason += "; the exact method did not fit: " + Exact.WhyNot;
    return Finish(std::move(*Functions.Result));
  }
  WhyNot.push_back("bdd: " + Functions.WhyNot);
  Attempt Random = compareStates(A, B, *I, Opts, /*Random=*/true);
  if (Random.Result) {
    Random.Result->Reason = fmt::format("{}; {}", fmt::join(WhyNot, "; "),
                                        Random.Result->Reason);
    return Finish(std::move(*Random.Result));
  }
  WhyNot.push_back("random: " + Random.WhyNot);
  EquivalenceResult R;
  R.Verdict = EquivalenceVerdict::Unknown;
  R.Method = EquivalenceMethod::None;
  R.Reason = fmt::format("no method could decide: {}", fmt::join(WhyNot, "; "));
  return Finish(std::move(R));
}

} // namespace revbound::semantics
