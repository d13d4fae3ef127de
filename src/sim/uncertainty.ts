import { CholeskyDecomposition, Matrix } from "ml-matrix";
import { xoroshiro128plus } from "pure-rand/generator/xoroshiro128plus";
import { withParams, type Model } from "../models/model-spec.js";
import { MAX_ABUNDANCE, numberSchema, param, type ParamInfo } from "../params.js";
import { fail, ok, type Result } from "../result.js";
import { issueFromZod } from "../zod-issue.js";
import { z } from "zod";
import { zigguratNormal } from "./ziggurat.js";
import { objectIssue } from "../object-input.js";

/** Most replicates in one stochastic projection. */
export const MAX_REPLICATES = 1_000_000;
/** Most parameter sets (bootstrap draws, or draws from a covariance) one projection uses. */
export const MAX_PARAMETER_SETS = 20_000;

/** The settings of a stochastic projection, with their units and ranges. */
export const UNCERTAINTY_SETTINGS = {
  replicates: param({
    name: "replicates",
    label: "number of replicates",
    unitKind: "count",
    description: "the number of simulated futures",
    range: { min: 10, max: MAX_REPLICATES, minInclusive: true },
    default: 2000,
    sweep: [100, 100000],
    scale: "log",
    integer: true,
  }),
  seed: param({
    name: "seed",
    label: "random seed",
    unitKind: "count",
    description: "the seed of the random numbers (the same seed gives the same numbers)",
    range: { min: 0, max: 2147483647, minInclusive: true },
    default: 1,
    sweep: [1, 1000],
    integer: true,
  }),
  processSd: param({
    name: "processSd",
    label: "process noise σ_p",
    unitKind: "log-sd",
    description: "lognormal process noise on production",
    range: { min: 0, max: 3, minInclusive: true },
    default: 0.2,
    sweep: [0, 1],
  }),
  processAutocorrelation: param({
    name: "processAutocorrelation",
    label: "process noise autocorrelation ρ",
    unitKind: "correlation",
    description: "lag-1 autocorrelation of the process noise",
    range: { min: -0.99, max: 0.99, minInclusive: true },
    default: 0,
    sweep: [-0.9, 0.9],
  }),
  observationSd: param({
    name: "observationSd",
    label: "survey error σ_obs",
    unitKind: "log-sd",
    description: "lognormal error of the survey the rule acts on",
    range: { min: 0, max: 3, minInclusive: true },
    default: 0.1,
    sweep: [0, 1],
  }),
  implementationSd: param({
    name: "implementationSd",
    label: "catch error σ_catch",
    unitKind: "log-sd",
    description: "lognormal error of the catch taken against the quota",
    range: { min: 0, max: 3, minInclusive: true },
    default: 0,
    sweep: [0, 1],
  }),
  limit: param({
    name: "limit",
    label: "limit reference point",
    unitKind: "abundance",
    description: "a stock below it is at risk of impaired recruitment",
    range: { min: 0, max: MAX_ABUNDANCE, minInclusive: true },
    default: 200,
    defaultTimesK: 0.2,
    sweep: [0, 1],
  }),
  quasiExtinction: param({
    name: "quasiExtinction",
    label: "quasi-extinction threshold",
    unitKind: "abundance",
    description: "a stock below it counts as lost",
    range: { min: 0, max: MAX_ABUNDANCE, minInclusive: true },
    default: 10,
    defaultTimesK: 0.01,
    sweep: [0, 0.2],
  }),
  recoveryTarget: param({
    name: "recoveryTarget",
    label: "recovery target",
    unitKind: "abundance",
    description: "the level a depleted stock should regain",
    range: { min: 0, max: MAX_ABUNDANCE, minInclusive: true },
    default: 500,
    defaultTimesK: 0.5,
    sweep: [0, 1],
  }),
  count: param({
    name: "count",
    label: "parameter sets drawn",
    unitKind: "count",
    description: "draws taken from the covariance",
    range: { min: 1, max: MAX_PARAMETER_SETS, minInclusive: true },
    default: 1000,
    sweep: [100, 10000],
    scale: "log",
    integer: true,
  }),
} as const satisfies Record<string, ParamInfo>;

const s = (name: keyof typeof UNCERTAINTY_SETTINGS) => numberSchema(UNCERTAINTY_SETTINGS[name]);

export const uncertaintySchema = z.strictObject({
  replicates: s("replicates"),
  seed: s("seed"),
  processSd: s("processSd").default(0),
  processAutocorrelation: s("processAutocorrelation").default(0),
  observationSd: s("observationSd").default(0),
  implementationSd: s("implementationSd").default(0),
  limit: s("limit").optional(),
  quasiExtinction: s("quasiExtinction").optional(),
  recoveryTarget: s("recoveryTarget").optional(),
  parameters: z
    .union([
      z.strictObject({ draws: z.array(z.record(z.string(), z.number())).min(1).max(MAX_PARAMETER_SETS) }),
      z.strictObject({
        mean: z.record(z.string(), z.number()),
        covariance: z.array(z.array(z.number())),
        count: s("count").default(1000),
      }),
    ])
    .optional()
    .describe(
      "parameter uncertainty: a fit's bootstrap draws, or a mean and covariance matrix (natural scale)",
    ),
});

export type UncertaintyInput = z.input<typeof uncertaintySchema>;

/** Validated uncertainty settings, with the parameter sets built as models. */
export interface Uncertainty {
  readonly replicates: number;
  readonly seed: number;
  readonly processSd: number;
  readonly processAutocorrelation: number;
  readonly observationSd: number;
  readonly implementationSd: number;
  /** Absolute thresholds, defaults filled in from the scenario model's K. */
  readonly limit: number;
  readonly quasiExtinction: number;
  readonly recoveryTarget: number;
  /** The models replicates draw from (uniformly); one entry when parameters are fixed. */
  readonly models: readonly Model[];
}

/**
 * Validates uncertainty settings against the scenario's model. Parameter sets are built as
 * models of the scenario's family and delay; a bootstrap draw outside a parameter's range
 * fails with the field named (`uncertainty.parameters.draws[3].r`). A covariance is drawn
 * from as a multivariate normal, x = μ + L·z with L the Cholesky factor (Σ = L·Lᵀ), seeded
 * from the projection's seed; a draw outside the allowed ranges is drawn again (at most 100
 * times per set, then it fails naming the covariance).
 * Source (multivariate normal by Cholesky): Gentle, J. E. (2003). Random Number Generation
 * and Monte Carlo Methods, 2nd ed. Springer, §5.3.1 (from memory).
 */
export function parseUncertainty(input: unknown, model: Model, prefix = "uncertainty"): Result<Uncertainty> {
  const notObject = objectIssue(input, prefix);
  if (notObject) return fail(notObject);
  const parsed = uncertaintySchema.safeParse(input);
  if (!parsed.success)
    return fail(
      issueFromZod(
        parsed.error,
        input,
        (path) => UNCERTAINTY_SETTINGS[String(path[path.length - 1]) as keyof typeof UNCERTAINTY_SETTINGS],
        prefix,
      ),
    );
  const u = parsed.data;
  const K = model.params.K!;
  const models = parameterSets(u.parameters, model, u.seed, `${prefix}.parameters`);
  if (!models.ok) return models;
  return ok({
    replicates: u.replicates,
    seed: u.seed,
    processSd: u.processSd,
    processAutocorrelation: u.processAutocorrelation,
    observationSd: u.observationSd,
    implementationSd: u.implementationSd,
    limit: u.limit ?? 0.2 * K,
    quasiExtinction: u.quasiExtinction ?? 0.01 * K,
    recoveryTarget: u.recoveryTarget ?? 0.5 * K,
    models: models.value,
  });
}

/** Names a fit's bootstrap draw carries besides the model's parameters (ignored here). */
const FIT_NUISANCE = ["N0", "q", "k", "sigma"];

type ParameterInput = z.output<typeof uncertaintySchema>["parameters"];

function parameterSets(p: ParameterInput, model: Model, seed: number, field: string): Result<Model[]> {
  if (p === undefined) return ok([model]);
  if ("draws" in p) {
    const out: Model[] = [];
    for (let i = 0; i < p.draws.length; i++) {
      const params: Record<string, number> = { ...model.params };
      for (const [name, v] of Object.entries(p.draws[i]!)) {
        if (model.growth.params.some((q) => q.name === name)) params[name] = v;
        else if (!FIT_NUISANCE.includes(name))
          return fail({ code: "unknown_field", field: `${field}.draws[${i}].${name}` });
      }
      const m = withParams(model, params, `${field}.draws[${i}]`);
      if (!m.ok) return m;
      out.push(m.value);
    }
    return ok(out);
  }
  const names = Object.keys(p.mean);
  for (const name of names) {
    if (!model.growth.params.some((q) => q.name === name))
      return fail({ code: "unknown_field", field: `${field}.mean.${name}` });
  }
  const d = names.length;
  if (p.covariance.length !== d || p.covariance.some((row) => row.length !== d)) {
    return fail({
      code: "constraint_violated",
      field: `${field}.covariance`,
      constraint: `must be a ${d} × ${d} matrix (one row and column per parameter in mean, in the same order)`,
    });
  }
  for (let i = 0; i < d; i++) {
    for (let j = 0; j < d; j++) {
      if (
        Math.abs(p.covariance[i]![j]! - p.covariance[j]![i]!) >
        1e-12 * Math.max(1, Math.abs(p.covariance[i]![j]!))
      ) {
        return fail({
          code: "constraint_violated",
          field: `${field}.covariance[${i}][${j}]`,
          constraint: "the covariance matrix must be symmetric",
        });
      }
    }
  }
  const chol = new CholeskyDecomposition(new Matrix(p.covariance));
  if (!chol.isPositiveDefinite())
    return fail({
      code: "constraint_violated",
      field: `${field}.covariance`,
      constraint: "the covariance matrix must be positive definite",
    });
  const L = chol.lowerTriangularMatrix.to2DArray();
  // The parameter draws have their own stream (seed + 1's generator), separate from the
  // replicates' noise, so adding parameter uncertainty leaves the noise draws unchanged.
  const g = xoroshiro128plus((seed + 1) | 0);
  const out: Model[] = [];
  const z0 = new Array<number>(d).fill(0);
  for (let k = 0; k < p.count; k++) {
    let built: Model | null = null;
    for (let attempt = 0; attempt < 100 && !built; attempt++) {
      for (let i = 0; i < d; i++) z0[i] = zigguratNormal(g);
      const params: Record<string, number> = { ...model.params };
      names.forEach((name, i) => {
        let v = p.mean[name]!;
        for (let j = 0; j <= i; j++) v += L[i]![j]! * z0[j]!;
        params[name] = v;
      });
      const m = withParams(model, params);
      if (m.ok) built = m.value;
    }
    if (!built)
      return fail({
        code: "constraint_violated",
        field: `${field}.covariance`,
        constraint:
          "100 draws in a row fell outside the parameters' allowed ranges; check the mean and the variances",
      });
    out.push(built);
  }
  return ok(out);
}
