// The projection kernel's configuration layout, written once: the numbers passed to it and
// their slots, the arrays and the order of their pointers, and the integer codes of the
// families and rule kinds it knows. kernel-blocks.ts lays memory out from this table, and
// scripts/build-kernel.mjs writes the same table as AssemblyScript constants
// (kernel-layout.generated.ts) that projection-kernel.ts reads, so the two sides cannot
// disagree. A family or rule kind of the catalogue must appear here: with the code and the
// numbers of its case in the kernel, or as "typescript-loop-only".
import { GOMPERTZ_FLOOR } from "../../models/gompertz.js";
import type { FamilyId } from "../../models/families.js";
import type { Params } from "../../models/growth-family.js";
import type { RuleKind } from "../../policy/rule-catalogue.js";
import type { RuleSpec } from "../../policy/rule-spec.js";

/** The f64 settings the kernel reads from its `cfg` array: slot i holds the i-th name. */
export const KERNEL_CONFIG = [
  "horizon",
  "modelCount",
  "family",
  "ruleKind",
  "q1",
  "q2",
  "q3",
  "q4",
  "stocking",
  "before",
  "sdP",
  "rho",
  "innovation",
  "halfP",
  "sdO",
  "halfO",
  "sdI",
  "halfI",
  "limit",
  "quasi",
  "recoveryTarget",
  "start",
  "scale",
  "bound",
  "bins",
  "binBase",
  "lastBin",
] as const;
export type KernelConfigName = (typeof KERNEL_CONFIG)[number];

/** The arrays after `cfg` and `ptr`, in the order of their u32 pointers in the kernel's `ptr` array. */
export const KERNEL_ARRAYS = [
  "models",
  "kn",
  "wn",
  "fn",
  "n",
  "eps",
  "prevCatch",
  "sumCatch",
  "sumChange",
  "flags",
  "pick",
  "aCounts",
  "cCounts",
  "aRange",
  "cRange",
  "below",
  "recovery",
  "counters",
  "catchTotals",
  "aavSums",
  "aavCounts",
  "z",
  "aPos",
  "cPos",
  "exp",
] as const;
export type KernelArrayName = (typeof KERNEL_ARRAYS)[number];

/** Numbers per parameter set in the `models` array (a, K, p2, p3 of production() in the kernel). */
export const KERNEL_MODEL_WIDTH = 4;

/** A family the kernel knows: its case in production() and the four numbers that case reads. */
export interface KernelFamily {
  readonly code: number;
  numbers(p: Params): readonly [number, number, number, number];
}

/** A rule kind the kernel knows: its case in quota() and the four settings q1…q4 it reads. */
export interface KernelRule {
  readonly code: number;
  settings(rule: RuleSpec): readonly [number, number, number, number];
}

type Entry<T> = T | "typescript-loop-only";

/** Every growth family: its kernel case, or "typescript-loop-only". */
export const KERNEL_FAMILIES: Readonly<Record<FamilyId, Entry<KernelFamily>>> = {
  ricker: { code: 0, numbers: (p) => [p.r!, p.K!, 0, 0] },
  "beverton-holt": { code: 1, numbers: (p) => [p.R0!, p.K!, 0, 0] },
  "discrete-logistic": { code: 2, numbers: (p) => [p.r!, p.K!, 0, 0] },
  gompertz: { code: 3, numbers: (p) => [p.r!, p.K!, GOMPERTZ_FLOOR * p.K!, 0] },
  "allee-ricker": { code: 4, numbers: (p) => [p.r!, p.K!, p.A!, 0] },
  hassell: { code: 5, numbers: (p) => [p.R0!, p.K!, p.beta!, (Math.pow(p.R0!, 1 / p.beta!) - 1) / p.K!] },
  shepherd: { code: 6, numbers: (p) => [p.R0!, p.K!, p.delta!, 0] },
  "theta-logistic": { code: 7, numbers: (p) => [p.r!, p.K!, p.theta!, 0] },
};

/** Every harvest rule kind: its kernel case, or "typescript-loop-only". */
export const KERNEL_RULES: Readonly<Record<RuleKind, Entry<KernelRule>>> = {
  "no-harvest": { code: 0, settings: () => [0, 0, 0, 0] },
  "constant-catch": { code: 1, settings: (r) => [num(r, "quota"), 0, 0, 0] },
  "constant-rate": { code: 2, settings: (r) => [num(r, "rate"), 0, 0, 0] },
  "constant-escapement": { code: 3, settings: (r) => [num(r, "escapement"), 0, 0, 0] },
  threshold: {
    code: 4,
    settings: (r) => {
      const lo = num(r, "lowerTrigger");
      const hi = num(r, "upperTrigger");
      return [lo, hi, num(r, "maxRate"), hi - lo];
    },
  },
};

function num(rule: RuleSpec, name: string): number {
  return (rule as unknown as Record<string, number>)[name]!;
}

/** The kernel entry of a family, or null when it runs in the TypeScript loop only. */
export function kernelFamily(id: string): KernelFamily | null {
  const e = KERNEL_FAMILIES[id as FamilyId];
  return e === undefined || e === "typescript-loop-only" ? null : e;
}

/** The kernel entry of a rule kind, or null when it runs in the TypeScript loop only. */
export function kernelRule(kind: string): KernelRule | null {
  const e = KERNEL_RULES[kind as RuleKind];
  return e === undefined || e === "typescript-loop-only" ? null : e;
}

/** A constant name for the generated AssemblyScript: "beverton-holt" → "BEVERTON_HOLT", "sdP" → "SD_P". */
export function constantName(name: string): string {
  return name
    .replace(/([a-z0-9])([A-Z])/g, "$1_$2")
    .replace(/-/g, "_")
    .toUpperCase();
}

/**
 * The table as AssemblyScript source: CFG_<NAME> byte offsets in `cfg`, PTR_<NAME> byte
 * offsets in `ptr`, FAMILY_<ID> and RULE_<KIND> codes. scripts/build-kernel.mjs writes it
 * beside the kernel before compiling.
 */
export function kernelLayoutSource(): string {
  const lines = ["// Generated by scripts/build-kernel.mjs from kernel-layout.ts: do not edit."];
  KERNEL_CONFIG.forEach((name, i) => lines.push(`export const CFG_${constantName(name)}: usize = ${8 * i};`));
  KERNEL_ARRAYS.forEach((name, i) => lines.push(`export const PTR_${constantName(name)}: usize = ${4 * i};`));
  for (const [id, e] of Object.entries(KERNEL_FAMILIES)) {
    if (e !== "typescript-loop-only") lines.push(`export const FAMILY_${constantName(id)}: i32 = ${e.code};`);
  }
  for (const [kind, e] of Object.entries(KERNEL_RULES)) {
    if (e !== "typescript-loop-only") lines.push(`export const RULE_${constantName(kind)}: i32 = ${e.code};`);
  }
  lines.push(`export const MODEL_BYTES: usize = ${8 * KERNEL_MODEL_WIDTH};`);
  return `${lines.join("\n")}\n`;
}
