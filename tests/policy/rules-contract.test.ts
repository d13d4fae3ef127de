import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { closedLoop } from "../../src/policy/closed-loop.js";
import type { RuleSpecInput } from "../../src/policy/rule-spec.js";
import { FAMILY_IDS } from "../../src/models/families.js";
import { families } from "../../src/models/families.js";
import { projectLoop } from "../../src/sim/project.js";
import { expectClose, model, rule } from "../helpers.js";

// One contract for every harvest rule: a quota never negative, dH/dy against a finite
// difference away from kinks, and in closed loop a catch never above the stock available
// and an abundance never negative or non-finite (invariants stated in closed-loop.ts;
// common practice, no source).

const RULES: Record<string, RuleSpecInput> = {
  "no-harvest": { kind: "no-harvest", stocking: 5 },
  "constant-catch": { kind: "constant-catch", quota: 180 },
  "constant-rate": { kind: "constant-rate", rate: 0.35 },
  "constant-escapement": { kind: "constant-escapement", escapement: 400 },
  threshold: { kind: "threshold", lowerTrigger: 200, upperTrigger: 500, maxRate: 0.3 },
};

for (const [name, spec] of Object.entries(RULES)) {
  describe(`harvest rule ${name}`, () => {
    const h = rule(spec).harvest;
    const kinks = [200, 400, 500];

    it("sets a non-negative quota and its slope matches a central difference away from kinks", () => {
      fc.assert(
        fc.property(fc.double({ min: 0, max: 5000, noNaN: true }), (y) => {
          expect(h.quota(y)).toBeGreaterThanOrEqual(0);
          if (kinks.some((k) => Math.abs(y - k) < 1e-3)) return;
          const d = 1e-5;
          const fd = (h.quota(y + d) - h.quota(Math.max(0, y - d))) / (y - d < 0 ? y + d : 2 * d);
          // Piecewise linear or quadratic: the central difference is exact up to rounding.
          expectClose(h.quotaSlope(y), fd, 1e-6, `dH/dy at ${y}`);
        }),
        { numRuns: 500, seed: 3 },
      );
    });

    it("in closed loop with every family, timing, lag and cap: catch ≤ stock, abundance ≥ 0 and finite", () => {
      fc.assert(
        fc.property(
          fc.constantFrom(...FAMILY_IDS),
          fc.constantFrom("before" as const, "after" as const),
          fc.integer({ min: 0, max: 4 }),
          fc.integer({ min: 0, max: 3 }),
          fc.boolean(),
          fc.double({ min: 0, max: 3000, noNaN: true }),
          (family, timing, surveyLag, delay, capped, start) => {
            const fam = families[family];
            const params: Record<string, number> = {};
            for (const p of fam.params) params[p.name] = p.default;
            if (family === "discrete-logistic" || family === "theta-logistic") params.r = 2.5;
            const r = rule({
              ...spec,
              timing,
              surveyLag,
              ...(capped ? { quotaChange: { maxIncrease: 0.15, maxDecrease: 0.15 } } : {}),
            });
            const loop = closedLoop(model(family, params, delay), r);
            const p = projectLoop(loop, [start], 200);
            const broken: string[] = [];
            for (let t = 0; t < p.catch.length; t++) {
              const n = p.abundance[t]!;
              const c = p.catch[t]!;
              const next = p.abundance[t + 1]!;
              if (!(c >= 0) || c > p.quota[t]! + 1e-9)
                broken.push(`year ${t}: catch ${c} vs quota ${p.quota[t]}`);
              // Before reproduction the catch comes out of N[t]; after, out of N[t]·g.
              if (timing === "before" && c > n) broken.push(`year ${t}: catch ${c} > stock ${n}`);
              if (!(next >= 0) || !Number.isFinite(next)) broken.push(`year ${t + 1}: abundance ${next}`);
            }
            expect(
              broken,
              `${family} ${timing} L=${surveyLag} T=${delay} capped=${capped} start=${start}`,
            ).toEqual([]);
          },
        ),
        { numRuns: 300, seed: 17 },
      );
    });
  });
}
