#!/usr/bin/env python3
"""Oracle: cuspmap's stylus-tip closing (ISO 16610-41 closing by a disk of radius r, the tip of
ISO 3274) against a brute-force numpy closing, seen through the real binary: `texture
--stylus-tip` on a rough profile gives the ISO 4287 parameters of the closed profile.

The closing here is computed independently by brute force: for every sample x, the lowest point
of a tip centred over x resting on the profile (max over all samples under the tip of
z + sqrt(r^2 - u^2) - r), then the lower envelope of all those tips. Roughness parameters come
from gaussian_filter_oracle.roughness_params (ISO 16610-21 with scipy).
Usage: /usr/bin/python3 stylus_closing_oracle.py <path-to-cuspmap>
"""
import json
import os
import subprocess
import sys
import tempfile

import numpy as np
from scipy.ndimage import gaussian_filter1d

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from gaussian_filter_oracle import roughness_params  # noqa: E402

failures = []


def check(name, got, want, rel, abs_tol=0.0):
    ok = abs(got - want) <= max(rel * abs(want), abs_tol)
    print(f"{'ok  ' if ok else 'FAIL'} {name}: cuspmap {got:.9g} oracle {want:.9g}")
    if not ok:
        failures.append(name)


def brute_closing(z, dx_um, r_um):
    """Closing by a disk, every tip position against every sample (O(n^2), no shortcuts)."""
    x = np.arange(z.size) * dx_um
    u = x[None, :] - x[:, None]                # u[i, s] = x_s - x_i
    inside = np.abs(u) <= r_um + 1e-9
    lift = np.where(inside, np.sqrt(np.clip(r_um ** 2 - u ** 2, 0, None)) - r_um, -np.inf)
    rest = np.max(z[None, :] + lift, axis=1)   # tip centred over x_i: its lowest point
    envelope = np.where(inside, rest[None, :] - lift, np.inf)
    return np.min(envelope, axis=1)            # lower envelope of the tips over x_i


def main():
    cuspmap = sys.argv[1]
    tmp = tempfile.mkdtemp(prefix="cuspmap-tip-")
    rng = np.random.default_rng(170041)
    dx_mm = 0.0005                  # 0.5 um samples
    n = 1200                        # 0.6 mm: 5 sampling lengths of 0.08 mm plus run-up/out
    z = gaussian_filter1d(rng.normal(0.0, 1.5, n), 2.0)  # sharp valleys a few um across
    path = os.path.join(tmp, "rough.csv")
    with open(path, "w") as f:
        for _ in range(4):          # identical rows: every trace along X is this profile
            f.write(",".join(f"{v:.9g}" for v in z.astype(np.float32)) + "\n")
    z32 = z.astype(np.float32).astype(np.float64)
    for tip in (2.0, 5.0, 10.0):
        closed = brute_closing(z32, dx_mm * 1e3, tip)
        want, _ = roughness_params(closed, dx_mm, 0.08)
        bare, _ = roughness_params(z32, dx_mm, 0.08)
        out = subprocess.run([cuspmap, "texture", path, "--json", "--cell", str(dx_mm), "--cutoff",
                              "0.08", "--lambda-s", "0", "--direction", "0", "--stylus-tip",
                              f"{tip}um"], capture_output=True, text=True)
        if out.returncode != 0:
            print(out.stderr)
            failures.append(f"run tip {tip}")
            continue
        got = json.loads(out.stdout)["profile"]
        check(f"tip {tip} um: stylus_tip_um", got["stylus_tip_um"], tip, 0.0, 1e-12)
        for key in ("Ra_um", "Rq_um", "Rz_um", "Rv_um", "Rp_um"):
            check(f"tip {tip} um: {key}", got[key], want[key], 1e-5, 1e-6)
        # The tip must matter on this profile, or the comparison above proves nothing.
        if not want["Rv_um"] < 0.97 * bare["Rv_um"]:
            failures.append(f"tip {tip}: closing did not change Rv ({want['Rv_um']} vs {bare['Rv_um']})")
    print(f"{len(failures)} failed")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
