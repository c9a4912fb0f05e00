#!/usr/bin/python3
"""Peer for bench_critic: the same gradient-penalty critic loop in PyTorch on the CPU.

2-64-64-1 ReLU network in float64 (as Barrow's), two clouds of 2000 points N(0, I) and
N((1.5, 0), I) (NumPy's generator, seeded), uniform weights, batch 256 drawn from each cloud
with replacement per step, interpolates x_hat = e x + (1 - e) y with e ~ U[0,1], loss
-(mean f(x) - mean f(y)) + 10 * mean((|grad f(x_hat)| - 1)^2) with create_graph=True, Adam
(lr 1e-4, betas (0, 0.9)). Gulrajani et al. 2017, Alg. 1 (tests/REFERENCES.md, Critic C3).

Prints one JSON object: steps, threads, wall seconds, CPU seconds (process time), the final
full-data estimate. `--threads 1` matches Barrow's single-threaded loop; `--float32` runs
torch's default precision.

    /usr/bin/python3 tests/bench/peer_critic.py --steps 1000 --threads 1
"""
import argparse
import json
import time

import numpy as np
import torch


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--steps", type=int, default=1000)
    ap.add_argument("--batch", type=int, default=256)
    ap.add_argument("--n", type=int, default=2000)
    ap.add_argument("--threads", type=int, default=1)
    ap.add_argument("--float32", action="store_true")
    ap.add_argument("--seed", type=int, default=1)
    args = ap.parse_args()

    torch.set_num_threads(args.threads)
    dtype = torch.float32 if args.float32 else torch.float64
    torch.manual_seed(args.seed)
    rng = np.random.default_rng(args.seed)
    x = torch.tensor(rng.standard_normal((args.n, 2)), dtype=dtype)
    y = torch.tensor(rng.standard_normal((args.n, 2)) + np.array([1.5, 0.0]), dtype=dtype)

    net = torch.nn.Sequential(torch.nn.Linear(2, 64), torch.nn.ReLU(), torch.nn.Linear(64, 64), torch.nn.ReLU(),
                              torch.nn.Linear(64, 1)).to(dtype)
    opt = torch.optim.Adam(net.parameters(), lr=1e-4, betas=(0.0, 0.9))
    m = args.batch

    wall0, cpu0 = time.perf_counter(), time.process_time()
    for _ in range(args.steps):
        xb = x[torch.randint(0, args.n, (m,))]
        yb = y[torch.randint(0, args.n, (m,))]
        e = torch.rand(m, 1, dtype=dtype)
        xh = (e * xb + (1 - e) * yb).requires_grad_(True)
        fh = net(xh)
        g = torch.autograd.grad(fh.sum(), xh, create_graph=True)[0]
        loss = -(net(xb).mean() - net(yb).mean()) + 10.0 * ((g.norm(dim=1) - 1) ** 2).mean()
        opt.zero_grad(set_to_none=True)
        loss.backward()
        opt.step()
    wall, cpu = time.perf_counter() - wall0, time.process_time() - cpu0
    with torch.no_grad():
        estimate = float(net(x).mean() - net(y).mean())
    print(json.dumps({"steps": args.steps, "batch": m, "threads": args.threads, "dtype": str(dtype),
                      "wall_seconds": wall, "cpu_seconds": cpu, "estimate": estimate}))


if __name__ == "__main__":
    main()
