import { hessian } from "./derivatives.js";
import { solveLinear } from "./newton-polish.js";

/**
 * Standard errors and correlations from the observed information: the inverse of the Hessian
 * of the negative log-likelihood at the optimum, on the natural parameter scale,
 *   Cov(θ̂) ≈ H⁻¹,   se_i = √(H⁻¹)_ii,   ρ_ij = (H⁻¹)_ij / (se_i·se_j).
 * Returns null entries where H is singular or not positive definite (an unidentified
 * direction: the data cannot pin the parameters down).
 * Source: Pawitan, Y. (2001). In All Likelihood. Oxford University Press, §2.5 and §9.
 */
export function covarianceFromHessian(
  f: (x: readonly number[]) => number,
  at: readonly number[],
): { se: (number | null)[]; correlation: (number | null)[][]; positiveDefinite: boolean } {
  const n = at.length;
  const H = hessian(f, at);
  const inv: number[][] = [];
  let ok = true;
  for (let j = 0; j < n; j++) {
    const e = new Array<number>(n).fill(0);
    e[j] = 1;
    const col = solveLinear(H, e);
    if (!col) {
      ok = false;
      break;
    }
    inv.push(col);
  }
  if (!ok)
    return { se: at.map(() => null), correlation: at.map(() => at.map(() => null)), positiveDefinite: false };
  const se = at.map((_, i) => (inv[i]![i]! > 0 ? Math.sqrt(inv[i]![i]!) : null));
  const positiveDefinite = se.every((v) => v !== null);
  const correlation = at.map((_, i) =>
    at.map((_, j) => (se[i] && se[j] ? Math.max(-1, Math.min(1, inv[j]![i]! / (se[i]! * se[j]!))) : null)),
  );
  return { se, correlation, positiveDefinite };
}
