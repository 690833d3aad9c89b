//===- ExpressionTest.cpp - Parameter expressions and their precedence ----===//
//
// The specification's grammar lists the operators without precedence; the
// precedence here is the one docs/language.md states: ^ binds tightest and
// is right-associative (-2^2 = -4, 2^-1 = 0.5, 2^3^2 = 512), then unary
// minus, then * and /, then + and -, all binary ones but ^ left-associative
// (common practice in mathematics and in most programming languages).
//
//===----------------------------------------------------------------------===//
#include "TestSupport.h"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

using revbound::test::elaborate;

static std::vector<double> valuesOf(const std::string &Args) {
  revbound::test::Elaborated E =
      elaborate("OPENQASM 2.0;\nqreg q[1];\nU(" + Args + ") q[0];\n");
  EXPECT_EQ(E.Error, "");
  if (!E.Circuit)
    return {};
  return {E.Circuit->Params.begin(), E.Circuit->Params.end()};
}

TEST(Expression, PowerBindsTighterThanUnaryMinus) {
  EXPECT_EQ(valuesOf("-2^2, 2^-1, 2^3^2"), (std::vector<double>{-4, 0.5, 512}));
}

TEST(Expression, ArithmeticPrecedenceAndAssociativity) {
  EXPECT_EQ(valuesOf("1+2*3, (1+2)*3, 8/2/2"), (std::vector<double>{7, 9, 2}));
  EXPECT_EQ(valuesOf("1-2-3, -3*-2, 2*-3"), (std::vector<double>{-4, 6, -6}));
}

TEST(Expression, PiAndFunctions) {
  std::vector<double> V = valuesOf("sin(pi/2), ln(exp(2)), sqrt(16)");
  ASSERT_EQ(V.size(), 3u);
  EXPECT_DOUBLE_EQ(V[0], 1.0);
  EXPECT_DOUBLE_EQ(V[1], 2.0);
  EXPECT_DOUBLE_EQ(V[2], 4.0);
  V = valuesOf("cos(0), tan(pi/4), -pi/2*3");
  ASSERT_EQ(V.size(), 3u);
  EXPECT_DOUBLE_EQ(V[0], 1.0);
  EXPECT_NEAR(V[1], 1.0, 1e-15);
  EXPECT_DOUBLE_EQ(V[2], -3 * std::numbers::pi / 2);
}

TEST(Expression, ScientificNotation) {
  EXPECT_EQ(valuesOf("1e-5, 4.688447e-01, .25"),
            (std::vector<double>{1e-5, 4.688447e-01, 0.25}));
}

TEST(Expression, GateParametersInScope) {
  revbound::test::Elaborated E = elaborate(
      "OPENQASM 2.0;\n"
      "gate g(theta, lambda) a { U(theta/2, -lambda, theta*lambda) a; }\n"
      "qreg q[1];\ng(pi, 2) q[0];\n");
  ASSERT_TRUE(E.Circuit) << E.Error;
  const revbound::ir::GateDef &G =
      E.Circuit->gate(E.Circuit->GateByName.lookup("g"));
  ASSERT_EQ(G.Body.size(), 1u);
  const auto &P = G.Body[0].Params;
  ASSERT_EQ(P.size(), 3u);
  double Args[] = {std::numbers::pi, 2};
  EXPECT_DOUBLE_EQ(P[0].evaluate(Args), std::numbers::pi / 2);
  EXPECT_DOUBLE_EQ(P[1].evaluate(Args), -2);
  EXPECT_DOUBLE_EQ(P[2].evaluate(Args), 2 * std::numbers::pi);
  EXPECT_FALSE(P[0].isConstant());
}

TEST(Expression, UnknownFunctionAndDeepNesting) {
  EXPECT_EQ(elaborate("OPENQASM 2.0;\nqreg q[1];\nU(asin(1),0,0) q[0];\n").Error,
            "test.qasm:3:3: error: unknown function 'asin'; expected one of sin, "
            "cos, tan, exp, ln, sqrt\n"
            "U(asin(1),0,0) q[0];\n"
            "  ^~~~\n");
  std::string Deep(5000, '(');
  std::string Text = "OPENQASM 2.0;\nqreg q[1];\nU(" + Deep + "1";
  EXPECT_NE(elaborate(Text).Error.find("expression nests deeper than 200 levels"),
            std::string::npos);
  std::string Minus(5000, '-');
  EXPECT_NE(elaborate("OPENQASM 2.0;\nqreg q[1];\nU(" + Minus + "1,0,0) q[0];\n")
                .Error.find("expression nests deeper"),
            std::string::npos);
}

TEST(Expression, TopLevelNamesAreErrors) {
  EXPECT_EQ(elaborate("OPENQASM 2.0;\nqreg q[1];\nU(theta,0,0) q[0];\n").Error,
            "test.qasm:3:3: error: 'theta' is not defined; outside gate bodies "
            "parameters must be constant expressions\n"
            "U(theta,0,0) q[0];\n"
            "  ^~~~~\n");
}

// A flat sum is a left-deep tree as deep as it is long; it must not recurse
// per term (found by reading a 120 kB expression).
TEST(Expression, LongFlatExpressions) {
  std::string Sum = "1";
  for (int I = 1; I < 100000; ++I)
    Sum += "+1";
  EXPECT_EQ(valuesOf(Sum + ",0,0"), (std::vector<double>{100000, 0, 0}));
  revbound::test::Elaborated E = elaborate(
      "OPENQASM 2.0;\ngate g(a) q { U(" + Sum + "*a,0,0) q; }\nqreg q[1];\n"
      "g(1) q[0];\n");
  EXPECT_EQ(E.Error, "");
}

TEST(Expression, UnderflowIsZero) {
  EXPECT_EQ(valuesOf("1e-400, 0, 0"), (std::vector<double>{0, 0, 0}));
}
