import { describe, expect, it } from "vitest";
import { closedLoop, stateLayout, type StepRecord } from "../../src/policy/closed-loop.js";
import { capQuota } from "../../src/policy/quota-cap.js";
import { projectLoop } from "../../src/sim/project.js";
import { families } from "../../src/models/families.js";
import { expectClose, model, rule } from "../helpers.js";

// Semantics of the closed loop, checked against values worked by hand from the equations in
// closed-loop.ts (hand arithmetic shown beside each value).

const ricker = model("ricker", { r: 1, K: 1000 });

describe("closed loop G = F − H + S", () => {
  it("after reproduction: N' = N·g(N) − min(Q, N·g(N)) + A", () => {
    const loop = closedLoop(ricker, rule({ kind: "constant-catch", quota: 100, stocking: 10 }));
    const x = loop.initialState([500]);
    const rec: StepRecord = { survey: 0, quota: 0, catch: 0, stocking: 0 };
    loop.step(x, x, rec);
    // 500·e^0.5 = 824.3606353500641; − 100 + 10
    expectClose(x[0]!, 500 * Math.exp(0.5) - 90, 1e-15, "N[1]");
    expect(rec).toEqual({ survey: 500, quota: 100, catch: 100, stocking: 10 });
  });

  it("before reproduction: N' = (N − C)·g(N − C) + A", () => {
    const loop = closedLoop(ricker, rule({ kind: "constant-catch", quota: 100, timing: "before" }));
    const x = loop.initialState([500]);
    loop.step(x, x);
    // 400·e^0.6
    expectClose(x[0]!, 400 * Math.exp(0.6), 1e-15, "N[1]");
  });

  it("a survey lag of L years makes the rule act on N[t − L]", () => {
    const lagged = closedLoop(ricker, rule({ kind: "constant-rate", rate: 0.5, surveyLag: 2 }));
    expect(lagged.layout.dimension).toBe(3);
    const p = projectLoop(lagged, [100, 200, 300], 5);
    // Year 0 sees N[−2] = 300, year 1 sees N[−1] = 200, year 2 sees N[0] = 100, then N[1], N[2].
    expect(p.survey.slice(0, 3)).toEqual([300, 200, 100]);
    expect(p.survey[3]).toBe(p.abundance[1]);
    expect(p.survey[4]).toBe(p.abundance[2]);
    expect(p.quota[0]).toBe(150);
  });

  it("a delay T reads the density term T years back: N' = N·g(N[t−T])", () => {
    const delayed = closedLoop(model("ricker", { r: 1, K: 1000 }, 1), rule({ kind: "no-harvest" }));
    const p = projectLoop(delayed, [500, 2000], 2);
    // N[1] = 500·e^(1 − 2) ; N[2] = N[1]·e^(1 − 0.5)
    expectClose(p.abundance[1]!, 500 * Math.exp(-1), 1e-15, "N[1]");
    expectClose(p.abundance[2]!, 500 * Math.exp(-1) * Math.exp(0.5), 1e-15, "N[2]");
  });

  it("with harvest before reproduction the delayed density term is past spawners", () => {
    const m = model("ricker", { r: 1, K: 1000 }, 1);
    const loop = closedLoop(m, rule({ kind: "constant-catch", quota: 100, timing: "before" }));
    expect(stateLayout(m, loop.rule)).toMatchObject({ nHistory: 0, bHistory: 1, dimension: 2 });
    const p = projectLoop(loop, [500, 800], 2);
    // Year 0: B[0] = 400, density term B[−1] = 800 (history, no catch before start).
    const n1 = 400 * Math.exp(1 - 0.8);
    expectClose(p.abundance[1]!, n1, 1e-15, "N[1]");
    // Year 1: B[1] = n1 − 100, density term B[0] = 400.
    expectClose(p.abundance[2]!, (n1 - 100) * Math.exp(1 - 0.4), 1e-15, "N[2]");
  });

  it("the catch never exceeds the stock: a quota larger than the stock takes all of it", () => {
    const loop = closedLoop(ricker, rule({ kind: "constant-catch", quota: 5000, timing: "before" }));
    const p = projectLoop(loop, [300], 3);
    expect(p.catch[0]).toBe(300);
    expect(p.abundance[1]).toBe(0);
    expect(p.extinctionYear).toBe(1);
  });

  it("quota caps limit the year-to-year change and do not lock a closed fishery", () => {
    expect(capQuota(200, 100, 0.15, 0.1)).toBeCloseTo(115, 12);
    expect(capQuota(50, 100, 0.15, 0.1)).toBeCloseTo(90, 12);
    expect(capQuota(100, 100, 0.15, 0.1)).toBe(100);
    expect(capQuota(80, 0, 0.15, 0.1)).toBe(80);
    const loop = closedLoop(
      ricker,
      rule({ kind: "constant-rate", rate: 0.5, quotaChange: { maxIncrease: 0.1, maxDecrease: 0.1 } }),
    );
    const p = projectLoop(loop, [200], 30);
    for (let t = 1; t < 30; t++) {
      const ratio = p.quota[t]! / p.quota[t - 1]!;
      expect(ratio).toBeLessThanOrEqual(1.1 + 1e-12);
      expect(ratio).toBeGreaterThanOrEqual(0.9 - 1e-12);
    }
  });

  it("stepping in place and into a separate array give identical states", () => {
    const m = model("hassell", { R0: 6, K: 800, beta: 3 }, 2);
    const r = rule({
      kind: "threshold",
      lowerTrigger: 100,
      upperTrigger: 400,
      maxRate: 0.4,
      surveyLag: 3,
      timing: "before",
      quotaChange: { maxIncrease: 0.2, maxDecrease: 0.2 },
    });
    const loop = closedLoop(m, r);
    const a = loop.initialState([300, 350, 420, 500]);
    const b = Float64Array.from(a);
    const tmp = new Float64Array(b.length);
    for (let t = 0; t < 50; t++) {
      loop.step(a, a);
      loop.step(b, tmp);
      b.set(tmp);
      expect(Array.from(a)).toEqual(Array.from(b));
    }
  });

  it("stocking alone keeps an Allee-collapsing stock alive", () => {
    const allee = model("allee-ricker", { r: 0.8, K: 1000, A: 200 });
    const none = projectLoop(closedLoop(allee, rule({ kind: "no-harvest" })), [150], 200);
    expect(none.abundance.at(-1)!).toBeLessThan(1e-6);
    const stocked = projectLoop(closedLoop(allee, rule({ kind: "no-harvest", stocking: 80 })), [150], 200);
    expect(stocked.abundance.at(-1)!).toBeGreaterThan(900);
  });
});

describe("the one-number shortcut next()", () => {
  it("gives bit for bit the same next abundance as step() for every family and timing", () => {
    for (const [id, fam] of Object.entries(families)) {
      const params: Record<string, number> = {};
      for (const p of fam.params) params[p.name] = p.default;
      for (const timing of ["before", "after"] as const) {
        for (const spec of [
          { kind: "constant-rate", rate: 0.3 },
          { kind: "constant-catch", quota: 150 },
          { kind: "threshold", lowerTrigger: 100, upperTrigger: 700, maxRate: 0.4 },
        ] as const) {
          const loop = closedLoop(model(id, params), rule({ ...spec, timing, stocking: 3 }));
          for (const n of [0, 1e-3, 50, 420, 999, 2500]) {
            const x = loop.initialState([n]);
            loop.step(x, x);
            expect(loop.next(n), `${id} ${timing} ${spec.kind} at ${n}`).toBe(x[0]);
          }
        }
      }
    }
  });
});
