"""scipy reference for the fit benchmark (bench/fit.bench.ts).

Observation-error Ricker fit with catches taken after reproduction:
  N[t+1] = N[t] exp(r (1 - N[t]/K)) - min(C[t], production),  index y[t] ~ lognormal(q N[t])
4 parameters (r, K, N0, q), minimising the sum of squared log residuals with
scipy.optimize.least_squares (trust-region reflective) from the same start values yieldloop
uses. Reads the series from the JSON file named on the command line; prints one JSON line
(best of `trials` timings).
"""
import json
import math
import sys
import time

import numpy as np
import scipy
from scipy.optimize import least_squares


def main():
    data = json.load(open(sys.argv[1]))
    trials = int(sys.argv[2]) if len(sys.argv) > 2 else 5
    y = np.array(data["count"], dtype=float)
    catch = np.array(data["catch"], dtype=float)
    start = data["start"]  # r, K, N0, q

    def residuals(p):
        r, K, n0, q = p
        n = n0
        out = np.empty(len(y))
        for t in range(len(y)):
            out[t] = n
            prod = n * math.exp(r * (1 - n / K)) if n > 0 else 0.0
            n = prod - min(catch[t], prod)
        return np.log(y) - np.log(np.maximum(q * out, 1e-300))

    best = math.inf
    fit = None
    for _ in range(trials):
        t0 = time.perf_counter()
        fit = least_squares(residuals, x0=start, x_scale=np.abs(start), method="trf", xtol=1e-12, ftol=1e-12, gtol=1e-12, max_nfev=20000)
        best = min(best, time.perf_counter() - t0)
    sse = float(np.sum(fit.fun ** 2))
    print(json.dumps({"bench": "ricker-fit", "impl": "scipy.optimize.least_squares", "scipy": scipy.__version__, "seconds": best,
                      "trials": trials, "sse": sse, "params": [float(v) for v in fit.x], "nfev": int(fit.nfev)}))


if __name__ == "__main__":
    main()
