import type { ClosedLoop } from "../policy/closed-loop.js";
import { brentRoot } from "../numeric/brent-root.js";
import { findEquilibria } from "./equilibria.js";
import { characteristicPolynomial, linearise } from "./jacobian.js";
import { juryVerdict, type JuryCode } from "./jury-verdict.js";
import { equilibriumResidual, steadyState } from "./steady-state.js";

/** The linear verdict of an equilibrium, or "none" when the loop has no positive equilibrium. */
export type OperatingVerdict = "stable" | "marginal" | "unstable" | "none";

const NAMES = { 1: "stable", 0: "marginal", [-1]: "unstable", [-2]: "none" } as const;

/**
 * The Jury verdict (stable, marginal, unstable) of the largest positive equilibrium of the
 * loop, or "none" when it has none (the stock collapses). A light version of
 * analyseStability for sweeps: a coarser bracketing grid and no report.
 *
 * With `near` (the same equilibrium's abundance at a neighbouring parameter value) the root
 * is first sought by continuation: a sign change of φ(N) = G(x*(N))[0] − N from + to − within
 * ±2%, ±10% or ±50% of `near`, refined by Brent's method; only if none is found is the whole
 * interval searched. Continuation follows the equilibrium it started on, which is the
 * largest one unless a new, larger equilibrium appears between neighbouring values.
 */
export function operatingVerdict(
  loop: ClosedLoop,
  near?: number,
  gridPoints = 100,
): { verdict: OperatingVerdict; abundance: number } {
  let abundance = -1;
  if (near !== undefined && near > 0) {
    const phi = equilibriumResidual(loop);
    for (const d of [0.02, 0.1, 0.5]) {
      const lo = near * (1 - d);
      const hi = near * (1 + d);
      if (phi(lo) > 0 && phi(hi) < 0) {
        abundance = brentRoot(phi, lo, hi);
        break;
      }
    }
  }
  if (!(abundance > 0)) {
    const set = findEquilibria(loop, { gridPoints });
    for (const e of set.equilibria) {
      if (e.abundance > 0) {
        abundance = e.abundance;
        if (e.multiplicity === "double") return { verdict: "marginal", abundance };
      }
    }
  }
  if (!(abundance > 0)) return { verdict: "none", abundance: 0 };
  const lin = linearise(loop, steadyState(loop, abundance));
  if (!lin.lagCoefficients) return { verdict: "none", abundance };
  // −2 from juryVerdict (a polynomial it cannot judge) has no linear verdict either.
  const code: JuryCode = juryVerdict(characteristicPolynomial(lin.lagCoefficients));
  return { verdict: NAMES[code], abundance };
}
