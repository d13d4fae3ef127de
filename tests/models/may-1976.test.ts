import { describe, expect, it } from "vitest";
import { productionSlope } from "../../src/models/growth-family.js";
import { projectLoop } from "../../src/sim/project.js";
import { closedLoop } from "../../src/policy/closed-loop.js";
import { expectClose, model, rule } from "../helpers.js";

// May, R. M. (1976). Simple mathematical models with very complicated dynamics.
// Nature 261: 459–467: for the discrete logistic and the Ricker map the fixed point K has
// slope 1 − r, so it is stable for 0 < r < 2 and period-doubles into a 2-cycle at r = 2.

const K = 1000;

/** Distinct values among the last `n` abundances of a long unharvested run, rounded. */
function attractor(family: string, r: number, n = 64): number[] {
  const loop = closedLoop(model(family, { r, K }), rule({ kind: "no-harvest" }));
  const p = projectLoop(loop, [0.3 * K], 20000);
  const tail = p.abundance.slice(-n).map((v) => Math.round(v * 1e4) / 1e4);
  return [...new Set(tail)].sort((a, b) => a - b);
}

for (const family of ["discrete-logistic", "ricker"]) {
  describe(`${family}: loss of stability at r = 2 (May 1976)`, () => {
    it("f'(K) = 1 − r, so |f'(K)| = 1 exactly at r = 2", () => {
      for (const r of [0.5, 1, 1.5, 1.99, 2, 2.01, 2.5]) {
        const m = model(family, { r, K });
        // Analytic values: exact to rounding, so 1e-14 relative.
        expectClose(productionSlope(m.growth, K, m.params), 1 - r, 1e-14, `f'(K) at r = ${r}`);
      }
    });

    it("iteration settles on K just below r = 2 and on a 2-cycle just above", () => {
      // r = 1.9: the slope −0.9 contracts by 0.9 a year, so 20,000 years reach K to rounding.
      expect(attractor(family, 1.9)).toEqual([K]);
      // r = 2.1: a stable 2-cycle straddling K (its points differ from K by O(√(r − 2))).
      const cycle = attractor(family, 2.1);
      expect(cycle.length).toBe(2);
      expect(cycle[0]!).toBeLessThan(K);
      expect(cycle[1]!).toBeGreaterThan(K);
    });
  });
}
