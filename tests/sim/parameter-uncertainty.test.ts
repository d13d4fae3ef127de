import { describe, expect, it } from "vitest";
import { parseScenario } from "../../src/sim/scenario.js";
import { parseUncertainty } from "../../src/sim/uncertainty.js";
import { projectStochastic } from "../../src/sim/stochastic-projection.js";
import { projectLoop } from "../../src/sim/project.js";
import { closedLoop } from "../../src/policy/closed-loop.js";
import { expectClose, model, unwrap } from "../helpers.js";

const sc = unwrap(
  parseScenario({
    model: { family: "beverton-holt", params: { R0: 2, K: 1000 } },
    rule: { kind: "constant-rate", rate: 0.1 },
    start: 100,
    horizon: 20,
  }),
);

describe("parameter uncertainty from bootstrap draws", () => {
  it("replicates draw each parameter set about equally often, and follow its trajectory", () => {
    // Two sets and no noise: every replicate follows one of two deterministic paths, so the
    // 25th and 75th percentiles are those paths and P(path A) is binomial(n, 1/2).
    const draws = [{ R0: 1.5 }, { R0: 4, N0: 90, sigma: 0.2 }];
    const low = projectLoop(
      closedLoop(model("beverton-holt", { R0: 1.5, K: 1000 }), sc.rule),
      [100],
      20,
    ).abundance;
    const high = projectLoop(
      closedLoop(model("beverton-holt", { R0: 4, K: 1000 }), sc.rule),
      [100],
      20,
    ).abundance;
    // A limit between the two paths in year 10 counts the replicates on the low path there.
    const limit = (low[10]! + high[10]!) / 2;
    const n = 4000;
    const u = unwrap(parseUncertainty({ replicates: n, seed: 3, limit, parameters: { draws } }, sc.model));
    const p = projectStochastic(sc, u);
    for (const t of [5, 10, 20]) {
      // Every percentile lies within the 0.3% histogram bin of its path.
      expectClose(p.abundance[0]![t]!, low[t]!, 0.003, `P5 N_${t}`);
      expectClose(p.abundance[6]![t]!, high[t]!, 0.003, `P95 N_${t}`);
      expectClose(p.abundance[2]![t]!, low[t]!, 0.003, `P25 N_${t}`);
      expectClose(p.abundance[4]![t]!, high[t]!, 0.003, `P75 N_${t}`);
    }
    // Binomial(n, 1/2): within 4 standard errors of one half.
    expect(Math.abs(p.risk.belowLimitByYear[10]! - 0.5)).toBeLessThan(4 * Math.sqrt(0.25 / n));
  });

  it("draws from a covariance have the given mean and covariance (multivariate normal)", () => {
    // x = μ + L·z with Σ = L·Lᵀ (Gentle 2003, §5.3.1, from memory): check the sample moments
    // of the parameter sets against μ and Σ within Monte Carlo error.
    const mean = { R0: 3, K: 1000 };
    const cov = [
      [0.04, 1.2],
      [1.2, 400],
    ];
    const u = unwrap(
      parseUncertainty(
        { replicates: 10, seed: 8, parameters: { mean, covariance: cov, count: 20000 } },
        sc.model,
      ),
    );
    const xs = u.models.map((m) => [m.params.R0!, m.params.K!]);
    const n = xs.length;
    const m0 = xs.reduce((a, x) => a + x[0]!, 0) / n;
    const m1 = xs.reduce((a, x) => a + x[1]!, 0) / n;
    const c01 = xs.reduce((a, x) => a + (x[0]! - m0) * (x[1]! - m1), 0) / (n - 1);
    const v0 = xs.reduce((a, x) => a + (x[0]! - m0) ** 2, 0) / (n - 1);
    expect(Math.abs(m0 - 3)).toBeLessThan(5 * Math.sqrt(0.04 / n));
    expect(Math.abs(m1 - 1000)).toBeLessThan(5 * Math.sqrt(400 / n));
    expectClose(v0, 0.04, (0.002 / 0.04) * 0.05, "var R0"); // relative 5% ≈ 5 SE at n = 20000
    expect(Math.abs(c01 / Math.sqrt(v0 * 400) - 0.3)).toBeLessThan(0.03); // correlation 1.2/(0.2·20)
  });
});

describe("bad uncertainty settings name the field and the allowed range", () => {
  const bad = (input: unknown) => {
    const r = parseUncertainty(input, sc.model);
    expect(r.ok).toBe(false);
    return r.ok ? null : r.issue;
  };
  it("replicates, seed and noise levels", () => {
    expect(bad({ replicates: 5, seed: 1 })).toMatchObject({
      code: "param_out_of_range",
      field: "uncertainty.replicates",
      min: 10,
      max: 1_000_000,
    });
    expect(bad({ replicates: 2_000_000, seed: 1 })).toMatchObject({
      code: "param_out_of_range",
      field: "uncertainty.replicates",
    });
    expect(bad({ replicates: 100.5, seed: 1 })).toMatchObject({
      code: "not_an_integer",
      field: "uncertainty.replicates",
    });
    expect(bad({ replicates: 100, seed: -1 })).toMatchObject({
      code: "param_out_of_range",
      field: "uncertainty.seed",
      min: 0,
    });
    expect(bad({ replicates: 100 })).toMatchObject({ code: "missing_field", field: "uncertainty.seed" });
    expect(bad({ replicates: 100, seed: 1, processSd: -0.1 })).toMatchObject({
      code: "param_out_of_range",
      field: "uncertainty.processSd",
      min: 0,
      max: 3,
    });
    expect(bad({ replicates: 100, seed: 1, processAutocorrelation: 1 })).toMatchObject({
      code: "param_out_of_range",
      field: "uncertainty.processAutocorrelation",
      max: 0.99,
    });
    expect(bad({ replicates: 100, seed: 1, processSd: Number.NaN })).toMatchObject({
      code: "not_finite",
      field: "uncertainty.processSd",
    });
    expect(bad({ replicates: 100, seed: 1, noise: 1 })).toMatchObject({
      code: "unknown_field",
      field: "uncertainty.noise",
    });
    expect(bad([1])).toMatchObject({ code: "wrong_type", field: "uncertainty" });
  });
  it("parameter draws and covariances", () => {
    expect(bad({ replicates: 100, seed: 1, parameters: { draws: [{ R0: 2 }, { R0: 0.5 }] } })).toMatchObject({
      code: "param_out_of_range",
      field: "uncertainty.parameters.draws[1].R0",
      min: 1,
    });
    expect(bad({ replicates: 100, seed: 1, parameters: { draws: [] } })).toMatchObject({
      field: "uncertainty.parameters.draws",
    });
    expect(bad({ replicates: 100, seed: 1, parameters: { draws: [{ R0: 2, r: 1 }] } })).toMatchObject({
      code: "unknown_field",
      field: "uncertainty.parameters.draws[0].r",
    });
    expect(
      bad({
        replicates: 100,
        seed: 1,
        parameters: {
          mean: { R0: 2 },
          covariance: [
            [0.1, 0],
            [0, 1],
          ],
        },
      }),
    ).toMatchObject({ code: "constraint_violated", field: "uncertainty.parameters.covariance" });
    expect(
      bad({
        replicates: 100,
        seed: 1,
        parameters: {
          mean: { R0: 2, K: 900 },
          covariance: [
            [0.1, 5],
            [5, 1],
          ],
        },
      }),
    ).toMatchObject({
      code: "constraint_violated",
      field: "uncertainty.parameters.covariance",
      constraint: expect.stringMatching(/positive definite/),
    });
    expect(
      bad({
        replicates: 100,
        seed: 1,
        parameters: {
          mean: { R0: 2, K: 900 },
          covariance: [
            [0.1, 0.2],
            [0.3, 1],
          ],
        },
      }),
    ).toMatchObject({ code: "constraint_violated", field: "uncertainty.parameters.covariance[0][1]" });
    expect(
      bad({ replicates: 100, seed: 1, parameters: { mean: { R0: 0.5 }, covariance: [[1e-4]], count: 5 } }),
    ).toMatchObject({
      code: "constraint_violated",
      field: "uncertainty.parameters.covariance",
      constraint: expect.stringMatching(/100 draws/),
    });
  });
});
