import type { OrderConstraint, ParamInfo } from "../params.js";

/** Parameter values by published symbol. */
export type Params = Readonly<Record<string, number>>;

/**
 * A density-dependent growth family in per-capita form.
 *
 *   N[t+1] = N[t] · g(N[t−T])
 *
 * `g` is the per-capita reproduction factor and `T ≥ 0` the delay in the density term
 * (Levin & May 1976, Theor. Popul. Biol. 9: 178–187, write delayed models this way).
 * With T = 0 this is the production map f(N) = N·g(N), whose slope is
 * f'(N) = g(N) + N·g'(N).
 */
export interface GrowthFamily<P extends Params = Params> {
  /** The id used in a model spec's `family` field. */
  readonly id: string;
  /** The family's name for people. */
  readonly label: string;
  /** The map in plain text. */
  readonly equation: string;
  /** The published source of the equation. */
  readonly source: string;
  readonly params: readonly ParamInfo[];
  /** Orders between parameters (A < K), checked after the ranges. */
  readonly constraints: readonly OrderConstraint[];
  /** Per-capita factor g(M) at density term M ≥ 0. */
  factor(m: number, p: P): number;
  /**
   * ln g(M), for families whose factor is an exponential (Ricker, Gompertz, Allee–Ricker):
   * factor(M) is exactly Math.exp(logFactor(M)), so a stochastic year can fold the
   * lognormal noise into the same exp: N·exp(ln g(M) + ε).
   */
  logFactor?(m: number, p: P): number;
  /** dg/dM at M ≥ 0 (may be −∞ at M = 0 for exponents below one; callers multiply by N). */
  factorSlope(m: number, p: P): number;
  /** The equilibria of the unharvested, undelayed map N = f(N), in increasing order. */
  equilibria(p: P): number[];
  /**
   * Closed-form peak of the surplus production f(S) − S where one is published:
   * the escapement S that maximises it and the maximum. Undefined means "numeric".
   */
  surplusPeak?(p: P): { escapement: number; msy: number; source: string };
  /** False where the surplus has no finite maximum (undefined means always finite). */
  finiteMsy?(p: P): boolean;
}

/** Production f(N) = N·g(N) of the undelayed map; zero stock produces nothing. */
export function production<P extends Params>(family: GrowthFamily<P>, n: number, p: P): number {
  return n > 0 ? n * family.factor(n, p) : 0;
}

/** Slope f'(N) = g(N) + N·g'(N) of the undelayed production map. */
export function productionSlope<P extends Params>(family: GrowthFamily<P>, n: number, p: P): number {
  return family.factor(n, p) + densityTerm(n, family.factorSlope(n, p));
}

/**
 * N·g'(M), the sensitivity of N[t+1] to the density term. Taken as 0 when N = 0, the limit
 * for every family here (N·M^(δ−1) → 0 as N, M → 0 for δ > 0).
 */
export function densityTerm(n: number, slope: number): number {
  return n === 0 ? 0 : n * slope;
}
