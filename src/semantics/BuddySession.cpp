//===- BuddySession.cpp - One run of the BuDDy package, safely ------------===//
#include "BuddySession.h"

#include <bdd.h>

#include <algorithm>

namespace revbound::semantics {
namespace {

/// The operator caches' size past which they stop growing with the node
/// table (BuDDy keeps six caches of 24-byte entries).
constexpr int CacheEntries = 1 << 20;

// The hooks' state for the session in progress (BuDDy calls plain
// functions); guarded by BuddyMutex.
std::mutex BuddyMutex;
int BuddyErrorCode = 0;
bool BuddyNearLimit = false;

void onBuddyError(int Code) {
  // After an error BuDDy's operations return false until bdd_done; the
  // caller notices the code after the current step and stops.
  if (BuddyErrorCode == 0)
    BuddyErrorCode = Code;
}

void onBuddyCollection(int Pre, bddGbcStat *S) {
  if (Pre)
    return;
  bddStat St;
  bdd_stats(&St);
  // With the table at its cap, a collection that frees little is soon
  // followed by another: stop instead of collecting after every node.
  if (St.maxnodenum > 0 && S->nodes >= St.maxnodenum - St.maxnodenum / 50 &&
      S->freenodes < S->nodes / 20)
    BuddyNearLimit = true;
}

} // namespace

BuddySession::BuddySession(uint64_t MaxNodes, uint64_t Variables)
    : Lock(BuddyMutex) {
  if (bdd_isrunning()) {
    Failure = "the BDD library was already in use";
    return;
  }
  BuddyErrorCode = 0;
  BuddyNearLimit = false;
  int Cap = int(std::clamp<uint64_t>(MaxNodes, 16, MaxBuddyNodeCap));
  int Initial = int(std::min<uint64_t>(Cap, 2 * Variables + (1u << 15)));
  if (bdd_init(Initial, 10007) < 0) {
    Failure = "the BDD library could not start";
    return;
  }
  Running = true;
  // bdd_init installs handlers that print (collections) and abort
  // (errors); neither may happen inside a library.
  bdd_error_hook(onBuddyError);
  bdd_gbc_hook(onBuddyCollection);
  bdd_resize_hook(nullptr);
  // Grow the table in big steps: each growth rehashes the whole table.
  bdd_setmaxincrease(1 << 20);
  fitCaches();
  // The cap must exceed the table bdd_init rounded up to a prime.
  bdd_setmaxnodenum(std::max(Cap, bdd_getallocnum() + 1));
}

BuddySession::~BuddySession() {
  if (Running)
    bdd_done();
}

int BuddySession::errorCode() { return BuddyErrorCode; }
bool BuddySession::nearLimit() { return BuddyNearLimit; }

void BuddySession::fitCaches() {
  int Table = bdd_getallocnum();
  int Ratio = std::max(2, int(Table / CacheEntries));
  if (Ratio != CacheRatio)
    bdd_setcacheratio(Ratio);
  CacheRatio = Ratio;
}

} // namespace revbound::semantics
