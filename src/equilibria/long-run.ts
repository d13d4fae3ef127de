import type { ClosedLoop } from "../policy/closed-loop.js";
import { burnInLanes } from "./burn-in-lanes.js";
import { lyapunovExponent } from "./lyapunov.js";

/** Long-run regimes found by iteration. */
export const REGIMES = [
  "extinct",
  "equilibrium",
  "cycle",
  "quasi-periodic",
  "irregular",
  "transient",
  "unbounded",
] as const;
export type Regime = (typeof REGIMES)[number];

export interface LongRunOptions {
  /** Years iterated before classifying (default 1000). */
  readonly burnIn?: number;
  /** Years observed and classified (default 128; cycles up to period observe/2 are found). */
  readonly observe?: number;
  /** Relative tolerance for "the same value again" (default 1e-7 of max(K, the orbit's level)). */
  readonly tolerance?: number;
  /** Keep the observed points in the result (default true; maps turn it off). */
  readonly points?: boolean;
}

export interface LongRun {
  readonly regime: Regime;
  /** Period in years of a cycle, else null. */
  readonly period: number | null;
  /** Largest Lyapunov exponent per year, when it was needed to decide, else null. */
  readonly lyapunov: number | null;
  /** For a transient: where the orbit is heading. */
  readonly towards: "extinction" | "equilibrium" | null;
  /** The observed abundances (the cycle's points for a cycle). */
  readonly points: number[];
  readonly min: number;
  readonly max: number;
  readonly mean: number;
}

/** Largest period searched for a cycle. */
export const MAX_PERIOD = 64;

/**
 * The long-run behaviour of the closed loop from a start state, by iteration.
 *
 * ## Method
 * 1. Iterate `burnIn` years; a state above 1e6·K or non-finite is "unbounded".
 * 2. Record `observe` years of N. With S = max(K, max N) and tol·S as "equal":
 *    - extinct: every observed N ≤ 1e-9·K;
 *    - equilibrium: successive values equal;
 *    - cycle of period k: the smallest k ≤ min(64, observe/2) with N[t+k] = N[t] throughout;
 * 3. Otherwise the largest Lyapunov exponent λ over the window decides (Benettin et al.
 *    1980): λ > 0.005 per year is "irregular" (chaotic). With λ ≤ 0.005 the orbit is either a
 *    slow transient — monotone through the window (heading for extinction when falling and
 *    either speeding up or with Aitken's Δ² extrapolation of its tail below 1% of K, else for
 *    an equilibrium), or a
 *    swing that has shrunk below 80% of its size when looked at again eight windows later —
 *    or "quasi-periodic" (an undamped swing that never repeats exactly, as after a
 *    Neimark–Sacker loss of stability). A slow transient is therefore never "irregular".
 * The thresholds 0.005 and 80% are common practice, no source.
 */
export function longRun(loop: ClosedLoop, start: Float64Array, options: LongRunOptions = {}): LongRun {
  // A one-number state goes through the batched path (one lane), the same numbers either way
  // (tests/equilibria/long-run-lanes.test.ts holds the lanes to longRunByOrbit).
  if (loop.layout.dimension === 1) return longRunBatch([loop], start, options)[0]!;
  return longRunByOrbit(loop, start, options);
}

/**
 * longRun by the plain path for any state: the full state vector stepped by loop.step, one
 * year at a time. The reference the batched lanes are tested against.
 */
export function longRunByOrbit(loop: ClosedLoop, start: Float64Array, options: LongRunOptions = {}): LongRun {
  const burnIn = options.burnIn ?? 1000;
  const observe = Math.max(8, options.observe ?? 128);
  const bound = 1e6 * loop.model.params.K!;
  const x = Float64Array.from(start);
  const obs = new Float64Array(observe);
  if (!vectorOrbit(loop, x, burnIn, obs, bound)) return UNBOUNDED;
  return classifyOrbit(loop, obs, x, options.tolerance ?? 1e-7);
}

/**
 * longRun for many one-number loops at once (every loop.layout.dimension === 1), iterated in
 * lockstep so that the independent cells overlap in the processor (a serial orbit waits on
 * each exp()). Each cell drops out as soon as Brent's check finds it periodic; the numbers
 * are identical to longRun's, cell by cell. Loops of higher dimension go through longRun.
 */
export function longRunBatch(
  loops: readonly ClosedLoop[],
  start: Float64Array,
  options: LongRunOptions = {},
): LongRun[] {
  const burnIn = options.burnIn ?? 1000;
  const observe = Math.max(8, options.observe ?? 128);
  const tol = options.tolerance ?? 1e-7;
  const m = loops.length;
  const out: LongRun[] = new Array(m);
  const scalar: number[] = [];
  for (let c = 0; c < m; c++) {
    if (loops[c]!.layout.dimension === 1) scalar.push(c);
    else out[c] = longRunByOrbit(loops[c]!, start, options);
  }
  const k = scalar.length;
  const n = new Float64Array(k);
  const done = new Int32Array(k); // steps taken when the burn-in stopped (period found or complete)
  const period = new Int32Array(k);
  const bad = new Uint8Array(k);
  const bounds = new Float64Array(k);
  for (let i = 0; i < k; i++) bounds[i] = 1e6 * loops[scalar[i]!]!.model.params.K!;
  burnInLanes(loops, scalar, start[0]!, burnIn, bounds, n, period, done, bad, MAX_PERIOD);
  const after = new Float64Array(1);
  const obs = new Float64Array(observe);
  const keep = options.points ?? true;
  for (let i = 0; i < k; i++) {
    const c = scalar[i]!;
    if (bad[i]) {
      out[c] = UNBOUNDED;
      continue;
    }
    const loop = loops[c]!;
    let v = n[i]!;
    const p = period[i]!;
    if (p > 0) for (let s = (burnIn - done[i]!) % p; s > 0; s--) v = loop.next(v);
    after[0] = v;
    let inside = true;
    for (let j = 0; j < observe; j++) {
      if (p > 0 && j >= p) obs[j] = obs[j - p]!;
      else {
        obs[j] = v;
        v = loop.next(v);
      }
      if (!(obs[j]! <= bounds[i]!)) inside = false;
    }
    out[c] = inside ? classifyOrbit(loop, obs, after, tol, keep) : UNBOUNDED;
  }
  return out;
}

const UNBOUNDED: LongRun = {
  regime: "unbounded",
  period: null,
  lyapunov: null,
  towards: null,
  points: [],
  min: 0,
  max: 0,
  mean: 0,
};

/** Burn-in then observation through step(), with Brent's exact cycle skip. False when unbounded. */
function vectorOrbit(
  loop: ClosedLoop,
  x: Float64Array,
  burnIn: number,
  obs: Float64Array,
  bound: number,
): boolean {
  const tortoise = Float64Array.from(x);
  let power = 1;
  let lam = 0;
  let period = 0;
  let t = 0;
  for (; t < burnIn; t++) {
    if (lam === power) {
      tortoise.set(x);
      power *= 2;
      lam = 0;
    }
    loop.step(x, x);
    lam++;
    if (!(x[0]! <= bound)) return false;
    if (lam <= MAX_PERIOD && sameState(x, tortoise)) {
      period = lam;
      t++;
      break;
    }
  }
  if (period > 0) for (let k = (burnIn - t) % period; k > 0; k--) loop.step(x, x);
  const y = Float64Array.from(x);
  for (let i = 0; i < obs.length; i++) {
    if (period > 0 && i >= period) obs[i] = obs[i - period]!;
    else {
      obs[i] = y[0]!;
      loop.step(y, y);
    }
  }
  for (const v of obs) if (!(v <= bound)) return false;
  return true;
}

/**
 * Classifies an observed window of abundances (steps 2–3 of longRun's method). `after` is the
 * state at the start of the window (it is advanced if a Lyapunov exponent is needed).
 */
function classifyOrbit(
  loop: ClosedLoop,
  obs: Float64Array,
  after: Float64Array,
  tol: number,
  keepPoints = true,
): LongRun {
  const observe = obs.length;
  const K = loop.model.params.K!;
  let min = Infinity;
  let max = -Infinity;
  let sum = 0;
  for (let i = 0; i < observe; i++) {
    const n = obs[i]!;
    if (n < min) min = n;
    if (n > max) max = n;
    sum += n;
  }
  const mean = sum / observe;
  if (max <= 1e-9 * K)
    return orbitResult("extinct", null, null, null, keepPoints ? [obs[observe - 1]!] : [], min, max, mean);
  const eq = tol * Math.max(K, max);
  const maxPeriod = Math.min(MAX_PERIOD, Math.floor(observe / 2));
  for (let k = 1; k <= maxPeriod; k++) {
    let repeats = true;
    for (let t = 0; t + k < observe; t++) {
      if (Math.abs(obs[t + k]! - obs[t]!) > eq) {
        repeats = false;
        break;
      }
    }
    if (repeats) {
      const points = keepPoints ? Array.from(obs.subarray(observe - k)) : [];
      return k === 1
        ? orbitResult("equilibrium", null, null, null, keepPoints ? [obs[observe - 1]!] : [], min, max, mean)
        : orbitResult("cycle", k, null, null, points, min, max, mean);
    }
  }
  const lyapunov = lyapunovExponent(loop, after, observe, Math.max(K, max));
  const points = keepPoints ? Array.from(obs) : [];
  if (lyapunov > 0.005) return orbitResult("irregular", null, lyapunov, null, points, min, max, mean);
  let rising = true;
  let falling = true;
  for (let t = 1; t < observe; t++) {
    if (obs[t]! > obs[t - 1]! + eq) falling = false;
    if (obs[t]! < obs[t - 1]! - eq) rising = false;
  }
  if (rising || falling) {
    // Aitken's Δ² extrapolation of the monotone tail estimates where it is heading.
    const [x0, x1, x2] = [obs[observe - 3]!, obs[observe - 2]!, obs[observe - 1]!];
    const denom = x2 - 2 * x1 + x0;
    const limit = denom !== 0 ? x2 - ((x2 - x1) * (x2 - x1)) / denom : x2;
    // A decline that speeds up is leaving an unstable level (an Allee threshold) downwards.
    const speeding = Math.abs(obs[observe - 1]! - obs[observe - 2]!) > Math.abs(obs[1]! - obs[0]!);
    const towards = falling && (speeding || limit < 0.01 * Math.max(K, max)) ? "extinction" : "equilibrium";
    return orbitResult("transient", null, lyapunov, towards, points, min, max, mean);
  }
  // Not monotone and not chaotic: a slowly damped swing or an undamped quasi-periodic one.
  // Look again 8 windows later: a damped swing will have shrunk.
  const early = spread(obs);
  const late = new Float64Array(observe);
  const scalar = loop.layout.dimension === 1;
  let v = after[0]!;
  for (let t = 0; t < 7 * observe; t++) {
    if (scalar) v = loop.next(v);
    else loop.step(after, after);
  }
  for (let t = 0; t < observe; t++) {
    if (scalar) {
      late[t] = v;
      v = loop.next(v);
    } else {
      late[t] = after[0]!;
      loop.step(after, after);
    }
  }
  if (spread(late) < 0.8 * early)
    return orbitResult("transient", null, lyapunov, "equilibrium", points, min, max, mean);
  return orbitResult("quasi-periodic", null, lyapunov, null, points, min, max, mean);
}

function spread(v: Float64Array): number {
  let lo = Infinity;
  let hi = -Infinity;
  for (const a of v) {
    if (a < lo) lo = a;
    if (a > hi) hi = a;
  }
  return hi - lo;
}

function orbitResult(
  regime: Regime,
  period: number | null,
  lyapunov: number | null,
  towards: LongRun["towards"],
  points: number[],
  min: number,
  max: number,
  mean: number,
): LongRun {
  return { regime, period, lyapunov, towards, points, min, max, mean };
}

function sameState(a: Float64Array, b: Float64Array): boolean {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}
