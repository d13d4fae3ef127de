import { brentRoot } from "../numeric/brent-root.js";
import { maximiseOnInterval } from "../numeric/golden-section.js";
import type { ClosedLoop } from "../policy/closed-loop.js";
import { equilibriumResidual, steadyState } from "./steady-state.js";

/** One equilibrium of the closed loop. */
export interface Equilibrium {
  /** N*: the abundance at the start of each year. */
  readonly abundance: number;
  /** The quota H(N*) and the catch C* actually taken each year at equilibrium. */
  readonly quota: number;
  readonly catch: number;
  /** The full state vector x* (history, spawners, last quota). */
  readonly state: number[];
  /** "double" for a tangency (a quota exactly at the largest surplus: the fold itself). */
  readonly multiplicity: "simple" | "double";
}

export interface EquilibriumSet {
  readonly equilibria: Equilibrium[];
  /** The upper end of the search interval [0, U]. */
  readonly searchedUpTo: number;
  /** True when no positive equilibrium exists: the stock collapses (or is held by stocking alone). */
  readonly noPositiveEquilibrium: boolean;
}

export interface EquilibriumOptions {
  /** Evenly spaced bracketing points on [0, U] (plus 60 log-spaced ones near 0). */
  readonly gridPoints?: number;
}

/**
 * All equilibria of the closed loop on [0, U]: the zeros of φ(N) = G(x*(N))[0] − N.
 *
 * ## Method
 * 1. U starts at 2K + 2A and doubles until φ(U) < 0 (every family here declines above K,
 *    so production cannot keep up beyond some U).
 * 2. φ is sampled on an even grid over [0, U] and a log grid from 1e-10·K (small
 *    equilibria such as an Allee threshold under harvest); each sign change is refined with
 *    Brent's method (Brent 1973, Algorithms for Minimization without Derivatives, ch. 4).
 * 3. A local extremum of φ that touches zero without a sign change (within 1e-9·K) is a
 *    double root — the fold point where two equilibria meet — found by a golden-section
 *    search of φ's extremum.
 * Roots closer than 1e-9·U are merged. N = 0 is an equilibrium whenever φ(0) = 0.
 */
export function findEquilibria(loop: ClosedLoop, options: EquilibriumOptions = {}): EquilibriumSet {
  const phi = equilibriumResidual(loop);
  const K = loop.model.params.K!;
  const A = loop.rule.stocking;
  let upper = 2 * K + 2 * A;
  for (let i = 0; i < 60 && phi(upper) > 0; i++) upper *= 2;
  const gridPoints = options.gridPoints ?? 2000;
  const tol = 1e-9 * K;
  const roots: { n: number; double: boolean }[] = [];
  const grid = scanGrid(upper, Math.min(K, upper), gridPoints);
  const m = grid.length;
  const fs = new Float64Array(m);
  for (let i = 0; i < m; i++) fs[i] = phi(grid[i]!);
  for (let i = 0; i < m; i++) {
    const f = fs[i]!;
    if (f === 0) roots.push({ n: grid[i]!, double: false });
    if (i + 1 < m && f * fs[i + 1]! < 0)
      roots.push({ n: brentRoot(phi, grid[i]!, grid[i + 1]!), double: false });
    if (i > 0 && i + 1 < m && f !== 0) {
      const prev = fs[i - 1]!;
      const next = fs[i + 1]!;
      const extremum = (f > prev && f >= next && f < 0) || (f < prev && f <= next && f > 0);
      if (extremum && Math.abs(f) < 1e3 * tol) {
        const sign = f < 0 ? 1 : -1;
        const best = maximiseOnInterval((v) => sign * phi(v), grid[i - 1]!, grid[i + 1]!, 16);
        if (Math.abs(best.value) <= tol) roots.push({ n: best.x, double: true });
      }
    }
  }
  roots.sort((a, b) => a.n - b.n);
  const merged: { n: number; double: boolean }[] = [];
  for (const r of roots) {
    const last = merged[merged.length - 1];
    if (last && Math.abs(r.n - last.n) <= 1e-9 * upper) {
      last.double ||= r.double;
      continue;
    }
    merged.push({ ...r });
  }
  const equilibria = merged.map(({ n, double }) => describe(loop, n, double));
  return { equilibria, searchedUpTo: upper, noPositiveEquilibrium: !equilibria.some((e) => e.abundance > 0) };
}

const grids = new Map<string, Float64Array>();

/**
 * The search grid: 0, then the merge of the log grid (61 points from 1e-10·logTop to logTop)
 * and the even grid (upper·i/points, i = 1 … points), increasing, without repeats. Grids are
 * kept (read-only) for the last few (upper, logTop, points), since most searches one after another
 * share their K.
 */
function scanGrid(upper: number, logTop: number, points: number): Float64Array {
  const key = `${upper} ${logTop} ${points}`;
  const hit = grids.get(key);
  if (hit) return hit;
  const out: number[] = [0];
  let li = 0;
  let ei = 1;
  while (li <= 60 || ei <= points) {
    const lv = li <= 60 ? logTop * Math.pow(10, -10 + (10 * li) / 60) : Infinity;
    const ev = ei <= points ? (upper * ei) / points : Infinity;
    const v = lv < ev ? lv : ev;
    if (lv < ev) li++;
    else ei++;
    if (v > out[out.length - 1]!) out.push(v);
  }
  const grid = Float64Array.from(out);
  if (grids.size >= 16) grids.delete(grids.keys().next().value!);
  grids.set(key, grid);
  return grid;
}

function describe(loop: ClosedLoop, n: number, double: boolean): Equilibrium {
  const state = steadyState(loop, n);
  const next = new Float64Array(state.length);
  const rec = { survey: 0, quota: 0, catch: 0, stocking: 0 };
  loop.step(state, next, rec);
  return {
    abundance: n,
    quota: rec.quota,
    catch: rec.catch,
    state: Array.from(state),
    multiplicity: double ? "double" : "simple",
  };
}
