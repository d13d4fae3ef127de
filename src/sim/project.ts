import type { ClosedLoop, StepRecord } from "../policy/closed-loop.js";
import type { Scenario } from "./scenario.js";

/** Abundance above this multiple of K ends a run as unbounded. */
export const UNBOUNDED_FACTOR = 1e6;

/** A deterministic projection, year by year. */
export interface Projection {
  /** Calendar years t = startYear … of the projected years. */
  readonly years: number[];
  /** N at the start of each projected year, then the year after the last (one more entry). */
  readonly abundance: number[];
  /** The survey the rule acted on each year, y[t − L]. */
  readonly survey: number[];
  readonly quota: number[];
  readonly catch: number[];
  readonly stocking: number[];
  /**
   * "completed" when every year ran; "unbounded" when the abundance left all bounds
   * (non-finite or above UNBOUNDED_FACTOR·K) and the run stopped there.
   */
  readonly status: "completed" | "unbounded";
  /** The first year the stock stood at zero, or null. */
  readonly extinctionYear: number | null;
}

/**
 * Iterates the closed loop x[t+1] = G(x[t]) for `horizon` years from the start history and
 * records abundance, survey, quota, catch and stocking. No NaN or Infinity is returned: a
 * run that explodes stops at the last finite year with status "unbounded".
 */
export function projectLoop(
  loop: ClosedLoop,
  start: readonly number[],
  horizon: number,
  startYear = 0,
): Projection {
  const bound = UNBOUNDED_FACTOR * loop.model.params.K!;
  const x = loop.initialState(start);
  const rec: StepRecord = { survey: 0, quota: 0, catch: 0, stocking: 0 };
  const years: number[] = [];
  const abundance: number[] = [x[0]!];
  const survey: number[] = [];
  const quota: number[] = [];
  const caught: number[] = [];
  const stocking: number[] = [];
  let extinctionYear: number | null = x[0] === 0 ? startYear : null;
  for (let t = 0; t < horizon; t++) {
    loop.step(x, x, rec);
    const next = x[0]!;
    if (
      !Number.isFinite(next) ||
      next > bound ||
      !Number.isFinite(rec.quota) ||
      !Number.isFinite(rec.catch)
    ) {
      return {
        years,
        abundance,
        survey,
        quota,
        catch: caught,
        stocking,
        status: "unbounded",
        extinctionYear,
      };
    }
    years.push(startYear + t);
    survey.push(rec.survey);
    quota.push(rec.quota);
    caught.push(rec.catch);
    stocking.push(rec.stocking);
    abundance.push(next);
    if (next === 0 && extinctionYear === null) extinctionYear = startYear + t + 1;
  }
  return { years, abundance, survey, quota, catch: caught, stocking, status: "completed", extinctionYear };
}

/** The deterministic projection of a validated scenario. */
export function project(scenario: Scenario): Projection {
  return projectLoop(scenario.loop, scenario.start, scenario.horizon, scenario.startYear);
}
