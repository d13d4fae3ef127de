import { describe, expect, it } from "vitest";
import { closedLoop } from "../../src/policy/closed-loop.js";
import { analyseStability } from "../../src/equilibria/stability.js";
import { stabilityMargin } from "../../src/equilibria/margin.js";
import { expectClose, model, rule, unwrap } from "../helpers.js";

// Schaefer (1954) logistic under constant catch Q (catch after reproduction): equilibria
// N± = K/2·(1 ± s), s = √(1 − 4Q/(rK)); f'(N) = 1 + r(1 − 2N/K) gives slope 1 + rs at N−
// (> 1: unstable, a fold) and 1 − rs at N+ (stable while rs < 2, period doubling beyond).

describe("Schaefer constant catch: fold and period doubling", () => {
  const K = 1000;
  it("r = 0.6, Q = 100: lower equilibrium unstable by a fold, upper stable (monotone)", () => {
    const a = analyseStability(
      closedLoop(model("discrete-logistic", { r: 0.6, K }), rule({ kind: "constant-catch", quota: 100 })),
    );
    const s = Math.sqrt(1 - (4 * 100) / (0.6 * K));
    const pos = a.equilibria.filter((e) => e.equilibrium.abundance > 0);
    expect(pos.length).toBe(2);
    expectClose(pos[0]!.equilibrium.abundance, (K / 2) * (1 - s), 1e-12, "N−");
    expectClose(pos[1]!.equilibrium.abundance, (K / 2) * (1 + s), 1e-12, "N+");
    expect(pos[0]!.verdict.kind).toBe("unstable-fold");
    expectClose(pos[0]!.verdict.dominant.re, 1 + 0.6 * s, 1e-9, "λ at N−");
    expect(pos[1]!.verdict.kind).toBe("stable-monotone");
    expectClose(pos[1]!.verdict.dominant.re, 1 - 0.6 * s, 1e-9, "λ at N+");
    expect(a.operating).toBe(a.equilibria.indexOf(pos[1]!));
  });

  it("r = 2.5: the upper equilibrium is stable while r·s < 2 (Q = 230) and period-doubles when r·s > 2 (Q = 220)", () => {
    // r·s = 2 at s = 0.8, i.e. Q = 0.09·r·K = 225.
    const upper = (Q: number) =>
      analyseStability(
        closedLoop(model("discrete-logistic", { r: 2.5, K }), rule({ kind: "constant-catch", quota: Q })),
      ).equilibria.at(-1)!;
    expect(upper(230).verdict.kind).toBe("stable-oscillating");
    expect(upper(220).verdict.kind).toBe("unstable-period-doubling");
    const m = unwrap(
      stabilityMargin(
        model("discrete-logistic", { r: 2.5, K }),
        rule({ kind: "constant-catch", quota: 230 }),
        "rule.quota",
      ),
    );
    expectClose(m.decrease.boundary!, 225, 1e-7, "quota where r·s = 2");
    expect(m.decrease.kind).toBe("unstable-period-doubling");
    // Raising the quota, the equilibrium vanishes at MSY = rK/4 = 625 (the fold).
    expectClose(m.increase.boundary!, 625, 1e-6, "quota at MSY");
    expect(m.increase.kind).toBe("equilibrium-lost");
  });

  it("a quota above the largest surplus leaves no positive equilibrium: the stock collapses", () => {
    const a = analyseStability(
      closedLoop(model("discrete-logistic", { r: 0.6, K }), rule({ kind: "constant-catch", quota: 151 })),
    );
    expect(a.noPositiveEquilibrium).toBe(true);
    expect(a.operating).toBeNull();
    expect(a.equilibria.map((e) => e.equilibrium.abundance)).toEqual([0]);
  });

  it("a quota exactly at MSY = rK/4 gives one marginal equilibrium at K/2", () => {
    const a = analyseStability(
      closedLoop(model("discrete-logistic", { r: 0.6, K }), rule({ kind: "constant-catch", quota: 150 })),
    );
    const pos = a.equilibria.filter((e) => e.equilibrium.abundance > 0);
    expect(pos.length).toBe(1);
    expectClose(pos[0]!.equilibrium.abundance, 500, 1e-6, "N at MSY");
    expect(pos[0]!.verdict.kind).toBe("marginal");
  });
});
