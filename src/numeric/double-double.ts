/**
 * Error-free products and sums for an accurate 2×2 determinant a·d − b·c.
 *
 * ## Method
 * 1. Veltkamp's split x = hi + lo with 26-bit halves (constant 2^27 + 1).
 * 2. Dekker's TwoProduct: a·b = p + e exactly, e from the split halves.
 * 3. Knuth's TwoSum for the difference of the two products, then the error terms are added,
 *    so the result carries about twice the working precision before its final rounding.
 * Sources: Dekker, T. J. (1971). A floating-point technique for extending the available
 * precision. Numer. Math. 18: 224–242; Knuth, D. E. The Art of Computer Programming vol. 2,
 * §4.2.2; Ogita, T., Rump, S. M. & Oishi, S. (2005). Accurate sum and dot product. SIAM J.
 * Sci. Comput. 26: 1955–1988.
 * Valid while the products neither overflow nor underflow (callers scale by powers of two).
 */
export interface DoubleDouble {
  hi: number;
  lo: number;
}

const SPLIT = 134217729; // 2^27 + 1

/** Exact product a·b as hi + lo (Dekker's TwoProduct). */
export function twoProduct(a: number, b: number, out: DoubleDouble): DoubleDouble {
  const p = a * b;
  let t = SPLIT * a;
  const ah = t - (t - a);
  const al = a - ah;
  t = SPLIT * b;
  const bh = t - (t - b);
  const bl = b - bh;
  out.hi = p;
  out.lo = al * bl - (p - ah * bh - al * bh - ah * bl);
  return out;
}

/** Exact sum a + b as hi + lo (Knuth's TwoSum). */
export function twoSum(a: number, b: number, out: DoubleDouble): DoubleDouble {
  const s = a + b;
  const bb = s - a;
  out.hi = s;
  out.lo = a - (s - bb) + (b - bb);
  return out;
}

/** Double-double difference (x.hi + x.lo) − (y.hi + y.lo), renormalised. */
export function ddSub(x: DoubleDouble, y: DoubleDouble, out: DoubleDouble): DoubleDouble {
  const s = twoSum(x.hi, -y.hi, { hi: 0, lo: 0 });
  const lo = s.lo + (x.lo - y.lo);
  const hi = s.hi + lo;
  out.lo = lo - (hi - s.hi);
  out.hi = hi;
  return out;
}

/** Double-double product of two double-double numbers (Dekker's mul2), renormalised. */
export function ddMul(x: DoubleDouble, y: DoubleDouble, out: DoubleDouble): DoubleDouble {
  const p = twoProduct(x.hi, y.hi, { hi: 0, lo: 0 });
  const lo = p.lo + (x.hi * y.lo + x.lo * y.hi);
  const hi = p.hi + lo;
  out.lo = lo - (hi - p.hi);
  out.hi = hi;
  return out;
}
