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
  const header = [
    "year",
    ...p.levels.map((l) => `abundance p${l} (${UNIT})`),
    ...p.levels.map((l) => `catch p${l} (${UNIT} per year)`),
  ];
  const rows = p.years.map((year, t) => [
    year,
    ...p.abundance.map((q) => q[t]!),
    ...p.catch.map((q) => (t < p.catch[0]!.length ? q[t]! : null)),
  ]);
  return { header, rows };
}

/** One row per risk metric, with its standard error where it has one. */
export function riskTable(p: StochasticProjection): Table {
  const r = p.risk;
  const rows: Cell[][] = [
    [
      "probability of falling below the limit",
      r.belowLimit.probability,
      r.belowLimit.standardError,
      `probability (limit ${r.limit} ${UNIT})`,
    ],
    [
      "probability of quasi-extinction",
      r.quasiExtinction.probability,
      r.quasiExtinction.standardError,
      `probability (threshold ${r.quasiExtinctionThreshold} ${UNIT})`,
    ],
    [
      "probability of reaching the recovery target",
      r.recovery.probability,
      r.recovery.standardError,
      `probability (target ${r.recoveryTarget} ${UNIT})`,
    ],
    ["median years to reach the recovery target", r.recovery.medianYears, null, "years"],
    ["mean annual catch", r.meanCatch, null, `${UNIT} per year`],
    ["median annual catch", r.medianCatch, null, `${UNIT} per year`],
    ["average annual variation in catch", r.averageAnnualVariation, null, "fraction"],
    ["fraction of years with zero catch", r.zeroCatchFraction, null, "fraction"],
    ["replicates", p.replicates, null, "count"],
    ["seed", String(p.seed), null, "integer"], // a label, written as is (2028, not 2,028)
  ];
  return { header: ["metric", "value", "standard error", "unit"], rows };
}

interface ComparisonRow {
  readonly rule: Record<string, unknown>;
  readonly verdictLabel: string;
  readonly equilibrium: number | null;
  readonly margin: {
    parameter: string;
    current: number;
    increase: { boundary: number | null };
    decrease: { boundary: number | null };
  } | null;
  readonly projection: StochasticProjection;
}

/** A rule's settings in a few words, e.g. "constant-rate rate=0.3 lag=1". */
export function ruleText(rule: Record<string, unknown>): string {
  const skip = new Set(["kind", "timing", "stocking", "surveyLag", "quotaChange"]);
  const parts = [String(rule.kind)];
  for (const [k, v] of Object.entries(rule))
    if (!skip.has(k) && typeof v === "number") parts.push(`${k}=${v}`);
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

interface FitRow {
  readonly family: string;
  readonly delay: number;
  readonly aicc: number;
  readonly deltaAicc: number;
  readonly weight: number;
  readonly estimates: Record<string, number>;
  readonly intervals?: Record<string, { lower: number; upper: number } | null>;
  readonly management?: { verdictLabel: string | null; msy: number | null };
  readonly identifiability?: { trustworthy: boolean };
}

/** One row per fitted model, best first, with the growth rate and K and their intervals. */
export function fitTable(result: { fits: readonly FitRow[] }): Table {
  const header = [
    "model",
    "AICc",
    "delta AICc",
    "Akaike weight",
    "r or R0",
    "r or R0 lower 95%",
    "r or R0 upper 95%",
    `K (${UNIT})`,
    "K lower 95%",
    "K upper 95%",
    `MSY (${UNIT} per year)`,
    "unharvested verdict",
    "trustworthy",
  ];
  const rows = result.fits.map((f) => {
    const g = f.estimates.r !== undefined ? "r" : "R0";
    return [
      f.delay ? `${f.family} (delay ${f.delay})` : f.family,
      f.aicc,
      f.deltaAicc,
      f.weight,
      f.estimates[g] ?? null,
      f.intervals?.[g]?.lower ?? null,
      f.intervals?.[g]?.upper ?? null,
      f.estimates.K ?? null,
      f.intervals?.K?.lower ?? null,
      f.intervals?.K?.upper ?? null,
      f.management?.msy ?? null,
      f.management?.verdictLabel ?? null,
      f.identifiability ? (f.identifiability.trustworthy ? "yes" : "no") : null,
    ];
  });
  return { header, rows };
}

/** The table of an analysis: equilibria (stability), both sides (margin), values (bifurcation) or cells (regime map). */
export function analysisTable(result: Record<string, unknown>): Table {
  if (Array.isArray(result.equilibria)) {
    const eq = result.equilibria as {
      equilibrium: { abundance: number };
      verdict: { label: string; dominantModulus: number; returnTime: number | null; period: number | null };
    }[];
    return {
      header: [
        `equilibrium (${UNIT})`,
        "verdict",
        "dominant eigenvalue modulus",
        "return time (years)",
        "oscillation period (years)",
        "operating",
      ],
      rows: eq.map((e, i) => [
        e.equilibrium.abundance,
        e.verdict.label,
        e.verdict.dominantModulus,
        e.verdict.returnTime,
        e.verdict.period,
        i === result.operating ? "yes" : "no",
      ]),
    };
  }
  if (typeof result.parameter === "string" && "increase" in result) {
    const m = result as {
      parameter: string;
      current: number;
      increase: Record<string, unknown>;
      decrease: Record<string, unknown>;
    };
    return {
      header: [
        "parameter",
        "direction",
        "current value",
        "boundary",
        "kind past the boundary",
        "margin",
        "searched to",
      ],
      rows: (["increase", "decrease"] as const).map((d) => [
        m.parameter,
        d,
        m.current,
        m[d].boundary as number | null,
        m[d].kind as string | null,
        m[d].margin as number | null,
        m[d].searchedTo as number,
      ]),
    };
  }
  if (Array.isArray(result.perModel)) {
    const r = result as { perModel: { weight: number; class: string; label: string }[]; models: string[] };
    return {
      header: ["model", "Akaike weight", "behaviour under the rule", "verdict"],
      rows: r.perModel.map((m, i) => [r.models[i] ?? null, m.weight, m.class, m.label]),
    };
  }
  if (Array.isArray(result.values) && Array.isArray(result.regimes)) {
    const b = result as {
      parameter: string;
      values: number[];
      regimes: string[];
      periods: (number | null)[];
      equilibrium: (number | null)[];
      stability: (number | null)[];
    };
    return {
      header: [
        b.parameter,
        "regime",
        "period (years)",
        `largest equilibrium (${UNIT})`,
        "Jury verdict of that equilibrium",
      ],
      rows: b.values.map((v, i) => [
        v,
        b.regimes[i]!,
        b.periods[i] ?? null,
        b.equilibrium[i] ?? null,
        b.stability[i] ?? null,
      ]),
    };
  }
  const m = result as {
    x: { path: string; values: number[] };
    y: { path: string; values: number[] };
    regimes: string[];
    periods: (number | null)[];
  };
  const rows: Cell[][] = [];
  for (let j = 0; j < m.y.values.length; j++) {
    for (let i = 0; i < m.x.values.length; i++) {
      const k = j * m.x.values.length + i;
      rows.push([m.x.values[i]!, m.y.values[j]!, m.regimes[k]!, m.periods[k] ?? null]);
    }
  }
  return { header: [m.x.path, m.y.path, "regime", "period (years)"], rows };
}
