//===- UnitaryTest.cpp - Library gates against their textbook matrices ----===//
//
// Reference matrices: Nielsen & Chuang, "Quantum Computation and Quantum
// Information" (2000), section 4.2 (X, Y, Z, H, S, T, rotations) and
// section 4.3 (CNOT, controlled gates, Toffoli, Fredkin); u1/u2/u3 and the
// OpenQASM U from the OpenQASM 2.0 specification (Cross et al.,
// arXiv:1707.03429, section 3); sqrt(X) = (1/2)[[1+i,1-i],[1-i,1+i]] and the
// two-qubit rotations exp(-i theta/2 P(x)P) (common practice, from memory).
// The books write the first qubit as the most significant bit; revbound's
// basis makes it the least, so references are bit-reversed before comparing.
//
//===----------------------------------------------------------------------===//
#include "TestSupport.h"
#include "revbound/ir/Unitary.h"
#include "revbound/physics/GateAngle.h"

#include <gtest/gtest.h>

#include <complex>
#include <numbers>

using namespace revbound;
using ir::Matrix;
using C = std::complex<double>;
using std::numbers::pi;

namespace {

const C I(0, 1);
const double R2 = std::sqrt(0.5);

Matrix mat(int N, std::initializer_list<C> Entries) {
  Matrix M(N, N);
  auto It = Entries.begin();
  for (int R = 0; R < N; ++R)
    for (int Col = 0; Col < N; ++Col)
      M(R, Col) = *It++;
  return M;
}

/// Reorders a matrix written with the first qubit most significant.
Matrix fromBigEndian(const Matrix &M) {
  int N = int(M.rows()), Bits = 0;
  while ((1 << Bits) < N)
    ++Bits;
  auto Rev = [&](int X) {
    int Y = 0;
    for (int B = 0; B < Bits; ++B)
      if (X >> B & 1)
        Y |= 1 << (Bits - 1 - B);
    return Y;
  };
  Matrix Out(N, N);
  for (int R = 0; R < N; ++R)
    for (int Col = 0; Col < N; ++Col)
      Out(Rev(R), Rev(Col)) = M(R, Col);
  return Out;
}

Matrix controlled(const Matrix &U) {
  Matrix M = Matrix::Identity(4, 4);
  M.block(2, 2, 2, 2) = U;
  return fromBigEndian(M);
}

class Unitaries : public ::testing::Test {
protected:
  void SetUp() override {
    E = test::elaborate("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n");
    ASSERT_TRUE(E.Circuit) << E.Error;
    Cache = std::make_unique<ir::UnitaryCache>(*E.Circuit);
  }
  const Matrix &of(const char *Name, std::vector<double> P = {}) {
    ir::GateId G = E.Circuit->GateByName.lookup(Name);
    const Matrix *M = Cache->get(G, P);
    EXPECT_TRUE(M) << Name;
    static Matrix Empty;
    return M ? *M : Empty;
  }
  test::Elaborated E;
  std::unique_ptr<ir::UnitaryCache> Cache;
};

} // namespace

TEST_F(Unitaries, OneQubitGates) {
  Matrix X = mat(2, {0, 1, 1, 0}), Y = mat(2, {0, -I, I, 0}),
         Z = mat(2, {1, 0, 0, -1}), H = mat(2, {R2, R2, R2, -R2}),
         S = mat(2, {1, 0, 0, I}), T = mat(2, {1, 0, 0, std::exp(I * pi / 4.0)});
  EXPECT_TRUE(ir::equalUpToPhase(of("x"), X));
  EXPECT_TRUE(ir::equalUpToPhase(of("y"), Y));
  EXPECT_TRUE(ir::equalUpToPhase(of("z"), Z));
  EXPECT_TRUE(ir::equalUpToPhase(of("h"), H));
  EXPECT_TRUE(ir::equalUpToPhase(of("s"), S));
  EXPECT_TRUE(ir::equalUpToPhase(of("sdg"), S.adjoint()));
  EXPECT_TRUE(ir::equalUpToPhase(of("t"), T));
  EXPECT_TRUE(ir::equalUpToPhase(of("tdg"), T.adjoint()));
  EXPECT_TRUE(ir::equalUpToPhase(of("id"), Matrix::Identity(2, 2)));
  EXPECT_TRUE(ir::equalUpToPhase(of("sx"), mat(2, {0.5 + 0.5 * I, 0.5 - 0.5 * I,
                                                   0.5 - 0.5 * I, 0.5 + 0.5 * I})));
  EXPECT_FALSE(ir::equalUpToPhase(of("s"), T));
  double A = 0.7;
  Matrix Rx = mat(2, {std::cos(A / 2), -I * std::sin(A / 2), -I * std::sin(A / 2),
                      std::cos(A / 2)});
  Matrix Ry = mat(2, {std::cos(A / 2), -std::sin(A / 2), std::sin(A / 2),
                      std::cos(A / 2)});
  Matrix Rz = mat(2, {std::exp(-I * A / 2.0), 0, 0, std::exp(I * A / 2.0)});
  EXPECT_TRUE(ir::equalUpToPhase(of("rx", {A}), Rx));
  EXPECT_TRUE(ir::equalUpToPhase(of("ry", {A}), Ry));
  EXPECT_TRUE(ir::equalUpToPhase(of("rz", {A}), Rz));
  EXPECT_TRUE(ir::equalUpToPhase(of("u1", {A}), mat(2, {1, 0, 0, std::exp(I * A)})));
  EXPECT_TRUE(ir::equalUpToPhase(of("p", {A}), mat(2, {1, 0, 0, std::exp(I * A)})));
}

TEST_F(Unitaries, TwoAndThreeQubitGates) {
  Matrix X = mat(2, {0, 1, 1, 0}), Y = mat(2, {0, -I, I, 0}),
         Z = mat(2, {1, 0, 0, -1}), H = mat(2, {R2, R2, R2, -R2});
  EXPECT_TRUE(ir::equalUpToPhase(of("cx"), controlled(X)));
  EXPECT_TRUE(ir::equalUpToPhase(of("cy"), controlled(Y)));
  EXPECT_TRUE(ir::equalUpToPhase(of("cz"), controlled(Z)));
  EXPECT_TRUE(ir::equalUpToPhase(of("ch"), controlled(H)));
  double A = 1.1;
  EXPECT_TRUE(ir::equalUpToPhase(
      of("crz", {A}), controlled(mat(2, {std::exp(-I * A / 2.0), 0, 0,
                                         std::exp(I * A / 2.0)}))));
  EXPECT_TRUE(ir::equalUpToPhase(of("cu1", {A}),
                                 controlled(mat(2, {1, 0, 0, std::exp(I * A)}))));
  EXPECT_TRUE(ir::equalUpToPhase(
      of("cry", {A}), controlled(mat(2, {std::cos(A / 2), -std::sin(A / 2),
                                         std::sin(A / 2), std::cos(A / 2)}))));
  EXPECT_TRUE(ir::equalUpToPhase(
      of("crx", {A}),
      controlled(mat(2, {std::cos(A / 2), -I * std::sin(A / 2),
                         -I * std::sin(A / 2), std::cos(A / 2)}))));
  Matrix Swap = mat(4, {1, 0, 0, 0, 0, 0, 1, 0, 0, 1, 0, 0, 0, 0, 0, 1});
  EXPECT_TRUE(ir::equalUpToPhase(of("swap"), Swap));
  Matrix Zz = Matrix::Zero(4, 4);
  for (int K = 0; K < 4; ++K) {
    int Parity = ((K & 1) ^ (K >> 1)) ? -1 : 1;
    Zz(K, K) = std::exp(-I * (A / 2) * double(Parity));
  }
  EXPECT_TRUE(ir::equalUpToPhase(of("rzz", {A}), Zz));
  Matrix Toffoli = Matrix::Identity(8, 8);
  Toffoli(6, 6) = Toffoli(7, 7) = 0;
  Toffoli(6, 7) = Toffoli(7, 6) = 1;
  EXPECT_TRUE(ir::equalUpToPhase(of("ccx"), fromBigEndian(Toffoli)));
  Matrix Fredkin = Matrix::Identity(8, 8);
  Fredkin(5, 5) = Fredkin(6, 6) = 0;
  Fredkin(5, 6) = Fredkin(6, 5) = 1;
  EXPECT_TRUE(ir::equalUpToPhase(of("cswap"), fromBigEndian(Fredkin)));
}

// cu(theta, phi, lambda, gamma) is controlled-(e^{i gamma} u3) with the
// common u3 matrix [[cos(t/2), -e^{i l} sin(t/2)], [e^{i p} sin(t/2),
// e^{i(p+l)} cos(t/2)]] (common practice, from memory): the phase on the
// controlled branch matters, so it is checked through the whole 4x4 matrix.
TEST_F(Unitaries, ControlledUWithPhase) {
  double T = 0.9, P = 0.4, L = -1.3, G = 0.7;
  Matrix U3 = mat(2, {std::cos(T / 2), -std::exp(I * L) * std::sin(T / 2),
                      std::exp(I * P) * std::sin(T / 2),
                      std::exp(I * (P + L)) * std::cos(T / 2)});
  EXPECT_TRUE(ir::equalUpToPhase(of("u3", {T, P, L}), U3));
  EXPECT_TRUE(ir::equalUpToPhase(of("cu", {T, P, L, G}),
                                 controlled(std::exp(I * G) * U3)));
  EXPECT_FALSE(ir::equalUpToPhase(of("cu", {T, P, L, G}), controlled(U3)));
}

TEST_F(Unitaries, Classification) {
  EXPECT_EQ(ir::classify(of("x")), ir::UnitaryClass::Permutation);
  EXPECT_EQ(ir::classify(of("ccx")), ir::UnitaryClass::Permutation);
  EXPECT_EQ(ir::classify(of("cswap")), ir::UnitaryClass::Permutation);
  EXPECT_EQ(ir::classify(of("t")), ir::UnitaryClass::Diagonal);
  EXPECT_EQ(ir::classify(of("cz")), ir::UnitaryClass::Diagonal);
  EXPECT_EQ(ir::classify(of("rz", {0.3})), ir::UnitaryClass::Diagonal);
  EXPECT_EQ(ir::classify(of("y")), ir::UnitaryClass::Monomial);
  EXPECT_EQ(ir::classify(of("h")), ir::UnitaryClass::General);
  EXPECT_EQ(ir::classify(of("rx", {0.3})), ir::UnitaryClass::General);
}

// Gate angles from DESIGN.md's definition: X, H, CX, CZ, CCX pi/2, S pi/4,
// T pi/8, rz(theta) |theta|/2 modulo 2 pi.
TEST_F(Unitaries, GateAngles) {
  for (const char *G : {"x", "h", "cx", "cz", "ccx", "swap", "y"})
    EXPECT_NEAR(physics::gateAngle(of(G)), pi / 2, 1e-12) << G;
  EXPECT_NEAR(physics::gateAngle(of("s")), pi / 4, 1e-12);
  EXPECT_NEAR(physics::gateAngle(of("t")), pi / 8, 1e-12);
  EXPECT_NEAR(physics::gateAngle(of("tdg")), pi / 8, 1e-12);
  EXPECT_NEAR(physics::gateAngle(of("rz", {0.5})), 0.25, 1e-12);
  EXPECT_NEAR(physics::gateAngle(of("rz", {-0.5})), 0.25, 1e-12);
  EXPECT_NEAR(physics::gateAngle(of("rz", {2 * pi + 0.5})), 0.25, 1e-12);
  EXPECT_NEAR(physics::gateAngle(of("id")), 0, 1e-12);
  // An arc of exactly pi (rz(pi) ~ Z) reaches an orthogonal state.
  EXPECT_NEAR(physics::gateAngle(of("rz", {pi})), pi / 2, 1e-12);
  EXPECT_TRUE(physics::reachesOrthogonal(physics::gateAngle(of("cz"))));
  EXPECT_FALSE(physics::reachesOrthogonal(physics::gateAngle(of("t"))));
}
