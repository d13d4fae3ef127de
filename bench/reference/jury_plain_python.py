"""Reference for the Jury benchmark: a plain-Python Jury table (Ogata's arrangement).

P(z) = a0 z^n + ... + an with a0 > 0 is stable iff |an| < a0, P(1) > 0, (-1)^n P(-1) > 0 and
each reduced row R'[i] = R0*R[i] - R[m-i]*Rm satisfies |R'[0]| > |R'[m-1]| down to three
entries (Jury 1964; Ogata 1995, Discrete-Time Control Systems, 2nd ed., section 4-3).
Reads polynomials from the JSON file named on the command line; prints one JSON line.
"""
import json
import sys
import time


def jury(a):
    if a[0] < 0:
        a = [-v for v in a]
    n = len(a) - 1
    if not abs(a[n]) < a[0]:
        return -1
    p1 = sum(a)
    pm1 = sum(v if (n - i) % 2 == 0 else -v for i, v in enumerate(a))
    if not p1 > 0 or not ((-1) ** n) * pm1 > 0:
        return -1
    row = a[::-1]
    while len(row) > 3:
        m = len(row) - 1
        r0, rm = row[0], row[m]
        row = [r0 * row[i] - row[m - i] * rm for i in range(m)]
        if not abs(row[0]) > abs(row[-1]):
            return -1
    return 1


def main():
    polys = json.load(open(sys.argv[1]))
    # Best of five trials, as the yieldloop side reports its best trial.
    seconds = float("inf")
    for _ in range(5):
        t0 = time.perf_counter()
        verdicts = [jury(p) for p in polys]
        seconds = min(seconds, time.perf_counter() - t0)
    print(json.dumps({"bench": "jury-verdicts", "impl": "plain-python-jury", "polynomials": len(polys),
                      "seconds": seconds, "verdictsPerSecond": len(polys) / seconds, "verdicts": verdicts}))


if __name__ == "__main__":
    main()
