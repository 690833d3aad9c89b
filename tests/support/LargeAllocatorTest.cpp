//===- LargeAllocatorTest.cpp - Large pools on huge-page boundaries -------===//
#include "revbound/support/LargeAllocator.h"

#include <gtest/gtest.h>

#include <cstdint>
#include <fstream>
#include <numeric>
#include <sstream>
#include <string>

using namespace revbound;

namespace {

constexpr uintptr_t HugePage = uintptr_t(2) << 20;

bool onHugePageBoundary(const void *P) {
  return reinterpret_cast<uintptr_t>(P) % HugePage == 0;
}

/// The mode of transparent huge pages, as the kernel brackets it in
/// "always [madvise] never"; empty where the file is absent.
std::string hugePageMode() {
  std::ifstream In("/sys/kernel/mm/transparent_hugepage/enabled");
  std::string Line;
  std::getline(In, Line);
  size_t Open = Line.find('['), Close = Line.find(']');
  if (Open == std::string::npos || Close == std::string::npos)
    return "";
  return Line.substr(Open + 1, Close - Open - 1);
}

/// The "THPeligible:" value of the mapping holding `P` in
/// /proc/self/smaps (Linux 5.0 and later), or -1 where it is not shown.
int hugePageEligible(const void *P) {
  std::ifstream In("/proc/self/smaps");
  uintptr_t Address = reinterpret_cast<uintptr_t>(P);
  std::string Line;
  bool Inside = false;
  while (std::getline(In, Line)) {
    uintptr_t Begin = 0, End = 0;
    char Dash = 0;
    std::istringstream Head(Line);
    if (Head >> std::hex >> Begin >> Dash >> End && Dash == '-' &&
        Line.find(':') > Line.find(' ')) {
      Inside = Begin <= Address && Address < End;
      continue;
    }
    if (Inside && Line.rfind("THPeligible:", 0) == 0)
      return std::stoi(Line.substr(12));
  }
  return -1;
}

} // namespace

#define SKIP_UNLESS_MAPPED()                                                   \
  if (!LargeBlocksMapped)                                                      \
  GTEST_SKIP() << "under AddressSanitizer large blocks come from operator "   \
                  "new, whose bounds it checks"

TEST(LargeAllocator, LargeBlocksStartOnAHugePage) {
  SKIP_UNLESS_MAPPED();
  LargeVector<uint32_t> V;
  V.reserve(LargeBlockBytes / sizeof(uint32_t));
  EXPECT_TRUE(onHugePageBoundary(V.data()));
  // Growing past the capacity moves the contents into another such block.
  V.resize(V.capacity());
  std::iota(V.begin(), V.end(), 0u);
  V.push_back(7);
  EXPECT_TRUE(onHugePageBoundary(V.data()));
  ASSERT_EQ(V.size(), LargeBlockBytes / sizeof(uint32_t) + 1);
  for (size_t I = 0; I + 1 < V.size(); ++I)
    ASSERT_EQ(V[I], uint32_t(I));
  EXPECT_EQ(V.back(), 7u);
}

TEST(LargeAllocator, SmallBlocksComeFromOperatorNew) {
  // Small vectors must not each take a 2 MiB mapping.
  LargeVector<uint32_t> V(100, 3);
  EXPECT_EQ(V[99], 3u);
  SKIP_UNLESS_MAPPED();
  LargeAllocator<char> A;
  char *Small = A.allocate(LargeBlockBytes - 1);
  char *Large = A.allocate(LargeBlockBytes);
  EXPECT_TRUE(onHugePageBoundary(Large));
  // operator new's blocks carry malloc's header, so even a large one that
  // came from it would not start on a boundary.
  EXPECT_FALSE(onHugePageBoundary(Small));
  A.deallocate(Small, LargeBlockBytes - 1);
  A.deallocate(Large, LargeBlockBytes);
}

TEST(LargeAllocator, LargeBlocksAskForHugePages) {
  SKIP_UNLESS_MAPPED();
  std::string Mode = hugePageMode();
  if (Mode != "madvise" && Mode != "always")
    GTEST_SKIP() << "transparent huge pages are '" << Mode
                 << "' here (/sys/kernel/mm/transparent_hugepage/enabled), "
                    "so no block can get them";
  LargeVector<uint64_t> V(LargeBlockBytes / sizeof(uint64_t), 1);
  int Eligible = hugePageEligible(V.data());
  if (Eligible < 0)
    GTEST_SKIP() << "this kernel's /proc/self/smaps has no THPeligible line";
  EXPECT_EQ(Eligible, 1);
}
