import { juryTest } from "./jury.js";

/** Verdict codes of the fast Jury test: 1 stable, 0 marginal, −1 unstable, −2 invalid input. */
export type JuryCode = 1 | 0 | -1 | -2;

/** Conditions closer to zero than this (relative) are re-decided by the double-double table. */
const DOUBT = 1e-6;

let scratch = new Float64Array(64);

/**
 * The Jury stability verdict of P(z) = a0·z^n + … + an (highest power first), without
 * building a report: the conditions of juryTest in plain double arithmetic, for sweeps and
 * regime maps.
 *
 * ## Method
 * The same table as juryTest (Jury 1964, in Ogata's arrangement). Each condition is a
 * comparison d > 0 with a natural scale s (a0 − |an| against a0 + |an|; P(±1) against Σ|ai|;
 * |R'[0]| − |R'[m−1]| against their sum), evaluated without division:
 *   d < −1e-6·s      clearly fails: the polynomial is unstable, stop;
 *   |d| < 1e-6·s     doubtful: the whole question goes to juryTest's double-double table,
 *                    which decides stable, unstable or marginal with its tolerance;
 *   otherwise        clearly holds.
 * A row whose entries drift below 1e-100 or above 1e100 is rescaled by an exact power of two,
 * so high degrees neither underflow nor overflow. The fast path therefore never decides a
 * case near the unit circle itself.
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
  if (scratch.length < n + 1) scratch = new Float64Array(2 * (n + 1));
  // Row 1 is [a_n … a_0]; the sums of even- and odd-power coefficients give P(1) and P(−1).
  // A negative leading coefficient flips the sign of the first-row conditions only: every
  // later row is a difference of products of two first-row entries, unchanged by a flip.
  const sign = c[start]! < 0 ? -1 : 1;
  let even = 0;
  let odd = 0;
  let abs = 0;
  const row = scratch;
  let k = 0;
  for (; k < n; k += 2) {
    const e = c[len - 1 - k]!; // coefficient of z^k
    const o = c[len - 2 - k]!; // coefficient of z^(k+1)
    row[k] = e;
    row[k + 1] = o;
    even += e;
    odd += o;
    abs += Math.abs(e) + Math.abs(o);
  }
  if (k === n) {
    const e = c[start]!;
    row[n] = e;
    even += e;
    abs += Math.abs(e);
  }
  if (!(abs < Infinity)) return -2;
  const p1 = sign * (even + odd);
  const pm1 = sign * ((n & 1) === 0 ? even - odd : odd - even); // (−1)^n·P(−1)
  const a0 = sign * row[n]!;
  const an = Math.abs(row[0]!);
  let doubt = false;
  // |a_n| < a_0
  let d = a0 - an;
  let s = a0 + an;
  if (d < -DOUBT * s) return -1;
  if (d < DOUBT * s) doubt = true;
  // P(1) > 0 and (−1)^n·P(−1) > 0
  if (p1 < -DOUBT * abs || pm1 < -DOUBT * abs) return -1;
  if (p1 < DOUBT * abs || pm1 < DOUBT * abs) doubt = true;
  // Each new row in place: entry i and entry m − i of the next row both come from the pair
  // (row[i], row[m − i]), so the pair is read once and both are written back.
  for (let m = n; m >= 3 && !doubt; m--) {
    const r0 = row[0]!;
    const rm = row[m]!;
    row[0] = r0 * r0 - rm * rm;
    const half = m >> 1;
    for (let i = 1; i < m - i; i++) {
      const a = row[i]!;
      const b = row[m - i]!;
      row[i] = r0 * a - rm * b;
      row[m - i] = r0 * b - rm * a;
    }
    if ((m & 1) === 0) row[half] = (r0 - rm) * row[half]!;
    const first = Math.abs(row[0]!);
    const last = Math.abs(row[m - 1]!);
    d = first - last;
    s = first + last;
    if (d < -DOUBT * s) return -1;
    if (!(d > DOUBT * s)) doubt = true;
    // Rescale by an exact power of two only when the row drifts towards under- or overflow.
    if (s < 1e-100 || s > 1e100) {
      if (s === 0) {
        doubt = true;
        break;
      }
      const sc = Math.pow(2, -Math.floor(Math.log2(s)));
      for (let i = 0; i < m; i++) row[i]! *= sc;
    }
  }
  return doubt ? decideExactly(c, tolerance) : 1;
}

/** The doubtful cases, decided by juryTest's double-double table with its tolerance. */
function decideExactly(c: ArrayLike<number>, tolerance: number): JuryCode {
  const exact = juryTest(Array.from(c), tolerance);
  if (!exact.ok) return -2;
  return exact.value.verdict === "stable" ? 1 : exact.value.verdict === "marginal" ? 0 : -1;
}
