import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseScenario, type Scenario } from "../../src/sim/scenario.js";
import { parseUncertainty, type UncertaintyInput } from "../../src/sim/uncertainty.js";
import { projectStochastic } from "../../src/sim/stochastic-projection.js";
import { projectLoop } from "../../src/sim/project.js";
import { analyseStability } from "../../src/equilibria/stability.js";
import { expectClose, unwrap } from "../helpers.js";

const fixture = (name: string) =>
  JSON.parse(readFileSync(new URL(`../fixtures/stochastic/${name}`, import.meta.url), "utf8"));

function scenario(spec: Record<string, unknown>): Scenario {
  return unwrap(parseScenario(spec));
}
function run(sc: Scenario, u: Omit<UncertaintyInput, "seed"> & { seed?: number }) {
  return projectStochastic(sc, unwrap(parseUncertainty({ seed: 1, ...u }, sc.model)));
}

describe("stochastic projection without noise equals the deterministic one", () => {
  // Beverton, R. J. H. & Holt, S. J. (1957): N_t = K·N0 / (N0 + (K − N0)·R0^(−t)).
  it("Beverton–Holt closed form, every percentile, every year", () => {
    const R0 = 2.5;
    const K = 800;
    const N0 = 40;
    const sc = scenario({
      model: { family: "beverton-holt", params: { R0, K } },
      rule: { kind: "no-harvest" },
      start: N0,
      horizon: 30,
    });
    const p = run(sc, { replicates: 50 });
    for (let t = 0; t <= 30; t++) {
      const exact = (K * N0) / (N0 + (K - N0) * Math.pow(R0, -t));
      for (let i = 0; i < p.levels.length; i++)
        expectClose(p.abundance[i]![t]! / K, exact / K, 1e-12, `P${p.levels[i]} N_${t}`);
    }
    expect(p.risk.meanCatch).toBe(0);
    expect(p.risk.zeroCatchFraction).toBe(1);
  });

  it("settles on the stable equilibrium that src/equilibria reports (Beverton–Holt, harvest rate 0.3)", () => {
    const sc = scenario({
      model: { family: "beverton-holt", params: { R0: 3, K: 1000 } },
      rule: { kind: "constant-rate", rate: 0.3 },
      start: 100,
      horizon: 200,
    });
    const a = analyseStability(sc.loop);
    const op = a.equilibria[a.operating!]!;
    expect(op.verdict.kind).toBe("stable-monotone");
    const p = run(sc, { replicates: 20 });
    expectClose(p.abundance[3]![200]!, op.equilibrium.abundance, 1e-9, "median N_200");
    // And it is the deterministic projection exactly, year by year.
    const det = projectLoop(sc.loop, sc.start, 200);
    for (let t = 0; t <= 200; t++) expect(p.abundance[0]![t]).toBe(det.abundance[t]);
    for (let t = 0; t < 200; t++) expect(p.catch[6]![t]).toBe(det.catch[t]);
  });
});

describe("pure lognormal noise without density dependence (scipy.stats.lognorm)", () => {
  // tests/fixtures/stochastic/make_stochastic_fixtures.py: ln N_t ~ Normal(μ, s²) with the AR(1)
  // variance of a sum; quantiles and densities from scipy.stats.lognorm.
  const { cases } = fixture("lognormal.json");
  const n = 100_000;
  for (const c of cases) {
    it(`percentiles at t = ${c.t} for σ = ${c.sigma}, ρ = ${c.rho}`, () => {
      // A Ricker with K = 1e12 has g(N) = exp(r(1 − N/K)) = exp(r) to about 1e-7 here.
      const sc = scenario({
        model: { family: "ricker", params: { r: c.r, K: 1e12 } },
        rule: { kind: "no-harvest" },
        start: c.N0,
        horizon: c.t,
      });
      const p = run(sc, { replicates: n, seed: 11, processSd: c.sigma, processAutocorrelation: c.rho });
      c.levels.forEach((level: number, i: number) => {
        const q = c.quantiles[i];
        // Monte Carlo standard error of a sample quantile: √(p(1 − p)/n) / f(q)
        // (Stuart & Ord, Kendall's Advanced Theory of Statistics, §10.10, from memory);
        // 4.5 of them, plus the histogram's 0.3% bin width.
        const se = Math.sqrt(((level / 100) * (1 - level / 100)) / n) / c.densities[i];
        const tol = 4.5 * se + 0.003 * q;
        expect(
          Math.abs(p.abundance[i]![c.t]! - q),
          `P${level}: ${p.abundance[i]![c.t]} vs ${q} ± ${tol}`,
        ).toBeLessThan(tol);
      });
    });
  }
});

describe("risk metrics against an independent numpy Monte Carlo", () => {
  // tests/fixtures/stochastic/ricker_threshold.json: numpy, 200,000 replicates, its own random
  // numbers; each metric agrees within 5 combined standard errors.
  const ref = fixture("ricker_threshold.json");
  const sc = scenario({
    model: { family: "ricker", params: { r: 1.2, K: 1000 } },
    rule: { kind: "threshold", lowerTrigger: 200, upperTrigger: 500, maxRate: 0.3 },
    start: 600,
    horizon: 50,
  });
  const n = 100_000;
  const p = run(sc, { replicates: n, seed: 5, processSd: 0.4 });
  const within = (
    ours: number,
    oursSe: number,
    theirs: { value: number; standardError: number },
    what: string,
  ) => {
    const tol = 5 * Math.hypot(oursSe, theirs.standardError);
    expect(Math.abs(ours - theirs.value), `${what}: ${ours} vs ${theirs.value} ± ${tol}`).toBeLessThan(tol);
  };
  it("probabilities of falling below the limit and of quasi-extinction", () => {
    within(p.risk.belowLimit.probability, p.risk.belowLimit.standardError, ref.belowLimit, "P(below 0.2K)");
    within(
      p.risk.quasiExtinction.probability,
      p.risk.quasiExtinction.standardError,
      ref.quasiExtinction,
      "P(below 0.01K)",
    );
    expect(p.risk.belowLimit.probability).toBeGreaterThan(0.5);
  });
  it("mean catch, average annual variation and zero-catch years", () => {
    // Our standard errors for these are taken as the reference's scaled to our n.
    const scale = Math.sqrt(200_000 / n);
    within(p.risk.meanCatch, ref.meanCatch.standardError * scale, ref.meanCatch, "mean catch");
    within(
      p.risk.averageAnnualVariation!,
      ref.averageAnnualVariation.standardError * scale,
      ref.averageAnnualVariation,
      "AAV",
    );
    within(
      p.risk.zeroCatchFraction,
      ref.zeroCatchFraction.standardError * scale,
      ref.zeroCatchFraction,
      "zero-catch fraction",
    );
  });
  it("median abundance in the early years (before the median stock hits zero)", () => {
    for (let t = 0; t <= 8; t++) {
      const theirs = ref.medianAbundance[t];
      expect(Math.abs(p.abundance[3]![t]! - theirs), `median N_${t}`).toBeLessThan(0.02 * theirs + 1e-9);
    }
  });
  it("binomial standard errors are √(p(1 − p)/n)", () => {
    const b = p.risk.belowLimit;
    expectClose(b.standardError, Math.sqrt((b.probability * (1 - b.probability)) / n), 1e-15, "SE");
  });
});
