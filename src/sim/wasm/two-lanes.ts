// AssemblyScript (compiled with projection-kernel.ts, see there): two-lane (f64x2) values
// for the projection kernel — its constants, a lane-by-lane exp, log and pow.

// The loop's constants as two-lane values in memory, one 16-byte slot each (named below):
// V8 rebuilds a v128 constant from an immediate in three instructions each time it is used,
// but reads one from memory in one.
const LANES = memory.data<u64>([
  0x40671547652b82fe, 0x40671547652b82fe,
  0x4338000000000000, 0x4338000000000000,
  0xbf762e42fefa0000, 0xbf762e42fefa0000,
  0xbd0cf79abc9e3b3a, 0xbd0cf79abc9e3b3a,
  0x3fdffffffffffdbd, 0x3fdffffffffffdbd,
  0x3fc555555555543c, 0x3fc555555555543c,
  0x3fa55555cf172b91, 0x3fa55555cf172b91,
  0x3f81111167a4d017, 0x3f81111167a4d017,
  0x3c90000000000000, 0x3c90000000000000,
  0x4080000000000000, 0x4080000000000000,
  0x3ff0000000000000, 0x3ff0000000000000,
  0x7fefffffffffffff, 0x7fefffffffffffff,
  0xffefffffffffffff, 0xffefffffffffffff,
  0x1, 0x1,
  0x2, 0x2,
  0x4, 0x4,
  0x8, 0x8,
], 16);
@inline export const INV_LN2_N = 0;
@inline export const SHIFT = 1;
@inline export const NEG_LN2_HI = 2;
@inline export const NEG_LN2_LO = 3;
@inline export const C2 = 4;
@inline export const C3 = 5;
@inline export const C4 = 6;
@inline export const C5 = 7;
@inline export const TINY = 8;
@inline export const HUGE = 9;
@inline export const ONE = 10;
@inline export const BIGGEST = 11;
@inline export const LOWEST = 12;
@inline export const BELOW_FLAG = 13;
@inline export const QUASI_FLAG = 14;
@inline export const RECOVERED_FLAG = 15;
@inline export const UNBOUNDED_FLAG = 16;
@inline export const INT_ONE = BELOW_FLAG; // the integer 1 in each 64-bit lane

/** The two-lane constant in slot i (one of the names above). */
@inline export function lanes(i: i32): v128 {
  return v128.load(LANES + (<usize>i << 4));
}

@inline export function splat(x: f64): v128 {
  return f64x2.splat(x);
}

/** f applied to each lane (for log and pow, which have no two-lane form here). */
@inline export function lanesLog(x: v128): v128 {
  return f64x2.replace_lane(f64x2.splat(Math.log(f64x2.extract_lane(x, 0))), 1, Math.log(f64x2.extract_lane(x, 1)));
}
@inline export function lanesPow(x: v128, y: v128): v128 {
  return f64x2.replace_lane(
    f64x2.splat(Math.pow(f64x2.extract_lane(x, 0), f64x2.extract_lane(y, 0))),
    1,
    Math.pow(f64x2.extract_lane(x, 1), f64x2.extract_lane(y, 1)),
  );
}

/**
 * exp of both lanes: the algorithm of musl's exp (AssemblyScript's Math.exp), lane by lane,
 *   x = k·ln2/128 + r,  exp(x) = 2^(k/128) · (1 + tail_k + r + r²(C2 + r·C3) + r⁴(C4 + r·C5))
 * with its table T (built by ../exp-table.ts) at `tab`: [tail_k bits, bits of 2^(k/128) − k·2^45]
 * per k. Lanes outside |x| ∈ [2^−54, 512) (where musl takes its special cases) go through
 * Math.exp itself, so every lane equals Math.exp of it bit for bit.
 * Source: Szabolcs Nagy's exp for musl libc and ARM optimized-routines (2018), from memory.
 */
@inline export function vexp(x: v128, tab: usize): v128 {
  const ax = f64x2.abs(x);
  if (!i64x2.all_true(v128.and(f64x2.ge(ax, lanes(TINY)), f64x2.lt(ax, lanes(HUGE))))) {
    return f64x2.replace_lane(f64x2.splat(Math.exp(f64x2.extract_lane(x, 0))), 1, Math.exp(f64x2.extract_lane(x, 1)));
  }
  const shift = lanes(SHIFT);
  let kd = f64x2.add(f64x2.mul(lanes(INV_LN2_N), x), shift);
  const ki = kd;
  kd = f64x2.sub(kd, shift);
  const r = f64x2.add(f64x2.add(x, f64x2.mul(kd, lanes(NEG_LN2_HI))), f64x2.mul(kd, lanes(NEG_LN2_LO)));
  const e0 = v128.load(tab + ((<usize>i64x2.extract_lane(ki, 0) & 127) << 4));
  const e1 = v128.load(tab + ((<usize>i64x2.extract_lane(ki, 1) & 127) << 4));
  const tail = i64x2.shuffle(e0, e1, 0, 2);
  const scale = i64x2.add(i64x2.shuffle(e0, e1, 1, 3), i64x2.shl(ki, 45));
  const r2 = f64x2.mul(r, r);
  const c23 = f64x2.add(lanes(C2), f64x2.mul(r, lanes(C3)));
  const c45 = f64x2.add(lanes(C4), f64x2.mul(r, lanes(C5)));
  const tmp = f64x2.add(f64x2.add(f64x2.add(tail, r), f64x2.mul(r2, c23)), f64x2.mul(f64x2.mul(r2, r2), c45));
  return f64x2.add(scale, f64x2.mul(scale, tmp));
}
