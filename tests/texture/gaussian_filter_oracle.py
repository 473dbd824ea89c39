#!/usr/bin/env python3
"""Oracle: cuspmap's ISO 16610-21 Gaussian profile filter and ISO 4287 roughness parameters
against scipy.ndimage.gaussian_filter1d with sigma = alpha * lc / sqrt(2 pi) (the ISO weighting
function s(x) = exp(-pi (x / (alpha lc))^2) / (alpha lc) is a normal density of that sigma).

Sources: ISO 16610-21:2011 §4.2 (weighting function, alpha = sqrt(ln 2 / pi), 50 % transmission
at lc); ISO 4287:1997 §4 (Ra, Rq, Rsk, Rku, Rp, Rv, Rz, Rt); ISO 4288:1996 (lc/2 run-up and
run-out, 5 sampling lengths). Reference implementation: scipy (Debian python3-scipy).
Usage: /usr/bin/python3 gaussian_filter_oracle.py <path-to-cuspmap>
"""
import json
import math
import os
import subprocess
import sys
import tempfile

import numpy as np
from scipy.ndimage import gaussian_filter1d

ALPHA = math.sqrt(math.log(2.0) / math.pi)
failures = []


def check(name, got, want, rel, abs_tol=0.0):
    ok = abs(got - want) <= max(rel * abs(want), abs_tol)
    print(f"{'ok  ' if ok else 'FAIL'} {name}: cuspmap {got:.9g} oracle {want:.9g} (rel tol {rel:g})")
    if not ok:
        failures.append(name)


def scipy_mean_line(z, dx, lc):
    """Normalised Gaussian mean line truncated at +-lc (the kernel renormalised at the ends)."""
    sigma = ALPHA * lc / math.sqrt(2.0 * math.pi) / dx  # in samples
    truncate = (lc / dx) / sigma                          # kernel reaches +-lc
    num = gaussian_filter1d(z, sigma, mode="constant", cval=0.0, truncate=truncate)
    den = gaussian_filter1d(np.ones_like(z), sigma, mode="constant", cval=0.0, truncate=truncate)
    return num / den


def detrend(z):
    x = np.arange(z.size) - 0.5 * (z.size - 1)
    slope = np.dot(x, z) / np.dot(x, x)
    return z - z.mean() - slope * x


def roughness_params(z, dx, lc):
    """The evaluation of cuspmap's docs/texture.md done with numpy/scipy."""
    z = detrend(np.asarray(z, dtype=np.float64))
    k = max(1, int(round(lc / dx)))
    n = min(5, z.size // k - 1)
    w = scipy_mean_line(z, dx, lc)
    r = z - w
    i0 = (z.size - n * k) // 2
    ev = r[i0:i0 + n * k]
    rq = math.sqrt(np.mean(ev ** 2))
    parts = np.array_split(ev, n)
    rp = np.mean([p.max() for p in parts])
    rv = np.mean([-p.min() for p in parts])
    return {"Ra_um": np.mean(np.abs(ev)), "Rq_um": rq, "Rsk": np.mean(ev ** 3) / rq ** 3,
            "Rku": np.mean(ev ** 4) / rq ** 4, "Rp_um": rp, "Rv_um": rv, "Rz_um": rp + rv,
            "Rt_um": ev.max() - ev.min()}, n


def run(cuspmap, path, *args):
    out = subprocess.run([cuspmap, "texture", path, "--json", *args], capture_output=True, text=True)
    if out.returncode != 0:
        print(out.stderr)
        failures.append(f"run {path}")
        return None
    return json.loads(out.stdout)


def main():
    cuspmap = sys.argv[1]
    tmp = tempfile.mkdtemp(prefix="cuspmap-oracle-")
    rng = np.random.default_rng(20240611)

    # 1. Weighting function: ISO s(x) sampled and normalised equals scipy's kernel (impulse
    #    response) with sigma = alpha lc / sqrt(2 pi).
    dx, lc = 0.001, 0.8
    half = int(round(lc / dx))
    x = np.arange(-half, half + 1) * dx
    s = np.exp(-math.pi * (x / (ALPHA * lc)) ** 2) / (ALPHA * lc)
    impulse = np.zeros(4 * half + 1)
    impulse[2 * half] = 1.0
    sigma = ALPHA * lc / math.sqrt(2 * math.pi) / dx
    kernel = gaussian_filter1d(impulse, sigma, mode="constant", truncate=half / sigma)[half:3 * half + 1]
    check("weighting function vs scipy kernel (max abs diff)", float(np.max(np.abs(s / s.sum() - kernel))), 0.0, 0.0, 1e-12)
    check("ISO s(x) integrates to 1", float(s.sum() * dx), 1.0, 1e-7)

    # 2. Random rough profile plus waviness, identical rows (traces along X all alike).
    dx = 0.002
    nx = 3000  # 6 mm: 0.8 mm cut-off gives 5 sampling lengths + run-up/out
    prof = rng.normal(0.0, 0.5, nx)
    prof = gaussian_filter1d(prof, 3.0)  # correlated roughness, ~ 10 um features
    xs = (np.arange(nx) + 0.5) * dx
    prof += 2.0 * np.sin(2 * math.pi * xs / 3.0) + 0.3 * xs  # waviness and tilt
    grid = np.tile(prof, (40, 1)).astype(np.float32)
    path = os.path.join(tmp, "random.npy")
    np.save(path, grid)
    got = run(cuspmap, path, "--cell", str(dx), "--cutoff", "0.8", "--lambda-s", "0",
              "--direction", "0")
    want, n = roughness_params(grid[0].astype(np.float64), dx, 0.8)
    if got:
        check("random: sampling lengths", got["profile"]["sampling_lengths"], n, 0.0)
        for key, value in want.items():
            check(f"random: {key}", got["profile"][key], value, 1e-5, 1e-6)

    # 3. Transmission at the cut-off: a sine of wavelength lc keeps half its amplitude in the
    #    roughness profile (ISO 16610-21), so Ra(roughness) = Pa / 2.
    dx, lc = 0.004, 2.5
    nx = 4000  # 16 mm
    xs = (np.arange(nx) + 0.5) * dx
    grid = np.tile(np.sin(2 * math.pi * xs / lc) * 3.0, (8, 1)).astype(np.float32)
    path = os.path.join(tmp, "sine.npy")
    np.save(path, grid)
    got = run(cuspmap, path, "--cell", str(dx), "--cutoff", "2.5", "--direction", "0")
    if got:
        check("sine at lc: Ra / Pa", got["profile"]["Ra_um"] / got["profile"]["primary"]["Pa_um"], 0.5, 2e-3)

    # 4. Cusp profile (parabolic arcs, stepover 0.3 mm) at the ISO 4288 cut-off 0.8 mm.
    dx = 0.005
    ys = (np.arange(1000) + 0.5) * dx
    d = ys - 0.3 * np.round(ys / 0.3)
    cusp = 5.0 * (2 * d / 0.3) ** 2
    grid = np.tile(cusp[:, None], (1, 20)).astype(np.float32)
    path = os.path.join(tmp, "cusp.npy")
    np.save(path, grid)
    got = run(cuspmap, path, "--cell", str(dx), "--lambda-s", "0")
    want, n = roughness_params(grid[:, 0].astype(np.float64), dx, 0.8)
    if got:
        check("cusp: cut-off by ISO 4288 (RSm 0.3 mm)", got["profile"]["cutoff_mm"], 0.8, 0.0)
        for key in ("Ra_um", "Rq_um", "Rz_um", "Rsk", "Rku"):
            check(f"cusp: {key}", got["profile"][key], want[key], 1e-5, 1e-6)

    print(f"{len(failures)} failed")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
