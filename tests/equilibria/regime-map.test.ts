import { afterAll, describe, expect, it } from "vitest";
import { regimeMap } from "../../src/equilibria/regime-map.js";
import { REGIMES } from "../../src/equilibria/long-run.js";
import { createAnalysisPool } from "../../server/workers/pool.js";
import { model, rule, unwrap } from "../helpers.js";

// Ricker with a constant rate h taken after reproduction: N* solves e^(r(1 − N/K)) = 1 + h
// and G'(N*) = (1 + h)(1 − r + ln(1 + h)) − h, so the equilibrium period-doubles
// (G' = −1) on r_c(h) = 1 + ln(1 + h) + (1 − h)/(1 + h) — derived here from the map; at h = 0
// it is May's (1976) r = 2.
const rc = (h: number) => 1 + Math.log(1 + h) + (1 - h) / (1 + h);

const request = {
  model: { family: "ricker", params: { r: 1, K: 1000 } },
  rule: { kind: "constant-rate", rate: 0.1 },
  x: { path: "model.params.r", from: 1.0, to: 2.4, count: 28 },
  y: { path: "rule.rate", from: 0, to: 0.6, count: 20 },
  options: { start: [500] },
};

describe("regime map", () => {
  const map = unwrap(
    regimeMap(
      model("ricker", { r: 1, K: 1000 }),
      rule({ kind: "constant-rate", rate: 0.1 }),
      request.x,
      request.y,
      { start: [500] },
    ),
  );

  it("the Jury boundary lies on the period-doubling curve r_c(h)", () => {
    const pd = map.boundary.filter((b) => b.from === "stable" && b.to === "unstable");
    expect(pd.length).toBeGreaterThanOrEqual(5); // columns with 1.72 < r < 2 cross the curve
    for (const b of pd)
      expect(Math.abs(b.x - rc(b.y)), `boundary point ${JSON.stringify(b)}`).toBeLessThan(1e-6);
  });

  it("cells left of r_c(h) settle on the equilibrium and cells just right of it cycle", () => {
    const nx = map.x.values.length;
    map.y.values.forEach((h, j) => {
      map.x.values.forEach((r, i) => {
        const regime = REGIMES[map.regimes[j * nx + i]!];
        if (r < rc(h) - 0.05 && r > Math.log(1 + h) + 0.05)
          expect(regime, `r = ${r}, h = ${h}`).toBe("equilibrium");
        if (r > rc(h) + 0.05 && r < rc(h) + 0.3) expect(regime, `r = ${r}, h = ${h}`).toBe("cycle");
      });
    });
  });

  const pools = [createAnalysisPool(1), createAnalysisPool(2)];
  afterAll(async () => {
    await Promise.all(pools.map((p) => p.close()));
  });

  it("1 and 2 workers give the same map as the single-threaded core", async () => {
    const [one, two] = await Promise.all(pools.map((p) => p.regimeMap(request)));
    for (const pooled of [one!, two!]) {
      expect(pooled.ok).toBe(true);
      if (!pooled.ok) return;
      // The pool answers with names; the core keeps indices into REGIMES.
      expect(pooled.regimes).toEqual(Array.from(map.regimes, (k) => REGIMES[k]));
      expect(pooled.periods).toEqual(Array.from(map.periods, (p) => p || null));
      expect(pooled.boundary).toEqual([...map.boundary].sort((a, b) => a.x - b.x || a.y - b.y));
    }
  });

  it("refuses an unknown parameter path, equal axes and a count out of range, naming the field", () => {
    const m = model("ricker", { r: 1, K: 1000 });
    const r = rule({ kind: "constant-rate", rate: 0.1 });
    const bad = regimeMap(m, r, { ...request.x, path: "model.params.q" }, request.y);
    expect(bad.ok || bad.issue).toMatchObject({ code: "unknown_option", field: "x.path" });
    const same = regimeMap(m, r, request.x, request.x);
    expect(same.ok || same.issue).toMatchObject({ code: "constraint_violated", field: "y.path" });
    const many = regimeMap(m, r, { ...request.x, count: 5000 }, request.y);
    expect(many.ok || many.issue).toMatchObject({ code: "param_out_of_range", field: "x.count" });
    const range = regimeMap(m, r, request.x, { ...request.y, to: 1.5 });
    expect(range.ok || range.issue).toMatchObject({ code: "param_out_of_range", field: "y.to" });
  });
});
