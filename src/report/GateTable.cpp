//===- GateTable.cpp - The gate library as plain rows (`revbound gates`) --===//
#include "revbound/report/GateTable.h"

#include "revbound/analysis/Summary.h"
#include "revbound/physics/GateAngle.h"
#include "revbound/physics/SpeedLimit.h"
#include "revbound/qasm/Frontend.h"
#include "revbound/support/Diagnostics.h"

#include "llvm/Support/MemoryBuffer.h"

#include <algorithm>
#include <cmath>
#include <fmt/format.h>
#include <map>
#include <set>

namespace revbound::report {

double genericSampleValue(unsigned Sample, unsigned Param) {
  return 0.3 + 0.4 * Sample + 0.17 * Param;
}

const char *evaluationName(Evaluation E) {
  switch (E) {
  case Evaluation::Fixed:
    return "fixed";
  case Evaluation::Values:
    return "values";
  case Evaluation::Generic:
    return "generic";
  case Evaluation::None:
    return "none";
  }
  return "none";
}

//===----------------------------------------------------------------------===//
// --params NAME=v1,v2,...
//===----------------------------------------------------------------------===//

static bool isNameChar(char C, bool First) {
  return (C >= 'a' && C <= 'z') || (C >= 'A' && C <= 'Z') || C == '_' ||
         (!First && C >= '0' && C <= '9');
}

// Characters an OpenQASM 2.0 constant expression can hold. Keeping ';', '['
// and line breaks out means the value cannot smuggle statements into the
// program it is evaluated in.
static bool isExprChar(char C) {
  return isNameChar(C, false) || C == '.' || C == '+' || C == '-' || C == '*' ||
         C == '/' || C == '^' || C == '(' || C == ')' || C == ' ' || C == '\t';
}

/// Evaluates `Value` as the first argument of a top-level U, so that the
/// language's parser and elaborator decide what it means. Diagnostics are
/// moved to `At` + offset within the value.
static llvm::Expected<double> evaluateConstant(llvm::StringRef Value,
                                               const char *At) {
  static constexpr llvm::StringLiteral Prefix = "OPENQASM 2.0;\nqreg q[1];\nU(";
  std::string Program = (Prefix + Value + ",0,0) q[0];\n").str();
  SourceFiles Scratch;
  unsigned Id = Scratch.addBuffer("--params", Program);
  const char *Start =
      Scratch.mgr().getMemoryBuffer(Id)->getBufferStart() + Prefix.size();
  DiagnosticSink Ignored;
  llvm::Expected<ir::Circuit> C =
      qasm::buildCircuit(Scratch, Id, qasm::FrontendOptions{}, Ignored);
  if (!C) {
    Diagnostic D;
    llvm::handleAllErrors(
        C.takeError(), [&](const DiagnosticError &E) { D = E.diagnostic(); });
    ptrdiff_t Off = D.Loc.isValid() ? D.Loc.getPointer() - Start : -1;
    if (Off < 0 || Off > ptrdiff_t(Value.size()))
      Off = ptrdiff_t(Value.size()); // past the value: its end is to blame
    unsigned Room = unsigned(Value.size() - size_t(Off));
    return errorAt(llvm::SMLoc::getFromPointer(At + Off), D.Message,
                   std::min(D.Length, Room));
  }
  if (C->Ops.size() != 1 || C->Ops[0].Gate != ir::Circuit::UGate)
    return errorAt(llvm::SMLoc::getFromPointer(At),
                   "expected one constant expression", unsigned(Value.size()));
  return C->params(C->Ops[0])[0];
}

llvm::Expected<ParamAssignment> parseParamAssignment(SourceFiles &Files,
                                                     llvm::StringRef Text) {
  unsigned Id = Files.addBuffer("--params", Text);
  const char *Base = Files.mgr().getMemoryBuffer(Id)->getBufferStart();
  auto At = [&](size_t Off) { return llvm::SMLoc::getFromPointer(Base + Off); };
  size_t Eq = Text.find('=');
  if (Eq == llvm::StringRef::npos || Eq == 0)
    return errorAt(At(0), "expected NAME=VALUE,... (for example rz=pi/4)",
                   unsigned(Text.size()));
  for (size_t I = 0; I < Eq; ++I)
    if (!isNameChar(Text[I], I == 0))
      return errorAt(
          At(0), fmt::format("'{}' is not a gate name", Text.take_front(Eq)),
          unsigned(Eq));
  ParamAssignment A;
  A.Gate = Text.take_front(Eq).str();
  A.Loc = At(0);
  A.Length = unsigned(Eq);
  size_t Begin = Eq + 1;
  while (true) {
    size_t End = std::min(Text.find(',', Begin), Text.size());
    llvm::StringRef Value = Text.slice(Begin, End);
    if (Value.trim().empty())
      return errorAt(At(Begin), "expected a value");
    for (size_t I = 0; I < Value.size(); ++I)
      if (!isExprChar(Value[I]))
        return errorAt(At(Begin + I),
                       "unexpected character in a parameter value", 1);
    llvm::Expected<double> V = evaluateConstant(Value, Base + Begin);
    if (!V)
      return V.takeError();
    if (!std::isfinite(*V))
      return errorAt(At(Begin), "value is not a finite number",
                     unsigned(Value.size()));
    A.Values.push_back(*V);
    if (End == Text.size())
      break;
    Begin = End + 1;
  }
  return A;
}

//===----------------------------------------------------------------------===//
// Rows
//===----------------------------------------------------------------------===//

namespace {

/// Computes the rows of one circuit; the caches are per circuit.
class RowBuilder {
public:
  RowBuilder(const ir::Circuit &C, const SourceFiles &Files)
      : C(C), Files(Files), Summaries(C, Policy),
        FirstOpaque(C.Gates.size(), NoGate), Cost(C.Gates.size(), -1) {
    // Callees precede callers (a body calls only earlier gates), so one pass
    // in id order finds, for every gate, an opaque gate it expands to.
    for (ir::GateId G = 0; G < C.Gates.size(); ++G)
      for (const ir::BodyOp &B : C.gate(G).Body)
        if (!B.IsBarrier && FirstOpaque[G] == NoGate)
          FirstOpaque[G] = C.gate(B.Callee).Origin == ir::GateOrigin::Opaque
                               ? B.Callee
                               : FirstOpaque[B.Callee];
  }

  llvm::Expected<GateRow> row(ir::GateId G,
                              llvm::ArrayRef<ParamAssignment> Assignments);

private:
  static constexpr ir::GateId NoGate = ~ir::GateId(0);
  /// About ten seconds of the unitary builder on one core (it manages some
  /// 10^8 multiply-adds a second on 10 qubits), so that no row
  /// can hang the command.
  static constexpr double MaxBuildCost = 0x1p30;

  std::string noUnitaryReason(ir::GateId G, unsigned Builds);
  double buildCost(ir::GateId G);
  bool expansionFinite(ir::GateId G, llvm::ArrayRef<double> Params);
  const ir::Matrix *unitary(ir::GateId G, llvm::ArrayRef<double> Params);
  void evaluateAt(GateRow &R, ir::GateId G, llvm::ArrayRef<double> Params);
  void evaluateGeneric(GateRow &R, ir::GateId G);

  const ir::Circuit &C;
  const SourceFiles &Files;
  analysis::LeafPolicy Policy;
  /// One cache per row: a row's sub-unitaries (16 MiB each on 10 qubits)
  /// are dropped before the next row is built.
  std::optional<ir::UnitaryCache> Unitaries;
  analysis::SummaryCache Summaries;
  std::vector<ir::GateId> FirstOpaque;
  std::vector<double> Cost; // buildCost by gate, -1 until computed
  std::set<std::pair<ir::GateId, std::vector<double>>> FiniteSeen;
};

} // namespace

// Complex multiply-adds to build G's unitary when every callee is built once:
// applying a k-qubit callee to a 2^n x 2^n matrix costs 4^n 2^k. Counting a
// callee once underestimates callees called with many different values, but
// it is enough to refuse the gates that would take minutes or hours.
double RowBuilder::buildCost(ir::GateId G) {
  if (Cost[G] >= 0)
    return Cost[G];
  const ir::GateDef &D = C.gate(G);
  double Dim = std::ldexp(1.0, int(D.numQubits()));
  double Total = 0;
  std::set<ir::GateId> Callees;
  for (const ir::BodyOp &B : D.Body)
    if (!B.IsBarrier) {
      Total += Dim * Dim * std::ldexp(1.0, int(B.Qubits.size()));
      Callees.insert(B.Callee);
    }
  for (ir::GateId Callee : Callees)
    Total += buildCost(Callee);
  return Cost[G] = Total;
}

std::string RowBuilder::noUnitaryReason(ir::GateId G, unsigned Builds) {
  const ir::GateDef &D = C.gate(G);
  if (D.Origin == ir::GateOrigin::Opaque)
    return "opaque gate: no definition to build a unitary from";
  if (D.numQubits() > MaxTableQubits)
    return fmt::format("acts on {} qubits; unitaries are built for at most {}",
                       D.numQubits(), MaxTableQubits);
  if (FirstOpaque[G] != NoGate)
    return fmt::format("calls opaque gate '{}'", C.gate(FirstOpaque[G]).Name);
  if (double Work = Builds * buildCost(G); Work > MaxBuildCost)
    return fmt::format("building its unitary would take about {:.1e} "
                       "multiply-adds, over the limit of {:.1e}",
                       Work, MaxBuildCost);
  return "";
}

// The unitary cache keys on parameter values, and a NaN key would break its
// ordering; so every value the expansion computes is checked first. Each
// (gate, values) pair is visited once, as in the cache itself.
bool RowBuilder::expansionFinite(ir::GateId G, llvm::ArrayRef<double> Params) {
  auto Key =
      std::make_pair(G, std::vector<double>(Params.begin(), Params.end()));
  if (!FiniteSeen.insert(Key).second)
    return true;
  std::vector<double> Sub;
  for (const ir::BodyOp &B : C.gate(G).Body) {
    if (B.IsBarrier)
      continue;
    Sub.clear();
    for (const ir::ParamExpr &E : B.Params) {
      double V = E.evaluate(Params);
      if (!std::isfinite(V))
        return false;
      Sub.push_back(V);
    }
    if (!expansionFinite(B.Callee, Sub))
      return false;
  }
  return true;
}

const ir::Matrix *RowBuilder::unitary(ir::GateId G,
                                      llvm::ArrayRef<double> Params) {
  if (!expansionFinite(G, Params))
    return nullptr;
  const ir::Matrix *U = Unitaries->get(G, Params);
  return U && U->allFinite() ? U : nullptr;
}

void RowBuilder::evaluateAt(GateRow &R, ir::GateId G,
                            llvm::ArrayRef<double> Params) {
  const ir::Matrix *U = unitary(G, Params);
  if (!U) {
    R.Eval = Evaluation::None;
    R.Note =
        "a parameter expression in the body is not finite for these values";
    return;
  }
  R.Class = ir::classify(*U);
  double L = physics::gateAngle(*U);
  R.AngleRad = L;
  R.Orthogonal = physics::reachesOrthogonal(L);
  R.ActionJs = physics::mlAction(L);
}

// Permutation and Diagonal meet in Monomial: a gate that is a permutation at
// one sample and diagonal at another is monomial at both.
static ir::UnitaryClass joinClass(ir::UnitaryClass A, ir::UnitaryClass B) {
  if (A == B)
    return A;
  if (A == ir::UnitaryClass::General || B == ir::UnitaryClass::General)
    return ir::UnitaryClass::General;
  return ir::UnitaryClass::Monomial;
}

void RowBuilder::evaluateGeneric(GateRow &R, ir::GateId G) {
  std::optional<ir::UnitaryClass> Class;
  std::vector<double> Params(C.gate(G).numParams());
  for (unsigned S = 0; S < GenericSamples; ++S) {
    for (unsigned I = 0; I < Params.size(); ++I)
      Params[I] = genericSampleValue(S, I);
    const ir::Matrix *U = unitary(G, Params);
    if (!U)
      continue;
    ir::UnitaryClass K = ir::classify(*U);
    Class = Class ? joinClass(*Class, K) : K;
  }
  if (!Class) {
    R.Eval = Evaluation::None;
    R.Note = "a parameter expression in the body is not finite at generic "
             "values";
    return;
  }
  R.Eval = Evaluation::Generic;
  R.Class = Class;
  R.Note = "angle depends on the parameter values";
}

llvm::Expected<GateRow>
RowBuilder::row(ir::GateId G, llvm::ArrayRef<ParamAssignment> Assignments) {
  const ir::GateDef &D = C.gate(G);
  Unitaries.emplace(C, MaxTableQubits);
  GateRow R;
  R.Name = D.Name;
  R.Origin = D.Origin;
  auto Current = C.GateByName.find(D.Name);
  R.Replaced = Current != C.GateByName.end() && Current->second != G;
  if (D.Loc.isValid()) {
    ResolvedLocation Where = resolve(Files.mgr(), D.Loc);
    R.File = Where.File;
    R.Line = Where.Line;
    R.Column = Where.Column;
  }
  R.Qubits = D.numQubits();
  R.Params = D.ParamNames;
  for (const ParamAssignment &A : Assignments)
    if (A.Gate == D.Name && A.Values.size() == D.numParams())
      R.Values = A.Values;

  llvm::Expected<analysis::PrimitiveCounts> P = Summaries.primitive(G, D.Loc);
  if (!P)
    return P.takeError();
  R.PrimitiveU = P->U;
  R.PrimitiveCX = P->CX;
  R.PrimitiveOpaque = P->Opaque;

  // Without values a parametrised gate is built once per generic sample.
  unsigned Builds = D.numParams() > 0 && R.Values.empty() ? GenericSamples : 1;
  if (std::string Why = noUnitaryReason(G, Builds); !Why.empty()) {
    R.Eval = Evaluation::None;
    R.Note = std::move(Why);
    return R;
  }
  if (D.numParams() == 0) {
    R.Eval = Evaluation::Fixed;
    evaluateAt(R, G, {});
  } else if (!R.Values.empty()) {
    R.Eval = Evaluation::Values;
    evaluateAt(R, G, R.Values);
  } else {
    evaluateGeneric(R, G);
  }
  return R;
}

static unsigned originRank(ir::GateOrigin O) {
  switch (O) {
  case ir::GateOrigin::Builtin:
    return 0;
  case ir::GateOrigin::StandardLibrary:
    return 1;
  case ir::GateOrigin::User:
  case ir::GateOrigin::Opaque:
    return 2;
  }
  return 2;
}

/// Rows of `C` whose origin rank is in [MinRank, MaxRank], grouped by rank.
static llvm::Expected<std::vector<GateRow>>
rowsOf(const ir::Circuit &C, const SourceFiles &Files,
       llvm::ArrayRef<ParamAssignment> Assignments, unsigned MinRank,
       unsigned MaxRank) {
  RowBuilder Builder(C, Files);
  std::vector<GateRow> Rows;
  for (ir::GateId G = 0; G < C.Gates.size(); ++G) {
    unsigned Rank = originRank(C.gate(G).Origin);
    if (Rank < MinRank || Rank > MaxRank)
      continue;
    llvm::Expected<GateRow> R = Builder.row(G, Assignments);
    if (!R)
      return R.takeError();
    Rows.push_back(std::move(*R));
  }
  // A file may define gates before it includes the library.
  std::stable_sort(Rows.begin(), Rows.end(),
                   [](const GateRow &A, const GateRow &B) {
                     return originRank(A.Origin) < originRank(B.Origin);
                   });
  return Rows;
}

/// Every assignment must name a row with as many parameters, once.
static llvm::Error
checkAssignments(llvm::ArrayRef<GateRow> Rows,
                 llvm::ArrayRef<ParamAssignment> Assignments) {
  for (size_t I = 0; I < Assignments.size(); ++I) {
    const ParamAssignment &A = Assignments[I];
    for (size_t J = 0; J < I; ++J)
      if (Assignments[J].Gate == A.Gate)
        return errorAt(A.Loc,
                       fmt::format("values for '{}' are given twice", A.Gate),
                       A.Length);
    const GateRow *Named = nullptr;
    bool Fits = false;
    for (const GateRow &R : Rows)
      if (R.Name == A.Gate) {
        Named = Named ? Named : &R;
        Fits |= R.Params.size() == A.Values.size();
      }
    if (!Named)
      return errorAt(A.Loc, fmt::format("no gate named '{}'", A.Gate),
                     A.Length);
    if (Fits)
      continue;
    size_t N = Named->Params.size();
    if (N == 0)
      return errorAt(A.Loc,
                     fmt::format("gate '{}' takes no parameters", A.Gate),
                     A.Length);
    return errorAt(A.Loc,
                   fmt::format("gate '{}' takes {} parameter{}, got {}", A.Gate,
                               N, N == 1 ? "" : "s", A.Values.size()),
                   A.Length);
  }
  return llvm::Error::success();
}

llvm::Expected<std::vector<GateRow>>
tabulateGates(const ir::Circuit &C, const SourceFiles &Files,
              llvm::ArrayRef<ParamAssignment> Assignments) {
  llvm::Expected<std::vector<GateRow>> Rows =
      rowsOf(C, Files, Assignments, 0, 2);
  if (!Rows)
    return Rows.takeError();
  if (llvm::Error E = checkAssignments(*Rows, Assignments))
    return E;
  return Rows;
}

static bool includesLibrary(const ir::Circuit &C) {
  return std::any_of(C.Gates.begin(), C.Gates.end(), [](const ir::GateDef &D) {
    return D.Origin == ir::GateOrigin::StandardLibrary;
  });
}

llvm::Expected<GateTable>
buildGateTable(const ir::Circuit &Library, const ir::Circuit *File,
               const SourceFiles &Files, llvm::StringRef FileName,
               llvm::StringRef LibraryName,
               llvm::ArrayRef<ParamAssignment> Assignments) {
  GateTable T;
  T.File = File ? FileName.str() : "";
  T.Library = LibraryName.str();
  T.LibraryIncluded = !File || includesLibrary(*File);
  if (!File || T.LibraryIncluded) {
    llvm::Expected<std::vector<GateRow>> Rows =
        tabulateGates(File ? *File : Library, Files, Assignments);
    if (!Rows)
      return Rows.takeError();
    T.Rows = std::move(*Rows);
    return T;
  }
  llvm::Expected<std::vector<GateRow>> Lib =
      rowsOf(Library, Files, Assignments, 0, 1);
  if (!Lib)
    return Lib.takeError();
  llvm::Expected<std::vector<GateRow>> Own =
      rowsOf(*File, Files, Assignments, 2, 2);
  if (!Own)
    return Own.takeError();
  T.Rows = std::move(*Lib);
  std::move(Own->begin(), Own->end(), std::back_inserter(T.Rows));
  if (llvm::Error E = checkAssignments(T.Rows, Assignments))
    return E;
  return T;
}

} // namespace revbound::report
