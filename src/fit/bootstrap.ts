import { seededUniform, standardNormal, type Uniform } from "../sim/rng.js";
import { fitProblem } from "./fit-model.js";
import { cvWeights } from "./likelihood.js";
import { minimise } from "./minimise.js";
import type { Series } from "./series.js";
import type { SeriesFit } from "./fit-series.js";

export interface Bootstrap {
  /** Parameter draws on the natural scale, one object per successful refit. */
  readonly draws: Record<string, number>[];
  readonly failed: number;
  readonly seed: number;
}

/**
 * Seeded parametric bootstrap of a fit: `count` new series drawn from the fitted model's
 * predictions with its observation error, each refitted from the estimate, giving parameter
 * draws the projection module can use.
 *   lognormal: y* = μ·exp(σ/√w·z);  normal: y* = μ + σ/√w·z;  poisson: y* ~ Poisson(μ);
 *   negative binomial: y* ~ Poisson(μ·G), G ~ Gamma(k, 1/k)
 * Sources: Efron, B. & Tibshirani, R. J. (1993). An Introduction to the Bootstrap. Chapman &
 * Hall, ch. 6; Poisson by inversion (μ < 30) or the normal approximation rounded (μ ≥ 30;
 * common practice); Gamma by Marsaglia, G. & Tsang, W. W. (2000). ACM Trans. Math. Softw.
 * 26: 363–372.
 */
export function parametricBootstrap(
  series: Series,
  fit: SeriesFit,
  optimum: readonly number[],
  count: number,
  seed: number,
): Bootstrap {
  const u = seededUniform(seed);
  const draws: Record<string, number>[] = [];
  let failed = 0;
  const w = cvWeights(fit.likelihood, series.cv);
  for (let b = 0; b < count; b++) {
    const count2 = series.count.map((y, t) => {
      const mu = fit.fitted[t];
      if (y === null || mu === null || mu === undefined) return null;
      return draw(fit, mu, w[t]!, u);
    });
    const synthetic: Series = { ...series, count: count2 };
    const p = fitProblem(synthetic, {
      family: fit.family,
      delay: fit.delay,
      method: fit.method,
      likelihood: fit.likelihood,
      timing: fit.timing,
    });
    if (!p.ok) {
      failed++;
      continue;
    }
    const r = minimise(p.value.objective, optimum, { quick: true });
    if (!Number.isFinite(r.value)) {
      failed++;
      continue;
    }
    const v = p.value.natural(r.x);
    const d: Record<string, number> = {};
    p.value.names.forEach((n, i) => (d[n] = v[i]!));
    if ("A" in d) d.A = d.A! * d.K!;
    draws.push(d);
  }
  return { draws, failed, seed };
}

function draw(fit: SeriesFit, mu: number, w: number, u: Uniform): number {
  const s = (fit.sigma ?? 0) / Math.sqrt(w);
  switch (fit.likelihood) {
    case "lognormal":
      return mu * Math.exp(s * standardNormal(u));
    case "normal":
      return Math.max(mu + s * standardNormal(u), 1e-9 * mu);
    case "poisson":
      return poisson(mu, u);
    case "negative-binomial": {
      const k = fit.estimates.k ?? 10;
      return poisson((mu * gamma(k, u)) / k, u);
    }
  }
}

function poisson(mu: number, u: Uniform): number {
  if (mu >= 30) return Math.max(0, Math.round(mu + Math.sqrt(mu) * standardNormal(u)));
  const L = Math.exp(-mu);
  let k = 0;
  let p = u();
  while (p > L) {
    k++;
    p *= u();
  }
  return k;
}

function gamma(shape: number, u: Uniform): number {
  if (shape < 1) return gamma(shape + 1, u) * Math.pow(u() || 1e-300, 1 / shape);
  const d = shape - 1 / 3;
  const c = 1 / Math.sqrt(9 * d);
  for (;;) {
    const x = standardNormal(u);
    const v = (1 + c * x) ** 3;
    if (v <= 0) continue;
    const uu = u();
    if (Math.log(uu || 1e-300) < 0.5 * x * x + d - d * v + d * Math.log(v)) return d * v;
  }
}
