/**
 * Percentiles of millions of simulated values in fixed memory: a histogram on a
 * logarithmic grid whose bins are read straight off the bits of the double.
 *
 * A value v > 0 is scaled to s = v/K and binned by the top 20 bits of its IEEE 754 binary64
 * pattern's upper word beyond the sign, shifted to keep the exponent and the top 8 mantissa
 * bits: 256 bins per octave, each 2^(1/256)-wide at most (0.27% of the value; 0.14% either side of its centre), over the 64
 * octaves s ∈ [2^−40, 2^24). Values below 2^−40·K share the lowest bin and exact zeros a
 * bin of their own (so "zero catch" is counted exactly). Counting is exact and
 * order-independent, so histograms from different workers add up to the same result.
 * A percentile is read by linear interpolation within the bin where the cumulative count
 * crosses p·n (the usual grouped-data estimate); its error from the binning is below the
 * bin width, small against the Monte Carlo error of any run below 10⁷ replicates.
 * Source (IEEE 754 layout): IEEE Std 754-2019, §3.4; grouped-data percentile:
 * Kendall, M. G. & Stuart, A. The Advanced Theory of Statistics, vol. 1, §2.14 (from memory).
 */
export const BINS_PER_OCTAVE = 256;
export const LOWEST_OCTAVE = -40;
export const OCTAVES = 64;
/** Bin 0 holds exact zeros, bin 1 values below the grid, the last bin values above it. */
export const HISTOGRAM_BINS = OCTAVES * BINS_PER_OCTAVE + 3;
const BASE = (1023 + LOWEST_OCTAVE) * BINS_PER_OCTAVE;
const LAST = HISTOGRAM_BINS - 1;

const f64 = new Float64Array(1);
const u32 = new Uint32Array(f64.buffer);
const HIGH = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 1 : 0; // little-endian: high word second

/** The bin of v ≥ 0, with scale = 1/K. */
export function binOf(v: number, scale: number): number {
  if (v === 0) return 0;
  f64[0] = v * scale;
  const i = (u32[HIGH]! >>> 12) - BASE + 2;
  return i < 2 ? 1 : i > LAST ? LAST : i;
}

/** The lower edge of bin i (i ≥ 2) in units of K. */
function lowerEdge(i: number): number {
  const k = i - 2;
  const octave = Math.floor(k / BINS_PER_OCTAVE) + LOWEST_OCTAVE;
  const frac = k % BINS_PER_OCTAVE;
  return Math.pow(2, octave) * (1 + frac / BINS_PER_OCTAVE);
}

/**
 * The bins [first, last] of the positive values in [lo, hi] (first > last when lo > hi:
 * none). binOf is increasing and sends only 0 to bin 0, so a year's histogram is zero
 * outside bin 0 and the span of its smallest and largest positive value: the sums below need
 * only those bins.
 */
export function positiveSpan(lo: number, hi: number, scale: number): [number, number] {
  return lo <= hi && lo > 0 ? [binOf(lo, scale), binOf(hi, scale)] : [1, 0];
}

/** Bins per group: a histogram's counts are also summed per group of this many consecutive bins. */
export const GROUP_BINS = 256;
/** Groups per histogram (the last one partly filled). */
export const HISTOGRAM_GROUPS = Math.ceil(HISTOGRAM_BINS / GROUP_BINS);

/**
 * Adds the group sums of `years` consecutive histograms in `counts` into `groups`
 * (HISTOGRAM_GROUPS per year), reading only bin 0 and each year's `spans[t]` (every count
 * must lie in those).
 */
export function addGroupSums(
  counts: Uint32Array,
  groups: Uint32Array,
  years: number,
  spans: (t: number) => readonly [number, number],
): void {
  for (let t = 0; t < years; t++) {
    const off = t * HISTOGRAM_BINS;
    const g0 = t * HISTOGRAM_GROUPS;
    groups[g0]! += counts[off]!;
    const [from, to] = spans(t);
    for (let i = Math.max(1, from); i <= to; i++) groups[g0 + ((i / GROUP_BINS) | 0)]! += counts[off + i]!;
  }
}

/**
 * Percentiles (in %, increasing) of the values in a histogram given by its group sums
 * `group(g)` (g < HISTOGRAM_GROUPS) and its bin counts `bin(i)`, in the abundance unit
 * (times `K`): the groups are summed first, and only the bins of a group where the
 * cumulative count crosses a level are read, in bin order (values are increasing in the bin
 * index, with exact zeros in bin 0). An empty histogram gives zeros.
 */
export function histogramPercentiles(
  group: (g: number) => number,
  bin: (i: number) => number,
  levels: readonly number[],
  K: number,
): number[] {
  const sums = new Float64Array(HISTOGRAM_GROUPS);
  let total = 0;
  for (let g = 0; g < HISTOGRAM_GROUPS; g++) total += sums[g] = group(g);
  const out = levels.map(() => 0);
  if (total === 0) return out;
  let cum = 0;
  let l = 0;
  for (let g = 0; g < HISTOGRAM_GROUPS && l < levels.length; g++) {
    const gc = sums[g]!;
    if (gc === 0) continue;
    if (cum + gc < (levels[l]! / 100) * total) {
      cum += gc;
      continue;
    }
    const end = Math.min(HISTOGRAM_BINS, (g + 1) * GROUP_BINS);
    for (let i = g * GROUP_BINS; i < end && l < levels.length; i++) {
      const c = bin(i);
      if (c === 0) continue;
      while (l < levels.length && cum + c >= (levels[l]! / 100) * total) {
        out[l] = valueInBin(i, (levels[l]! / 100) * total - cum, c) * K;
        l++;
      }
      cum += c;
    }
  }
  for (; l < levels.length; l++) out[l] = lowerEdge(LAST);
  return out;
}

/** The value (in units of K) a fraction `into/c` of the way through bin i. */
function valueInBin(i: number, into: number, c: number): number {
  if (i === 0) return 0;
  if (i === 1) return lowerEdge(2);
  if (i === LAST) return lowerEdge(LAST);
  const lo = lowerEdge(i);
  return lo + (Math.max(0, into) / c) * (lowerEdge(i + 1) - lo);
}
