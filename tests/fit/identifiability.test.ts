import { describe, expect, it } from "vitest";
import { parseModel } from "../../src/models/model-spec.js";
import { projectThroughCatches } from "../../src/sim/project-through-catches.js";
import { seededUniform, standardNormal } from "../../src/sim/rng.js";
import { fitSeries } from "../../src/fit/fit-series.js";
import { compareModels } from "../../src/fit/compare-models.js";
import { parametricBootstrap } from "../../src/fit/bootstrap.js";
import { fitProblem, optimiseFit } from "../../src/fit/fit-model.js";
import { summarise } from "../../src/fit/fit-series.js";
import type { Series } from "../../src/fit/series.js";
import { unwrap } from "../helpers.js";

// A series without contrast — a stock held near one level by a steady harvest — cannot
// separate r from K (Hilborn & Walters 1992, Quantitative Fisheries Stock Assessment, ch. 8:
// the "one-way trip" and "no contrast" problems). The fit must say so.

function series(rate: (t: number) => number, seed: number, noise = 0.1): Series {
  const u = seededUniform(seed);
  const model = unwrap(parseModel({ family: "ricker", params: { r: 0.9, K: 4000 } }));
  const years = 30;
  const ab: number[] = [];
  const catches: number[] = [];
  // Start at the equilibrium of the steady rate so that the stock does not move.
  let n = 4000 * (1 - Math.log(1 + rate(0)) / 0.9);
  for (let t = 0; t < years; t++) {
    ab.push(n);
    const c = rate(t) * n;
    catches.push(c);
    n = projectThroughCatches(model, "after", n, [c, 0], [0, 0])!.abundance[1]!;
  }
  return {
    years: ab.map((_, i) => 2000 + i),
    count: ab.map((a) => 0.05 * a * Math.exp(noise * standardNormal(u))),
    catch: catches,
    stocking: ab.map(() => 0),
    cv: ab.map(() => null),
    indices: {},
    warnings: [],
  };
}

describe("identifiability", () => {
  it("a steady harvest holding the stock at one level is flagged as not trustworthy", () => {
    const fit = unwrap(
      fitSeries(
        series(() => 0.3, 4),
        { family: "ricker" },
      ),
    );
    expect(fit.identifiability.trustworthy).toBe(false);
    expect(fit.identifiability.problems.length).toBeGreaterThan(0);
  });

  it("an approximate interval that runs to a parameter's bound is named (the data cannot bound it)", () => {
    // The steady-harvest series above again: whatever else is flagged, any interval that
    // reaches the top of its parameter's range must be reported as unbounded on that side.
    const fit = unwrap(
      fitSeries(
        series(() => 0.3, 4),
        { family: "ricker" },
      ),
    );
    for (const [name, ci] of Object.entries(fit.intervals)) {
      const top = name === "r" ? 10 : 1e12;
      const flagged = fit.identifiability.problems.some(
        (p) => p.code === "unbounded_interval" && p.parameter === name && p.side === "upper",
      );
      expect(flagged, name).toBe(ci !== null && ci.upper >= top * (1 - 1e-9));
    }
    expect(fit.identifiability.problems.some((p) => p.code === "unbounded_interval")).toBe(true);
  });

  it("the same stock fished down and then allowed to recover (contrast) is trustworthy", () => {
    // A harvest that rises only makes a "one-way trip", itself poorly informative; down and
    // back up gives the contrast that separates r from K.
    const fit = unwrap(
      fitSeries(
        series((t) => (t < 15 ? 0.05 + 0.045 * t : 0.05), 4),
        { family: "ricker" },
      ),
    );
    expect(fit.identifiability).toEqual({ trustworthy: true, problems: [] });
  });
});

describe("model comparison and bootstrap", () => {
  const s = series((t) => (t < 15 ? 0.05 + 0.045 * t : 0.05), 9);

  it("ranks the generating family among the best and the Akaike weights sum to 1 (Burnham & Anderson 2002)", () => {
    const c = {
      value: unwrap(compareModels(s, { families: ["ricker", "beverton-holt", "gompertz"], delays: [0] })),
    };
    const total = c.value.fits.reduce((a, f) => a + f.weight, 0);
    expect(Math.abs(total - 1)).toBeLessThan(1e-12);
    expect(c.value.fits[0]!.deltaAicc).toBe(0);
    const ricker = c.value.fits.find((f) => f.family === "ricker")!;
    expect(ricker.deltaAicc).toBeLessThan(4);
    for (let i = 1; i < c.value.fits.length; i++)
      expect(c.value.fits[i]!.aicc).toBeGreaterThanOrEqual(c.value.fits[i - 1]!.aicc);
  });

  it("a seeded bootstrap reproduces bit for bit and its draws centre on the estimate", () => {
    const p = unwrap(fitProblem(s, { family: "ricker" }));
    const o = optimiseFit(p);
    const fit = summarise(s, p, o.x, o);
    const a = parametricBootstrap(s, fit, o.x, 60, 42);
    const b = parametricBootstrap(s, fit, o.x, 60, 42);
    expect(a.draws).toEqual(b.draws);
    expect(a.failed).toBe(0);
    const rs = a.draws.map((d) => d.r!).sort((x, y) => x - y);
    const median = rs[30]!;
    // The bootstrap median of r lies within two standard errors of the estimate.
    expect(Math.abs(median - fit.estimates.r!)).toBeLessThan(2 * fit.standardErrors.r!);
  });
});
