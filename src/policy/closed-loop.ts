import type { GrowthFamily, Params } from "../models/growth-family.js";
import type { Model } from "../models/model-spec.js";
import type { HarvestRule } from "./harvest-rule.js";
import { capQuota } from "./quota-cap.js";
import type { Rule } from "./rule-spec.js";

/**
 * Where each quantity sits in the closed loop's state vector x[t]:
 *
 *   x[0]                         N[t]             abundance at the start of year t
 *   x[1 .. nHistory]             N[t−1] … N[t−nHistory]
 *   x[bStart .. bStart+T−1]      B[t−1] … B[t−T]  spawners (harvest before reproduction only)
 *   x[quotaIndex]                Q[t−1]           last year's quota (quota caps only)
 *
 * nHistory = max(T, L) when the catch is taken after reproduction (the density term and the
 * survey both read past abundances) and L when it is taken before (the density term reads
 * past spawners B = N − C instead).
 */
export interface StateLayout {
  readonly dimension: number;
  readonly nHistory: number;
  readonly bStart: number;
  readonly bHistory: number;
  /** −1 when the rule has no quota caps. */
  readonly quotaIndex: number;
}

/** What happened in one year of the closed loop. */
export interface StepRecord {
  /** The survey the rule acted on, y[t−L]. */
  survey: number;
  /** The quota the rule set (after caps). */
  quota: number;
  /** The catch actually taken: min(quota, stock available at harvest time). */
  catch: number;
  /** The animals released, A. */
  stocking: number;
}

/**
 * Noise on one year of the loop (0, 1 and 1 for the deterministic map): production
 * P × exp(logProcess), the survey the rule sees y × survey, and the catch aimed at
 * (quota × implementation, still at most the stock available).
 */
export interface StepNoise {
  logProcess: number;
  survey: number;
  implementation: number;
}

/**
 * The closed-loop map G = F − H + S: one year of growth, harvest and stocking.
 *
 * Harvest after reproduction (timing "after", the Schaefer convention):
 *   P[t]   = N[t] · g(N[t−T])
 *   C[t]   = min(Q[t], P[t])
 *   N[t+1] = P[t] − C[t] + A
 * Harvest before reproduction (timing "before", the Ricker convention):
 *   C[t]   = min(Q[t], N[t]),   B[t] = N[t] − C[t]
 *   N[t+1] = B[t] · g(B[t−T]) + A
 * with Q[t] = H(y[t−L]) (capped against Q[t−1] when the rule has change limits) and the
 * survey y[t] = N[t].
 *
 * Non-negativity: the catch never exceeds the stock available when it is taken (the min
 * above), and a growth step that would be negative (the discrete and theta-logistic above
 * N = K(1 + r)/r) is set to zero, which is extinction. Stocking is added at the end of the
 * year. Sources: Schaefer (1954), Bull. Inter-Am. Trop. Tuna Comm. 1: 27–56; Ricker (1954),
 * J. Fish. Res. Board Can. 11: 559–623.
 */
export interface ClosedLoop {
  readonly model: Model;
  readonly rule: Rule;
  readonly layout: StateLayout;
  /**
   * Advances x[t] to x[t+1]. `out` may be the same array as `x` (updated in place).
   * Fills `record` with the year's survey, quota, catch and stocking when given; `noise`
   * multiplies production, survey and catch (a stochastic year).
   */
  step(x: Float64Array, out: Float64Array, record?: StepRecord, noise?: StepNoise): void;
  /**
   * The state at the start of the first year from past abundances: `history[0]` = N[0],
   * `history[k]` = N[−k]. Missing history repeats the oldest value given; past spawners are
   * taken equal to past abundances (no catch before the start) and last year's quota is the
   * rule's quota on the first survey.
   */
  initialState(history: readonly number[]): Float64Array;
  /**
   * For a loop whose state is one number (no delay, no survey lag, no quota caps): the next
   * year's abundance, the same arithmetic as step() without the state vector. Callers check
   * layout.dimension === 1.
   */
  next(n: number): number;
  /**
   * next() with noise on production, survey and catch (see StepNoise); the year's quota
   * and catch go to `record`. With logProcess 0 and the multipliers 1 it returns exactly
   * next(n).
   */
  nextWith(n: number, logProcess: number, survey: number, implementation: number, record: StepRecord): number;
}

/** Builds the layout of the state vector for a model and a rule. */
export function stateLayout(model: Model, rule: Rule): StateLayout {
  const T = model.delay;
  const L = rule.surveyLag;
  const nHistory = rule.timing === "after" ? Math.max(T, L) : L;
  const bHistory = rule.timing === "after" ? 0 : T;
  const bStart = 1 + nHistory;
  const quotaIndex = rule.quotaChange ? bStart + bHistory : -1;
  return { dimension: bStart + bHistory + (quotaIndex >= 0 ? 1 : 0), nHistory, bStart, bHistory, quotaIndex };
}

/** Builds the closed-loop map of a validated model and rule. */
export function closedLoop(model: Model, rule: Rule): ClosedLoop {
  return new ClosedLoopMap(model, rule);
}

// A class rather than a closure, so that every loop shares one hidden class and the callers'
// loop.step(...) stays monomorphic (and inlined) in sweeps over thousands of loops.
class ClosedLoopMap implements ClosedLoop {
  readonly layout: StateLayout;
  private readonly T: number;
  private readonly L: number;
  private readonly growth: GrowthFamily<Params>;
  private readonly logFactor: ((m: number, p: Params) => number) | null;
  private readonly params: Params;
  private readonly harvest: HarvestRule;
  private readonly stocking: number;
  private readonly before: boolean;
  private readonly capped: boolean;
  private readonly maxIncrease: number;
  private readonly maxDecrease: number;

  constructor(
    readonly model: Model,
    readonly rule: Rule,
  ) {
    this.layout = stateLayout(model, rule);
    this.T = model.delay;
    this.L = rule.surveyLag;
    this.growth = model.growth;
    this.logFactor = model.growth.logFactor ?? null;
    this.params = model.params;
    this.harvest = rule.harvest;
    this.stocking = rule.stocking;
    this.before = rule.timing === "before";
    this.capped = rule.quotaChange !== undefined;
    this.maxIncrease = rule.quotaChange?.maxIncrease ?? 0;
    this.maxDecrease = rule.quotaChange?.maxDecrease ?? 0;
  }

  step(x: Float64Array, out: Float64Array, record?: StepRecord, noise?: StepNoise): void {
    const { nHistory, bStart, bHistory, quotaIndex } = this.layout;
    const T = this.T;
    const L = this.L;
    const n = x[0]!;
    const survey = (L === 0 ? n : x[L]!) * (noise ? noise.survey : 1);
    let quota = this.harvest.quota(survey);
    if (this.capped) quota = capQuota(quota, x[quotaIndex]!, this.maxIncrease, this.maxDecrease);
    const aim = noise ? quota * noise.implementation : quota;
    let taken: number;
    let next: number;
    let spawners = 0;
    if (this.before) {
      taken = aim < n ? aim : n;
      spawners = n - taken;
      const dens = T === 0 ? spawners : x[bStart + T - 1]!;
      const p =
        spawners > 0
          ? noise
            ? this.noisyProduction(spawners, dens, noise.logProcess)
            : spawners * this.growth.factor(dens, this.params)
          : 0;
      next = (p < 0 ? 0 : p) + this.stocking;
    } else {
      const dens = T === 0 ? n : x[T]!;
      let p =
        n > 0
          ? noise
            ? this.noisyProduction(n, dens, noise.logProcess)
            : n * this.growth.factor(dens, this.params)
          : 0;
      if (p < 0) p = 0;
      taken = aim < p ? aim : p;
      next = p - taken + this.stocking;
    }
    // Shift the delay lines from the far end so that out may alias x.
    if (quotaIndex >= 0) out[quotaIndex] = quota;
    for (let k = bHistory - 1; k >= 1; k--) out[bStart + k] = x[bStart + k - 1]!;
    if (bHistory > 0) out[bStart] = spawners;
    for (let k = nHistory; k >= 2; k--) out[k] = x[k - 1]!;
    if (nHistory > 0) out[1] = n;
    out[0] = next;
    if (record) {
      record.survey = survey;
      record.quota = quota;
      record.catch = taken;
      record.stocking = this.stocking;
    }
  }

  next(n: number): number {
    const quota = this.harvest.quota(n);
    // One growth call for both timings: before, the spawners N − C reproduce; after, N does.
    const base = this.before ? n - (quota < n ? quota : n) : n;
    let p = base > 0 ? base * this.growth.factor(base, this.params) : 0;
    if (p < 0) p = 0;
    return (this.before ? p : p - (quota < p ? quota : p)) + this.stocking;
  }

  /** base · g(dens) · exp(ε), with one exp for exponential families. */
  private noisyProduction(base: number, dens: number, logProcess: number): number {
    const lf = this.logFactor;
    return lf
      ? base * Math.exp(lf(dens, this.params) + logProcess)
      : base * this.growth.factor(dens, this.params) * Math.exp(logProcess);
  }

  nextWith(
    n: number,
    logProcess: number,
    survey: number,
    implementation: number,
    record: StepRecord,
  ): number {
    const quota = this.harvest.quota(n * survey);
    const aim = quota * implementation;
    let next: number;
    let taken: number;
    if (this.before) {
      taken = aim < n ? aim : n;
      const base = n - taken;
      let p = base > 0 ? this.noisyProduction(base, base, logProcess) : 0;
      if (p < 0) p = 0;
      next = p + this.stocking;
    } else {
      let p = n > 0 ? this.noisyProduction(n, n, logProcess) : 0;
      if (p < 0) p = 0;
      taken = aim < p ? aim : p;
      next = p - taken + this.stocking;
    }
    record.quota = quota;
    record.catch = taken;
    return next;
  }

  initialState(history: readonly number[]): Float64Array {
    const { dimension, nHistory, bStart, bHistory, quotaIndex } = this.layout;
    const x = new Float64Array(dimension);
    const at = (k: number) => history[Math.min(k, history.length - 1)]!;
    x[0] = at(0);
    for (let k = 1; k <= nHistory; k++) x[k] = at(k);
    for (let k = 0; k < bHistory; k++) x[bStart + k] = at(k + 1);
    if (quotaIndex >= 0) x[quotaIndex] = this.harvest.quota(at(this.L));
    return x;
  }
}
