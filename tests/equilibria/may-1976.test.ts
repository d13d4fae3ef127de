import { describe, expect, it } from "vitest";
import { closedLoop } from "../../src/policy/closed-loop.js";
import { analyseStability } from "../../src/equilibria/stability.js";
import { longRun } from "../../src/equilibria/long-run.js";
import { bifurcationDiagram } from "../../src/equilibria/bifurcation.js";
import { model, rule, unwrap } from "../helpers.js";

// May, R. M. (1976). Nature 261: 459–467. Discrete logistic and Ricker: the equilibrium
// period-doubles at r = 2. For the logistic map x' = a·x(1 − x) the 4-cycle is born at
// a = 1 + √6, i.e. r = a − 1 = √6 ≈ 2.449 here. For the Ricker map the 4-cycle is born
// near r ≈ 2.526 (value from memory, as quoted in the issue).

function period(family: string, r: number): number | null {
  const loop = closedLoop(model(family, { r, K: 1000 }), rule({ kind: "no-harvest" }));
  // 20,000 burn-in years: near a period-doubling the approach to the new cycle is slow.
  const run = longRun(loop, loop.initialState([300]), { burnIn: 20000, observe: 128 });
  return run.regime === "equilibrium" ? 1 : run.period;
}

describe("May (1976): the route to cycles", () => {
  for (const family of ["discrete-logistic", "ricker"]) {
    it(`${family}: K is stable (damped oscillation) at r = 1.99 and unstable by period doubling at r = 2.01`, () => {
      const at = (r: number) =>
        analyseStability(
          closedLoop(model(family, { r, K: 1000 }), rule({ kind: "no-harvest" })),
        ).equilibria.at(-1)!.verdict.kind;
      expect(at(1.99)).toBe("stable-oscillating");
      expect(at(2.01)).toBe("unstable-period-doubling");
    });
  }

  it("discrete logistic: a 2-cycle just below r = √6 and a 4-cycle just above", () => {
    expect(period("discrete-logistic", Math.sqrt(6) - 0.01)).toBe(2);
    expect(period("discrete-logistic", Math.sqrt(6) + 0.01)).toBe(4);
  });

  it("Ricker: a 2-cycle at r = 2.50 and a 4-cycle at r = 2.55 (4-cycle born near 2.526)", () => {
    expect(period("ricker", 2.5)).toBe(2);
    expect(period("ricker", 2.55)).toBe(4);
  });

  it("the bifurcation diagram shows 1, 2 and 4 points and the Jury boundary at r = 2", () => {
    const d = unwrap(
      bifurcationDiagram(
        model("ricker", { r: 1, K: 1000 }),
        rule({ kind: "no-harvest" }),
        { path: "model.params.r", from: 1.5, to: 2.6, count: 11 },
        { burnIn: 5000 },
      ),
    );
    expect(d.points[0]!.length).toBe(1); // r = 1.5
    expect(d.points[6]!.length).toBe(2); // r = 2.16
    expect(d.points[10]!.length).toBe(4); // r = 2.6 (values 1.5 + 0.11·i miss r = 2 itself)
    expect(d.boundaries.length).toBe(1);
    expect(Math.abs(d.boundaries[0]!.value - 2)).toBeLessThan(1e-6);
    expect(d.boundaries[0]).toMatchObject({ from: "stable", to: "unstable" });
  });
});
