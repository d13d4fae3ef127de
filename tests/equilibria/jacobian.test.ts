import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { families } from "../../src/models/families.js";
import { FAMILY_IDS } from "../../src/models/families.js";
import { closedLoop } from "../../src/policy/closed-loop.js";
import { characteristicPolynomial, linearise } from "../../src/equilibria/jacobian.js";
import { eigenvalues, polynomialRoots, modulus } from "../../src/equilibria/eigenvalues.js";
import { findEquilibria } from "../../src/equilibria/equilibria.js";
import { model, rule } from "../helpers.js";

// Identity checks (common practice, no source): the analytic Jacobian against central
// finite differences of the map, G(x*) = x* at every equilibrium found, and the roots of the
// characteristic polynomial equal to the eigenvalues of the full Jacobian (ml-matrix).

const rules = [
  { kind: "constant-rate", rate: 0.25 },
  { kind: "constant-catch", quota: 90 },
  { kind: "constant-escapement", escapement: 350 },
  { kind: "threshold", lowerTrigger: 150, upperTrigger: 600, maxRate: 0.35 },
] as const;

const scenario = fc.record({
  family: fc.constantFrom(...FAMILY_IDS),
  ruleIndex: fc.integer({ min: 0, max: rules.length - 1 }),
  timing: fc.constantFrom("before" as const, "after" as const),
  T: fc.integer({ min: 0, max: 3 }),
  L: fc.integer({ min: 0, max: 3 }),
  u: fc.array(fc.double({ min: 0.3, max: 1.6, noNaN: true }), { minLength: 8, maxLength: 8 }),
});

function build(s: {
  family: (typeof FAMILY_IDS)[number];
  ruleIndex: number;
  timing: "before" | "after";
  T: number;
  L: number;
}) {
  const params: Record<string, number> = {};
  for (const p of families[s.family].params) params[p.name] = p.default;
  return closedLoop(
    model(s.family, params, s.T),
    rule({ ...rules[s.ruleIndex]!, timing: s.timing, surveyLag: s.L }),
  );
}

describe("Jacobian of the closed loop", () => {
  it("matches central finite differences at random states (away from kinks)", () => {
    fc.assert(
      fc.property(scenario, (s) => {
        const loop = build(s);
        const d = loop.layout.dimension;
        const x = new Float64Array(d);
        for (let i = 0; i < d; i++) x[i] = 1000 * s.u[i % 8]!;
        const J = linearise(loop, x).jacobian;
        const h = 1e-4;
        const plus = new Float64Array(d);
        const minus = new Float64Array(d);
        for (let j = 0; j < d; j++) {
          const xp = Float64Array.from(x);
          const xm = Float64Array.from(x);
          xp[j]! += h;
          xm[j]! -= h;
          loop.step(xp, plus);
          loop.step(xm, minus);
          for (let i = 0; i < d; i++) {
            const fd = (plus[i]! - minus[i]!) / (2 * h);
            // A kink (trigger, catch = stock) inside ±h makes the difference one-sided: skip.
            const base = new Float64Array(d);
            loop.step(x, base);
            const left = (base[i]! - minus[i]!) / h;
            const right = (plus[i]! - base[i]!) / h;
            if (Math.abs(left - right) > 1e-3 * Math.max(1, Math.abs(fd))) continue;
            expect(Math.abs(J[i]![j]! - fd), `J[${i}][${j}] for ${JSON.stringify(s)}`).toBeLessThan(
              1e-5 * Math.max(1, Math.abs(fd)),
            );
          }
        }
      }),
      { numRuns: 300, seed: 5 },
    );
  });

  it("at every equilibrium: G(x*) = x*, and the characteristic polynomial's roots are J's eigenvalues", () => {
    fc.assert(
      fc.property(scenario, (s) => {
        const loop = build(s);
        for (const e of findEquilibria(loop).equilibria) {
          const x = Float64Array.from(e.state);
          const next = new Float64Array(x.length);
          loop.step(x, next);
          for (let i = 0; i < x.length; i++) expect(Math.abs(next[i]! - x[i]!)).toBeLessThan(1e-8 * 1000);
          const lin = linearise(loop, x);
          expect(lin.lagCoefficients).not.toBeNull();
          const poly = characteristicPolynomial(lin.lagCoefficients!);
          expect(poly.length - 1).toBe(lin.jacobian.length);
          // Repeated zero roots (unread delay slots) are defective: their computed values
          // scatter by EPS^(1/k), so only roots of modulus above 1e-2 are compared, to 1e-6.
          const big = (v: number[]) => v.filter((m) => m > 1e-2).sort((a, b) => b - a);
          const fromPoly = big(polynomialRoots(poly).map(modulus));
          const fromJ = big(eigenvalues(lin.jacobian).map(modulus));
          expect(fromPoly.length).toBe(fromJ.length);
          fromPoly.forEach((m, i) => expect(Math.abs(m - fromJ[i]!)).toBeLessThan(1e-6 * Math.max(1, m)));
        }
      }),
      { numRuns: 150, seed: 9 },
    );
  });
});
