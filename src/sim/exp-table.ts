/**
 * The 128-entry table of musl's exp (the one AssemblyScript's Math.exp uses), built exactly
 * with integer arithmetic, for the projection kernel's two-lane exp: for k = 0 … 127,
 *   2^(k/128) ≈ H_k · (1 + tail_k),  H_k the double nearest 2^(k/128), tail_k a double,
 * stored as the bit patterns [tail_k, H_k − k·2^45] (the exponent of 2^⌊k/128⌋ is added
 * back from the reduction's integer). 2^(k/128) is taken to 160 bits from 2^(1/128), itself
 * seven integer square roots of 2.
 * Source: Szabolcs Nagy's exp for musl libc and ARM optimized-routines (2018): the table's
 * definition and layout (from memory; the test checks entries against musl's exp_data.c).
 */
export function expTable(): BigUint64Array {
  const P = 160n;
  const one = 1n << P;
  let root = 2n << P; // 2 in fixed point with P fractional bits
  for (let i = 0; i < 7; i++) root = isqrt(root << P);
  const out = new BigUint64Array(256);
  const f64 = new Float64Array(1);
  const u64 = new BigUint64Array(f64.buffer);
  let v = one;
  for (let k = 0; k < 128; k++) {
    // H_k: v rounded to 53 significant bits (v lies in [2^P, 2^(P+1)), so its exponent is 0).
    const drop = P - 52n;
    const m = (v + (1n << (drop - 1n))) >> drop;
    const h = m << drop;
    const hBits = (1023n << 52n) + (m - (1n << 52n));
    // tail_k = (v − H_k)/H_k rounded once: the quotient to 200 bits, then to a double.
    f64[0] = Number(((v - h) << 200n) / h) / 2 ** 200;
    out[2 * k] = u64[0]!;
    out[2 * k + 1] = (hBits - (BigInt(k) << 45n)) & 0xffffffffffffffffn;
    v = (v * root) >> P;
  }
  return out;
}

/** ⌊√n⌋ for n ≥ 0 (Newton's method on integers). */
function isqrt(n: bigint): bigint {
  if (n < 2n) return n;
  let x = 1n << BigInt((n.toString(2).length >> 1) + 1);
  for (;;) {
    const y = (x + n / x) >> 1n;
    if (y >= x) return x;
    x = y;
  }
}
