import { juryTest } from "./jury.js";

/** Verdict codes of the fast Jury test: 1 stable, 0 marginal, −1 unstable, −2 invalid input. */
export type JuryCode = 1 | 0 | -1 | -2;

/** Conditions closer to zero than this are re-decided by the double-double table. */
const DOUBT = 1e-6;

let scratch = new Float64Array(64);
let spare = new Float64Array(64);

/**
 * The Jury stability verdict of P(z) = a0·z^n + … + an (highest power first), without
 * building a report: the same conditions as juryTest in plain double arithmetic with
 * power-of-two rescaling of each row (no allocation), for sweeps and regime maps.
 *
 * Any condition whose value falls within 1e-6 of zero is re-decided by juryTest's
 * double-double table, so the fast path never flips a verdict near the unit circle.
 * Source: Jury, E. I. (1964). Theory and Application of the z-Transform Method. Wiley.
 * @example juryVerdict([1, -1.2, 0.07, 0.3, -0.08]) // => 1 (Ogata 1995, Example 4-3)
 */
export function juryVerdict(c: ArrayLike<number>, tolerance = 1e-9): JuryCode {
  let start = 0;
  const len = c.length;
  while (start < len && c[start] === 0) start++;
  if (start === len) return -2;
  const n = len - 1 - start;
  if (n === 0) return Number.isFinite(c[start]!) ? 1 : -2;
  if (scratch.length < n + 1) {
    scratch = new Float64Array(2 * (n + 1));
    spare = new Float64Array(2 * (n + 1));
  }
  const sign = c[start]! < 0 ? -1 : 1;
  // Row 1 is [a_n … a_0]; also P(1), P(−1) and Σ|a| on the way.
  let p1 = 0;
  let pm1 = 0;
  let abs = 0;
  let alt = n % 2 === 0 ? 1 : -1;
  for (let i = 0; i <= n; i++) {
    const v = sign * c[start + i]!;
    scratch[n - i] = v;
    p1 += v;
    pm1 += alt * v;
    alt = -alt;
    abs += v < 0 ? -v : v;
  }
  if (!Number.isFinite(abs)) return -2;
  const a0 = scratch[n]!;
  const an = scratch[0]!;
  // Each condition's value v: fails if v < −tol, marginal if |v| ≤ tol, doubtful if |v| < DOUBT.
  const anAbs = an < 0 ? -an : an;
  let v = (a0 - anAbs) / (a0 > anAbs ? a0 : anAbs);
  if (v < -DOUBT) return -1;
  let worst = v;
  let closest = v < 0 ? -v : v;
  v = p1 / abs;
  if (v < -DOUBT) return -1;
  if (v < worst) worst = v;
  if ((v < 0 ? -v : v) < closest) closest = v < 0 ? -v : v;
  v = ((n % 2 === 0 ? 1 : -1) * pm1) / abs;
  if (v < -DOUBT) return -1;
  if (v < worst) worst = v;
  if ((v < 0 ? -v : v) < closest) closest = v < 0 ? -v : v;
  let row = scratch;
  let next = spare;
  for (let m = n; m >= 3; m--) {
    const r0 = row[0]!;
    const rm = row[m]!;
    for (let i = 0; i < m; i++) next[i] = r0 * row[i]! - row[m - i]! * rm;
    const swap = row;
    row = next;
    next = swap;
    let first = row[0]!;
    let last = row[m - 1]!;
    if (first < 0) first = -first;
    if (last < 0) last = -last;
    // Rescale by an exact power of two only when the row drifts towards under- or overflow.
    const big = first > last ? first : last;
    if (big > 0 && (big < 1e-100 || big > 1e100)) {
      const sc = Math.pow(2, -(Math.floor(Math.log2(big)) + 1));
      for (let i = 0; i < m; i++) row[i]! *= sc;
    }
    // Scale-free row condition (|first| − |last|)/(|first| + |last|).
    v = big > 0 ? (first - last) / (first + last) : 0;
    // A clear failure needs no further rows: the polynomial is unstable.
    if (v < -DOUBT) return -1;
    if (v < worst) worst = v;
    const av = v < 0 ? -v : v;
    if (av < closest) closest = av;
  }
  const doubt = closest < DOUBT;
  const marginal = closest <= tolerance;
  const fails = worst < -tolerance;
  if (doubt) {
    const exact = juryTest(Array.from(c as ArrayLike<number>), tolerance);
    if (!exact.ok) return -2;
    return exact.value.verdict === "stable" ? 1 : exact.value.verdict === "marginal" ? 0 : -1;
  }
  if (fails) return -1;
  return marginal ? 0 : 1;
}
