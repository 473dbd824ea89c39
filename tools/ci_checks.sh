#!/usr/bin/env bash
# CI checks beyond the normal build and tests (run after them by .ci/run):
#  1. the whole test suite built with AddressSanitizer + UndefinedBehaviorSanitizer (build-asan/);
#  2. every libFuzzer target for a short fixed time (build-fuzz/, clang), failing on any crash,
#     leak, timeout or finding. Seconds per target: CUSPMAP_FUZZ_SECONDS (default 30).
# Prints one timing line per stage so the extra CI time stays visible (budget: ~8 min, 2 cores).
set -euo pipefail
cd "$(dirname "$0")/.."
jobs="$(nproc)"
stage_start=$SECONDS
stage_done() { echo "ci_checks: $1 done in $((SECONDS - stage_start)) s"; stage_start=$SECONDS; }

# -O1 -g1: the usual sanitizer setting; line tables for reports without full debug info cost.
# Warnings are enforced by the normal -Werror build; here they stay warnings, and GCC 12's
# -Wmaybe-uninitialized, which misfires on std::regex/std::function under -fsanitize=address
# (hundreds of lines of log), is off.
cmake -S . -B build-asan -DCMAKE_BUILD_TYPE=None -DCMAKE_CXX_FLAGS="-O1 -g1 -Wno-maybe-uninitialized" \
  -DCUSPMAP_SANITIZE=ON -DCUSPMAP_WERROR=OFF >/dev/null
cmake --build build-asan -j"$jobs"
stage_done "sanitizer build"
# Leaks count as failures; any UB report stops the process (-fno-sanitize-recover=all).
ASAN_OPTIONS=detect_leaks=1:strict_string_checks=1:detect_stack_use_after_return=1 \
UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1 \
  ctest --test-dir build-asan --output-on-failure
stage_done "sanitizer tests"

# Two targets at a time on two cores: 8 targets x 30 s take 2 minutes.
# A target with an open finding (tests/fuzz/regressions/open.txt) is replayed, not fuzzed.
FUZZ_JOBS="$jobs" FUZZ_PARALLEL="$jobs" FUZZ_SKIP_OPEN=1 tools/fuzz.sh "${CUSPMAP_FUZZ_SECONDS:-30}"
stage_done "fuzzing"
