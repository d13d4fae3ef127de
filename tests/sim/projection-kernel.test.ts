import { describe, expect, it } from "vitest";
import { closedLoop } from "../../src/policy/closed-loop.js";
import { parseScenario } from "../../src/sim/scenario.js";
import { parseUncertainty } from "../../src/sim/uncertainty.js";
import type { ProjectionParts } from "../../src/sim/projection-parts.js";
import { projectionBlocks, simulateBlocks } from "../../src/sim/simulate-blocks.js";
import { kernelApplies } from "../../src/sim/kernel-blocks.js";
import { unwrap } from "../helpers.js";

// The WebAssembly kernel against the TypeScript loop it was written from (the reference is
// this project's own, so this checks the translation, not the science; the science of the
// shared engine is checked against theory, scipy and numpy in stochastic-theory.test.ts).
// Same random stream, same operations: every count must agree exactly and every sum to
// rounding, since only exp, log and pow come from another library (AssemblyScript's port of
// musl against V8's of fdlibm). The parameters keep each map away from chaos, where a
// one-ulp difference would grow.
const families = [
  { family: "ricker", params: { r: 1.2, K: 1000 } },
  { family: "beverton-holt", params: { R0: 3, K: 1000 } },
  { family: "discrete-logistic", params: { r: 1.5, K: 1000 } },
  { family: "gompertz", params: { r: 0.5, K: 1000 } },
  { family: "allee-ricker", params: { r: 0.2, K: 1000, A: 100 } },
  { family: "hassell", params: { R0: 3, K: 1000, beta: 2 } },
  { family: "shepherd", params: { R0: 3, K: 1000, delta: 2 } },
  { family: "theta-logistic", params: { r: 1.2, K: 1000, theta: 1.5 } },
];
const rules = [
  { kind: "threshold", lowerTrigger: 200, upperTrigger: 500, maxRate: 0.3 },
  { kind: "constant-rate", rate: 0.25, timing: "before" },
  { kind: "constant-catch", quota: 120, stocking: 15 },
  { kind: "constant-escapement", escapement: 450, timing: "before" },
  { kind: "no-harvest" },
];
const noise = {
  replicates: 1500,
  seed: 11,
  processSd: 0.3,
  processAutocorrelation: 0.4,
  observationSd: 0.2,
  implementationSd: 0.1,
};

function both(spec: object, u: object): [ProjectionParts, ProjectionParts] {
  const sc = unwrap(parseScenario(spec));
  const unc = unwrap(parseUncertainty(u, sc.model));
  const nb = projectionBlocks(unc);
  return [
    simulateBlocks(sc, unc, 0, nb, sc.rule, "auto"),
    simulateBlocks(sc, unc, 0, nb, sc.rule, "typescript"),
  ];
}

function expectAgree(wasm: ProjectionParts, ts: ProjectionParts): void {
  expect(Array.from(wasm.abundanceCounts)).toEqual(Array.from(ts.abundanceCounts));
  expect(Array.from(wasm.catchCounts)).toEqual(Array.from(ts.catchCounts));
  expect(Array.from(wasm.belowLimitByYear)).toEqual(Array.from(ts.belowLimitByYear));
  expect(Array.from(wasm.recoveryByYear)).toEqual(Array.from(ts.recoveryByYear));
  expect([wasm.everBelowLimit, wasm.everQuasiExtinct, wasm.zeroCatchYears, wasm.unbounded]).toEqual([
    ts.everBelowLimit,
    ts.everQuasiExtinct,
    ts.zeroCatchYears,
    ts.unbounded,
  ]);
  expect(Array.from(wasm.aavCounts)).toEqual(Array.from(ts.aavCounts));
  const close = (a: ArrayLike<number>, b: ArrayLike<number>) => {
    expect(a.length).toBe(b.length);
    for (let i = 0; i < a.length; i++)
      expect(Math.abs(a[i]! - b[i]!)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(b[i]!)));
  };
  close(wasm.catchTotals, ts.catchTotals);
  close(wasm.aavSums, ts.aavSums);
  close(wasm.abundanceRange, ts.abundanceRange);
  close(wasm.catchRange, ts.catchRange);
  close(wasm.abundancePositiveMin, ts.abundancePositiveMin);
  close(wasm.catchPositiveMin, ts.catchPositiveMin);
}

describe("WebAssembly projection kernel", () => {
  for (const model of families) {
    for (const rule of rules) {
      it(`${model.family} under ${rule.kind}${rule.timing ? ` (${rule.timing})` : ""}: the same counts, sums to rounding`, () => {
        const [wasm, ts] = both({ model, rule, start: 600, horizon: 30 }, noise);
        expectAgree(wasm, ts);
        // The runs are not trivial: the last year's abundances spread over many bins.
        expect(
          Array.from(ts.abundanceCounts.subarray((30 * ts.abundanceCounts.length) / 31)).filter((c) => c > 0)
            .length,
        ).toBeGreaterThan(50);
      });
    }
  }

  it("parameter sets drawn per replicate, and a collapse to zero, agree too", () => {
    const spec = {
      model: { family: "ricker", params: { r: 1.2, K: 1000 } },
      rule: { kind: "threshold", lowerTrigger: 200, upperTrigger: 500, maxRate: 0.3 },
      start: 600,
      horizon: 50,
    };
    const draws = [
      { r: 0.9, K: 800 },
      { r: 1.4, K: 1100 },
      { r: 1.1, K: 950 },
    ];
    const [wasm, ts] = both(spec, { replicates: 3000, seed: 5, processSd: 0.4, parameters: { draws } });
    expectAgree(wasm, ts);
    const [w2, t2] = both(spec, { replicates: 3000, seed: 5, processSd: 0.4 });
    expectAgree(w2, t2);
    expect(t2.zeroCatchYears).toBeGreaterThan(0); // the issue's benchmark scenario: many replicates end at zero
  });

  it("odd block sizes (the kernel takes replicates in pairs and runs the last one twice) agree too", () => {
    const spec = { model: families[0], rule: rules[0], start: 600, horizon: 30 };
    for (const replicates of [1501, 11]) {
      const [wasm, ts] = both(spec, { ...noise, replicates });
      expectAgree(wasm, ts);
      // Every replicate counted once each year: the histograms hold exactly `replicates` per year.
      expect(
        wasm.abundanceCounts.subarray(0, wasm.abundanceCounts.length / 31).reduce((s, c) => s + c, 0),
      ).toBe(replicates);
      expect(wasm.catchCounts.subarray(29 * (wasm.catchCounts.length / 30)).reduce((s, c) => s + c, 0)).toBe(
        replicates,
      );
    }
  });

  it("a run split into pieces equals the run in one piece", () => {
    const sc = unwrap(parseScenario({ model: families[0], rule: rules[0], start: 600, horizon: 20 }));
    const unc = unwrap(parseUncertainty(noise, sc.model));
    const whole = simulateBlocks(sc, unc, 0, 3);
    const a = simulateBlocks(sc, unc, 0, 1);
    const b = simulateBlocks(sc, unc, 1, 3);
    const sum = whole.abundanceCounts.map((_, i) => a.abundanceCounts[i]! + b.abundanceCounts[i]!);
    expect(Array.from(sum)).toEqual(Array.from(whole.abundanceCounts));
    expect([...a.catchTotals, ...b.catchTotals]).toEqual([...whole.catchTotals]);
    // The kernel leaves its histograms zero for the next run of the same layout: a second run
    // of the same blocks is identical, and so are its group sums.
    const again = simulateBlocks(sc, unc, 1, 3);
    expect(Array.from(again.abundanceCounts)).toEqual(Array.from(b.abundanceCounts));
    expect(Array.from(again.catchGroups)).toEqual(Array.from(b.catchGroups));
  });

  it("is used only where it applies: a one-number state of a family it knows", () => {
    const m = unwrap(parseScenario({ model: families[0], rule: rules[0], start: 600, horizon: 5 }));
    expect(kernelApplies(m.loop)).toBe(true);
    const lagged = unwrap(
      parseScenario({ model: families[0], rule: { ...rules[0], surveyLag: 1 }, start: 600, horizon: 5 }),
    );
    expect(kernelApplies(lagged.loop)).toBe(false);
    expect(kernelApplies(closedLoop({ ...m.model, delay: 1 }, m.rule))).toBe(false);
  });
});
