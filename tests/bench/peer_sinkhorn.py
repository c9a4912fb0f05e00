#!/usr/bin/python3
"""Peer for bench_sinkhorn: a straightforward dense log-domain Sinkhorn in NumPy/SciPy.

Same problem class as the C++ benchmark: n points uniform on the unit square for each cloud
(NumPy's generator, seeded), uniform weights, cost |x - y|^2, the same epsilon, and the same
stopping rule (L1 error of the row marginals <= tolerance, columns exact after each
iteration). No epsilon-scaling, no over-relaxation: the textbook iteration
    f = -eps * logsumexp((g - C) / eps + log b, axis=1)
    g = -eps * logsumexp((f - C) / eps + log a, axis=0)
on a precomputed dense C. NumPy runs these element-wise passes on one core.

Prints one JSON object per run: iterations, total seconds, seconds per iteration (median of
the timed iterations), value <a,f> + <b,g>, final marginal error.

    /usr/bin/python3 tests/bench/peer_sinkhorn.py --n 4000 --eps 0.01 --tol 1e-6
    /usr/bin/python3 tests/bench/peer_sinkhorn.py --n 4000 --eps 0.001 --iterations 20
"""
import argparse
import json
import time

import numpy as np
from scipy.special import logsumexp


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--n", type=int, default=4000)
    ap.add_argument("--eps", type=float, default=0.01)
    ap.add_argument("--tol", type=float, default=1e-6)
    ap.add_argument("--max-iterations", type=int, default=100000)
    ap.add_argument("--iterations", type=int, default=0,
                    help="run exactly this many iterations (per-iteration timing only)")
    ap.add_argument("--seed", type=int, default=1)
    args = ap.parse_args()

    rng = np.random.default_rng(args.seed)
    x, y = rng.random((args.n, 2)), rng.random((args.n, 2))
    a = np.full(args.n, 1.0 / args.n)
    b = np.full(args.n, 1.0 / args.n)
    eps = args.eps

    start = time.perf_counter()
    C = ((x[:, None, :] - y[None, :, :]) ** 2).sum(-1)
    la, lb = np.log(a), np.log(b)
    f, g = np.zeros(args.n), np.zeros(args.n)
    per_iteration = []
    error = np.inf
    iterations = 0
    budget = args.iterations if args.iterations else args.max_iterations
    while iterations < budget:
        t0 = time.perf_counter()
        # Row sums with the current (f, g) measure the row marginals (as the C++ solver does),
        # and the same pass gives the f update.
        lse_rows = logsumexp((g[None, :] - C) / eps + lb[None, :], axis=1)
        error = np.abs(a * np.exp(f / eps + lse_rows) - a).sum()
        if not args.iterations and error <= args.tol:
            break
        f = -eps * lse_rows
        g = -eps * logsumexp((f[:, None] - C) / eps + la[:, None], axis=0)
        iterations += 1
        per_iteration.append(time.perf_counter() - t0)
    total = time.perf_counter() - start
    print(json.dumps({
        "n": args.n, "eps": eps, "tol": args.tol, "iterations": iterations,
        "converged": bool(error <= args.tol), "seconds_total": total,
        "seconds_per_iteration": float(np.median(per_iteration)) if per_iteration else None,
        "value": float(a @ f + b @ g), "marginal_error": float(error),
    }))


if __name__ == "__main__":
    main()
