import type { ClosedLoop } from "../policy/closed-loop.js";
import { classifyEquilibrium, type StabilityVerdict } from "./classify.js";
import { eigenvalues, polynomialRoots, type Complex } from "./eigenvalues.js";
import { findEquilibria, type Equilibrium, type EquilibriumOptions } from "./equilibria.js";
import { characteristicPolynomial, linearise } from "./jacobian.js";
import { juryTest, JURY_TOLERANCE, type JuryTable } from "./jury.js";

/** The linear stability of one equilibrium. */
export interface EquilibriumStability {
  readonly equilibrium: Equilibrium;
  readonly jacobian: number[][];
  /** det(zI − J), highest power first. */
  readonly characteristicPolynomial: number[];
  readonly jury: JuryTable;
  /** Eigenvalues of J by decreasing modulus. */
  readonly eigenvalues: Complex[];
  readonly verdict: StabilityVerdict;
}

export interface StabilityAnalysis {
  readonly equilibria: EquilibriumStability[];
  readonly noPositiveEquilibrium: boolean;
  readonly searchedUpTo: number;
  /** The equilibrium a manager operates at: the largest stable positive one, else the largest positive one, else null. */
  readonly operating: number | null;
}

/**
 * Every equilibrium of the closed loop with its Jacobian, characteristic polynomial, Jury
 * table, eigenvalues and verdict. See findEquilibria, linearise, juryTest and
 * classifyEquilibrium for the methods and sources.
 */
export function analyseStability(
  loop: ClosedLoop,
  options: EquilibriumOptions & { tolerance?: number } = {},
): StabilityAnalysis {
  const set = findEquilibria(loop, options);
  const equilibria = set.equilibria.map((e) =>
    equilibriumStability(loop, e, options.tolerance ?? JURY_TOLERANCE),
  );
  return {
    equilibria,
    noPositiveEquilibrium: set.noPositiveEquilibrium,
    searchedUpTo: set.searchedUpTo,
    operating: operatingIndex(equilibria),
  };
}

/** The linear stability of one equilibrium of the loop. */
export function equilibriumStability(
  loop: ClosedLoop,
  equilibrium: Equilibrium,
  tolerance = JURY_TOLERANCE,
): EquilibriumStability {
  const lin = linearise(loop, equilibrium.state);
  const poly = lin.lagCoefficients
    ? characteristicPolynomial(lin.lagCoefficients)
    : polynomialFromRoots(eigenvalues(lin.jacobian));
  const jury = juryTest(poly, tolerance);
  if (!jury.ok) throw new Error("equilibriumStability: a characteristic polynomial is monic and finite");
  // Roots from the companion matrix of the exact polynomial (better conditioned than J's).
  const eigs = polynomialRoots(poly);
  const verdict =
    equilibrium.multiplicity === "double" && jury.value.verdict !== "unstable"
      ? "marginal"
      : jury.value.verdict;
  return {
    equilibrium,
    jacobian: lin.jacobian,
    characteristicPolynomial: poly,
    jury: jury.value,
    eigenvalues: eigs,
    verdict: classifyEquilibrium(verdict, eigs),
  };
}

function operatingIndex(list: readonly EquilibriumStability[]): number | null {
  let best: number | null = null;
  for (let i = 0; i < list.length; i++) {
    const e = list[i]!;
    if (e.equilibrium.abundance > 0 && e.verdict.kind.startsWith("stable")) best = i;
  }
  if (best !== null) return best;
  for (let i = 0; i < list.length; i++) if (list[i]!.equilibrium.abundance > 0) best = i;
  return best;
}

/** Π (z − λ_i), highest power first, real parts kept (complex roots come in pairs). */
function polynomialFromRoots(roots: readonly Complex[]): number[] {
  let re = [1];
  let im = [0];
  for (const r of roots) {
    const nr = new Array<number>(re.length + 1).fill(0);
    const ni = new Array<number>(re.length + 1).fill(0);
    for (let i = 0; i < re.length; i++) {
      nr[i]! += re[i]!;
      ni[i]! += im[i]!;
      nr[i + 1]! -= re[i]! * r.re - im[i]! * r.im;
      ni[i + 1]! -= re[i]! * r.im + im[i]! * r.re;
    }
    re = nr;
    im = ni;
  }
  return re;
}
