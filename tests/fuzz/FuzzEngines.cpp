//===- FuzzEngines.cpp - libFuzzer entry over the semantic engines --------===//
//
// Arbitrary bytes through the front end (role annotations included), then
// semantics::runEngine with small limits so that every input stays fast.
// The first byte chooses the engine when it is a control byte below 8:
// bits 0-1 pick auto, structural, classical or density, bit 2 runs the
// engine a second time and requires the same ledger (DESIGN.md: output is
// deterministic; BuDDy is one global package, so state left from a run must
// not change the next). Any other first byte is part of the text and the
// engine is auto, so that plain circuits are seeds as they are.
//
// Beyond crashes, the harness traps on ledgers that break what Ledger.h and
// DESIGN.md ("Erasure ledger") promise: intervals with 0 <= low <= high,
// at most one bit for a reset or an overwrite (DESIGN.md), no bits for a
// proved constant, one verdict per ancilla qubit, probabilities in [0, 1].
//
//===----------------------------------------------------------------------===//
#include "FuzzLimits.h"
#include "revbound/qasm/Frontend.h"
#include "revbound/semantics/Engines.h"
#include "revbound/semantics/Ledger.h"

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>

namespace {

using namespace revbound;

/// Rounding slack for entropies computed in doubles.
constexpr double Slack = 1e-9;

[[noreturn]] void broken(const char *What) {
  std::fprintf(stderr, "revbound_fuzz_engines: ledger invariant broken: %s\n",
               What);
  std::abort();
}

void checkInterval(double Low, double High, double Max, const char *What) {
  if (!std::isfinite(Low) || !std::isfinite(High) || Low < -Slack ||
      Low > High + Slack || High > Max + Slack)
    broken(What);
}

void checkLedger(const ir::Circuit &C, const semantics::Ledger &L) {
  using semantics::ErasureKind;
  using semantics::ErasureStatus;
  uint64_t Discarded = 0, Ancillas = 0;
  for (uint32_t Q = 0; Q < C.NumQubits; ++Q) {
    Discarded += ir::isDiscarded(C.role(Q));
    Ancillas += C.role(Q) == ir::WireRole::Ancilla;
  }
  for (const semantics::ErasureEvent &E : L.Events) {
    // A reset's A = {q}, an overwrite's A = {q, c} with c taking one bit
    // of q, a discard a single qubit's marginal: at most one bit each.
    checkInterval(E.BitsLow, E.BitsHigh, 1.0, "event interval");
    if (E.Status == ErasureStatus::Constant && E.BitsHigh > Slack)
      broken("a proved constant erases bits");
    if (E.Status == ErasureStatus::Exact &&
        std::fabs(E.BitsHigh - E.BitsLow) > Slack)
      broken("an exact event with a wide interval");
    if (E.Kind == ErasureKind::Overwrite ? E.Wire >= C.NumClbits
                                         : E.Wire >= C.NumQubits)
      broken("an event on a wire that does not exist");
  }
  checkInterval(L.DiscardJoint.Low, L.DiscardJoint.High, double(Discarded),
                "joint discard interval");
  if (L.Ancillas.size() != Ancillas)
    broken("not one verdict per ancilla qubit");
  for (const semantics::AncillaVerdict &A : L.Ancillas) {
    if (A.Qubit >= C.NumQubits || C.role(A.Qubit) != ir::WireRole::Ancilla)
      broken("a verdict for a qubit that is no ancilla");
    if (A.DirtyProbability &&
        !(*A.DirtyProbability >= -Slack && *A.DirtyProbability <= 1 + Slack))
      broken("a dirty probability outside [0, 1]");
    if (A.DirtySamples > A.Samples)
      broken("more dirty samples than samples");
  }
  semantics::LedgerTotals T = semantics::totals(L);
  if (T.Events != L.Events.size())
    broken("totals count other events than the ledger lists");
  checkInterval(T.Entropy.Low, T.Entropy.High, HUGE_VAL, "total interval");
}

bool sameLedger(const semantics::Ledger &A, const semantics::Ledger &B) {
  if (A.Engine != B.Engine || A.Reason != B.Reason || A.Notes != B.Notes ||
      A.Events.size() != B.Events.size() ||
      A.Ancillas.size() != B.Ancillas.size() ||
      A.DiscardJoint.Low != B.DiscardJoint.Low ||
      A.DiscardJoint.High != B.DiscardJoint.High ||
      A.DiscardJoint.Exact != B.DiscardJoint.Exact)
    return false;
  for (size_t I = 0; I < A.Events.size(); ++I) {
    const semantics::ErasureEvent &X = A.Events[I], &Y = B.Events[I];
    if (X.Kind != Y.Kind || X.Wire != Y.Wire || X.Status != Y.Status ||
        X.BitsLow != Y.BitsLow || X.BitsHigh != Y.BitsHigh ||
        X.Samples != Y.Samples || X.BitsEstimate != Y.BitsEstimate ||
        X.Loc.getPointer() != Y.Loc.getPointer())
      return false;
  }
  for (size_t I = 0; I < A.Ancillas.size(); ++I) {
    const semantics::AncillaVerdict &X = A.Ancillas[I], &Y = B.Ancillas[I];
    if (X.Qubit != Y.Qubit || X.Clean != Y.Clean ||
        X.Counterexample != Y.Counterexample ||
        X.DirtyProbability != Y.DirtyProbability || X.Samples != Y.Samples ||
        X.DirtySamples != Y.DirtySamples)
      return false;
  }
  return true;
}

} // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *Data, size_t Size) {
  using namespace revbound;
  static const semantics::EngineChoice Choices[] = {
      semantics::EngineChoice::Auto, semantics::EngineChoice::Structural,
      semantics::EngineChoice::Classical, semantics::EngineChoice::Density};
  semantics::EngineChoice Choice = semantics::EngineChoice::Auto;
  bool Twice = false;
  if (Size > 0 && Data[0] < 8) {
    Choice = Choices[Data[0] & 3];
    Twice = (Data[0] & 4) != 0;
    ++Data;
    --Size;
  }
  SourceFiles Files;
  unsigned Id = Files.addBuffer(
      "fuzz.qasm", llvm::StringRef(reinterpret_cast<const char *>(Data), Size));
  qasm::FrontendOptions Front = fuzz::smallFrontendOptions(256, 20'000);
  DiagnosticSink Warnings;
  llvm::Expected<ir::Circuit> C =
      qasm::buildCircuit(Files, Id, Front, Warnings);
  if (!C) {
    llvm::consumeError(C.takeError());
    return 0;
  }
  semantics::EngineOptions Opts = fuzz::smallEngineOptions(Choice);
  llvm::Expected<semantics::Ledger> L = semantics::runEngine(*C, Opts);
  if (!L) {
    // An explicit choice that cannot run is an error with a message.
    std::string Message = llvm::toString(L.takeError());
    if (Message.empty())
      broken("an engine error without a message");
    return 0;
  }
  checkLedger(*C, *L);
  if (Twice) {
    llvm::Expected<semantics::Ledger> Again = semantics::runEngine(*C, Opts);
    if (!Again)
      broken("a second run failed where the first succeeded");
    if (!sameLedger(*L, *Again))
      broken("a second run gave another ledger");
  }
  return 0;
}
