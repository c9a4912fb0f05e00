#!/usr/bin/python3
"""Peer timings for bench_uncertainty: the same resampling loops written the usual way with
NumPy/SciPy (Debian python3-numpy, python3-scipy), on the same kind of data (seeded Gaussian
blobs N(0, I), B shifted by 0.5 in x, equal weights).

  spread:  200 bootstrap resamples of both 500-point clouds; per resample every fast measure
           the peer can compute the textbook way:
             w1, w2      scipy.optimize.linear_sum_assignment on the n x n cost matrix (with equal
                         masses an optimal plan is a permutation, Birkhoff–von Neumann)
             sliced      50 fixed directions, sorted projections
             mmd         V-statistic, sigma fixed once on the original pair (median distance)
             energy      V-statistics from cdist
             frechet     Gaussian fit + scipy.linalg.sqrtm
             chamfer, hausdorff   scipy.spatial.cKDTree
             kl_ab, kl_ba, js, tv, hellinger   numpy.histogram2d on a grid fixed once
  permute: 999 permutations of exact W1 at 300 + 300 (linear_sum_assignment per permutation).

Single process (NumPy's BLAS may use both cores inside cdist-free parts; the loops are serial).
Run: /usr/bin/python3 tests/bench/peer_uncertainty.py   (prints a Markdown table)
"""
import time

import numpy as np
from scipy.linalg import sqrtm
from scipy.optimize import linear_sum_assignment
from scipy.spatial import cKDTree
from scipy.spatial.distance import cdist


def blobs(n, seed_a, seed_b):
    a = np.random.default_rng(seed_a).standard_normal((n, 2))
    b = np.random.default_rng(seed_b).standard_normal((n, 2))
    b[:, 0] += 0.5
    return a, b


def w_p(x, y, p):
    c = cdist(x, y) ** p
    i, j = linear_sum_assignment(c)
    return c[i, j].mean() ** (1.0 / p)


ANGLES = np.pi * np.arange(50) / 50
DIRS = np.stack([np.cos(ANGLES), np.sin(ANGLES)], axis=1)


def sliced(x, y):
    px = np.sort(x @ DIRS.T, axis=0)
    py = np.sort(y @ DIRS.T, axis=0)
    return np.sqrt(((px - py) ** 2).mean())


def mmd(x, y, sigma):
    g = 1.0 / (2 * sigma * sigma)
    k = lambda u, v: np.exp(-g * cdist(u, v, "sqeuclidean")).mean()
    return np.sqrt(max(k(x, x) + k(y, y) - 2 * k(x, y), 0.0))


def energy(x, y):
    return np.sqrt(max(2 * cdist(x, y).mean() - cdist(x, x).mean() - cdist(y, y).mean(), 0.0))


def frechet(x, y):
    ca, cb = np.cov(x.T, bias=True), np.cov(y.T, bias=True)
    ra = np.real(sqrtm(ca))
    t = np.trace(ca + cb - 2 * np.real(sqrtm(ra @ cb @ ra)))
    return np.sqrt(max(((x.mean(0) - y.mean(0)) ** 2).sum() + t, 0.0))


def chamfer_hausdorff(x, y):
    dx, _ = cKDTree(y).query(x)
    dy, _ = cKDTree(x).query(y)
    return dx.mean() + dy.mean(), max(dx.max(), dy.max())


def densities(x, y, edges):
    p, _, _ = np.histogram2d(x[:, 0], x[:, 1], bins=edges)
    q, _, _ = np.histogram2d(y[:, 0], y[:, 1], bins=edges)
    p, q = p.ravel() / p.sum(), q.ravel() / q.sum()
    with np.errstate(divide="ignore", invalid="ignore"):
        kl = lambda u, v: np.inf if np.any((u > 0) & (v == 0)) else np.sum(u[u > 0] * np.log(u[u > 0] / v[u > 0]))
        m = 0.5 * (p + q)
        return kl(p, q), kl(q, p), 0.5 * kl(p, m) + 0.5 * kl(q, m), 0.5 * np.abs(p - q).sum(), \
            np.sqrt(0.5 * ((np.sqrt(p) - np.sqrt(q)) ** 2).sum())


def spread_loop(a, b, resamples=200):
    rng = np.random.default_rng(7)
    pooled = np.vstack([a, b])
    sigma = np.median(cdist(pooled, pooled)[np.triu_indices(len(pooled), 1)])  # frozen once
    lo, hi = pooled.min(0), pooled.max(0)
    edges = [np.linspace(lo[0], hi[0], 21), np.linspace(lo[1], hi[1], 21)]       # frozen once
    times = {}
    t_all = time.perf_counter()
    for _ in range(resamples):
        x = a[rng.integers(0, len(a), len(a))]
        y = b[rng.integers(0, len(b), len(b))]
        for name, f in [("w1", lambda: w_p(x, y, 1)), ("w2", lambda: w_p(x, y, 2)), ("sliced", lambda: sliced(x, y)),
                        ("mmd", lambda: mmd(x, y, sigma)), ("energy", lambda: energy(x, y)),
                        ("frechet", lambda: frechet(x, y)), ("chamfer+hausdorff", lambda: chamfer_hausdorff(x, y)),
                        ("5 histogram divergences", lambda: densities(x, y, edges))]:
            t = time.perf_counter()
            f()
            times[name] = times.get(name, 0.0) + time.perf_counter() - t
    return time.perf_counter() - t_all, times


def permute_loop(a, b, permutations=999):
    rng = np.random.default_rng(8)
    pooled = np.vstack([a, b])
    n = len(a)
    obs = w_p(a, b, 1)
    t = time.perf_counter()
    count = 0
    for _ in range(permutations):
        idx = rng.permutation(len(pooled))
        count += w_p(pooled[idx[:n]], pooled[idx[n:]], 1) >= obs
    return time.perf_counter() - t, (1 + count) / (1 + permutations)


def main():
    a, b = blobs(500, 1, 2)
    total, parts = spread_loop(a, b)
    print("| peer (NumPy/SciPy) | wall |")
    print("|---|---|")
    print(f"| spread: 200 resamples, 13 fast measures, 500 + 500 | {total:.2f} s |")
    for k, v in parts.items():
        print(f"|   of which {k} | {v:.2f} s |")
    a, b = blobs(300, 3, 4)
    t, p = permute_loop(a, b)
    print(f"| permute: 999 permutations of W1, 300 + 300 (p = {p:.3f}) | {t:.2f} s |")


if __name__ == "__main__":
    main()
