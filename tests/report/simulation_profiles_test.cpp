// profile.png says what its Ra is: the single centre trace, not the table's mean of several
// traces (issue 13 item 1). Source: derived (the plotted Ra is evaluate_profiles on one trace).
#include "report/simulation_pictures.h"

#include <cmath>

#include "test_support.h"

using namespace cuspmap;

TEST_CASE("simulation_profiles: issue_13: the plotted Ra is labelled as the centre trace's",
          "[report]") {
  JobRun run;
  Heightfield& hf = run.floor;
  hf.nx = 200;
  hf.ny = 400;
  hf.cell_mm = 0.005;
  hf.z_um.resize(hf.ny, hf.nx);
  for (int j = 0; j < hf.ny; ++j) {  // passes along X every 0.2 mm, 3 um parabolic cusps
    const double y = hf.y_mm(j), u = 2.0 * (y - 0.2 * std::round(y / 0.2)) / 0.2;
    for (int i = 0; i < hf.nx; ++i) hf.z_um(j, i) = static_cast<float>(3.0 * u * u);
  }
  TextureOptions o;
  o.lay_deg = 0.0;
  run.texture = texture_report(hf, o);
  const std::vector<ProfilePlotData> plots = simulation_profiles(run);
  REQUIRE(plots.size() == 2);
  REQUIRE(plots[0].title == "Centre trace across, 90 deg");
  REQUIRE(plots[1].title == "Centre trace along, 0 deg");
  const SimulationPictures pics = render_simulation_pictures(run, LengthUnit::Millimetre, {});
  REQUIRE(pics.profile_caption.find("that one trace's") != std::string::npos);
  REQUIRE(pics.profile_caption.find("mean of several parallel traces") != std::string::npos);
}
