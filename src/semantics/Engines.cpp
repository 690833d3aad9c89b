//===- Engines.cpp - Choosing a semantic engine ---------------------------===//
#include "revbound/semantics/Engines.h"

#include "EngineSupport.h"
#include "revbound/semantics/GateExpander.h"

#include <fmt/format.h>

#include <algorithm>

#include <pthread.h>

namespace revbound::semantics {

std::optional<EngineChoice> parseEngineChoice(llvm::StringRef Name) {
  if (Name == "auto")
    return EngineChoice::Auto;
  if (Name == "structural")
    return EngineChoice::Structural;
  if (Name == "classical")
    return EngineChoice::Classical;
  if (Name == "density")
    return EngineChoice::Density;
  return std::nullopt;
}

/// Gate applications of the whole circuit after expansion (saturating).
static uint64_t expandedOps(const ir::Circuit &C) {
  GateExpander Sizes(C, 0, 0);
  uint64_t Total = 0;
  for (const ir::Op &O : C.Ops) {
    uint64_t S = O.Kind == ir::OpKind::Gate ? Sizes.expandedSize(O.Gate) : 1;
    Total = Total > UINT64_MAX - S ? UINT64_MAX : Total + S;
  }
  return Total;
}

/// Qubits that some operation other than a barrier touches: the density
/// engine simulates only those.
static unsigned activeQubits(const ir::Circuit &C) {
  std::vector<bool> Used(C.NumQubits, false);
  unsigned Count = 0;
  for (const ir::Op &O : C.Ops) {
    if (O.Kind == ir::OpKind::Barrier)
      continue;
    llvm::ArrayRef<uint32_t> W = C.wires(O);
    if (O.Kind == ir::OpKind::Measure)
      W = W.take_front(1);
    for (uint32_t Q : W)
      if (!Used[Q]) {
        Used[Q] = true;
        ++Count;
      }
  }
  return Count;
}

/// Runs the classical engine on a thread with a large stack: BuDDy's
/// operations and its garbage collector recurse once per variable level, and
/// circuits with thousands of fresh variables go deeper than a default
/// 8 MiB stack. The stack is reserved, not touched, so it costs no memory
/// until used.
static Ledger runClassicalOnLargeStack(const ir::Circuit &C,
                                       const EngineOptions &Opts) {
  struct Job {
    const ir::Circuit *C;
    const EngineOptions *Opts;
    Ledger Result;
  } J{&C, &Opts, {}};
  pthread_attr_t Attr;
  pthread_t Thread;
  bool Started = pthread_attr_init(&Attr) == 0 &&
                 pthread_attr_setstacksize(&Attr, size_t(1) << 30) == 0 &&
                 pthread_create(
                     &Thread, &Attr,
                     [](void *P) -> void * {
                       auto *J = static_cast<Job *>(P);
                       J->Result = runClassical(*J->C, *J->Opts);
                       return nullptr;
                     },
                     &J) == 0;
  pthread_attr_destroy(&Attr);
  if (!Started)
    return runClassical(C, Opts); // no thread: the caller's stack will do
  pthread_join(Thread, nullptr);
  return std::move(J.Result);
}

/// True when the ledger leaves nothing open: every event and every ancilla
/// decided, the discard's joint entropy exact.
static bool complete(const Ledger &L) {
  for (const ErasureEvent &E : L.Events)
    if (E.Kind != ErasureKind::Discard && E.Status == ErasureStatus::Unknown)
      return false;
  for (const AncillaVerdict &A : L.Ancillas)
    if (!A.Clean)
      return false;
  bool AnyDiscard = false;
  for (const ErasureEvent &E : L.Events)
    AnyDiscard |= E.Kind == ErasureKind::Discard;
  return !AnyDiscard || L.DiscardJoint.Exact;
}

llvm::Expected<Ledger> runEngine(const ir::Circuit &C,
                                 const EngineOptions &Opts) {
  switch (Opts.Choice) {
  case EngineChoice::Structural: {
    Ledger L = runStructural(C, Opts);
    L.Reason = "structural, as chosen with --engine";
    return L;
  }
  case EngineChoice::Classical: {
    Ledger L = runClassicalOnLargeStack(C, Opts);
    L.Reason = "classical, as chosen with --engine";
    return L;
  }
  case EngineChoice::Density: {
    unsigned Active = activeQubits(C);
    uint64_t Ops = Active <= Opts.MaxDensityQubits ? expandedOps(C) : 0;
    if (Ops > Opts.MaxDensityWork >> (2 * Active))
      return llvm::createStringError(
          llvm::inconvertibleErrorCode(),
          "the density engine would need more than %llu matrix-entry "
          "updates for %llu operations on %u qubits (minutes or more); use "
          "--engine classical or auto",
          (unsigned long long)Opts.MaxDensityWork, (unsigned long long)Ops,
          Active);
    llvm::Expected<Ledger> L = runDensity(C, Opts);
    if (L)
      L->Reason = "density, as chosen with --engine";
    return L;
  }
  case EngineChoice::Auto:
    break;
  }

  if (!canErase(C)) {
    Ledger L;
    L.Engine = EngineKind::Structural;
    L.DiscardJoint.Exact = true;
    L.Reason = "structural: nothing can erase information (no reset, no bit "
               "measured twice, no ancilla or garbage qubits)";
    return L;
  }
  uint64_t Size = expandedOps(C);
  if (Size > std::min(Opts.MaxExpandedOps, Opts.MaxAutoClassicalOps)) {
    Ledger L = runStructural(C, Opts);
    L.Reason = fmt::format(
        "structural: the circuit expands to {} operations, more than the "
        "{} the classical engine takes under auto (--engine classical "
        "runs it anyway)",
        Size, std::min(Opts.MaxExpandedOps, Opts.MaxAutoClassicalOps));
    return L;
  }
  Ledger Classical = runClassicalOnLargeStack(C, Opts);
  if (complete(Classical)) {
    Classical.Reason =
        "classical: every erasure and every ancilla was decided exactly";
    return Classical;
  }
  std::string WhyNot;
  unsigned Active = activeQubits(C);
  if (Active > Opts.MaxDensityQubits) {
    WhyNot = fmt::format("{} qubits in use, over the density engine's {}",
                         Active, Opts.MaxDensityQubits);
  } else {
    // 4^n entries, touched once or twice per gate application.
    uint64_t Work = (uint64_t(1) << (2 * Active));
    if (Size > Opts.MaxAutoDensityWork / Work) {
      WhyNot = fmt::format("{} operations on {} qubits would take the "
                           "density engine too long",
                           Size, Active);
    } else {
      llvm::Expected<Ledger> Density = runDensity(C, Opts);
      if (Density) {
        Density->Reason = fmt::format(
            "density: {} qubits fit the exact simulation and the classical "
            "engine left some figures open",
            Active);
        return std::move(*Density);
      }
      WhyNot = llvm::toString(Density.takeError());
    }
  }
  Classical.Reason = fmt::format(
      "classical (not exact everywhere); no density simulation: {}", WhyNot);
  return Classical;
}

} // namespace revbound::semantics
