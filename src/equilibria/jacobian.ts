import { densityTerm } from "../models/growth-family.js";
import type { ClosedLoop } from "../policy/closed-loop.js";
import { capQuota } from "../policy/quota-cap.js";

/** The linearised closed loop at a state. */
export interface Linearisation {
  /** ∂G_i/∂x_j on the state layout of closed-loop.ts. */
  readonly jacobian: number[][];
  /**
   * The scalar recurrence δN[t+1] = Σ_k a[k]·δN[t−k] that the linearised loop reduces to,
   * when it exists (it does at every equilibrium; not where a quota cap binds).
   */
  readonly lagCoefficients: number[] | null;
}

/**
 * The Jacobian of the closed-loop map G at a state x, by the chain rule through each year's
 * steps (see closed-loop.ts for the map):
 *
 *   after:  δP = g(M)·δN + N·g'(M)·δM,  δC = H'(y)·δy (quota binds) or δP (all taken),
 *           δN' = δP − δC
 *   before: δC = H'(y)·δy or δN,  δB = δN − δC,  δN' = g(M)·δB + B·g'(M)·δM
 *
 * with M the density term (N or B, T years back), y = N[t−L], and the delay lines adding
 * shift rows (ones on their subdiagonal), which makes J a companion-type matrix. At a kink
 * (a trigger, the catch exactly equal to the stock) the branch taken by the map is used.
 * Where a quota cap binds, δQ = (1 ± cap)·δQ[t−1].
 * Source: the linearisation x[t+1] − x* ≈ J·(x[t] − x*) of a map at a fixed point, as in
 * May, R. M. (1976). Nature 261: 459–467, and for delayed maps Levin, S. A. & May, R. M.
 * (1976). Theor. Popul. Biol. 9: 178–187.
 */
export function linearise(loop: ClosedLoop, x: ArrayLike<number>): Linearisation {
  const { dimension: d, nHistory, bStart, bHistory, quotaIndex } = loop.layout;
  const T = loop.model.delay;
  const L = loop.rule.surveyLag;
  const { growth, params } = loop.model;
  const { harvest } = loop.rule;
  const caps = loop.rule.quotaChange;
  const J: number[][] = Array.from({ length: d }, () => new Array<number>(d).fill(0));

  const n = x[0]!;
  const y = x[L]!;
  let quota = harvest.quota(y);
  // δQ as a vector over the state, and as a lag polynomial in δN (null if it recurses).
  const dQ = new Array<number>(d).fill(0);
  dQ[L] = harvest.quotaSlope(y);
  let dQprev = 0;
  if (caps) {
    const prev = x[quotaIndex]!;
    const capped = capQuota(quota, prev, caps.maxIncrease, caps.maxDecrease);
    if (capped !== quota) {
      dQ[L] = 0;
      dQprev = capped / prev;
      dQ[quotaIndex] = dQprev;
      quota = capped;
    }
  }
  let row0: number[];
  let dB: number[] | null = null;
  if (loop.rule.timing === "before") {
    const takeAll = quota > 0 && quota >= n;
    const dC = takeAll ? unit(d, 0) : dQ;
    const b = n - Math.min(quota, n);
    dB = add(unit(d, 0), dC, -1);
    const densIndex = T === 0 ? -1 : bStart + T - 1;
    const m = T === 0 ? b : x[densIndex]!;
    const g = growth.factor(m, params);
    const p = b > 0 ? b * g : 0;
    if (p < 0) row0 = new Array<number>(d).fill(0);
    else {
      const dM = T === 0 ? dB : unit(d, densIndex);
      row0 = add(scale(dB, g), dM, densityTerm(b, growth.factorSlope(m, params)));
    }
  } else {
    const densIndex = T === 0 ? 0 : T;
    const m = x[densIndex]!;
    const g = growth.factor(m, params);
    const raw = n > 0 ? n * g : 0;
    const dP =
      raw < 0
        ? new Array<number>(d).fill(0)
        : add(scale(unit(d, 0), g), unit(d, densIndex), densityTerm(n, growth.factorSlope(m, params)));
    const p = raw < 0 ? 0 : raw;
    const takeAll = quota > 0 && quota >= p;
    row0 = takeAll ? new Array<number>(d).fill(0) : add(dP, dQ, -1);
  }
  J[0] = row0;
  for (let k = 1; k <= nHistory; k++) J[k]![k - 1] = 1;
  if (bHistory > 0 && dB) {
    J[bStart] = dB;
    for (let k = 1; k < bHistory; k++) J[bStart + k]![bStart + k - 1] = 1;
  }
  if (quotaIndex >= 0) J[quotaIndex] = dQ;

  return { jacobian: J, lagCoefficients: dQprev !== 0 ? null : lagForm(loop, row0, dB, dQ) };
}

/**
 * Rewrites δN[t+1] = row0 · δx[t] as Σ_k a[k]·δN[t−k], replacing each state variable by the
 * past δN it stands for: N-history slot k is δN[t−k]; spawner slot k is δB[t−1−k] with
 * δB = dB · (δN lags); the quota slot is δQ[t−1] = H'(y)·δN[t−1−L].
 */
function unit(d: number, j: number): number[] {
  const v = new Array<number>(d).fill(0);
  v[j] = 1;
  return v;
}

function add(a: readonly number[], b: readonly number[], s = 1): number[] {
  return a.map((v, i) => v + s * b[i]!);
}

function scale(a: readonly number[], s: number): number[] {
  return a.map((v) => v * s);
}

function lagForm(loop: ClosedLoop, row0: number[], dB: number[] | null, dQ: number[]): number[] {
  const { nHistory, bStart, bHistory, quotaIndex, dimension } = loop.layout;
  const L = loop.rule.surveyLag;
  const out = new Array<number>(dimension).fill(0);
  const addAt = (lag: number, v: number) => {
    if (v !== 0) out[lag] = (out[lag] ?? 0) + v;
  };
  // δB (and δQ) as lag polynomials: only N-history entries appear in them.
  const dBlags = dB ? dB.slice(0, nHistory + 1) : [];
  const dQlag = dQ[L]!;
  for (let j = 0; j <= nHistory; j++) addAt(j, row0[j]!);
  for (let k = 0; k < bHistory; k++) {
    const w = row0[bStart + k]!;
    if (w === 0) continue;
    for (let j = 0; j < dBlags.length; j++) addAt(1 + k + j, w * dBlags[j]!);
  }
  if (quotaIndex >= 0) addAt(1 + L, row0[quotaIndex]! * dQlag);
  return out;
}

/**
 * The characteristic polynomial det(zI − J) of the linearised loop, highest power first,
 * from its lag form: P(z) = z^d − a[0]·z^(d−1) − a[1]·z^(d−2) − … − a[d−1], d the state
 * dimension (states the recurrence does not need contribute roots at 0).
 * Source: the characteristic equation of a linear difference equation, e.g. Elaydi, S.
 * (2005). An Introduction to Difference Equations, 3rd ed., Springer, §2.3.
 */
export function characteristicPolynomial(lagCoefficients: readonly number[]): number[] {
  return [1, ...lagCoefficients.map((a) => (a === 0 ? 0 : -a))];
}
