import { gradient, hessian } from "./derivatives.js";
import type { Minimum } from "./nelder-mead.js";

/** Solves A·x = b for a small dense symmetric system by Gaussian elimination with pivoting; null if singular. */
export function solveLinear(A: readonly (readonly number[])[], b: readonly number[]): number[] | null {
  const n = b.length;
  const M = A.map((r, i) => [...r, b[i]!]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r]![c]!) > Math.abs(M[p]![c]!)) p = r;
    if (!(Math.abs(M[p]![c]!) > 1e-300)) return null;
    [M[c], M[p]] = [M[p]!, M[c]!];
    for (let r = c + 1; r < n; r++) {
      const k = M[r]![c]! / M[c]![c]!;
      for (let j = c; j <= n; j++) M[r]![j]! -= k * M[c]![j]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = M[r]![n]!;
    for (let j = r + 1; j < n; j++) s -= M[r]![j]! * x[j]!;
    x[r] = s / M[r]![r]!;
  }
  return x.every(Number.isFinite) ? x : null;
}

/**
 * Damped Newton polish of a minimum found by a global or simplex search.
 *
 * ## Method
 * Step δ solves (H + λ·diag(|H|) + λ·I)·δ = −g with the finite-difference gradient and
 * Hessian (derivatives.ts); λ starts at 1e-6 and is raised tenfold until the step lowers f,
 * lowered tenfold after a success (the Levenberg–Marquardt damping strategy applied to a
 * general objective). Stops when the step changes f by less than 1e-15 relative or λ exceeds
 * 1e8; reports the final gradient norm and Newton decrement gᵀH⁻¹g/2 (the decrease a further
 * Newton step predicts — scale-free, unlike the gradient norm).
 * Sources: Levenberg, K. (1944). Q. Appl. Math. 2: 164–168; Marquardt, D. W. (1963). J. Soc.
 * Ind. Appl. Math. 11: 431–441; Nocedal & Wright (2006), ch. 3 and 10.
 */
export function newtonPolish(
  f: (x: readonly number[]) => number,
  start: readonly number[],
  maxIter = 100,
): Minimum & { gradientNorm: number; decrement: number } {
  let x = Array.from(start);
  let fx = f(x);
  let lambda = 1e-6;
  let it = 0;
  let converged = false;
  let lastH: number[][] | null = null;
  let lastG: number[] | null = null;
  for (; it < maxIter; it++) {
    const H = hessian(f, x);
    const g = gradient(f, x, undefined, H);
    lastH = H;
    lastG = g;
    let improved = false;
    while (lambda <= 1e8) {
      const A = H.map((row, i) => row.map((v, j) => (i === j ? v + lambda * (Math.abs(v) + 1) : v)));
      const d = solveLinear(
        A,
        g.map((v) => -v),
      );
      if (d) {
        const xn = x.map((v, i) => v + d[i]!);
        const fn = f(xn);
        if (Number.isFinite(fn) && fn <= fx) {
          const change = fx - fn;
          x = xn;
          fx = fn;
          lastH = null;
          lambda = Math.max(lambda / 10, 1e-12);
          improved = true;
          if (change <= 1e-15 * (Math.abs(fx) + 1e-300)) converged = true;
          break;
        }
      }
      lambda *= 10;
    }
    if (!improved) {
      converged = true;
      break;
    }
    if (converged) break;
  }
  // Derivatives at the final point: reuse the last iteration's when the point did not move.
  const H = lastH ?? hessian(f, x);
  const g = lastH && lastG ? lastG : gradient(f, x, undefined, H);
  const d = solveLinear(H, g);
  // Newton decrement gᵀH⁻¹g/2: the decrease a full Newton step still predicts.
  const decrement = d ? Math.abs(g.reduce((s, v, i) => s + v * d[i]!, 0)) / 2 : Infinity;
  return { x, value: fx, iterations: it, converged, gradientNorm: Math.hypot(...g), decrement };
}
