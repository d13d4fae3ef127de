"""numpy reference for the regime-map benchmark (bench/regime-map.bench.ts).

Ricker N' = N·exp(r(1 − N/K)) with a constant harvest rate h taken after reproduction
(catch = min(h·N, production)), a 400 × 400 grid of r × h, 1,000 burn-in years and 128
classified years per cell, vectorised over all cells with in-place operations. Each cell is
classified as yieldloop's longRun does: extinct, equilibrium, cycle of period k ≤ 64, else
the largest Lyapunov exponent (two-trajectory method) decides irregular vs not.
Prints one JSON line (the best of `trials` runs, default 3).
Usage: python3 regime_map_numpy.py [nx ny burn observe [trials]]
"""
import json
import sys
import time

import numpy as np


def main():
    nx, ny, burn, observe = (int(a) for a in (sys.argv[1:5] if len(sys.argv) >= 5 else (400, 400, 1000, 128)))
    trials = int(sys.argv[5]) if len(sys.argv) >= 6 else 3
    best = None
    for _ in range(trials):
        result = run(nx, ny, burn, observe)
        if best is None or result["seconds"] < best["seconds"]:
            best = result
    best["trials"] = trials
    print(json.dumps(best))


def run(nx, ny, burn, observe):
    K = 1000.0
    r = np.linspace(0.05, 4.0, nx)
    h = np.linspace(0.0, 0.95, ny)
    R, H = np.meshgrid(r, h)  # row j = h[j], column i = r[i]
    R = R.ravel().copy()
    H = H.ravel().copy()
    t0 = time.perf_counter()
    n = np.full(R.shape, 500.0)
    p = np.empty_like(n)
    c = np.empty_like(n)

    def step(x):
        # p = x·exp(r(1 − x/K)); x = p − min(h·x, p)
        np.multiply(x, -1.0 / K, out=p)
        np.add(p, 1.0, out=p)
        np.multiply(p, R, out=p)
        np.exp(p, out=p)
        np.multiply(p, x, out=p)
        np.multiply(H, x, out=c)
        np.minimum(c, p, out=c)
        np.subtract(p, c, out=x)

    for _ in range(burn):
        step(n)
    after = n.copy()
    obs = np.empty((observe, n.size))
    for t in range(observe):
        obs[t] = n
        step(n)
    top = obs.max(axis=0)
    eq = 1e-7 * np.maximum(K, top)
    regime = np.full(n.size, -1, dtype=np.int8)  # 0 extinct 1 equilibrium 2 cycle 4 irregular 5 other
    period = np.zeros(n.size, dtype=np.int8)
    regime[top <= 1e-9 * K] = 0
    for k in range(1, 65):
        undecided = regime < 0
        if not undecided.any():
            break
        same = (np.abs(obs[k:, undecided] - obs[:-k, undecided]) <= eq[undecided]).all(axis=0)
        idx = np.flatnonzero(undecided)[same]
        regime[idx] = 1 if k == 1 else 2
        period[idx] = 0 if k == 1 else k
    undecided = np.flatnonzero(regime < 0)
    if undecided.size:
        x = after[undecided].copy()
        scale = np.maximum(K, top[undecided])
        eps = 1e-8 * scale
        y = x + eps
        Rs, Hs = R[undecided], H[undecided]
        acc = np.zeros(x.size)
        for _ in range(observe):
            px = x * np.exp(Rs * (1 - x / K))
            x = px - np.minimum(Hs * x, px)
            py = y * np.exp(Rs * (1 - y / K))
            y = py - np.minimum(Hs * y, py)
            d = np.abs(y - x)
            bad = ~(d > 0)
            acc += np.where(bad, np.log(1e-16), np.log(np.where(bad, 1.0, d) / eps))
            y = np.where(bad, x + eps, x + (y - x) * (eps / np.where(bad, 1.0, d)))
        lyap = acc / observe
        regime[undecided] = np.where(lyap > 0.005, 4, 5)
    seconds = time.perf_counter() - t0
    counts = {str(k): int((regime == k).sum()) for k in (0, 1, 2, 4, 5)}
    return {"bench": "regime-map", "impl": "numpy", "numpy": np.__version__, "cells": int(n.size),
            "steps": int(n.size * (burn + observe)), "seconds": seconds, "regimeCounts": counts}


if __name__ == "__main__":
    main()
