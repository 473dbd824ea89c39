#!/usr/bin/env python3
"""Oracle: cuspmap's ISO 25178-2 areal parameters (least-squares plane removal, Sa, Sq, Sp, Sv,
Sz, Ssk, Sku, Sdr) against numpy on random and structured surfaces (with unreached NaN cells),
and the lay direction of sine gratings at known angles.

Sources: ISO 25178-2:2012 §4.1 (height parameters about the least-squares mean plane), §4.3.2
(Sdr = mean of sqrt(1 + |grad z|^2) - 1; gradients by central differences on each square of four
cells, as docs/texture.md states); a grating z = A sin(2 pi (x cos phi + y sin phi) / L) has its
lay (grooves) at phi + 90 deg. Reference implementation: numpy (Debian python3-numpy).
Usage: /usr/bin/python3 areal_oracle.py <path-to-cuspmap>
"""
import json
import math
import os
import subprocess
import sys
import tempfile

import numpy as np

failures = []


def check(name, got, want, rel, abs_tol=0.0):
    ok = abs(got - want) <= max(rel * abs(want), abs_tol)
    print(f"{'ok  ' if ok else 'FAIL'} {name}: cuspmap {got:.9g} oracle {want:.9g}")
    if not ok:
        failures.append(name)


def numpy_areal(z, cell):
    """Plane removal and ISO 25178-2 parameters with numpy (float64)."""
    z = z.astype(np.float64)
    ny, nx = z.shape
    yy, xx = np.mgrid[0:ny, 0:nx]
    x = (xx + 0.5) * cell
    y = (yy + 0.5) * cell
    m = np.isfinite(z)
    a = np.column_stack([np.ones(m.sum()), x[m], y[m]])
    coef, *_ = np.linalg.lstsq(a, z[m], rcond=None)
    r = z - (coef[0] + coef[1] * x + coef[2] * y)
    v = r[m]
    sq = math.sqrt(np.mean(v ** 2))
    gx = ((r[:-1, 1:] - r[:-1, :-1]) + (r[1:, 1:] - r[1:, :-1])) / (2 * cell) * 1e-3
    gy = ((r[1:, :-1] - r[:-1, :-1]) + (r[1:, 1:] - r[:-1, 1:])) / (2 * cell) * 1e-3
    g2 = gx ** 2 + gy ** 2
    ok = np.isfinite(g2)
    return {"Sa_um": np.mean(np.abs(v)), "Sq_um": sq, "Sp_um": v.max(), "Sv_um": -v.min(),
            "Sz_um": v.max() - v.min(), "Ssk": np.mean(v ** 3) / sq ** 3,
            "Sku": np.mean(v ** 4) / sq ** 4, "Sdr": np.mean(np.sqrt(1 + g2[ok]) - 1)}


def run(cuspmap, path, cell):
    out = subprocess.run([cuspmap, "texture", path, "--cell", str(cell), "--json"],
                         capture_output=True, text=True)
    if out.returncode != 0:
        print(out.stderr)
        failures.append(f"run {path}")
        return None
    return json.loads(out.stdout)


def compare(cuspmap, tmp, name, z, cell):
    path = os.path.join(tmp, name + ".npy")
    np.save(path, z.astype(np.float32))
    got = run(cuspmap, path, cell)
    if not got:
        return None
    want = numpy_areal(z.astype(np.float32), cell)
    for key, value in want.items():
        # cuspmap stores the residual as float32 (heights to ~1e-7 relative of the largest).
        check(f"{name}: {key}", got["areal"][key], value, 2e-5, 1e-6)
    return got


def main():
    cuspmap = sys.argv[1]
    tmp = tempfile.mkdtemp(prefix="cuspmap-oracle-")
    rng = np.random.default_rng(42)
    cell = 0.01
    ny, nx = 300, 400
    yy, xx = np.mgrid[0:ny, 0:nx]
    x = (xx + 0.5) * cell
    y = (yy + 0.5) * cell

    # Random rough surface on a tilted plane.
    z = rng.normal(0.0, 1.2, (ny, nx)) + 0.8 * x - 1.5 * y + 12.0
    compare(cuspmap, tmp, "random", z, cell)

    # Same with a block of unreached cells and a ragged edge.
    zn = z.copy()
    zn[100:160, 50:200] = np.nan
    zn[:, -3:] = np.nan
    compare(cuspmap, tmp, "random_nan", zn, cell)

    # Structured: crossed sines (cusps across Y, feed marks along X) plus tilt.
    zs = 3.0 * np.sin(2 * math.pi * y / 0.4) ** 2 + 0.5 * np.sin(2 * math.pi * x / 0.07) + 0.2 * x
    compare(cuspmap, tmp, "structured", zs, cell)

    # Lay of sine gratings at known angles.
    for phi in (35.0, 150.0):
        c, s = math.cos(math.radians(phi)), math.sin(math.radians(phi))
        zg = 2.0 * np.sin(2 * math.pi * (x * c + y * s) / 0.15)
        path = os.path.join(tmp, f"grating{int(phi)}.npy")
        np.save(path, zg.astype(np.float32))
        got = run(cuspmap, path, cell)
        if got:
            want = (phi + 90.0) % 180.0
            diff = abs(got["areal"]["lay_deg"] - want) % 180.0
            diff = min(diff, 180.0 - diff)
            check(f"grating {phi} deg: lay error (deg)", diff, 0.0, 0.0, 1.0)
            check(f"grating {phi} deg: profile traced across the lay (deg)",
                  got["profile"]["direction_deg"], phi % 180.0, 0.0, 1.0)

    print(f"{len(failures)} failed")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
