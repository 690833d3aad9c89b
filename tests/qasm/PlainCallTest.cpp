//===- PlainCallTest.cpp - Plain gate calls read past the lexer -----------===//
//
// The fast path must be taken for the plain form, refused for everything
// else, and give exactly what the token-by-token path gives, diagnostics
// included. The grammar is the OpenQASM 2.0 specification's (Cross et al.,
// arXiv:1707.03429, section 4, "uop" and "argument").
//
//===----------------------------------------------------------------------===//
#include "PlainCallCheck.h"
#include "TestSupport.h"

#include "revbound/qasm/Parser.h"
// The one-pass reader is internal to the front end.
#include "../../src/qasm/PlainCallScanner.h"

#include <fmt/format.h>
#include <gtest/gtest.h>

using namespace revbound;

namespace {

/// Accepts every plain call and counts both kinds of statement.
class CountingSink : public qasm::StatementSink {
public:
  unsigned Plain = 0, Ordinary = 0;
  std::vector<double> LastParams;
  std::vector<uint64_t> LastIndices;
  llvm::Error onStatement(const qasm::Statement &) override {
    ++Ordinary;
    return llvm::Error::success();
  }
  bool tryPlainCall(const qasm::PlainCall &C) override {
    ++Plain;
    LastParams.assign(C.Params.begin(), C.Params.end());
    LastIndices.clear();
    for (const qasm::PlainOperand &A : C.Args)
      LastIndices.push_back(A.Index);
    return true;
  }
};

/// Parses "qreg q[8];" and `Line`; true when `Line` took the fast path.
bool readsPlain(const std::string &Line, CountingSink &Sink) {
  SourceFiles Files;
  unsigned Id = Files.addBuffer("t.qasm", "qreg q[8];\n" + Line + "\n");
  qasm::ParserOptions Opts;
  DiagnosticSink Warnings;
  llvm::Error E = qasm::parseProgram(Files, Id, Opts, Sink, Warnings);
  llvm::consumeError(std::move(E));
  return Sink.Plain == 1;
}

bool readsPlain(const std::string &Line) {
  CountingSink Sink;
  return readsPlain(Line, Sink);
}

TEST(PlainCall, TakenForThePlainForm) {
  EXPECT_TRUE(readsPlain("h q[0];"));
  EXPECT_TRUE(readsPlain("cx q[0],q[1];"));
  EXPECT_TRUE(readsPlain("cx\tq [ 0 ] ,  q[1] ;"));
  EXPECT_TRUE(readsPlain("ccx q[0], q[1], q[2]; // trailing comment"));
  EXPECT_TRUE(readsPlain("foo() q[0];"));
  CountingSink Sink;
  EXPECT_TRUE(readsPlain("u3(0.5, -1e-3, - 2) q[7];", Sink));
  EXPECT_EQ(Sink.LastParams, (std::vector<double>{0.5, -1e-3, -2.0}));
  EXPECT_EQ(Sink.LastIndices, (std::vector<uint64_t>{7}));
  CountingSink Angles;
  EXPECT_TRUE(readsPlain("u3(pi/2, -pi/4, 3*pi/8) q[0];", Angles));
  const double Pi = 3.141592653589793; // the double nearest pi
  EXPECT_EQ(Angles.LastParams,
            (std::vector<double>{Pi / 2, -Pi / 4, 3 * Pi / 8}));
  EXPECT_TRUE(readsPlain("rz(pi * -2 / 3) q[0];"));
  CountingSink Dots;
  EXPECT_TRUE(readsPlain("rz(.25) q[0];", Dots));
  EXPECT_EQ(Dots.LastParams, (std::vector<double>{0.25}));
}

TEST(PlainCall, RefusedForEverythingElse) {
  for (const char *Line :
       {"h q;",                 // a whole register: broadcasting
        "h\nq[0];",             // a line break inside the statement
        "h q[0] // c\n;",       // a comment inside
        "rz(pi+1) q[0];",       // a sum
        "rz(2^2) q[0];", "rz(pi^2) q[0];", // powers bind tighter than '*'
        "rz(sin(1)) q[0];", "rz((1)) q[0];", "rz(pix) q[0];",
        "rz(1/0) q[0];",        // not finite: the parser's diagnostic
        "rz(+1) q[0];",         // no unary plus in the grammar
        "rz(--1) q[0];",        // two signs
        "rz(1e400) q[0];",      // out of a double's range
        "rz(1e) q[0];",         // a lexical error
        "rz(01) q[0];",         // an integer may not start with 0
        "rz(1x) q[0];",         // a number running into a name
        "h q[01];", "h q[1.0];", "h q[1e0];", "h q[];",
        "h q[18446744073709551616];", // past 2^64
        "h pi[0];",             // a keyword as a register
        "h q[0]",               // no ';'
        "h q[0],;", "h q[0] q[1];", "if (c==1) h q[0];", "measure q[0] -> c[0];",
        "U(0,0,0) q[0];", "CX q[0],q[1];", "h q[0]\r\n;"}) {
    CountingSink Sink;
    EXPECT_FALSE(readsPlain(Line, Sink)) << Line;
  }
}

TEST(PlainCall, SameCircuitAndDiagnosticsBothWays) {
  const std::string Head = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                           "qreg q[4];\nqreg r[2];\ncreg c[4];\n";
  for (const char *Body :
       {"h q[0];\ncx q[0],q[1];\nrz(-0.5) q[2];\nu3(1,2,3) r[1];\n",
        "rz(0) q[0]; rz(-0) q[1]; rz(1e-400) q[2]; rz(4.9e-324) q[3];\n",
        "rz(0.1000000000000000055511151231257827) q[0];\n",
        "rz(pi/4) q[0]; rz(-pi/4) q[1]; rz(pi*-2/3) q[2]; rz(2*pi/3) q[3];\n",
        "rz(1e308*10) q[0];\n", "rz(1/0) q[0];\n", "rz(0/0) q[0];\n",
        "u3(pi/7*3/11, -pi*1e-3, 5/pi) r[0];\n",
        "h q[4];\n", // index out of range
        "h c[0];\n", // a classical register as a qubit
        // Switching registers: r[2] is past r's size though within q's.
        "cx q[0],r[1];\ncx r[0],q[1];\nh q[3];\nh r[2];\n",
        "h q[0];\nh c[0];\n", // the last register, then a classical one
        "h q[0];\nh qq[0];\nh r[0];\nh rr[0];\n", // names sharing a byte
        "qreg qa[1];\nqreg qb[3];\nh qb[2];\nh qa[2];\n", // and a length
        "h s[0];\n",         // an undeclared register
        "cx q[1],q[1];\n",   // a repeated qubit
        "nosuch q[0];\n",    // an unknown gate
        "cx q[0];\n",        // wrong arity
        "rz q[0];\n",        // a missing parameter
        "h(0.5) q[0];\n",    // an extra parameter
        "rz(1e400) q[0];\n", // out of range, the parser's message
        "h q[0]\n",          // missing ';'
        "gate g a { h a; }\ng q[0];\ng(1) q[0];\n",
        "h q;\ncx q, r;\n", // broadcasting, and a size mismatch
        "h q[0]; //! role q[1] ancilla\n",
        "cx q[0], q[2]; if (c==0) h q[0]; h q[3];\n",
        // Runs of calls that the one-pass reader (readPlainRun) ends
        // on: keywords, counts that do not match, gates wider than its
        // arrays (nine qubits, nine parameters).
        "h q[0]; U(0,0,0) q[1]; CX q[0],q[1]; h q[2];\n",
        "h q[0]; rz(1,2) q[1]; h q[2];\n", "h q[0]; h() q[1]; h q[2];\n",
        "h q[0]; h q[1], q[2]; h q[3];\n", "h q[0]; cx q[1] q[2];\n",
        "h q[0]; rz(0.5 q[1];\n", "h q[0]; h q[0]x;\n",
        "qreg w[9];\ngate nine a,b,c,d,e,f,g,h,i { cx a, i; }\n"
        "h w[0]; nine w[0],w[1],w[2],w[3],w[4],w[5],w[6],w[7],w[8]; h w[8];\n"
        "nine w[0],w[1],w[2],w[3],w[4],w[5],w[6],w[7],w[0]; h w[1];\n",
        "gate p9(a,b,c,d,e,f,g,h,i) x { rz(a+i) x; }\n"
        "h q[0]; p9(1,2,3,4,5,6,7,8,9) q[1]; p9(1,2,3,4,5,6,7,8) q[1];\n",
        "gate p8(a,b,c,d,e,f,g,h) x { rz(a+h) x; }\n"
        "h q[0]; p8(1,2,3,4,5,6,7,-pi/8) q[1]; p8(1,2,3,4,5,6,7,8,9) "
        "q[1];\n"}) {
    // The first plain call of a run goes through tryPlainCall, the rest
    // through the one-pass reader: each body is read both as the first
    // and after one.
    EXPECT_EQ(test::plainCallDifference(Head + Body), "") << Body;
    EXPECT_EQ(test::plainCallDifference(Head + "h q[1];\n" + Body), "")
        << "after a call: " << Body;
  }
}

TEST(PlainCall, WithoutTheStandardHeaderOrLibrary) {
  // U and CX only, and a file that declares its own gates.
  EXPECT_EQ(test::plainCallDifference(
                "qreg q[2];\ngate mine(t) a, b { U(t,0,0) a; CX a, b; }\n"
                "mine(0.5) q[0], q[1];\nmine(0.5) q[1], q[1];\n"),
            "");
}

TEST(PlainCall, BuiltinLibraryFromItsCopyOrItsText) {
  // The copy is taken only when the include comes before any gate of the
  // file's own and every library gate fits the qubit limit; the other
  // cases read the text. Either way the gates, their ids, bodies and
  // locations, and every diagnostic must be the same.
  const std::string Body = "qreg q[3];\nccx q[0],q[1],q[2];\nu2(0,pi) q[0];\n";
  EXPECT_EQ(test::plainCallDifference("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n" +
                                      Body),
            "");
  EXPECT_EQ(test::plainCallDifference(
                "OPENQASM 2.0;\ngate mine a { U(0,0,0) a; }\n"
                "include \"qelib1.inc\";\n" + Body + "mine q[0];\n"),
            "");
  EXPECT_EQ(test::plainCallDifference(
                "OPENQASM 2.0;\ngate h a { U(0,0,0) a; }\n"
                "include \"qelib1.inc\";\n" + Body),
            "");
  EXPECT_EQ(test::plainCallDifference("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                                      "include \"qelib1.inc\";\n" + Body),
            "");
  qasm::FrontendOptions Narrow;
  Narrow.Limits.MaxGateQubits = 2; // ccx has three
  EXPECT_EQ(test::plainCallDifference("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n" +
                                          Body,
                                      Narrow),
            "");
}

TEST(PlainCall, LimitOnOpsIsTheSameDiagnostic) {
  qasm::FrontendOptions Opts;
  Opts.Limits.MaxOps = 2;
  EXPECT_EQ(test::plainCallDifference("OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                                      "qreg q[2];\nh q[0];\nh q[1];\nx q[0];\n",
                                      Opts),
            "");
}

TEST(PlainCall, LimitOnPoolEntriesIsTheSameDiagnostic) {
  for (uint64_t Max : {3u, 4u, 5u, 6u}) {
    qasm::FrontendOptions Opts;
    Opts.Limits.MaxPoolEntries = Max;
    EXPECT_EQ(test::plainCallDifference(
                  "OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[3];\n"
                  "cx q[0],q[1];\nrz(1) q[2];\nrz(2) q[0];\nccx q[0],q[1],q[2];\n",
                  Opts),
              "")
        << Max;
  }
}

// The one-pass reader itself, against a target that records what it is
// asked: the names resolved, the calls added whole, the wide ones handed
// over as PlainCalls, and where the run stops.
struct RecordingTarget {
  std::vector<std::string> Log;
  qasm::PlainGate Gate;
  const qasm::PlainGate *gate(llvm::StringRef Name) {
    Log.push_back("gate " + Name.str());
    if (Name == "h" || Name == "rz" || Name == "cx" || Name == "wide") {
      Gate.NumParams = Name == "rz" ? 1 : Name == "wide" ? 9 : 0;
      Gate.NumQubits = Name == "cx" ? 2 : 1;
      return &Gate;
    }
    return nullptr;
  }
  bool qubit(llvm::StringRef Register, uint64_t Index, uint32_t &Wire) {
    Wire = uint32_t(Index);
    return Register == "q";
  }
  bool add(const qasm::PlainGate &G, llvm::SMLoc, const double *Params,
           const uint32_t *Wires) {
    std::string Entry = "add";
    for (unsigned I = 0; I < G.NumParams; ++I)
      Entry += fmt::format(" {}", Params[I]);
    for (unsigned I = 0; I < G.NumQubits; ++I)
      Entry += fmt::format(" w{}", Wires[I]);
    Log.push_back(Entry);
    return true;
  }
  bool cancelled() { return false; }
  bool takeCall(const qasm::PlainCall &Call) {
    Log.push_back(fmt::format("call {} with {} parameters",
                              Call.Gate.Name.str(), Call.Params.size()));
    return true;
  }
};

TEST(PlainCall, OnePassReaderResolvesAsItReads) {
  const std::string Text = "h q[3];\n  cx q[1] , q [2];rz(-pi/2) q[0];\n"
                           "wide(1,2,3,4,5,6,7,8,9) q[5];\nh r[0];\n";
  RecordingTarget T;
  const char *End = qasm::readPlainRun(Text.c_str(), T, nullptr);
  const std::vector<std::string> Expected = {
      "gate h",    "add w3",
      "gate cx",   "add w1 w2",
      "gate rz",   fmt::format("add {} w0", -3.141592653589793 / 2),
      "gate wide", "call wide with 9 parameters",
      "gate h"}; // r is no register: stop
  EXPECT_EQ(T.Log, Expected);
  ASSERT_NE(End, nullptr);
  EXPECT_EQ(std::string(End), "\nh r[0];\n");
  // A limit stops it before a call that starts at or past it; an unknown
  // gate stops it at once.
  RecordingTarget Limited;
  EXPECT_EQ(qasm::readPlainRun(Text.c_str(), Limited, Text.c_str() + 8),
            Text.c_str() + 7);
  EXPECT_EQ(Limited.Log, (std::vector<std::string>{"gate h", "add w3"}));
  RecordingTarget Unknown;
  EXPECT_EQ(qasm::readPlainRun("x q[0];", Unknown, nullptr), nullptr);
}

// The second thread. The split falls at the first line past the middle of
// what follows the first plain call; these bodies put declarations,
// straddling statements, comments, errors and limits on either side of it.

/// Records every plain call's gate name and location; its forks record
/// theirs, and a join appends them.
class RecordingSink : public qasm::StatementSink {
public:
  std::vector<std::string> Calls; // "name@offset"
  unsigned Forks = 0, Joins = 0;
  const char *Base = nullptr;
  bool RefuseJoin = false;

  llvm::Error onStatement(const qasm::Statement &S) override {
    Calls.push_back(S.Kind == qasm::StmtKind::GateCall
                        ? "stmt@" + offset(S.Call.Gate.Loc)
                        : "decl");
    return llvm::Error::success();
  }
  bool tryPlainCall(const qasm::PlainCall &C) override {
    Calls.push_back(C.Gate.Name.str() + "@" + offset(C.Gate.Loc));
    return true;
  }
  std::unique_ptr<qasm::PlainCallSink>
  forkPlainCalls(llvm::StringRef, llvm::StringRef) override {
    ++Forks;
    auto F = std::make_unique<RecordingSink>();
    F->Base = Base;
    return F;
  }
  bool joinPlainCalls(qasm::PlainCallSink &Fork) override {
    if (RefuseJoin)
      return false;
    ++Joins;
    auto &F = static_cast<RecordingSink &>(Fork);
    Calls.insert(Calls.end(), F.Calls.begin(), F.Calls.end());
    return true;
  }

private:
  std::string offset(llvm::SMLoc L) const {
    return std::to_string(L.getPointer() - Base);
  }
};

std::vector<std::string> record(const std::string &Text, uint64_t MinBytes,
                                RecordingSink &Sink) {
  SourceFiles Files;
  unsigned Id = Files.addBuffer("t.qasm", Text);
  Sink.Base = Files.mgr().getMemoryBuffer(Id)->getBufferStart();
  qasm::ParserOptions Opts;
  Opts.MinBytesForSecondThread = MinBytes;
  DiagnosticSink Warnings;
  llvm::consumeError(qasm::parseProgram(Files, Id, Opts, Sink, Warnings));
  return Sink.Calls;
}

std::string manyLines(unsigned N, const char *Line) {
  std::string Out;
  for (unsigned I = 0; I < N; ++I)
    Out += Line;
  return Out;
}

TEST(PlainCallSecondThread, JoinsAndReadsEachCallOnce) {
  std::string Text = "qreg q[2];\n" + manyLines(200, "h q[0];\ncx q[0], q[1];\n");
  RecordingSink One, Two;
  std::vector<std::string> Alone = record(Text, UINT64_MAX, One);
  EXPECT_EQ(One.Forks, 0u);
  EXPECT_EQ(record(Text, 0, Two), Alone);
  EXPECT_EQ(Two.Forks, 1u);
  EXPECT_EQ(Two.Joins, 1u);
  EXPECT_EQ(Alone.size(), 401u); // the qreg, then 400 calls
  // The threshold is on the bytes left after the first call.
  RecordingSink Big;
  record(Text, Text.size(), Big);
  EXPECT_EQ(Big.Forks, 0u);
}

TEST(PlainCallSecondThread, RefusedJoinReadsOnOneThread) {
  std::string Text = "qreg q[2];\n" + manyLines(200, "h q[0];\n");
  RecordingSink One, Two;
  Two.RefuseJoin = true;
  EXPECT_EQ(record(Text, 0, Two), record(Text, UINT64_MAX, One));
  EXPECT_EQ(Two.Forks, 1u);
}

TEST(PlainCallSecondThread, StatementAcrossTheSplitIsNotJoined) {
  // A conditional spread over every line after the first call: the split
  // falls inside it, and the second reader takes its body for a plain
  // call of its own, which must not be used.
  std::string Text = "qreg q[2];\ncreg c[2];\nh q[0];\nif (c==1)\n" +
                     manyLines(100, "\n") + "h q[1];\nh q[0];\n";
  RecordingSink One, Two;
  EXPECT_EQ(record(Text, 0, Two), record(Text, UINT64_MAX, One));
  EXPECT_EQ(Two.Forks, 1u);
  EXPECT_EQ(Two.Joins, 0u);
}

TEST(PlainCallSecondThread, SameCircuitWhateverFallsAroundTheSplit) {
  const std::string Head = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                           "qreg q[4];\ncreg c[4];\nh q[0];\n";
  const std::string Half = manyLines(50, "cx q[0], q[1];\nrz(pi/8) q[2];\n");
  for (const char *Middle : {
           "",                             // only plain calls
           "qreg r[2];\nh r[0];\n",        // a declaration before it
           "gate g a { h a; }\ng q[0];\n", // a definition
           "gate rz(t) a { u1(t) a; }\n",  // rz means another gate
           "measure q[0] -> c[0];\nreset q[1];\n",
           "if (c==1) x q[3];\n",
           "// a comment\n//! role q[3] ancilla\n",
           "h q[9];\n",         // an error
           "cx q[1],\nq[2];\n", // two lines
           // The fork writes its ops into the circuit's pool past one op
           // per ';' before its part: fewer (';' in comments) leave a gap
           // the join closes, more (broadcasts) make the fork give way.
           "// ;;; ;\nh q[1]; // ;\n",
           "h q;\n",
           "measure q -> c;\nreset q;\n",
           "cx q, q;\n",
       }) {
    EXPECT_EQ(test::plainCallDifference(Head + Half + Middle + Half), "")
        << Middle;
    EXPECT_EQ(test::plainCallDifference(Head + Middle + Half + Half), "")
        << Middle;
    EXPECT_EQ(test::plainCallDifference(Head + Half + Half + Middle), "")
        << Middle;
  }
  // More ';' before the split than a pool of one op per 4 bytes would
  // hold: read on one thread.
  const std::string Semicolons = "// " + std::string(700, ';') + "\n";
  EXPECT_EQ(test::plainCallDifference(Head + Half + Semicolons + Half), "");
}

TEST(PlainCallSecondThread, LimitOnOpsAcrossTheSplit) {
  const std::string Text = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                           "qreg q[2];\n" + manyLines(100, "h q[0];\n");
  for (uint64_t Max : {1u, 50u, 99u, 100u, 101u}) {
    qasm::FrontendOptions Opts;
    Opts.Limits.MaxOps = Max;
    EXPECT_EQ(test::plainCallDifference(Text, Opts), "") << Max;
  }
}

// Enough ops past the split that the join works on two threads
// (Elaborator::joinPlainCalls); every line differs, so that a part put in
// the wrong place shows. The fork's ops stay where it wrote them, or move
// down when comments with ';' before the split leave a gap.
TEST(PlainCallSecondThread, LargeJoinWorksOnTwoThreads) {
  for (const char *Gap : {"", "// ;;\n"}) {
    std::string Text = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                       "qreg q[7];\ncreg c[7];\nbarrier q;\n"
                       "measure q[3] -> c[3];\nu3(0.5,0.25,0.125) q[6];\n";
    Text += Gap;
    for (unsigned I = 0; I < 100'000; ++I) {
      unsigned A = I % 7, B = (I / 7 + 1 + A) % 7;
      if (B == A)
        B = (A + 1) % 7;
      Text += fmt::format("rz({}) q[{}];\ncx q[{}],q[{}];\nh q[{}];\n", I, A, A,
                          B, B);
    }
    EXPECT_EQ(test::plainCallDifference(Text), "") << Gap;
  }
}

TEST(PlainCallSecondThread, LimitOnPoolEntriesAcrossTheSplit) {
  const std::string Text = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                           "qreg q[2];\n" +
                           manyLines(100, "crz(0.5) q[0],q[1];\n");
  for (uint64_t Max : {1u, 99u, 100u, 101u, 199u, 200u, 201u}) {
    qasm::FrontendOptions Opts;
    Opts.Limits.MaxPoolEntries = Max;
    EXPECT_EQ(test::plainCallDifference(Text, Opts), "") << Max;
    // Two wires and one parameter value per line: 100 lines fit in 200.
    bool Fits = test::elaborate(Text, Opts).Error.empty();
    EXPECT_EQ(Fits, Max >= 200) << Max;
  }
}

} // namespace
