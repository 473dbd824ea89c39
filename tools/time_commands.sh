#!/usr/bin/env bash
# Whole commands timed as a user runs them (issue 15): a fresh process per run, RUNS runs, the
# median (hyperfine, Debian package 'hyperfine'), page faults and peak memory of one more run
# (/usr/bin/time -v). Beside the Google Benchmark microbenchmarks (tools/bench_*.cpp).
# Usage: tools/time_commands.sh [BIN=build/cuspmap] [BEFORE=binary to compare, optional]
#   RUNS (default 5), SETS (default "simulate12 texture16m simulate48m"; also teeth10,
#   compare_flat), THREADS (0 = all).
# Prints Markdown tables: command, binary, median / min / max wall s; page faults; peak RSS.
set -euo pipefail
bin="$(realpath "${1:-build/cuspmap}")"
before="${2:-}"
[ -n "$before" ] && before="$(realpath "$before")"
runs="${RUNS:-5}"
sets="${SETS:-simulate12 texture16m simulate48m}"
threads="${THREADS:-0}"
here="$(cd "$(dirname "$0")" && pwd)"
for tool in hyperfine /usr/bin/time; do
  command -v "$tool" >/dev/null || { echo "time_commands.sh: needs $tool (apt-get install hyperfine time)" >&2; exit 2; }
done
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT

# job NAME SIZE_X SIZE_Y CELL: a 6 mm ball, zigzag raster at 0.3 mm (the issue's job family).
job() {
  cat >"$work/$1.toml" <<TOML
name = "pump cover floor $1"
units = "mm"
[patch]
size = [$2, $3]
cell = $4
[tool]
shape = "ball"
diameter = 6
teeth = 2
[cut]
rpm = 12000
feed = 1800
depth = 0
[path]
kind = "raster"
stepover = 0.3
angle_deg = 0
direction = "zigzag"
TOML
}

echo "load: $(uptime)"
echo
echo "| command | binary | median s | min s | max s | runs |"
echo "|---|---|---|---|---|---|"
summary="$work/summary.txt"
: >"$summary"
# time_it LABEL BINLABEL COMMAND...: hyperfine median, then one /usr/bin/time -v run.
time_it() {
  local label="$1" who="$2"
  shift 2
  hyperfine --runs "$runs" --warmup 0 --style none --export-json "$work/h.json" -- "$*" \
    >/dev/null 2>&1 || { echo "| $label | $who | failed | | | |"; return; }
  /usr/bin/python3 - "$work/h.json" "$label" "$who" "$runs" <<'PY'
import json, sys
r = json.load(open(sys.argv[1]))["results"][0]
print(f"| {sys.argv[2]} | {sys.argv[3]} | {r['median']:.3f} | {r['min']:.3f} | {r['max']:.3f} | {sys.argv[4]} |")
PY
  /usr/bin/time -v bash -c "$*" >/dev/null 2>"$work/t.txt" || true
  local minor major rss
  minor=$(sed -n 's/.*Minor (reclaiming a frame) page faults: //p' "$work/t.txt")
  major=$(sed -n 's/.*Major (requiring I\/O) page faults: //p' "$work/t.txt")
  rss=$(sed -n 's/.*Maximum resident set size (kbytes): //p' "$work/t.txt")
  echo "| $label | $who | $minor | $major | $((rss / 1024)) |" >>"$summary"
}

binaries=("$bin")
[ -n "$before" ] && binaries=("$before" "$bin")
for set in $sets; do
  case "$set" in
    simulate12)  # 12 x 12 mm at 10 um = 1.44 M cells: pictures, height.npy, report.json
      job j12 12 12 0.01
      for b in "${binaries[@]}"; do
        time_it "simulate 12 x 12 mm at 10 um" "$(basename "$b")" \
          "$b simulate $work/j12.toml --out $work/o12 --threads $threads"
      done ;;
    texture16m)  # texture of a 4000 x 4000 floor (20 x 20 mm at 5 um) against the numpy peer
      job j20 20 20 0.005
      "$bin" simulate "$work/j20.toml" --out "$work/o20" --threads "$threads" >/dev/null
      for b in "${binaries[@]}"; do
        time_it "texture 4000 x 4000" "$(basename "$b")" \
          "$b texture $work/o20/height.npy --cell 0.005 --json"
      done
      time_it "texture 4000 x 4000" "numpy/scipy peer" \
        "/usr/bin/python3 $here/texture_peer.py $work/o20/height.npy 0.005" ;;
    simulate48m)  # 40 x 30 mm at 5 um = 48 M cells, in memory with the texture report
      job j48 40 30 0.005
      for b in "${binaries[@]}"; do
        time_it "simulate 40 x 30 mm at 5 um" "$(basename "$b")" \
          "$b simulate $work/j48.toml --out $work/o48 --threads $threads"
      done ;;
    teeth10)  # tooth-resolved 10 x 10 mm at 2 um (25 M cells): bench_sweep's BM_TeethFlat job
              # (6 mm 3-flute flat, 1 deg dish, 0.01 deg tram across, fz 0.05, 0.5 mm zigzag)
              # as a user runs it: with the margin passes and the texture report
      cat >"$work/t10.toml" <<TOML
name = "mould insert floor, tooth by tooth"
units = "mm"
[patch]
size = [10, 10]
cell = 0.002
[tool]
shape = "flat"
diameter = 6
dish_deg = 1
teeth = 3
tilt_deg = 0.01
tilt_toward_deg = 90
[cut]
rpm = 10000
feed = 1500
depth = 0
[path]
kind = "raster"
stepover = 0.5
direction = "zigzag"
[sim]
tooth_marks = true
TOML
      for b in "${binaries[@]}"; do
        time_it "simulate 10 x 10 mm at 2 um, tooth by tooth" "$(basename "$b")" \
          "$b simulate $work/t10.toml --out $work/ot10 --threads $threads"
      done ;;
    compare_flat)  # the README's compare: two tooth-resolved 6 x 6 mm floors at 5 um
      for b in "${binaries[@]}"; do
        time_it "compare two tooth-resolved 6 x 6 mm floors" "$(basename "$b")" \
          "$b compare $here/../examples/pump_cover_flat_oneway.toml $here/../examples/pump_cover_flat_zigzag_tram.toml --out $work/oc"
      done ;;
    *) echo "time_commands.sh: unknown set '$set' (simulate12, texture16m, simulate48m, teeth10, compare_flat)" >&2
       exit 2 ;;
  esac
done
echo
echo "| command | binary | minor page faults | major page faults | peak RSS MiB |"
echo "|---|---|---|---|---|"
cat "$summary"
