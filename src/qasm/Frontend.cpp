//===- Frontend.cpp - Elaboration of OpenQASM 2.0 into the circuit IR ----===//
//
// The rules checked here are those of the OpenQASM 2.0 specification
// (Cross, Bishop, Smolin, Gambetta, arXiv:1707.03429, sections 3 and 4):
// declaration before use, equal register sizes when broadcasting, distinct
// qubit arguments in every gate application, gates calling only earlier
// gates.
//
//===----------------------------------------------------------------------===//
#include "revbound/qasm/Frontend.h"
#include "PlainCallScanner.h"
#include "revbound/qasm/Roles.h"

#include "llvm/ADT/STLExtras.h"
#include "llvm/ADT/SmallSet.h"
#include "llvm/Support/Compiler.h"
#include "llvm/Support/ErrorHandling.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <fmt/format.h>
#include <mutex>
#include <numbers>
#include <optional>
#include <system_error>
#include <thread>

namespace revbound::qasm {

namespace {

llvm::Error withNote(llvm::Error E, llvm::SMLoc NoteLoc, std::string Note,
                     unsigned Length = 0) {
  return llvm::handleErrors(std::move(E), [&](DiagnosticError &DE) {
    Diagnostic Full = DE.diagnostic();
    Diagnostic N;
    N.Sev = Severity::Note;
    N.Loc = NoteLoc;
    N.Length = Length;
    N.Message = Note;
    Full.Notes.push_back(std::move(N));
    return llvm::make_error<DiagnosticError>(std::move(Full));
  });
}

/// Translates a syntax tree into postfix code; `Scope` names the parameters
/// in reach (empty at the top level). Iterative, since a flat sum of many
/// terms is a left-deep tree as deep as it is long.
llvm::Error compileExpr(const Expr *Root, llvm::ArrayRef<Ident> Scope,
                        ir::ParamExpr &Out) {
  using Op = ir::ParamExpr::OpCode;
  // Post-order walk: each entry is a node and whether its operands are done.
  llvm::SmallVector<std::pair<const Expr *, bool>, 16> Stack;
  Stack.push_back({Root, false});
  while (!Stack.empty()) {
    auto [E, Expanded] = Stack.pop_back_val();
    if (!Expanded && (E->Lhs || E->Rhs)) {
      Stack.push_back({E, true});
      if (E->Rhs)
        Stack.push_back({E->Rhs, false});
      if (E->Lhs)
        Stack.push_back({E->Lhs, false});
      continue;
    }
    switch (E->Kind) {
    case ExprKind::Number:
      Out.push({Op::Const, 0, E->Value});
      break;
    case ExprKind::Pi:
      Out.push({Op::Const, 0, std::numbers::pi});
      break;
    case ExprKind::Name: {
      bool Found = false;
      for (unsigned I = 0; I < Scope.size() && !Found; ++I)
        if (Scope[I].Name == E->Name) {
          Out.push({Op::Param, I, 0});
          Found = true;
        }
      if (Found)
        break;
      if (Scope.empty())
        return errorAt(E->Loc,
                       fmt::format("'{}' is not defined; outside gate bodies "
                                   "parameters must be constant expressions",
                                   E->Name.str()),
                       E->Length);
      return errorAt(E->Loc,
                     fmt::format("'{}' is not a parameter of this gate",
                                 E->Name.str()),
                     E->Length);
    }
    case ExprKind::Neg:
      Out.push({Op::Neg, 0, 0});
      break;
    case ExprKind::Call: {
      Op Code = Op::Sin;
      switch (E->Func) {
      case MathFunc::Sin: Code = Op::Sin; break;
      case MathFunc::Cos: Code = Op::Cos; break;
      case MathFunc::Tan: Code = Op::Tan; break;
      case MathFunc::Exp: Code = Op::Exp; break;
      case MathFunc::Ln: Code = Op::Ln; break;
      case MathFunc::Sqrt: Code = Op::Sqrt; break;
      }
      Out.push({Code, 0, 0});
      break;
    }
    case ExprKind::Add: Out.push({Op::Add, 0, 0}); break;
    case ExprKind::Sub: Out.push({Op::Sub, 0, 0}); break;
    case ExprKind::Mul: Out.push({Op::Mul, 0, 0}); break;
    case ExprKind::Div: Out.push({Op::Div, 0, 0}); break;
    case ExprKind::Pow: Out.push({Op::Pow, 0, 0}); break;
    }
  }
  return llvm::Error::success();
}

/// A direct-mapped cache in front of a StringMap that never loses an entry.
/// Flat files name the same few gates and registers on every line; a name
/// of up to 8 bytes is packed into an integer as it is hashed, so a hit is
/// one comparison instead of a probe of the map and a memcmp. The value is
/// read through the cached entry and StringMap entries never move, so a
/// name that gets a new value (a library gate replaced by the user's own)
/// needs no invalidation. Longer names and colliding names only miss.
template <typename ValueT> class NameCache {
public:
  using Entry = llvm::StringMapEntry<ValueT>;

  explicit NameCache(const llvm::StringMap<ValueT> &Map) : Map(Map) {}

  /// The entry for `Name`, or null if the map has none.
  const Entry *find(llvm::StringRef Name) {
    if (Name.size() > sizeof(uint64_t) || Name.empty())
      return lookup(Name);
    // The bytes, first one most significant. A name has no NUL, so no two
    // names of 1..8 bytes pack to one key, and no name packs to 0.
    uint64_t Key = 0;
    for (char Ch : Name)
      Key = Key << 8 | static_cast<unsigned char>(Ch);
    Slot &S = Slots[(Key * 0x9E3779B97F4A7C15u) >> 58]; // Fibonacci hashing
    if (S.Key == Key)
      return S.Target;
    const Entry *Found = lookup(Name);
    if (Found)
      S = {Key, Found};
    return Found;
  }

private:
  struct Slot {
    uint64_t Key = 0; // 0: empty
    const Entry *Target = nullptr;
  };
  static constexpr unsigned NumSlots = 64; // the shift above keeps 6 bits

  const Entry *lookup(llvm::StringRef Name) const {
    auto It = Map.find(Name);
    return It == Map.end() ? nullptr : &*It;
  }

  const llvm::StringMap<ValueT> &Map;
  std::array<Slot, NumSlots> Slots{};
};

/// A resolved top-level operand: one wire, or a whole register.
struct WireRef {
  uint32_t First = 0;
  uint32_t Count = 1;
  bool IsRegister = false;
  const Operand *Source = nullptr;
};

/// True when pools of these sizes stay within `L`'s ops and entries.
static bool fitLimits(const FrontendLimits &L, uint64_t Ops, uint64_t Wires,
                      uint64_t Params) {
  return Ops <= L.MaxOps && Wires <= L.MaxPoolEntries &&
         Params <= L.MaxPoolEntries;
}

/// A fork's ops, written straight into the circuit's op pool: into its
/// capacity past the most the main thread may fill meanwhile, so that the
/// join neither copies them nor touches new pages for them.
struct OpStretch {
  ir::Op *Data = nullptr;
  size_t Size = 0;
  size_t size() const { return Size; }
  void push_back(const ir::Op &O) { Data[Size++] = O; }
};

/// Where top-level ops go: the circuit's pools, or a fork's stretch of the
/// op pool and pools of its own. `Ops` holds at most `MaxOps` (beside the
/// limits): the main thread's ceiling while a fork writes above it, or the
/// stretch's room.
template <typename OpsT> struct OpPoolsOf {
  OpsT &Ops;
  ir::Pool<uint32_t> &Wires;
  ir::Pool<double> &Params;
  uint64_t MaxOps = UINT64_MAX;
};
using OpPools = OpPoolsOf<ir::Pool<ir::Op>>;

// Few op statements are shorter than "h q[0];" and a newline, so this
// bound spares the pools of a flat file their repeated doubling (copies,
// and twice the memory for a moment); broadcasts and includes may still
// grow them. Where it is loose it costs address space, not memory: pages
// never written are never mapped. Counting the ';' instead would be
// tighter but reads the whole file once more.
static uint64_t estimateOps(llvm::StringRef Text, uint64_t MaxOps) {
  return std::min<uint64_t>(Text.size() / 8, MaxOps);
}

/// Sizes `To` for `Ops` ops: gates on one or two qubits and at most one
/// parameter each are the norm.
static void reservePools(OpPools To, uint64_t Ops) {
  To.Ops.reserve(Ops);
  To.Wires.reserve(2 * Ops);
  To.Params.reserve(Ops);
}

/// StatementSink::tryPlainCall's rules, against names it only reads: those
/// of the Elaborator itself, or a fork's copies on the second thread.
class PlainCallAppender {
public:
  PlainCallAppender(const llvm::StringMap<ir::GateId> &GateByName,
                    const std::vector<ir::GateDef> &Gates,
                    const llvm::StringMap<uint32_t> &RegisterByName,
                    const std::vector<ir::Register> &QRegs)
      : Gates(Gates), QRegs(QRegs), GateCache(GateByName),
        RegisterCache(RegisterByName) {}

  /// Adds `Call` to `To` if applyGate would take it without a diagnostic
  /// and `To` stays within `Limits`' ops and pool entries and its own
  /// MaxOps; otherwise changes nothing.
  template <typename OpsT>
  bool append(const PlainCall &Call, const FrontendLimits &Limits,
              OpPoolsOf<OpsT> To);

  /// PlainCallSink::takePlainRun into `To`, each call taken as append
  /// would take it, but read and resolved in one pass (readPlainRun). The
  /// run also ends soon after `Abandoned` (when given) is set.
  template <typename OpsT>
  const char *appendRun(const char *P, const FrontendLimits &Limits,
                        OpPoolsOf<OpsT> To, const std::atomic<bool> &Cancel,
                        const char *Limit,
                        const std::atomic<bool> *Abandoned = nullptr);

  /// The names' entries, through the caches that append uses too.
  const llvm::StringMapEntry<ir::GateId> *findGate(llvm::StringRef Name) {
    return GateCache.find(Name);
  }
  const llvm::StringMapEntry<uint32_t> *findRegister(llvm::StringRef Name) {
    return RegisterCache.find(Name);
  }

private:
  /// The gate named `Name` for readPlainRun, or null when there is none
  /// or the name is a keyword (the built-in U and CX are read by the
  /// parser). The result lives until the next call.
  const PlainGate *plainGate(llvm::StringRef Name) {
    const auto *Entry = GateCache.find(Name);
    if (!Entry || chars::keywordKind(Name) != Tok::Identifier)
      return nullptr;
    const ir::GateDef &Def = Gates[Entry->getValue()];
    Resolved = {Entry->getValue(), Def.numParams(), Def.numQubits()};
    return &Resolved;
  }

  /// Wire `Wire` for `Register[Index]` when that names a qubit. A name
  /// found among the registers was declared as one, so it is no keyword.
  bool qubit(llvm::StringRef Register, uint64_t Index, uint32_t &Wire) {
    const auto *Reg = findOperandRegister(Register);
    uint32_t Code = Reg ? Reg->getValue() : 0;
    if (!(Code & 1)) // no such register, or a classical one
      return false;
    const ir::Register &R = QRegs[Code >> 1];
    if (Index >= R.Size)
      return false;
    Wire = R.Offset + uint32_t(Index);
    return true;
  }

  /// The rest of applyGate's rules (distinct qubits) and the limits, then
  /// the op: `Params` and `Wires` hold G's counts of each.
  template <typename OpsT>
  bool add(const PlainGate &G, llvm::SMLoc Loc, const double *Params,
           const uint32_t *Wires, const FrontendLimits &Limits,
           OpPoolsOf<OpsT> To);

  /// Most files name one quantum register in every operand, so the last
  /// operand's name is compared first: a byte or two instead of the
  /// cache's hashing (the first byte apart, so that a one-byte name costs
  /// no memcmp call). A register's entry never changes once declared.
  const llvm::StringMapEntry<uint32_t> *
  findOperandRegister(llvm::StringRef Name) {
    if (LastRegister && Name.size() == LastRegisterName.size() &&
        Name[0] == LastRegisterName[0] &&
        Name.drop_front() == LastRegisterName.drop_front())
      return LastRegister;
    const auto *Found = RegisterCache.find(Name);
    if (Found) {
      LastRegister = Found;
      LastRegisterName = Name;
    }
    return Found;
  }

  const std::vector<ir::GateDef> &Gates;
  const std::vector<ir::Register> &QRegs;
  NameCache<ir::GateId> GateCache;
  NameCache<uint32_t> RegisterCache; // index * 2 + (1 for quantum)
  const llvm::StringMapEntry<uint32_t> *LastRegister = nullptr;
  llvm::StringRef LastRegisterName; // in a source buffer, alive while parsing
  PlainGate Resolved;               // plainGate's result
};

class PlainCallFork;

/// The fork an Elaborator has in flight, and the ceiling it sets on the
/// circuit's op count meanwhile.
struct ForkInFlight {
  PlainCallFork *Fork = nullptr;
  uint64_t OpsCeiling = UINT64_MAX;
};

/// A fork for StatementSink::forkPlainCalls: copies of the names; its ops
/// go into a stretch of the circuit's op pool, its wires and parameter
/// values into pools of its own, which joinPlainCalls appends.
class PlainCallFork : public PlainCallSink {
public:
  PlainCallFork(const ir::Circuit &C,
                const llvm::StringMap<uint32_t> &RegisterByName,
                const FrontendLimits &Limits, OpStretch Stretch,
                size_t StretchRoom, uint64_t OpsEstimate, ForkInFlight &Slot)
      : Ops(Stretch), OpsRoom(StretchRoom), GateByName(C.GateByName),
        Gates(C.Gates), RegisterByName(RegisterByName), QRegs(C.QRegs),
        Limits(Limits), NumRegisters(C.QRegs.size() + C.CRegs.size()),
        Slot(Slot) {
    Wires.reserve(2 * OpsEstimate);
    Params.reserve(OpsEstimate);
  }
  ~PlainCallFork() override {
    if (Slot.Fork == this)
      Slot = ForkInFlight();
  }

  bool tryPlainCall(const PlainCall &Call) override {
    std::lock_guard<std::mutex> Running(RunMutex);
    return !Abandoned.load() && Appender.append(Call, Limits, pools());
  }
  const char *takePlainRun(const char *P, const std::atomic<bool> &Cancel,
                           const char *Limit) override {
    // Held while the run writes, so that abandon() can wait for it; and
    // a run that starts after abandon() writes nothing.
    std::lock_guard<std::mutex> Running(RunMutex);
    if (Abandoned.load())
      return nullptr;
    return Appender.appendRun(P, Limits, pools(), Cancel, Limit, &Abandoned);
  }

  /// Stops the fork's writing into the circuit's op pool and waits until
  /// it has: called on the main thread before it fills past the ceiling.
  void abandon() {
    Abandoned.store(true);
    std::lock_guard<std::mutex> Wait(RunMutex);
  }
  bool abandoned() const { return Abandoned.load(); }

  /// True when `C` has declared nothing since the fork was made.
  bool sameNamesAs(const ir::Circuit &C) const {
    return Gates.size() == C.Gates.size() &&
           NumRegisters == C.QRegs.size() + C.CRegs.size();
  }

  OpStretch Ops;
  ir::Pool<uint32_t> Wires;
  ir::Pool<double> Params;

private:
  OpPoolsOf<OpStretch> pools() { return {Ops, Wires, Params, OpsRoom}; }

  const size_t OpsRoom;
  // Declarations only ever add a gate or a register, so equal counts mean
  // equal names.
  const llvm::StringMap<ir::GateId> GateByName;
  const std::vector<ir::GateDef> Gates;
  const llvm::StringMap<uint32_t> RegisterByName;
  const std::vector<ir::Register> QRegs;
  const FrontendLimits Limits;
  const size_t NumRegisters;
  ForkInFlight &Slot;
  std::mutex RunMutex;
  std::atomic<bool> Abandoned{false};
  PlainCallAppender Appender{GateByName, Gates, RegisterByName, QRegs};
};

class Elaborator : public StatementSink {
public:
  /// `ReuseBuiltinLibrary`: FrontendOptions::ReuseBuiltinLibrary; off for
  /// the one Elaborator that reads the library for the copy.
  Elaborator(const FrontendLimits &Limits, DiagnosticSink &Warnings,
             bool ReuseBuiltinLibrary)
      : Limits(withinIndexRange(Limits)), Warnings(Warnings),
        ReuseBuiltinLibrary(ReuseBuiltinLibrary) {}

  llvm::Error onStatement(const Statement &S) override;
  bool tryPlainCall(const PlainCall &Call) override {
    return Plain.append(Call, Limits, pools());
  }
  const char *takePlainRun(const char *P, const std::atomic<bool> &Cancel,
                           const char *Limit) override {
    return Plain.appendRun(P, Limits, pools(), Cancel, Limit);
  }
  std::unique_ptr<PlainCallSink> forkPlainCalls(llvm::StringRef Between,
                                                llvm::StringRef Text) override;
  bool defineBuiltinLibrary() override;
  bool joinPlainCalls(PlainCallSink &Fork) override;
  /// Sizes the op and wire pools for the main file's text.
  void reserveFor(llvm::StringRef MainText);
  ir::Circuit take() { return std::move(C); }

private:
  LLVM_ATTRIBUTE_NOINLINE llvm::Error applyOther(const Statement &S);
  llvm::Error declareRegister(const Statement &S);
  llvm::Error defineGate(const GateDecl &D);
  llvm::Error compileBody(const GateDecl &D, ir::GateDef &G);
  llvm::Error applyGate(const Statement &S, uint32_t Cond);
  llvm::Error applyMeasure(const Statement &S, uint32_t Cond);
  llvm::Error applyReset(const Statement &S, uint32_t Cond);
  llvm::Error applyBarrier(const Statement &S);
  llvm::Expected<uint32_t> makeCondition(const Statement &S);
  llvm::Expected<ir::GateId> lookupGate(const Ident &Name);
  llvm::Expected<WireRef> resolve(const Operand &O, bool Quantum);
  llvm::Error checkBroadcast(llvm::ArrayRef<WireRef> Refs, uint64_t &Count);
  // Once per op; as a call it would cost a frame for the pool's growth path.
  LLVM_ATTRIBUTE_ALWAYS_INLINE llvm::Error addOp(ir::Op O);

  const ir::Register *findRegister(llvm::StringRef Name, bool &IsQuantum);

  // Diagnostics of the paths taken for every line, out of line so that those
  // keep small frames.
  LLVM_ATTRIBUTE_NOINLINE llvm::Error errorUnknownGate(const Ident &Name);
  LLVM_ATTRIBUTE_NOINLINE llvm::Error errorOperand(const Operand &O,
                                                   bool Quantum,
                                                   const ir::Register *R,
                                                   bool IsQuantum);
  LLVM_ATTRIBUTE_NOINLINE llvm::Error errorArity(const GateCall &Call,
                                                 const ir::GateDef &Def);
  LLVM_ATTRIBUTE_NOINLINE llvm::Error
  errorRepeatedQubit(const Operand &Arg, uint32_t Q, const ir::GateDef &Def);
  LLVM_ATTRIBUTE_NOINLINE llvm::Error errorTooManyOps(llvm::SMLoc Loc);
  LLVM_ATTRIBUTE_NOINLINE llvm::Error errorPoolsFull(llvm::SMLoc Loc);

  /// The IR's indices bound the ops and pools whatever the options say.
  static FrontendLimits withinIndexRange(FrontendLimits L) {
    L.MaxOps = std::min(L.MaxOps, ir::MaxPoolEntries);
    L.MaxPoolEntries = std::min(L.MaxPoolEntries, ir::MaxPoolEntries);
    return L;
  }

  /// The circuit's pools, as far as the main thread may fill them now.
  OpPools pools() { return {C.Ops, C.Wires, C.Params, InFlight.OpsCeiling}; }

  const FrontendLimits Limits;
  DiagnosticSink &Warnings;
  ir::Circuit C;
  ForkInFlight InFlight;
  const bool ReuseBuiltinLibrary;
  bool SawStandardLibrary = false;
  llvm::StringMap<uint32_t> RegisterByName; // index * 2 + (1 for quantum)
  PlainCallAppender Plain{C.GateByName, C.Gates, RegisterByName, C.QRegs};
  llvm::SmallVector<WireRef, 4> Refs;     // reused per statement
  llvm::SmallVector<uint32_t, 8> Qubits;  // reused per statement
};

const ir::Register *Elaborator::findRegister(llvm::StringRef Name,
                                             bool &IsQuantum) {
  const auto *Entry = Plain.findRegister(Name);
  if (!Entry)
    return nullptr;
  // Encoded as index * 2 + (1 for quantum).
  uint32_t Code = Entry->getValue();
  IsQuantum = Code & 1;
  return IsQuantum ? &C.QRegs[Code >> 1] : &C.CRegs[Code >> 1];
}

void Elaborator::reserveFor(llvm::StringRef MainText) {
  reservePools({C.Ops, C.Wires, C.Params},
               estimateOps(MainText, Limits.MaxOps));
}

llvm::Error Elaborator::onStatement(const Statement &S) {
  // Unconditional gate calls are nearly every line of a large file; the
  // other statements go through a function of their own so that these do
  // not pay for its frame.
  if (S.Kind == StmtKind::GateCall && !S.HasCondition)
    return applyGate(S, ir::NoCondition);
  return applyOther(S);
}

llvm::Error Elaborator::applyOther(const Statement &S) {
  switch (S.Kind) {
  case StmtKind::QReg:
  case StmtKind::CReg:
    return declareRegister(S);
  case StmtKind::GateDecl:
    return defineGate(*S.Decl);
  case StmtKind::Barrier:
    return applyBarrier(S);
  case StmtKind::GateCall:
  case StmtKind::Measure:
  case StmtKind::Reset:
    break;
  }
  uint32_t Cond = ir::NoCondition;
  if (S.HasCondition) {
    llvm::Expected<uint32_t> CondOrErr = makeCondition(S);
    if (!CondOrErr)
      return CondOrErr.takeError();
    Cond = *CondOrErr;
  }
  if (S.Kind == StmtKind::GateCall)
    return applyGate(S, Cond);
  if (S.Kind == StmtKind::Measure)
    return applyMeasure(S, Cond);
  return applyReset(S, Cond);
}

llvm::Error Elaborator::declareRegister(const Statement &S) {
  bool Quantum = S.Kind == StmtKind::QReg;
  bool OtherQuantum = false;
  if (const ir::Register *Prev = findRegister(S.RegName.Name, OtherQuantum))
    return withNote(errorAt(S.RegName.Loc,
                            fmt::format("redeclaration of register '{}'",
                                        S.RegName.Name.str()),
                            unsigned(S.RegName.Name.size())),
                    Prev->Loc, "previous declaration is here");
  if (S.RegSize == 0)
    return errorAt(S.RegSizeLoc, "a register needs at least one wire",
                   S.RegSizeLength);
  uint64_t Limit = Quantum ? Limits.MaxQubits : Limits.MaxClbits;
  uint64_t Have = Quantum ? C.NumQubits : C.NumClbits;
  if (S.RegSize > Limit - Have)
    return errorAt(S.RegSizeLoc,
                   fmt::format("{} {} in all would exceed the limit of {} ({})",
                               Have + std::min<uint64_t>(S.RegSize, UINT32_MAX),
                               Quantum ? "qubits" : "classical bits", Limit,
                               Quantum ? "--max-qubits" : "--max-clbits"),
                   S.RegSizeLength);
  ir::Register R;
  R.Name = S.RegName.Name.str();
  R.Offset = uint32_t(Have);
  R.Size = uint32_t(S.RegSize);
  R.Loc = S.RegName.Loc;
  RegisterByName[R.Name] =
      uint32_t((Quantum ? C.QRegs.size() : C.CRegs.size()) * 2 + Quantum);
  if (Quantum) {
    C.QRegs.push_back(std::move(R));
    C.NumQubits += uint32_t(S.RegSize);
  } else {
    C.CRegs.push_back(std::move(R));
    C.NumClbits += uint32_t(S.RegSize);
  }
  return llvm::Error::success();
}

static llvm::Error checkDistinct(llvm::ArrayRef<Ident> Names,
                                 const char *What) {
  for (unsigned I = 0; I < Names.size(); ++I)
    for (unsigned J = 0; J < I; ++J)
      if (Names[I].Name == Names[J].Name)
        return withNote(errorAt(Names[I].Loc,
                                fmt::format("duplicate {} '{}'", What,
                                            Names[I].Name.str()),
                                unsigned(Names[I].Name.size())),
                        Names[J].Loc, "first declared here");
  return llvm::Error::success();
}

llvm::Error Elaborator::defineGate(const GateDecl &D) {
  if (D.FromStandardLibrary)
    SawStandardLibrary = true;
  if (llvm::Error E = checkDistinct(D.Params, "gate parameter"))
    return E;
  if (llvm::Error E = checkDistinct(D.Qubits, "gate qubit argument"))
    return E;
  for (const Ident &P : D.Params)
    for (const Ident &Q : D.Qubits)
      if (P.Name == Q.Name)
        return errorAt(Q.Loc,
                       fmt::format("'{}' names both a parameter and a qubit "
                                   "argument",
                                   Q.Name.str()),
                       unsigned(Q.Name.size()));
  if (D.Qubits.size() > Limits.MaxGateQubits)
    return errorAt(D.Name.Loc,
                   fmt::format("gate '{}' takes {} qubits, over the limit of {}",
                               D.Name.Name.str(), D.Qubits.size(),
                               Limits.MaxGateQubits),
                   unsigned(D.Name.Name.size()));
  auto Existing = C.GateByName.find(D.Name.Name);
  if (Existing != C.GateByName.end()) {
    const ir::GateDef &Prev = C.gate(Existing->second);
    // Library gates are weak: the user's own definition replaces them.
    bool Replaceable =
        Prev.Origin == ir::GateOrigin::StandardLibrary && !D.FromStandardLibrary;
    if (!Replaceable)
      return withNote(errorAt(D.Name.Loc,
                              fmt::format("redefinition of gate '{}'",
                                          D.Name.Name.str()),
                              unsigned(D.Name.Name.size())),
                      Prev.Loc, "previous definition is here");
  }
  ir::GateDef G;
  G.Name = D.Name.Name.str();
  G.Loc = D.Name.Loc;
  G.Origin = D.Opaque ? ir::GateOrigin::Opaque
             : D.FromStandardLibrary ? ir::GateOrigin::StandardLibrary
                                     : ir::GateOrigin::User;
  for (const Ident &P : D.Params)
    G.ParamNames.push_back(P.Name.str());
  for (const Ident &Q : D.Qubits)
    G.QubitNames.push_back(Q.Name.str());
  if (!D.Opaque)
    if (llvm::Error E = compileBody(D, G))
      return E;
  ir::GateId Id = ir::GateId(C.Gates.size());
  C.Gates.push_back(std::move(G));
  C.GateByName[D.Name.Name] = Id;
  return llvm::Error::success();
}

llvm::Error Elaborator::compileBody(const GateDecl &D, ir::GateDef &G) {
  unsigned Level = 0;
  for (const BodyStatement &B : D.Body) {
    ir::BodyOp Op;
    Op.IsBarrier = B.IsBarrier;
    Op.Loc = B.Loc;
    for (const Operand &A : B.Call.Args) {
      auto It = std::find_if(D.Qubits.begin(), D.Qubits.end(),
                             [&](const Ident &Q) { return Q.Name == A.Reg.Name; });
      if (It == D.Qubits.end())
        return errorAt(A.Reg.Loc,
                       fmt::format("'{}' is not a qubit argument of gate '{}'",
                                   A.Reg.Name.str(), G.Name),
                       unsigned(A.Reg.Name.size()));
      uint32_t Index = uint32_t(It - D.Qubits.begin());
      if (!B.IsBarrier)
        for (uint32_t Prev : Op.Qubits)
          if (Prev == Index)
            return errorAt(A.Reg.Loc,
                           fmt::format("qubit '{}' is used twice in one gate "
                                       "application",
                                       A.Reg.Name.str()),
                           unsigned(A.Reg.Name.size()));
      Op.Qubits.push_back(Index);
    }
    if (!B.IsBarrier) {
      const Ident &Callee = B.Call.Gate;
      if (Callee.Name == D.Name.Name)
        return errorAt(Callee.Loc,
                       fmt::format("gate '{}' calls itself; a gate body may "
                                   "only call gates defined before it",
                                   G.Name),
                       unsigned(Callee.Name.size()));
      llvm::Expected<ir::GateId> Id = lookupGate(Callee);
      if (!Id)
        return Id.takeError();
      const ir::GateDef &Def = C.gate(*Id);
      if (B.Call.Params.size() != Def.numParams())
        return errorAt(Callee.Loc,
                       fmt::format("gate '{}' takes {} parameter{}, got {}",
                                   Def.Name, Def.numParams(),
                                   Def.numParams() == 1 ? "" : "s",
                                   B.Call.Params.size()),
                       unsigned(Callee.Name.size()));
      if (Op.Qubits.size() != Def.numQubits())
        return errorAt(Callee.Loc,
                       fmt::format("gate '{}' acts on {} qubit{}, got {}",
                                   Def.Name, Def.numQubits(),
                                   Def.numQubits() == 1 ? "" : "s",
                                   Op.Qubits.size()),
                       unsigned(Callee.Name.size()));
      for (const Expr *P : B.Call.Params) {
        ir::ParamExpr PE;
        if (llvm::Error E = compileExpr(P, D.Params, PE))
          return E;
        Op.Params.push_back(std::move(PE));
      }
      Op.Callee = *Id;
      Level = std::max(Level, Def.NestingLevel);
    }
    G.Body.push_back(std::move(Op));
  }
  G.NestingLevel = Level + 1;
  // The built-in library's own depth (cswap is 4 levels) is not the file's
  // doing; a --stdlib file is input like any other and gets the limit.
  if (G.NestingLevel > Limits.MaxNesting && !D.FromBuiltinLibrary)
    return errorAt(D.Name.Loc,
                   fmt::format("gate '{}' nests {} levels of definitions, over "
                               "the limit of {} (--max-nesting)",
                               G.Name, G.NestingLevel, Limits.MaxNesting),
                   unsigned(D.Name.Name.size()));
  return llvm::Error::success();
}

llvm::Expected<ir::GateId> Elaborator::lookupGate(const Ident &Name) {
  if (const auto *Entry = Plain.findGate(Name.Name))
    return Entry->getValue();
  return errorUnknownGate(Name);
}

llvm::Error Elaborator::errorUnknownGate(const Ident &Name) {
  llvm::Error E = errorAt(Name.Loc,
                          fmt::format("unknown gate '{}'", Name.Name.str()),
                          unsigned(Name.Name.size()));
  if (!SawStandardLibrary)
    return withNote(std::move(E), llvm::SMLoc(),
                    "the standard gates (h, cx, ccx, ...) come from "
                    "'include \"qelib1.inc\";'");
  return E;
}

llvm::Expected<WireRef> Elaborator::resolve(const Operand &O, bool Quantum) {
  bool IsQuantum = false;
  const ir::Register *R = findRegister(O.Reg.Name, IsQuantum);
  if (!R || IsQuantum != Quantum || (O.HasIndex && O.Index >= R->Size))
    return errorOperand(O, Quantum, R, IsQuantum);
  WireRef W;
  W.Source = &O;
  if (!O.HasIndex) {
    W.First = R->Offset;
    W.Count = R->Size;
    W.IsRegister = true;
    return W;
  }
  W.First = R->Offset + uint32_t(O.Index);
  return W;
}

llvm::Error Elaborator::errorOperand(const Operand &O, bool Quantum,
                                     const ir::Register *R, bool IsQuantum) {
  unsigned Len = unsigned(O.Reg.Name.size());
  if (!R)
    return errorAt(O.Reg.Loc,
                   fmt::format("use of undeclared {} register '{}'",
                               Quantum ? "quantum" : "classical",
                               O.Reg.Name.str()),
                   Len);
  if (IsQuantum != Quantum)
    return errorAt(O.Reg.Loc,
                   fmt::format("'{}' is a {} register; expected a {} register",
                               O.Reg.Name.str(),
                               IsQuantum ? "quantum" : "classical",
                               Quantum ? "quantum" : "classical"),
                   Len);
  return withNote(errorAt(O.IndexLoc,
                          fmt::format("index {} is out of range for register "
                                      "'{}' of size {}",
                                      O.Index, R->Name, R->Size),
                          O.IndexLength),
                  R->Loc, "register declared here", unsigned(R->Name.size()));
}

/// Broadcasting (specification, section 3): register operands must all have
/// the same size n, and the statement means n applications, single wires
/// being repeated in each.
llvm::Error Elaborator::checkBroadcast(llvm::ArrayRef<WireRef> Refs,
                                       uint64_t &Count) {
  const WireRef *First = nullptr;
  Count = 1;
  for (const WireRef &R : Refs) {
    if (!R.IsRegister)
      continue;
    if (!First) {
      First = &R;
      Count = R.Count;
      continue;
    }
    if (R.Count != First->Count)
      return withNote(
          errorAt(R.Source->Reg.Loc,
                  fmt::format("register '{}' has {} wires but '{}' has {}; "
                              "registers in one statement must have equal sizes",
                              R.Source->Reg.Name.str(), R.Count,
                              First->Source->Reg.Name.str(), First->Count),
                  unsigned(R.Source->Reg.Name.size())),
          First->Source->Reg.Loc, "the first register operand is here",
          unsigned(First->Source->Reg.Name.size()));
  }
  return llvm::Error::success();
}

llvm::Error Elaborator::addOp(ir::Op O) {
  if (C.Ops.size() >= Limits.MaxOps)
    return errorTooManyOps(O.Loc);
  // The op's wires and parameters are in the pools already.
  if (!fitLimits(Limits, 0, C.Wires.size(), C.Params.size()))
    return errorPoolsFull(O.Loc);
  // More ops before the fork's part than the bound it was placed by (a
  // broadcast, an include): the fork gives way, and this thread reads on
  // alone from its start.
  if (LLVM_UNLIKELY(C.Ops.size() >= InFlight.OpsCeiling)) {
    InFlight.Fork->abandon();
    InFlight = ForkInFlight();
  }
  C.Ops.push_back(O);
  return llvm::Error::success();
}

llvm::Error Elaborator::errorPoolsFull(llvm::SMLoc Loc) {
  return errorAt(Loc, fmt::format("the top-level operations pass {} wires "
                                  "or parameter values in all; revbound "
                                  "indexes them in 32 bits",
                                  Limits.MaxPoolEntries));
}

llvm::Error Elaborator::errorTooManyOps(llvm::SMLoc Loc) {
  return errorAt(Loc, fmt::format("more than {} top-level operations after "
                                  "broadcasting (--max-ops)",
                                  Limits.MaxOps));
}

// applyGate's rules for the plain form, checked before anything is added;
// whatever would be a diagnostic is left to applyGate.
template <typename OpsT>
bool PlainCallAppender::append(const PlainCall &Call,
                               const FrontendLimits &Limits,
                               OpPoolsOf<OpsT> To) {
  const PlainGate *G = plainGate(Call.Gate.Name);
  if (!G || Call.Params.size() != G->NumParams ||
      Call.Args.size() != G->NumQubits)
    return false;
  uint32_t Wires[PlainRunMaxQubits];
  if (G->NumQubits > std::size(Wires))
    return false;
  for (unsigned A = 0; A < G->NumQubits; ++A)
    if (!qubit(Call.Args[A].Reg.Name, Call.Args[A].Index, Wires[A]))
      return false;
  return add(*G, Call.Gate.Loc, Call.Params.data(), Wires, Limits, To);
}

template <typename OpsT>
bool PlainCallAppender::add(const PlainGate &G, llvm::SMLoc Loc,
                            const double *Params, const uint32_t *Wires,
                            const FrontendLimits &Limits, OpPoolsOf<OpsT> To) {
  const unsigned Arity = G.NumQubits;
  for (unsigned A = 1; A < Arity; ++A)
    for (unsigned B = 0; B < A; ++B)
      if (Wires[B] == Wires[A])
        return false;
  if (To.Ops.size() >= To.MaxOps ||
      !fitLimits(Limits, To.Ops.size() + 1, To.Wires.size() + Arity,
                 To.Params.size() + G.NumParams))
    return false;
  ir::Op O;
  O.Kind = ir::OpKind::Gate;
  O.Gate = G.Id;
  O.FirstWire = uint32_t(To.Wires.size());
  O.NumWires = Arity;
  O.FirstParam = uint32_t(To.Params.size());
  O.Cond = ir::NoCondition;
  O.Loc = Loc;
  // push_back, not a range insert: the general insert's bookkeeping for a
  // middle position costs more than these one to three elements.
  for (unsigned I = 0; I < G.NumParams; ++I)
    To.Params.push_back(Params[I]);
  for (unsigned A = 0; A < Arity; ++A)
    To.Wires.push_back(Wires[A]);
  To.Ops.push_back(O);
  return true;
}

template <typename OpsT>
const char *
PlainCallAppender::appendRun(const char *P, const FrontendLimits &Limits,
                             OpPoolsOf<OpsT> To,
                             const std::atomic<bool> &Cancel, const char *Limit,
                             const std::atomic<bool> *Abandoned) {
  struct Target {
    PlainCallAppender &A;
    const FrontendLimits &Limits;
    OpPoolsOf<OpsT> To;
    const std::atomic<bool> &Cancel;
    const std::atomic<bool> *Abandoned;
    const PlainGate *gate(llvm::StringRef Name) { return A.plainGate(Name); }
    bool qubit(llvm::StringRef Register, uint64_t Index, uint32_t &Wire) {
      return A.qubit(Register, Index, Wire);
    }
    bool add(const PlainGate &G, llvm::SMLoc Loc, const double *Params,
             const uint32_t *Wires) {
      return A.add(G, Loc, Params, Wires, Limits, To);
    }
    bool takeCall(const PlainCall &Call) { return A.append(Call, Limits, To); }
    bool cancelled() {
      return Cancel.load(std::memory_order_relaxed) ||
             (Abandoned && Abandoned->load(std::memory_order_relaxed));
    }
  } T{*this, Limits, To, Cancel, Abandoned};
  return readPlainRun(P, T, Limit);
}

std::unique_ptr<PlainCallSink>
Elaborator::forkPlainCalls(llvm::StringRef Between, llvm::StringRef Text) {
  if (InFlight.Fork)
    return nullptr; // one at a time
  // Each statement this thread reads before the fork's part adds one op
  // at most, except broadcasts and includes: the fork writes from there
  // on, and should this thread need more, addOp makes the fork give way.
  // The ';' are counted on this thread before the fork starts (about
  // 1.5 ms for the 7 MB before the split of a 1M-op file).
  uint64_t Ceiling = C.Ops.size() + Between.count(';');
  // Room for one op at least, so that even a short part is read twice
  // over in the tests (a fork that runs out of room ends its run early).
  uint64_t Estimate = std::max<uint64_t>(1, estimateOps(Text, Limits.MaxOps));
  // The pool grows to hold both (address space only: pages nobody writes
  // are never mapped), but to no more than one op per 4 bytes left to
  // read: a first half of mostly ';' is read on one thread instead.
  uint64_t Needed = Ceiling + Estimate;
  if (Ceiling >= Limits.MaxOps ||
      Needed > C.Ops.size() + (Between.size() + Text.size()) / 4)
    return nullptr;
  C.Ops.reserve(std::max<uint64_t>(C.Ops.capacity(), Needed));
  OpStretch Stretch{C.Ops.data() + Ceiling, 0};
  auto Fork = std::make_unique<PlainCallFork>(
      C, RegisterByName, Limits, Stretch, C.Ops.capacity() - Ceiling, Estimate,
      InFlight);
  InFlight = {Fork.get(), Ceiling};
  return Fork;
}

bool Elaborator::joinPlainCalls(PlainCallSink &Sink) {
  auto &Fork = static_cast<PlainCallFork &>(Sink); // made by forkPlainCalls
  const size_t Taken = Fork.Ops.size();
  if (Fork.abandoned() || InFlight.Fork != &Fork || !Fork.sameNamesAs(C) ||
      !fitLimits(Limits, C.Ops.size() + Taken,
                 C.Wires.size() + Fork.Wires.size(),
                 C.Params.size() + Fork.Params.size()))
    return false;
  const size_t OpBase = C.Ops.size();
  const size_t StretchAt = size_t(Fork.Ops.Data - C.Ops.data());
  const uint32_t WireBase = uint32_t(C.Wires.size());
  const uint32_t ParamBase = uint32_t(C.Params.size());
  InFlight = ForkInFlight();
  // Sized first and filled after (ir::PoolAllocator writes nothing): the
  // fork's ops are in place already, past OpBase or right at it.
  C.Ops.resize(StretchAt + Taken);
  C.Wires.resize(WireBase + Fork.Wires.size());
  C.Params.resize(ParamBase + Fork.Params.size());
  ir::Op *Ops = C.Ops.data();
  auto Rebase = [&](size_t From, size_t To) {
    for (size_t I = From; I < To; ++I) {
      ir::Op O = Ops[StretchAt + I];
      O.FirstWire += WireBase;
      O.FirstParam += ParamBase;
      Ops[OpBase + I] = O;
    }
  };
  // Two threads share the work: the rest of the pools, and the ops where
  // they stay in place. Ops that must move down (this thread read fewer
  // than the ceiling allowed) move on one thread in order, since the two
  // ranges overlap.
  auto CopyPart = [&](unsigned Part, unsigned Parts) {
    auto Range = [=](size_t N) {
      return std::pair(N * Part / Parts, N * (Part + 1) / Parts);
    };
    if (StretchAt == OpBase) {
      auto [OpsFrom, OpsTo] = Range(Taken);
      Rebase(OpsFrom, OpsTo);
    } else if (Part == 0) {
      Rebase(0, Taken);
    }
    auto [WiresFrom, WiresTo] = Range(Fork.Wires.size());
    std::copy(Fork.Wires.begin() + WiresFrom, Fork.Wires.begin() + WiresTo,
              C.Wires.begin() + WireBase + WiresFrom);
    auto [ParamsFrom, ParamsTo] = Range(Fork.Params.size());
    std::copy(Fork.Params.begin() + ParamsFrom, Fork.Params.begin() + ParamsTo,
              C.Params.begin() + ParamBase + ParamsFrom);
  };
  std::optional<std::thread> Helper;
  // Below this a thread costs more than it saves.
  constexpr size_t MinOpsForHelper = 1u << 16;
  if (Taken >= MinOpsForHelper) {
    try {
      Helper.emplace([&] { CopyPart(1, 2); });
    } catch (const std::system_error &) {
      // no thread to be had: this one does everything
    }
  }
  CopyPart(0, Helper ? 2 : 1);
  if (Helper)
    Helper->join();
  C.Ops.resize(OpBase + Taken);
  return true;
}

llvm::Error Elaborator::applyGate(const Statement &S, uint32_t Cond) {
  const GateCall &Call = S.Call;
  llvm::Expected<ir::GateId> Id = lookupGate(Call.Gate);
  if (!Id)
    return Id.takeError();
  const ir::GateDef &Def = C.gate(*Id);
  if (Call.Params.size() != Def.numParams() ||
      Call.Args.size() != Def.numQubits())
    return errorArity(Call, Def);
  uint32_t FirstParam = uint32_t(C.Params.size());
  for (const Expr *P : Call.Params) {
    // A literal, the most common parameter, is its own value.
    double V = P->Value;
    if (P->Kind != ExprKind::Number) {
      ir::ParamExpr PE;
      if (llvm::Error E = compileExpr(P, {}, PE)) {
        C.Params.resize(FirstParam);
        return E;
      }
      V = PE.evaluate({});
    }
    if (!std::isfinite(V)) {
      C.Params.resize(FirstParam);
      return errorAt(P->Loc, "parameter evaluates to a non-finite value",
                     P->Length);
    }
    C.Params.push_back(V);
  }
  Refs.clear();
  for (const Operand &A : Call.Args) {
    llvm::Expected<WireRef> W = resolve(A, /*Quantum=*/true);
    if (!W)
      return W.takeError();
    Refs.push_back(*W);
  }
  uint64_t Count;
  if (llvm::Error E = checkBroadcast(Refs, Count))
    return E;
  for (uint64_t I = 0; I < Count; ++I) {
    ir::Op O;
    O.Kind = ir::OpKind::Gate;
    O.Gate = *Id;
    O.FirstWire = uint32_t(C.Wires.size());
    O.NumWires = uint32_t(Refs.size());
    O.FirstParam = FirstParam;
    O.Cond = Cond;
    O.Loc = S.Loc;
    for (unsigned A = 0; A < Refs.size(); ++A) {
      uint32_t Q = Refs[A].First + (Refs[A].IsRegister ? uint32_t(I) : 0);
      for (unsigned B = 0; B < A; ++B)
        if (C.Wires[O.FirstWire + B] == Q) {
          C.Wires.resize(O.FirstWire);
          return errorRepeatedQubit(*Refs[A].Source, Q, Def);
        }
      C.Wires.push_back(Q);
    }
    if (llvm::Error E = addOp(O))
      return E;
  }
  return llvm::Error::success();
}

llvm::Error Elaborator::errorArity(const GateCall &Call,
                                   const ir::GateDef &Def) {
  unsigned NameLen = unsigned(Call.Gate.Name.size());
  if (Call.Params.size() != Def.numParams())
    return errorAt(Call.Gate.Loc,
                   fmt::format("gate '{}' takes {} parameter{}, got {}",
                               Def.Name, Def.numParams(),
                               Def.numParams() == 1 ? "" : "s",
                               Call.Params.size()),
                   NameLen);
  return errorAt(Call.Gate.Loc,
                 fmt::format("gate '{}' acts on {} qubit{}, got {}", Def.Name,
                             Def.numQubits(), Def.numQubits() == 1 ? "" : "s",
                             Call.Args.size()),
                 NameLen);
}

llvm::Error Elaborator::errorRepeatedQubit(const Operand &Arg, uint32_t Q,
                                           const ir::GateDef &Def) {
  return errorAt(Arg.Reg.Loc,
                 fmt::format("qubit {} is used twice in one application of "
                             "'{}'",
                             C.qubitName(Q), Def.Name),
                 Arg.length());
}

llvm::Error Elaborator::applyMeasure(const Statement &S, uint32_t Cond) {
  llvm::Expected<WireRef> Q = resolve(S.Target, /*Quantum=*/true);
  if (!Q)
    return Q.takeError();
  llvm::Expected<WireRef> B = resolve(S.Result, /*Quantum=*/false);
  if (!B)
    return B.takeError();
  if (Q->IsRegister != B->IsRegister || Q->Count != B->Count)
    return errorAt(S.Result.Reg.Loc,
                   fmt::format("measure maps {} qubit{} onto {} bit{}; a "
                               "measurement needs a qubit and a bit, or two "
                               "registers of equal size",
                               Q->Count, Q->Count == 1 ? "" : "s", B->Count,
                               B->Count == 1 ? "" : "s"),
                   S.Result.length());
  for (uint32_t I = 0; I < Q->Count; ++I) {
    ir::Op O;
    O.Kind = ir::OpKind::Measure;
    O.FirstWire = uint32_t(C.Wires.size());
    O.NumWires = 2;
    O.Cond = Cond;
    O.Loc = S.Loc;
    C.Wires.push_back(Q->First + I);
    C.Wires.push_back(B->First + I);
    if (llvm::Error E = addOp(O))
      return E;
  }
  return llvm::Error::success();
}

llvm::Error Elaborator::applyReset(const Statement &S, uint32_t Cond) {
  llvm::Expected<WireRef> Q = resolve(S.Target, /*Quantum=*/true);
  if (!Q)
    return Q.takeError();
  for (uint32_t I = 0; I < Q->Count; ++I) {
    ir::Op O;
    O.Kind = ir::OpKind::Reset;
    O.FirstWire = uint32_t(C.Wires.size());
    O.NumWires = 1;
    O.Cond = Cond;
    O.Loc = S.Loc;
    C.Wires.push_back(Q->First + I);
    if (llvm::Error E = addOp(O))
      return E;
  }
  return llvm::Error::success();
}

llvm::Error Elaborator::applyBarrier(const Statement &S) {
  ir::Op O;
  O.Kind = ir::OpKind::Barrier;
  O.FirstWire = uint32_t(C.Wires.size());
  O.Loc = S.Loc;
  llvm::SmallSet<uint32_t, 16> Seen;
  for (const Operand &A : S.Barrier) {
    llvm::Expected<WireRef> W = resolve(A, /*Quantum=*/true);
    if (!W) {
      C.Wires.resize(O.FirstWire);
      return W.takeError();
    }
    for (uint32_t I = 0; I < W->Count; ++I)
      if (Seen.insert(W->First + I).second)
        C.Wires.push_back(W->First + I);
  }
  O.NumWires = uint32_t(C.Wires.size() - O.FirstWire);
  return addOp(O);
}

llvm::Expected<uint32_t> Elaborator::makeCondition(const Statement &S) {
  bool IsQuantum = false;
  const ir::Register *R = findRegister(S.CondReg.Name, IsQuantum);
  unsigned Len = unsigned(S.CondReg.Name.size());
  if (!R)
    return errorAt(S.CondReg.Loc,
                   fmt::format("use of undeclared classical register '{}' in "
                               "'if'",
                               S.CondReg.Name.str()),
                   Len);
  if (IsQuantum)
    return errorAt(S.CondReg.Loc,
                   fmt::format("'{}' is a quantum register; 'if' compares a "
                               "classical register",
                               S.CondReg.Name.str()),
                   Len);
  ir::Condition Cd;
  Cd.CReg = uint32_t(R - C.CRegs.data());
  // Enough bits for the decimal digits: ceil(digits * log2(10)) + 1.
  unsigned Bits = unsigned(S.CondValue.size() * 3322 / 1000 + 2);
  llvm::APInt V(Bits, S.CondValue, 10);
  if (V.getActiveBits() > R->Size) {
    Cd.Unsatisfiable = true;
    Warnings.warn(S.CondValueLoc,
                  fmt::format("condition can never hold: register '{}' has {} "
                              "bit{} and cannot equal {}",
                              R->Name, R->Size, R->Size == 1 ? "" : "s",
                              S.CondValue.str()),
                  unsigned(S.CondValue.size()));
    Cd.Value = llvm::APInt(R->Size, 0);
  } else {
    Cd.Value = V.zextOrTrunc(R->Size);
  }
  C.Conditions.push_back(std::move(Cd));
  return uint32_t(C.Conditions.size() - 1);
}

} // namespace

/// The built-in qelib1.inc's gates (after U and CX) as reading its text on
/// its own gives them, once per process. Their locations are in the text
/// itself, which SourceFiles::addStaticBuffer does not copy, so they hold in
/// every run. Reading it here goes through the same parser and Elaborator,
/// so a change to either changes the memo with it.
static const std::vector<ir::GateDef> &builtinLibraryGates() {
  static const std::vector<ir::GateDef> Gates = [] {
    SourceFiles Files;
    unsigned Id = Files.addBuffer("<library memo>", "OPENQASM 2.0;\n"
                                                    "include \"qelib1.inc\";\n");
    FrontendLimits Limits;
    DiagnosticSink Warnings;
    Elaborator E(Limits, Warnings, /*ReuseBuiltinLibrary=*/false);
    llvm::Error Err = parseProgram(Files, Id, ParserOptions(), E, Warnings);
    // The built-in text is fixed and tested; an error here is a bug in it.
    if (Err)
      llvm::report_fatal_error(llvm::Twine("the built-in qelib1.inc: ") +
                               llvm::toString(std::move(Err)));
    ir::Circuit C = E.take();
    return std::vector<ir::GateDef>(C.Gates.begin() + 2, C.Gates.end());
  }();
  return Gates;
}

// The memo holds gate ids as a file that includes the library before any
// gate of its own has them, and no limit a user may lower applies to the
// built-in library but the qubits of a gate; anything else reads the text.
bool Elaborator::defineBuiltinLibrary() {
  if (!ReuseBuiltinLibrary || C.Gates.size() != 2)
    return false;
  const std::vector<ir::GateDef> &Library = builtinLibraryGates();
  for (const ir::GateDef &G : Library)
    if (G.numQubits() > Limits.MaxGateQubits)
      return false;
  SawStandardLibrary = true;
  for (const ir::GateDef &G : Library) {
    C.GateByName[G.Name] = ir::GateId(C.Gates.size());
    C.Gates.push_back(G);
  }
  return true;
}

llvm::Expected<ir::Circuit> buildCircuit(SourceFiles &Files, unsigned BufferId,
                                         const FrontendOptions &Opts,
                                         DiagnosticSink &Warnings) {
  Elaborator E(Opts.Limits, Warnings, Opts.ReuseBuiltinLibrary);
  E.reserveFor(Files.mgr().getMemoryBuffer(BufferId)->getBuffer());
  std::vector<llvm::StringRef> Annotations;
  if (llvm::Error Err = parseProgram(Files, BufferId, Opts.Parser, E, Warnings,
                                     &Annotations))
    return std::move(Err);
  ir::Circuit C = E.take();
  if (llvm::Error Err = assignRoles(C, Annotations, Opts.Roles))
    return std::move(Err);
  return C;
}

} // namespace revbound::qasm
