#!/usr/bin/env python3
"""Oracle: a streamed `simulate --npy` writes a height.npy that numpy loads as a float32 (ny, nx)
array matching report.json's grid, and the areal height parameters the streamed run accumulated
band by band (Sa, Sq, Sp, Sv, Sz, Ssk, Sku) equal numpy's on that whole array.

Sources: numpy.lib.format (NEP 1) for the file; ISO 25178-2:2012 §4.1 (height parameters about
the least-squares mean plane) computed with numpy (Debian python3-numpy) in float64.
Usage: /usr/bin/python3 streamed_npy_oracle.py <path-to-cuspmap>
"""
import json
import os
import subprocess
import sys
import tempfile

import numpy as np

# The areal oracle's numpy reference (plane removal, ISO 25178-2 §4.1 parameters), shared.
sys.dont_write_bytecode = True  # leave no __pycache__ in the source tree
sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "texture"))
from areal_oracle import numpy_areal  # noqa: E402

failures = []

# Streamed sums are float64 over float32 heights; the plane and residuals in float64 here: the
# two agree to float32 rounding of the heights (~1e-7 relative), 2e-6 leaves a 20x margin.
REL = 2e-6

JOB = """# Mould insert, floor between ribs: 4 mm ball, one-way raster at 0.25 mm (invented).
name = "mould insert floor"
units = "mm"
[patch]
size = [7, 5]
cell = 0.005
origin = [2, -1]
[tool]
shape = "ball"
diameter = 4
teeth = 2
[cut]
rpm = 15000
feed = 1200
depth = 0
[path]
kind = "raster"
stepover = 0.25
angle_deg = 0
direction = "one-way"
"""


def check(name, got, want, rel, abs_tol=0.0):
    ok = abs(got - want) <= max(rel * abs(want), abs_tol)
    print(f"{'ok  ' if ok else 'FAIL'} {name}: cuspmap {got:.9g} numpy {want:.9g}")
    if not ok:
        failures.append(name)


def main():
    cuspmap = sys.argv[1]
    tmp = tempfile.mkdtemp(prefix="cuspmap-oracle-")
    job = os.path.join(tmp, "job.toml")
    with open(job, "w") as f:
        f.write(JOB)
    out = os.path.join(tmp, "out")
    run = subprocess.run([cuspmap, "simulate", job, "--out", out, "--stream", "--npy",
                          "--max-memory", "2MiB", "--json"], capture_output=True, text=True)
    if run.returncode != 0:
        print(run.stderr)
        print("1 failed")
        return 1
    report = json.loads(run.stdout)
    z = np.load(os.path.join(out, "height.npy"))
    print(f"height.npy: shape {z.shape}, dtype {z.dtype}; mode {report['memory']['mode']}, "
          f"{report['memory']['bands']} bands")
    check("dtype is float32", float(z.dtype == np.float32), 1.0, 0.0)
    check("streamed run", float(report["memory"]["mode"] == "streamed"), 1.0, 0.0)
    check("bands > 2", float(report["memory"]["bands"] > 2), 1.0, 0.0)
    check("rows (ny)", z.shape[0], report["grid"]["ny"], 0.0)
    check("columns (nx)", z.shape[1], report["grid"]["nx"], 0.0)
    check("rows = 5 mm / 5 um", z.shape[0], 1000, 0.0)
    check("columns = 7 mm / 5 um", z.shape[1], 1400, 0.0)
    want = numpy_areal(z, report["cell_mm"])
    for key, value in want.items():
        if key != "Sdr":  # needs the whole field: not computed when streamed (reported as 0)
            check(key, report["areal"][key], value, REL, 1e-9)
    check("highest point", report["highest_point_um"], float(np.nanmax(z)), 0.0, 1e-6)
    print(f"{len(failures)} failed")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
