// AssemblyScript source of the stochastic projection's inner loop for loops whose state is
// one number (no delay, no survey lag, no quota caps): the same arithmetic, in the same
// order and from the same random stream, as runBlock in ../stochastic-projection.ts, compiled
// to WebAssembly by scripts/build-kernel.mjs. Only exp, log and pow come from a different
// library (AssemblyScript's port of musl instead of V8's port of fdlibm; both within 1 ulp),
// so results agree with the TypeScript loop to rounding, not bit for bit; the tests check
// the agreement for every family and rule kind. Each growth factor below is the equation of
// the family's own file in src/models/ (the source is cited there), and each quota the
// equation of its file in src/policy/.
//
// Memory: the caller reserves one region (reserve) and lays every array out in it; the
// pointers come in through configure. Nothing here allocates.

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
let pAlive: usize = 0;
let pAPos: usize = 0;
let pCPos: usize = 0;

const BELOW: u32 = 1;
const QUASI: u32 = 2;
const RECOVERED: u32 = 4;
const UNBOUNDED: u32 = 8;

/** The start of a region of `bytes` bytes after this module's own data, grown as needed. */
export function reserve(bytes: usize): usize {
  const base = (__heap_base + 15) & ~(<usize>15);
  const pages = <i32>((base + bytes + 0xffff) >>> 16);
  const have = memory.size();
  if (pages > have && memory.grow(pages - have) < 0) return 0;
  return base;
}

/** Reads the settings (f64 array `cfg`, layout in ../wasm-projection.ts) and the pointers (u32 array `ptr`). */
export function configure(cfg: usize, ptr: usize): void {
  H = <i32>load<f64>(cfg, 0);
  M = <i32>load<f64>(cfg, 8);
  family = <i32>load<f64>(cfg, 16);
  ruleKind = <i32>load<f64>(cfg, 24);
  q1 = load<f64>(cfg, 32);
  q2 = load<f64>(cfg, 40);
  q3 = load<f64>(cfg, 48);
  q4 = load<f64>(cfg, 56);
  stocking = load<f64>(cfg, 64);
  before = load<f64>(cfg, 72) != 0;
  sdP = load<f64>(cfg, 80);
  rho = load<f64>(cfg, 88);
  innovation = load<f64>(cfg, 96);
  halfP = load<f64>(cfg, 104);
  sdO = load<f64>(cfg, 112);
  halfO = load<f64>(cfg, 120);
  sdI = load<f64>(cfg, 128);
  halfI = load<f64>(cfg, 136);
  limit = load<f64>(cfg, 144);
  quasi = load<f64>(cfg, 152);
  recoveryTarget = load<f64>(cfg, 160);
  start = load<f64>(cfg, 168);
  scale = load<f64>(cfg, 176);
  bound = load<f64>(cfg, 184);
  bins = <i32>load<f64>(cfg, 192);
  binBase = <i32>load<f64>(cfg, 200);
  lastBin = <i32>load<f64>(cfg, 208);
  pModels = load<u32>(ptr, 0);
  pKn = load<u32>(ptr, 4);
  pWn = load<u32>(ptr, 8);
  pFn = load<u32>(ptr, 12);
  pN = load<u32>(ptr, 16);
  pEps = load<u32>(ptr, 20);
  pPrevCatch = load<u32>(ptr, 24);
  pSumCatch = load<u32>(ptr, 28);
  pSumChange = load<u32>(ptr, 32);
  pFlags = load<u32>(ptr, 36);
  pPick = load<u32>(ptr, 40);
  pACounts = load<u32>(ptr, 44);
  pCCounts = load<u32>(ptr, 48);
  pARange = load<u32>(ptr, 52);
  pCRange = load<u32>(ptr, 56);
  pBelow = load<u32>(ptr, 60);
  pRecovery = load<u32>(ptr, 64);
  pCounters = load<u32>(ptr, 68);
  pCatchTotals = load<u32>(ptr, 72);
  pAavSums = load<u32>(ptr, 76);
  pAavCounts = load<u32>(ptr, 80);
  pZ = load<u32>(ptr, 84);
  pAlive = load<u32>(ptr, 88);
  pAPos = load<u32>(ptr, 92);
  pCPos = load<u32>(ptr, 96);
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

/** `count` standard normal deviates to z, z + stride, … (zigguratNormal's draws). */
function fillNormals(z: usize, count: i32, stride: usize): void {
  for (let k = 0; k < count; k++) {
    store<f64>(z, normal());
    z += stride;
  }
}

// Called through the function table, so the optimiser keeps it a function of its own, its
// few values in registers, instead of inlining it into runBlock's crowded body (measured
// about 5% faster).
let fill: (z: usize, count: i32, stride: usize) => void = fillNormals;

@inline function normal(): f64 {
  const j = nextInt();
  const i = j & 127;
  const u = j >> 7;
  return abs<i32>(u) < load<i32>(pKn + (<usize>i << 2)) ? <f64>u * load<f64>(pWn + (<usize>i << 3)) : edge(i, u);
}

/** The quota H(y) of the rule (src/policy/*.ts): kind, then its settings. */
@inline function quota(kind: i32, y: f64, r1: f64, r2: f64, r3: f64, r4: f64): f64 {
  switch (kind) {
    case 1: return r1; // constant catch
    case 2: return r1 * y; // constant rate
    case 3: return select<f64>(y - r1, 0, y > r1); // constant escapement
    case 4: return select<f64>(0, select<f64>(r3 * y, ((r3 * (y - r1)) / r4) * y, y >= r2), y <= r1); // threshold (lower, upper, rate, width)
    default: return 0; // no harvest
  }
}

/**
 * base · g(dens) · exp(ε) with the family's factor g (src/models/*.ts); one exp for the
 * exponential families, as noisyProduction in src/policy/closed-loop.ts.
 */
@inline function production(fam: i32, base: f64, dens: f64, lp: f64, p: usize): f64 {
  const a = load<f64>(p, 0);
  const K = load<f64>(p, 8);
  switch (fam) {
    case 0: return base * Math.exp(a * (1 - dens / K) + lp); // Ricker
    case 1: return base * (a / (1 + ((a - 1) * dens) / K)) * Math.exp(lp); // Beverton–Holt
    case 2: return base * (1 + a * (1 - dens / K)) * Math.exp(lp); // discrete logistic
    case 3: return base * Math.exp(a * Math.log(K / Math.max(dens, load<f64>(p, 16))) + lp); // Gompertz
    case 4: return base * Math.exp(a * (1 - dens / K) * (dens / load<f64>(p, 16) - 1) + lp); // Allee–Ricker
    case 5: return base * (a / Math.pow(1 + load<f64>(p, 24) * dens, load<f64>(p, 16))) * Math.exp(lp); // Hassell
    case 6: return base * (a / (1 + (a - 1) * Math.pow(dens / K, load<f64>(p, 16)))) * Math.exp(lp); // Shepherd
    default: return base * (1 + a * (1 - Math.pow(dens / K, load<f64>(p, 16)))) * Math.exp(lp); // theta-logistic
  }
}

/** binOf of src/sim/quantile-histogram.ts: 0 for 0, else the bit-binned index of v·scale, clamped to [1, last]. */
@inline function binOf(v: f64, sc: f64, first: i32, last: i32): i32 {
  const i = <i32>(reinterpret<u64>(v * sc) >>> 44) - first + 2;
  return select<i32>(0, select<i32>(1, select<i32>(last, i, i > last), i < 2), v == 0);
}

@inline function bump(p: usize): void {
  store<u32>(p, load<u32>(p) + 1);
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
  const r1 = q1;
  const r2 = q2;
  const r3 = q3;
  const r4 = q4;
  const A = stocking;
  const beforeRepro = before;
  const hasP = sdP > 0;
  const hasO = sdO > 0;
  const hasI = sdI > 0;
  const ar = rho;
  const inn = innovation;
  const hP = halfP;
  const sO = sdO;
  const hO = halfO;
  const sI = sdI;
  const hI = halfI;
  const lim = limit;
  const qe = quasi;
  const target = recoveryTarget;
  const top = bound;
  const sc = scale;
  const first = binBase;
  const last = lastBin;
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
  const alive = pAlive;
  // A replicate at 0 with no catch and no stocking stays at 0 with no catch for good (the
  // production of 0 is 0): from then on its years are counted in bulk, not simulated. Its
  // draws are still made (fillNormals), so the other replicates' numbers do not change.
  const absorbing = A == 0 && target > 0;
  let aliveCount = size;
  const draws: usize = (hasP ? 1 : 0) + (hasO ? 1 : 0) + (hasI ? 1 : 0);
  const stride = draws << 3;
  const oP: usize = 0;
  const oO: usize = hasP ? 8 : 0;
  const oI: usize = oO + (hasO ? 8 : 0);
  // Per-replicate set-up, in the TypeScript loop's order of draws: the parameter set, then ε[−1].
  for (let k = 0; k < size; k++) {
    const o = <usize>k << 3;
    store<i32>(picks + (<usize>k << 2), single ? 0 : min<i32>(M - 1, <i32>Math.floor((<f64>(<u32>nextInt()) / 4294967296) * <f64>M)));
    store<f64>(epss + o, ar != 0 && hasP ? sdP * normal() : 0);
    store<f64>(ns + o, n0);
    store<f64>(prevs + o, 0);
    store<f64>(sums + o, 0);
    store<f64>(changes + o, 0);
    store<u8>(flags + <usize>k, n0 >= target ? <u8>RECOVERED : 0);
    store<i32>(alive + (<usize>k << 2), k);
  }
  const a0 = pACounts + (<usize>binOf(n0, sc, first, last) << 2);
  store<u32>(a0, load<u32>(a0) + <u32>size);
  if (n0 < load<f64>(pARange, 0)) store<f64>(pARange, n0, 0);
  if (n0 > load<f64>(pARange, 8)) store<f64>(pARange, n0, 8);
  if (n0 < load<f64>(pAPos) && n0 > 0) store<f64>(pAPos, n0);
  if (n0 < lim) store<u32>(pBelow, load<u32>(pBelow) + <u32>size);
  if (n0 >= target) store<u32>(pRecovery, load<u32>(pRecovery) + <u32>size);
  let zeroYears: u32 = 0;
  for (let t = 0; t < H; t++) {
    const aOff = pACounts + (<usize>((t + 1) * nB) << 2);
    const cOff = pCCounts + (<usize>(t * nB) << 2);
    const belowAt = pBelow + (<usize>(t + 1) << 2);
    const recoveryAt = pRecovery + (<usize>(t + 1) << 2);
    let aMin = load<f64>(pARange + (<usize>(2 * t + 2) << 3));
    let aMax = load<f64>(pARange + (<usize>(2 * t + 3) << 3));
    let cMin = load<f64>(pCRange + (<usize>(2 * t) << 3));
    let cMax = load<f64>(pCRange + (<usize>(2 * t + 1) << 3));
    let aPos = load<f64>(pAPos + (<usize>(t + 1) << 3));
    let cPos = load<f64>(pCPos + (<usize>t << 3));
    let belowCount: u32 = 0;
    let recoveryCount: u32 = 0;
    // The year's normal deviates first, in the order the TypeScript loop draws them (per
    // replicate: process, survey, catch); the loop after uses them.
    if (draws > 0) fill(zs, size * <i32>draws, 8);
    // The absorbed replicates' year, all at once: N = 0, C = 0.
    const absorbed = <u32>(size - aliveCount);
    if (absorbed > 0) {
      store<u32>(aOff, load<u32>(aOff) + absorbed);
      store<u32>(cOff, load<u32>(cOff) + absorbed);
      zeroYears += absorbed;
      if (0 < lim) belowCount += absorbed;
      if (0 < aMin) aMin = 0;
      if (0 > aMax) aMax = 0;
      if (0 < cMin) cMin = 0;
      if (0 > cMax) cMax = 0;
    }
    const later = t > 0;
    let kept = 0;
    for (let j = 0; j < aliveCount; j++) {
      const k = load<i32>(alive + (<usize>j << 2));
      const o = <usize>k << 3;
      const z = zs + <usize>k * stride;
      let lp: f64 = 0;
      let sm: f64 = 1;
      let im: f64 = 1;
      if (hasP) {
        const e = ar * load<f64>(epss + o) + inn * load<f64>(z + oP);
        store<f64>(epss + o, e);
        lp = e - hP;
      }
      if (hasO) sm = Math.exp(sO * load<f64>(z + oO) - hO);
      if (hasI) im = Math.exp(sI * load<f64>(z + oI) - hI);
      const p = models + (single ? 0 : <usize>load<i32>(picks + (<usize>k << 2)) << 5);
      // nextWith of src/policy/closed-loop.ts, branch-free (select, min, max): which
      // replicates have collapsed, fallen below the limit or recovered is unpredictable from
      // one to the next. No NaN reaches here, and the production of 0 is 0, so the values
      // are those of nextWith's branches.
      const n = load<f64>(ns + o);
      const aim = quota(kind, n * sm, r1, r2, r3, r4) * im;
      let next: f64;
      let c: f64;
      if (beforeRepro) {
        c = min<f64>(aim, n);
        next = max<f64>(production(fam, n - c, n - c, lp, p), 0) + A;
      } else {
        const q = max<f64>(production(fam, n, n, lp, p), 0);
        c = min<f64>(aim, q);
        next = q - c + A;
      }
      let f = <u32>load<u8>(flags + <usize>k);
      if (!(next <= top)) {
        next = top;
        f |= UNBOUNDED;
      }
      store<f64>(ns + o, next);
      const isBelow = <u32>(next < lim);
      belowCount += isBelow;
      f |= isBelow * BELOW;
      f |= <u32>(next < qe) * QUASI;
      const recovered = <u32>(next >= target) & ~(f >> 2) & 1;
      recoveryCount += recovered;
      f |= recovered * RECOVERED;
      store<u8>(flags + <usize>k, <u8>f);
      store<f64>(sums + o, load<f64>(sums + o) + c);
      if (later) store<f64>(changes + o, load<f64>(changes + o) + Math.abs(c - load<f64>(prevs + o)));
      store<f64>(prevs + o, c);
      zeroYears += <u32>(c == 0);
      bump(aOff + (<usize>binOf(next, sc, first, last) << 2));
      bump(cOff + (<usize>binOf(c, sc, first, last) << 2));
      // Branches, not f64.min/max (which V8 expands into a longer sequence for NaN and −0):
      // a new smallest or largest value is rare, so these are well predicted.
      if (next < aMin) aMin = next;
      if (next > aMax) aMax = next;
      if (c < cMin) cMin = c;
      if (c > cMax) cMax = c;
      // Smallest positive value (the test on the rare new minimum first, so it predicts well).
      if (next < aPos && next > 0) aPos = next;
      if (c < cPos && c > 0) cPos = c;
      store<i32>(alive + (<usize>kept << 2), k);
      kept += select<i32>(0, 1, absorbing && next == 0 && c == 0);
    }
    aliveCount = kept;
    store<f64>(pAPos + (<usize>(t + 1) << 3), aPos);
    store<f64>(pCPos + (<usize>t << 3), cPos);
    store<u32>(belowAt, load<u32>(belowAt) + belowCount);
    store<u32>(recoveryAt, load<u32>(recoveryAt) + recoveryCount);
    store<f64>(pARange + (<usize>(2 * t + 2) << 3), aMin);
    store<f64>(pARange + (<usize>(2 * t + 3) << 3), aMax);
    store<f64>(pCRange + (<usize>(2 * t) << 3), cMin);
    store<f64>(pCRange + (<usize>(2 * t + 1) << 3), cMax);
  }
  // counters: everBelowLimit, everQuasiExtinct, unbounded, zeroCatchYears (u32 each)
  store<u32>(pCounters, load<u32>(pCounters, 12) + zeroYears, 12);
  let total: f64 = 0;
  let aav: f64 = 0;
  let aavCount: u32 = 0;
  for (let k = 0; k < size; k++) {
    const f = load<u8>(pFlags + <usize>k);
    if (f & BELOW) store<u32>(pCounters, load<u32>(pCounters, 0) + 1, 0);
    if (f & QUASI) store<u32>(pCounters, load<u32>(pCounters, 4) + 1, 4);
    if (f & UNBOUNDED) store<u32>(pCounters, load<u32>(pCounters, 8) + 1, 8);
    const o = <usize>k << 3;
    const sc = load<f64>(pSumCatch + o);
    total += sc;
    if (sc > 0) {
      aav += load<f64>(pSumChange + o) / sc;
      aavCount++;
    }
  }
  store<f64>(pCatchTotals + (<usize>slot << 3), total);
  store<f64>(pAavSums + (<usize>slot << 3), aav);
  store<u32>(pAavCounts + (<usize>slot << 2), aavCount);
}
