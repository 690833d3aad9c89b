//===- CircuitGenerator.cpp - Deterministic OpenQASM 2.0 benchmark circuits ===//
#include "CircuitGenerator.h"

#include <algorithm>
#include <charconv>

namespace revbound::perf {

namespace {

/// SplitMix64 (Steele, Lea and Flood, OOPSLA 2014): tiny, fast, and the same
/// sequence everywhere, unlike the distributions of <random>.
class SplitMix {
public:
  explicit SplitMix(uint64_t Seed) : State(Seed) {}
  uint64_t next() {
    uint64_t Z = (State += 0x9E3779B97F4A7C15ull);
    Z = (Z ^ (Z >> 30)) * 0xBF58476D1CE4E5B9ull;
    Z = (Z ^ (Z >> 27)) * 0x94D049BB133111EBull;
    return Z ^ (Z >> 31);
  }
  /// Uniform in [0, N) by Lemire's multiply-shift (bias below 2^-32 here).
  uint32_t below(uint32_t N) {
    return uint32_t((uint64_t(uint32_t(next() >> 32)) * N) >> 32);
  }

private:
  uint64_t State;
};

/// Appends text with std::to_chars for numbers; the generator writes tens of
/// megabytes, so no streams.
class Writer {
public:
  explicit Writer(size_t Reserve) { Out.reserve(Reserve); }
  Writer &operator<<(const char *S) {
    Out += S;
    return *this;
  }
  Writer &operator<<(const std::string &S) {
    Out += S;
    return *this;
  }
  Writer &operator<<(uint64_t V) {
    char Buf[24];
    auto [End, Ec] = std::to_chars(Buf, Buf + sizeof(Buf), V);
    (void)Ec;
    Out.append(Buf, End);
    return *this;
  }
  Writer &qubit(uint32_t Q) {
    Out += "q[";
    *this << uint64_t(Q);
    Out += ']';
    return *this;
  }
  /// A fixed-point angle `Micro` / 10^6 with six decimals, e.g. "2.718281".
  Writer &angle(uint32_t Micro) {
    *this << uint64_t(Micro / 1'000'000);
    char Frac[8] = ".000000";
    uint32_t F = Micro % 1'000'000;
    for (int I = 6; I >= 1; --I, F /= 10)
      Frac[I] = char('0' + F % 10);
    Out += Frac;
    return *this;
  }
  std::string take() { return std::move(Out); }

private:
  std::string Out;
};

constexpr uint32_t PiMicro = 3'141'593; // angles drawn from [0, pi)

/// `Count` distinct qubits out of `N` (N >= Count).
void pickDistinct(SplitMix &R, uint32_t N, unsigned Count, uint32_t *Out) {
  for (unsigned I = 0; I < Count; ++I) {
    uint32_t Q;
    do
      Q = R.below(N);
    while (std::find(Out, Out + I, Q) != Out + I);
    Out[I] = Q;
  }
}

void writeHeader(Writer &W, const char *What) {
  W << "// revbound benchmark circuit (generated): " << What << "\n"
    << "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n";
}

} // namespace

std::string generateFlat(const FlatSpec &S) {
  uint32_t N = std::max<uint32_t>(S.Qubits, 3);
  uint64_t Measures = std::min<uint64_t>(N, S.Ops);
  uint64_t Gates = S.Ops - Measures;
  Writer W(size_t(S.Ops) * 15 + 256);
  writeHeader(W, "flat mix of h, cx, rz, t, tdg, x, ccx");
  W << "qreg q[" << uint64_t(N) << "];\ncreg c[" << uint64_t(N) << "];\n";
  SplitMix R(S.Seed);
  uint32_t Q[3];
  for (uint64_t I = 0; I < Gates; ++I) {
    // Weights in percent: h 22, cx 30, rz 18, t 14, tdg 4, x 6, ccx 6.
    uint32_t Pick = R.below(100);
    if (Pick < 22) {
      W << "h ";
      W.qubit(R.below(N));
    } else if (Pick < 52) {
      pickDistinct(R, N, 2, Q);
      W << "cx ";
      W.qubit(Q[0]) << ",";
      W.qubit(Q[1]);
    } else if (Pick < 70) {
      W << "rz(";
      uint32_t Form = R.below(8);
      if (Form == 0) {
        W << "pi/4"; // a T gate in disguise, for the T-count
      } else {
        if (Form == 1)
          W << "-";
        W.angle(R.below(PiMicro));
      }
      W << ") ";
      W.qubit(R.below(N));
    } else if (Pick < 84) {
      W << "t ";
      W.qubit(R.below(N));
    } else if (Pick < 88) {
      W << "tdg ";
      W.qubit(R.below(N));
    } else if (Pick < 94) {
      W << "x ";
      W.qubit(R.below(N));
    } else {
      pickDistinct(R, N, 3, Q);
      W << "ccx ";
      W.qubit(Q[0]) << ",";
      W.qubit(Q[1]) << ",";
      W.qubit(Q[2]);
    }
    W << ";\n";
  }
  for (uint64_t I = 0; I < Measures; ++I)
    W << "measure q[" << I << "] -> c[" << I << "];\n";
  return W.take();
}

std::string generateNested(const NestedSpec &S) {
  unsigned Levels = std::max(S.Levels, 1u);
  Writer W(size_t(Levels) * 48 + 256);
  writeHeader(W, "nested definitions expanding to 2^levels leaves");
  W << "// levels: " << uint64_t(Levels) << "\n";
  W << "gate n0 a,b,c { cx a,b; t c; }\n";
  for (unsigned K = 1; K < Levels; ++K)
    W << "gate n" << uint64_t(K) << " a,b,c { n" << uint64_t(K - 1)
      << " a,b,c; n" << uint64_t(K - 1) << " b,c,a; }\n";
  W << "qreg q[3];\ncreg c[3];\n";
  W << "n" << uint64_t(Levels - 1) << " q[0],q[1],q[2];\n";
  W << "measure q -> c;\n";
  return W.take();
}

std::string generateParams(const ParamSpec &S) {
  uint32_t N = std::max<uint32_t>(S.Qubits, 3);
  unsigned G = std::max(S.Gates, 1u);
  Writer W(size_t(G) * 96 + size_t(S.Calls) * 40 + 256);
  writeHeader(W, "many small parameterised user gates");
  // Four shapes, so that the bodies differ in arity and structure.
  for (unsigned K = 0; K < G; ++K) {
    W << "gate p" << uint64_t(K) << "(theta,phi) a,b";
    switch (K % 4) {
    case 0:
      W << " { rz(theta/2) b; cx a,b; rz(-theta/2) b; cx a,b; }\n";
      break;
    case 1:
      W << " { h a; cx a,b; rz(theta+phi) b; cx a,b; h a; }\n";
      break;
    case 2:
      W << ",c { ccx a,b,c; rz(phi*2) c; ccx a,b,c; u1(theta) a; }\n";
      break;
    default:
      W << " { u3(theta,phi,0) a; cx b,a; rz(phi-theta) a; t b; }\n";
      break;
    }
  }
  W << "qreg q[" << uint64_t(N) << "];\ncreg c[" << uint64_t(N) << "];\n";
  SplitMix R(S.Seed);
  uint32_t Q[3];
  for (uint64_t I = 0; I < S.Calls; ++I) {
    uint32_t K = R.below(G);
    unsigned Arity = K % 4 == 2 ? 3 : 2;
    pickDistinct(R, N, Arity, Q);
    W << "p" << uint64_t(K) << "(";
    W.angle(R.below(PiMicro)) << ",";
    W.angle(R.below(PiMicro)) << ") ";
    W.qubit(Q[0]);
    for (unsigned A = 1; A < Arity; ++A) {
      W << ",";
      W.qubit(Q[A]);
    }
    W << ";\n";
  }
  W << "measure q -> c;\n";
  return W.take();
}

} // namespace revbound::perf
