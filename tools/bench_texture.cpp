// Benchmark: texture_report on a 1000 x 1000 cusp floor with feed marks (target: well under 1 s),
// and the ArealMoments accumulation alone (the part a tiled, streaming report would repeat).
// Method: Google Benchmark; surfaces built analytically (parabolic cusps, 0.5 mm stepover).
#include <benchmark/benchmark.h>

#include <cmath>

#include "bench_cusp_floor.h"
#include "core/heightfield.h"
#include "texture/areal_moments.h"
#include "texture/texture_report.h"

namespace {

// The 0.5 mm stepover, 10 um deep floor these figures were first taken on.
cuspmap::Heightfield cusp_floor(int n) { return bench_cusp_floor(n, 0.5, 10.0); }

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
