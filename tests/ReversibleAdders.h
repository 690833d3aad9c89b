//===- ReversibleAdders.h - Published adder constructions for the tests ---===//
//
// The ripple-carry adder of Cuccaro, Draper, Kutin and Moulton
// (arXiv:quant-ph/0410184, figure 4): MAJ(c, b, a) is CNOT a->b, CNOT a->c,
// Toffoli(c, b -> a); UMA(c, b, a) is Toffoli(c, b -> a), CNOT a->c,
// CNOT c->b. Registers cin[1] (carry-in ancilla, starts and ends 0), a[n],
// b[n] (inputs; b ends as a + b mod 2^n) and cout[1] (the carry out).
//
// The circuit is kept as a list of gates so that a test can print variants
// (a gate dropped, a Toffoli written in Clifford+T) and evaluate them on
// basis inputs with a simulator of its own, apart from the library.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_TESTS_REVERSIBLEADDERS_H
#define REVBOUND_TESTS_REVERSIBLEADDERS_H

#include <fmt/format.h>

#include <map>
#include <string>
#include <vector>

namespace revbound::test {

/// A gate on named wires ("a[3]"): x, cx or ccx (the target last).
struct NamedGate {
  std::string Name;
  std::vector<std::string> Wires;
};

inline std::vector<NamedGate> cuccaroGates(unsigned N) {
  std::vector<NamedGate> G;
  auto Q = [](const char *R, unsigned I) { return fmt::format("{}[{}]", R, I); };
  auto Maj = [&](std::string C, std::string B, std::string A) {
    G.push_back({"cx", {A, B}});
    G.push_back({"cx", {A, C}});
    G.push_back({"ccx", {C, B, A}});
  };
  auto Uma = [&](std::string C, std::string B, std::string A) {
    G.push_back({"ccx", {C, B, A}});
    G.push_back({"cx", {A, C}});
    G.push_back({"cx", {C, B}});
  };
  Maj("cin[0]", "b[0]", "a[0]");
  for (unsigned I = 1; I < N; ++I)
    Maj(Q("a", I - 1), Q("b", I), Q("a", I));
  G.push_back({"cx", {Q("a", N - 1), "cout[0]"}});
  for (unsigned I = N - 1; I >= 1; --I)
    Uma(Q("a", I - 1), Q("b", I), Q("a", I));
  Uma("cin[0]", "b[0]", "a[0]");
  return G;
}

/// The Toffoli ccx a,b,c in Clifford+T with seven T gates (Nielsen &
/// Chuang, Quantum Computation and Quantum Information, figure 4.9; the
/// same body as ccx in the OpenQASM 2.0 specification's qelib1.inc).
inline std::string cliffordTToffoli(const std::string &A, const std::string &B,
                                    const std::string &C) {
  return fmt::format("h {2};\ncx {1},{2};\ntdg {2};\ncx {0},{2};\nt {2};\n"
                     "cx {1},{2};\ntdg {2};\ncx {0},{2};\nt {1};\nt {2};\n"
                     "h {2};\ncx {0},{1};\nt {0};\ntdg {1};\ncx {0},{1};\n",
                     A, B, C);
}

struct AdderVariant {
  int Dropped = -1;      // index of a gate left out
  int CliffordT = -1;    // index of a ccx written in Clifford+T
  std::string RenameA;   // another name for register a (an interface change)
};

/// The adder as an OpenQASM 2.0 program with role comments.
inline std::string cuccaroQasm(unsigned N, const AdderVariant &V = {}) {
  std::vector<NamedGate> G = cuccaroGates(N);
  std::string A = V.RenameA.empty() ? "a" : V.RenameA;
  auto Rename = [&](std::string W) {
    if (!V.RenameA.empty() && W.rfind("a[", 0) == 0)
      W = A + W.substr(1);
    return W;
  };
  std::string S = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n";
  S += fmt::format("//! input {}, b\n//! ancilla cin\n", A);
  S += fmt::format("qreg cin[1];\nqreg {0}[{1}];\nqreg b[{1}];\nqreg cout[1];\n",
                   A, N);
  for (size_t I = 0; I < G.size(); ++I) {
    if (int(I) == V.Dropped)
      continue;
    std::vector<std::string> W;
    for (const std::string &X : G[I].Wires)
      W.push_back(Rename(X));
    if (int(I) == V.CliffordT && G[I].Name == "ccx") {
      S += cliffordTToffoli(W[0], W[1], W[2]);
      continue;
    }
    S += fmt::format("{} {};\n", G[I].Name, fmt::join(W, ","));
  }
  return S;
}

/// Runs x/cx/ccx gates on wire values (missing wires read 0).
inline std::map<std::string, bool> runGates(const std::vector<NamedGate> &G,
                                            std::map<std::string, bool> Value,
                                            int Dropped = -1) {
  for (size_t I = 0; I < G.size(); ++I) {
    if (int(I) == Dropped)
      continue;
    bool Control = true;
    for (size_t K = 0; K + 1 < G[I].Wires.size(); ++K)
      Control = Control && Value[G[I].Wires[K]];
    if (Control)
      Value[G[I].Wires.back()] = !Value[G[I].Wires.back()];
  }
  return Value;
}

/// Wire values of registers a and b given as bit strings, highest index
/// first (as a binary numeral).
inline std::map<std::string, bool> adderInput(const std::string &A,
                                              const std::string &B) {
  std::map<std::string, bool> V;
  for (size_t I = 0; I < A.size(); ++I)
    V[fmt::format("a[{}]", A.size() - 1 - I)] = A[I] == '1';
  for (size_t I = 0; I < B.size(); ++I)
    V[fmt::format("b[{}]", B.size() - 1 - I)] = B[I] == '1';
  return V;
}

} // namespace revbound::test

#endif
