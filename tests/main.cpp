// Catch2 main. In debug builds, floating-point traps catch NaN-producing arithmetic early.
#define CATCH_CONFIG_RUNNER
#include <catch2/catch.hpp>

#ifndef NDEBUG
#include <cfenv>
#endif

int main(int argc, char* argv[]) {
#if !defined(NDEBUG) && defined(__GLIBC__) && !defined(CUSPMAP_NO_FPE)
  feenableexcept(FE_INVALID | FE_DIVBYZERO);
#endif
  return Catch::Session().run(argc, argv);
}
