import type { ClosedLoop } from "../policy/closed-loop.js";
import { lyapunovExponent } from "./lyapunov.js";

/** Long-run regimes found by iteration. */
export const REGIMES = ["extinct", "equilibrium", "cycle", "quasi-periodic", "irregular", "transient", "unbounded"] as const;
export type Regime = (typeof REGIMES)[number];

export interface LongRunOptions {
  /** Years iterated before classifying (default 1000). */
  readonly burnIn?: number;
  /** Years observed and classified (default 128; cycles up to period observe/2 are found). */
  readonly observe?: number;
  /** Relative tolerance for "the same value again" (default 1e-7 of max(K, the orbit's level)). */
  readonly tolerance?: number;
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
  const burnIn = options.burnIn ?? 1000;
  const observe = Math.max(8, options.observe ?? 128);
  const bound = 1e6 * loop.model.params.K!;
  const x = Float64Array.from(start);
  const obs = new Float64Array(observe);
  if (loop.layout.dimension === 1) {
    if (scalarOrbit(loop, x, burnIn, obs, bound) === null) return UNBOUNDED;
  } else if (!vectorOrbit(loop, x, burnIn, obs, bound)) return UNBOUNDED;
  return classifyOrbit(loop, obs, x, options.tolerance ?? 1e-7);
}

/**
 * longRun for many one-number loops at once (every loop.layout.dimension === 1), iterated in
 * lockstep so that the independent cells overlap in the processor (a serial orbit waits on
 * each exp()). Each cell drops out as soon as Brent's check finds it periodic; the numbers
 * are identical to longRun's, cell by cell. Loops of higher dimension go through longRun.
 */
export function longRunBatch(loops: readonly ClosedLoop[], start: Float64Array, options: LongRunOptions = {}): LongRun[] {
  const burnIn = options.burnIn ?? 1000;
  const observe = Math.max(8, options.observe ?? 128);
  const tol = options.tolerance ?? 1e-7;
  const m = loops.length;
  const out: LongRun[] = new Array(m);
  const scalar: number[] = [];
  for (let c = 0; c < m; c++) {
    if (loops[c]!.layout.dimension === 1) scalar.push(c);
    else out[c] = longRun(loops[c]!, start, options);
  }
  const k = scalar.length;
  const n = new Float64Array(k).fill(start[0]!);
  const tortoise = new Float64Array(k).fill(start[0]!);
  const power = new Float64Array(k).fill(1);
  const lam = new Float64Array(k);
  const done = new Int32Array(k).fill(-1); // step at which the period was found
  const period = new Int32Array(k);
  const bad = new Uint8Array(k);
  const bounds = new Float64Array(k);
  for (let i = 0; i < k; i++) bounds[i] = 1e6 * loops[scalar[i]!]!.model.params.K!;
  let active = Array.from({ length: k }, (_, i) => i);
  for (let t = 0; t < burnIn && active.length > 0; t++) {
    let w = 0;
    for (let a = 0; a < active.length; a++) {
      const i = active[a]!;
      if (lam[i] === power[i]) {
        tortoise[i] = n[i]!;
        power[i]! *= 2;
        lam[i] = 0;
      }
      const v = loops[scalar[i]!]!.next(n[i]!);
      n[i] = v;
      lam[i]! += 1;
      if (!(v <= bounds[i]!)) {
        bad[i] = 1;
        continue;
      }
      if (v === tortoise[i] && lam[i]! <= MAX_PERIOD) {
        period[i] = lam[i]!;
        done[i] = t + 1;
        continue;
      }
      active[w++] = i;
    }
    active.length = w;
  }
  const x = new Float64Array(1);
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
    const obs = new Float64Array(observe);
    x[0] = v;
    for (let j = 0; j < observe; j++) {
      if (p > 0 && j >= p) obs[j] = obs[j - p]!;
      else {
        obs[j] = v;
        v = loop.next(v);
      }
    }
    if (!(obs.every((o) => o <= bounds[i]!))) {
      out[c] = UNBOUNDED;
      continue;
    }
    out[c] = classifyOrbit(loop, obs, Float64Array.of(x[0]!), tol);
  }
  return out;
}

const UNBOUNDED: LongRun = { regime: "unbounded", period: null, lyapunov: null, towards: null, points: [], min: 0, max: 0, mean: 0 };

/** Burn-in then observation through step(), with Brent's exact cycle skip. False when unbounded. */
function vectorOrbit(loop: ClosedLoop, x: Float64Array, burnIn: number, obs: Float64Array, bound: number): boolean {
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
function classifyOrbit(loop: ClosedLoop, obs: Float64Array, after: Float64Array, tol: number): LongRun {
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
  const base = { min, max, mean };
  if (max <= 1e-9 * K) return { regime: "extinct", period: null, lyapunov: null, towards: null, points: [obs[observe - 1]!], ...base };
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
      const points = Array.from(obs.subarray(observe - k));
      return k === 1
        ? { regime: "equilibrium", period: null, lyapunov: null, towards: null, points: [obs[observe - 1]!], ...base }
        : { regime: "cycle", period: k, lyapunov: null, towards: null, points, ...base };
    }
  }
  const lyapunov = lyapunovExponent(loop, after, observe, Math.max(K, max));
  const points = Array.from(obs);
  if (lyapunov > 0.005) return { regime: "irregular", period: null, lyapunov, towards: null, points, ...base };
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
    return { regime: "transient", period: null, lyapunov, towards, points, ...base };
  }
  // Not monotone and not chaotic: a slowly damped swing or an undamped quasi-periodic one.
  // Look again 8 windows later: a damped swing will have shrunk.
  const early = spread(obs);
  const late = new Float64Array(observe);
  for (let t = 0; t < 7 * observe; t++) loop.step(after, after);
  for (let t = 0; t < observe; t++) {
    late[t] = after[0]!;
    loop.step(after, after);
  }
  if (spread(late) < 0.8 * early) return { regime: "transient", period: null, lyapunov, towards: "equilibrium", points, ...base };
  return { regime: "quasi-periodic", period: null, lyapunov, towards: null, points, ...base };

  function spread(v: Float64Array): number {
    let lo = Infinity;
    let hi = -Infinity;
    for (const a of v) {
      if (a < lo) lo = a;
      if (a > hi) hi = a;
    }
    return hi - lo;
  }
}

function sameState(a: Float64Array, b: Float64Array): boolean {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/**
 * Burn-in and observation for a one-number state through loop.next(), with the same Brent
 * cycle skip as the vector path (identical numbers, fewer allocations and calls).
 * Returns the observed values' period (0 if none found) and the state after burn-in in `x`.
 */
function scalarOrbit(loop: ClosedLoop, x: Float64Array, burnIn: number, obs: Float64Array, bound: number): number | null {
  let n = x[0]!;
  let tortoise = n;
  let power = 1;
  let lam = 0;
  let period = 0;
  let t = 0;
  for (; t < burnIn; t++) {
    if (lam === power) {
      tortoise = n;
      power *= 2;
      lam = 0;
    }
    n = loop.next(n);
    lam++;
    if (!(n <= bound)) return null;
    if (n === tortoise && lam <= MAX_PERIOD) {
      period = lam;
      t++;
      break;
    }
  }
  if (period > 0) for (let k = (burnIn - t) % period; k > 0; k--) n = loop.next(n);
  x[0] = n;
  for (let i = 0; i < obs.length; i++) {
    if (period > 0 && i >= period) obs[i] = obs[i - period]!;
    else {
      obs[i] = n;
      n = loop.next(n);
    }
  }
  return period;
}
