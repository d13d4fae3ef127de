import { EigenvalueDecomposition, Matrix } from "ml-matrix";

/** A complex number re + i·im. */
export interface Complex {
  readonly re: number;
  readonly im: number;
}

/**
 * Eigenvalues of a real square matrix, from ml-matrix's EigenvalueDecomposition (the
 * EISPACK/JAMA routines orthes + hqr2: Hessenberg reduction then shifted QR), sorted by
 * decreasing modulus.
 * Source: Wilkinson, J. H. & Reinsch, C. (1971). Handbook for Automatic Computation vol. II,
 * Linear Algebra. Springer (hqr2), as ported to JavaScript in ml-matrix.
 */
export function eigenvalues(matrix: readonly (readonly number[])[]): Complex[] {
  if (matrix.length === 0) return [];
  const evd = new EigenvalueDecomposition(new Matrix(matrix.map((r) => [...r])), { assumeSymmetric: false });
  const out: Complex[] = evd.realEigenvalues.map((re, i) => ({
    re: re + 0,
    im: evd.imaginaryEigenvalues[i]! + 0,
  }));
  return out.sort((a, b) => Math.hypot(b.re, b.im) - Math.hypot(a.re, a.im));
}

/**
 * The companion matrix of P(z) = c0·z^n + c1·z^(n−1) + … + cn (highest power first, c0 ≠ 0):
 * first row −c1/c0 … −cn/c0, ones on the subdiagonal. Its eigenvalues are the roots of P,
 * as numpy.roots computes them.
 */
export function companionMatrix(coefficients: readonly number[]): number[][] {
  const n = coefficients.length - 1;
  const c0 = coefficients[0]!;
  const m: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let j = 0; j < n; j++) m[0]![j] = -coefficients[j + 1]! / c0;
  for (let i = 1; i < n; i++) m[i]![i - 1] = 1;
  return m;
}

/** Roots of a real polynomial (highest power first) as companion-matrix eigenvalues. */
export function polynomialRoots(coefficients: readonly number[]): Complex[] {
  let start = 0;
  while (start < coefficients.length - 1 && coefficients[start] === 0) start++;
  const c = coefficients.slice(start);
  return c.length < 2 ? [] : eigenvalues(companionMatrix(c));
}

/** |z|. */
export function modulus(z: Complex): number {
  return Math.hypot(z.re, z.im);
}
