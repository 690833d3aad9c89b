//===- Checked.h - Exact 64-bit counting that never wraps ----------------===//
#ifndef REVBOUND_SUPPORT_CHECKED_H
#define REVBOUND_SUPPORT_CHECKED_H

#include <cstdint>

namespace revbound {

/// Adds `B` to `A`; returns false (leaving `A` unchanged) if the sum would
/// pass 2^64 - 1.
[[nodiscard]] inline bool addChecked(uint64_t &A, uint64_t B) {
  uint64_t R;
  if (__builtin_add_overflow(A, B, &R))
    return false;
  A = R;
  return true;
}

} // namespace revbound

#endif
