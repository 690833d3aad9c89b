//===- Batch.h - Many inputs on a thread pool, results in input order -----===//
//
// Internal to the driver. A batch's output must not depend on the number of
// threads (DESIGN.md: same input, same bytes), so work runs in any order
// but results are handed on strictly in input order; at most a window of
// finished results waits, so a batch of any length runs in bounded memory.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_TOOL_BATCH_H
#define REVBOUND_TOOL_BATCH_H

#include "llvm/ADT/STLFunctionalExtras.h"

#include <chrono>
#include <cstddef>
#include <ostream>
#include <string>

namespace revbound::tool {

/// Runs Work(I) for every I in [0, Count) on `Jobs` threads and Take(I) on
/// the calling thread for I = 0, 1, ... in order, each once Work(I) has
/// returned. At most `Window` Works are started past the last Take, so
/// that many results at most are held (Work I may reuse the slot of
/// result I - Window). Work must not throw.
/// When Take returns false or throws, no further Work starts and the
/// running ones are waited for. Tick runs about five times a second while
/// the next result is awaited.
void runOrdered(size_t Count, unsigned Jobs, size_t Window,
                llvm::function_ref<void(size_t)> Work,
                llvm::function_ref<bool(size_t)> Take,
                llvm::function_ref<void()> Tick);

/// A "12/200 files" line on `Out` (standard error), drawn only when
/// `Enabled` (the caller passes whether it is a terminal) and the run has
/// lasted more than `Delay`; short runs and logs stay silent. Redrawn at
/// most once per `Interval`, so that many small files do not flood the
/// terminal.
class ProgressLine {
public:
  ProgressLine(
      size_t Total, bool Enabled, std::ostream &Out,
      std::chrono::milliseconds Delay = std::chrono::seconds(2),
      std::chrono::milliseconds Interval = std::chrono::milliseconds(100));
  ~ProgressLine() { clear(); }
  ProgressLine(const ProgressLine &) = delete;
  ProgressLine &operator=(const ProgressLine &) = delete;

  /// Redraws the line with `Done` files finished, if it is due.
  void show(size_t Done);
  /// Erases the line if drawn: before other output to standard error, and
  /// at the end.
  void clear();

private:
  size_t Total;
  bool Enabled;
  std::ostream &Out;
  std::chrono::steady_clock::time_point Due;
  std::chrono::milliseconds Interval;
  std::string Drawn; // what the terminal shows now; empty when erased
};

} // namespace revbound::tool

#endif
