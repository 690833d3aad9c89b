//===- LargeAllocator.cpp - Pools of large circuits on huge pages ---------===//
#include "revbound/support/LargeAllocator.h"

#include <cstdint>

#if defined(__linux__)
#include <sys/mman.h>
#endif

namespace revbound {

namespace {
constexpr size_t HugePage = size_t(2) << 20;

size_t roundUp(size_t Bytes, size_t To) { return (Bytes + To - 1) / To * To; }
} // namespace

#if defined(__linux__)

void *allocateLargeBlock(size_t Bytes) {
  if (Bytes > SIZE_MAX - 2 * HugePage)
    throw std::bad_alloc();
  size_t Size = roundUp(Bytes, HugePage);
  // Map one huge page more than needed, then unmap what lies before the
  // first boundary and after the block, so that it starts on one.
  size_t Mapped = Size + HugePage;
  void *Raw = mmap(nullptr, Mapped, PROT_READ | PROT_WRITE,
                   MAP_PRIVATE | MAP_ANONYMOUS, -1, 0);
  if (Raw == MAP_FAILED)
    throw std::bad_alloc();
  uintptr_t Start = reinterpret_cast<uintptr_t>(Raw);
  uintptr_t Aligned = roundUp(Start, HugePage);
  if (Aligned > Start)
    munmap(Raw, Aligned - Start);
  size_t After = Start + Mapped - (Aligned + Size);
  if (After > 0)
    munmap(reinterpret_cast<void *>(Aligned + Size), After);
  void *Block = reinterpret_cast<void *>(Aligned);
#if defined(MADV_HUGEPAGE)
  // Only a hint: where it fails, the block is served in small pages.
  (void)madvise(Block, Size, MADV_HUGEPAGE);
#endif
  return Block;
}

void freeLargeBlock(void *Block, size_t Bytes) noexcept {
  munmap(Block, roundUp(Bytes, HugePage));
}

#else

void *allocateLargeBlock(size_t Bytes) {
  return ::operator new(Bytes, std::align_val_t(HugePage));
}

void freeLargeBlock(void *Block, size_t) noexcept {
  ::operator delete(Block, std::align_val_t(HugePage));
}

#endif

} // namespace revbound
