//===- PlainCallCheck.h - Both ways of reading a file must agree ----------===//
//
// The parser reads plain gate calls straight from the bytes (AST.h,
// PlainCall) unless ParserOptions::ReadPlainCalls is off, and reads the
// second half of a large file on a second thread
// (ParserOptions::MinBytesForSecondThread), and takes the built-in
// qelib1.inc from a copy read once (FrontendOptions::ReuseBuiltinLibrary).
// This header builds a text token by token reading the library's text,
// plainly on one thread with the copy, and so on two whatever its size,
// and describes the first difference: in the circuit (ops, wires,
// parameters to the bit, locations as file:line:col, registers, gates), in
// the error text or in the warnings. Used by the front-end tests and by
// the fuzz target FuzzPlainCalls.cpp.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_TESTS_PLAINCALLCHECK_H
#define REVBOUND_TESTS_PLAINCALLCHECK_H

#include "revbound/qasm/Frontend.h"

#include <fmt/format.h>

#include <cstring>
#include <string>

namespace revbound::test {

struct ReadOneWay {
  SourceFiles Files;
  std::optional<ir::Circuit> Circuit;
  std::string Error;
  std::string Warnings;
};

enum class Way { TokenByToken, Plain, PlainOnTwoThreads };

inline void readOneWay(llvm::StringRef Text, qasm::FrontendOptions Opts,
                       Way How, ReadOneWay &Out) {
  Opts.Parser.ReadPlainCalls = How != Way::TokenByToken;
  Opts.ReuseBuiltinLibrary = How != Way::TokenByToken;
  Opts.Parser.MinBytesForSecondThread =
      How == Way::PlainOnTwoThreads ? 0 : UINT64_MAX;
  unsigned Id = Out.Files.addBuffer("input.qasm", Text);
  DiagnosticSink Warnings;
  llvm::Expected<ir::Circuit> C =
      qasm::buildCircuit(Out.Files, Id, Opts, Warnings);
  for (const Diagnostic &W : Warnings.warnings())
    Out.Warnings += formatDiagnostic(Out.Files.mgr(), W);
  if (!C) {
    llvm::handleAllErrors(
        C.takeError(),
        [&](const DiagnosticError &D) {
          Out.Error = formatDiagnostic(Out.Files.mgr(), D.diagnostic());
        },
        [&](const llvm::ErrorInfoBase &E) { Out.Error = E.message(); });
    return;
  }
  Out.Circuit = std::move(*C);
}

inline std::string where(const SourceFiles &F, llvm::SMLoc L) {
  if (!L.isValid())
    return "-";
  SourceFiles::Point P = F.locate(L);
  return fmt::format("{}:{}:{}", P.File.str(), P.Line, P.Column);
}

/// "" when `Fast` and `Slow` read the same; otherwise the first difference.
inline std::string difference(const ReadOneWay &Fast, const ReadOneWay &Slow) {
  if (Fast.Error != Slow.Error)
    return "error: '" + Fast.Error + "' vs '" + Slow.Error + "'";
  if (Fast.Warnings != Slow.Warnings)
    return "warnings: '" + Fast.Warnings + "' vs '" + Slow.Warnings + "'";
  if (!Fast.Circuit || !Slow.Circuit)
    return Fast.Circuit || Slow.Circuit ? "one way built no circuit" : "";
  const ir::Circuit &A = *Fast.Circuit, &B = *Slow.Circuit;
  if (A.NumQubits != B.NumQubits || A.NumClbits != B.NumClbits ||
      A.QRegs.size() != B.QRegs.size() || A.CRegs.size() != B.CRegs.size() ||
      A.Gates.size() != B.Gates.size() ||
      A.Conditions.size() != B.Conditions.size() ||
      A.QubitRoles != B.QubitRoles)
    return "declarations differ";
  for (size_t G = 0; G < A.Gates.size(); ++G) {
    const ir::GateDef &X = A.Gates[G], &Y = B.Gates[G];
    bool Same = X.Name == Y.Name && X.Origin == Y.Origin &&
                X.ParamNames == Y.ParamNames && X.QubitNames == Y.QubitNames &&
                X.NestingLevel == Y.NestingLevel &&
                where(Fast.Files, X.Loc) == where(Slow.Files, Y.Loc) &&
                X.Body.size() == Y.Body.size() &&
                A.GateByName.lookup(X.Name) == B.GateByName.lookup(Y.Name);
    for (size_t I = 0; Same && I < X.Body.size(); ++I) {
      const ir::BodyOp &P = X.Body[I], &Q = Y.Body[I];
      Same = P.IsBarrier == Q.IsBarrier && P.Callee == Q.Callee &&
             P.Qubits == Q.Qubits && P.Params.size() == Q.Params.size() &&
             where(Fast.Files, P.Loc) == where(Slow.Files, Q.Loc);
      for (size_t K = 0; Same && K < P.Params.size(); ++K)
        Same = P.Params[K].print(X.ParamNames) == Q.Params[K].print(Y.ParamNames);
    }
    if (!Same)
      return "gate " + X.Name + " differs";
  }
  if (A.Ops.size() != B.Ops.size())
    return fmt::format("{} ops vs {}", A.Ops.size(), B.Ops.size());
  for (size_t I = 0; I < A.Ops.size(); ++I) {
    const ir::Op &X = A.Ops[I], &Y = B.Ops[I];
    bool Same = X.Kind == Y.Kind && X.NumWires == Y.NumWires &&
                X.Gate == Y.Gate && X.Cond == Y.Cond &&
                A.wires(X).vec() == B.wires(Y).vec() &&
                where(Fast.Files, X.Loc) == where(Slow.Files, Y.Loc);
    llvm::ArrayRef<double> PX = A.params(X), PY = B.params(Y);
    Same = Same && PX.size() == PY.size() &&
           (PX.empty() ||
            std::memcmp(PX.data(), PY.data(), PX.size() * sizeof(double)) == 0);
    if (!Same)
      return fmt::format("op {} differs (at {})", I, where(Slow.Files, Y.Loc));
  }
  return "";
}

/// "" when reading `Text` token by token, plainly on one thread and
/// plainly on two gives the same result; otherwise the first difference.
inline std::string plainCallDifference(llvm::StringRef Text,
                                       const qasm::FrontendOptions &Opts = {}) {
  ReadOneWay Slow, Fast, Split;
  readOneWay(Text, Opts, Way::TokenByToken, Slow);
  readOneWay(Text, Opts, Way::Plain, Fast);
  readOneWay(Text, Opts, Way::PlainOnTwoThreads, Split);
  if (std::string D = difference(Fast, Slow); !D.empty())
    return "plain: " + D;
  if (std::string D = difference(Split, Slow); !D.empty())
    return "plain on two threads: " + D;
  return "";
}

} // namespace revbound::test

#endif
