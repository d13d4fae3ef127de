import { readFileSync } from "node:fs";
import { xoroshiro128plus } from "pure-rand/generator/xoroshiro128plus";
import { describe, expect, it } from "vitest";
import { zigguratNormal } from "../../src/sim/ziggurat.js";

// The standard normal CDF at fixed points from scipy.stats.norm
// (tests/fixtures/stochastic/make_stochastic_fixtures.py), against the empirical CDF of
// two million ziggurat draws, within 5 binomial standard errors; 3.44 is where the
// ziggurat's tail method takes over (Marsaglia & Tsang 2000).
const ref = JSON.parse(
  readFileSync(new URL("../fixtures/stochastic/normal.json", import.meta.url), "utf8"),
) as { x: number[]; cdf: number[] };

describe("ziggurat standard normal deviates", () => {
  const n = 2_000_000;
  const g = xoroshiro128plus(20261202);
  const below = new Array<number>(ref.x.length).fill(0);
  let s1 = 0;
  let s2 = 0;
  let s4 = 0;
  for (let k = 0; k < n; k++) {
    const z = zigguratNormal(g);
    s1 += z;
    s2 += z * z;
    s4 += z * z * z * z;
    for (let i = 0; i < ref.x.length; i++) if (z < ref.x[i]!) below[i]!++;
  }
  it("match the normal CDF, tails included", () => {
    ref.x.forEach((x, i) => {
      const p = ref.cdf[i]!;
      const se = Math.sqrt((p * (1 - p)) / n);
      expect(Math.abs(below[i]! / n - p), `F(${x})`).toBeLessThan(5 * se + 1 / n);
    });
  });
  it("have mean 0, variance 1 and kurtosis 3 (within 5 standard errors)", () => {
    expect(Math.abs(s1 / n)).toBeLessThan(5 * Math.sqrt(1 / n));
    expect(Math.abs(s2 / n - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
    expect(Math.abs(s4 / n - 3)).toBeLessThan(5 * Math.sqrt(96 / n));
  });
});
