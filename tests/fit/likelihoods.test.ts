import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { logGamma } from "../../src/numeric/log-gamma.js";
import { parseSeriesCsv } from "../../src/fit/series.js";
import { compareModels, type ModelComparison } from "../../src/fit/compare-models.js";
import { fitSeries } from "../../src/fit/fit-series.js";
import type { Series } from "../../src/fit/series.js";
import { expectClose, unwrap } from "../helpers.js";

describe("log-gamma (exact identities)", () => {
  it("ln Γ(n) = ln (n − 1)! and Γ(½) = √π", () => {
    let fact = 1;
    for (let n = 1; n <= 20; n++) {
      expectClose(logGamma(n), Math.log(fact), 1e-13, `lnΓ(${n})`);
      fact *= n;
    }
    expectClose(logGamma(0.5), 0.5 * Math.log(Math.PI), 1e-13, "lnΓ(1/2)");
  });
});

describe("process-error fit", () => {
  // Ricker (1954): with no catch, the process-error Ricker with lognormal error and q = 1 is
  // least squares on ln(y[t+1]/y[t]) = r − (r/K)·y[t]: its estimates equal the ordinary
  // least-squares line (closed form, computed here independently).
  it("equals the Ricker linear regression", () => {
    const y = [120, 260, 480, 700, 820, 760, 840, 800, 900, 780, 860, 830, 800, 870];
    const series: Series = {
      years: y.map((_, i) => i),
      count: y,
      catch: y.map(() => 0),
      stocking: y.map(() => 0),
      cv: y.map(() => null),
      indices: {},
      warnings: [],
    };
    const xs = y.slice(0, -1);
    const zs = y.slice(1).map((v, i) => Math.log(v / y[i]!));
    const mx = xs.reduce((a, b) => a + b) / xs.length;
    const mz = zs.reduce((a, b) => a + b) / zs.length;
    const slope =
      xs.reduce((a, x, i) => a + (x - mx) * (zs[i]! - mz), 0) / xs.reduce((a, x) => a + (x - mx) ** 2, 0);
    const r = mz - slope * mx;
    const fit = unwrap(fitSeries(series, { family: "ricker", method: "process" }));
    expectClose(fit.estimates.r!, r, 1e-6, "r");
    expectClose(fit.estimates.K! / (-r / slope), 1, 1e-6, "K");
  });
});

describe("count likelihoods", () => {
  it("Poisson and negative binomial fit raw counts with zeros, and lognormal refuses zeros by name", () => {
    const y = [40, 55, 71, 0, 90, 103, 96, 110, 0, 120, 115, 118, 124, 119];
    const series: Series = {
      years: y.map((_, i) => 2000 + i),
      count: y,
      catch: y.map(() => 0),
      stocking: y.map(() => 0),
      cv: y.map(() => null),
      indices: {},
      warnings: [],
    };
    for (const likelihood of ["poisson", "negative-binomial"] as const) {
      const fit = unwrap(fitSeries(series, { family: "beverton-holt", likelihood }));
      expect(fit.convergence.converged).toBe(true);
      expect(fit.estimates.K!).toBeGreaterThan(80);
    }
    const bad = fitSeries(series, { family: "beverton-holt", likelihood: "lognormal" });
    expect(bad.ok || bad.issue).toMatchObject({ code: "constraint_violated", field: "count[2003]" });
  });

  it("the demo deer herd (invented, generated with R0 = 1.6, K = 2,400) is recovered within 10%", () => {
    const s = unwrap(
      parseSeriesCsv(
        readFileSync(new URL("../../data-demo/skerra-deer/series.csv", import.meta.url), "utf8"),
      ),
    );
    const fit = unwrap(fitSeries(s, { family: "beverton-holt", likelihood: "poisson", timing: "before" }));
    expect(Math.abs(fit.estimates.K! / 2400 - 1)).toBeLessThan(0.1);
    expect(Math.abs(fit.estimates.R0! / 1.6 - 1)).toBeLessThan(0.1);
    expect(fit.management.verdict).toBe("stable-monotone");
  });

  it("a series shorter than the parameters need is refused", () => {
    const series: Series = {
      years: [0, 1, 2],
      count: [1, 2, 3],
      catch: [0, 0, 0],
      stocking: [0, 0, 0],
      cv: [null, null, null],
      indices: {},
      warnings: [],
    };
    expect(fitSeries(series, { family: "ricker" })).toMatchObject({
      ok: false,
      issue: { code: "series_too_short" },
    });
    // A comparison in which every model fails is still a result: it says so, model by model
    // (Ricker estimates r, K, N0 and σ, and needs two points more than that).
    const all = compareModels(series, { families: ["ricker", "gompertz"], delays: [0] });
    expect(all).toMatchObject({ ok: true, value: { fits: [], converged: false } });
    const skipped = (all as { value: ModelComparison }).value.skipped;
    expect(skipped.map((s) => [s.family, s.reason])).toEqual([
      ["ricker", "series_too_short"],
      ["gompertz", "series_too_short"],
    ]);
    expect(skipped[0]!.detail).toBe("the series has 3 usable points; at least 6 are needed");
  });
});
