//===- LargeAllocator.h - Pools of large circuits on huge pages -----------===//
//
// A 1M-op file fills about 50 MB of pools. At 4 KiB a page that is some
// 12,000 page faults, each zeroing a page in the kernel; on two cores they
// took a quarter of the run. Transparent huge pages (2 MiB) need 512 times
// fewer faults for the same bytes, but most kernels give them only to
// memory that asks (`madvise` in /sys/kernel/mm/transparent_hugepage/
// enabled), and only for whole 2 MiB pages of it. So large blocks are
// mapped here on a 2 MiB boundary and ask; small ones go to operator new.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SUPPORT_LARGEALLOCATOR_H
#define REVBOUND_SUPPORT_LARGEALLOCATOR_H

#include <cstddef>
#include <memory>
#include <new>
#include <vector>

namespace revbound {

#if defined(__has_feature)
#if __has_feature(address_sanitizer)
#define REVBOUND_ADDRESS_SANITIZER 1
#endif
#endif
#if defined(__SANITIZE_ADDRESS__)
#define REVBOUND_ADDRESS_SANITIZER 1
#endif

/// Whether large blocks are mapped on their own. Not under
/// AddressSanitizer: it checks only the bounds of memory it allocates, so
/// mapped pools would escape its checks.
#if defined(REVBOUND_ADDRESS_SANITIZER)
inline constexpr bool LargeBlocksMapped = false;
#else
inline constexpr bool LargeBlocksMapped = true;
#endif

/// Blocks of at least this many bytes are mapped on their own.
inline constexpr size_t LargeBlockBytes = size_t(4) << 20;

/// `Bytes` (at least LargeBlockBytes) of memory starting on a
/// huge-page boundary, advised to be backed by huge pages where the system
/// has them; throws std::bad_alloc when the system refuses.
void *allocateLargeBlock(size_t Bytes);
/// Returns a block from allocateLargeBlock(`Bytes`).
void freeLargeBlock(void *Block, size_t Bytes) noexcept;

/// std::allocator, but blocks of LargeBlockBytes or more come from
/// allocateLargeBlock where LargeBlocksMapped. Stateless: any two compare
/// equal.
template <typename T> struct LargeAllocator {
  using value_type = T;

  LargeAllocator() = default;
  template <typename U> LargeAllocator(const LargeAllocator<U> &) noexcept {}

  T *allocate(size_t N) {
    if (N > SIZE_MAX / sizeof(T))
      throw std::bad_alloc();
    if (LargeBlocksMapped && N * sizeof(T) >= LargeBlockBytes)
      return static_cast<T *>(allocateLargeBlock(N * sizeof(T)));
    return std::allocator<T>().allocate(N);
  }
  void deallocate(T *P, size_t N) noexcept {
    // N is the count P was allocated with, so it tells which way it came.
    if (LargeBlocksMapped && N * sizeof(T) >= LargeBlockBytes)
      freeLargeBlock(P, N * sizeof(T));
    else
      std::allocator<T>().deallocate(P, N);
  }

  template <typename U> bool operator==(const LargeAllocator<U> &) const {
    return true;
  }
  template <typename U> bool operator!=(const LargeAllocator<U> &) const {
    return false;
  }
};

/// The vector type of the circuit's pools and of per-op analysis arrays.
template <typename T> using LargeVector = std::vector<T, LargeAllocator<T>>;

} // namespace revbound

#endif
