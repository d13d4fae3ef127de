/** A source of 32-bit random integers (a pure-rand generator satisfies it). */
export interface IntSource {
  next(): number;
}

// The 128-layer tables of Marsaglia & Tsang (2000), built once. Layer i covers
// [0, x_i]; a deviate is accepted at once when it falls inside the rectangle under the
// layer above, which happens about 98.8% of the time.
const LAYERS = 128;
const R = 3.442619855899; // the start of the tail
const V = 9.91256303526217e-3; // the area of each layer
const SCALE = 16777216; // 2^24: the magnitude uses 24 bits of the draw, the layer 7 others
const kn = new Int32Array(LAYERS);
const wn = new Float64Array(LAYERS);
const fn = new Float64Array(LAYERS);
{
  let dn = R;
  let tn = dn;
  const q = V / Math.exp(-0.5 * dn * dn);
  kn[0] = Math.floor((dn / q) * SCALE);
  kn[1] = 0;
  wn[0] = q / SCALE;
  wn[LAYERS - 1] = dn / SCALE;
  fn[0] = 1;
  fn[LAYERS - 1] = Math.exp(-0.5 * dn * dn);
  for (let i = LAYERS - 2; i >= 1; i--) {
    dn = Math.sqrt(-2 * Math.log(V / dn + Math.exp(-0.5 * dn * dn)));
    kn[i + 1] = Math.floor((dn / tn) * SCALE);
    tn = dn;
    fn[i] = Math.exp(-0.5 * dn * dn);
    wn[i] = dn / SCALE;
  }
}

/** The layer tables (read-only), for the WebAssembly projection kernel's copy. */
export const ZIGGURAT_TABLES = { kn, wn, fn } as const;

/** A uniform in (0, 1) from one 32-bit draw (for the rare slow paths). */
function open01(g: IntSource): number {
  return ((g.next() >>> 0) + 0.5) * 2.3283064365386963e-10;
}

/**
 * A standard normal deviate by the ziggurat method: one 32-bit draw j, layer i = j & 127,
 * signed magnitude u = j >> 7 (24 bits, disjoint from the layer bits); accept x = u·w_i
 * when |u| < k_i, otherwise fall back to the exact wedge test
 *   f_i + U·(f_{i−1} − f_i) < exp(−x²/2)
 * or, in the base layer, Marsaglia's tail method beyond r = 3.4426:
 *   x = −ln(U₁)/r, y = −ln(U₂), accept when 2y > x², return ±(r + x).
 * Taking the layer and the magnitude from disjoint bits avoids the correlation between them
 * that Doornik (2005) found in the original.
 * Sources: Marsaglia, G. & Tsang, W. W. (2000). The ziggurat method for generating random
 * variables. J. Stat. Softw. 5(8); Doornik, J. A. (2005). An improved ziggurat method to
 * generate normal random samples. University of Oxford working paper.
 */
export function zigguratNormal(g: IntSource): number {
  // The fast path, small enough to be inlined into the simulation loop.
  const j = g.next() | 0;
  const i = j & 127;
  const u = j >> 7;
  return Math.abs(u) < kn[i]! ? u * wn[i]! : edge(g, i, u);
}

/** The rare draws outside the layer's inner rectangle: the wedge or the tail. */
function edge(g: IntSource, i: number, u: number): number {
  for (;;) {
    if (i === 0) {
      let x: number;
      let y: number;
      do {
        x = -Math.log(open01(g)) / R;
        y = -Math.log(open01(g));
      } while (y + y < x * x);
      return u > 0 ? R + x : -R - x;
    }
    const x = u * wn[i]!;
    if (fn[i]! + open01(g) * (fn[i - 1]! - fn[i]!) < Math.exp(-0.5 * x * x)) return x;
    const j = g.next() | 0;
    i = j & 127;
    u = j >> 7;
    if (Math.abs(u) < kn[i]!) return u * wn[i]!;
  }
}
