// The catalogue of families, rules and settings, read once from GET /api/v1/catalogue: the
// page's lists, forms, labels, slider ranges and defaults all come from it (the page
// hard-codes none of them).
import { getJson } from "./api.js";
import type { ModelSpec, RuleSpec } from "./state.js";

export interface Setting {
  name: string;
  label: string;
  unitKind: string;
  unit: string;
  description: string;
  min: number;
  max: number;
  minInclusive: boolean;
  maxInclusive: boolean;
  integer: boolean;
  scale: "linear" | "log";
  default: number;
  defaultTimesK?: number;
  sweep: [number, number];
}

export interface Catalogue {
  families: { id: string; label: string; equation: string; source: string; params: Setting[] }[];
  delay: Setting;
  rules: { kind: string; label: string; equation: string; settings: Setting[]; main: string }[];
  ruleCommon: Setting[];
  quotaChange: Setting[];
  timings: { value: string; label: string }[];
  uncertainty: Setting[];
  defaultTiming: string;
  fitOptions: {
    likelihoods: { value: string; label: string }[];
    methods: { value: string; label: string }[];
  };
}

let loaded: Catalogue | null = null;

/** Fetches the catalogue (once). */
export async function loadCatalogue(): Promise<Catalogue> {
  loaded ??= await getJson<Catalogue>("/api/v1/catalogue");
  return loaded;
}

/** The catalogue; loadCatalogue must have finished (main.ts waits for it). */
export function catalogue(): Catalogue {
  if (!loaded) throw new Error("the catalogue has not been loaded");
  return loaded;
}

export function familyOf(id: string): Catalogue["families"][number] | undefined {
  return catalogue().families.find((f) => f.id === id);
}

export function ruleOf(kind: string): Catalogue["rules"][number] | undefined {
  return catalogue().rules.find((r) => r.kind === kind);
}

/** The description of a parameter path of the current model and rule (`model.params.r`, `rule.rate`, …). */
export function settingAt(path: string, model: ModelSpec | null, rule: RuleSpec): Setting | undefined {
  const [head, ...rest] = path.split(".");
  const name = rest[rest.length - 1];
  if (head === "model") {
    if (path === "model.delay") return catalogue().delay;
    return model ? familyOf(model.family)?.params.find((p) => p.name === name) : undefined;
  }
  return [...(ruleOf(rule.kind)?.settings ?? []), ...catalogue().ruleCommon].find((s) => s.name === name);
}

/** The parameter paths a margin or a sweep may vary, in the catalogue's order. */
export function variablePaths(model: ModelSpec | null, rule: RuleSpec): string[] {
  if (!model) return [];
  return [
    ...(familyOf(model.family)?.params ?? []).map((p) => `model.params.${p.name}`),
    ...(ruleOf(rule.kind)?.settings ?? []).map((s) => `rule.${s.name}`),
    ...catalogue().ruleCommon.map((s) => `rule.${s.name}`),
  ];
}

const isAbundance = (s: Setting) => s.unitKind === "abundance" || s.unitKind === "abundance-per-year";

/** A setting's default, scaled by K for abundance settings (rounded to whole animals). */
export function defaultOf(s: Setting, K: number): number {
  return s.defaultTimesK !== undefined ? Math.round(s.defaultTimesK * K) : s.default;
}

/** A setting's usual sweep, in its own unit, widened to include `current` and kept inside its range. */
export function sweepOf(s: Setting, K: number, current?: number): [number, number] {
  const f = isAbundance(s) ? K : 1;
  let [lo, hi] = [s.sweep[0] * f, s.sweep[1] * f];
  if (current !== undefined && current > hi) hi = 2 * current;
  if (current !== undefined && current < lo) lo = current / 2;
  const top = s.maxInclusive ? s.max : s.max - 1e-9 * Math.max(1, Math.abs(s.max));
  const bottom = s.minInclusive ? s.min : s.min + 1e-9 * Math.max(1, Math.abs(s.min));
  return [Math.max(bottom, lo), Math.min(top, hi)];
}

/** A slider for a setting: its sweep, in a thousand steps (whole steps for whole-number settings). */
export function sliderOf(s: Setting, K: number, current: number): { min: number; max: number; step: number } {
  const [min, max] = sweepOf(s, K, current);
  return { min, max, step: s.integer ? 1 : Math.max((max - min) / 1000, 1e-6) };
}

/** A new rule of a kind with the catalogue's defaults, keeping the common settings given. */
export function defaultRule(kind: string, K: number, keep: Partial<RuleSpec> = {}): RuleSpec {
  const rule: RuleSpec = { kind };
  for (const s of ruleOf(kind)?.settings ?? []) rule[s.name] = defaultOf(s, K);
  for (const s of catalogue().ruleCommon) rule[s.name] = keep[s.name] ?? s.default;
  rule.timing = keep.timing ?? catalogue().defaultTiming;
  return rule;
}

/** A setting's unit in words, or "" for a dimensionless one. */
export function unitText(s: Setting): string {
  return s.unitKind === "dimensionless" ? "" : s.unit;
}

/** "harvest rate h (fraction of the surveyed stock per year)": a setting's label with its unit. */
export function labelWithUnit(s: Setting): string {
  return s.unitKind === "dimensionless" ? s.label : `${s.label} (${s.unit})`;
}
