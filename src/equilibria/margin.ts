import type { Model } from "../models/model-spec.js";
import { isAbundanceKind } from "../params.js";
import { closedLoop, type ClosedLoop } from "../policy/closed-loop.js";
import type { Rule } from "../policy/rule-spec.js";
import { ok, type Result } from "../result.js";
import type { StabilityKind } from "./classify.js";
import { findEquilibria, type Equilibrium } from "./equilibria.js";
import { characteristicPolynomial, linearise } from "./jacobian.js";
import { juryVerdict } from "./jury-verdict.js";
import { parameterAxis, withParameter, type ParameterAxis } from "./parameter-path.js";
import { analyseStability, equilibriumStability } from "./stability.js";

/** How stability changes when a parameter moves one way from its current value. */
export interface MarginSide {
  /** The value at which the tracked equilibrium changes stability, or null if it does not within the range searched. */
  readonly boundary: number | null;
  /** What happens just past the boundary: a StabilityKind, or "equilibrium-lost" when it vanishes (a fold: collapse or a jump). */
  readonly kind: StabilityKind | "equilibrium-lost" | null;
  /** (boundary − current)/|current| (continuous parameters), or boundary − current (lags and delays, in years). */
  readonly margin: number | null;
  /** The end of the range searched. */
  readonly searchedTo: number;
}

export interface StabilityMargin {
  readonly parameter: string;
  readonly current: number;
  /** N* of the tracked (operating) equilibrium at the current value, or null if there is none. */
  readonly equilibrium: number | null;
  readonly stableNow: boolean;
  readonly increase: MarginSide;
  readonly decrease: MarginSide;
}

type Status = { n: number; stable: boolean } | null;

/**
 * Stability margin of the operating equilibrium in one parameter: the nearest values above
 * and below the current one at which it loses (or, if unstable now, gains) stability, and
 * the kind of change there — the gain margin (harvest rate, quota, r, …) and delay margin
 * (survey lag, delay) of control engineering, applied to a harvest rule.
 *
 * ## Method
 * 1. The operating equilibrium (analyseStability) is tracked by continuation: at each new
 *    value the equilibrium nearest to the last one is taken; it is "lost" when no positive
 *    equilibrium lies within 0.3·K of it (the fold where two equilibria meet and vanish).
 * 2. Continuous parameters: 200 steps from the current value to the end of the search range
 *    (linear, or geometric when the range spans more than two decades), then 50 bisection
 *    steps on the first change, so the boundary is located to about 1e-15 of the range.
 *    The search range is the parameter's allowed range, capped at 4·K (abundance settings)
 *    or ten times the current value.
 * 3. Integer parameters (survey lag, delay): every value up to the largest allowed; the
 *    boundary is the first value with the other status.
 * 4. Stability at each step is the Jury verdict of the characteristic polynomial
 *    (Jury 1964); the kind past the boundary is classified from the eigenvalues.
 * Source (margins): Franklin, G. F., Powell, J. D. & Emami-Naeini, A. Feedback Control of
 * Dynamic Systems, Pearson (gain and delay margins; from memory), here computed by
 * continuation on the closed loop's own equilibrium.
 */
export function stabilityMargin(model: Model, rule: Rule, path: string): Result<StabilityMargin> {
  const axis = parameterAxis(model, rule, path);
  if (!axis.ok) return axis;
  const ax = axis.value;
  const K = model.params.K!;
  const base = analyseStability(closedLoop(model, rule), { gridPoints: 1000 });
  const op = base.operating === null ? null : base.equilibria[base.operating]!;
  if (!op) {
    return ok({
      parameter: path,
      current: ax.current,
      equilibrium: null,
      stableNow: false,
      increase: emptySide(ax.current),
      decrease: emptySide(ax.current),
    });
  }
  const stableNow = op.verdict.kind.startsWith("stable");
  // The equilibrium followed by continuation: at a new value, the positive one nearest to
  // `near`, or null when none lies within 0.3·K (it has vanished).
  const tracked = (value: number, near: number): { loop: ClosedLoop; equilibrium: Equilibrium } | null => {
    const varied = withParameter(model, rule, ax, value);
    if (!varied.ok) return null;
    const loop = closedLoop(varied.value.model, varied.value.rule);
    let best: Equilibrium | null = null;
    for (const e of findEquilibria(loop, { gridPoints: 400 }).equilibria) {
      if (
        e.abundance > 0 &&
        (best === null || Math.abs(e.abundance - near) < Math.abs(best.abundance - near))
      )
        best = e;
    }
    if (!best || Math.abs(best.abundance - near) > 0.3 * (varied.value.model.params.K ?? K)) return null;
    return { loop, equilibrium: best };
  };
  const status = (value: number, near: number): Status => {
    const t = tracked(value, near);
    if (!t) return null;
    const lin = linearise(t.loop, t.equilibrium.state);
    const stable = lin.lagCoefficients
      ? juryVerdict(characteristicPolynomial(lin.lagCoefficients)) === 1
      : equilibriumStability(t.loop, t.equilibrium).verdict.kind.startsWith("stable");
    return { n: t.equilibrium.abundance, stable };
  };
  const kindAt = (value: number, near: number): StabilityKind | "equilibrium-lost" => {
    const t = tracked(value, near);
    return t ? equilibriumStability(t.loop, t.equilibrium).verdict.kind : "equilibrium-lost";
  };

  const side = (dir: 1 | -1): MarginSide => {
    const end = searchEnd(ax, dir, K);
    if (ax.integer) {
      let near = op.equilibrium.abundance;
      for (let v = ax.current + dir; dir > 0 ? v <= end : v >= end; v += dir) {
        const s = status(v, near);
        if (s === null || s.stable !== stableNow) {
          return {
            boundary: v,
            kind: s === null ? "equilibrium-lost" : kindAt(v, near),
            margin: v - ax.current,
            searchedTo: end,
          };
        }
        near = s.n;
      }
      return { boundary: null, kind: null, margin: null, searchedTo: end };
    }
    const values = stepsTowards(ax.current, end, 200);
    let good = ax.current;
    let near = op.equilibrium.abundance;
    for (const v of values) {
      const s = status(v, near);
      if (s !== null && s.stable === stableNow) {
        good = v;
        near = s.n;
        continue;
      }
      // Bisect between the last value with the current status and the first without.
      let bad = v;
      let nearGood = near;
      for (let i = 0; i < 50; i++) {
        const mid = 0.5 * (good + bad);
        if (mid === good || mid === bad) break;
        const m = status(mid, nearGood);
        if (m !== null && m.stable === stableNow) {
          good = mid;
          nearGood = m.n;
        } else bad = mid;
      }
      const boundary = 0.5 * (good + bad);
      // The kind is read a little past the boundary (at the boundary itself it is marginal).
      let kind: StabilityKind | "equilibrium-lost" = "marginal";
      for (const f of [1e-6, 1e-4, 1e-2]) {
        if (kind !== "marginal") break;
        kind = kindAt(boundary + (end - boundary) * f, nearGood);
      }
      // A status that only reaches "marginal" at the end of the range is no loss of stability.
      if (kind === "marginal" && Math.abs(boundary - end) <= 1e-6 * Math.max(1, Math.abs(end - ax.current))) {
        return { boundary: null, kind: null, margin: null, searchedTo: end };
      }
      return {
        boundary,
        kind,
        margin: ax.current !== 0 ? (boundary - ax.current) / Math.abs(ax.current) : null,
        searchedTo: end,
      };
    }
    return { boundary: null, kind: null, margin: null, searchedTo: end };
  };

  return ok({
    parameter: path,
    current: ax.current,
    equilibrium: op.equilibrium.abundance,
    stableNow,
    increase: side(1),
    decrease: side(-1),
  });
}

function emptySide(current: number): MarginSide {
  return { boundary: null, kind: null, margin: null, searchedTo: current };
}

/** The far end of the search in one direction, inside the allowed range. */
function searchEnd(ax: ParameterAxis, dir: 1 | -1, K: number): number {
  const abundanceUnit = isAbundanceKind(ax.info.unitKind);
  const inside = (v: number) =>
    dir > 0
      ? ax.maxInclusive
        ? v
        : Math.min(v, ax.max - 1e-9 * Math.max(1, Math.abs(ax.max)))
      : ax.minInclusive
        ? v
        : Math.max(v, ax.min + 1e-9 * Math.max(1, Math.abs(ax.min)));
  if (ax.integer) return dir > 0 ? ax.max : ax.min;
  if (dir < 0) return inside(ax.min);
  const cap = abundanceUnit ? Math.max(4 * K, 10 * ax.current) : Math.max(10 * ax.current, ax.current + 1);
  return inside(Math.min(ax.max, cap));
}

/** `count` values from a (exclusive) to b (inclusive): geometric when both are positive and b/a > 100. */
function stepsTowards(a: number, b: number, count: number): number[] {
  const out: number[] = [];
  const geometric = a > 0 && b > 0 && (b / a > 100 || a / b > 100);
  for (let i = 1; i <= count; i++) {
    out.push(geometric ? a * Math.pow(b / a, i / count) : a + ((b - a) * i) / count);
  }
  return out;
}
