import { describe, expect, it } from "vitest";
import { parseModel } from "../../src/models/model-spec.js";
import { projectThroughCatches } from "../../src/sim/project-through-catches.js";
import { seededUniform, standardNormal } from "../../src/sim/rng.js";
import { fitProblem, optimiseFit } from "../../src/fit/fit-model.js";
import { profileInterval } from "../../src/fit/profile-likelihood.js";
import type { Series } from "../../src/fit/series.js";
import { unwrap } from "../helpers.js";

// Recovery and coverage: series simulated from known parameters (seeded) with lognormal
// observation error sd 0.15, 40 years, harvest rate rising 5% → 60% (contrast). The 95%
// profile intervals must contain the true r and K at close to the nominal rate.
// Tolerance: with 40 simulated series per family, the count of covering intervals is
// Binomial(40, 0.95) if the method is right: mean 38, sd 1.38. We accept ≥ 34 (below that has
// probability < 0.5% under the right method), while intervals with a true coverage of 80%
// would pass with probability < 2% (P(Binomial(40, 0.8) ≥ 34) ≈ 0.016).

function simulate(family: string, params: Record<string, number>, seed: number): Series {
  const u = seededUniform(seed);
  const model = unwrap(parseModel({ family, params }));
  const years = 40;
  const catches: number[] = [];
  let n = 0.8 * params.K!;
  const abundance: number[] = [];
  for (let t = 0; t < years; t++) {
    abundance.push(n);
    const c = (0.05 + (0.55 * t) / (years - 1)) * n;
    catches.push(c);
    n = projectThroughCatches(model, "after", n, [c, 0], [0, 0])!.abundance[1]!;
  }
  return {
    years: abundance.map((_, i) => i),
    count: abundance.map((a) => 0.01 * a * Math.exp(0.15 * standardNormal(u))),
    catch: catches,
    stocking: abundance.map(() => 0),
    cv: abundance.map(() => null),
    indices: {},
    warnings: [],
  };
}

const TRIALS = 40;
for (const [family, truth] of [
  ["ricker", { r: 0.8, K: 5000 }],
  ["beverton-holt", { R0: 2.5, K: 5000 }],
  ["gompertz", { r: 0.5, K: 5000 }],
] as const) {
  describe(`recovery of ${family} ${JSON.stringify(truth)}`, () => {
    it(`95% profile intervals cover the true values in ≥ 34 of ${TRIALS} seeded series`, () => {
      const names = Object.keys(truth) as (keyof typeof truth)[];
      const covered: Record<string, number> = {};
      const unbounded: Record<string, number> = {};
      for (const n of names) {
        covered[n] = 0;
        unbounded[n] = 0;
      }
      for (let s = 0; s < TRIALS; s++) {
        const series = simulate(family, truth, 1000 + s);
        const p = unwrap(fitProblem(series, { family }));
        const o = optimiseFit(p, s + 1);
        for (const name of names) {
          const ci = profileInterval(p, o.x, name)!;
          const v = (truth as Record<string, number>)[name]!;
          if ((ci.lower === null || ci.lower <= v) && (ci.upper === null || v <= ci.upper)) covered[name]!++;
          if (ci.lowerOpen && ci.upperOpen) unbounded[name]!++;
        }
      }
      for (const name of names) {
        expect(covered[name], `${name}: ${covered[name]} of ${TRIALS}`).toBeGreaterThanOrEqual(34);
        // An interval open at both ends covers trivially; most must be bounded for the
        // coverage to mean anything.
        expect(unbounded[name], `${name}: ${unbounded[name]} of ${TRIALS} unbounded`).toBeLessThanOrEqual(
          TRIALS / 4,
        );
      }
    }, 120_000);
  });
}
