import { describe, expect, it } from "vitest";
import {
  addGroupSums,
  binOf,
  HISTOGRAM_BINS,
  HISTOGRAM_GROUPS,
  histogramPercentiles,
  positiveSpan,
} from "../../src/sim/quantile-histogram.js";
import { seededUniform } from "../../src/sim/rng.js";

// The grouped percentile reader against the sample's own order statistics: the empirical
// p-quantile (the value at rank ⌈p·n⌉ of the sorted sample, Hyndman & Fan (1996) definition 1,
// Am. Stat. 50: 361–365, from memory) lies within one bin (2^(1/256), 0.27%) of the
// histogram's reading. Zeros are counted apart and must be read back exactly.
describe("quantile histogram", () => {
  it("reads percentiles within one bin of the order statistics, zeros exactly", () => {
    const u = seededUniform(3);
    const K = 1000;
    const values: number[] = [];
    for (let i = 0; i < 20_000; i++)
      values.push(u() < 0.3 ? 0 : K * Math.exp(4 * (u() - 0.5)) * (u() < 0.1 ? 1e-6 : 1));
    const counts = new Uint32Array(HISTOGRAM_BINS);
    for (const v of values) counts[binOf(v, 1 / K)]!++;
    const positive = values.filter((v) => v > 0);
    const groups = new Uint32Array(HISTOGRAM_GROUPS);
    addGroupSums(counts, groups, 1, () => positiveSpan(Math.min(...positive), Math.max(...positive), 1 / K));
    expect(groups.reduce((s, c) => s + c, 0)).toBe(values.length);
    const levels = [5, 10, 25, 50, 75, 90, 95];
    const got = histogramPercentiles(
      (g) => groups[g]!,
      (i) => counts[i]!,
      levels,
      K,
    );
    const sorted = [...values].sort((a, b) => a - b);
    levels.forEach((p, i) => {
      const exact = sorted[Math.ceil((p / 100) * sorted.length) - 1]!;
      if (exact === 0) expect(got[i]).toBe(0);
      else expect(Math.abs(Math.log(got[i]! / exact))).toBeLessThan(Math.log(2) / 256 + 1e-12);
    });
    expect(got[0]).toBe(0); // 30% zeros: the 5th, 10th and 25th percentiles are exactly zero
    expect(got[3]).toBeGreaterThan(0);
  });
});
