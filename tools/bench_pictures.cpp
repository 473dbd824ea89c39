// Benchmark: the 12 x 12 mm simulate job's per-cell picture and texture kernels on a 1200 x 1200
// cusp floor at 10 um (issue 15): the anti-aliased 2 x 2 block reduction of a picture, the shaded
// relief (brightness pass, percentile, reduction), and Sdr's per-square slope sums.
// Method: Google Benchmark; the floor is built analytically (parabolic cusps at 0.3 mm stepover
// with feed marks), as bench_texture's.
#include <benchmark/benchmark.h>

#include <cstdint>

#include "bench_cusp_floor.h"
#include "core/heightfield.h"
#include "report/reduce_blocks.h"
#include "report/shaded_image.h"
#include "texture/areal_parameters.h"

namespace {

// The 12 mm job's floor: 6 mm ball at 0.3 mm stepover, 3.75 um cusps (derived: s^2 / (8 R)).
cuspmap::Heightfield cusp_floor(int n) { return bench_cusp_floor(n, 0.3, 3.75); }

void BM_ReduceBlocksAntiAlias(benchmark::State& state) {
  const cuspmap::Heightfield hf = cusp_floor(1200);
  const int k = static_cast<int>(state.range(0));
  for (auto _ : state) {
    benchmark::DoNotOptimize(cuspmap::reduce_blocks(hf.z_um, k, cuspmap::BlockReduce::AntiAlias));
  }
  state.SetItemsProcessed(state.iterations() * hf.cells());
}
BENCHMARK(BM_ReduceBlocksAntiAlias)->Arg(2)->Arg(5)->MeasureProcessCPUTime()->Unit(benchmark::kMillisecond);

void BM_ShadedImage(benchmark::State& state) {
  const cuspmap::Heightfield hf = cusp_floor(1200);
  for (auto _ : state) {
    benchmark::DoNotOptimize(cuspmap::render_shaded_image(hf, cuspmap::ShadedImageOptions{}));
  }
  state.SetItemsProcessed(state.iterations() * hf.cells());
}
BENCHMARK(BM_ShadedImage)->MeasureProcessCPUTime()->Unit(benchmark::kMillisecond);

void BM_DevelopedAreaRatio(benchmark::State& state) {
  const cuspmap::Heightfield hf = cusp_floor(1200);
  for (auto _ : state) {
    std::int64_t squares = 0;
    benchmark::DoNotOptimize(cuspmap::developed_area_ratio(hf, squares));
  }
  state.SetItemsProcessed(state.iterations() * hf.cells());
}
BENCHMARK(BM_DevelopedAreaRatio)->MeasureProcessCPUTime()->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
