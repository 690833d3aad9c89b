//===- PlainCallCheck.h - Both ways of reading a file must agree ----------===//
//
// The parser reads plain gate calls straight from the bytes (AST.h,
// PlainCall) unless ParserOptions::ReadPlainCalls is off. This header builds
// a text both ways and describes the first difference: in the circuit (ops,
// wires, parameters to the bit, locations as file:line:col, registers,
// gates), in the error text or in the warnings. Used by the front-end tests
// and by the fuzz target FuzzPlainCalls.cpp.
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

inline void readOneWay(llvm::StringRef Text, qasm::FrontendOptions Opts,
                       bool Plain, ReadOneWay &Out) {
  Opts.Parser.ReadPlainCalls = Plain;
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

/// "" when reading `Text` with and without the plain-call path gives the
/// same result; otherwise the first difference.
inline std::string plainCallDifference(llvm::StringRef Text,
                                       const qasm::FrontendOptions &Opts = {}) {
  ReadOneWay Fast, Slow;
  readOneWay(Text, Opts, true, Fast);
  readOneWay(Text, Opts, false, Slow);
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
  for (size_t G = 0; G < A.Gates.size(); ++G)
    if (A.Gates[G].Name != B.Gates[G].Name ||
        A.Gates[G].Body.size() != B.Gates[G].Body.size())
      return "gate " + A.Gates[G].Name + " differs";
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

} // namespace revbound::test

#endif
