//===- Batch.cpp - Many inputs on a thread pool, results in input order ---===//
#include "Batch.h"

#include "llvm/Support/ThreadPool.h"

#include <fmt/format.h>

#include <algorithm>
#include <atomic>
#include <deque>
#include <future>

namespace revbound::tool {

void runOrdered(size_t Count, unsigned Jobs, size_t Window,
                llvm::function_ref<void(size_t)> Work,
                llvm::function_ref<bool(size_t)> Take,
                llvm::function_ref<void()> Tick) {
  if (Count == 0)
    return;
  // Threads past the window or the count would only wait.
  Window = std::max<size_t>(Window, 1);
  Jobs = unsigned(std::clamp<size_t>(Jobs, 1, std::min(Count, Window)));
  std::atomic<bool> Cancelled = false;
  std::deque<std::shared_future<void>> Pending;
  // The pool's destructor waits for the started Works, which use Work and
  // Cancelled: it is declared after them so that it goes first.
  llvm::ThreadPool Pool(llvm::hardware_concurrency(Jobs));
  size_t Started = 0;
  try {
    for (size_t Next = 0; Next < Count; ++Next) {
      // Work I may reuse the result slot of Take(I - Window), which is done.
      for (; Started < Count && Started < Next + Window; ++Started)
        Pending.push_back(Pool.async([&Work, &Cancelled, I = Started] {
          if (!Cancelled)
            Work(I);
        }));
      while (Pending.front().wait_for(std::chrono::milliseconds(200)) !=
             std::future_status::ready)
        Tick();
      Pending.pop_front();
      if (!Take(Next)) {
        Cancelled = true;
        return;
      }
    }
  } catch (...) {
    Cancelled = true;
    throw;
  }
}

ProgressLine::ProgressLine(size_t Total, bool Enabled, std::ostream &Out,
                           std::chrono::milliseconds Delay,
                           std::chrono::milliseconds Interval)
    : Total(Total), Enabled(Enabled), Out(Out),
      Due(std::chrono::steady_clock::now() + Delay), Interval(Interval) {}

void ProgressLine::show(size_t Done) {
  if (!Enabled)
    return;
  auto Now = std::chrono::steady_clock::now();
  std::string Text = fmt::format("{}/{} files", Done, Total);
  if (Now < Due || Text == Drawn)
    return;
  Due = Now + Interval;
  // Pad over a longer previous line; one write per redraw.
  std::string Line(1, '\r');
  Line += Text;
  if (Drawn.size() > Text.size())
    Line.append(Drawn.size() - Text.size(), ' ');
  Out << Line << std::flush;
  Drawn = std::move(Text);
}

void ProgressLine::clear() {
  if (Drawn.empty())
    return;
  std::string Blank(Drawn.size() + 2, ' ');
  Blank.front() = Blank.back() = '\r';
  Out << Blank << std::flush;
  Drawn.clear();
}

} // namespace revbound::tool
