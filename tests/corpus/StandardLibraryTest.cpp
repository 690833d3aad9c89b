//===- StandardLibraryTest.cpp - Built-in qelib1.inc vs the standard's --===//
//
// The standard's own header (shared/openqasm2/qelib1.inc, openqasm/openqasm
// @0af8b84, the final OpenQASM 2.0 qelib1.inc with 23 gates per
// shared/openqasm2/SOURCES.md) read through --stdlib must mean the same
// gates as the built-in library; the built-in one must also define every
// gate the corpus calls beyond it, and those definitions must stay weak.
//
//===----------------------------------------------------------------------===//
#include "CorpusSupport.h"

#include "revbound/analysis/Summary.h"

#include <gtest/gtest.h>

#include <cctype>
#include <cmath>
#include <map>
#include <set>

using namespace revbound;
using namespace revbound::test;

namespace {

const char *const IncludeOnly = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n";

/// The library gates of an elaborated program, by name.
std::map<std::string, ir::GateId> libraryGates(const ir::Circuit &C) {
  std::map<std::string, ir::GateId> Out;
  for (ir::GateId G = 0; G < C.Gates.size(); ++G)
    if (C.gate(G).Origin == ir::GateOrigin::StandardLibrary)
      Out[C.gate(G).Name] = G;
  return Out;
}

analysis::PrimitiveCounts primitiveOf(const ir::Circuit &C, ir::GateId G) {
  analysis::LeafPolicy Policy;
  analysis::SummaryCache Cache(C, Policy);
  llvm::Expected<analysis::PrimitiveCounts> P =
      Cache.primitive(G, llvm::SMLoc());
  if (!P) {
    ADD_FAILURE() << llvm::toString(P.takeError());
    return {};
  }
  return *P;
}

bool isIdentStart(char C) {
  return std::isalpha(static_cast<unsigned char>(C)) || C == '_';
}
bool isIdentChar(char C) {
  return std::isalnum(static_cast<unsigned char>(C)) || C == '_';
}

/// Names of the gates a file calls and does not define itself, read from
/// the text alone: the first word of every statement (statements split at
/// ';', '{' and '}', comments removed, an `if (...)` prefix skipped).
std::set<std::string> calledNotDefined(const std::string &Text) {
  static const std::set<std::string> Keywords = {
      "OPENQASM", "include", "qreg",    "creg", "gate", "opaque",
      "measure",  "reset",   "barrier", "U",    "CX"};
  std::string Code;
  for (size_t I = 0; I < Text.size(); ++I) {
    if (Text.compare(I, 2, "//") == 0) {
      size_t E = Text.find('\n', I);
      if (E == std::string::npos)
        break;
      I = E;
    }
    Code += Text[I];
  }
  std::set<std::string> Called, Defined;
  size_t Start = 0;
  for (size_t I = 0; I <= Code.size(); ++I) {
    if (I < Code.size() && Code[I] != ';' && Code[I] != '{' && Code[I] != '}')
      continue;
    std::string S = Code.substr(Start, I - Start);
    Start = I + 1;
    size_t P = 0;
    auto SkipBlanks = [&] {
      while (P < S.size() && std::isspace(static_cast<unsigned char>(S[P])))
        ++P;
    };
    auto Word = [&] {
      size_t B = P;
      if (P < S.size() && isIdentStart(S[P]))
        while (P < S.size() && isIdentChar(S[P]))
          ++P;
      return S.substr(B, P - B);
    };
    SkipBlanks();
    std::string W = Word();
    if (W == "if") {
      size_t Close = S.find(')', P);
      if (Close == std::string::npos)
        continue;
      P = Close + 1;
      SkipBlanks();
      W = Word();
    }
    if (W == "gate" || W == "opaque") {
      SkipBlanks();
      Defined.insert(Word());
      continue;
    }
    if (!W.empty() && !Keywords.count(W))
      Called.insert(W);
  }
  std::set<std::string> Out;
  for (const std::string &N : Called)
    if (!Defined.count(N))
      Out.insert(N);
  return Out;
}

} // namespace

// Checks that the standard's qelib1.inc, read as --stdlib, and the built-in
// library give every one of the standard's 23 gates the same arity and the
// same full expansion into U and CX.
TEST(StandardLibrary, SameUCXExpansionAsTheStandardFile) {
  REVBOUND_REQUIRE_SHARED("openqasm2/qelib1.inc");
  Loaded Std =
      loadText("std.qasm", IncludeOnly,
               withStandardLibrary(sharedPath("openqasm2/qelib1.inc")));
  ASSERT_TRUE(Std.Circuit) << Std.ErrorText;
  Loaded Builtin = loadText("builtin.qasm", IncludeOnly, {});
  ASSERT_TRUE(Builtin.Circuit) << Builtin.ErrorText;
  std::map<std::string, ir::GateId> StdGates = libraryGates(*Std.Circuit);
  std::map<std::string, ir::GateId> BuiltinGates =
      libraryGates(*Builtin.Circuit);
  // shared/openqasm2/SOURCES.md: "the final OpenQASM 2.0 standard header
  // (23 gates)".
  EXPECT_EQ(StdGates.size(), 23u);
  for (const auto &[Name, StdId] : StdGates) {
    auto It = BuiltinGates.find(Name);
    ASSERT_NE(It, BuiltinGates.end()) << "built-in library lacks " << Name;
    const ir::GateDef &S = Std.Circuit->gate(StdId);
    const ir::GateDef &B = Builtin.Circuit->gate(It->second);
    EXPECT_EQ(S.numQubits(), B.numQubits()) << Name;
    EXPECT_EQ(S.numParams(), B.numParams()) << Name;
    analysis::PrimitiveCounts PS = primitiveOf(*Std.Circuit, StdId);
    analysis::PrimitiveCounts PB = primitiveOf(*Builtin.Circuit, It->second);
    EXPECT_EQ(PS.U, PB.U) << Name;
    EXPECT_EQ(PS.CX, PB.CX) << Name;
    EXPECT_EQ(PS.Opaque, 0u) << Name;
    EXPECT_EQ(PB.Opaque, 0u) << Name;
  }
  // Textbook check values, independent of both files: the Toffoli as 6 CNOTs
  // and 9 one-qubit gates (Nielsen & Chuang, figure 4.9); cz and cy as one
  // CNOT between basis changes (common practice).
  ASSERT_TRUE(StdGates.count("ccx") && StdGates.count("cz") &&
              StdGates.count("cy"));
  EXPECT_EQ(primitiveOf(*Std.Circuit, StdGates["ccx"]).CX, 6u);
  EXPECT_EQ(primitiveOf(*Std.Circuit, StdGates["ccx"]).U, 9u);
  EXPECT_EQ(primitiveOf(*Std.Circuit, StdGates["cz"]).CX, 1u);
  EXPECT_EQ(primitiveOf(*Std.Circuit, StdGates["cy"]).CX, 1u);
}

// Checks that the built-in definitions of the standard's 23 gates are the
// standard's bodies statement by statement: same callees on the same local
// qubits, parameter expressions equal at a sample point.
TEST(StandardLibrary, SameBodiesAsTheStandardFile) {
  REVBOUND_REQUIRE_SHARED("openqasm2/qelib1.inc");
  Loaded Std =
      loadText("std.qasm", IncludeOnly,
               withStandardLibrary(sharedPath("openqasm2/qelib1.inc")));
  ASSERT_TRUE(Std.Circuit) << Std.ErrorText;
  Loaded Builtin = loadText("builtin.qasm", IncludeOnly, {});
  ASSERT_TRUE(Builtin.Circuit) << Builtin.ErrorText;
  std::map<std::string, ir::GateId> BuiltinGates =
      libraryGates(*Builtin.Circuit);
  const double Sample[] = {0.37, -1.21, 2.93};
  for (const auto &[Name, StdId] : libraryGates(*Std.Circuit)) {
    ASSERT_TRUE(BuiltinGates.count(Name)) << Name;
    const ir::GateDef &S = Std.Circuit->gate(StdId);
    const ir::GateDef &B = Builtin.Circuit->gate(BuiltinGates[Name]);
    ASSERT_EQ(S.Body.size(), B.Body.size()) << Name;
    llvm::ArrayRef<double> P(Sample, S.numParams());
    for (size_t I = 0; I < S.Body.size(); ++I) {
      const ir::BodyOp &X = S.Body[I], &Y = B.Body[I];
      EXPECT_EQ(X.IsBarrier, Y.IsBarrier) << Name << " #" << I;
      EXPECT_EQ(Std.Circuit->gate(X.Callee).Name,
                Builtin.Circuit->gate(Y.Callee).Name)
          << Name << " #" << I;
      EXPECT_EQ(std::vector<uint32_t>(X.Qubits.begin(), X.Qubits.end()),
                std::vector<uint32_t>(Y.Qubits.begin(), Y.Qubits.end()))
          << Name << " #" << I;
      ASSERT_EQ(X.Params.size(), Y.Params.size()) << Name << " #" << I;
      for (size_t J = 0; J < X.Params.size(); ++J)
        EXPECT_NEAR(X.Params[J].evaluate(P), Y.Params[J].evaluate(P), 1e-12)
            << Name << " #" << I << " parameter " << J;
    }
  }
}

// Checks that the built-in library defines every gate the corpus calls
// without defining it and without the standard's qelib1.inc defining it
// (shared/benchmarks/SOURCES.md names sx; the QASMBench files also call
// cswap, cry and rzz), with the arity the textbook gives it.
TEST(StandardLibrary, BuiltinCoversGatesBeyondTheStandard) {
  REVBOUND_REQUIRE_SHARED("openqasm2/qelib1.inc");
  REVBOUND_REQUIRE_SHARED("benchmarks");
  Loaded Std =
      loadText("std.qasm", IncludeOnly,
               withStandardLibrary(sharedPath("openqasm2/qelib1.inc")));
  ASSERT_TRUE(Std.Circuit) << Std.ErrorText;
  Loaded Builtin = loadText("builtin.qasm", IncludeOnly, {});
  ASSERT_TRUE(Builtin.Circuit) << Builtin.ErrorText;
  std::map<std::string, ir::GateId> StdGates = libraryGates(*Std.Circuit);
  std::map<std::string, ir::GateId> BuiltinGates =
      libraryGates(*Builtin.Circuit);

  std::map<std::string, std::string> Beyond; // gate -> a file calling it
  std::vector<fs::path> Files = filesUnder(sharedPath("openqasm2"), ".qasm");
  std::vector<fs::path> Bench = filesUnder(sharedPath("benchmarks"), ".qasm");
  Files.insert(Files.end(), Bench.begin(), Bench.end());
  for (const fs::path &P : Files)
    for (const std::string &N : calledNotDefined(readText(P)))
      if (!StdGates.count(N))
        Beyond.emplace(N, relToShared(P));
  // The standard's invalid example calls the undeclared `w` on purpose.
  ASSERT_EQ(Beyond.count("w"), 1u);
  Beyond.erase("w");
  for (const char *N : {"sx", "cswap", "cry", "rzz"})
    EXPECT_TRUE(Beyond.count(N)) << N << " is no longer called beyond the "
                                 << "standard; update this test";
  for (const auto &[N, File] : Beyond)
    EXPECT_TRUE(BuiltinGates.count(N))
        << "built-in library lacks '" << N << "', called in " << File;

  // Arities and CNOT counts of the textbook gates (common practice; swap as
  // three CNOTs, Nielsen & Chuang figure 1.7; Fredkin as a Toffoli between
  // two CNOTs, 2 + 6; controlled-Ry by the A X B X C construction of
  // Nielsen & Chuang corollary 4.2, two CNOTs; exp(-i theta Z Z / 2) as
  // CNOT-Rz-CNOT).
  struct Expect {
    const char *Name;
    unsigned Qubits, Params;
    uint64_t CX;
  };
  for (const Expect &E : {Expect{"sx", 1, 0, 0}, Expect{"swap", 2, 0, 3},
                          Expect{"cswap", 3, 0, 8}, Expect{"cry", 2, 1, 2},
                          Expect{"rzz", 2, 1, 2}}) {
    ASSERT_TRUE(BuiltinGates.count(E.Name)) << E.Name;
    ir::GateId G = BuiltinGates[E.Name];
    EXPECT_EQ(Builtin.Circuit->gate(G).numQubits(), E.Qubits) << E.Name;
    EXPECT_EQ(Builtin.Circuit->gate(G).numParams(), E.Params) << E.Name;
    EXPECT_EQ(primitiveOf(*Builtin.Circuit, G).CX, E.CX) << E.Name;
  }
}

// Checks that a file's own `gate` with a library name replaces the library's
// definition without error, with the built-in library and with the
// standard's file as --stdlib.
TEST(StandardLibrary, OwnDefinitionReplacesLibraryGate) {
  const std::string Text = std::string(IncludeOnly) +
                           "gate sx a { x a; }\n"
                           "gate ccx a,b,c { CX a,c; }\n"
                           "qreg q[3];\nsx q[0];\nccx q[0],q[1],q[2];\n";
  std::vector<qasm::FrontendOptions> Options = {qasm::FrontendOptions()};
  if (std::filesystem::exists(sharedPath("openqasm2/qelib1.inc")))
    Options.push_back(withStandardLibrary(sharedPath("openqasm2/qelib1.inc")));
  for (const qasm::FrontendOptions &Opts : Options) {
    std::string Tag = Opts.Parser.StandardLibraryPath.empty()
                          ? "built-in"
                          : Opts.Parser.StandardLibraryPath;
    // The standard's qelib1.inc has no sx; redefining it is then no
    // replacement, only a definition, and must work all the same.
    Loaded L = loadText("own.qasm", Text, Opts);
    ASSERT_TRUE(L.Circuit) << Tag << "\n" << L.ErrorText;
    const ir::Circuit &C = *L.Circuit;
    for (const char *N : {"sx", "ccx"}) {
      ASSERT_TRUE(C.GateByName.count(N)) << N;
      EXPECT_EQ(C.gate(C.GateByName.lookup(N)).Origin, ir::GateOrigin::User)
          << Tag << " " << N;
    }
    // The calls use the file's bodies: x is one U, the new ccx one CX.
    ASSERT_EQ(C.Ops.size(), 2u);
    analysis::PrimitiveCounts Sx = primitiveOf(C, C.Ops[0].Gate);
    analysis::PrimitiveCounts Ccx = primitiveOf(C, C.Ops[1].Gate);
    EXPECT_EQ(Sx.U, 1u) << Tag;
    EXPECT_EQ(Sx.CX, 0u) << Tag;
    EXPECT_EQ(Ccx.U, 0u) << Tag;
    EXPECT_EQ(Ccx.CX, 1u) << Tag;
  }
}

// Checks that weak definitions are weak only against the library: a file
// that defines its own gate twice is still an error, at the second one.
TEST(StandardLibrary, OwnGateDefinedTwiceIsAnError) {
  Loaded L = loadText("twice.qasm",
                      std::string(IncludeOnly) + "gate g a { x a; }\n"
                                                 "gate g a { y a; }\n",
                      {});
  ASSERT_FALSE(L.Circuit);
  EXPECT_EQ(L.ErrorAt.Line, 4u) << L.ErrorText;
  EXPECT_NE(L.ErrorText.find("redefinition of gate 'g'"), std::string::npos)
      << L.ErrorText;
}

// Checks the corpus's own replacements: QASMBench large/qugan_n39 defines
// `ryy(param0)` and the standard's generic/ipea_3_pi_8.qasm defines a
// two-qubit `cu` without parameters; the built-in library has both names
// (with other parameters), and the files' definitions win.
TEST(StandardLibrary, CorpusFilesReplaceLibraryGates) {
  REVBOUND_REQUIRE_SHARED(
      "benchmarks/qasmbench/large/qugan_n39/qugan_n39.qasm");
  REVBOUND_REQUIRE_SHARED("openqasm2/examples/generic/ipea_3_pi_8.qasm");
  struct Case {
    const char *Rel, *Gate, *DefPrefix;
    unsigned Params;
  };
  for (const Case &K :
       {Case{"benchmarks/qasmbench/large/qugan_n39/qugan_n39.qasm", "ryy",
             "gate ryy(", 1},
        Case{"openqasm2/examples/generic/ipea_3_pi_8.qasm", "cu", "gate cu ",
             0}}) {
    fs::path P = sharedPath(K.Rel);
    Loaded L = loadFile(P, qasm::FrontendOptions());
    ASSERT_TRUE(L.Circuit) << L.ErrorText;
    const ir::Circuit &C = *L.Circuit;
    ASSERT_TRUE(C.GateByName.count(K.Gate));
    const ir::GateDef &G = C.gate(C.GateByName.lookup(K.Gate));
    EXPECT_EQ(G.Origin, ir::GateOrigin::User) << K.Rel;
    EXPECT_EQ(G.numParams(), K.Params) << K.Rel;
    EXPECT_EQ(resolve(L.Files->mgr(), G.Loc).File, P.string()) << K.Rel;
    unsigned DefLine = firstLineStartingWith(readText(P), K.DefPrefix);
    ASSERT_GT(DefLine, 0u) << K.Rel;
    EXPECT_EQ(resolve(L.Files->mgr(), G.Loc).Line, DefLine) << K.Rel;
  }
}
