import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import reference from "../fixtures/census/census-scipy.json" with { type: "json" };
import { parseSeriesCsv } from "../../src/fit/series.js";
import { fitSeries } from "../../src/fit/fit-series.js";
import { expectClose, unwrap } from "../helpers.js";

// A published census series: the US decennial census 1790–1940 (US Census Bureau totals, in
// millions; values taken from a public listing, not from memory), the series Pearl & Reed
// (1920, PNAS 6: 275–288) fitted with the logistic. Reference: scipy.optimize.least_squares
// on the same annual discrete-logistic observation-error model,
// tests/fixtures/census/fit_census_scipy.py, output in census-scipy.json.
describe("US census 1790–1940: discrete logistic against scipy.optimize", () => {
  const series = unwrap(
    parseSeriesCsv(readFileSync(new URL("../fixtures/census/us-census.csv", import.meta.url), "utf8")),
  );
  const fit = unwrap(fitSeries(series, { family: "discrete-logistic" }));

  it("reaches the same estimates to 4 significant digits", () => {
    expectClose(fit.estimates.r!, reference.r, 1e-4, "r");
    expectClose(fit.estimates.K! / reference.K, 1, 1e-4, "K");
    expectClose(fit.estimates.N0!, reference.N0, 1e-4, "N0");
    expect(fit.q).toBe(1);
  });

  it("reaches the same objective value (negative log-likelihood, 1e-6 relative)", () => {
    expectClose(fit.negLogLikelihood, reference.negLogLikelihood, 1e-6, "NLL");
    expectClose(fit.sigma!, reference.sigma, 1e-5, "σ");
    expect(fit.convergence.converged).toBe(true);
  });

  it("has the standard errors of the Gauss–Newton covariance s²(JᵀJ)⁻¹ (scipy Jacobian), to 2%", () => {
    // Ours come from a numerical Hessian of the concentrated likelihood on the free scale,
    // carried to the natural scale by the delta method; scipy's from the Jacobian at its optimum.
    for (const name of ["r", "K", "N0"] as const) {
      expectClose(fit.standardErrors[name]! / reference.standardErrors[name], 1, 0.02, `se(${name})`);
    }
  });

  it("gives approximate 95% intervals that contain the estimate and span about ±1.96 se", () => {
    for (const name of ["r", "K", "N0"] as const) {
      const ci = fit.intervals[name]!;
      const est = fit.estimates[name]!;
      expect(ci.lower).toBeLessThan(est);
      expect(ci.upper).toBeGreaterThan(est);
      // Well-determined here, so the width is close to the Wald width 2·1.96·se (within 5%).
      expectClose(
        (ci.upper - ci.lower) / (2 * 1.96 * reference.standardErrors[name]),
        1,
        0.05,
        `width(${name})`,
      );
    }
  });
});
