#!/usr/bin/env python3
"""Random round trips of `cuspmap diagnose` through the CLI (issue 17): floors drawn at random
(ball, flat with and without a dish, bull-nose; one-way and zigzag; any lay; stepover 0.3-3 mm;
tilt 0.005-0.15 deg toward any direction; 0-0.03 um noise, a setup plane, 0-3 % missing cells,
5-20 um cells, some rows closed by an ISO 3274 stylus tip of 2, 5 or 10 um; one noise-free floor,
one heel-lifted tooth-resolved floor) are simulated, damaged in numpy and diagnosed with the tool
known; single stylus traces (two columns x mm, z um, as profilometers export, under a comment
or a row of column names) across and along the lay go through `diagnose` and `texture`. Every reading is judged against the truth: issue
17's tolerances (tilt within 10 % or 0.002 deg, direction within 10 deg, stepover within 1 %)
and 3 of its own reported sigmas. Prints one markdown row per case (docs/diagnose.md keeps the
table) and exits 1 when any case fails.

Sources: truths are the simulation's inputs ("derived"); the ridge regime a |sin(direction from
the lay)| < a - s/2 and the heel bound are first-order tilt geometry (derived, DESIGN.md); the
stylus closing is ISO 16610-41 with ISO 3274 nominal tips (tests/cli/diagnose_roundtrip_oracle.py).
Not a ctest (minutes of CPU); the oracle keeps the failures it found as cases.
Usage: /usr/bin/python3 tools/diagnose_campaign.py build/cuspmap [--seed 2027] [--only 3,7]
       [--keep DIR]
"""
import argparse
import importlib.util
import json
import math
import os
import subprocess
import sys
import tempfile

import numpy as np

sys.dont_write_bytecode = True  # no __pycache__ beside the oracle in tests/cli
HERE = os.path.dirname(os.path.abspath(__file__))
_spec = importlib.util.spec_from_file_location(
    "oracle", os.path.join(HERE, "..", "tests", "cli", "diagnose_roundtrip_oracle.py"))
oracle = importlib.util.module_from_spec(_spec)
_spec.loader.exec_module(oracle)


CELLS = [0.005, 0.0075, 0.01, 0.015, 0.02]
MAX_CELLS_PER_SIDE = 1500  # keeps a simulate run at a few seconds (common practice, no source)


def draw_floor(rng, k, kind):
    """One floor. kind: ball, flat, flat0 (no dish), bullnose, heel, clean (noise-free flat)."""
    c = {"k": k, "kind": kind}
    shape = {"flat0": "flat", "heel": "flat", "clean": "flat"}.get(kind, kind)
    c["shape"] = shape
    c["d"] = round(float(rng.uniform(3.0, 12.0)), 1)
    c["rc"] = round(float(rng.uniform(0.3, 0.3 * c["d"])), 2) if shape == "bullnose" else 0.0
    c["dish"] = 0.0 if kind == "flat0" else (1.0 if shape == "flat" else 0.0)
    s_max = min(3.0, (0.6 if shape == "ball" else 0.9) * c["d"])
    c["s"] = round(float(rng.uniform(0.3, s_max)), 3)
    c["lay"] = round(float(rng.uniform(0.0, 180.0)), 1)
    c["direction"] = str(rng.choice(["one-way", "zigzag"]))
    c["tilt"] = round(float(math.exp(rng.uniform(math.log(0.005), math.log(0.15)))), 4)
    c["toward"] = round(float(rng.uniform(0.0, 360.0)), 1)
    c["noise"] = round(float(rng.uniform(0.0, 0.03)), 3)
    c["plane"] = (round(float(rng.uniform(-2, 2)), 2), round(float(rng.uniform(-2, 2)), 2))
    c["missing"] = round(float(rng.uniform(0.0, 0.03)), 3)
    c["tip"] = 0.0
    c["tooth"] = False
    c["teeth"] = 2
    c["feed"] = 1000.0
    # At least 5 stepovers and 5 mm of floor; the cell so that a side stays under the cap.
    c["field"] = round(max(5.0, 5.5 * c["s"]), 1)
    fine = [x for x in CELLS if (c["field"] + c["d"]) / x <= MAX_CELLS_PER_SIDE]
    c["cell"] = float(rng.choice(fine))
    if kind == "clean":
        c["noise"], c["missing"], c["plane"] = 0.0, 0.0, (0.0, 0.0)
    if kind == "heel":
        # Tooth-resolved, one-way, the end face's lowest point ahead of the cut: the heel lifts.
        c["d"], c["s"], c["direction"], c["tooth"] = 6.0, round(float(rng.uniform(0.6, 1.5)), 3), \
            "one-way", True
        c["toward"] = round((c["lay"] + float(rng.uniform(-15, 15))) % 360.0, 1)
        c["tilt"] = round(float(rng.uniform(0.03, 0.1)), 4)
        c["field"], c["cell"], c["feed"] = max(5.0, round(5.5 * c["s"], 1)), 0.01, \
            float(rng.uniform(800, 2000))
    return c


def draw_trace(rng, k, kind):
    """A floor to take one trace from: across (stepover, cusp radius) or along (feed marks)."""
    c = draw_floor(rng, k, "ball" if kind != "along-flat" else "flat")
    c["kind"] = "trace " + kind
    c["trace"] = "along" if kind.startswith("along") else "across"
    c["cell"] = 0.005 if c["trace"] == "along" else 0.01
    c["tip"] = float(rng.choice([2.0, 5.0, 10.0]))
    if c["trace"] == "along":
        c["tooth"], c["teeth"] = True, int(rng.choice([1, 2, 3]))
        c["feed"] = round(float(rng.uniform(0.04, 0.12)) * 10000 * c["teeth"], 0)
        c["field"], c["s"] = 5.0, round(float(rng.uniform(0.3, 0.9)), 3)
        c["d"] = max(c["d"], 4.0)
    return c


def simulate(exe, c, tmp):
    extra = ""
    if c["shape"] == "flat":
        extra = "dish_deg = %g\ntilt_deg = %g\ntilt_toward_deg = %g" % (c["dish"], c["tilt"],
                                                                      c["toward"])
    if c["shape"] == "bullnose":
        extra = "corner_radius = %g\ntilt_deg = %g\ntilt_toward_deg = %g" % (
            c["rc"], c["tilt"], c["toward"])
    extra += c.get("tool_more", "")  # more [tool] lines (tools/tooth_campaign.py: dish, runout)
    # The rim a tool radius around the field is cropped (a measurement lies inside its part);
    # the raster runs its passes a reach past the patch, so a narrower rim may be asked for.
    margin = c.get("margin_mm", 0.5 * c["d"])
    job = os.path.join(tmp, "job%d.toml" % c["k"])
    with open(job, "w") as f:
        f.write(oracle.JOB.format(size=c["field"] + 2 * margin, cell=c["cell"], shape=c["shape"],
                                  d=c["d"], teeth=c["teeth"], tool_extra=extra, feed=c["feed"],
                                  s=c["s"], lay_deg=c["lay"], direction=c["direction"],
                                  teeth_marks="true" if c["tooth"] else "false"))
    out = os.path.join(tmp, "sim%d" % c["k"])
    subprocess.run([exe, "simulate", job, "--out", out, "--threads", "2"], check=True,
                   stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
    z = np.load(os.path.join(out, "height.npy")).astype(np.float64)
    m = int(round(margin / c["cell"]))
    return z[m:-m, m:-m]


def damage(rng, c, z):
    if c["tip"] > 0.0:
        z = oracle.stylus_rows(z, c["cell"], c["tip"])
    ny, nx = z.shape
    y, x = np.mgrid[0:ny, 0:nx] * c["cell"]
    z = z + rng.normal(0.0, c["noise"], z.shape) + c["plane"][0] * x + c["plane"][1] * y
    z[rng.random(z.shape) < c["missing"]] = np.nan
    return z


def angle_err(a, b):
    d = abs(a - b) % 360.0
    return min(d, 360.0 - d)


def plane_rms(z):
    ny, nx = z.shape
    y, x = np.mgrid[0:ny, 0:nx]
    a = np.c_[np.ones(z.size), x.ravel(), y.ravel()]
    r = z.ravel() - a @ np.linalg.lstsq(a, z.ravel(), rcond=None)[0]
    return float(np.sqrt(np.mean(r * r)))


def judge_floor(c, j, fails):
    """Checks one diagnosed floor; returns the table's read-back columns."""
    fit = j["fit"]
    s = c["s"]
    so = fit["stepover_mm"]
    if fit.get("arc_beat"):
        # Stepover and tilt withheld: the repeat may be the tooth arcs' beat (infer/arc_beat).
        # Honest when the read repeat is not the stepover; a lost reading when it is.
        partner = fit["arc_beat_stepover_mm"]
        if abs(so["value"] - s) <= 0.01 * s:
            fails.append("stepover %.5f right but withheld as an arc beat" % so["value"])
        return {"lay": "%.3f" % j["lay_deg"], "s": "not read (%.5f)" % so["value"],
                "tilt": "not read", "toward": "-", "derr": "-",
                "verdict": "arc beat: passes ~%.3f mm apart would beat at %.4f mm" % (
                    partner, so["value"])}
    if abs(so["value"] - s) > 0.01 * s:
        fails.append("stepover %.5f outside 1 %%" % so["value"])
    if abs(so["value"] - s) > 3 * so["sigma"] + 1e-6:
        fails.append("stepover %.5f off by %.1f sigma" % (so["value"],
                                                          abs(so["value"] - s) / so["sigma"]))
    # The surface-only estimate (autocorrelation of the band means) with its own sigma.
    ss, ssig = j["stepover_mm"], j["stepover_sigma_mm"]
    if abs(ss - s) > 0.01 * s or abs(ss - s) > 3 * ssig + 1e-6:
        fails.append("surface stepover %.5f (sigma %.5f)" % (ss, ssig))
    lay_err = (j["lay_deg"] - c["lay"]) % 180.0
    if min(lay_err, 180.0 - lay_err) > 0.5:
        fails.append("lay %.3f" % j["lay_deg"])
    for key, truth in (("gx_um_per_mm", c["plane"][0]), ("gy_um_per_mm", c["plane"][1])):
        g = fit["setup_plane"][key]
        if abs(g["value"] - truth) > max(0.05, 3 * g["sigma"]):
            fails.append("plane %s %.4f (sigma %.4f)" % (key, g["value"], g["sigma"]))
    cols = {"lay": "%.3f" % j["lay_deg"], "s": "%.5f (%.5f)" % (so["value"], so["sigma"]),
            "tilt": "-", "toward": "-", "derr": "-", "verdict": ""}
    if c["shape"] == "ball":
        if fit["tilt_deg"]["fitted"]:
            fails.append("a ball's tilt was fitted")
        cols["tilt"] = "not fitted (ball)"
        return cols
    t = fit["tilt_deg"]
    cols["tilt"] = "%.5f (%.5f)" % (t["value"], t["sigma"])
    if c["kind"] == "heel":
        along = fit["tilt_along_deg"]
        truth = c["tilt"] * math.cos(math.radians(c["toward"] - c["lay"]))
        cols["tilt"] = "along %.4f (%.4f)" % (along["value"], along["sigma"])
        if not fit["heel_lifted"]:
            fails.append("heel not read as lifted")
        if fit["heel_min_tilt_deg"] > truth:
            fails.append("heel bound %.4f over the truth %.4f" % (fit["heel_min_tilt_deg"], truth))
        if along["resolved"]:
            if abs(along["value"] - truth) > max(0.1 * truth, 3 * along["sigma"]):
                fails.append("along tilt %.4f for %.4f" % (along["value"], truth))
            cols["verdict"] = "along resolved"
        else:
            if max(along["bound"], fit["heel_min_tilt_deg"]) < truth:
                fails.append("along bound %.4f under the truth %.4f" % (along["bound"], truth))
            if not any("only bounds it" in line for line in fit["verdict"]):
                fails.append("verdict does not say the tilt is only bounded")
            cols["verdict"] = "along bounded: heel >= %.4f, bound %.4f" % (
                fit["heel_min_tilt_deg"], along["bound"])
        return cols
    err = abs(t["value"] - c["tilt"])
    a = 0.5 * c["d"] - c["rc"]
    ridge = a * abs(math.sin(math.radians(c["toward"] - c["lay"]))) <= a - 0.5 * s
    de = min(angle_err(fit["tilt_toward_deg"]["value"], c["toward"]),
             angle_err(fit["tilt_toward_alt_deg"], c["toward"]))
    cols["toward"] = "%.2f (%.2f)" % (fit["tilt_toward_deg"]["value"],
                                      fit["tilt_toward_deg"]["sigma"])
    cols["derr"] = "%.2f" % de
    if t["resolved"] and err > 3 * t["sigma"]:
        fails.append("tilt %.5f off by %.1f sigma" % (t["value"], err / t["sigma"]))
    if not t["resolved"] and t["bound"] < c["tilt"]:
        fails.append("bound %.4f under the truth" % t["bound"])
    lo, hi = fit["tilt_interval_deg"]
    if not ridge:
        if t["resolved"]:
            if err > max(0.1 * c["tilt"], 0.002):
                fails.append("tilt %.5f outside 10 %% / 0.002 deg" % t["value"])
            if de > 10.0:
                fails.append("direction off by %.1f deg" % de)
            if de > 3 * fit["tilt_toward_deg"]["sigma"] + 0.5:
                fails.append("direction off by %.1f sigma" % (de / fit["tilt_toward_deg"]["sigma"]))
        cols["verdict"] = "resolved" if t["resolved"] else "bound %.4f" % t["bound"]
    else:
        if t["resolved"] and not fit["tilt_interval_only"] and (
                err > max(0.1 * c["tilt"], 0.002) or de > 10.0):
            fails.append("ridge regime: tilt %.4f toward off %.1f deg claimed resolved" % (
                t["value"], de))
        if t["resolved"] and not (lo <= c["tilt"] <= hi):
            fails.append("interval [%.4f, %.4f] misses the truth" % (lo, hi))
        cols["verdict"] = ("interval [%.4f, %.4f]" % (lo, hi) if fit["tilt_interval_only"]
                           else ("resolved" if t["resolved"] else "bound %.4f" % t["bound"]))
        cols["verdict"] += " (ridge regime)"
    return cols


def run_floor(exe, rng, c, tmp):
    clean = simulate(exe, c, tmp)
    z = damage(rng, c, clean)
    npy = os.path.join(tmp, "floor%d.npy" % c["k"])
    np.save(npy, z.astype(np.float32))
    cmd = [exe, "diagnose", npy, "--cell", str(c["cell"]), "--tool", c["shape"], "--diameter",
           str(c["d"]), "--direction", c["direction"], "--threads", "2", "--json"]
    if c["shape"] == "flat":
        cmd += ["--dish", str(c["dish"])]
    if c["shape"] == "bullnose":
        cmd += ["--corner-radius", str(c["rc"])]
    if c["tip"] > 0.0:
        cmd += ["--stylus-tip", "%gum" % c["tip"]]
    r = subprocess.run(cmd, capture_output=True, text=True)
    fails = []
    if r.returncode != 0:
        # A refusal is right when the marks (2 sqrt 2 x the clean floor's rms about its plane,
        # diagnose's own measure) are under the noise (derived).
        marks = 2.0 * math.sqrt(2.0) * plane_rms(clean)
        right = r.returncode == 2 and "noise" in r.stderr and marks < 3.0 * c["noise"]
        if c["kind"] == "heel" and r.returncode == 2 and "feed marks" in r.stderr:
            # A heel floor's passes: a cusp tan(along) (a - sqrt(a^2 - s^2/4)) and a step
            # s tan(across) (DESIGN.md first-order tilt) against the feed marks' rise
            # (fz / 2) tan(dish) (derived); refusing is right when the passes are under them.
            a, s = 0.5 * c["d"], c["s"]
            rel = math.radians(c["toward"] - c["lay"])
            t = math.radians(c["tilt"])
            passes = 1e3 * (math.tan(t * abs(math.cos(rel))) * (a - math.sqrt(a * a - s * s / 4))
                            + s * math.tan(t * abs(math.sin(rel))))
            fz = c["feed"] / (10000.0 * c["teeth"])
            rise = 1e3 * 0.5 * fz * math.tan(math.radians(c["dish"]))
            right = right or passes < rise
        if not right:
            fails.append("exit %d: %s (marks %.3g um)" % (r.returncode, r.stderr.strip(), marks))
        return {"lay": "-", "s": "-", "tilt": "-", "toward": "-", "derr": "-",
                "verdict": "refused: " + r.stderr.strip()}, fails
    return judge_floor(c, json.loads(r.stdout), fails), fails


def run_trace(exe, rng, c, tmp):
    """One trace through the floor's centre, across the lay (or along it), at the cell step:
    bilinear samples of the noise-free floor, the stylus closing, noise, a slope, missing points
    (written as NaN rows), x in mm and z in um under a '#' header."""
    z = simulate(exe, c, tmp)
    ny, nx = z.shape
    th = math.radians(c["lay"] + (90.0 if c["trace"] == "across" else 0.0))
    n = int(0.9 * min(nx, ny) / max(abs(math.cos(th)), abs(math.sin(th)), 1e-9))
    n = min(n, int(0.9 * min(nx, ny)))
    t = (np.arange(n) - 0.5 * n)
    xs, ys = 0.5 * nx + t * math.cos(th), 0.5 * ny + t * math.sin(th)
    i0, j0 = np.floor(xs).astype(int), np.floor(ys).astype(int)
    fx, fy = xs - i0, ys - j0
    zt = ((1 - fx) * (1 - fy) * z[j0, i0] + fx * (1 - fy) * z[j0, i0 + 1] +
          (1 - fx) * fy * z[j0 + 1, i0] + fx * fy * z[j0 + 1, i0 + 1])
    if c["tip"] > 0.0:
        zt = oracle.stylus_rows(zt[None, :], c["cell"], c["tip"])[0]
    x = t * c["cell"] - t[0] * c["cell"]
    zt = zt + rng.normal(0.0, c["noise"], n) + c["plane"][0] * x
    zt[rng.random(n) < c["missing"]] = np.nan
    path = os.path.join(tmp, "trace%d.txt" % c["k"])
    # Half the traces carry a '#' comment, half a row of column names with tabs, as
    # profilometers write them.
    tabbed = c["k"] % 2 == 1
    with open(path, "w") as f:
        f.write("X [mm]\tZ [um]\n" if tabbed else "# x mm, z um (trace %s the lay)\n" % c["trace"])
        for xv, zv in zip(x, zt):
            f.write("%.6f%s%s\n" % (xv, "\t" if tabbed else " ",
                                    "nan" if np.isnan(zv) else "%.5f" % zv))
    fails = []
    r = subprocess.run([exe, "diagnose", path, "--stylus-tip", "%gum" % c["tip"], "--json"],
                       capture_output=True, text=True)
    tx = subprocess.run([exe, "texture", path, "--json"], capture_output=True, text=True)
    cols = {"lay": "-", "s": "-", "tilt": "-", "toward": "-", "derr": "-", "verdict": ""}
    if tx.returncode != 0:
        fails.append("texture exit %d: %s" % (tx.returncode, tx.stderr.strip()))
    else:
        p = json.loads(tx.stdout)["profile"]
        cols["verdict"] = "texture Ra %.3g um, RSm %.4g mm, cut-off %g; " % (
            p["Ra_um"], p["RSm_mm"], p["cutoff_mm"])
    if r.returncode != 0:
        fails.append("diagnose exit %d: %s" % (r.returncode, r.stderr.strip()))
        return cols, fails
    j = json.loads(r.stdout)
    per = j["period_mm"] if "period_mm" in j else j["period"]["period_mm"]
    sig = j["period_sigma_mm"] if "period_sigma_mm" in j else j["period"]["sigma_mm"]
    if c["trace"] == "across":
        truth = c["s"]
    else:
        truth = c["feed"] / (10000.0 * c["teeth"])
    cols["s"] = "%.5f (%.5f) for %.4f" % (per, sig, truth)
    if abs(per - truth) > 0.01 * truth and c["trace"] == "across":
        fails.append("period %.5f outside 1 %% of %.4f" % (per, truth))
    if abs(per - truth) > 0.02 * truth and c["trace"] == "along":
        fails.append("period %.5f outside 2 %% of %.4f" % (per, truth))
    if abs(per - truth) > 3 * sig + 1e-6:
        fails.append("period off by %.1f sigma" % (abs(per - truth) / sig))
    cusp = j.get("cusp", {})
    if c["trace"] == "across" and cusp.get("curved"):
        rad = cusp["effective_radius_mm"]
        cols["tilt"] = "radius %.4f (%.4f) for %.2f" % (rad, cusp["effective_radius_sigma_mm"],
                                                         c["d"] / 2)
        if abs(rad - c["d"] / 2) > 0.05 * c["d"] / 2:
            fails.append("radius %.3f outside 5 %% of %.2f" % (rad, c["d"] / 2))
        if abs(rad - c["d"] / 2) > 3 * cusp["effective_radius_sigma_mm"]:
            fails.append("radius %.3f off by %.1f sigma" % (
                rad, abs(rad - c["d"] / 2) / cusp["effective_radius_sigma_mm"]))
    return cols, fails


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("exe")
    ap.add_argument("--seed", type=int, default=2027)
    ap.add_argument("--only", default="")
    ap.add_argument("--keep", default="")
    a = ap.parse_args()
    rng = np.random.default_rng(a.seed)
    kinds = ["clean", "ball", "flat", "bullnose", "flat0", "heel", "flat", "bullnose", "ball",
             "flat0", "flat", "bullnose", "flat", "ball", "flat0", "bullnose"]
    cases = [draw_floor(rng, k, kind) for k, kind in enumerate(kinds)]
    # Stylus tips (ISO 3274 nominal 2, 5, 10 um) on fine cells for four floors.
    for k, tip in ((2, 2.0), (7, 5.0), (10, 10.0), (12, 2.0)):
        cases[k]["tip"], cases[k]["cell"] = tip, 0.005 if cases[k]["field"] < 6.5 else 0.0075
    for kind in ("across-ball", "across-ball-2", "along-ball", "along-flat"):
        cases.append(draw_trace(rng, len(cases), kind))
    only = {int(x) for x in a.only.split(",") if x}
    tmp = a.keep or tempfile.mkdtemp(prefix="campaign")
    os.makedirs(tmp, exist_ok=True)
    print("| # | tool | s mm | tilt deg toward | passes | lay | noise um, plane um/mm, missing,"
          " cell mm, tip um | lay read | stepover / period (sigma) | tilt (sigma) |"
          " toward (sigma) | direction error, deg | verdict |")
    print("| --- " * 13 + "|")
    failed = 0
    for c in cases:
        if only and c["k"] not in only:
            continue
        dmg = np.random.default_rng(a.seed * 1000 + c["k"])
        if "trace" in c:
            cols, fails = run_trace(a.exe, dmg, c, tmp)
        else:
            cols, fails = run_floor(a.exe, dmg, c, tmp)
        tool = c["shape"] + " %g" % c["d"]
        if c["shape"] == "bullnose":
            tool += " r %g" % c["rc"]
        if c["shape"] == "flat":
            tool += " dish %g" % c["dish"]
        if c["kind"].startswith("trace"):
            tool = c["kind"] + ", " + tool
        elif c["kind"] in ("heel", "clean"):
            tool = c["kind"] + ", " + tool
        if c["tooth"]:
            tool += ", %d teeth, fz %.4g" % (c["teeth"], c["feed"] / (10000.0 * c["teeth"]))
        verdict = cols["verdict"] + ("; FAIL: " + "; ".join(fails) if fails else "; ok")
        failed += bool(fails)
        print("| rs%d | %s | %g | %g toward %g | %s | %g | %g, %g / %g, %.1f %%, %g, %g | %s | %s |"
              " %s | %s | %s | %s |" % (
                  c["k"], tool, c["s"], c["tilt"], c["toward"], c["direction"], c["lay"],
                  c["noise"], c["plane"][0], c["plane"][1], 100 * c["missing"], c["cell"],
                  c["tip"], cols["lay"], cols["s"], cols["tilt"], cols["toward"], cols["derr"],
                  verdict), flush=True)
    print("%d of %d cases failed" % (failed, len(cases) if not only else len(only)))
    sys.exit(1 if failed else 0)


if __name__ == "__main__":
    main()
