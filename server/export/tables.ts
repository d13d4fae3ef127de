// The tables of a projection and a rule comparison, as header + rows, with units in the
// header; the same rows go to CSV and to JSON (and into the printable report).
import type { StochasticProjection } from "../../src/sim/risk-metrics.js";
import type { Cell } from "./csv.js";

export interface Table {
  readonly header: string[];
  readonly rows: Cell[][];
}

const UNIT = "stock units";

/** One row per year: the percentiles of abundance and of the catch. */
export function projectionTable(p: StochasticProjection): Table {
  const header = ["year", ...p.levels.map((l) => `abundance p${l} (${UNIT})`), ...p.levels.map((l) => `catch p${l} (${UNIT} per year)`)];
  const rows = p.years.map((year, t) => [year, ...p.abundance.map((q) => q[t]!), ...p.catch.map((q) => (t < p.catch[0]!.length ? q[t]! : null))]);
  return { header, rows };
}

/** One row per risk metric, with its standard error where it has one. */
export function riskTable(p: StochasticProjection): Table {
  const r = p.risk;
  const rows: Cell[][] = [
    ["probability of falling below the limit", r.belowLimit.probability, r.belowLimit.standardError, `probability (limit ${r.limit} ${UNIT})`],
    ["probability of quasi-extinction", r.quasiExtinction.probability, r.quasiExtinction.standardError, `probability (threshold ${r.quasiExtinctionThreshold} ${UNIT})`],
    ["probability of reaching the recovery target", r.recovery.probability, r.recovery.standardError, `probability (target ${r.recoveryTarget} ${UNIT})`],
    ["median years to reach the recovery target", r.recovery.medianYears, null, "years"],
    ["mean annual catch", r.meanCatch, null, `${UNIT} per year`],
    ["median annual catch", r.medianCatch, null, `${UNIT} per year`],
    ["average annual variation in catch", r.averageAnnualVariation, null, "fraction"],
    ["fraction of years with zero catch", r.zeroCatchFraction, null, "fraction"],
    ["replicates", p.replicates, null, "count"],
    ["seed", p.seed, null, "integer"],
  ];
  return { header: ["metric", "value", "standard error", "unit"], rows };
}

interface ComparisonRow {
  readonly rule: Record<string, unknown>;
  readonly verdictLabel: string;
  readonly equilibrium: number | null;
  readonly margin: { parameter: string; current: number; increase: { boundary: number | null }; decrease: { boundary: number | null } } | null;
  readonly projection: StochasticProjection;
}

/** A rule's settings in a few words, e.g. "constant-rate rate=0.3 lag=1". */
export function ruleText(rule: Record<string, unknown>): string {
  const skip = new Set(["kind", "timing", "stocking", "surveyLag", "quotaChange"]);
  const parts = [String(rule.kind)];
  for (const [k, v] of Object.entries(rule)) if (!skip.has(k) && typeof v === "number") parts.push(`${k}=${v}`);
  if (rule.surveyLag) parts.push(`lag=${rule.surveyLag}`);
  if (rule.timing) parts.push(`catch ${rule.timing} reproduction`);
  return parts.join(" ");
}

/** One row per candidate rule: its verdict, margin and risk metrics on common random numbers. */
export function comparisonTable(rows: readonly ComparisonRow[]): Table {
  const header = [
    "rule",
    "stability verdict",
    `equilibrium (${UNIT})`,
    "margin parameter",
    "stability lost or gained above",
    "stability lost or gained below",
    "P(below limit) (probability)",
    "P(below limit) standard error",
    "P(quasi-extinction) (probability)",
    `mean annual catch (${UNIT} per year)`,
    "average annual variation in catch (fraction)",
    "zero-catch years (fraction)",
    `median final abundance (${UNIT})`,
  ];
  const out = rows.map((r) => {
    const p = r.projection;
    const last = p.abundance[3]![p.abundance[3]!.length - 1]!;
    return [
      ruleText(r.rule),
      r.verdictLabel,
      r.equilibrium,
      r.margin?.parameter ?? null,
      r.margin?.increase.boundary ?? null,
      r.margin?.decrease.boundary ?? null,
      p.risk.belowLimit.probability,
      p.risk.belowLimit.standardError,
      p.risk.quasiExtinction.probability,
      p.risk.meanCatch,
      p.risk.averageAnnualVariation,
      p.risk.zeroCatchFraction,
      last,
    ];
  });
  return { header, rows: out };
}
