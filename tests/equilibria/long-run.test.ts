import { describe, expect, it } from "vitest";
import { closedLoop } from "../../src/policy/closed-loop.js";
import { longRun, longRunBatch } from "../../src/equilibria/long-run.js";
import { model, rule } from "../helpers.js";

const loopOf = (
  family: string,
  params: Record<string, number>,
  spec: object = { kind: "no-harvest" },
  delay = 0,
) => closedLoop(model(family, params, delay), rule(spec as never));

describe("long-run regimes by iteration", () => {
  it("Ricker r = 3 is irregular with a positive Lyapunov exponent (chaos, May 1976)", () => {
    const loop = loopOf("ricker", { r: 3, K: 1000 });
    const run = longRun(loop, loop.initialState([300]));
    expect(run.regime).toBe("irregular");
    expect(run.lyapunov!).toBeGreaterThan(0.1);
  });

  it("a slow creep towards an equilibrium is a transient, not irregular (logistic r = 0.001)", () => {
    // Slope 1 − r = 0.999 at K: after 1,000 years only e^(−1) of the gap has closed.
    const loop = loopOf("discrete-logistic", { r: 0.001, K: 1000 });
    const run = longRun(loop, loop.initialState([100]));
    expect(run.regime).toBe("transient");
    expect(run.towards).toBe("equilibrium");
  });

  it("a stock creeping to extinction below an Allee threshold is a transient towards extinction", () => {
    // r = 0.002: per-capita decline ≈ r·(1 − N/A) a year, so 1,128 years do not reach 1e-9·K.
    const loop = loopOf("allee-ricker", { r: 0.002, K: 1000, A: 500 });
    const run = longRun(loop, loop.initialState([480]));
    expect(run.regime).toBe("transient");
    expect(run.towards).toBe("extinction");
  });

  it("a slowly damped oscillation is a transient (delayed Ricker just inside r_c = 1)", () => {
    const loop = loopOf("ricker", { r: 0.998, K: 1000 }, { kind: "no-harvest" }, 1);
    const run = longRun(loop, loop.initialState([600]), { burnIn: 200 });
    expect(run.regime).toBe("transient");
    expect(run.regime).not.toBe("irregular");
  });

  it("just outside r_c the delayed Ricker settles on a quasi-periodic orbit (Neimark–Sacker), not chaos", () => {
    const loop = loopOf("ricker", { r: 1.05, K: 1000 }, { kind: "no-harvest" }, 1);
    const run = longRun(loop, loop.initialState([600]), { burnIn: 5000 });
    expect(["quasi-periodic", "cycle"]).toContain(run.regime);
  });

  it("extinction, equilibrium and a 2-cycle are recognised, and an exploding run is unbounded", () => {
    const dead = loopOf("ricker", { r: 1, K: 1000 }, { kind: "constant-catch", quota: 2000 });
    expect(longRun(dead, dead.initialState([500])).regime).toBe("extinct");
    const eq = loopOf("beverton-holt", { R0: 3, K: 1000 });
    expect(longRun(eq, eq.initialState([10])).regime).toBe("equilibrium");
    const two = loopOf("ricker", { r: 2.2, K: 1000 });
    expect(longRun(two, two.initialState([300]))).toMatchObject({ regime: "cycle", period: 2 });
    const boom = loopOf("gompertz", { r: 2.9, K: 100 });
    expect(longRun(boom, boom.initialState([50])).regime).toBe("unbounded");
  });

  it("the batched orbit gives the same result as longRun, cell by cell", () => {
    const loops = [0.3, 1.2, 1.9, 2.1, 2.6, 2.9, 3.5].flatMap((r) =>
      [0, 0.2, 0.6].map((h) => loopOf("ricker", { r, K: 1000 }, { kind: "constant-rate", rate: h })),
    );
    const start = Float64Array.of(500);
    const batch = longRunBatch(loops, start);
    loops.forEach((l, i) => expect(batch[i]).toEqual(longRun(l, start)));
  });
});
