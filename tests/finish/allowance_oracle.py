#!/usr/bin/python3
"""Oracle for `cuspmap allowance --json` on the closed-form cusp profile.

Independent reference: scipy.integrate.quad over the exact cusp profile of one period
(ball: circle of R; bull-nose: level band of half-width R - rc, then circle of rc; flat end
tilted along the feed: circle of R scaled by tan(tilt), derived geometry), giving
Sz = max - min (handbook scallop height), Sv = mean - min, Ra = mean |z - mean|; then the
grit-sequence arithmetic of docs/finishing.md with the built-in table's fractions
(scratch 0.07 and Ra 0.01 x FEPA P-grade particle size, removal 0.1 mm^3/min per um).
Usage: allowance_oracle.py <path-to-cuspmap>; exits non-zero on any mismatch.
"""
import json
import math
import subprocess
import sys

from scipy import integrate, optimize

REL = 1e-6  # quad is accurate to ~1e-10 here; the binary's closed forms to ~1e-14

# FEPA P-grade mean particle sizes (from memory; same values as the built-in table).
FEPA_P = {"P180": 82.0, "P240": 58.5, "P320": 46.2, "P400": 35.0}


def profile(shape, diameter, corner, tilt_deg):
    big_r = diameter / 2.0
    if shape == "ball":
        w, c, k = 0.0, big_r, 1.0
    elif shape == "bullnose":
        w, c, k = big_r - corner, corner, 1.0
    else:
        w, c, k = 0.0, big_r, abs(math.tan(math.radians(tilt_deg)))

    def z(y):
        u = max(0.0, abs(y) - w)
        return k * (c - math.sqrt(max(0.0, c * c - u * u)))

    return z, w


def reference(shape, diameter, corner, tilt_deg, stepover):
    z, w = profile(shape, diameter, corner, tilt_deg)
    half = stepover / 2.0
    pts = [w] if 0.0 < w < half else None
    mean = integrate.quad(z, 0.0, half, points=pts, epsabs=0, epsrel=1e-12, limit=200)[0] / half
    sz = z(half) - z(0.0)
    if sz <= 0.0:
        return {"sz": 0.0, "sv": 0.0, "ra": 0.0}
    cross = optimize.brentq(lambda y: z(y) - mean, max(w, 0.0), half, xtol=1e-15)
    below = integrate.quad(lambda y: mean - z(y), 0.0, cross, points=pts if pts and w < cross else None,
                           epsabs=0, epsrel=1e-12, limit=200)[0]
    above = integrate.quad(lambda y: z(y) - mean, cross, half, epsabs=0, epsrel=1e-12, limit=200)[0]
    return {"sz": sz * 1000.0, "sv": (mean - z(0.0)) * 1000.0, "ra": (below + above) / half * 1000.0}


def run(binary, args):
    out = subprocess.run([binary, "allowance", *args, "--json"], capture_output=True, text=True)
    if out.returncode != 0:
        raise SystemExit(f"cuspmap {' '.join(args)} exited {out.returncode}: {out.stderr}")
    return json.loads(out.stdout)


def close(name, got, want, failures, tol=None):
    tol = tol if tol is not None else REL * max(abs(want), 1e-9)
    ok = abs(got - want) <= tol
    print(f"  {'ok ' if ok else 'BAD'} {name}: cuspmap {got:.9g}  reference {want:.9g}")
    if not ok:
        failures.append(name)


def main():
    binary = sys.argv[1]
    failures = []
    cases = [
        ("ball", 6.0, 0.0, 0.0, 0.5),
        ("ball", 12.7, 0.0, 0.0, 0.508),
        ("ball", 3.0, 0.0, 0.0, 2.5),
        ("bullnose", 10.0, 1.0, 0.0, 9.0),
        ("flat", 12.7, 0.0, 0.05, 0.508),
        ("flat", 12.7, 0.0, 0.5, 8.0),
    ]
    area = 9600.0
    for shape, dia, corner, tilt, step in cases:
        args = ["--tool", shape, "--diameter", str(dia), "--stepover", str(step), "--area", str(area)]
        if shape == "bullnose":
            args += ["--corner-radius", str(corner)]
        if tilt:
            args += ["--tilt", str(tilt)]
        print(f"{shape} D{dia} rc{corner} tilt{tilt} s{step}:")
        doc = run(binary, args)
        ref = reference(shape, dia, corner, tilt, step)
        close("depth_to_clear_um (Sz)", doc["depth_to_clear_um"], ref["sz"], failures)
        close("mean_removal_um (Sv)", doc["mean_removal_um"], ref["sv"], failures)
        close("marks.ra_um", doc["marks"]["Ra_um"], ref["ra"], failures)
        close("volume_mm3 = Sv x area", doc["volume_mm3"], ref["sv"] / 1000.0 * area, failures)
        close("volume_in3", doc["volume_in3"], ref["sv"] / 1000.0 * area / 25.4 ** 3, failures)
        # Grit sequence (docs/finishing.md): skip grades whose scratches exceed Sz, then
        # Sv + c1/2, (c_{i-1} + c_i)/2 ...; time = area x remove / rate.
        seq = [g for g in ["P180", "P240", "P320", "P400"]]
        scratch = {g: 0.07 * FEPA_P[g] for g in seq}
        first = next((i for i, g in enumerate(seq) if scratch[g] <= ref["sz"]), len(seq) - 1)
        used = seq[first:]
        # Issue 13: no sanding when the machined Ra is at or below the last grade's own Ra
        # (0.01 x particle size): nothing used, stock 0, final Ra = machined Ra.
        if ref["ra"] <= 0.01 * FEPA_P[seq[-1]]:
            used = []
        got = [g["grit"] for g in doc["grits"]]
        print(f"  {'ok ' if got == used else 'BAD'} grades: cuspmap {got}  reference {used}")
        if got != used:
            failures.append("grades")
            continue
        if not used:
            close("stock_valleys_nominal_um", doc["stock_valleys_nominal_um"], 0.0, failures, 0.0)
            close("stock_mean_nominal_um", doc["stock_mean_nominal_um"], 0.0, failures, 0.0)
            close("final_Ra_um", doc["final_Ra_um"], doc["marks"]["Ra_um"], failures, 0.0)
            continue
        prev = None
        for g, step_doc in zip(used, doc["grits"]):
            remove = (ref["sv"] if prev is None else scratch[prev] / 2.0) + scratch[g] / 2.0
            close(f"{g} remove_um", step_doc["remove_um"], remove, failures, 1e-6)
            close(f"{g} time_s", step_doc["time_s"], remove / 1000.0 * area / (0.1 * FEPA_P[g]) * 60.0,
                  failures, 1e-6)
            prev = g
        below = sum(scratch[g] for g in used) - scratch[used[-1]] / 2.0
        close("stock_valleys_nominal_um", doc["stock_valleys_nominal_um"], below, failures, 1e-9)
        close("stock_mean_nominal_um", doc["stock_mean_nominal_um"], ref["sv"] + below, failures,
              1e-6)
        close("final_Ra_um", doc["final_Ra_um"], 0.01 * FEPA_P[used[-1]], failures, 1e-12)
    if failures:
        print("FAILED:", ", ".join(failures))
        return 1
    print("all allowance checks agree with the scipy reference")
    return 0


if __name__ == "__main__":
    sys.exit(main())
