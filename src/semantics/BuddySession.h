//===- BuddySession.h - One run of the BuDDy package, safely --------------===//
//
// Internal to the semantics engines. BuDDy is one global package (bdd_init
// ... bdd_done per run, hooks as globals), so a session holds a process-wide
// lock for its lifetime: engines that use BDDs are serialised, never
// re-entered. Errors and near-full node tables are recorded, not aborted
// on; callers poll them after each step.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SEMANTICS_BUDDYSESSION_H
#define REVBOUND_SEMANTICS_BUDDYSESSION_H

#include <cstdint>
#include <mutex>
#include <string>

namespace revbound::semantics {

/// BuDDy counts nodes in an int.
inline constexpr uint64_t MaxBuddyNodeCap = uint64_t(1) << 28;

/// bdd_init ... bdd_done with recoverable errors and a node cap.
class BuddySession {
public:
  /// Starts BuDDy with a table of at most `MaxNodes` nodes, sized for about
  /// `Variables` variables; ok() says whether it started.
  BuddySession(uint64_t MaxNodes, uint64_t Variables);
  ~BuddySession();
  BuddySession(const BuddySession &) = delete;
  BuddySession &operator=(const BuddySession &) = delete;

  bool ok() const { return Running; }
  const std::string &failure() const { return Failure; }

  /// The first error BuDDy reported in this session (0 if none).
  static int errorCode();
  /// A collection at the node cap freed less than 5%: the table is full.
  static bool nearLimit();
  /// errorCode() or nearLimit().
  static bool failed() { return errorCode() != 0 || nearLimit(); }

  /// bdd_setvarnum(Count) (at least the current count), and its result.
  /// Use this rather than bdd_setvarnum or bdd_extvarnum: it also clears
  /// the node reference stack that BuDDy 2.4 allocates anew, which its
  /// collections would otherwise read before anything wrote it
  /// (BuddySession.cpp).
  int setVariableCount(int Count);

  /// Operator caches of half the node table, up to a fixed size: BuDDy's
  /// caches are lossy, and with much smaller ones an operation recomputes
  /// shared subproblems over and over, in time exponential in the depth of
  /// its functions. Call again as the table grows.
  void fitCaches();

private:
  std::unique_lock<std::mutex> Lock;
  bool Running = false;
  std::string Failure;
  int CacheRatio = 0;
};

} // namespace revbound::semantics

#endif
