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
 * outside bin 0 and the span of its smallest and largest positive value: the sums and scans
 * below need only those bins.
 */
export function positiveSpan(lo: number, hi: number, scale: number): [number, number] {
  return lo <= hi && lo > 0 ? [binOf(lo, scale), binOf(hi, scale)] : [1, 0];
}

/**
 * Percentiles (in %, increasing) of the values counted in
 * `counts[offset … offset + HISTOGRAM_BINS)`, in the abundance unit (times `K`), read in
 * one pass over bin 0 (the zeros) and the bins of `span` (all others unless given; every
 * count must lie in those). An empty histogram gives zeros.
 */
export function histogramPercentiles(counts: Uint32Array, offset: number, levels: readonly number[], K: number, span: readonly [number, number] = [1, HISTOGRAM_BINS - 1]): number[] {
  const from = Math.max(1, span[0]);
  const to = span[1];
  let total = counts[offset]!;
  for (let i = from; i <= to; i++) total += counts[offset + i]!;
  const out = levels.map(() => 0);
  if (total === 0) return out;
  let cum = 0;
  let l = 0;
  const visit = (bin: number) => {
    const c = counts[offset + bin]!;
    if (c === 0) return;
    while (l < levels.length && cum + c >= (levels[l]! / 100) * total) {
      out[l] = valueInBin(bin, (levels[l]! / 100) * total - cum, c) * K;
      l++;
    }
    cum += c;
  };
  visit(0);
  for (let i = from; i <= to && l < levels.length; i++) visit(i);
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
