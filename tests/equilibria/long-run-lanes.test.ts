import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { type LongRun, longRunBatch, longRunByOrbit } from "../../src/equilibria/long-run.js";
import type { ClosedLoop } from "../../src/policy/closed-loop.js";
import { GENERATED_K, loopArb, unit } from "./generated-loops.js";

// The batched lanes (burnInLanes, three one-number loops at a time) against the plain path
// (longRunByOrbit: the full state stepped one year at a time), on generated loops of every
// family and rule kind: the same regime, period and observed points, point by point and in
// order, so a lane that rotates a cycle's points or skips a year fails. Property: common
// practice, no source (the plain path is the reference, not the fast path itself).
const K = GENERATED_K;

function expectSameRun(fast: LongRun, plain: LongRun, what: string): void {
  expect(fast.regime, what).toBe(plain.regime);
  expect(fast.period, what).toBe(plain.period);
  expect(fast.towards, what).toBe(plain.towards);
  expect(fast.points.length, what).toBe(plain.points.length);
  // The two paths step the same arithmetic (loop.next and loop.step agree to rounding): a
  // point may differ by a few ulps after a thousand years of iteration, never by a step.
  fast.points.forEach((p, i) => {
    const q = plain.points[i]!;
    expect(Math.abs(p - q), `${what}, point ${i}: ${p} against ${q}`).toBeLessThanOrEqual(1e-9 * K);
  });
  for (const key of ["min", "max", "mean"] as const)
    expect(Math.abs(fast[key] - plain[key]), `${what}, ${key}`).toBeLessThanOrEqual(1e-9 * K);
}

describe("the long-run lanes against the plain orbit", () => {
  it("give the plain path's regime, period and points for every generated one-number loop", () => {
    const seen = new Map<string, number>();
    fc.assert(
      fc.property(
        fc.array(loopArb, { minLength: 1, maxLength: 7 }),
        fc.integer({ min: 0, max: 1500 }),
        fc.integer({ min: 8, max: 80 }),
        unit.map((v) => 0.05 + 1.5 * v),
        (loops: ClosedLoop[], burnIn, observe, x0) => {
          const start = new Float64Array([x0 * K]);
          const options = { burnIn, observe };
          const fast = longRunBatch(loops, start, options);
          loops.forEach((loop, i) => {
            const plain = longRunByOrbit(loop, loop.initialState([x0 * K]), options);
            const key = plain.regime === "cycle" ? `cycle ${plain.period}` : plain.regime;
            seen.set(key, (seen.get(key) ?? 0) + 1);
            expectSameRun(fast[i]!, plain, `${loop.model.family} under ${loop.rule.kind}, burn-in ${burnIn}`);
          });
        },
      ),
      { numRuns: 400, seed: 20261202 },
    );
    // The generator reaches the cases that matter: equilibria, extinction, cycles longer than
    // two years (where a rotated phase would show) and irregular orbits.
    const cycles = [...seen.keys()].filter((k) => k.startsWith("cycle ") && Number(k.slice(6)) > 2);
    expect(seen.get("equilibrium") ?? 0).toBeGreaterThan(20);
    expect(seen.get("extinct") ?? 0).toBeGreaterThan(5);
    expect(cycles.length).toBeGreaterThan(0);
    expect(seen.get("cycle 2") ?? 0).toBeGreaterThan(20);
    expect(seen.get("irregular") ?? 0).toBeGreaterThan(5);
  });
});
