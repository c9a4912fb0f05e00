#!/usr/bin/python3
"""Peer timings for bench_kernel_geometric: the same measures computed the usual way with
NumPy/SciPy (Debian python3-numpy, python3-scipy), on the same kind of data (seeded Gaussian
blobs, B shifted by 0.5 in x, equal weights), at sizes the brute force can hold in memory.

  MMD (V-statistic, sigma = 1) and energy distance: full distance matrices from
  scipy.spatial.distance.cdist, then NumPy sums (O(n^2) memory: 3 matrices of n^2 doubles).
  Chamfer and Hausdorff: scipy.spatial.cKDTree queries on all cores (workers=-1);
  Hausdorff also with scipy.spatial.distance.directed_hausdorff.

Run: /usr/bin/python3 tests/bench/peer_kernel.py   (prints a Markdown table; best of 3)
"""
import time

import numpy as np
from scipy.spatial import cKDTree
from scipy.spatial.distance import cdist, directed_hausdorff


def blobs(n, seed=1):
    rng = np.random.default_rng(seed)
    a = rng.standard_normal((n, 2))
    b = rng.standard_normal((n, 2))
    b[:, 0] += 0.5
    return a, b


def mmd_v(x, y, sigma=1.0):
    g = 1.0 / (2 * sigma * sigma)
    kxx = np.exp(-g * cdist(x, x, "sqeuclidean")).mean()
    kyy = np.exp(-g * cdist(y, y, "sqeuclidean")).mean()
    kxy = np.exp(-g * cdist(x, y, "sqeuclidean")).mean()
    return np.sqrt(max(kxx + kyy - 2 * kxy, 0.0))


def energy(x, y):
    e = 2 * cdist(x, y).mean() - cdist(x, x).mean() - cdist(y, y).mean()
    return np.sqrt(max(e, 0.0))


def chamfer(x, y):
    dx, _ = cKDTree(y).query(x, workers=-1)
    dy, _ = cKDTree(x).query(y, workers=-1)
    return dx.mean() + dy.mean()


def hausdorff_tree(x, y):
    dx, _ = cKDTree(y).query(x, workers=-1)
    dy, _ = cKDTree(x).query(y, workers=-1)
    return max(dx.max(), dy.max())


def hausdorff_scipy(x, y):
    return max(directed_hausdorff(x, y)[0], directed_hausdorff(y, x)[0])


def best_of(f, *args, repeat=3):
    best, value = float("inf"), None
    for _ in range(repeat):
        t0 = time.perf_counter()
        value = f(*args)
        best = min(best, time.perf_counter() - t0)
    return best, value


def main():
    rows = []
    for name, f, sizes in [
        ("mmd (cdist + numpy)", mmd_v, [2000, 5000, 10000]),
        ("energy (cdist + numpy)", energy, [2000, 5000, 10000]),
        ("chamfer (cKDTree, workers=-1)", chamfer, [10000, 100000]),
        ("hausdorff (cKDTree, workers=-1)", hausdorff_tree, [10000, 100000]),
        ("hausdorff (directed_hausdorff)", hausdorff_scipy, [10000, 100000]),
    ]:
        for n in sizes:
            x, y = blobs(n)
            t, v = best_of(f, x, y, repeat=1 if n >= 10000 and "cdist" in name else 3)
            rows.append((name, n, t, v))
    print("| peer | n = m | seconds | value |")
    print("|---|---|---|---|")
    for name, n, t, v in rows:
        print(f"| {name} | {n} | {t:.3f} | {v:.6g} |")


if __name__ == "__main__":
    main()
