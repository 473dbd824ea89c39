#!/usr/bin/python3
"""Numpy oracle for `cuspmap stepover --json`: builds the cross-feed profile as the pointwise
minimum of many neighbouring tool sections (planes) or tool circles (cylinders) on a fine grid,
integrates Ra/Rq exactly over the piecewise-linear samples, and compares cusp height, Ra and Rq
with the binary's exact values (agreement <= 0.5%). Also checks the handbook ball formula,
turning theory and that inch inputs equal their metric equivalents.

Usage: /usr/bin/python3 cusp_profile_oracle.py <path-to-cuspmap>
Method: direct envelope sampling; ISO 4287 Ra/Rq; Machinery's Handbook cusp formula; Boothroyd &
Knight turning formulas; Lin & Koren (1996) circle-intersection scallop geometry.
"""
import json
import math
import subprocess
import sys

import numpy as np

REL_TOL = 0.005  # the bound for the min-of-circles check
SAMPLES = 400001


def run(binary, args):
    out = subprocess.run([binary, "stepover", *args, "--json"], capture_output=True, text=True)
    if out.returncode != 0:
        raise RuntimeError(f"cuspmap {' '.join(args)} failed: {out.stderr.strip()}")
    return json.loads(out.stdout)


def section(y, big_r, rc):
    """Swept section height above the tip at lateral offset y: flat, corner arcs, none past R."""
    a = big_r - rc
    ay = np.abs(y)
    h = np.full_like(y, np.inf)
    h[ay <= a] = 0.0
    arc = (ay > a) & (ay <= big_r)
    u = ay[arc] - a
    h[arc] = rc - np.sqrt(np.maximum(rc * rc - u * u, 0.0))
    return h


def plane_profile(big_r, rc, s, slope_deg):
    al = math.radians(slope_deg)
    t = math.tan(al)
    y = np.linspace(0.0, s, SAMPLES)
    env = np.full_like(y, np.inf)
    k_max = int(2 * big_r / s) + 4
    for k in range(-k_max, k_max + 1):
        env = np.minimum(env, section(y - k * s, big_r, rc) + k * s * t)
    r = env - y * t
    r -= r.min()
    return y / math.cos(al) + r * math.sin(al), r * math.cos(al)


def cylinder_profile(big_r, rho, convex, s):
    phi = s / rho
    c = rho + big_r if convex else rho - big_r
    th = np.linspace(0.0, phi, SAMPLES)
    best = np.full_like(th, np.inf if convex else 0.0)
    for k in range(-3, 5):
        proj = c * np.cos(th - k * phi)
        disc = proj * proj - (c * c - big_r * big_r)
        ok = (disc >= 0) & (proj > 0)
        root = np.sqrt(np.where(ok, disc, 0.0))
        if convex:
            best = np.where(ok, np.minimum(best, proj - root), best)
        else:
            best = np.where(ok, np.maximum(best, proj + root), best)
    n = best - rho if convex else rho - best
    return rho * th, n


def stats(x, n):
    """Cusp, Ra, Rq in um, integrating each linear segment exactly."""
    dx = np.diff(x)
    period = x[-1] - x[0]
    mean = np.sum(0.5 * (n[1:] + n[:-1]) * dx) / period
    a, b = n[:-1] - mean, n[1:] - mean
    rq = np.sum(dx * (a * a + a * b + b * b) / 3.0) / period
    same = a * b >= 0
    denom = np.where(same, 1.0, np.abs(b - a))
    seg = np.where(same, dx * 0.5 * np.abs(a + b), dx * 0.5 * (a * a + b * b) / denom)
    ra = np.sum(seg) / period
    return n.max() * 1e3, ra * 1e3, math.sqrt(rq) * 1e3


FAILURES = []


def compare(label, got, want, tol):
    ok = abs(got - want) <= tol
    status = "ok  " if ok else "FAIL"
    print(f"{status} {label}: cuspmap {got:.6g} oracle {want:.6g} (tol {tol:.3g})")
    if not ok:
        FAILURES.append(label)


def check_profile(binary, name, args, profile):
    j = run(binary, args)
    h, ra, rq = stats(*profile)
    compare(f"{name} cusp", j["cusp_um"], h, REL_TOL * h)
    compare(f"{name} Ra", j["Ra_um"], ra, REL_TOL * ra)
    compare(f"{name} Rq", j["Rq_um"], rq, REL_TOL * rq)


def main():
    binary = sys.argv[1]
    planes = [
        ("ball level", ["--tool", "ball", "--diameter", "6", "--stepover", "0.5"], (3, 3, 0.5, 0)),
        ("ball level wide", ["--tool", "ball", "--diameter", "6", "--stepover", "4"], (3, 3, 4, 0)),
        ("ball slope 30", ["--diameter", "6", "--slope", "30", "--stepover", "0.5"],
         (3, 3, 0.5, 30)),
        ("ball slope 60 (side cuts)", ["--diameter", "6", "--slope", "60", "--stepover", "2"],
         (3, 3, 2, 60)),
        ("bull-nose level", ["--tool", "bullnose", "--diameter", "10", "--corner-radius", "1",
                             "--stepover", "9"], (5, 1, 9, 0)),
        ("bull-nose slope 20", ["--tool", "bullnose", "--diameter", "10", "--corner-radius", "1",
                                "--slope", "20", "--stepover", "3"], (5, 1, 3, 20)),
        ("flat slope 10", ["--tool", "flat", "--diameter", "10", "--slope", "10",
                           "--stepover", "1"], (5, 0, 1, 10)),
        ("ball inch", ["--units", "in", "--diameter", "0.25", "--stepover", "0.02"],
         (3.175, 3.175, 0.508, 0)),
    ]
    for name, args, (big_r, rc, s, slope) in planes:
        check_profile(binary, name, args, plane_profile(big_r, rc, s, slope))
    cylinders = [
        ("convex rho 20", ["--diameter", "6", "--surface", "convex", "--surface-radius", "20",
                           "--stepover", "0.5"], (3, 20, True, 0.5)),
        ("concave rho 20", ["--diameter", "6", "--surface", "concave", "--surface-radius", "20",
                            "--stepover", "0.5"], (3, 20, False, 0.5)),
        ("concave rho 5", ["--diameter", "6", "--surface", "concave", "--surface-radius", "5",
                           "--stepover", "2"], (3, 5, False, 2)),
    ]
    for name, args, (big_r, rho, convex, s) in cylinders:
        check_profile(binary, name, args, cylinder_profile(big_r, rho, convex, s))
    # Turning marks are circles of the nose radius stepped by the feed.
    check_profile(binary, "turning r 0.8 f 0.2",
                  ["--tool", "insert", "--nose-radius", "0.8", "--feed-per-rev", "0.2"],
                  plane_profile(0.8, 0.8, 0.2, 0))

    # Machinery's Handbook cusp formula h = R - sqrt(R^2 - (s/2)^2), and its inverse.
    j = run(binary, ["--diameter", "6", "--stepover", "0.5"])
    compare("handbook ball cusp", j["cusp_um"], (3 - math.sqrt(9 - 0.0625)) * 1e3, 1e-9)
    j = run(binary, ["--diameter", "6", "--target-scallop", "5um"])
    compare("handbook inverse s = 2 sqrt(h (2R - h))", j["stepover_mm"],
            2 * math.sqrt(0.005 * (6 - 0.005)), 1e-9)
    # Boothroyd & Knight: Rt = f^2/(8r), Ra = f^2/(18 sqrt 3 r).
    j = run(binary, ["--tool", "insert", "--nose-radius", "0.8", "--feed-per-rev", "0.2"])
    compare("turning Rt approx", j["Rz_approx_um"], 0.04 / 6.4 * 1e3, 1e-9)
    compare("turning Ra approx", j["Ra_approx_um"], 0.04 / (18 * math.sqrt(3) * 0.8) * 1e3, 1e-9)
    # Inch inputs equal their metric equivalents; trade rule: about 0.4 thou (common practice).
    a = run(binary, ["--diameter", "0.25in", "--stepover", "20thou"])
    b = run(binary, ["--diameter", "6.35mm", "--stepover", "0.508"])
    compare("inch = metric", a["cusp_um"], b["cusp_um"], 1e-9)
    compare("1/4 in ball at 0.020 in ~ 0.4 thou", a["cusp_um"] / 25.4, 0.4, 0.01)

    if FAILURES:
        print(f"{len(FAILURES)} comparison(s) failed: {', '.join(FAILURES)}")
        return 1
    print("all comparisons agree")
    return 0


if __name__ == "__main__":
    sys.exit(main())
