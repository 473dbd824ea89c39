// SurfaceHeights: the height parameters of a machined texture that the finishing decisions use
// (sanding depth, mean removal, stock), whatever produced them: the closed-form cusp profile, a
// simulated heightfield's areal parameters, or a measured surface. Heights in um.
// Method: ISO 25178-2:2012 §4.1 height parameters (Sp, Sv, Sz, Sa) and ISO 4287:1997 §4.2.1 (Ra).
#pragma once

namespace cuspmap {

/// Height parameters of a surface texture about its mean plane, um. Sz = Sp + Sv.
/// For a texture extruded along the feed (an ideal cusp raster), Sa equals the profile Ra.
struct SurfaceHeights {
  double sz_um = 0.0;  ///< maximum height: highest peak to deepest valley (the depth to clear)
  double sv_um = 0.0;  ///< maximum pit height: mean plane minus the lowest point (mean removal)
  double sp_um = 0.0;  ///< maximum peak height: highest point minus the mean plane
  double sa_um = 0.0;  ///< arithmetical mean height of the area
  double ra_um = 0.0;  ///< arithmetical mean deviation of the profile across the lay
};

}  // namespace cuspmap
