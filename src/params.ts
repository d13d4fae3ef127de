import { z } from "zod";
import type { Issue } from "./issues.js";

/**
 * What a setting's number measures. The unit a person reads is made from it (unitText), and
 * code that needs to know whether a setting is an abundance (the margin search, slider ranges)
 * asks this, never the setting's name.
 */
export const UNIT_KINDS = {
  abundance: "same unit as the abundance",
  "abundance-per-year": "same unit as the abundance, per year",
  "fraction-per-year": "fraction of the surveyed stock per year",
  fraction: "fraction",
  "per-year": "per year",
  years: "years",
  dimensionless: "dimensionless",
  count: "count",
  "log-sd": "sd of ln(multiplier)",
  correlation: "correlation",
} as const;

export type UnitKind = keyof typeof UNIT_KINDS;

/** True for settings counted in the abundance's own unit (K, A, quotas, triggers, stocking). */
export function isAbundanceKind(kind: UnitKind): boolean {
  return kind === "abundance" || kind === "abundance-per-year";
}

/**
 * One parameter of a model or setting of a rule, described once: its published symbol, the
 * words a person reads, what it measures, its allowed range, a default and the range a slider
 * or a sweep usually covers. The schema, the error texts, the margin search, the page's forms
 * and the command line's help are all read from this description.
 */
export interface ParamInfo {
  /** The published symbol or setting name, kept as the field name (`r`, `K`, `R0`, `maxRate`). */
  readonly name: string;
  /** Words for people: "intrinsic rate of increase r". */
  readonly label: string;
  readonly unitKind: UnitKind;
  /** The unit in words, from unitKind. */
  readonly unit: string;
  /** One sentence on what it means. */
  readonly description: string;
  readonly min: number;
  readonly max: number;
  readonly minInclusive: boolean;
  readonly maxInclusive: boolean;
  readonly integer: boolean;
  /** How a slider or a sweep steps through it: evenly, or by equal ratios. */
  readonly scale: "linear" | "log";
  /** A typical value: the default of a new rule, the start of a fit, the demo's value. */
  readonly default: number;
  /**
   * For abundance settings: the default as a multiple of the carrying capacity K (a quota of
   * 0.1·K), used wherever K is known; `default` is the value when it is not.
   */
  readonly defaultTimesK?: number;
  /** The range a slider or a sweep usually covers; for abundance settings as multiples of K. */
  readonly sweep: readonly [number, number];
}

/** Largest carrying capacity or abundance accepted, in the series' own unit. */
export const MAX_ABUNDANCE = 1e12;

/** Builds a ParamInfo; bounds default to an open lower and a closed upper end. */
export function param(p: {
  name: string;
  label: string;
  unitKind: UnitKind;
  description: string;
  range: { min: number; max: number; minInclusive?: boolean; maxInclusive?: boolean };
  default: number;
  defaultTimesK?: number;
  sweep: readonly [number, number];
  scale?: "linear" | "log";
  integer?: boolean;
}): ParamInfo {
  return {
    name: p.name,
    label: p.label,
    unitKind: p.unitKind,
    unit: UNIT_KINDS[p.unitKind],
    description: p.description,
    min: p.range.min,
    max: p.range.max,
    minInclusive: p.range.minInclusive ?? false,
    maxInclusive: p.range.maxInclusive ?? true,
    integer: p.integer ?? false,
    scale: p.scale ?? "linear",
    default: p.default,
    ...(p.defaultTimesK !== undefined ? { defaultTimesK: p.defaultTimesK } : {}),
    sweep: p.sweep,
  };
}

/** The carrying capacity K, shared by every growth family. */
export const carryingCapacity = param({
  name: "K",
  label: "carrying capacity K",
  unitKind: "abundance",
  description: "the unharvested equilibrium abundance",
  range: { min: 0, max: MAX_ABUNDANCE },
  default: 1000,
  sweep: [0.2, 3],
  scale: "log",
});

/** The maximum per-capita reproduction R0 of the compensatory families (Beverton–Holt and kin). */
export const maxReproduction = param({
  name: "R0",
  label: "maximum reproduction R0",
  unitKind: "dimensionless",
  description: "maximum per-capita reproduction, at low density",
  range: { min: 1, max: 1e4 },
  default: 3,
  sweep: [1.05, 6],
  scale: "log",
});

/** An intrinsic rate r (per year) with a family's own range and wording. */
export function growthRate(description: string, max: number, dflt: number): ParamInfo {
  return param({
    name: "r",
    label: "intrinsic rate of increase r",
    unitKind: "per-year",
    description,
    range: { min: 0, max },
    default: dflt,
    sweep: [0.05, 3],
  });
}

/** A setting's default, scaled by K for abundance settings when K is known. */
export function defaultValue(info: ParamInfo, K?: number): number {
  return K !== undefined && info.defaultTimesK !== undefined ? info.defaultTimesK * K : info.default;
}

/** True when v lies in the setting's allowed range (and is whole, for whole-number settings). */
export function inRange(info: ParamInfo, v: number): boolean {
  if (!Number.isFinite(v) || (info.integer && !Number.isInteger(v))) return false;
  const below = info.minInclusive ? v < info.min : v <= info.min;
  const above = info.maxInclusive ? v > info.max : v >= info.max;
  return !below && !above;
}

/** A zod number schema enforcing a ParamInfo's range (zod 4 numbers reject NaN and ±Infinity). */
export function numberSchema(info: ParamInfo): z.ZodNumber {
  let s = info.integer ? z.int() : z.number();
  s = info.minInclusive ? s.gte(info.min) : s.gt(info.min);
  s = info.maxInclusive ? s.lte(info.max) : s.lt(info.max);
  return s.describe(`${info.label}: ${info.description} [${info.unit}]`);
}

/** A zod object schema for a list of parameters, rejecting unknown keys. */
export function paramsSchema(infos: readonly ParamInfo[]) {
  const shape: Record<string, z.ZodNumber> = {};
  for (const info of infos) shape[info.name] = numberSchema(info);
  return z.strictObject(shape);
}

/**
 * An order between two settings of one spec: `lower` < `upper` (A < K, lower trigger < upper
 * trigger). `field` is the one named when it fails.
 */
export interface OrderConstraint {
  readonly lower: string;
  readonly upper: string;
  readonly field: string;
}

/** The first order constraint the values break, or undefined. */
export function brokenOrder(
  constraints: readonly OrderConstraint[],
  spec: object,
): OrderConstraint | undefined {
  const values = spec as Readonly<Record<string, unknown>>;
  for (const c of constraints) {
    const lo = values[c.lower];
    const hi = values[c.upper];
    if (typeof lo === "number" && typeof hi === "number" && !(lo < hi)) return c;
  }
  return undefined;
}

/**
 * The issue a value breaks against its setting's description (missing, not finite, not whole,
 * out of range), naming `field`; undefined when the value is allowed.
 */
export function valueIssue(info: ParamInfo, v: unknown, field: string): Issue | undefined {
  if (v === undefined) return { code: "missing_field", field };
  if (typeof v !== "number") return { code: "wrong_type", field, expected: "number", received: typeof v };
  if (!Number.isFinite(v)) return { code: "not_finite", field, received: String(v) };
  if (info.integer && !Number.isInteger(v)) return { code: "not_an_integer", field, value: v };
  if (inRange(info, v)) return undefined;
  return {
    code: "param_out_of_range",
    field,
    value: v,
    min: info.min,
    max: info.max,
    minInclusive: info.minInclusive,
    maxInclusive: info.maxInclusive,
  };
}

/** The issue of a broken order constraint, with both values, fields named under `prefix`. */
export function orderIssue(c: OrderConstraint, spec: object, prefix: string): Issue {
  const values = spec as Readonly<Record<string, unknown>>;
  const other = c.field === c.lower ? c.upper : c.lower;
  return {
    code: "settings_out_of_order",
    field: `${prefix}.${c.field}`,
    value: Number(values[c.field]),
    other: `${prefix}.${other}`,
    otherValue: Number(values[other]),
    relation: c.field === c.lower ? "below" : "above",
  };
}
