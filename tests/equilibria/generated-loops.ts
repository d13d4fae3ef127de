// Generated closed loops for the tests that hold a fast path to its plain reference: every
// family and rule kind of the catalogue, with parameters across their usual sweeps.
import fc from "fast-check";
import { catalogue } from "../../src/catalogue.js";
import { defaultValue } from "../../src/params.js";
import { parseScenario } from "../../src/sim/scenario.js";

const cat = catalogue();
/** The carrying capacity of every generated model. */
export const GENERATED_K = 1000;
const K = GENERATED_K;

// Uniform on [0, 1] (fast-check's doubles favour extremes such as 1e-300).
export const unit = fc.integer({ min: 0, max: 1_000_000 }).map((i) => i / 1_000_000);

const anyLoop = fc.record({
  family: fc.constantFrom(...cat.families.map((f) => f.id)),
  kind: fc.constantFrom(...cat.rules.map((r) => r.kind)),
  timing: fc.constantFrom(...cat.timings.map((t) => t.value)),
  u: fc.array(unit, { minLength: 6, maxLength: 6 }),
  start: unit.map((v) => 0.05 + 1.5 * v),
});
// Overcompensating stocks lightly harvested: the period-doubling cascade (2-, 4-, 8-cycles).
const cyclingLoop = fc.record({
  family: fc.constantFrom("ricker", "discrete-logistic"),
  kind: fc.constant("constant-rate"),
  timing: fc.constantFrom(...cat.timings.map((t) => t.value)),
  u: fc.tuple(
    unit.map((v) => 0.68 + 0.2 * v),
    unit,
    unit,
    unit.map((v) => 0.02 * v),
    unit,
    unit,
  ),
  start: unit.map((v) => 0.05 + 1.5 * v),
});

/** A one-number closed loop of any family and rule kind (the first branch), or a cycling one. */
export const specArb = fc.oneof(anyLoop, cyclingLoop).map(({ family, kind, timing, u, start }) => {
  const f = cat.families.find((x) => x.id === family)!;
  // Growth parameters across their usual sweep (high r and R0 give cycles and chaos).
  const params: Record<string, number> = {};
  f.params.forEach((p, i) => {
    const [lo, hi] = p.unitKind === "abundance" ? [p.sweep[0] * K, p.sweep[1] * K] : p.sweep;
    params[p.name] = p.name === "K" ? K : lo + (hi - lo) * u[i]!;
  });
  if (params.A !== undefined) params.A = Math.min(Math.max(params.A, 0.01 * K), 0.9 * K);
  const r = cat.rules.find((x) => x.kind === kind)!;
  const rule: Record<string, unknown> = { kind, timing };
  r.settings.forEach((s, i) => {
    rule[s.name] = defaultValue(s, K) * (0.5 + u[(i + 3) % 6]!);
    if (s.unitKind === "fraction-per-year") rule[s.name] = Math.min(0.9, Number(rule[s.name]));
  });
  if (kind === "threshold")
    rule.upperTrigger = Math.max(Number(rule.upperTrigger), Number(rule.lowerTrigger) + 1);
  return { model: { family, params }, rule, start: start * K, horizon: 10 };
});

/** The generated scenario's closed loop. */
export const loopArb = specArb.map((spec) => {
  const sc = parseScenario(spec);
  if (!sc.ok) throw new Error(`generated an invalid scenario: ${JSON.stringify(sc.issue)}`);
  return sc.value.loop;
});

/** The same scenarios with a delay T and a survey lag L of 0–2 years (a state of several numbers). */
export const laggedSpecArb = fc
  .tuple(specArb, fc.integer({ min: 0, max: 2 }), fc.integer({ min: 0, max: 2 }))
  .map(([spec, delay, surveyLag]) => ({
    ...spec,
    model: { ...spec.model, delay },
    rule: { ...spec.rule, surveyLag },
  }));
