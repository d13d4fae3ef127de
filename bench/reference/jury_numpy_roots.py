"""Reference for the Jury benchmark: stability by numpy.roots for each polynomial.

Reads a JSON list of polynomials (highest power first) from the file named on the command
line and prints one JSON line: timing and verdicts (1 = every root strictly inside the unit
circle, -1 otherwise).
"""
import json
import sys
import time

import numpy as np


def main():
    polys = json.load(open(sys.argv[1]))
    arrays = [np.array(p, dtype=float) for p in polys]
    # Best of three trials, as the yieldloop side reports its best trial.
    seconds = float("inf")
    for _ in range(3):
        t0 = time.perf_counter()
        verdicts = [1 if np.max(np.abs(np.roots(a))) < 1 else -1 for a in arrays]
        seconds = min(seconds, time.perf_counter() - t0)
    print(json.dumps({"bench": "jury-verdicts", "impl": "numpy.roots", "numpy": np.__version__, "polynomials": len(polys),
                      "seconds": seconds, "verdictsPerSecond": len(polys) / seconds, "verdicts": verdicts}))


if __name__ == "__main__":
    main()
