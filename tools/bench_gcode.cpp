// Benchmark of the G-code reader: a 200,000-line finishing program over a 60 x 60 mm floor
// (zigzag passes of short G1 segments, as CAM posts write them, joined by G2/G3 semicircles),
// read from memory and from a file; and a 16,000-move program written both flat (a post's
// safe-start header, modal feeds) and as a parametric O-word loop (issue 16). Target: well under
// a second per program.
// Method: Google Benchmark; the program is generated here, so the figure is reproducible.
#include <benchmark/benchmark.h>

#include <charconv>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>

#include "path/gcode_reader.h"

namespace {

constexpr int kLines = 200'000;
constexpr double kFloorMm = 60.0;

void append_number(std::string& out, char letter, double value) {
  char buf[32];
  buf[0] = letter;
  const auto [end, ec] = std::to_chars(buf + 1, buf + sizeof buf, value, std::chars_format::fixed, 4);
  (void)ec;
  out.append(buf, end);
}

// Passes along X, 0.3 mm apart; each pass is cut into short segments so that the whole program
// has kLines lines; the tip rides a gentle 5 um waviness in Z so Z is written on every line.
std::string finishing_program() {
  const int passes = static_cast<int>(kFloorMm / 0.3);
  const int segments = kLines / passes - 1;
  std::string out = "%\nO5001 (BENCH FLOOR)\nG17 G21 G90 G94\nM3 S10000\nG0 X0 Y0 Z2\nG1 Z0 F1200\n";
  out.reserve(static_cast<std::size_t>(kLines) * 32);
  for (int p = 0; p < passes; ++p) {
    const double y = 0.3 * p;
    for (int k = 1; k <= segments; ++k) {
      const double t = static_cast<double>(k) / segments;
      const double x = (p % 2 == 0) ? kFloorMm * t : kFloorMm * (1.0 - t);
      out += "G1 ";
      append_number(out, 'X', x);
      out += ' ';
      append_number(out, 'Z', 0.005 * ((k % 8) < 4 ? 1 : -1));
      out += '\n';
    }
    if (p + 1 < passes) {
      out += (p % 2 == 0) ? "G3 " : "G2 ";
      append_number(out, 'X', p % 2 == 0 ? kFloorMm : 0.0);
      out += ' ';
      append_number(out, 'Y', y + 0.3);
      out += " R0.15\n";
    }
  }
  out += "G0 Z2\nM30\n%\n";
  return out;
}

cuspmap::Patch bench_patch() {
  cuspmap::Patch patch;
  patch.size_x_mm = patch.size_y_mm = kFloorMm;
  patch.cell_mm = 0.02;
  return patch;
}


void BM_ReadGcodeFile(benchmark::State& state) {
  const std::string program = finishing_program();
  const std::string path =
      (std::filesystem::temp_directory_path() / "cuspmap_bench_gcode.nc").string();
  std::ofstream(path, std::ios::binary) << program;
  const cuspmap::Cutter cutter;
  for (auto _ : state) {
    const cuspmap::BuiltPath b =
        cuspmap::read_gcode_file(path, cuspmap::CutSpec{}, bench_patch(), cutter);
    benchmark::DoNotOptimize(b.path.moves.data());
  }
  state.SetBytesProcessed(static_cast<int64_t>(state.iterations() * program.size()));
  std::filesystem::remove(path);
}
BENCHMARK(BM_ReadGcodeFile)->Unit(benchmark::kMillisecond);

// 16,000 moves: 200 zigzag passes of 80 G1 segments over the 60 mm floor, written flat as a
// post writes them (safe-start header, modal G1 with axis words only).
constexpr int kPasses16k = 200;
constexpr int kSegments16k = 80;

std::string flat_16k_program() {
  std::string out = "%\nO5002 (BENCH 16K)\nG90 G17 G40 G80 G00 G21\nT1 M6\nG54 G43 H1 S10000 M3\n"
                    "G0 X0 Y0 Z2 M8\nG1 Z0 F1200\n";
  for (int p = 0; p < kPasses16k; ++p) {
    for (int k = 1; k <= kSegments16k; ++k) {
      const double t = static_cast<double>(k) / kSegments16k;
      append_number(out, 'X', (p % 2 == 0) ? kFloorMm * t : kFloorMm * (1.0 - t));
      out += '\n';
    }
    if (p + 1 < kPasses16k) {
      append_number(out, 'Y', 0.3 * (p + 1));
      out += '\n';
    }
  }
  out += "G0 Z2 M9\nG91 G28 Z0\nM30\n%\n";
  return out;
}

// The same path as a parametric program: a while loop over passes calling an O-word subroutine
// whose repeat loop writes the segments from expressions.
std::string macro_16k_program() {
  return "G21 G90 G17 G94\nM3 S10000\n#<_w> = 60\n#<_n> = " + std::to_string(kSegments16k) +
         "\no<pass> sub\n  #<k> = 1\n  o1 repeat [#<_n>]\n"
         "    o2 if [#1 EQ 0]\n      G1 X[#<_w> * #<k> / #<_n>]\n    o2 else\n"
         "      G1 X[#<_w> * [1 - #<k> / #<_n>]]\n    o2 endif\n    #<k> = [#<k> + 1]\n"
         "  o1 endrepeat\no<pass> endsub\nG0 X0 Y0 Z2\nG1 Z0 F1200\n#<p> = 0\n"
         "o3 while [#<p> LT " + std::to_string(kPasses16k) + "]\n"
         "  o<pass> call [#<p> MOD 2]\n  #<p> = [#<p> + 1]\n"
         "  o4 if [#<p> LT " + std::to_string(kPasses16k) + "]\n    G1 Y[0.3 * #<p>]\n  o4 endif\n"
         "o3 endwhile\nG0 Z2\nM30\n";
}

// Reads `program` from memory once per iteration; counts its moves and bytes.
void read_from_memory(benchmark::State& state, const std::string& program) {
  const cuspmap::Cutter cutter;
  std::size_t moves = 0;
  for (auto _ : state) {
    const cuspmap::BuiltPath b =
        cuspmap::read_gcode_text(program, "bench.nc", cuspmap::CutSpec{}, bench_patch(), cutter);
    moves = b.path.moves.size();
    benchmark::DoNotOptimize(b.path.moves.data());
  }
  state.counters["moves"] = static_cast<double>(moves);
  state.SetBytesProcessed(static_cast<int64_t>(state.iterations() * program.size()));
}

void BM_ReadGcodeText(benchmark::State& state) {
  read_from_memory(state, finishing_program());
  state.counters["lines"] = kLines;
}
BENCHMARK(BM_ReadGcodeText)->Unit(benchmark::kMillisecond);

void BM_Read16kMovesFlat(benchmark::State& state) { read_from_memory(state, flat_16k_program()); }
BENCHMARK(BM_Read16kMovesFlat)->Unit(benchmark::kMillisecond);

void BM_Read16kMovesParametric(benchmark::State& state) { read_from_memory(state, macro_16k_program()); }
BENCHMARK(BM_Read16kMovesParametric)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
