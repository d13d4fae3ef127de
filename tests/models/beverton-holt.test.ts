import { describe, expect, it } from "vitest";
import { productionSlope } from "../../src/models/growth-family.js";
import { closedLoop } from "../../src/policy/closed-loop.js";
import { projectLoop } from "../../src/sim/project.js";
import { expectClose, model, rule } from "../helpers.js";

// Beverton, R. J. H. & Holt, S. J. (1957). On the Dynamics of Exploited Fish Populations.
// The map N' = R0·N/(1 + (R0 − 1)N/K) has the closed-form solution
//   N_t = K·N0 / (N0 + (K − N0)·R0^(−t))
// and slope 1/R0 at K.

describe("Beverton–Holt (Beverton & Holt 1957)", () => {
  const cases = [
    { R0: 1.5, K: 1000, N0: 10 },
    { R0: 3, K: 250, N0: 900 },
    { R0: 40, K: 5e5, N0: 1 },
  ];
  for (const { R0, K, N0 } of cases) {
    it(`projection equals the closed form for R0 = ${R0}, K = ${K}, N0 = ${N0}`, () => {
      const p = projectLoop(
        closedLoop(model("beverton-holt", { R0, K }), rule({ kind: "no-harvest" })),
        [N0],
        60,
      );
      expect(p.status).toBe("completed");
      for (let t = 0; t <= 60; t++) {
        const exact = (K * N0) / (N0 + (K - N0) * Math.pow(R0, -t));
        // Each step rounds once and the map contracts errors, so 1e-12 relative is ample.
        expectClose(p.abundance[t]! / K, exact / K, 1e-12, `N_${t}`);
      }
    });

    it(`f'(K) = 1/R0 for R0 = ${R0}`, () => {
      const m = model("beverton-holt", { R0, K });
      expectClose(productionSlope(m.growth, K, m.params), 1 / R0, 1e-14, "f'(K)");
    });
  }
});
