//===- ParamExpr.cpp - Gate-parameter expressions in compiled form -------===//
#include "revbound/ir/ParamExpr.h"

#include <cassert>
#include <cmath>
#include <fmt/format.h>
#include <numbers>

namespace revbound::ir {

double ParamExpr::evaluate(llvm::ArrayRef<double> Params) const {
  llvm::SmallVector<double, 8> Stack;
  for (const Instr &I : Code) {
    double B = 0;
    switch (I.Op) {
    case OpCode::Const:
      Stack.push_back(I.Value);
      continue;
    case OpCode::Param:
      Stack.push_back(I.Param < Params.size() ? Params[I.Param] : NAN);
      continue;
    case OpCode::Neg:
      Stack.back() = -Stack.back();
      continue;
    case OpCode::Sin: Stack.back() = std::sin(Stack.back()); continue;
    case OpCode::Cos: Stack.back() = std::cos(Stack.back()); continue;
    case OpCode::Tan: Stack.back() = std::tan(Stack.back()); continue;
    case OpCode::Exp: Stack.back() = std::exp(Stack.back()); continue;
    case OpCode::Ln: Stack.back() = std::log(Stack.back()); continue;
    case OpCode::Sqrt: Stack.back() = std::sqrt(Stack.back()); continue;
    case OpCode::Add:
    case OpCode::Sub:
    case OpCode::Mul:
    case OpCode::Div:
    case OpCode::Pow:
      B = Stack.pop_back_val();
      break;
    }
    double &A = Stack.back();
    switch (I.Op) {
    case OpCode::Add: A = A + B; break;
    case OpCode::Sub: A = A - B; break;
    case OpCode::Mul: A = A * B; break;
    case OpCode::Div: A = A / B; break;
    case OpCode::Pow: A = std::pow(A, B); break;
    default: break;
    }
  }
  assert(Stack.size() == 1 && "malformed parameter expression");
  return Stack.empty() ? NAN : Stack.back();
}

bool ParamExpr::isConstant() const {
  for (const Instr &I : Code)
    if (I.Op == OpCode::Param)
      return false;
  return true;
}

std::string ParamExpr::print(llvm::ArrayRef<std::string> ParamNames) const {
  llvm::SmallVector<std::string, 8> Stack;
  for (const Instr &I : Code) {
    auto unary = [&](const char *F) {
      Stack.back() = fmt::format("{}({})", F, Stack.back());
    };
    auto binary = [&](const char *Op) {
      std::string B = Stack.pop_back_val();
      Stack.back() = fmt::format("({}{}{})", Stack.back(), Op, B);
    };
    switch (I.Op) {
    case OpCode::Const:
      Stack.push_back(I.Value == std::numbers::pi ? std::string("pi")
                                                  : fmt::format("{}", I.Value));
      break;
    case OpCode::Param:
      Stack.push_back(I.Param < ParamNames.size() ? ParamNames[I.Param]
                                                  : std::string("?"));
      break;
    case OpCode::Neg: Stack.back() = "-" + Stack.back(); break;
    case OpCode::Add: binary("+"); break;
    case OpCode::Sub: binary("-"); break;
    case OpCode::Mul: binary("*"); break;
    case OpCode::Div: binary("/"); break;
    case OpCode::Pow: binary("^"); break;
    case OpCode::Sin: unary("sin"); break;
    case OpCode::Cos: unary("cos"); break;
    case OpCode::Tan: unary("tan"); break;
    case OpCode::Exp: unary("exp"); break;
    case OpCode::Ln: unary("ln"); break;
    case OpCode::Sqrt: unary("sqrt"); break;
    }
  }
  return Stack.empty() ? std::string() : Stack.back();
}

} // namespace revbound::ir
