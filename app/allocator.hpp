#pragma once

#if defined(__GLIBC__)
#include <malloc.h>
#endif

namespace ds {

/// Keeps freed memory in the process instead of handing it back to the system after every
/// flight. A flight records its dense steps in vectors of a few hundred kilobytes; with glibc's
/// defaults each one was mapped, faulted in page by page and returned again, a third of the
/// time of a long descent under a canopy (the Earth capsule: 2.5 ms to 1.6 ms per flight,
/// measured with descent-sizer-bench). Call once at the start of main.
inline void tuneAllocator() {
#if defined(__GLIBC__)
    constexpr int keep_bytes = 256 * 1024 * 1024;  // trim the heap only above this
    constexpr int map_bytes = 32 * 1024 * 1024;    // map blocks of their own only above this
    mallopt(M_TRIM_THRESHOLD, keep_bytes);
    mallopt(M_MMAP_THRESHOLD, map_bytes);
#endif
}

}  // namespace ds
