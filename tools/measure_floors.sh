#!/usr/bin/env bash
# Peak memory and time of `cuspmap simulate` on square floors (issue 9): a 10 mm ball, zigzag
# raster at a given stepover over S x S mm at cell C, run under /usr/bin/time -v, one row each.
# Usage: tools/measure_floors.sh [BIN=build/cuspmap] [SIZES="20 50 100 200"] [CELLS="0.005 0.002"]
#   STEPOVER (mm, default 0.4), THREADS (default 0 = all cores), MODE (--stream or empty: auto).
# Prints a Markdown table: size, cell, cells, mode, wall s, user+sys CPU s, peak RSS MiB, Sa um.
set -euo pipefail
bin="${1:-build/cuspmap}"
sizes="${2:-20 50 100 200}"
cells="${3:-0.005 0.002}"
stepover="${STEPOVER:-0.4}"
threads="${THREADS:-0}"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
[ -x /usr/bin/time ] || { echo "measure_floors.sh: needs /usr/bin/time (Debian package 'time')" >&2; exit 2; }
echo "| floor | cell | cells | threads | wall s | CPU s | peak RSS MiB | Sa um | mode |"
echo "|---|---|---|---|---|---|---|---|---|"
for s in $sizes; do
  for c in $cells; do
    job="$work/floor.toml"
    cat >"$job" <<TOML
name = "mould insert floor ${s} mm"
units = "mm"
[patch]
size = [$s, $s]
cell = $c
[tool]
shape = "ball"
diameter = 10
teeth = 2
[cut]
rpm = 12000
feed = 2400
depth = 0
[path]
kind = "raster"
stepover = $stepover
angle_deg = 0
direction = "zigzag"
TOML
    rm -rf "$work/out"
    /usr/bin/time -v "$bin" simulate "$job" --out "$work/out" --json --threads "$threads" \
      ${MODE:-} >"$work/report.json" 2>"$work/time.txt"
    wall=$(sed -n 's/.*Elapsed (wall clock) time (h:mm:ss or m:ss): //p' "$work/time.txt")
    user=$(sed -n 's/.*User time (seconds): //p' "$work/time.txt")
    sys=$(sed -n 's/.*System time (seconds): //p' "$work/time.txt")
    rss=$(sed -n 's/.*Maximum resident set size (kbytes): //p' "$work/time.txt")
    /usr/bin/python3 - "$work/report.json" "$s" "$c" "$threads" "$wall" "$user" "$sys" "$rss" <<'PY'
import json, sys
r = json.load(open(sys.argv[1]))
s, c, th, wall, user, sysc, rss = sys.argv[2:]
wall_s = 0.0
for part in wall.split(":"):  # m:ss.ss or h:mm:ss
    wall_s = 60 * wall_s + float(part)
n = round(float(s) / float(c)) ** 2
def find(d, key):
    if isinstance(d, dict):
        for k, v in d.items():
            if k == key: return v
            f = find(v, key)
            if f is not None: return f
    return None
sa = find(r, "Sa_um"); st = r.get("memory", {}).get("mode", "?")
print(f"| {s} mm | {float(c)*1000:g} um | {n:.2e} | {th} | {wall_s:.1f} | {float(user)+float(sysc):.1f} | {int(rss)/1024:.0f} | {sa:.6f} | {st} |")
PY
  done
done
