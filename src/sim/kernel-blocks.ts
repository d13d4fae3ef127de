import type { ClosedLoop } from "../policy/closed-loop.js";
import type { Rule } from "../policy/rule-spec.js";
import { expTable } from "./exp-table.js";
import { UNBOUNDED_FACTOR } from "./project.js";
import { BINS_PER_OCTAVE, HISTOGRAM_BINS, LOWEST_OCTAVE, positiveSpan } from "./quantile-histogram.js";
import { BLOCK_SIZE, blockLength } from "./replicate-streams.js";
import type { Scenario } from "./scenario.js";
import type { ProjectionParts } from "./projection-parts.js";
import type { Uncertainty } from "./uncertainty.js";
import {
  KERNEL_ARRAYS,
  KERNEL_CONFIG,
  KERNEL_MODEL_WIDTH,
  type KernelArrayName,
  type KernelConfigName,
  kernelFamily,
  kernelRule,
} from "./wasm/kernel-layout.js";
import { PROJECTION_KERNEL_WASM } from "./wasm/projection-kernel.generated.js";
import { ZIGGURAT_TABLES } from "./ziggurat.js";

const EXP_TABLE = expTable();

/**
 * The stochastic projection's inner loop compiled to WebAssembly (src/sim/wasm/
 * projection-kernel.ts), for loops whose state is one number. It runs the replicate blocks
 * exactly as runBlock in simulate-blocks.ts does (same random stream, same order of
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

/** True when the kernel can run this loop: a one-number state, a family and a rule kind it knows, and an engine with WebAssembly SIMD. */
export function kernelApplies(loop: ClosedLoop): boolean {
  return (
    loop.layout.dimension === 1 &&
    kernelFamily(loop.model.family) !== null &&
    kernelRule(loop.rule.kind) !== null &&
    instance() !== null
  );
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
  // The size in bytes of every array the kernel uses (kernel-layout.ts gives their order).
  const bytes: Record<KernelArrayName, number> = {
    models: M * KERNEL_MODEL_WIDTH * 8,
    kn: 128 * 4,
    wn: 128 * 8,
    fn: 128 * 8,
    n: B * 8,
    eps: B * 8,
    prevCatch: B * 8,
    sumCatch: B * 8,
    sumChange: B * 8,
    flags: B * 8,
    pick: B * 4,
    aCounts: parts.abundanceCounts.length * 4,
    cCounts: parts.catchCounts.length * 4,
    aRange: parts.abundanceRange.length * 8,
    cRange: parts.catchRange.length * 8,
    below: (H + 1) * 4,
    recovery: (H + 1) * 4,
    counters: 4 * 4,
    catchTotals: nb * 8,
    aavSums: nb * 8,
    aavCounts: nb * 4,
    z: B * 24, // up to three planes of deviates (process, survey, catch)
    aPos: (H + 1) * 8,
    cPos: H * 8,
    exp: 256 * 8,
  };
  const cfgAt = L.take(KERNEL_CONFIG.length * 8);
  const ptrAt = L.take(KERNEL_ARRAYS.length * 4);
  const at = {} as Record<KernelArrayName, number>;
  for (const name of KERNEL_ARRAYS) at[name] = L.take(bytes[name]);

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
  const family = kernelFamily(scenario.model.family);
  const ruleEntry = kernelRule(rule.kind);
  if (!family || !ruleEntry)
    throw new Error("projection kernel: not a kernel loop (check kernelApplies first)");
  const [q1, q2, q3, q4] = ruleEntry.settings(rule);
  const sdP = u.processSd;
  const rho = u.processAutocorrelation;
  const cfg: Record<KernelConfigName, number> = {
    horizon: H,
    modelCount: M,
    family: family.code,
    ruleKind: ruleEntry.code,
    q1,
    q2,
    q3,
    q4,
    stocking: rule.stocking,
    before: rule.timing === "before" ? 1 : 0,
    sdP,
    rho,
    innovation: sdP * Math.sqrt(1 - rho * rho),
    halfP: 0.5 * sdP * sdP,
    sdO: u.observationSd,
    halfO: 0.5 * u.observationSd * u.observationSd,
    sdI: u.implementationSd,
    halfI: 0.5 * u.implementationSd * u.implementationSd,
    limit: u.limit,
    quasi: u.quasiExtinction,
    recoveryTarget: u.recoveryTarget,
    start: scenario.start[0]!,
    scale: 1 / K,
    bound: UNBOUNDED_FACTOR * K,
    bins: HISTOGRAM_BINS,
    binBase: (1023 + LOWEST_OCTAVE) * BINS_PER_OCTAVE,
    lastBin: HISTOGRAM_BINS - 1,
  };
  f64(cfgAt, KERNEL_CONFIG.length).set(KERNEL_CONFIG.map((name) => cfg[name]));
  const models = f64(at.models, M * KERNEL_MODEL_WIDTH);
  loops.forEach((loop, i) => models.set(family.numbers(loop.model.params), i * KERNEL_MODEL_WIDTH));
  new BigUint64Array(buf, base + at.exp, 256).set(EXP_TABLE);
  new Int32Array(buf, base + at.kn, 128).set(ZIGGURAT_TABLES.kn);
  f64(at.wn, 128).set(ZIGGURAT_TABLES.wn);
  f64(at.fn, 128).set(ZIGGURAT_TABLES.fn);
  f64(at.aRange, parts.abundanceRange.length).set(parts.abundanceRange);
  f64(at.cRange, parts.catchRange.length).set(parts.catchRange);
  f64(at.aPos, H + 1).set(parts.abundancePositiveMin);
  f64(at.cPos, H).set(parts.catchPositiveMin);
  // The pointers, in the order configure() reads them.
  u32(ptrAt, KERNEL_ARRAYS.length).set(KERNEL_ARRAYS.map((name) => base + at[name]));
  k.configure(base + cfgAt, base + ptrAt);
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
