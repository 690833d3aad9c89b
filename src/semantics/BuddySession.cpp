//===- BuddySession.cpp - One run of the BuDDy package, safely ------------===//
#include "BuddySession.h"

#include <bdd.h>

#include <algorithm>

// BuDDy 2.4's node reference stack (kernel.h, which bdd.h does not
// include); libbdd exports both symbols. See clearUnwrittenRefs().
extern "C" {
extern int *bddrefstack;
extern int *bddrefstacktop;
}

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

// A BuDDy 2.4 bug made bdd_gbc crash in bdd_mark on uninitialised memory
// in some runs. The recursive operations (apply_rec, ite_rec, quant_rec,
// not_rec, ... in bddop.c; also bdd_setvarnum) keep intermediate results on
// the node reference stack with `PUSHREF(f(...))`, which expands to
// `*(bddrefstacktop++) = f(...)`: the increment and the call are not
// sequenced, and GCC (Debian's libbdd included) bumps the top before the
// call and stores the result after it. A collection inside the call marks
// from every slot below the top, so also from the one reserved for the
// call's result, which nobody has written yet. A slot written once holds a
// stale node index, which is harmless to mark, but bdd_setvarnum (and so
// bdd_extvarnum) mallocs a new stack, whose slots hold whatever the heap
// held: bdd_mark follows such a value far outside the node table. Whether
// it does depends on the heap's contents, hence crashes in some runs only
// (valgrind: "conditional jump depends on uninitialised value" in bdd_mark
// from bdd_gbc; MALLOC_PERTURB_ makes every such run crash).
//
// The fix: setVariableCount() zeroes the new stack right after
// bdd_setvarnum, when no operation is in progress. From then on every slot
// holds 0 (a terminal, which bdd_mark ignores) or a node index BuDDy wrote
// (inside the table, which never shrinks during a session): marking it is
// safe whatever the node holds now (a free node has low == -1 and stops
// bdd_mark, a used one has valid children); at worst a dead node survives
// one more collection.
//
// clearUnwrittenRefs() is the safety net for a caller that sets the
// variable count directly: before each collection it replaces any value
// outside the node table with 0. That is sound too: a live slot always
// holds an index inside the table, so only reserved slots change, and their
// operations overwrite them on return. (It reads the unwritten slots, which
// valgrind reports; with setVariableCount there are none.)
void clearUnwrittenRefs() {
  if (!bddrefstack)
    return;
  int Nodes = bdd_getallocnum();
  for (int *R = bddrefstack; R < bddrefstacktop; ++R)
    if (*R < 0 || *R >= Nodes)
      *R = 0;
}

void onBuddyCollection(int Pre, bddGbcStat *S) {
  if (Pre) {
    // Runs before bdd_gbc marks from the reference stack.
    clearUnwrittenRefs();
    return;
  }
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

int BuddySession::setVariableCount(int Count) {
  int Result = bdd_setvarnum(Count);
  // bdd_setvarnum allocated 2 * Count + 4 slots and may have kept fewer
  // variables on failure; no operation is in progress, so the stack holds
  // nothing live (its top is back at its base).
  if (bddrefstack)
    std::fill(bddrefstack, bddrefstack + 2 * size_t(bdd_varnum()) + 4, 0);
  return Result;
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
