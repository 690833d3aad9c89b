//===- Ledger.cpp - Erasure events and ancilla verdicts -------------------===//
#include "revbound/semantics/Ledger.h"

namespace revbound::semantics {

const char *engineName(EngineKind K) {
  switch (K) {
  case EngineKind::Structural:
    return "structural";
  case EngineKind::Classical:
    return "classical";
  case EngineKind::Density:
    return "density";
  }
  return "structural";
}

const char *erasureKindName(ErasureKind K) {
  switch (K) {
  case ErasureKind::Reset:
    return "reset";
  case ErasureKind::Overwrite:
    return "overwrite";
  case ErasureKind::Discard:
    return "discard";
  }
  return "reset";
}

const char *erasureStatusName(ErasureStatus S) {
  switch (S) {
  case ErasureStatus::Constant:
    return "constant";
  case ErasureStatus::Exact:
    return "exact";
  case ErasureStatus::Unknown:
    return "unknown";
  }
  return "unknown";
}

LedgerTotals totals(const Ledger &L) {
  LedgerTotals T;
  T.Entropy.Exact = L.DiscardJoint.Exact;
  bool AnyDiscard = false;
  for (const ErasureEvent &E : L.Events) {
    ++T.Events;
    if (E.Kind == ErasureKind::Discard) {
      AnyDiscard = true;
      continue;
    }
    T.Entropy.Low += E.BitsLow;
    T.Entropy.High += E.BitsHigh;
    if (E.Status == ErasureStatus::Unknown)
      T.Entropy.Exact = false;
  }
  if (AnyDiscard) {
    T.Entropy.Low += L.DiscardJoint.Low;
    T.Entropy.High += L.DiscardJoint.High;
  }
  return T;
}

} // namespace revbound::semantics
