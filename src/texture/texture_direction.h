// Spatial parameters of a surface: autocorrelation length Sal, texture aspect ratio Str (from
// the areal autocorrelation function) and the lay direction (from the power spectrum).
// Inputs: residual Heightfield um over mm cells (plane removed); NaN cells are filled with the
// plane (0) for the FFT and left out of the autocorrelation's pair counts.
// Cost O(N log N) for N padded cells (FFTW), plus O(angles * radius) for the decay search.
// Method: ISO 25178-2:2012 §4.2.1-4.2.2 (f_ACF, Sal, Str with s = 0.2); lay from the power
// spectral density's doubled-angle mean direction (Mardia & Jupp, Directional Statistics, 2000,
// axial data), computed with FFTW3 (Frigo & Johnson 2005).
#pragma once

#include "core/heightfield.h"
#include "core/large_buffer.h"
#include "texture/fit_plane.h"
#include "texture/lay_spectrum.h"

namespace cuspmap {

/// ISO 25178-2 default threshold s for Sal and Str.
inline constexpr double kAcfThreshold = 0.2;
/// Angular step of the decay-length search, deg (0.5 deg resolves Str of strongly directional
/// surfaces without a noticeable cost).
inline constexpr double kAcfAngleStepDeg = 0.5;

/// Spatial parameters and lay.
struct TextureDirection {
  double sal_mm = 0.0;           ///< Sal: shortest distance at which the ACF decays to s
  double str = 0.0;              ///< Str: Sal / longest decay distance, 0..1 (1 = isotropic)
  bool str_upper_bound = false;  ///< some direction never decayed within half the field: Str is
                                 ///< at most the value given (computed with that half size)
  bool sal_found = false;        ///< the ACF decayed to s in at least one direction
  double lay_deg = 0.0;          ///< direction of the lay (the grooves), deg from +X, [0, 180)
  double lay_strength = 0.0;     ///< 0 (no preferred direction) .. 1 (one direction only)
};

/// Computes Sal, Str and the lay of a residual surface.
/// @param[in] residual heightfield with its mean plane removed; needs nx, ny >= 2 and a finite
///            cell (else all zeros)
/// @param[in] threads  workers for the transforms and the ray search, 0 = all hardware threads;
///            the result is bit-identical for any count
TextureDirection texture_direction(const Heightfield& residual, int threads = 0);

/// As above, of `hf` less `remove` (residual_row's arithmetic), made row by row into the
/// padded transform so that no whole residual is held.
/// @param[in] remove   plane to take off, null = none (hf is the residual)
/// @param[in] lay      optional lay sums of this residual already taken (texture/lay_spectrum.h);
///                     null = computed here
/// @param[in] spent    optional memory of a finished transform (lay_spectrum's), reused for the
///                     padded one: pages already held are cheaper than fresh ones
/// @param[in,out] release optional: its heights are freed once the padded transform holds
///                     them (a caller handing over a residual does not hold both at once)
TextureDirection texture_direction(const Heightfield& hf, const Plane* remove, int threads,
                                   const LaySums* lay, LargeBytes spent,
                                   Heightfield* release = nullptr);

/// Makes and drops the FFTW plans texture_direction (and lay_spectrum) will make for an
/// nx x ny field, so that theirs are found in FFTW's planner cache: FFTW_ESTIMATE planning of
/// the 12 x 12 mm floor's transforms costs ~125 M instructions, paid once per process. Run it
/// beside other work (the sweep) once the grid's size is known. Thread-safe (fftw_plan.h).
void warm_texture_direction_plans(int nx, int ny);

}  // namespace cuspmap
