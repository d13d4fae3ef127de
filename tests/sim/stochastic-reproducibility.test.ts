import { afterAll, describe, expect, it } from "vitest";
import { createAnalysisPool } from "../../server/workers/pool.js";
import { parseScenario } from "../../src/sim/scenario.js";
import { parseUncertainty } from "../../src/sim/uncertainty.js";
import { projectStochastic } from "../../src/sim/stochastic-projection.js";
import { projectLoop } from "../../src/sim/project.js";
import { rule, unwrap } from "../helpers.js";

// Reproducibility and common random numbers are properties of the design (DESIGN.md: the same
// scenario and seed give the same numbers, bit for bit); no external source.
const spec = {
  model: { family: "ricker", params: { r: 1.8, K: 500 } },
  rule: { kind: "constant-rate", rate: 0.2, surveyLag: 0 },
  start: 250,
  horizon: 25,
};
const noisy = {
  replicates: 3000,
  seed: 99,
  processSd: 0.3,
  processAutocorrelation: 0.5,
  observationSd: 0.2,
  implementationSd: 0.1,
};
const sc = unwrap(parseScenario(spec));
const u = unwrap(parseUncertainty(noisy, sc.model));

describe("seeded runs", () => {
  it("the same scenario and seed reproduce bit for bit", () => {
    expect(projectStochastic(sc, u)).toEqual(projectStochastic(sc, u));
  });
  it("another seed gives other numbers", () => {
    const other = unwrap(parseUncertainty({ ...noisy, seed: 100 }, sc.model));
    expect(projectStochastic(sc, other).abundance).not.toEqual(projectStochastic(sc, u).abundance);
  });
  it("a delayed, lagged, capped loop (the state-vector path) reproduces too", () => {
    const sc2 = unwrap(
      parseScenario({
        ...spec,
        model: { family: "ricker", params: { r: 0.8, K: 500 }, delay: 1 },
        rule: {
          kind: "constant-rate",
          rate: 0.2,
          surveyLag: 2,
          quotaChange: { maxIncrease: 0.1, maxDecrease: 0.2 },
        },
      }),
    );
    const a = projectStochastic(sc2, unwrap(parseUncertainty(noisy, sc2.model)));
    expect(a).toEqual(projectStochastic(sc2, unwrap(parseUncertainty(noisy, sc2.model))));
    // Without noise the state-vector path is the deterministic projection exactly.
    const quiet = projectStochastic(sc2, unwrap(parseUncertainty({ replicates: 10, seed: 1 }, sc2.model)));
    expect(quiet.abundance[0]).toEqual(projectLoop(sc2.loop, sc2.start, 25).abundance);
  });
});

describe("common random numbers", () => {
  it("two identical rules give exactly zero difference", () => {
    const a = projectStochastic(sc, u, {
      rule: rule({ kind: "threshold", lowerTrigger: 100, upperTrigger: 300, maxRate: 0.25 }),
    });
    const b = projectStochastic(sc, u, {
      rule: rule({ kind: "threshold", lowerTrigger: 100, upperTrigger: 300, maxRate: 0.25 }),
    });
    for (let i = 0; i < a.levels.length; i++) {
      for (let t = 0; t <= 25; t++) expect(a.abundance[i]![t]! - b.abundance[i]![t]!).toBe(0);
      for (let t = 0; t < 25; t++) expect(a.catch[i]![t]! - b.catch[i]![t]!).toBe(0);
    }
    expect(a.risk.meanCatch - b.risk.meanCatch).toBe(0);
  });
  it("a rule that never binds sees the same draws as no harvest", () => {
    // A constant catch of 0 removes nothing, so its whole projection must equal no harvest's.
    const a = projectStochastic(sc, u, { rule: rule({ kind: "constant-catch", quota: 0 }) });
    const b = projectStochastic(sc, u, { rule: rule({ kind: "no-harvest" }) });
    expect(a.abundance).toEqual(b.abundance);
  });
});

describe("worker pool", () => {
  const pools = [createAnalysisPool(1), createAnalysisPool(2)];
  afterAll(async () => {
    for (const p of pools) await p.close();
  });
  it("1 and 2 workers give the numbers of the in-thread run, bit for bit", async () => {
    const req = { scenario: spec, uncertainty: { ...noisy, replicates: 20_000 } };
    const local = projectStochastic(sc, unwrap(parseUncertainty(req.uncertainty, sc.model)));
    const [one, two] = await Promise.all(pools.map((p) => p.projection(req)));
    expect(one).toEqual({ ok: true, value: local });
    expect(two).toEqual({ ok: true, value: local });
  });
  it("reports progress and can be cancelled", async () => {
    const seen: number[] = [];
    const done = await pools[1]!.projection(
      { scenario: spec, uncertainty: { ...noisy, replicates: 20_000 } },
      undefined,
      (d, total) => {
        seen.push(d);
        expect(total).toBe(20);
      },
    );
    expect(done.ok).toBe(true);
    expect(seen[seen.length - 1]).toBe(20);
    const controller = new AbortController();
    const pending = pools[1]!.projection(
      { scenario: spec, uncertainty: { ...noisy, replicates: 1_000_000 } },
      controller.signal,
    );
    controller.abort();
    await expect(pending).rejects.toThrow(/abort/i);
  });
  it("bad input fails before any worker starts, naming the field", async () => {
    const r = await pools[0]!.projection({ scenario: spec, uncertainty: { ...noisy, replicates: 5 } });
    expect(r).toMatchObject({
      ok: false,
      issue: { code: "param_out_of_range", field: "uncertainty.replicates", min: 10 },
    });
  });
});
