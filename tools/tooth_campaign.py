#!/usr/bin/env python3
"""Random tooth-resolved round trips of `cuspmap diagnose --tooth-fit` through the CLI (issue 17):
flat and bull-nose end mills (4-10 mm, 2-4 teeth, 0.5-2 deg dish, 2-10 um runout at any phase),
fz 0.03-0.08 mm, stepover 0.5-1.5 mm, one-way and zigzag, tilt 0.02-0.08 deg toward any
direction, are simulated with tooth marks, damaged in numpy (0-0.02 um noise, a setup plane, 0-2 %
missing cells), and read back through `--job` (even cases) or the tool flags with `--teeth
--feed-per-tooth` (odd cases). Judged against the truth per issue 17: runout within 15 % and 3
sigma, phase within 15 deg (modulo 360 / Z) and 3 sigma, dish within 15 % and 3 sigma, a known
along-feed sign right; Z = 2 gives only |e cos psi|, which is judged instead. A value reported
"not resolved" (no sigma, or resolved false) is "honest, not read": not a failure, counted apart.

Sources: truths are the simulation's inputs ("derived"); runout model Kline & DeVor 1983 (tooth
k's edge at R + e cos(psi - 2 pi k / Z): psi known modulo 360 / Z, Z = 2 only |e cos psi|,
derived); the along-feed tilt tilt cos(toward - lay) is first-order tilt geometry (derived).
The floor is simulated, cropped and damaged by tools/diagnose_campaign.py's helpers.
Not a ctest (each case 100-200 s of CPU). Prints one markdown row per case and a summary;
exits 1 when any case fails.
Usage: /usr/bin/python3 tools/tooth_campaign.py build/cuspmap [--seed 2030] [--cases 8]
       [--only 3,7] [--keep DIR]
"""
import argparse
import importlib.util
import json
import math
import os
import resource
import subprocess
import sys
import tempfile

import numpy as np

sys.dont_write_bytecode = True  # no __pycache__ beside the helpers
HERE = os.path.dirname(os.path.abspath(__file__))
_spec = importlib.util.spec_from_file_location("campaign",
                                               os.path.join(HERE, "diagnose_campaign.py"))
campaign = importlib.util.module_from_spec(_spec)
_spec.loader.exec_module(campaign)
oracle = campaign.oracle

RPM = 10000.0         # the job's spindle speed; fz = feed / (rpm Z)
FIELD_MM = 4.0        # the cropped floor (at least): the stage's window is at most 40 000 cells
MARGIN_MM = 1.0      # cropped around the field (the raster's passes reach past the patch)
CELLS = [0.005, 0.0075, 0.01]
MIN_CELLS_PER_FZ = 4  # the stage's own floor (kMinCellsPerTooth)
TOL = 0.15            # issue 17: runout and dish within 15 %, phase within 15 deg
TOL_PHASE_DEG = 15.0


def draw_case(rng, k, shape, teeth):
    """One tooth-resolved floor. shape: flat or bullnose; teeth: 2-4, or 0 to draw it."""
    c = {"k": k, "kind": shape, "shape": shape, "tooth": True, "tip": 0.0}
    c["teeth"] = int(teeth or rng.integers(2, 5))
    c["d"] = round(float(rng.uniform(4.0, 10.0)), 1)
    c["rc"] = round(float(rng.uniform(0.3, 0.2 * c["d"])), 2) if shape == "bullnose" else 0.0
    c["dish"] = round(float(rng.uniform(0.5, 2.0)), 2)
    c["runout"] = round(float(rng.uniform(2.0, 10.0)), 2)
    c["phase"] = round(float(rng.uniform(0.0, 360.0)), 1)
    c["fz"] = round(float(rng.uniform(0.03, 0.08)), 4)
    c["feed"] = round(c["fz"] * RPM * c["teeth"], 3)
    c["s"] = round(float(rng.uniform(0.5, 1.5)), 3)
    # Half the floors along +X (as tests/infer/tooth_fit_test.cpp), half at any lay.
    c["lay"] = 0.0 if rng.random() < 0.5 else round(float(rng.uniform(0.0, 180.0)), 1)
    c["direction"] = str(rng.choice(["one-way", "zigzag"]))
    c["tilt"] = round(float(rng.uniform(0.02, 0.08)), 4)
    c["toward"] = round(float(rng.uniform(0.0, 360.0)), 1)
    c["noise"] = round(float(rng.uniform(0.0, 0.02)), 3)
    c["plane"] = (round(float(rng.uniform(-2, 2)), 2), round(float(rng.uniform(-2, 2)), 2))
    c["missing"] = round(float(rng.uniform(0.0, 0.02)), 3)
    c["cell"] = float(rng.choice([x for x in CELLS if c["fz"] / x >= MIN_CELLS_PER_FZ]))
    # The envelope stage needs 4 stepovers across the field, as the surface reads them (it
    # refuses fewer; a field of exactly 4 was refused for a stepover read 1.2 % long): 4.5.
    c["field"] = max(FIELD_MM, math.ceil(45.0 * c["s"]) / 10.0)
    c["margin_mm"] = MARGIN_MM
    # Lines campaign.simulate adds to the job's [tool] (the bull-nose's dish, the runout).
    c["tool_more"] = ("\ndish_deg = %g" % c["dish"] if shape == "bullnose" else "") + \
        "\nrunout = %g\nrunout_phase_deg = %g" % (c["runout"] * 1e-3, c["phase"])
    c["route"] = "job" if k % 2 == 0 else "flags"
    return c


def diagnose_job(c, tmp):
    """The job as a user would give it: tool, dish, teeth, feed, passes; no runout, no tilt."""
    extra = "dish_deg = %g" % c["dish"]
    if c["shape"] == "bullnose":
        extra += "\ncorner_radius = %g" % c["rc"]
    path = os.path.join(tmp, "diag%d.toml" % c["k"])
    with open(path, "w") as f:
        f.write(oracle.JOB.format(size=c["field"] + 2 * c["margin_mm"], cell=c["cell"],
                                  shape=c["shape"],
                                  d=c["d"], teeth=c["teeth"], tool_extra=extra, feed=c["feed"],
                                  s=c["s"], lay_deg=c["lay"], direction=c["direction"],
                                  teeth_marks="true"))
    return path


def read(v):
    """(value, sigma) of a reported value; sigma None when not resolved (honest, not read)."""
    if v is None:
        return None, None
    if not v.get("resolved", False) or "sigma" not in v or not math.isfinite(v["sigma"]):
        return v["value"], None
    return v["value"], v["sigma"]


def judge(name, value, sigma, err, tol, fails, notread):
    """One value: 'not read' when unresolved; else within tol and 3 sigma, or a failure."""
    if sigma is None:
        notread.append(name)
        return "%.4g, not read" % value if value is not None else "not read"
    cell = "%.4g (%.2g)" % (value, sigma)
    if err > 3.0 * sigma:
        fails.append("%s %.4g off by %.1f sigma" % (name, value, err / max(sigma, 1e-12)))
    elif err > tol:
        fails.append("%s %.4g outside issue 17's tolerance (within %.1f sigma)" % (
            name, value, err / max(sigma, 1e-12)))
    return cell


def judge_tooth(c, j, fails, notread):
    fit = j["fit"]
    t = fit["tooth_fit"]
    cols = {"runout": "-", "phase": "-", "dish": "-", "along": "-", "sweeps": "-", "note": ""}
    if not t["ran"]:
        fails.append("stage skipped: " + t.get("skipped", "?"))
        return cols
    cols["sweeps"] = "%d" % t["sweeps"]
    z, e, psi = c["teeth"], c["runout"], c["phase"]
    if t["marks_misfit"]:
        notread += ["runout", "phase", "dish", "sign"]
        cols["note"] = "marks misfit (smoothed residual %.2f of the marks)" % (
            t["smoothed_residual_ratio"])
        return cols
    if not t["marks_seen"]:
        fails.append("no marks seen (F %.3f) on a dished, run-out floor" % (
            t["marks_variance_ratio"]))
        return cols
    if z <= 2:
        # Z = 2: the two edges at R +- e cos psi (Kline & DeVor 1983, derived): the projection.
        proj = abs(e * math.cos(math.radians(psi)))
        if not t.get("runout_projection_only", False) and not fit.get("runout_projection_only",
                                                                      True):
            fails.append("Z = 2 but the runout is not reported as a projection")
        v, sg = read(t["runout_um"])
        # 15 % of the projection, at least 15 % of e / 2 (a projection near 0 has no 15 %:
        # common practice, no source).
        cols["runout"] = "|e cos psi| %.3g: " % proj + judge(
            "|e cos psi|", v, sg, abs(v - proj), TOL * max(proj, 0.5 * e), fails, notread)
        cols["phase"] = "- (Z = 2)"
    else:
        v, sg = read(t["runout_um"])
        if t["runout_not_read"]:
            sg = None
        cols["runout"] = judge("runout", v, sg, abs(v - e), TOL * e, fails, notread)
        period = 360.0 / z
        truth = psi % period
        pv, psg = read(t.get("runout_phase_deg"))
        if t["runout_not_read"]:
            psg = None
        dpsi = abs(math.remainder(pv - psi, period)) if pv is not None else 0.0
        cols["phase"] = "%.1f: " % truth + judge("phase", pv, psg, dpsi, TOL_PHASE_DEG, fails,
                                                 notread)
        if psg is not None:
            cols["phase"] += ", %.1f off" % dpsi
        if t.get("runout_basin_sigmas") is not None:
            cols["note"] += "basin %.3g var." % t["runout_basin_sigmas"]
        else:
            cols["note"] += "one phase basin solved"
    dv, dsg = read(t["dish_deg"])
    cols["dish"] = judge("dish", dv, dsg, abs(dv - c["dish"]), TOL * c["dish"], fails, notread)
    # The along-feed tilt in the reported lay's frame (derived: tilt cos(toward - lay)).
    along = c["tilt"] * math.cos(math.radians(c["toward"] - fit["lay_deg"]))
    a = t["tilt_along_deg"]["value"]
    if t["along_sign_known"]:
        right = (a > 0) == (along > 0)
        if not right:
            fails.append("along-feed sign known but wrong (%.4f for %.4f)" % (a, along))
        cols["along"] = "%+.4f: %+.4f, sign known (%.3g var.)%s" % (
            along, a, t["along_sign_cost_sigmas"], "" if right else " WRONG")
    else:
        notread.append("sign")
        cols["along"] = "%+.4f: %+.4f, sign not known" % (along, a)
    return cols


def run_case(exe, rng, c, tmp):
    clean = campaign.simulate(exe, c, tmp)
    z = campaign.damage(rng, c, clean)
    npy = os.path.join(tmp, "floor%d.npy" % c["k"])
    np.save(npy, z.astype(np.float32))
    cmd = [exe, "diagnose", npy, "--cell", str(c["cell"]), "--tooth-fit", "--threads", "2",
           "--json"]
    if c["route"] == "job":
        cmd += ["--job", diagnose_job(c, tmp)]
    else:
        cmd += ["--tool", c["shape"], "--diameter", str(c["d"]), "--dish", str(c["dish"]),
                "--direction", c["direction"], "--teeth", str(c["teeth"]),
                "--feed-per-tooth", str(c["fz"])]
        if c["shape"] == "bullnose":
            cmd += ["--corner-radius", str(c["rc"])]
    before = resource.getrusage(resource.RUSAGE_CHILDREN)
    r = subprocess.run(cmd, capture_output=True, text=True)
    after = resource.getrusage(resource.RUSAGE_CHILDREN)
    cpu = after.ru_utime - before.ru_utime
    fails, notread = [], []
    if r.returncode != 0:
        fails.append("exit %d: %s" % (r.returncode, r.stderr.strip()))
        return {"runout": "-", "phase": "-", "dish": "-", "along": "-", "sweeps": "-",
                "note": "", "cpu": cpu}, fails, notread
    with open(os.path.join(tmp, "diagnose%d.json" % c["k"]), "w") as f:
        f.write(r.stdout)
    cols = judge_tooth(c, json.loads(r.stdout), fails, notread)
    cols["cpu"] = cpu
    return cols, fails, notread


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("exe")
    ap.add_argument("--seed", type=int, default=2030)
    ap.add_argument("--cases", type=int, default=8)
    ap.add_argument("--only", default="")
    ap.add_argument("--keep", default="")
    a = ap.parse_args()
    rng = np.random.default_rng(a.seed)
    # Mostly flats, two bull-noses; the flute counts cycle so that Z = 2, 3 and 4 all come
    # (Z = 2 shows only |e cos psi|); cases past the eighth draw Z from 2-4.
    plan = [("flat", 3), ("flat", 4), ("bullnose", 4), ("flat", 2), ("flat", 3), ("flat", 4),
            ("bullnose", 3), ("flat", 2)]
    while len(plan) < a.cases:
        plan.append(("flat", 0))
    cases = [draw_case(rng, k, shape, z) for k, (shape, z) in enumerate(plan[:a.cases])]
    only = {int(x) for x in a.only.split(",") if x}
    tmp = a.keep or tempfile.mkdtemp(prefix="toothcampaign")
    os.makedirs(tmp, exist_ok=True)
    print("| # | tool, Z, fz mm | route | s mm, passes | lay | tilt deg toward | noise um, plane "
          "um/mm, missing, cell mm | runout um: read (sigma) | phase deg mod 360/Z: read (sigma)"
          " | dish deg: read (sigma) | along deg: read, sign | sweeps, CPU s | verdict |")
    print("| --- " * 13 + "|")
    failed = 0
    counts = {"ok": 0, "not read": 0, "failed": 0}
    for c in cases:
        if only and c["k"] not in only:
            continue
        dmg = np.random.default_rng(a.seed * 1000 + c["k"])
        cols, fails, notread = run_case(a.exe, dmg, c, tmp)
        tool = "%s %g" % (c["shape"], c["d"])
        if c["shape"] == "bullnose":
            tool += " r %g" % c["rc"]
        tool += ", %d teeth, fz %g" % (c["teeth"], c["fz"])
        verdict = ("not read: " + ", ".join(notread) + "; " if notread else "") + \
            (cols["note"] + "; " if cols["note"] else "") + \
            ("FAIL: " + "; ".join(fails) if fails else "ok")
        failed += bool(fails)
        counts["failed" if fails else ("not read" if notread else "ok")] += 1
        print("| tc%d | %s | %s | %g, %s | %g | %g toward %g | %g, %g / %g, %.1f %%, %g |"
              " %g: %s | %s | %g: %s | %s | %s, %.0f | %s |" % (
                  c["k"], tool, c["route"], c["s"], c["direction"], c["lay"], c["tilt"],
                  c["toward"], c["noise"], c["plane"][0], c["plane"][1], 100 * c["missing"],
                  c["cell"], c["runout"], cols["runout"], cols["phase"], c["dish"],
                  cols["dish"], cols["along"], cols["sweeps"], cols["cpu"], verdict), flush=True)
    n = len(cases) if not only else len(only)
    print("%d of %d cases failed; %d all within tolerance; %d honest with something not read" % (
        failed, n, counts["ok"], counts["not read"]))
    sys.exit(1 if failed else 0)


if __name__ == "__main__":
    main()
