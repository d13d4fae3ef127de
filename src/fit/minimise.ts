import { nelderMead } from "./nelder-mead.js";
import { newtonPolish } from "./newton-polish.js";
import type { Uniform } from "../sim/rng.js";

/** A minimisation's result, with an honest account of how it ended. */
export interface Optimum {
  readonly x: number[];
  readonly value: number;
  /** Total simplex iterations plus Newton iterations. */
  readonly iterations: number;
  readonly gradientNorm: number;
  /** Newton decrement at the optimum: the further decrease a Newton step predicts. */
  readonly decrement: number;
  readonly converged: boolean;
  /** How many starts were run, and how many reached within 1e-6 (relative) of the best value. */
  readonly starts: number;
  readonly agreeingStarts: number;
}

/**
 * Multi-start minimiser that survives bad starts: Nelder–Mead from the given start and from
 * `extraStarts` random points (seeded) drawn within ±`spread` of it in the (transformed)
 * coordinates, each restarted once from its own result, then a damped-Newton polish of the
 * best (`quick`: one simplex pass per start and at most 3 Newton steps, for warm-started
 * refits such as the bootstrap's). `converged` requires the polish to converge with a Newton decrement below
 * 1e-9·|f| (no further decrease worth a billionth of the objective is predicted).
 * Sources: Nelder & Mead (1965), Computer Journal 7: 308–313; restarts as recommended by
 * Lagarias et al. (1998), SIAM J. Optim. 9: 112–147; polish as in newton-polish.ts.
 */
export function minimise(
  f: (x: readonly number[]) => number,
  start: readonly number[],
  options: {
    random?: Uniform;
    extraStarts?: number;
    spread?: number;
    maxIter?: number;
    quick?: boolean;
  } = {},
): Optimum {
  const extra = options.random ? (options.extraStarts ?? 8) : 0;
  const spread = options.spread ?? 2;
  const starts: number[][] = [Array.from(start)];
  for (let k = 0; k < extra; k++)
    starts.push(start.map((v) => v + spread * (2 * options.random!() - 1) * Math.max(1, Math.abs(v))));
  let iterations = 0;
  const results = starts.map((s) => {
    // Loose simplex tolerances: the Newton polish supplies the last digits.
    const a = nelderMead(f, s, { maxIter: options.maxIter, tol: 1e-6, xtol: 1e-3 });
    // One restart from the simplex's own result, unless it already agrees with a fresh
    // simplex's stopping rule (quick mode never restarts; the polish takes it from there).
    if (options.quick || a.converged) {
      iterations += a.iterations;
      return a;
    }
    const b = nelderMead(f, a.x, { maxIter: options.maxIter, tol: 1e-6, xtol: 1e-3 });
    iterations += a.iterations + b.iterations;
    return b;
  });
  let best = results[0]!;
  for (const r of results) if (r.value < best.value) best = r;
  const polished = newtonPolish(f, best.x, options.quick ? 3 : 100);
  iterations += polished.iterations;
  const final =
    polished.value <= best.value ? polished : { ...best, gradientNorm: Infinity, decrement: Infinity };
  const agreeing = results.filter(
    (r) => Math.abs(r.value - final.value) <= 1e-6 * (Math.abs(final.value) + 1e-12),
  ).length;
  return {
    x: final.x,
    value: final.value,
    iterations,
    gradientNorm: final.gradientNorm,
    converged: polished.converged && final.decrement <= 1e-9 * (Math.abs(final.value) + 1e-12),
    decrement: final.decrement,
    starts: starts.length,
    agreeingStarts: agreeing,
  };
}
