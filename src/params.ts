import { z } from "zod";

/**
 * One parameter of a model or rule: its published symbol, unit, meaning and allowed range.
 *
 * The range is the single source of truth for validation (the zod schema is built from it)
 * and for the messages that name the allowed range when input falls outside it.
 */
export interface ParamInfo {
  /** The published symbol, kept as the field name (`r`, `K`, `R0`). */
  readonly name: string;
  readonly unit: string;
  readonly description: string;
  readonly min: number;
  readonly max: number;
  readonly minInclusive: boolean;
  readonly maxInclusive: boolean;
  /** A typical value, used by the demo and as a start value. */
  readonly typical: number;
}

/** Largest carrying capacity or abundance accepted, in the series' own unit. */
export const MAX_ABUNDANCE = 1e12;

/** Builds a ParamInfo; bounds default to an open lower and a closed upper end. */
export function param(
  name: string,
  unit: string,
  description: string,
  range: { min: number; max: number; minInclusive?: boolean; maxInclusive?: boolean },
  typical: number,
): ParamInfo {
  return {
    name,
    unit,
    description,
    min: range.min,
    max: range.max,
    minInclusive: range.minInclusive ?? false,
    maxInclusive: range.maxInclusive ?? true,
    typical,
  };
}

/** The carrying capacity K, shared by every growth family. */
export const carryingCapacity = param(
  "K",
  "same unit as the abundance (animals, tonnes or index units)",
  "carrying capacity: the unharvested equilibrium abundance",
  { min: 0, max: MAX_ABUNDANCE },
  1000,
);

/** A zod number schema enforcing a ParamInfo's range (zod 4 numbers reject NaN and ±Infinity). */
export function numberSchema(info: ParamInfo): z.ZodNumber {
  let s = z.number();
  s = info.minInclusive ? s.gte(info.min) : s.gt(info.min);
  s = info.maxInclusive ? s.lte(info.max) : s.lt(info.max);
  return s.describe(`${info.description} [${info.unit}]`);
}

/** A zod object schema for a list of parameters, rejecting unknown keys. */
export function paramsSchema(infos: readonly ParamInfo[]) {
  const shape: Record<string, z.ZodNumber> = {};
  for (const info of infos) shape[info.name] = numberSchema(info);
  return z.strictObject(shape);
}
