/**
 * The mergeable counts and sums of a range of replicate blocks. Counts are integers (they
 * add up in any order); the floating-point sums are kept per block and added in block order
 * by summariseProjection, so any split of the blocks gives bit-identical results.
 */
export interface ProjectionParts {
  readonly blocks: readonly [number, number];
  readonly horizon: number;
  /** Histogram of N[t], t = 0 … horizon: (horizon + 1) × HISTOGRAM_BINS counts. */
  readonly abundanceCounts: Uint32Array;
  /** Histogram of the catch C[t], t = 0 … horizon − 1. */
  readonly catchCounts: Uint32Array;
  /** The two histograms summed per group of GROUP_BINS bins (HISTOGRAM_GROUPS per year): percentiles read only the groups they fall in. */
  readonly abundanceGroups: Uint32Array;
  readonly catchGroups: Uint32Array;
  /** Smallest and largest N[t] and C[t] per year (percentiles are clamped into them, so a point mass is exact). */
  readonly abundanceRange: Float64Array;
  readonly catchRange: Float64Array;
  /** Smallest positive N[t] and C[t] per year (Number.MAX_VALUE when none): with the largest, the bins a year's positive values occupy (bin 0 holds the zeros). */
  readonly abundancePositiveMin: Float64Array;
  readonly catchPositiveMin: Float64Array;
  /** Replicates with N[t] < limit, per year t = 0 … horizon. */
  readonly belowLimitByYear: Uint32Array;
  /** Replicates first at or above the recovery target in year t = 0 … horizon. */
  readonly recoveryByYear: Uint32Array;
  /** Replicates below the limit in at least one projected year t = 1 … horizon. */
  everBelowLimit: number;
  /** Replicates below the quasi-extinction threshold in at least one projected year. */
  everQuasiExtinct: number;
  /** Replicate-years with zero catch. */
  zeroCatchYears: number;
  /** Replicates whose abundance left all bounds (clipped at 10⁶·K). */
  unbounded: number;
  /** Per block: the total catch over its replicates and years. */
  readonly catchTotals: Float64Array;
  /** Per block: the sum of the replicates' average annual variation in catch, and their count. */
  readonly aavSums: Float64Array;
  readonly aavCounts: Uint32Array;
}
