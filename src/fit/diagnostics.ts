/** Residual diagnostics for a fit. */
export interface ResidualDiagnostics {
  /** Lag-1 autocorrelation of the residuals in year order (gaps skipped), or null with < 3. */
  readonly lag1Autocorrelation: number | null;
  /** Wald–Wolfowitz runs test of the residual signs. */
  readonly runs: {
    readonly runs: number;
    readonly expected: number;
    readonly z: number;
    readonly pValue: number;
  } | null;
}

/**
 * Lag-1 autocorrelation r1 = Σ(e_t − ē)(e_(t+1) − ē) / Σ(e_t − ē)², and the runs test
 *   R = number of sign runs,  E = 2n₊n₋/n + 1,  Var = 2n₊n₋(2n₊n₋ − n)/(n²(n − 1)),
 *   z = (R − E)/√Var, two-sided p from the normal distribution.
 * Too few runs (z ≪ 0) means residuals that trend: the model misses a pattern.
 * Sources: Box, G. E. P. & Jenkins, G. M. (1976). Time Series Analysis, rev. ed. Holden-Day
 * (autocorrelation); Wald, A. & Wolfowitz, J. (1940). On a test whether two samples are from
 * the same population. Ann. Math. Stat. 11: 147–162.
 */
export function residualDiagnostics(residuals: readonly (number | null)[]): ResidualDiagnostics {
  const e = residuals.filter((v): v is number => v !== null);
  const n = e.length;
  let lag1: number | null = null;
  if (n >= 3) {
    const mean = e.reduce((a, b) => a + b, 0) / n;
    let num = 0;
    let den = 0;
    for (let i = 0; i < n; i++) {
      den += (e[i]! - mean) ** 2;
      if (i + 1 < n) num += (e[i]! - mean) * (e[i + 1]! - mean);
    }
    lag1 = den > 0 ? num / den : 0;
  }
  const signs = e.filter((v) => v !== 0).map((v) => v > 0);
  const np = signs.filter((s) => s).length;
  const nm = signs.length - np;
  let runs: ResidualDiagnostics["runs"] = null;
  if (np > 0 && nm > 0 && signs.length >= 3) {
    let r = 1;
    for (let i = 1; i < signs.length; i++) if (signs[i] !== signs[i - 1]) r++;
    const m = signs.length;
    const expected = (2 * np * nm) / m + 1;
    const variance = (2 * np * nm * (2 * np * nm - m)) / (m * m * (m - 1));
    const z = variance > 0 ? (r - expected) / Math.sqrt(variance) : 0;
    runs = { runs: r, expected, z, pValue: 2 * (1 - normalCdf(Math.abs(z))) };
  }
  return { lag1Autocorrelation: lag1, runs };
}

/**
 * Standard normal CDF Φ(z) = ½·erfc(−z/√2), erfc by the Chebyshev-fitted approximation
 * `erfcc` of Press, W. H. et al. (1992). Numerical Recipes in C, 2nd ed., §6.2 (from memory):
 * fractional error below 1.2e-7 everywhere.
 */
export function normalCdf(z: number): number {
  const x = Math.abs(z) / Math.SQRT2;
  const t = 1 / (1 + 0.5 * x);
  const y =
    t *
    Math.exp(
      -x * x -
        1.26551223 +
        t *
          (1.00002368 +
            t *
              (0.37409196 +
                t *
                  (0.09678418 +
                    t *
                      (-0.18628806 +
                        t *
                          (0.27886807 +
                            t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))))),
    );
  return z >= 0 ? 1 - 0.5 * y : 0.5 * y;
}
