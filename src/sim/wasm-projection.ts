import { GOMPERTZ_FLOOR } from "../models/gompertz.js";
import type { Model } from "../models/model-spec.js";
import type { ClosedLoop } from "../policy/closed-loop.js";
import type { Rule } from "../policy/rule-spec.js";
import { expTable } from "./exp-table.js";
import { UNBOUNDED_FACTOR } from "./project.js";
import { BINS_PER_OCTAVE, HISTOGRAM_BINS, LOWEST_OCTAVE, positiveSpan } from "./quantile-histogram.js";
import { BLOCK_SIZE, blockLength } from "./replicate-streams.js";
import type { Scenario } from "./scenario.js";
import type { ProjectionParts } from "./stochastic-projection.js";
import type { Uncertainty } from "./uncertainty.js";
import { PROJECTION_KERNEL_WASM } from "./wasm/projection-kernel.generated.js";
import { ZIGGURAT_TABLES } from "./ziggurat.js";

const EXP_TABLE = expTable();

/**
 * The stochastic projection's inner loop compiled to WebAssembly (src/sim/wasm/
 * projection-kernel.ts), for loops whose state is one number. It runs the replicate blocks
 * exactly as runBlock in stochastic-projection.ts does (same random stream, same order of
 * operations, same histograms and counters), two replicates at a time in SIMD lanes, about
 * three times as fast; only exp, log and pow come from another library, so the two agree to
 * rounding.
 */
interface KernelExports {
  readonly memory: WebAssembly.Memory;
  reserve(bytes: number): number;
  configure(cfg: number, ptr: number): void;
  runBlock(slot: number, size: number, s01: number, s00: number, s11: number, s10: number): void;
}

const FAMILY_CODES: Record<string, number> = {
  ricker: 0,
  "beverton-holt": 1,
  "discrete-logistic": 2,
  gompertz: 3,
  "allee-ricker": 4,
  hassell: 5,
  shepherd: 6,
  "theta-logistic": 7,
};

/** The compiled kernel; null where it does not compile (no WebAssembly SIMD); undefined until tried. */
let kernel: KernelExports | null | undefined;
/** The layout of the last run that left its two histograms zero (see kernelBlocks). */
let countsLeftZero: string | null = null;

/** The kernel, compiled on first use, or null where the engine cannot compile it. */
function instance(): KernelExports | null {
  if (kernel === undefined) {
    const bin = atob(PROJECTION_KERNEL_WASM);
    const bytes = new Uint8Array(bin.length);
    for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
    const abort = () => {
      throw new Error("projection kernel: internal error");
    };
    try {
      kernel = new WebAssembly.Instance(new WebAssembly.Module(bytes), { env: { abort } })
        .exports as unknown as KernelExports;
    } catch {
      kernel = null;
    }
  }
  return kernel;
}

/** The rule kinds quota() in the kernel knows. */
const RULE_KINDS_IN_KERNEL: ReadonlySet<string> = new Set([
  "no-harvest",
  "constant-catch",
  "constant-rate",
  "constant-escapement",
  "threshold",
]);

/** True when the kernel can run this loop: a one-number state, a family and a rule kind it knows, and an engine with WebAssembly SIMD. */
export function kernelApplies(loop: ClosedLoop): boolean {
  return (
    loop.layout.dimension === 1 &&
    FAMILY_CODES[loop.model.family] !== undefined &&
    RULE_KINDS_IN_KERNEL.has(loop.rule.kind) &&
    instance() !== null
  );
}

/** The four numbers the kernel reads per parameter set (see production() in the kernel). */
function modelParams(m: Model): [number, number, number, number] {
  const p = m.params;
  const K = p.K!;
  switch (m.family) {
    case "gompertz":
      return [p.r!, K, GOMPERTZ_FLOOR * K, 0];
    case "allee-ricker":
      return [p.r!, K, p.A!, 0];
    case "hassell":
      return [p.R0!, K, p.beta!, (Math.pow(p.R0!, 1 / p.beta!) - 1) / K];
    case "shepherd":
      return [p.R0!, K, p.delta!, 0];
    case "theta-logistic":
      return [p.r!, K, p.theta!, 0];
    case "beverton-holt":
      return [p.R0!, K, 0, 0];
    default:
      return [p.r!, K, 0, 0];
  }
}

/** The rule's kind code and settings (see quota() in the kernel). */
function ruleSettings(rule: Rule): [number, number, number, number, number] {
  switch (rule.kind) {
    case "constant-catch":
      return [1, rule.quota, 0, 0, 0];
    case "constant-rate":
      return [2, rule.rate, 0, 0, 0];
    case "constant-escapement":
      return [3, rule.escapement, 0, 0, 0];
    case "threshold":
      return [4, rule.lowerTrigger, rule.upperTrigger, rule.maxRate, rule.upperTrigger - rule.lowerTrigger];
    case "no-harvest":
      return [0, 0, 0, 0, 0];
    default:
      throw new Error(`projection kernel: no quota for rule kind ${(rule as { kind: string }).kind}`);
  }
}

/** Byte offsets of every array in the kernel's region, 16-byte aligned (the kernel reads two lanes at once). */
class Layout {
  bytes = 0;
  take(n: number): number {
    const at = this.bytes;
    this.bytes += Math.ceil(n / 16) * 16;
    return at;
  }
}

/**
 * Runs blocks [from, to) in the kernel, adding into `parts` (fresh, from simulateBlocks) and
 * taking each block's generator state from `states` in block order.
 */
export function kernelBlocks(
  parts: ProjectionParts,
  scenario: Scenario,
  u: Uncertainty,
  rule: Rule,
  loops: readonly ClosedLoop[],
  states: Iterator<readonly number[]>,
): void {
  const k = instance();
  if (!k) throw new Error("projection kernel: not compiled (check kernelApplies first)");
  const H = scenario.horizon;
  const K = scenario.model.params.K!;
  const [from, to] = parts.blocks;
  const nb = to - from;
  // Per-replicate arrays hold an even number of replicates (the kernel takes them in pairs).
  const B = (Math.min(BLOCK_SIZE, u.replicates) + 1) & ~1;
  const M = loops.length;
  const L = new Layout();
  // Every array the kernel uses; after cfg and ptr, in the order configure() reads their pointers.
  const at = {
    cfg: L.take(32 * 8),
    ptr: L.take(32 * 4),
    models: L.take(M * 32),
    kn: L.take(128 * 4),
    wn: L.take(128 * 8),
    fn: L.take(128 * 8),
    n: L.take(B * 8),
    eps: L.take(B * 8),
    prevCatch: L.take(B * 8),
    sumCatch: L.take(B * 8),
    sumChange: L.take(B * 8),
    flags: L.take(B * 8),
    pick: L.take(B * 4),
    aCounts: L.take(parts.abundanceCounts.length * 4),
    cCounts: L.take(parts.catchCounts.length * 4),
    aRange: L.take(parts.abundanceRange.length * 8),
    cRange: L.take(parts.catchRange.length * 8),
    below: L.take((H + 1) * 4),
    recovery: L.take((H + 1) * 4),
    counters: L.take(4 * 4),
    catchTotals: L.take(nb * 8),
    aavSums: L.take(nb * 8),
    aavCounts: L.take(nb * 4),
    z: L.take(B * 24), // up to three planes of deviates (process, survey, catch)
    aPos: L.take((H + 1) * 8),
    cPos: L.take(H * 8),
    exp: L.take(256 * 8),
  };
  const base = k.reserve(L.bytes);
  if (base === 0) throw new Error("projection kernel: out of memory");
  const buf = k.memory.buffer;
  // Zero the region. The two histograms (most of it: 6.7 MB for 50 years) are left zero by the
  // last run when they lay at the same place, so then only the other arrays need it.
  const layout = `${base}:${at.aCounts}:${at.cCounts}:${at.aRange}`;
  if (layout === countsLeftZero) {
    const bytes = new Uint8Array(buf, base, L.bytes);
    bytes.fill(0, 0, at.aCounts);
    bytes.fill(0, at.aRange);
  } else {
    new Uint8Array(buf, base, L.bytes).fill(0);
  }
  countsLeftZero = null;
  const f64 = (off: number, len: number) => new Float64Array(buf, base + off, len);
  const u32 = (off: number, len: number) => new Uint32Array(buf, base + off, len);
  const [ruleKind, q1, q2, q3, q4] = ruleSettings(rule);
  const sdP = u.processSd;
  const rho = u.processAutocorrelation;
  f64(at.cfg, 27).set([
    H,
    M,
    FAMILY_CODES[scenario.model.family]!,
    ruleKind,
    q1,
    q2,
    q3,
    q4,
    rule.stocking,
    rule.timing === "before" ? 1 : 0,
    sdP,
    rho,
    sdP * Math.sqrt(1 - rho * rho),
    0.5 * sdP * sdP,
    u.observationSd,
    0.5 * u.observationSd * u.observationSd,
    u.implementationSd,
    0.5 * u.implementationSd * u.implementationSd,
    u.limit,
    u.quasiExtinction,
    u.recoveryTarget,
    scenario.start[0]!,
    1 / K,
    UNBOUNDED_FACTOR * K,
    HISTOGRAM_BINS,
    (1023 + LOWEST_OCTAVE) * BINS_PER_OCTAVE,
    HISTOGRAM_BINS - 1,
  ]);
  const models = f64(at.models, M * 4);
  loops.forEach((loop, i) => models.set(modelParams(loop.model), i * 4));
  new BigUint64Array(buf, base + at.exp, 256).set(EXP_TABLE);
  new Int32Array(buf, base + at.kn, 128).set(ZIGGURAT_TABLES.kn);
  f64(at.wn, 128).set(ZIGGURAT_TABLES.wn);
  f64(at.fn, 128).set(ZIGGURAT_TABLES.fn);
  f64(at.aRange, parts.abundanceRange.length).set(parts.abundanceRange);
  f64(at.cRange, parts.catchRange.length).set(parts.catchRange);
  f64(at.aPos, H + 1).set(parts.abundancePositiveMin);
  f64(at.cPos, H).set(parts.catchPositiveMin);
  // The pointers, in the order configure() reads them: every array after cfg and ptr, as laid out.
  const order = (Object.keys(at) as (keyof typeof at)[]).slice(2);
  u32(at.ptr, order.length).set(order.map((name) => base + at[name]));
  k.configure(base + at.cfg, base + at.ptr);
  for (let b = from; b < to; b++) {
    const s = states.next().value as readonly number[];
    k.runBlock(b - from, blockLength(b, u.replicates), s[0]!, s[1]!, s[2]!, s[3]!);
  }
  parts.abundanceRange.set(f64(at.aRange, parts.abundanceRange.length));
  parts.catchRange.set(f64(at.cRange, parts.catchRange.length));
  parts.abundancePositiveMin.set(f64(at.aPos, H + 1));
  parts.catchPositiveMin.set(f64(at.cPos, H));
  // Each year's counts lie in bin 0 (the zeros) and the bins of its positive values: copy only
  // those, and zero them behind, so the histograms are left zero for the next run.
  const copySpans = (
    from: Uint32Array,
    into: Uint32Array,
    range: Float64Array,
    positiveMin: Float64Array,
    years: number,
  ) => {
    for (let t = 0; t < years; t++) {
      const off = t * HISTOGRAM_BINS;
      into[off] = from[off]!;
      from[off] = 0;
      const [a, b] = positiveSpan(positiveMin[t]!, range[2 * t + 1]!, 1 / K);
      if (a <= b) {
        into.set(from.subarray(off + a, off + b + 1), off + a);
        from.fill(0, off + a, off + b + 1);
      }
    }
  };
  copySpans(
    u32(at.aCounts, parts.abundanceCounts.length),
    parts.abundanceCounts,
    parts.abundanceRange,
    parts.abundancePositiveMin,
    H + 1,
  );
  copySpans(
    u32(at.cCounts, parts.catchCounts.length),
    parts.catchCounts,
    parts.catchRange,
    parts.catchPositiveMin,
    H,
  );
  countsLeftZero = layout;
  parts.belowLimitByYear.set(u32(at.below, H + 1));
  parts.recoveryByYear.set(u32(at.recovery, H + 1));
  const c = u32(at.counters, 4);
  parts.everBelowLimit = c[0]!;
  parts.everQuasiExtinct = c[1]!;
  parts.unbounded = c[2]!;
  parts.zeroCatchYears = c[3]!;
  parts.catchTotals.set(f64(at.catchTotals, nb));
  parts.aavSums.set(f64(at.aavSums, nb));
  parts.aavCounts.set(u32(at.aavCounts, nb));
}
