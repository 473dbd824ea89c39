#!/usr/bin/python3
"""Oracle for `cuspmap calibrate --json`: predictions and the least-squares fit.

Independent references:
- the kinematic Ra of a ball's cusp profile across the feed, from a dense numpy sampling of
  one period of z(y) = R - sqrt(R^2 - y^2), |y| <= s/2 (handbook cusp geometry), Ra = mean|z - mean|
  (ISO 4287 definition);
- numpy.polyfit(deg=1, cov=True) for floor, scale and their covariance (its covariance is
  scaled by the residual sum of squares over n - 2, as ordinary least squares prescribes).
A synthetic shop: measured = 0.2 um + 1.4 x kinematic + noise (sd 0.03 um, fixed seed).
Usage: shop_calibration_oracle.py <path-to-cuspmap>; exits non-zero on any mismatch.
"""
import json
import os
import subprocess
import sys
import tempfile

import numpy as np


def ball_ra_um(diameter_mm, stepover_mm, samples=2_000_001):
    r = diameter_mm / 2.0
    y = np.linspace(-stepover_mm / 2.0, stepover_mm / 2.0, samples)
    z = (r - np.sqrt(r * r - y * y)) * 1000.0
    return float(np.mean(np.abs(z - np.mean(z))))


def main():
    binary = sys.argv[1]
    rng = np.random.default_rng(7)
    stepovers = [0.15, 0.25, 0.35, 0.5, 0.65, 0.8, 1.0]
    truth = [ball_ra_um(6.0, s) for s in stepovers]
    measured = [0.2 + 1.4 * p + rng.normal(0.0, 0.03) for p in truth]
    failures = []
    with tempfile.TemporaryDirectory() as tmp:
        csv = os.path.join(tmp, "history.csv")
        with open(csv, "w") as f:
            f.write("name,tool,diameter,stepover,measured_ra\n")
            for k, (s, m) in enumerate(zip(stepovers, measured)):
                f.write(f"cover {k},ball,6mm,{s!r},{m!r}um\n")
        out = os.path.join(tmp, "out")
        run = subprocess.run([binary, "calibrate", csv, "--json", "--out", out],
                             capture_output=True, text=True, check=False)
        if run.returncode != 0:
            print(run.stderr)
            sys.exit(1)
        doc = json.loads(run.stdout)
        for row, ref in zip(doc["rows"], truth):
            rel = abs(row["predicted_Ra_um"] - ref) / ref
            if rel > 2e-5:  # dense sampling converges to ~1e-7 relative here
                failures.append(f"{row['name']}: predicted {row['predicted_Ra_um']} vs {ref}")
        pred = np.array([r["predicted_Ra_um"] for r in doc["rows"]])
        (scale, floor), cov = np.polyfit(pred, np.array(measured), 1, cov=True)
        checks = [("floor_um", doc["floor_um"], floor), ("scale", doc["scale"], scale),
                  ("scale_sd", doc["scale_sd"], np.sqrt(cov[0, 0])),
                  ("floor_sd_um", doc["floor_sd_um"], np.sqrt(cov[1, 1])),
                  ("cov_floor_scale_um", doc["cov_floor_scale_um"], cov[0, 1])]
        for name, got, want in checks:
            if abs(got - want) > 1e-9 * max(1.0, abs(want)):
                failures.append(f"{name}: {got} vs numpy.polyfit {want}")
        if doc["model"] != "floor+scale":
            failures.append(f"model {doc['model']}")
        if abs(doc["floor_um"] - 0.2) > 3 * doc["floor_sd_um"] or \
                abs(doc["scale"] - 1.4) > 3 * doc["scale_sd"]:
            failures.append("true floor/scale outside 3 standard errors")
        for name in ("shop.toml", "calibration.svg"):
            if not os.path.isfile(os.path.join(out, name)):
                failures.append(f"{name} not written")
    for f in failures:
        print("FAIL", f)
    print(f"shop_calibration_oracle: {len(stepovers)} rows, {len(failures)} failures")
    sys.exit(1 if failures else 0)


if __name__ == "__main__":
    main()
