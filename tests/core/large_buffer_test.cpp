// Large buffers handed on: reuse keeps the memory's pages and says which part holds old values.
// Sources: mremap(2) and mmap(2) (Linux man-pages): a grown anonymous mapping's new pages read
// as zero; a fresh anonymous mapping reads as zero.
#include "core/large_buffer.h"

#include <cstddef>
#include <cstdint>

#include "test_support.h"

using namespace cuspmap;

TEST_CASE("LargeBuffer: fresh memory is zero; spent memory grows with a zero tail", "[core]") {
  constexpr std::size_t kFirst = std::size_t{3} << 20;  // 12 MiB of floats: the mapped path
  LargeBuffer<float> a(kFirst);
  for (std::size_t k = 0; k < kFirst; k += 4096) REQUIRE(a[k] == 0.0f);
  for (std::size_t k = 0; k < kFirst; ++k) a[k] = 1.0f;
  std::size_t stale = 0;
  LargeBuffer<float> b(kFirst + (kFirst / 2), std::move(a).release(), &stale);
  CHECK(a.size() == 0);
  CHECK(stale == kFirst);  // the old values are kept (not cleared) ...
  CHECK(b[0] == 1.0f);
  CHECK(b[kFirst - 1] == 1.0f);
  for (std::size_t k = kFirst; k < b.size(); k += 1024) REQUIRE(b[k] == 0.0f);  // ... the rest is zero
  // Grown at a 2 MiB boundary, so its huge pages move whole (core/large_buffer.cpp).
  CHECK(reinterpret_cast<std::uintptr_t>(b.data()) % (std::uintptr_t{2} << 20) == 0);
}

TEST_CASE("LargeBuffer: spent memory shrinks in place; small or empty spent memory is fresh",
          "[core]") {
  constexpr std::size_t kBig = std::size_t{2} << 20;  // 16 MiB of doubles
  LargeBuffer<double> a(kBig);
  for (std::size_t k = 0; k < kBig; ++k) a[k] = 2.0;
  std::size_t stale = 7;
  LargeBuffer<float> b(kBig, std::move(a).release(), &stale);  // 8 MiB of floats
  CHECK(stale == kBig);
  CHECK(b[kBig - 1] != 0.0f);  // old bytes, unspecified as floats but not cleared
  LargeBuffer<float> small(100);
  std::size_t small_stale = 7;
  LargeBuffer<float> c(1000, std::move(small).release(), &small_stale);
  CHECK(small_stale == 0);
  for (std::size_t k = 0; k < c.size(); ++k) REQUIRE(c[k] == 0.0f);
  std::size_t none_stale = 7;
  LargeBuffer<float> d(kBig, LargeBytes(), &none_stale);
  CHECK(none_stale == 0);
  for (std::size_t k = 0; k < kBig; k += 4096) REQUIRE(d[k] == 0.0f);
}

TEST_CASE("LargeBuffer: spent memory of any size grows in place of fresh memory", "[core]") {
  // A size that is neither a multiple of 2 MiB nor of a page (a lay transform's 1200 x 608
  // complex doubles plus a little): the whole mapping must move, not fall back to fresh memory.
  constexpr std::size_t kFirst = (std::size_t{11673600} + 1000) / sizeof(double);
  LargeBuffer<double> a(kFirst);
  for (std::size_t k = 0; k < kFirst; ++k) a[k] = 3.0;
  std::size_t stale = 0;
  LargeBuffer<float> b(std::size_t{14991360} / sizeof(float), std::move(a).release(), &stale);
  CHECK(stale == kFirst * sizeof(double) / sizeof(float));  // 0 would mean the move failed (mremap(2): EFAULT)
  CHECK(reinterpret_cast<const double*>(b.data())[kFirst - 1] == 3.0);
  CHECK(reinterpret_cast<std::uintptr_t>(b.data()) % (std::uintptr_t{2} << 20) == 0);
}
