//===- Circuit.cpp - The hierarchical circuit IR -------------------------===//
#include "revbound/ir/Circuit.h"

#include <cstring>
#include <fmt/format.h>

namespace revbound::ir {

Circuit::Circuit() {
  // The two built-in gates of OpenQASM 2.0 (specification, section 3).
  GateDef U;
  U.Name = "U";
  U.Origin = GateOrigin::Builtin;
  U.ParamNames = {"theta", "phi", "lambda"};
  U.QubitNames = {"q"};
  GateDef CX;
  CX.Name = "CX";
  CX.Origin = GateOrigin::Builtin;
  CX.QubitNames = {"c", "t"};
  Gates.push_back(std::move(U));
  Gates.push_back(std::move(CX));
  GateByName["U"] = UGate;
  GateByName["CX"] = CXGate;
}

static std::string wireName(const std::vector<Register> &Regs, uint32_t W) {
  for (const Register &R : Regs)
    if (W >= R.Offset && W < R.Offset + R.Size)
      return fmt::format("{}[{}]", R.Name, W - R.Offset);
  return fmt::format("?[{}]", W);
}

std::string callKey(GateId G, llvm::ArrayRef<double> Params) {
  std::string Key(sizeof(G) + Params.size() * sizeof(double), '\0');
  std::memcpy(Key.data(), &G, sizeof(G));
  if (!Params.empty())
    std::memcpy(Key.data() + sizeof(G), Params.data(),
                Params.size() * sizeof(double));
  return Key;
}

const char *wireRoleName(WireRole R) {
  switch (R) {
  case WireRole::Output:
    return "output";
  case WireRole::Input:
    return "input";
  case WireRole::Ancilla:
    return "ancilla";
  case WireRole::Garbage:
    return "garbage";
  }
  return "output";
}

std::optional<WireRole> parseWireRole(llvm::StringRef Name) {
  for (WireRole R : {WireRole::Output, WireRole::Input, WireRole::Ancilla,
                     WireRole::Garbage})
    if (Name == wireRoleName(R))
      return R;
  return std::nullopt;
}

std::string Circuit::qubitName(uint32_t Q) const { return wireName(QRegs, Q); }
std::string Circuit::clbitName(uint32_t C) const { return wireName(CRegs, C); }

std::vector<std::pair<std::string, std::string>>
Circuit::inputRegisterBits(const std::vector<bool> &ValueByQubit) const {
  std::vector<std::pair<std::string, std::string>> Out;
  for (const Register &R : QRegs) {
    bool AnyInput = false;
    std::string Bits(R.Size, '0');
    for (uint32_t K = 0; K < R.Size; ++K) {
      AnyInput |= role(R.Offset + K) == WireRole::Input;
      if (R.Offset + K < ValueByQubit.size() && ValueByQubit[R.Offset + K])
        Bits[R.Size - 1 - K] = '1';
    }
    if (AnyInput)
      Out.emplace_back(R.Name, std::move(Bits));
  }
  return Out;
}

} // namespace revbound::ir
