import { closedLoop, type ClosedLoop, type StepNoise, type StepRecord } from "../policy/closed-loop.js";
import type { Rule } from "../policy/rule-spec.js";
import { UNBOUNDED_FACTOR } from "./project.js";
import { addGroupSums, binOf, HISTOGRAM_BINS, HISTOGRAM_GROUPS, positiveSpan } from "./quantile-histogram.js";
import { BLOCK_SIZE, blockCount, blockLength, blockStates, blockStreams } from "./replicate-streams.js";
import type { Scenario } from "./scenario.js";
import type { ProjectionParts } from "./projection-parts.js";
import type { Uncertainty } from "./uncertainty.js";
import { kernelApplies, kernelBlocks } from "./kernel-blocks.js";
import { zigguratNormal, type IntSource } from "./ziggurat.js";

/**
 * "auto": the WebAssembly kernel (kernel-blocks.ts) when the loop's state is one number,
 * this file's TypeScript loop otherwise; "typescript": always this file's loop (the
 * reference the kernel is tested against).
 */
export type ProjectionEngine = "auto" | "typescript";

const BELOW = 1;
const QUASI = 2;
const RECOVERED = 4;
const UNBOUNDED = 8;

/**
 * Simulates the replicate blocks [from, to) of a stochastic projection of the scenario
 * under a rule (the scenario's own rule when none is given). Each replicate, each year:
 *
 *   ε[t]   = ρ·ε[t−1] + σ_p·√(1 − ρ²)·z,   ε[−1] ~ N(0, σ_p²)      (AR(1) process noise)
 *   P[t]   = production of the closed loop × exp(ε[t] − σ_p²/2)
 *   y'     = y[t−L] × exp(σ_o·z_o − σ_o²/2)                        (survey the rule sees)
 *   C[t]   = min(Q(y') × exp(σ_i·z_i − σ_i²/2), stock available)   (implementation error)
 *
 * with independent standard normal z (ziggurat), so each multiplier has mean 1 and median
 * exp(−σ²/2). A replicate's parameter set is drawn uniformly from uncertainty.models when
 * there is more than one. The noise each replicate sees depends only on the seed, its block
 * and its place in the block, not on the rule or the state: two rules run with the same
 * uncertainty see the same draws (common random numbers).
 * Sources: lognormal process and observation error with AR(1) autocorrelation as in
 * Hilborn, R. & Walters, C. J. (1992). Quantitative Fisheries Stock Assessment. Chapman &
 * Hall, ch. 7 (from memory); bias correction −σ²/2: Aitchison, J. & Brown, J. A. C. (1957).
 * The Lognormal Distribution. Cambridge University Press.
 */
export function simulateBlocks(
  scenario: Scenario,
  uncertainty: Uncertainty,
  from: number,
  to: number,
  rule: Rule = scenario.rule,
  engine: ProjectionEngine = "auto",
): ProjectionParts {
  const H = scenario.horizon;
  const K = scenario.model.params.K!;
  const parts: ProjectionParts = {
    blocks: [from, to],
    horizon: H,
    abundanceCounts: new Uint32Array((H + 1) * HISTOGRAM_BINS),
    catchCounts: new Uint32Array(H * HISTOGRAM_BINS),
    abundanceGroups: new Uint32Array((H + 1) * HISTOGRAM_GROUPS),
    catchGroups: new Uint32Array(H * HISTOGRAM_GROUPS),
    abundanceRange: emptyRange(H + 1),
    catchRange: emptyRange(H),
    abundancePositiveMin: new Float64Array(H + 1).fill(Number.MAX_VALUE),
    catchPositiveMin: new Float64Array(H).fill(Number.MAX_VALUE),
    belowLimitByYear: new Uint32Array(H + 1),
    recoveryByYear: new Uint32Array(H + 1),
    everBelowLimit: 0,
    everQuasiExtinct: 0,
    zeroCatchYears: 0,
    unbounded: 0,
    catchTotals: new Float64Array(to - from),
    aavSums: new Float64Array(to - from),
    aavCounts: new Uint32Array(to - from),
  };
  const loops = uncertainty.models.map((m) => closedLoop(m, rule));
  if (engine === "auto" && kernelApplies(loops[0]!)) {
    kernelBlocks(parts, scenario, uncertainty, rule, loops, blockStates(uncertainty.seed, from));
  } else {
    const streams = blockStreams(uncertainty.seed, from);
    const state = new BlockState(Math.min(BLOCK_SIZE, uncertainty.replicates), loops[0]!.layout.dimension);
    for (let b = from; b < to; b++) {
      const g = streams.next().value as IntSource;
      runBlock(
        parts,
        b - from,
        blockLength(b, uncertainty.replicates),
        g,
        loops,
        scenario,
        uncertainty,
        K,
        state,
      );
    }
  }
  const span = (positiveMin: Float64Array, range: Float64Array) => (t: number) =>
    positiveSpan(positiveMin[t]!, range[2 * t + 1]!, 1 / K);
  addGroupSums(
    parts.abundanceCounts,
    parts.abundanceGroups,
    H + 1,
    span(parts.abundancePositiveMin, parts.abundanceRange),
  );
  addGroupSums(parts.catchCounts, parts.catchGroups, H, span(parts.catchPositiveMin, parts.catchRange));
  return parts;
}

/** [min, max] pairs per year, empty (min = +max double, max = −max double). */
function emptyRange(years: number): Float64Array {
  const r = new Float64Array(2 * years);
  for (let t = 0; t < years; t++) {
    r[2 * t] = Number.MAX_VALUE;
    r[2 * t + 1] = -Number.MAX_VALUE;
  }
  return r;
}

/** The number of blocks of a run (for splitting across workers). */
export function projectionBlocks(uncertainty: Uncertainty): number {
  return blockCount(uncertainty.replicates);
}

class BlockState {
  readonly n: Float64Array;
  readonly eps: Float64Array;
  readonly prevCatch: Float64Array;
  readonly sumCatch: Float64Array;
  readonly sumChange: Float64Array;
  readonly flags: Uint8Array;
  readonly pick: Int32Array;
  readonly x: Float64Array[];
  constructor(size: number, dimension: number) {
    this.n = new Float64Array(size);
    this.eps = new Float64Array(size);
    this.prevCatch = new Float64Array(size);
    this.sumCatch = new Float64Array(size);
    this.sumChange = new Float64Array(size);
    this.flags = new Uint8Array(size);
    this.pick = new Int32Array(size);
    const flat = new Float64Array(dimension > 1 ? size * dimension : 0);
    this.x =
      dimension > 1
        ? Array.from({ length: size }, (_, k) => flat.subarray(k * dimension, (k + 1) * dimension))
        : [];
  }
}

/** One year of a replicate whose state is a vector (delays, survey lags, quota caps). */
function vectorYear(
  loop: ClosedLoop,
  x: Float64Array,
  lp: number,
  sm: number,
  im: number,
  rec: StepRecord,
  noise: StepNoise,
): number {
  noise.logProcess = lp;
  noise.survey = sm;
  noise.implementation = im;
  loop.step(x, x, rec, noise);
  return x[0]!;
}

function runBlock(
  parts: ProjectionParts,
  slot: number,
  size: number,
  g: IntSource,
  loops: readonly ClosedLoop[],
  scenario: Scenario,
  u: Uncertainty,
  K: number,
  st: BlockState,
): void {
  const H = scenario.horizon;
  const scale = 1 / K;
  const bound = UNBOUNDED_FACTOR * K;
  const { n, eps, prevCatch, sumCatch, sumChange, flags, pick } = st;
  const sdP = u.processSd;
  const rho = u.processAutocorrelation;
  const innovation = sdP * Math.sqrt(1 - rho * rho);
  const halfP = 0.5 * sdP * sdP;
  const sdO = u.observationSd;
  const halfO = 0.5 * sdO * sdO;
  const sdI = u.implementationSd;
  const halfI = 0.5 * sdI * sdI;
  const { limit, quasiExtinction, recoveryTarget } = u;
  const single = loops.length === 1;
  const loop0 = loops[0]!;
  const vector = loop0.layout.dimension > 1;
  const start = scenario.start[0]!;
  // Per-replicate set-up, in a fixed order of draws: the parameter set, then ε[−1].
  for (let k = 0; k < size; k++) {
    pick[k] = single
      ? 0
      : Math.min(loops.length - 1, Math.floor(((g.next() >>> 0) / 4294967296) * loops.length));
    eps[k] = rho !== 0 && sdP > 0 ? sdP * zigguratNormal(g) : 0;
    n[k] = start;
    prevCatch[k] = 0;
    sumCatch[k] = 0;
    sumChange[k] = 0;
    flags[k] = start >= recoveryTarget ? RECOVERED : 0;
    if (vector) st.x[k]!.set(loops[pick[k]!]!.initialState(scenario.start));
  }
  parts.abundanceCounts[binOf(start, scale)] += size;
  const aRange = parts.abundanceRange;
  const cRange = parts.catchRange;
  if (start < aRange[0]!) aRange[0] = start;
  if (start > aRange[1]!) aRange[1] = start;
  if (start < parts.abundancePositiveMin[0]! && start > 0) parts.abundancePositiveMin[0] = start;
  if (start < limit) parts.belowLimitByYear[0]! += size;
  if (start >= recoveryTarget) parts.recoveryByYear[0]! += size;
  const rec: StepRecord = { survey: 0, quota: 0, catch: 0, stocking: 0 };
  const noise: StepNoise = { logProcess: 0, survey: 1, implementation: 1 };
  const aCounts = parts.abundanceCounts;
  const cCounts = parts.catchCounts;
  const below = parts.belowLimitByYear;
  const recovery = parts.recoveryByYear;
  let zeroYears = 0;
  for (let t = 0; t < H; t++) {
    const aOff = (t + 1) * HISTOGRAM_BINS;
    const cOff = t * HISTOGRAM_BINS;
    let aMin = aRange[2 * t + 2]!;
    let aMax = aRange[2 * t + 3]!;
    let cMin = cRange[2 * t]!;
    let cMax = cRange[2 * t + 1]!;
    let aPos = parts.abundancePositiveMin[t + 1]!;
    let cPos = parts.catchPositiveMin[t]!;
    for (let k = 0; k < size; k++) {
      let lp = 0;
      let sm = 1;
      let im = 1;
      if (sdP > 0) {
        const e = rho * eps[k]! + innovation * zigguratNormal(g);
        eps[k] = e;
        lp = e - halfP;
      }
      if (sdO > 0) sm = Math.exp(sdO * zigguratNormal(g) - halfO);
      if (sdI > 0) im = Math.exp(sdI * zigguratNormal(g) - halfI);
      const loop = single ? loop0 : loops[pick[k]!]!;
      let next = vector
        ? vectorYear(loop, st.x[k]!, lp, sm, im, rec, noise)
        : loop.nextWith(n[k]!, lp, sm, im, rec);
      let f = flags[k]!;
      if (!(next <= bound)) {
        next = bound;
        f |= UNBOUNDED;
        if (vector) st.x[k]![0] = bound;
      }
      n[k] = next;
      const c = rec.catch;
      if (next < limit) {
        below[t + 1]!++;
        f |= BELOW;
      }
      if (next < quasiExtinction) f |= QUASI;
      if ((f & RECOVERED) === 0 && next >= recoveryTarget) {
        f |= RECOVERED;
        recovery[t + 1]!++;
      }
      flags[k] = f;
      sumCatch[k]! += c;
      if (t > 0) {
        const d = c - prevCatch[k]!;
        sumChange[k]! += Math.abs(d);
      }
      prevCatch[k] = c;
      if (c === 0) zeroYears++;
      aCounts[aOff + binOf(next, scale)]!++;
      cCounts[cOff + binOf(c, scale)]!++;
      if (next < aMin) aMin = next;
      if (next > aMax) aMax = next;
      if (c < cMin) cMin = c;
      if (c > cMax) cMax = c;
      if (next < aPos && next > 0) aPos = next;
      if (c < cPos && c > 0) cPos = c;
    }
    parts.abundancePositiveMin[t + 1] = aPos;
    parts.catchPositiveMin[t] = cPos;
    aRange[2 * t + 2] = aMin;
    aRange[2 * t + 3] = aMax;
    cRange[2 * t] = cMin;
    cRange[2 * t + 1] = cMax;
  }
  parts.zeroCatchYears += zeroYears;
  let total = 0;
  let aav = 0;
  let aavCount = 0;
  for (let k = 0; k < size; k++) {
    const f = flags[k]!;
    if (f & BELOW) parts.everBelowLimit++;
    if (f & QUASI) parts.everQuasiExtinct++;
    if (f & UNBOUNDED) parts.unbounded++;
    total += sumCatch[k]!;
    if (sumCatch[k]! > 0) {
      aav += sumChange[k]! / sumCatch[k]!;
      aavCount++;
    }
  }
  parts.catchTotals[slot] = total;
  parts.aavSums[slot] = aav;
  parts.aavCounts[slot] = aavCount;
}
