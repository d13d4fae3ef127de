import { HISTOGRAM_BINS, HISTOGRAM_GROUPS, histogramPercentiles } from "./quantile-histogram.js";
import type { Scenario } from "./scenario.js";
import type { ProjectionParts } from "./projection-parts.js";
import type { Uncertainty } from "./uncertainty.js";

/** The percentiles reported per year, in %. */
export const PERCENTILE_LEVELS = [5, 10, 25, 50, 75, 90, 95] as const;

/** A probability estimated from replicates, with its binomial standard error √(p(1 − p)/n). */
export interface Estimate {
  readonly probability: number;
  readonly standardError: number;
}

/** Risk and yield metrics of a stochastic projection. */
export interface RiskMetrics {
  /** The thresholds used, in the abundance unit. */
  readonly limit: number;
  readonly quasiExtinctionThreshold: number;
  readonly recoveryTarget: number;
  /** P(N < limit in at least one projected year). */
  readonly belowLimit: Estimate;
  /** P(N[t] < limit), per year t = 0 … horizon. */
  readonly belowLimitByYear: number[];
  /** P(N < quasi-extinction threshold in at least one projected year). */
  readonly quasiExtinction: Estimate;
  /** P(N reaches the recovery target by the last year), with the years it took among those that did. */
  readonly recovery: Estimate & { readonly medianYears: number | null; readonly meanYears: number | null };
  /** Mean of all annual catches (replicates × years). */
  readonly meanCatch: number;
  /** Median of all annual catches (replicates × years). */
  readonly medianCatch: number;
  /** Mean over replicates of Σ|C[t] − C[t−1]| / ΣC[t] (replicates with some catch), or null if none caught anything. */
  readonly averageAnnualVariation: number | null;
  /** Fraction of replicate-years with zero catch. */
  readonly zeroCatchFraction: number;
}

/** A stochastic projection summarised: per-year percentiles and the risk metrics. */
export interface StochasticProjection {
  readonly replicates: number;
  readonly seed: number;
  /** Years of the abundance columns: startYear … startYear + horizon. */
  readonly years: number[];
  readonly levels: readonly number[];
  /** abundance[i][t]: the levels[i] percentile of N in year t (horizon + 1 entries). */
  readonly abundance: number[][];
  /** catch[i][t]: the levels[i] percentile of the catch in year t (horizon entries). */
  readonly catch: number[][];
  readonly risk: RiskMetrics;
  /** Replicates whose abundance left all bounds and was clipped at 10⁶·K. */
  readonly unboundedReplicates: number;
}

/** Checks that parts cover blocks 0 … n contiguously, and returns them in block order. */
function inBlockOrder(list: readonly ProjectionParts[]): ProjectionParts[] {
  const sorted = [...list].sort((a, b) => a.blocks[0] - b.blocks[0]);
  let expect = 0;
  for (const p of sorted) {
    if (p.blocks[0] !== expect || p.horizon !== sorted[0]!.horizon)
      throw new Error("summariseProjection: the parts must cover the blocks contiguously, with one horizon");
    expect = p.blocks[1];
  }
  return sorted;
}

/** The smallest and largest value of year t over all parts. */
function yearRange(
  parts: readonly ProjectionParts[],
  which: "abundanceRange" | "catchRange",
  t: number,
): [number, number] {
  let lo = Number.MAX_VALUE;
  let hi = -Number.MAX_VALUE;
  for (const p of parts) {
    lo = Math.min(lo, p[which][2 * t]!);
    hi = Math.max(hi, p[which][2 * t + 1]!);
  }
  return lo <= hi ? [lo, hi] : [0, 0];
}

function clamp(v: number, lo: number, hi: number): number {
  return v < lo ? lo : v > hi ? hi : v;
}

/** Percentiles of year t's histogram (`counts`, with its group sums `groups`) summed over all parts. */
function yearPercentiles(
  parts: readonly ProjectionParts[],
  counts: "abundanceCounts" | "catchCounts",
  groups: "abundanceGroups" | "catchGroups",
  t: number,
  levels: readonly number[],
  K: number,
): number[] {
  const g0 = t * HISTOGRAM_GROUPS;
  const b0 = t * HISTOGRAM_BINS;
  return histogramPercentiles(
    (g) => {
      let s = 0;
      for (const p of parts) s += p[groups][g0 + g]!;
      return s;
    },
    (i) => {
      let s = 0;
      for (const p of parts) s += p[counts][b0 + i]!;
      return s;
    },
    levels,
    K,
  );
}

/**
 * Percentiles and risk metrics from the parts of a whole run. Probabilities are fractions
 * of replicates with the binomial standard error √(p(1 − p)/n); average annual variation
 * in catch is AAV = Σ_t |C[t] − C[t−1]| / Σ_t C[t] per replicate, averaged over replicates.
 * Sources: binomial standard error, e.g. Cochran, W. G. (1977). Sampling Techniques, 3rd
 * ed. Wiley, §3.2; AAV as in Punt, A. E. et al. (2016). Management strategy evaluation:
 * best practices. Fish Fish. 17: 303–334 (from memory).
 */
export function summariseProjection(
  list: readonly ProjectionParts[],
  scenario: Scenario,
  u: Uncertainty,
): StochasticProjection {
  const parts = inBlockOrder(list);
  const H = scenario.horizon;
  const K = scenario.model.params.K!;
  const n = u.replicates;
  const levels = [...PERCENTILE_LEVELS];
  const abundance = levels.map(() => new Array<number>(H + 1).fill(0));
  const caught = levels.map(() => new Array<number>(H).fill(0));
  for (let t = 0; t <= H; t++) {
    const [lo, hi] = yearRange(parts, "abundanceRange", t);
    yearPercentiles(parts, "abundanceCounts", "abundanceGroups", t, levels, K).forEach(
      (v, i) => (abundance[i]![t] = clamp(v, lo, hi)),
    );
  }
  for (let t = 0; t < H; t++) {
    const [lo, hi] = yearRange(parts, "catchRange", t);
    yearPercentiles(parts, "catchCounts", "catchGroups", t, levels, K).forEach(
      (v, i) => (caught[i]![t] = clamp(v, lo, hi)),
    );
  }
  // Floating-point sums in block order, so any split across workers adds up identically.
  let catchTotal = 0;
  let aav = 0;
  let aavCount = 0;
  const below = new Array<number>(H + 1).fill(0);
  const recoveryByYear = new Array<number>(H + 1).fill(0);
  let everBelow = 0;
  let everQuasi = 0;
  let zeroYears = 0;
  let unbounded = 0;
  for (const p of parts) {
    for (let b = 0; b < p.catchTotals.length; b++) {
      catchTotal += p.catchTotals[b]!;
      aav += p.aavSums[b]!;
      aavCount += p.aavCounts[b]!;
    }
    for (let t = 0; t <= H; t++) {
      below[t]! += p.belowLimitByYear[t]!;
      recoveryByYear[t]! += p.recoveryByYear[t]!;
    }
    everBelow += p.everBelowLimit;
    everQuasi += p.everQuasiExtinct;
    zeroYears += p.zeroCatchYears;
    unbounded += p.unbounded;
  }
  let recovered = 0;
  let yearsSum = 0;
  for (let t = 0; t <= H; t++) {
    recovered += recoveryByYear[t]!;
    yearsSum += t * recoveryByYear[t]!;
  }
  let medianYears: number | null = null;
  if (recovered > 0) {
    let cum = 0;
    for (let t = 0; t <= H && medianYears === null; t++) {
      cum += recoveryByYear[t]!;
      if (2 * cum >= recovered) medianYears = t;
    }
  }
  return {
    replicates: n,
    seed: u.seed,
    years: Array.from({ length: H + 1 }, (_, t) => scenario.startYear + t),
    levels,
    abundance,
    catch: caught,
    risk: {
      limit: u.limit,
      quasiExtinctionThreshold: u.quasiExtinction,
      recoveryTarget: u.recoveryTarget,
      belowLimit: estimate(everBelow, n),
      belowLimitByYear: below.map((c) => c / n),
      quasiExtinction: estimate(everQuasi, n),
      recovery: {
        ...estimate(recovered, n),
        medianYears,
        meanYears: recovered > 0 ? yearsSum / recovered : null,
      },
      meanCatch: H > 0 ? catchTotal / (n * H) : 0,
      medianCatch: H > 0 ? pooledCatchMedian(parts, H, K) : 0,
      averageAnnualVariation: aavCount > 0 ? aav / aavCount : null,
      zeroCatchFraction: H > 0 ? zeroYears / (n * H) : 0,
    },
    unboundedReplicates: unbounded,
  };
}

/** The median of every replicate's catch in every year: the catch histograms pooled over the years. */
function pooledCatchMedian(parts: readonly ProjectionParts[], H: number, K: number): number {
  const sum = (key: "catchGroups" | "catchCounts", stride: number, i: number) => {
    let s = 0;
    for (const p of parts) for (let t = 0; t < H; t++) s += p[key][t * stride + i]!;
    return s;
  };
  return histogramPercentiles(
    (g) => sum("catchGroups", HISTOGRAM_GROUPS, g),
    (i) => sum("catchCounts", HISTOGRAM_BINS, i),
    [50],
    K,
  )[0]!;
}

function estimate(count: number, n: number): Estimate {
  const p = count / n;
  return { probability: p, standardError: Math.sqrt((p * (1 - p)) / n) };
}
