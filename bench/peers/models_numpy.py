"""numpy peers for the model workloads D4-D7 (bench/README.md), written the way a researcher
vectorises each model: every visit or update is whole-array numpy over the patterns (or the
couplings), the visiting loop itself is Python where the dynamics are sequential. A measuring
instrument for bench/run.ts, not part of the product; its own random stream (PCG64), so its
outputs agree with the engine's statistically, not bit for bit.

usage: python3 models_numpy.py D4|D5|D6|D7 [--seed S]     prints one JSON line
"""
import argparse
import json
import time

import numpy as np

WORKLOADS = {
    # name: (N, P, trials, flipped bits, max sweeps)
    'D4': (400, 2000, 50, 40, 50),     # dense polynomial memory, F(x) = x^3, asynchronous
    'D5': (200, 2000, 50, 20, 50),     # dense exponential memory, asynchronous
    'D6': (400, 2000, 50, 40, 50),     # modern softmax network, beta = 32
    'D7': (20000, 5, 20, 2000, 50),    # fixed in-degree K = 50, Hebbian, asynchronous
}
DEGREE = 3
BETA = 32.0
IN_DEGREE = 50
TOLERANCE = 1e-9


def cue(rng, pattern, flips):
    s = pattern.copy()
    s[rng.choice(pattern.size, flips, replace=False)] *= -1
    return s


def dense_memory(rng, n, p, trials, flips, max_sweeps, exponential):
    xi = rng.choice(np.array([-1, 1], dtype=np.int64), size=(p, n))
    rows = np.ascontiguousarray(xi.T)
    t0 = time.perf_counter()
    overlaps, sweeps = [], []
    for t in range(trials):
        target = t % p
        s = cue(rng, xi[target], flips)
        m = xi @ s
        for sweep in range(1, max_sweeps + 1):
            changed = False
            for i in rng.permutation(n):
                x = rows[i]
                r = m - x * s[i]
                if exponential:
                    h = x @ np.exp(r - r.max())
                else:
                    h = x @ ((r + 1) ** DEGREE - (r - 1) ** DEGREE)
                v = 1 if h > 0 else (-1 if h < 0 else s[i])
                if v != s[i]:
                    m += (v - s[i]) * x
                    s[i] = v
                    changed = True
            if not changed:
                break
        overlaps.append(xi[target] @ s / n)
        sweeps.append(sweep)
    return overlaps, sweeps, time.perf_counter() - t0


def softmax(rng, n, p, trials, flips, max_sweeps):
    xi = rng.choice(np.array([-1.0, 1.0]), size=(p, n))
    x = xi / np.sqrt(n)
    t0 = time.perf_counter()
    overlaps, sweeps = [], []
    for t in range(trials):
        target = t % p
        state = cue(rng, xi[target], flips) / np.sqrt(n)
        for sweep in range(1, max_sweeps + 1):
            a = BETA * (x @ state)
            w = np.exp(a - a.max())
            new = x.T @ (w / w.sum())
            moved = np.linalg.norm(new - state)
            state = new
            if moved < TOLERANCE:
                break
        overlaps.append(x[target] @ state)
        sweeps.append(sweep)
    return overlaps, sweeps, time.perf_counter() - t0


def in_degree(rng, n, p, trials, flips, max_sweeps):
    xi = rng.choice(np.array([-1, 1], dtype=np.int64), size=(p, n))
    # K distinct inputs per neuron, never itself: draw from the other N - 1 and skip i.
    inputs = np.empty((n, IN_DEGREE), dtype=np.int64)
    for i in range(n):
        picked = rng.choice(n - 1, IN_DEGREE, replace=False)
        inputs[i] = picked + (picked >= i)
    weights = np.einsum('mi,mik->ik', xi, xi[:, inputs])
    order = np.argsort(inputs.ravel(), kind='stable')
    targets = np.repeat(np.arange(n), IN_DEGREE)[order]
    target_weights = weights.ravel()[order]
    starts = np.concatenate(([0], np.cumsum(np.bincount(inputs.ravel(), minlength=n))))
    t0 = time.perf_counter()
    overlaps, sweeps = [], []
    for t in range(trials):
        target = t % p
        s = cue(rng, xi[target], flips)
        h = (weights * s[inputs]).sum(axis=1)
        for sweep in range(1, max_sweeps + 1):
            changed = False
            for j in rng.permutation(n):
                v = 1 if h[j] > 0 else (-1 if h[j] < 0 else s[j])
                if v != s[j]:
                    a, b = starts[j], starts[j + 1]
                    h[targets[a:b]] += (v - s[j]) * target_weights[a:b]
                    s[j] = v
                    changed = True
            if not changed:
                break
        overlaps.append(xi[target] @ s / n)
        sweeps.append(sweep)
    return overlaps, sweeps, time.perf_counter() - t0


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument('workload', choices=sorted(WORKLOADS))
    parser.add_argument('--seed', type=int, default=1)
    args = parser.parse_args()
    n, p, trials, flips, max_sweeps = WORKLOADS[args.workload]
    rng = np.random.default_rng(args.seed)
    if args.workload in ('D4', 'D5'):
        overlaps, sweeps, sim = dense_memory(rng, n, p, trials, flips, max_sweeps, args.workload == 'D5')
    elif args.workload == 'D6':
        overlaps, sweeps, sim = softmax(rng, n, p, trials, flips, max_sweeps)
    else:
        overlaps, sweeps, sim = in_degree(rng, n, p, trials, flips, max_sweeps)
    overlaps = np.array(overlaps)
    print(json.dumps({
        'impl': 'numpy', 'workload': args.workload, 'variant': 'vec', 'seed': args.seed, 'N': n, 'P': p, 'trials': trials,
        'mean_overlap': float(overlaps.mean()), 'sd_overlap': float(overlaps.std(ddof=1)),
        'frac_success': float((overlaps >= 0.95).mean()), 'mean_sweeps': float(np.mean(sweeps)),
        'sim_s': sim, 'trials_per_s': trials / sim,
    }))


if __name__ == '__main__':
    main()
