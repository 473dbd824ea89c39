// Owners of FFTW plans whose making and destruction hold one lock per precision library.
// FFTW's planner is not thread-safe (FFTW 3.3 manual, s. 5.4 "Thread safety": only the execute
// functions are), and cuspmap plans on several threads: the profile side of a texture report
// beside its areal side, and the warm-up of a floor's plans beside its sweep.
// Method: FFTW3 (Frigo & Johnson 2005); RAII.
#pragma once

#include <fftw3.h>

#include <cassert>
#include <mutex>

namespace cuspmap {

/// A plan of one precision (fftw_plan or fftwf_plan) made under that library's planner lock
/// and destroyed under it; moves only.
template <class PlanT, void (*Destroy)(PlanT)>
class LockedFftwPlan {
 public:
  LockedFftwPlan() = default;
  /// Calls `make()` (an fftw_plan_* call returning the plan) with the planner locked.
  template <class Make>
  explicit LockedFftwPlan(Make&& make) {
    const std::lock_guard<std::mutex> lock(planner_mutex());
    plan_ = make();
    assert(plan_ != nullptr && "FFTW could not plan");
  }
  ~LockedFftwPlan() { reset(); }
  LockedFftwPlan(LockedFftwPlan&& o) noexcept : plan_(o.plan_) { o.plan_ = nullptr; }
  LockedFftwPlan& operator=(LockedFftwPlan&& o) noexcept {
    if (this != &o) {
      reset();
      plan_ = o.plan_;
      o.plan_ = nullptr;
    }
    return *this;
  }
  LockedFftwPlan(const LockedFftwPlan&) = delete;
  LockedFftwPlan& operator=(const LockedFftwPlan&) = delete;

  PlanT get() const { return plan_; }

  /// The lock of this precision's planner (one per library: libfftw3 and libfftw3f keep
  /// separate planners and may plan at the same time).
  static std::mutex& planner_mutex() {
    static std::mutex m;
    return m;
  }

 private:
  void reset() {
    if (plan_ == nullptr) return;
    const std::lock_guard<std::mutex> lock(planner_mutex());
    Destroy(plan_);
    plan_ = nullptr;
  }
  PlanT plan_ = nullptr;
};

/// Double precision plan (libfftw3).
using FftwPlan = LockedFftwPlan<fftw_plan, fftw_destroy_plan>;
/// Single precision plan (libfftw3f).
using FftwfPlan = LockedFftwPlan<fftwf_plan, fftwf_destroy_plan>;

}  // namespace cuspmap
