"""Independent vectorised evaluation of a PT round with numpy, for `npm run bench`.

Written apart from shared/stats (no code shared): ISO 13528 Algorithm A (median start,
s* = 1.483 MAD, winsorize at 1.5 s*, s* = 1.134 SD, iterate until x* and s* change by less
than 1e-12 s*), u(x_pt) = 1.25 s*/sqrt(p), sigma_pt = s*, z and z'.

Input (argv[1]): a folder with participant.i32, group.i32, value.f64 (one entry per replicate
row, little-endian) and meta.json {"codes": int, "groups": int}. Output on stdout: JSON with
the median and p95 CPU time in ms over `runs` evaluations and x*, s* per group for cross-checking.
"""
import json
import sys
import time

import numpy as np


def algorithm_a(x):
    xs = np.median(x)
    s = 1.483 * np.median(np.abs(x - xs))
    if s <= 0:
        return xs, 0.0
    for _ in range(1000):
        delta = 1.5 * s
        w = np.clip(x, xs - delta, xs + delta)
        new_x = w.mean()
        new_s = 1.134 * w.std(ddof=1)
        done = abs(new_x - xs) <= 1e-12 * new_s and abs(new_s - s) <= 1e-12 * new_s
        xs, s = new_x, new_s
        if done:
            break
    return xs, s


def evaluate(participant, group, value, n_codes, n_groups):
    # One key per (group, participant); means and replicate SDs by sorting on the key.
    key = group.astype(np.int64) * n_codes + participant
    order = np.argsort(key, kind="stable")
    k = key[order]
    v = value[order]
    starts = np.flatnonzero(np.r_[True, k[1:] != k[:-1]])
    counts = np.diff(np.r_[starts, len(k)])
    sums = np.add.reduceat(v, starts)
    means = sums / counts
    sq = np.add.reduceat(v * v, starts)
    with np.errstate(invalid="ignore", divide="ignore"):
        sds = np.sqrt(np.maximum(sq - sums * means, 0) / (counts - 1))
    cell_group = k[starts] // n_codes
    out = []
    bounds = np.searchsorted(cell_group, np.arange(n_groups + 1))
    for g in range(n_groups):
        x = means[bounds[g]:bounds[g + 1]]
        xs, s = algorithm_a(x)
        u = 1.25 * s / np.sqrt(len(x))
        z = (x - xs) / s if s > 0 else None
        zp = (x - xs) / np.sqrt(s * s + u * u) if s > 0 else None
        out.append((xs, s, z, zp, sds[bounds[g]:bounds[g + 1]]))
    return out


def main():
    folder = sys.argv[1]
    runs = int(sys.argv[2]) if len(sys.argv) > 2 else 20
    meta = json.load(open(folder + "/meta.json"))
    participant = np.fromfile(folder + "/participant.i32", dtype="<i4")
    group = np.fromfile(folder + "/group.i32", dtype="<i4")
    value = np.fromfile(folder + "/value.f64", dtype="<f8")
    evaluate(participant, group, value, meta["codes"], meta["groups"])  # warm-up
    times = []
    for _ in range(runs):
        t0 = time.process_time()
        res = evaluate(participant, group, value, meta["codes"], meta["groups"])
        times.append((time.process_time() - t0) * 1000)
    times.sort()
    print(json.dumps({
        "median_ms": times[len(times) // 2],
        "p95_ms": times[min(len(times) - 1, int(np.ceil(0.95 * len(times))) - 1)],
        "runs": runs,
        "groups": [{"x": float(r[0]), "s": float(r[1])} for r in res],
        "numpy": np.__version__,
    }))


if __name__ == "__main__":
    main()
