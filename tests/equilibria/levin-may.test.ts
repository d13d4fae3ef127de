import { describe, expect, it } from "vitest";
import { closedLoop } from "../../src/policy/closed-loop.js";
import { analyseStability } from "../../src/equilibria/stability.js";
import { stabilityMargin } from "../../src/equilibria/margin.js";
import { expectClose, model, rule, unwrap } from "../helpers.js";

// Levin, S. A. & May, R. M. (1976). A note on difference-delay equations. Theor. Popul.
// Biol. 9: 178–187: x[t+1] = x[t]·g(x[t−T]) with −x*g'(x*)/g(x*) = r (delayed Ricker and
// delayed logistic both have this r) is stable iff 0 < r < 2·cos(Tπ/(2T + 1)).
// T = 1: r_c = 2cos(π/3) = 1;  T = 2: r_c = 2cos(2π/5) = 0.6180339887… (the golden ratio − 1).

const critical = (T: number) => 2 * Math.cos((T * Math.PI) / (2 * T + 1));

function verdictAt(family: string, r: number, T: number): string {
  const a = analyseStability(closedLoop(model(family, { r, K: 1000 }, T), rule({ kind: "no-harvest" })));
  const atK = a.equilibria.find((e) => Math.abs(e.equilibrium.abundance - 1000) < 1e-6)!;
  return atK.verdict.kind;
}

describe("delayed growth: Levin & May (1976) stability boundary through the Jury test", () => {
  for (const family of ["ricker", "discrete-logistic"]) {
    for (const T of [1, 2]) {
      const rc = critical(T);
      it(`${family}, T = ${T}: stable at 0.99·r_c, unstable (growing oscillation) at 1.01·r_c, r_c = ${rc.toFixed(6)}`, () => {
        expect(verdictAt(family, 0.99 * rc, T)).toBe("stable-oscillating");
        expect(verdictAt(family, 1.01 * rc, T)).toBe("unstable-oscillating");
      });
      it(`${family}, T = ${T}: the stability margin in r finds r_c to 1e-7`, () => {
        const m = unwrap(
          stabilityMargin(
            model(family, { r: 0.5 * rc, K: 1000 }, T),
            rule({ kind: "no-harvest" }),
            "model.params.r",
          ),
        );
        // The boundary is where a Jury condition crosses the 1e-9 marginal band, so it sits
        // within ~1e-8 of r_c; 1e-7 leaves room for the bisection's last step.
        expectClose(m.increase.boundary!, rc, 1e-7, "boundary");
        expect(m.increase.kind).toBe("unstable-oscillating");
      });
    }
  }

  it("the delay itself has a margin: a Ricker with r = 0.8 is stable for T = 1 and loses it at T = 2", () => {
    // r_c(1) = 1 > 0.8 > r_c(2) = 0.618.
    const m = unwrap(
      stabilityMargin(model("ricker", { r: 0.8, K: 1000 }, 0), rule({ kind: "no-harvest" }), "model.delay"),
    );
    expect(m.increase.boundary).toBe(2);
    expect(m.increase.margin).toBe(2);
    expect(m.increase.kind).toBe("unstable-oscillating");
  });
});
