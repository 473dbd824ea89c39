// Benchmark: texture_report on a 1000 x 1000 cusp floor with feed marks (target: well under 1 s),
// and the ArealMoments accumulation alone (the part a tiled, streaming report would repeat).
// Method: Google Benchmark; surfaces built analytically (parabolic cusps, 0.5 mm stepover).
#include <benchmark/benchmark.h>

#include <cmath>

#include "core/heightfield.h"
#include "texture/areal_moments.h"
#include "texture/texture_report.h"

namespace {

cuspmap::Heightfield cusp_floor(int n) {
  cuspmap::Heightfield hf;
  hf.nx = n;
  hf.ny = n;
  hf.cell_mm = 0.01;
  hf.z_um.resize(n, n);
  for (int j = 0; j < n; ++j) {
    const double y = hf.y_mm(j), d = y - 0.5 * std::round(y / 0.5), u = 2 * d / 0.5;
    for (int i = 0; i < n; ++i) {
      hf.z_um(j, i) =
          static_cast<float>(10.0 * u * u + 0.3 * std::sin(2 * 3.14159265 * hf.x_mm(i) / 0.08));
    }
  }
  return hf;
}

void BM_TextureReport(benchmark::State& state) {
  const cuspmap::Heightfield hf = cusp_floor(static_cast<int>(state.range(0)));
  for (auto _ : state) {
    benchmark::DoNotOptimize(cuspmap::texture_report(hf, cuspmap::TextureOptions{}));
  }
  state.SetItemsProcessed(state.iterations() * hf.cells());
}
BENCHMARK(BM_TextureReport)->Arg(500)->Arg(1000)->Unit(benchmark::kMillisecond);

void BM_ArealMoments(benchmark::State& state) {
  const cuspmap::Heightfield hf = cusp_floor(1000);
  for (auto _ : state) {
    cuspmap::ArealMoments m;
    const float* z = hf.z_um.data();
    for (std::int64_t k = 0; k < hf.cells(); ++k) m.add(z[k]);
    benchmark::DoNotOptimize(m);
  }
  state.SetItemsProcessed(state.iterations() * 1000000);
}
BENCHMARK(BM_ArealMoments)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
