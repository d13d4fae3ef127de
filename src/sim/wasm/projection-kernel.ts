// AssemblyScript source of the stochastic projection's inner loop for loops whose state is
// one number (no delay, no survey lag, no quota caps): the same arithmetic, in the same
// order and from the same random stream, as runBlock in ../simulate-blocks.ts, compiled
// to WebAssembly by scripts/build-kernel.mjs. Only exp, log and pow come from a different
// library (AssemblyScript's port of musl instead of V8's port of fdlibm; both within 1 ulp),
// so results agree with the TypeScript loop to rounding, not bit for bit; the tests check
// the agreement for every family and rule kind. Each growth factor below is the equation of
// the family's own file in src/models/ (the source is cited there), and each quota the
// equation of its file in src/policy/.
//
// The replicates are taken two at a time in the lanes of WebAssembly's 128-bit SIMD values
// (f64x2), exp included (vexp, in two-lanes.ts); a block of odd size runs its last
// replicate in both lanes of the last pair and takes the copy's counts off again.
//
// Memory: the caller reserves one region (reserve) and lays every array out in it; the
// pointers come in through configure. Nothing here allocates.

import { CFG_HORIZON, CFG_MODEL_COUNT, CFG_FAMILY, CFG_RULE_KIND, CFG_Q1, CFG_Q2, CFG_Q3, CFG_Q4, CFG_STOCKING, CFG_BEFORE, CFG_SD_P, CFG_RHO, CFG_INNOVATION, CFG_HALF_P, CFG_SD_O, CFG_HALF_O, CFG_SD_I, CFG_HALF_I, CFG_LIMIT, CFG_QUASI, CFG_RECOVERY_TARGET, CFG_START, CFG_SCALE, CFG_BOUND, CFG_BINS, CFG_BIN_BASE, CFG_LAST_BIN } from "./kernel-layout.generated";
import { PTR_MODELS, PTR_KN, PTR_WN, PTR_FN, PTR_N, PTR_EPS, PTR_PREV_CATCH, PTR_SUM_CATCH, PTR_SUM_CHANGE, PTR_FLAGS, PTR_PICK, PTR_A_COUNTS, PTR_C_COUNTS, PTR_A_RANGE, PTR_C_RANGE, PTR_BELOW, PTR_RECOVERY, PTR_COUNTERS, PTR_CATCH_TOTALS, PTR_AAV_SUMS, PTR_AAV_COUNTS, PTR_Z, PTR_A_POS, PTR_C_POS, PTR_EXP } from "./kernel-layout.generated";
import { FAMILY_RICKER, FAMILY_BEVERTON_HOLT, FAMILY_DISCRETE_LOGISTIC, FAMILY_GOMPERTZ, FAMILY_ALLEE_RICKER, FAMILY_HASSELL, FAMILY_SHEPHERD, RULE_CONSTANT_CATCH, RULE_CONSTANT_RATE, RULE_CONSTANT_ESCAPEMENT, RULE_THRESHOLD, FAMILY_THETA_LOGISTIC, MODEL_BYTES } from "./kernel-layout.generated";
import { BELOW_FLAG, BIGGEST, INT_ONE, LOWEST, ONE, QUASI_FLAG, RECOVERED_FLAG, UNBOUNDED_FLAG, lanes, lanesLog, lanesPow, splat, vexp } from "./two-lanes";

// xoroshiro128+ as pure-rand implements it (two 32-bit halves per 64-bit word; the draw is
// the low 32 bits of s0 + s1). Blackman, D. & Vigna, S. (2021). ACM Trans. Math. Softw. 47: 36.
let s00: u32 = 0;
let s01: u32 = 0;
let s10: u32 = 0;
let s11: u32 = 0;

@inline function nextInt(): i32 {
  const out = s00 + s10;
  const a0 = s10 ^ s00;
  const a1 = s11 ^ s01;
  const o00 = s00;
  const o01 = s01;
  s00 = (o00 << 24) ^ (o01 >>> 8) ^ a0 ^ (a0 << 16);
  s01 = (o01 << 24) ^ (o00 >>> 8) ^ a1 ^ ((a1 << 16) | (a0 >>> 16));
  s10 = (a1 << 5) ^ (a0 >>> 27);
  s11 = (a0 << 5) ^ (a1 >>> 27);
  return <i32>out;
}

// Configuration (see configure) and pointers into the reserved region.
let H: i32 = 0;
let M: i32 = 1;
let family: i32 = 0;
let ruleKind: i32 = 0;
let q1: f64 = 0;
let q2: f64 = 0;
let q3: f64 = 0;
let q4: f64 = 0;
let stocking: f64 = 0;
let before: bool = false;
let sdP: f64 = 0;
let rho: f64 = 0;
let innovation: f64 = 0;
let halfP: f64 = 0;
let sdO: f64 = 0;
let halfO: f64 = 0;
let sdI: f64 = 0;
let halfI: f64 = 0;
let limit: f64 = 0;
let quasi: f64 = 0;
let recoveryTarget: f64 = 0;
let start: f64 = 0;
let scale: f64 = 0;
let bound: f64 = 0;
let bins: i32 = 0;
let binBase: i32 = 0;
let lastBin: i32 = 0;

let pModels: usize = 0;
let pKn: usize = 0;
let pWn: usize = 0;
let pFn: usize = 0;
let pN: usize = 0;
let pEps: usize = 0;
let pPrevCatch: usize = 0;
let pSumCatch: usize = 0;
let pSumChange: usize = 0;
let pFlags: usize = 0;
let pPick: usize = 0;
let pACounts: usize = 0;
let pCCounts: usize = 0;
let pARange: usize = 0;
let pCRange: usize = 0;
let pBelow: usize = 0;
let pRecovery: usize = 0;
let pCounters: usize = 0;
let pCatchTotals: usize = 0;
let pAavSums: usize = 0;
let pAavCounts: usize = 0;
let pZ: usize = 0;
let pAPos: usize = 0;
let pCPos: usize = 0;
let pExp: usize = 0;

const BELOW: i64 = 1;
const QUASI: i64 = 2;
const RECOVERED: i64 = 4;
const UNBOUNDED: i64 = 8;

/** The start of a region of `bytes` bytes after this module's own data, grown as needed. */
export function reserve(bytes: usize): usize {
  const base = (__heap_base + 15) & ~(<usize>15);
  const pages = <i32>((base + bytes + 0xffff) >>> 16);
  const have = memory.size();
  if (pages > have && memory.grow(pages - have) < 0) return 0;
  return base;
}

/** Reads the settings (f64 array `cfg`) and the pointers (u32 array `ptr`), laid out as kernel-layout.ts says. */
export function configure(cfg: usize, ptr: usize): void {
  H = <i32>load<f64>(cfg + CFG_HORIZON);
  M = <i32>load<f64>(cfg + CFG_MODEL_COUNT);
  family = <i32>load<f64>(cfg + CFG_FAMILY);
  ruleKind = <i32>load<f64>(cfg + CFG_RULE_KIND);
  q1 = load<f64>(cfg + CFG_Q1);
  q2 = load<f64>(cfg + CFG_Q2);
  q3 = load<f64>(cfg + CFG_Q3);
  q4 = load<f64>(cfg + CFG_Q4);
  stocking = load<f64>(cfg + CFG_STOCKING);
  before = load<f64>(cfg + CFG_BEFORE) != 0;
  sdP = load<f64>(cfg + CFG_SD_P);
  rho = load<f64>(cfg + CFG_RHO);
  innovation = load<f64>(cfg + CFG_INNOVATION);
  halfP = load<f64>(cfg + CFG_HALF_P);
  sdO = load<f64>(cfg + CFG_SD_O);
  halfO = load<f64>(cfg + CFG_HALF_O);
  sdI = load<f64>(cfg + CFG_SD_I);
  halfI = load<f64>(cfg + CFG_HALF_I);
  limit = load<f64>(cfg + CFG_LIMIT);
  quasi = load<f64>(cfg + CFG_QUASI);
  recoveryTarget = load<f64>(cfg + CFG_RECOVERY_TARGET);
  start = load<f64>(cfg + CFG_START);
  scale = load<f64>(cfg + CFG_SCALE);
  bound = load<f64>(cfg + CFG_BOUND);
  bins = <i32>load<f64>(cfg + CFG_BINS);
  binBase = <i32>load<f64>(cfg + CFG_BIN_BASE);
  lastBin = <i32>load<f64>(cfg + CFG_LAST_BIN);
  pModels = load<u32>(ptr + PTR_MODELS);
  pKn = load<u32>(ptr + PTR_KN);
  pWn = load<u32>(ptr + PTR_WN);
  pFn = load<u32>(ptr + PTR_FN);
  pN = load<u32>(ptr + PTR_N);
  pEps = load<u32>(ptr + PTR_EPS);
  pPrevCatch = load<u32>(ptr + PTR_PREV_CATCH);
  pSumCatch = load<u32>(ptr + PTR_SUM_CATCH);
  pSumChange = load<u32>(ptr + PTR_SUM_CHANGE);
  pFlags = load<u32>(ptr + PTR_FLAGS);
  pPick = load<u32>(ptr + PTR_PICK);
  pACounts = load<u32>(ptr + PTR_A_COUNTS);
  pCCounts = load<u32>(ptr + PTR_C_COUNTS);
  pARange = load<u32>(ptr + PTR_A_RANGE);
  pCRange = load<u32>(ptr + PTR_C_RANGE);
  pBelow = load<u32>(ptr + PTR_BELOW);
  pRecovery = load<u32>(ptr + PTR_RECOVERY);
  pCounters = load<u32>(ptr + PTR_COUNTERS);
  pCatchTotals = load<u32>(ptr + PTR_CATCH_TOTALS);
  pAavSums = load<u32>(ptr + PTR_AAV_SUMS);
  pAavCounts = load<u32>(ptr + PTR_AAV_COUNTS);
  pZ = load<u32>(ptr + PTR_Z);
  pAPos = load<u32>(ptr + PTR_A_POS);
  pCPos = load<u32>(ptr + PTR_C_POS);
  pExp = load<u32>(ptr + PTR_EXP);
}

// Marsaglia, G. & Tsang, W. W. (2000). The ziggurat method for generating random variables.
// J. Stat. Softw. 5(8). Tables from ../ziggurat.ts; the same draws as zigguratNormal.
const TAIL: f64 = 3.442619855899;

@inline function open01(): f64 {
  return (<f64>(<u32>nextInt()) + 0.5) * 2.3283064365386963e-10;
}

/** The slow path of zigguratNormal (about 1.2% of draws), on the generator state in the globals. */
function edge(i: i32, u: i32): f64 {
  while (true) {
    if (i == 0) {
      let x: f64;
      let y: f64;
      do {
        x = -Math.log(open01()) / TAIL;
        y = -Math.log(open01());
      } while (y + y < x * x);
      return u > 0 ? TAIL + x : -TAIL - x;
    }
    const x = <f64>u * load<f64>(pWn + (<usize>i << 3));
    const fi = load<f64>(pFn + (<usize>i << 3));
    if (fi + open01() * (load<f64>(pFn + (<usize>(i - 1) << 3)) - fi) < Math.exp(-0.5 * x * x)) return x;
    const j = nextInt();
    i = j & 127;
    u = j >> 7;
    if (abs<i32>(u) < load<i32>(pKn + (<usize>i << 2))) return <f64>u * load<f64>(pWn + (<usize>i << 3));
  }
  return 0; // not reached
}

/**
 * The year's standard normal deviates (zigguratNormal's draws, in the TypeScript loop's
 * order: per replicate, process, survey, catch), stored by kind: deviate d of replicate k
 * at z + d·plane + 8k, so that the loop after reads two replicates' deviates at once.
 */
function fillNormals(z: usize, size: i32, draws: i32, plane: usize): void {
  // The generator as two 64-bit words in locals: the same xoroshiro128+ step as nextInt.
  let a: u64 = (<u64>s01 << 32) | <u64>s00;
  let b: u64 = (<u64>s11 << 32) | <u64>s10;
  const kn = pKn;
  const wn = pWn;
  for (let k = 0; k < size; k++) {
    let at = z + (<usize>k << 3);
    for (let d = 0; d < draws; d++) {
      const j = <i32>(a + b);
      const x = b ^ a;
      a = rotl<u64>(a, 24) ^ x ^ (x << 16);
      b = rotl<u64>(x, 37);
      const i = j & 127;
      const u = j >> 7;
      let v: f64;
      if (abs<i32>(u) < load<i32>(kn + (<usize>i << 2))) {
        v = <f64>u * load<f64>(wn + (<usize>i << 3));
      } else {
        s00 = <u32>a;
        s01 = <u32>(a >>> 32);
        s10 = <u32>b;
        s11 = <u32>(b >>> 32);
        v = edge(i, u);
        a = (<u64>s01 << 32) | <u64>s00;
        b = (<u64>s11 << 32) | <u64>s10;
      }
      store<f64>(at, v);
      at += plane;
    }
  }
  s00 = <u32>a;
  s01 = <u32>(a >>> 32);
  s10 = <u32>b;
  s11 = <u32>(b >>> 32);
}

// Called through the function table, so the optimiser keeps it a function of its own, its
// few values in registers, instead of inlining it into runBlock's crowded body.
let fill: (z: usize, size: i32, draws: i32, plane: usize) => void = fillNormals;

@inline function normal(): f64 {
  const j = nextInt();
  const i = j & 127;
  const u = j >> 7;
  return abs<i32>(u) < load<i32>(pKn + (<usize>i << 2)) ? <f64>u * load<f64>(pWn + (<usize>i << 3)) : edge(i, u);
}

// Two replicates at a time: every value below is a v128 of two f64 lanes (or two i64 lanes
// for masks and counts), one replicate in each. The arithmetic is lane by lane the scalar
// arithmetic of the TypeScript loop, in the same order, so each lane's numbers are the ones
// a one-at-a-time loop gives; comparisons give all-ones masks and choices are blends, with no
// branch on the data (whether a survey is below a trigger is unpredictable from one
// replicate to the next).

/** The quota H(y) of the rule (src/policy/*.ts): kind, then its settings. */
@inline function quota(kind: i32, y: v128, r1: v128, r2: v128, r3: v128, r4: v128): v128 {
  const zero = splat(0);
  switch (kind) {
    case RULE_CONSTANT_CATCH: return r1;
    case RULE_CONSTANT_RATE: return f64x2.mul(r1, y);
    case RULE_CONSTANT_ESCAPEMENT: return v128.bitselect(f64x2.sub(y, r1), zero, f64x2.gt(y, r1));
    case RULE_THRESHOLD: // (lower, upper, rate, width)
      return v128.bitselect(zero, v128.bitselect(f64x2.mul(r3, y), f64x2.mul(f64x2.div(f64x2.mul(r3, f64x2.sub(y, r1)), r4), y), f64x2.ge(y, r2)), f64x2.le(y, r1));
    default: return zero; // RULE_NO_HARVEST
  }
}

/**
 * base · g(dens) · exp(ε) with the family's factor g (src/models/*.ts) and parameters
 * (a, K, p2, p3) per lane; one exp for the exponential families, as noisyProduction in
 * src/policy/closed-loop.ts.
 */
@inline function production(fam: i32, base: v128, dens: v128, lp: v128, a: v128, K: v128, p2: v128, p3: v128, tab: usize): v128 {
  const one = lanes(ONE);
  switch (fam) {
    case FAMILY_RICKER:
      return f64x2.mul(base, vexp(f64x2.add(f64x2.mul(a, f64x2.sub(one, f64x2.div(dens, K))), lp), tab));
    case FAMILY_BEVERTON_HOLT:
      return f64x2.mul(f64x2.mul(base, f64x2.div(a, f64x2.add(one, f64x2.div(f64x2.mul(f64x2.sub(a, one), dens), K)))), vexp(lp, tab));
    case FAMILY_DISCRETE_LOGISTIC:
      return f64x2.mul(f64x2.mul(base, f64x2.add(one, f64x2.mul(a, f64x2.sub(one, f64x2.div(dens, K))))), vexp(lp, tab));
    case FAMILY_GOMPERTZ:
      return f64x2.mul(base, vexp(f64x2.add(f64x2.mul(a, lanesLog(f64x2.div(K, f64x2.pmax(p2, dens)))), lp), tab));
    case FAMILY_ALLEE_RICKER:
      return f64x2.mul(base, vexp(f64x2.add(f64x2.mul(f64x2.mul(a, f64x2.sub(one, f64x2.div(dens, K))), f64x2.sub(f64x2.div(dens, p2), one)), lp), tab));
    case FAMILY_HASSELL:
      return f64x2.mul(f64x2.mul(base, f64x2.div(a, lanesPow(f64x2.add(one, f64x2.mul(p3, dens)), p2))), vexp(lp, tab));
    case FAMILY_SHEPHERD:
      return f64x2.mul(f64x2.mul(base, f64x2.div(a, f64x2.add(one, f64x2.mul(f64x2.sub(a, one), lanesPow(f64x2.div(dens, K), p2))))), vexp(lp, tab));
    case FAMILY_THETA_LOGISTIC:
      return f64x2.mul(f64x2.mul(base, f64x2.add(one, f64x2.mul(a, f64x2.sub(one, lanesPow(f64x2.div(dens, K), p2))))), vexp(lp, tab));
    default: // not a kernel family (kernelApplies keeps these out)
      return splat(0);
  }
}

/**
 * binOf of src/sim/quantile-histogram.ts for both lanes: 0 for 0, else the bit-binned index
 * of v·scale, clamped to [1, last]. v ≥ 0, so the top bits fit an i32: the bins come back in
 * i32 lanes 0 and 2 (the low halves of the two doubles).
 */
@inline function bins2(v: v128, sc: v128, first2: v128, last: v128): v128 {
  const i = i32x4.sub(i64x2.shr_u(f64x2.mul(v, sc), 44), first2);
  return v128.andnot(i32x4.min_s(i32x4.max_s(i, lanes(INT_ONE)), last), f64x2.eq(v, splat(0)));
}

/** Adds one to bin b of the histogram at p. */
@inline function bump(p: usize, b: i32): void {
  const at = p + (<usize>b << 2);
  store<u32>(at, load<u32>(at) + 1);
}

/** The scalar bin of v (the pad replicate's correction). */
@inline function binOf(v: f64, sc: f64, first: i32, last: i32): i32 {
  return i32x4.extract_lane(bins2(splat(v), splat(sc), i32x4.splat(first - 2), i32x4.splat(last)), 0);
}

/** Two lanes of a per-replicate f64 array at p, from two parameter sets' words at p0 and p1. */
@inline function gather(p0: usize, p1: usize, offset: usize): v128 {
  return v128.load64_lane(p1 + offset, v128.load64_zero(p0 + offset), 1);
}

/** The sum of an i64x2's lanes. */
@inline function laneSum(v: v128): u32 {
  return <u32>(i64x2.extract_lane(v, 0) + i64x2.extract_lane(v, 1));
}

/** One block of `size` replicates from the generator state (s01, s00, s11, s10), results to slot `slot`. */
export function runBlock(slot: i32, size: i32, a01: u32, a00: u32, a11: u32, a10: u32): void {
  s01 = a01;
  s00 = a00;
  s11 = a11;
  s10 = a10;
  // Every setting in a local: the loop below reads none of the globals.
  const single = M == 1;
  const fam = family;
  const kind = ruleKind;
  const r1 = splat(q1);
  const r2 = splat(q2);
  const r3 = splat(q3);
  const r4 = splat(q4);
  const A = splat(stocking);
  const beforeRepro = before;
  const hasP = sdP > 0;
  const hasO = sdO > 0;
  const hasI = sdI > 0;
  const ar = splat(rho);
  const inn = splat(innovation);
  const hP = splat(halfP);
  const sO = splat(sdO);
  const hO = splat(halfO);
  const sI = splat(sdI);
  const hI = splat(halfI);
  const lim = splat(limit);
  const qe = splat(quasi);
  const target = splat(recoveryTarget);
  const top = splat(bound);
  const sc = splat(scale);
  const first2 = i32x4.splat(binBase - 2);
  const last = i32x4.splat(lastBin);
  const zero = splat(0);
  const nB = bins;
  const n0 = start;
  const models = pModels;
  const picks = pPick;
  const ns = pN;
  const epss = pEps;
  const flags = pFlags;
  const sums = pSumCatch;
  const changes = pSumChange;
  const prevs = pPrevCatch;
  const zs = pZ;
  const tab = pExp;
  const draws = (hasP ? 1 : 0) + (hasO ? 1 : 0) + (hasI ? 1 : 0);
  // The deviates by kind, each a plane of `padded` doubles (see fillNormals).
  const padded = (size + 1) & ~1;
  const plane = <usize>padded << 3;
  const zO = zs + (hasP ? plane : 0);
  const zI = zO + (hasO ? plane : 0);
  // Parameter set 0 as lanes (all replicates use it when there is one).
  const a0 = splat(load<f64>(models, 0));
  const K0 = splat(load<f64>(models, 8));
  const p20 = splat(load<f64>(models, 16));
  const p30 = splat(load<f64>(models, 24));
  // Per-replicate set-up, in the TypeScript loop's order of draws: the parameter set, then ε[−1].
  for (let k = 0; k < size; k++) {
    const o = <usize>k << 3;
    store<i32>(picks + (<usize>k << 2), single ? 0 : min<i32>(M - 1, <i32>Math.floor((<f64>(<u32>nextInt()) / 4294967296) * <f64>M)));
    store<f64>(epss + o, rho != 0 && hasP ? sdP * normal() : 0);
    store<f64>(ns + o, n0);
    store<f64>(prevs + o, 0);
    store<f64>(sums + o, 0);
    store<f64>(changes + o, 0);
    store<i64>(flags + o, n0 >= recoveryTarget ? <i64>RECOVERED : 0);
  }
  // An odd block runs its last replicate twice, in both lanes of the last pair: the copy's
  // counts are taken off again after each year, and the final sums stop at `size`.
  const pad = padded != size;
  if (pad) {
    const o = <usize>size << 3;
    store<i32>(picks + (<usize>size << 2), load<i32>(picks + (<usize>(size - 1) << 2)));
    store<f64>(epss + o, load<f64>(epss + o - 8));
    store<f64>(ns + o, n0);
    store<f64>(prevs + o, 0);
    store<f64>(sums + o, 0);
    store<f64>(changes + o, 0);
    store<i64>(flags + o, load<i64>(flags + o - 8));
  }
  const start0 = pACounts + (<usize>binOf(n0, scale, binBase, lastBin) << 2);
  store<u32>(start0, load<u32>(start0) + <u32>size);
  if (n0 < load<f64>(pARange, 0)) store<f64>(pARange, n0, 0);
  if (n0 > load<f64>(pARange, 8)) store<f64>(pARange, n0, 8);
  if (n0 < load<f64>(pAPos) && n0 > 0) store<f64>(pAPos, n0);
  if (n0 < limit) store<u32>(pBelow, load<u32>(pBelow) + <u32>size);
  if (n0 >= recoveryTarget) store<u32>(pRecovery, load<u32>(pRecovery) + <u32>size);
  let zeroYears: u32 = 0;
  for (let t = 0; t < H; t++) {
    const aOff = pACounts + (<usize>((t + 1) * nB) << 2);
    const cOff = pCCounts + (<usize>(t * nB) << 2);
    let aMin = lanes(BIGGEST);
    let aMax = lanes(LOWEST);
    let cMin = lanes(BIGGEST);
    let cMax = lanes(LOWEST);
    let aPos = lanes(BIGGEST);
    let cPos = lanes(BIGGEST);
    let belowCount = i64x2.splat(0);
    let recoveryCount = i64x2.splat(0);
    let zeroCount = i64x2.splat(0);
    if (draws > 0) fill(zs, size, draws, plane);
    const padFlags = pad ? load<i64>(flags + (<usize>size << 3)) : 0;
    if (pad) {
      store<f64>(zs + (<usize>size << 3), load<f64>(zs + (<usize>(size - 1) << 3)));
      store<f64>(zO + (<usize>size << 3), load<f64>(zO + (<usize>(size - 1) << 3)));
      store<f64>(zI + (<usize>size << 3), load<f64>(zI + (<usize>(size - 1) << 3)));
    }
    const later = t > 0;
    for (let k = 0; k < padded; k += 2) {
      const o = <usize>k << 3;
      let lp = zero;
      let sm = lanes(ONE);
      let im = lanes(ONE);
      if (hasP) {
        const e = f64x2.add(f64x2.mul(ar, v128.load(epss + o)), f64x2.mul(inn, v128.load(zs + o)));
        v128.store(epss + o, e);
        lp = f64x2.sub(e, hP);
      }
      if (hasO) sm = vexp(f64x2.sub(f64x2.mul(sO, v128.load(zO + o)), hO), tab);
      if (hasI) im = vexp(f64x2.sub(f64x2.mul(sI, v128.load(zI + o)), hI), tab);
      let a = a0;
      let K = K0;
      let p2 = p20;
      let p3 = p30;
      if (!single) {
        const m0 = models + <usize>load<i32>(picks + (<usize>k << 2)) * MODEL_BYTES;
        const m1 = models + <usize>load<i32>(picks + (<usize>k << 2), 4) * MODEL_BYTES;
        a = gather(m0, m1, 0);
        K = gather(m0, m1, 8);
        p2 = gather(m0, m1, 16);
        p3 = gather(m0, m1, 24);
      }
      // nextWith of src/policy/closed-loop.ts. No NaN reaches here, and the production of 0
      // is 0, so pmin / pmax give the values of its min and max.
      const n = v128.load(ns + o);
      const aim = f64x2.mul(quota(kind, f64x2.mul(n, sm), r1, r2, r3, r4), im);
      let next: v128;
      let c: v128;
      if (beforeRepro) {
        c = f64x2.pmin(aim, n);
        const e = f64x2.sub(n, c);
        next = f64x2.add(f64x2.pmax(zero, production(fam, e, e, lp, a, K, p2, p3, tab)), A);
      } else {
        const q = f64x2.pmax(zero, production(fam, n, n, lp, a, K, p2, p3, tab));
        c = f64x2.pmin(aim, q);
        next = f64x2.add(f64x2.sub(q, c), A);
      }
      let f = v128.load(flags + o);
      const unbounded = v128.not(f64x2.le(next, top));
      next = v128.bitselect(top, next, unbounded);
      f = v128.or(f, v128.and(unbounded, lanes(UNBOUNDED_FLAG)));
      v128.store(ns + o, next);
      f = v128.or(f, v128.and(f64x2.lt(next, lim), lanes(BELOW_FLAG)));
      f = v128.or(f, v128.and(f64x2.lt(next, qe), lanes(QUASI_FLAG)));
      const recovered = v128.and(f64x2.ge(next, target), i64x2.eq(v128.and(f, lanes(RECOVERED_FLAG)), i64x2.splat(0)));
      recoveryCount = i64x2.sub(recoveryCount, recovered);
      f = v128.or(f, v128.and(recovered, lanes(RECOVERED_FLAG)));
      v128.store(flags + o, f);
      v128.store(sums + o, f64x2.add(v128.load(sums + o), c));
      if (later) v128.store(changes + o, f64x2.add(v128.load(changes + o), f64x2.abs(f64x2.sub(c, v128.load(prevs + o)))));
      v128.store(prevs + o, c);
    }
    // The year's abundance and catch (in ns and prevs) into the histograms, ranges and counts:
    // a second pass, so that each loop's values fit in the registers.
    for (let k = 0; k < padded; k += 2) {
      const o = <usize>k << 3;
      const next = v128.load(ns + o);
      const c = v128.load(prevs + o);
      belowCount = i64x2.sub(belowCount, f64x2.lt(next, lim));
      zeroCount = i64x2.sub(zeroCount, f64x2.eq(c, zero));
      const bn = bins2(next, sc, first2, last);
      bump(aOff, i32x4.extract_lane(bn, 0));
      bump(aOff, i32x4.extract_lane(bn, 2));
      const bc = bins2(c, sc, first2, last);
      bump(cOff, i32x4.extract_lane(bc, 0));
      bump(cOff, i32x4.extract_lane(bc, 2));
      aMin = f64x2.pmin(aMin, next);
      aMax = f64x2.pmax(aMax, next);
      cMin = f64x2.pmin(cMin, c);
      cMax = f64x2.pmax(cMax, c);
      // Smallest positive value: a zero (values are ≥ 0) counts as the largest double.
      aPos = f64x2.pmin(aPos, f64x2.add(next, v128.and(f64x2.eq(next, zero), lanes(BIGGEST))));
      cPos = f64x2.pmin(cPos, f64x2.add(c, v128.and(f64x2.eq(c, zero), lanes(BIGGEST))));
    }
    let belowYear = laneSum(belowCount);
    let recoveryYear = laneSum(recoveryCount);
    let zeroYear = laneSum(zeroCount);
    if (pad) {
      // Take the copy of the last replicate off the counts (min and max are unchanged by it).
      const o = <usize>size << 3;
      const nx = load<f64>(ns + o);
      const cx = load<f64>(prevs + o);
      const ba = aOff + (<usize>binOf(nx, scale, binBase, lastBin) << 2);
      store<u32>(ba, load<u32>(ba) - 1);
      const bc = cOff + (<usize>binOf(cx, scale, binBase, lastBin) << 2);
      store<u32>(bc, load<u32>(bc) - 1);
      belowYear -= <u32>(nx < limit);
      zeroYear -= <u32>(cx == 0);
      recoveryYear -= <u32>((load<i64>(flags + o) & ~padFlags & RECOVERED) != 0);
    }
    zeroYears += zeroYear;
    const belowAt = pBelow + (<usize>(t + 1) << 2);
    const recoveryAt = pRecovery + (<usize>(t + 1) << 2);
    store<u32>(belowAt, load<u32>(belowAt) + belowYear);
    store<u32>(recoveryAt, load<u32>(recoveryAt) + recoveryYear);
    const aR = pARange + (<usize>(2 * t + 2) << 3);
    const cR = pCRange + (<usize>(2 * t) << 3);
    store<f64>(aR, min(load<f64>(aR), min(f64x2.extract_lane(aMin, 0), f64x2.extract_lane(aMin, 1))));
    store<f64>(aR, max(load<f64>(aR, 8), max(f64x2.extract_lane(aMax, 0), f64x2.extract_lane(aMax, 1))), 8);
    store<f64>(cR, min(load<f64>(cR), min(f64x2.extract_lane(cMin, 0), f64x2.extract_lane(cMin, 1))));
    store<f64>(cR, max(load<f64>(cR, 8), max(f64x2.extract_lane(cMax, 0), f64x2.extract_lane(cMax, 1))), 8);
    const aP = pAPos + (<usize>(t + 1) << 3);
    const cP = pCPos + (<usize>t << 3);
    store<f64>(aP, min(load<f64>(aP), min(f64x2.extract_lane(aPos, 0), f64x2.extract_lane(aPos, 1))));
    store<f64>(cP, min(load<f64>(cP), min(f64x2.extract_lane(cPos, 0), f64x2.extract_lane(cPos, 1))));
  }
  // counters: everBelowLimit, everQuasiExtinct, unbounded, zeroCatchYears (u32 each)
  store<u32>(pCounters, load<u32>(pCounters, 12) + zeroYears, 12);
  let total: f64 = 0;
  let aav: f64 = 0;
  let aavCount: u32 = 0;
  for (let k = 0; k < size; k++) {
    const o = <usize>k << 3;
    const f = load<i64>(flags + o);
    if (f & BELOW) store<u32>(pCounters, load<u32>(pCounters, 0) + 1, 0);
    if (f & QUASI) store<u32>(pCounters, load<u32>(pCounters, 4) + 1, 4);
    if (f & UNBOUNDED) store<u32>(pCounters, load<u32>(pCounters, 8) + 1, 8);
    const sc = load<f64>(sums + o);
    total += sc;
    if (sc > 0) {
      aav += load<f64>(changes + o) / sc;
      aavCount++;
    }
  }
  store<f64>(pCatchTotals + (<usize>slot << 3), total);
  store<f64>(pAavSums + (<usize>slot << 3), aav);
  store<u32>(pAavCounts + (<usize>slot << 2), aavCount);
}
