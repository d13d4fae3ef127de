import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { families } from "../../src/models/families.js";
import { FAMILY_IDS } from "../../src/models/families.js";
import { production, productionSlope, type Params } from "../../src/models/growth-family.js";
import { msy } from "../../src/policy/msy.js";
import { maximiseOnInterval } from "../../src/numeric/golden-section.js";
import { expectClose, model, unwrap } from "../helpers.js";

// One contract for every growth family (hono's shared-suite pattern): the analytic
// derivative against a central finite difference, the listed equilibria as fixed points of
// the map, and the closed-form MSY against a numeric maximisation of f(S) − S.

/** Parameters drawn inside each family's documented range (a practical sub-range). */
function paramsArb(id: (typeof FAMILY_IDS)[number]): fc.Arbitrary<Params> {
  const K = fc.double({ min: 10, max: 1e6, noNaN: true });
  const r3 = fc.double({ min: 0.05, max: 2.9, noNaN: true });
  const R0 = fc.double({ min: 1.05, max: 50, noNaN: true });
  switch (id) {
    case "discrete-logistic":
    case "gompertz":
      return fc.record({ r: r3, K });
    case "ricker":
      return fc.record({ r: fc.double({ min: 0.05, max: 5, noNaN: true }), K });
    case "beverton-holt":
      return fc.record({ R0, K });
    case "shepherd":
      return fc.record({ R0, K, delta: fc.double({ min: 0.3, max: 6, noNaN: true }) });
    case "hassell":
      return fc.record({ R0, K, beta: fc.double({ min: 0.3, max: 10, noNaN: true }) });
    case "theta-logistic":
      return fc.record({
        r: fc.double({ min: 0.05, max: 1.5, noNaN: true }),
        K,
        theta: fc.double({ min: 0.3, max: 5, noNaN: true }),
      });
    case "allee-ricker":
      return fc
        .record({
          r: fc.double({ min: 0.05, max: 3, noNaN: true }),
          K,
          frac: fc.double({ min: 0.05, max: 0.8, noNaN: true }),
        })
        .map(({ r, K, frac }) => ({ r, K, A: frac * K }));
  }
}

for (const id of FAMILY_IDS) {
  const fam = families[id];
  describe(`growth family ${id}`, () => {
    it("documents its equation, source and every parameter's unit and range", () => {
      expect(fam.equation).toMatch(/N\[t\+1\]/);
      expect(fam.source.length).toBeGreaterThan(10);
      for (const p of fam.params) {
        expect(p.unit.length).toBeGreaterThan(0);
        expect(p.min).toBeLessThan(p.max);
        expect(p.default).toBeGreaterThan(p.min);
        expect(p.default).toBeLessThanOrEqual(p.max);
      }
    });

    // Central difference with step h = 1e-5·K has truncation error O(h²·f''') and rounding
    // error O(EPS·f/h); relative 1e-5 of the slope scale bounds both for these smooth maps.
    it("f'(N) and g'(M) agree with a central finite difference over the parameter range", () => {
      fc.assert(
        fc.property(paramsArb(id), fc.double({ min: 0.02, max: 2.5, noNaN: true }), (p, u) => {
          const N = u * p.K!;
          const h = 1e-5 * p.K!;
          const fd = (production(fam, N + h, p) - production(fam, N - h, p)) / (2 * h);
          const an = productionSlope(fam, N, p);
          const scale = Math.max(1, Math.abs(fam.factor(N, p)), Math.abs(fd));
          expectClose(an / scale, fd / scale, 1e-5, `${id} f'(${N}) with ${JSON.stringify(p)}`);
          const gfd = (fam.factor(N + h, p) - fam.factor(N - h, p)) / (2 * h);
          const gs = Math.max(1e-300, Math.abs(gfd), fam.factor(N, p) / p.K!);
          expectClose(fam.factorSlope(N, p) / gs, gfd / gs, 1e-5, `${id} g'(${N})`);
        }),
        { numRuns: 300, seed: 20261201 },
      );
    });

    it("every listed equilibrium is a fixed point of N' = f(N)", () => {
      fc.assert(
        fc.property(paramsArb(id), (p) => {
          for (const e of fam.equilibria(p)) expectClose(production(fam, e, p), e, 1e-12, `${id} f(${e})`);
        }),
        { numRuns: 200, seed: 7 },
      );
    });

    it("MSY is the peak of the surplus f(S) − S (closed form against a numeric search)", () => {
      fc.assert(
        fc.property(paramsArb(id), (p) => {
          const result = msy(model(id, p as Record<string, number>));
          if (id === "gompertz" && p.r! >= 1) {
            // r ≥ 1: f(S) = K^r·S^(1−r) grows without bound as S → 0, so no finite MSY.
            expect(result.ok).toBe(false);
            return;
          }
          const m = unwrap(result);
          const lower = fam
            .equilibria(p)
            .filter((e) => e < p.K!)
            .reduce((a, b) => Math.max(a, b), 0);
          const num = maximiseOnInterval((x) => production(fam, x, p) - x, lower, p.K!, 2048);
          // The maximum value is accurate to ~EPS; its location only to ~√EPS (flat peak).
          expectClose(m.msy / p.K!, num.value / p.K!, 1e-9, `${id} MSY`);
          expectClose(m.escapementMsy / p.K!, num.x / p.K!, 1e-5, `${id} S_MSY`);
          expect(m.msy).toBeGreaterThan(0);
          expect(m.hMsy).toBeGreaterThan(0);
        }),
        { numRuns: 100, seed: 11 },
      );
    });
  });
}
