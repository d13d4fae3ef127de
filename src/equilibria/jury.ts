import { ddMul, ddSub, type DoubleDouble } from "../numeric/double-double.js";
import { fail, ok, type Result } from "../result.js";

/** Default tolerance below which a Jury condition counts as "on the unit circle". */
export const JURY_TOLERANCE = 1e-9;

/** One Jury condition with its value: positive holds, negative fails, |value| ≤ tol marginal. */
export interface JuryCondition {
  /** Ogata's wording of the condition, e.g. "|b[n−1]| > |b[0]|". */
  readonly name: string;
  /** The value of (left side − right side), scaled as documented on juryTest. */
  readonly value: number;
  readonly holds: boolean;
  readonly marginal: boolean;
}

/** One row of the Jury table: entries × 2^exponent are the unscaled values. */
export interface JuryRow {
  readonly entries: number[];
  readonly exponent: number;
}

export type JuryVerdict = "stable" | "unstable" | "marginal";

export interface JuryTable {
  readonly degree: number;
  /** The polynomial, highest power first, with a positive leading coefficient. */
  readonly coefficients: number[];
  /**
   * The first row of each pair: [a_n … a_0], then [b_(n−1) … b_0], [c_(n−2) … c_0], … down to
   * three entries (the second row of each pair is the same row reversed).
   */
  readonly rows: JuryRow[];
  readonly conditions: JuryCondition[];
  readonly verdict: JuryVerdict;
  readonly tolerance: number;
}

/**
 * The Jury stability test of a real polynomial P(z) = a0·z^n + a1·z^(n−1) + … + an: are all
 * roots strictly inside the unit circle? No roots are computed.
 *
 * ## Method (Ogata's arrangement of Jury's table)
 * 1. Normalise so a0 > 0. Conditions: |an| < a0;  P(1) > 0;  (−1)^n·P(−1) > 0.
 * 2. From a row R = [R0 … Rm] (first row of a pair) the next is
 *      R'[i] = R0·R[i] − R[m−i]·Rm,   i = 0 … m−1
 *    which gives Ogata's b_k = an·a(k+1) − a(n−1−k)·a0, then c_k, …, down to three entries;
 *    each new row must satisfy |R'[0]| > |R'[m−1]|.
 * 3. Numerics. Each entry is formed in double-double arithmetic (Dekker's exact products),
 *    so the cancellation that occurs when roots lie near the circle costs no digits; and each
 *    row is rescaled by a power of two (exactly) so that its largest entry lies in [0.5, 1).
 *    A plain double table squares magnitudes row by row (|b| ~ |a|²) and underflows after
 *    about ten rows; the rescaled one does not, at any degree.
 * 4. Values. |an| < a0 is reported as (a0 − |an|)/max(a0, |an|); P(±1) as a fraction of
 *    Σ|ai| (summed with error-free transformations); each row condition as |R'[0]| − |R'[m−1]|
 *    of the rescaled row. A value within ±tol is "marginal": a root on the unit circle to
 *    rounding, reported as such instead of being flipped either way.
 * Verdict: unstable if any condition fails beyond tol; else marginal if any is within tol;
 * else stable.
 * Sources: Jury, E. I. (1964). Theory and Application of the z-Transform Method. Wiley;
 * Ogata, K. (1995). Discrete-Time Control Systems, 2nd ed., Prentice Hall, §4-3.
 */
export function juryTest(coefficients: readonly number[], tolerance = JURY_TOLERANCE): Result<JuryTable> {
  const a = normalise(coefficients);
  if (!a.ok) return a;
  const c = a.value;
  const n = c.length - 1;
  const conditions: JuryCondition[] = [];
  const rows: JuryRow[] = [];
  const push = (name: string, value: number) =>
    conditions.push({ name, value, holds: value > tolerance, marginal: Math.abs(value) <= tolerance });
  if (n === 0) return ok({ degree: 0, coefficients: c, rows: [], conditions, verdict: "stable", tolerance });

  const a0 = c[0]!;
  const an = c[n]!;
  push("|a_n| < a_0", (a0 - Math.abs(an)) / Math.max(a0, Math.abs(an)));
  push("P(1) > 0", evaluateScaled(c, 1));
  push(`(−1)^${n}·P(−1) > 0`, (n % 2 === 0 ? 1 : -1) * evaluateScaled(c, -1));

  // Row 1 of Ogata's table is [a_n … a_0]: the coefficients in ascending powers.
  let row: DoubleDouble[] = c.map((v) => ({ hi: v, lo: 0 })).reverse();
  rows.push({ entries: row.map((v) => v.hi), exponent: 0 });
  let exponent = 0;
  const t1: DoubleDouble = { hi: 0, lo: 0 };
  const t2: DoubleDouble = { hi: 0, lo: 0 };
  const letters = "bcdefghijklmnopqrstuvwxyz";
  for (let stage = 1; row.length > 3; stage++) {
    const m = row.length - 1;
    const next: DoubleDouble[] = [];
    for (let i = 0; i < m; i++) {
      ddMul(row[0]!, row[i]!, t1);
      ddMul(row[m - i]!, row[m]!, t2);
      next.push(ddSub(t1, t2, { hi: 0, lo: 0 }));
    }
    const shift = scaleExponent(next);
    for (const v of next) {
      v.hi *= Math.pow(2, -shift);
      v.lo *= Math.pow(2, -shift);
    }
    exponent = 2 * exponent + shift;
    rows.push({ entries: next.map((v) => v.hi), exponent });
    const letter = letters[(stage - 1) % letters.length]!;
    push(`|${letter}_${m - 1}| > |${letter}_0|`, Math.abs(next[0]!.hi) - Math.abs(next[m - 1]!.hi));
    row = next;
  }
  const verdict: JuryVerdict = conditions.some((k) => !k.holds && !k.marginal)
    ? "unstable"
    : conditions.some((k) => k.marginal)
      ? "marginal"
      : "stable";
  return ok({ degree: n, coefficients: c, rows, conditions, verdict, tolerance });
}

/** Trims leading zeros, checks finiteness and makes the leading coefficient positive. */
function normalise(coefficients: readonly number[]): Result<number[]> {
  for (let i = 0; i < coefficients.length; i++) {
    const v = coefficients[i]!;
    if (!Number.isFinite(v))
      return fail({ code: "not_finite", field: `coefficients[${i}]`, received: String(v) });
  }
  let start = 0;
  while (start < coefficients.length && coefficients[start] === 0) start++;
  if (start === coefficients.length) {
    return fail({
      code: "constraint_violated",
      field: "coefficients",
      constraint: "the zero polynomial has no defined roots",
    });
  }
  const c = coefficients.slice(start);
  if (c[0]! < 0) for (let i = 0; i < c.length; i++) c[i] = -c[i]! + 0;
  return ok(c);
}

/** P(z) at z = ±1 divided by Σ|ai|, summed with Neumaier's compensated summation. */
function evaluateScaled(c: readonly number[], z: 1 | -1): number {
  const n = c.length - 1;
  let sum = 0;
  let comp = 0;
  let abs = 0;
  for (let i = 0; i <= n; i++) {
    const term = z === 1 || (n - i) % 2 === 0 ? c[i]! : -c[i]!;
    const t = sum + term;
    comp += Math.abs(sum) >= Math.abs(term) ? sum - t + term : term - t + sum;
    sum = t;
    abs += Math.abs(term);
  }
  return (sum + comp) / abs;
}

/** The power of two that brings the largest |entry| into [0.5, 1). */
function scaleExponent(row: readonly DoubleDouble[]): number {
  let max = 0;
  for (const v of row) max = Math.max(max, Math.abs(v.hi));
  if (max === 0 || !Number.isFinite(max)) return 0;
  return Math.floor(Math.log2(max)) + 1;
}
