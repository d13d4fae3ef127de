import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { equilibriumResidual, steadyState } from "../../src/equilibria/steady-state.js";
import { parseScenario } from "../../src/sim/scenario.js";
import { unwrap } from "../helpers.js";

// The shortcut in equilibriumResidual (a steady state makes the survey lag, the delay and the
// quota caps drop out) against its definition φ(N) = G(x*(N))[0] − N through the full
// state-vector step. An identity of the closed-loop map; no external source.
describe("equilibrium residual", () => {
  const cases = [
    {
      model: { family: "ricker", params: { r: 1.5, K: 1000 }, delay: 2 },
      rule: { kind: "threshold", lowerTrigger: 200, upperTrigger: 500, maxRate: 0.3, surveyLag: 1 },
    },
    {
      model: { family: "beverton-holt", params: { R0: 3, K: 800 }, delay: 1 },
      rule: {
        kind: "constant-catch",
        quota: 90,
        timing: "before",
        quotaChange: { maxIncrease: 0.1, maxDecrease: 0.2 },
      },
    },
    {
      model: { family: "allee-ricker", params: { r: 0.8, K: 1000, A: 150 }, delay: 0 },
      rule: { kind: "constant-escapement", escapement: 300, surveyLag: 2, stocking: 20 },
    },
    {
      model: { family: "theta-logistic", params: { r: 1.1, K: 500, theta: 2 }, delay: 3 },
      rule: { kind: "constant-rate", rate: 0.2, timing: "before", surveyLag: 1 },
    },
  ];
  for (const c of cases) {
    it(`${c.model.family}, delay ${c.model.delay}, ${c.rule.kind}: the one-number shortcut equals the full step to the last bit`, () => {
      const sc = unwrap(parseScenario({ ...c, start: 100, horizon: 5 }));
      expect(sc.loop.layout.dimension).toBeGreaterThan(1);
      const phi = equilibriumResidual(sc.loop);
      const y = new Float64Array(sc.loop.layout.dimension);
      fc.assert(
        fc.property(fc.double({ min: 0, max: 3 * sc.model.params.K!, noNaN: true }), (n) => {
          sc.loop.step(steadyState(sc.loop, n), y);
          expect(phi(n)).toBe(y[0]! - n);
        }),
        { numRuns: 500 },
      );
    });
  }
});
