import { describe, expect, it } from "vitest";
import { closedLoop } from "../../src/policy/closed-loop.js";
import { msy } from "../../src/policy/msy.js";
import { projectLoop } from "../../src/sim/project.js";
import { expectClose, model, rule, unwrap } from "../helpers.js";

// Schaefer, M. B. (1954). Some aspects of the dynamics of populations important to the
// management of the commercial marine fisheries. Bull. Inter-Am. Trop. Tuna Comm. 1: 27–56.
// Logistic surplus rN(1 − N/K): MSY = rK/4 at N = K/2 with h = r/2; under a constant catch Q
// the equilibria are K/2·(1 ± √(1 − 4Q/(rK))), and there are none when Q > rK/4.

describe("Schaefer (1954) logistic yield", () => {
  it("MSY = rK/4 at N_MSY = K/2, h_MSY = r/2 (catch after reproduction)", () => {
    for (const [r, K] of [
      [0.4, 1000],
      [1.2, 5e4],
      [1.9, 80],
    ] as const) {
      const m = unwrap(msy(model("discrete-logistic", { r, K })));
      expectClose(m.msy, (r * K) / 4, 1e-14, "MSY");
      expectClose(m.nMsy, K / 2, 1e-14, "N_MSY");
      expectClose(m.hMsy, r / 2, 1e-14, "h_MSY");
      expect(m.method).toBe("closed form");
    }
  });

  it("constant-rate harvest at h_MSY settles at K/2 with catch rK/4", () => {
    const r = 0.8;
    const K = 1000;
    const p = projectLoop(
      closedLoop(model("discrete-logistic", { r, K }), rule({ kind: "constant-rate", rate: r / 2 })),
      [900],
      400,
    );
    expectClose(p.abundance.at(-1)!, K / 2, 1e-9, "N after 400 years");
    expectClose(p.catch.at(-1)!, (r * K) / 4, 1e-9, "catch after 400 years");
  });

  const r = 0.6;
  const K = 1000;
  for (const Q of [50, 100, 140]) {
    const root = Math.sqrt(1 - (4 * Q) / (r * K));
    const upper = (K / 2) * (1 + root);
    const lower = (K / 2) * (1 - root);
    it(`constant catch Q = ${Q}: both K/2·(1 ± √(1 − 4Q/(rK))) are fixed points`, () => {
      const loop = closedLoop(
        model("discrete-logistic", { r, K }),
        rule({ kind: "constant-catch", quota: Q }),
      );
      for (const e of [upper, lower]) {
        const x = loop.initialState([e]);
        loop.step(x, x);
        expectClose(x[0]!, e, 1e-12, `G(${e})`);
      }
    });
    it(`constant catch Q = ${Q}: starts above the lower equilibrium go to the upper one, starts below collapse`, () => {
      const loop = closedLoop(
        model("discrete-logistic", { r, K }),
        rule({ kind: "constant-catch", quota: Q }),
      );
      const above = projectLoop(loop, [lower * 1.05], 2000);
      expectClose(above.abundance.at(-1)!, upper, 1e-9, "long-run N from above the lower equilibrium");
      const below = projectLoop(loop, [lower * 0.95], 2000);
      expect(below.abundance.at(-1)).toBe(0);
      expect(below.extinctionYear).not.toBeNull();
    });
  }

  it("a quota above rK/4 drives the stock to zero from K", () => {
    const loop = closedLoop(
      model("discrete-logistic", { r, K }),
      rule({ kind: "constant-catch", quota: (r * K) / 4 + 1 }),
    );
    const p = projectLoop(loop, [K], 2000);
    expect(p.abundance.at(-1)).toBe(0);
  });
});
