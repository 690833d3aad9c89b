//===- EngineSupport.cpp - What every semantic engine needs ---------------===//
#include "EngineSupport.h"

#include <algorithm>
#include <cmath>

namespace revbound::semantics {

double binaryEntropy(double P) {
  if (!(P > 0) || !(P < 1))
    return 0;
  return -P * std::log2(P) - (1 - P) * std::log2(1 - P);
}

double shannonEntropy(const std::vector<double> &Weights) {
  double Sum = 0;
  for (double W : Weights)
    Sum += W > 0 ? W : 0;
  if (!(Sum > 0))
    return 0;
  double H = 0;
  for (double W : Weights)
    if (W > 0)
      H -= W / Sum * std::log2(W / Sum);
  return H;
}

double clampBits(double Bits, double MaxBits) {
  if (!(Bits > WholeBitsTolerance))
    return 0;
  // Entropies are sums of many terms; a uniformly random bit comes out as
  // 0.9999999999999999 as often as 1. No figure is that precise, so values
  // this close to a whole number of bits are that number.
  double Whole = std::round(Bits);
  if (std::abs(Bits - Whole) <= WholeBitsTolerance * std::max(1.0, Whole))
    Bits = Whole;
  return std::min(Bits, MaxBits);
}

std::vector<llvm::SMLoc> lastUses(const ir::Circuit &C) {
  std::vector<llvm::SMLoc> Last(C.NumQubits);
  for (uint32_t Q = 0; Q < C.NumQubits; ++Q)
    Last[Q] = C.roleLoc(Q);
  for (const ir::Op &O : C.Ops) {
    if (O.Kind == ir::OpKind::Barrier)
      continue;
    llvm::ArrayRef<uint32_t> W = C.wires(O);
    if (O.Kind == ir::OpKind::Measure)
      W = W.take_front(1);
    for (uint32_t Q : W)
      Last[Q] = O.Loc;
  }
  return Last;
}

bool canErase(const ir::Circuit &C) {
  if (!discardedQubits(C).empty())
    return true;
  std::vector<bool> Written(C.NumClbits, false);
  for (const ir::Op &O : C.Ops) {
    if (O.Kind == ir::OpKind::Reset)
      return true;
    if (O.Kind != ir::OpKind::Measure)
      continue;
    uint32_t Bit = C.wires(O)[1];
    if (Written[Bit])
      return true;
    Written[Bit] = true;
  }
  return false;
}

std::vector<uint32_t> discardedQubits(const ir::Circuit &C) {
  std::vector<uint32_t> Out;
  for (uint32_t Q = 0; Q < C.NumQubits; ++Q)
    if (ir::isDiscarded(C.role(Q)))
      Out.push_back(Q);
  return Out;
}

std::vector<uint32_t> inputQubits(const ir::Circuit &C) {
  std::vector<uint32_t> Out;
  for (uint32_t Q = 0; Q < C.NumQubits; ++Q)
    if (C.role(Q) == ir::WireRole::Input)
      Out.push_back(Q);
  return Out;
}

std::vector<uint32_t> conditionBits(const ir::Circuit &C,
                                    const ir::Condition &Cond) {
  const ir::Register &R = C.CRegs[Cond.CReg];
  std::vector<uint32_t> Out;
  for (uint32_t I = 0; I < R.Size; ++I)
    Out.push_back(R.Offset + I);
  return Out;
}

ErasureEvent discardEvent(uint32_t Q, llvm::SMLoc Loc, ErasureStatus Status,
                          double Low, double High) {
  ErasureEvent E;
  E.Kind = ErasureKind::Discard;
  E.Wire = Q;
  E.Loc = Loc;
  E.Status = Status;
  E.BitsLow = Low;
  E.BitsHigh = High;
  return E;
}

} // namespace revbound::semantics
