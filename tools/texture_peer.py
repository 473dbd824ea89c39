#!/usr/bin/env python3
"""Peer for timing `cuspmap texture`: the same areal set computed with numpy/scipy as a script
writer would (least-squares plane, Sa..Sku, Sdr, Sal/Str from a zero-padded FFT autocorrelation,
lay from the Hann-windowed power spectrum). Used by tools/time_commands.sh, not by the tests.

Sources: ISO 25178-2:2012 §4.1 (height parameters about the least-squares plane), §4.2.1-4.2.2
(Sal: shortest lag where the ACF falls to s = 0.2; Str = Sal / longest such lag), §4.3.2 (Sdr);
Wiener-Khinchin theorem (ACF = inverse FFT of |F|^2). Reference implementation: numpy + scipy
(Debian python3-numpy, python3-scipy), float64, scipy.fft with all cores (workers=-1).
Usage: /usr/bin/python3 texture_peer.py FLOOR.npy CELL_MM  -> one JSON object on stdout
"""
import json
import math
import sys

import numpy as np
import scipy.fft
import scipy.ndimage

THRESHOLD = 0.2  # ISO 25178-2 default s for Sal/Str
ANGLE_STEP_DEG = 0.5
STEP_CELLS = 0.25


def areal(z, cell):
    z = z.astype(np.float64)
    ny, nx = z.shape
    m = np.isfinite(z)
    yy, xx = np.mgrid[0:ny, 0:nx]
    x = (xx + 0.5) * cell
    y = (yy + 0.5) * cell
    a = np.column_stack([np.ones(m.sum()), x[m], y[m]])
    coef, *_ = np.linalg.lstsq(a, z[m], rcond=None)
    r = z - (coef[0] + coef[1] * x + coef[2] * y)
    v = r[m]
    sq = math.sqrt(np.mean(v ** 2))
    out = {"Sa_um": float(np.mean(np.abs(v))), "Sq_um": sq, "Sp_um": float(v.max()),
           "Sv_um": float(-v.min()), "Sz_um": float(v.max() - v.min()),
           "Ssk": float(np.mean(v ** 3) / sq ** 3), "Sku": float(np.mean(v ** 4) / sq ** 4)}
    gx = ((r[:-1, 1:] - r[:-1, :-1]) + (r[1:, 1:] - r[1:, :-1])) / (2 * cell) * 1e-3
    gy = ((r[1:, :-1] - r[:-1, :-1]) + (r[1:, 1:] - r[:-1, 1:])) / (2 * cell) * 1e-3
    g2 = gx ** 2 + gy ** 2
    ok = np.isfinite(g2)
    out["Sdr"] = float(np.mean(np.sqrt(1 + g2[ok]) - 1))
    r = np.where(m, r, 0.0)
    out.update(sal_str(r, m, cell))
    out.update(lay(r))
    return out


def sal_str(r, m, cell):
    ny, nx = r.shape
    py = scipy.fft.next_fast_len(ny + ny // 2 + 1, real=True)
    px = scipy.fft.next_fast_len(nx + nx // 2 + 1, real=True)
    f = scipy.fft.rfft2(r, s=(py, px), workers=-1)
    acf = scipy.fft.irfft2(f.real ** 2 + f.imag ** 2, s=(py, px), workers=-1)
    if m.all():
        ty = np.arange(py)
        ty = np.where(ty > py // 2, ty - py, ty)
        tx = np.arange(px)
        tx = np.where(tx > px // 2, tx - px, tx)
        pairs = np.outer(np.maximum(ny - np.abs(ty), 0), np.maximum(nx - np.abs(tx), 0))
    else:
        g = scipy.fft.rfft2(m.astype(np.float64), s=(py, px), workers=-1)
        pairs = np.rint(scipy.fft.irfft2(g.real ** 2 + g.imag ** 2, s=(py, px), workers=-1))
    acf = np.where(pairs >= 1, acf / np.maximum(pairs, 1), 0.0)
    acf = np.fft.fftshift(acf / acf[0, 0])
    cy, cx = py // 2, px // 2
    reach_x, reach_y = 0.5 * (nx - 1), 0.5 * (ny - 1)
    shortest, longest, found_any = math.inf, 0.0, False
    for k in range(int(round(180 / ANGLE_STEP_DEG))):
        a = math.radians(k * ANGLE_STEP_DEG)
        c, s = math.cos(a), math.sin(a)
        reach = min(reach_x / abs(c) if abs(c) > 1e-12 else math.inf,
                    reach_y / abs(s) if abs(s) > 1e-12 else math.inf)
        rr = np.arange(1, int(reach / STEP_CELLS) + 1) * STEP_CELLS
        vals = scipy.ndimage.map_coordinates(acf, [cy + rr * s, cx + rr * c], order=1)
        below = np.nonzero(vals <= THRESHOLD)[0]
        if below.size == 0:
            longest = max(longest, reach)
            continue
        i = below[0]
        prev_r, prev_v = (rr[i - 1], vals[i - 1]) if i > 0 else (0.0, 1.0)
        d = prev_r + (prev_v - THRESHOLD) / (prev_v - vals[i]) * (rr[i] - prev_r)
        found_any = True
        shortest, longest = min(shortest, d), max(longest, d)
    if not found_any:
        return {"Sal_mm": 0.0, "Str": 0.0}
    return {"Sal_mm": shortest * cell, "Str": shortest / longest if longest > 0 else 0.0}


def lay(r):
    ny, nx = r.shape
    wy = 0.5 - 0.5 * np.cos(2 * np.pi * (np.arange(ny) + 0.5) / ny)
    wx = 0.5 - 0.5 * np.cos(2 * np.pi * (np.arange(nx) + 0.5) / nx)
    f = scipy.fft.rfft2(r * np.outer(wy, wx), workers=-1)
    p = f.real ** 2 + f.imag ** 2
    i = np.arange(f.shape[1])
    p[:, (i > 0) & (2 * i != nx)] *= 2
    p[0, 0] = 0
    ky = scipy.fft.fftfreq(ny)[:, None]
    kx = (i / nx)[None, :]
    phi2 = 2 * np.arctan2(ky, kx)
    c, s, total = (p * np.cos(phi2)).sum(), (p * np.sin(phi2)).sum(), p.sum()
    deg = (0.5 * math.degrees(math.atan2(s, c)) + 90.0) % 180.0
    return {"lay_deg": deg, "lay_strength": math.hypot(c, s) / total}


def main():
    z = np.load(sys.argv[1])
    print(json.dumps(areal(z, float(sys.argv[2]))))


if __name__ == "__main__":
    main()
