//===- ParamExpr.h - Gate-parameter expressions in compiled form ---------===//
//
// Gate bodies keep their parameter expressions (`u1(lambda/2) b;`) so that a
// definition is analysed once per set of parameter values, not once per call
// site. An expression is a short postfix program over constants and the
// enclosing gate's parameters.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_IR_PARAMEXPR_H
#define REVBOUND_IR_PARAMEXPR_H

#include "llvm/ADT/ArrayRef.h"
#include "llvm/ADT/SmallVector.h"

#include <cstdint>
#include <string>

namespace revbound::ir {

class ParamExpr {
public:
  enum class OpCode : uint8_t {
    Const, Param, Neg, Add, Sub, Mul, Div, Pow, Sin, Cos, Tan, Exp, Ln, Sqrt
  };
  struct Instr {
    OpCode Op;
    uint32_t Param = 0; // for Param: index into the enclosing gate's parameters
    double Value = 0;   // for Const
  };

  /// Appends one instruction (postfix order).
  void push(Instr I) { Code.push_back(I); }
  /// Evaluates with the enclosing gate's parameter values. Division by zero
  /// and the like follow IEEE arithmetic; callers check isfinite.
  double evaluate(llvm::ArrayRef<double> Params) const;
  /// True when the value does not depend on any parameter.
  bool isConstant() const;
  /// Prints the expression with the parameter names given (for reports).
  std::string print(llvm::ArrayRef<std::string> ParamNames) const;

private:
  llvm::SmallVector<Instr, 4> Code;
};

} // namespace revbound::ir

#endif
