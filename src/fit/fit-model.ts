import { families } from "../models/families.js";
import { FAMILY_IDS, type FamilyId } from "../models/families.js";
import type { Params } from "../models/growth-family.js";
import { MAX_DELAY, type Model } from "../models/model-spec.js";
import type { Timing } from "../policy/rule-spec.js";
import { fail, ok, type Result } from "../result.js";
import { seededUniform } from "../sim/rng.js";
import { projectThroughCatches, yearWithCatch, type YearWithCatch } from "../sim/project-through-catches.js";
import { cvWeights, negLogLikelihood, type LikelihoodKind } from "./likelihood.js";
import { minimise, type Optimum } from "./minimise.js";
import { transformFor, type Transform } from "./parameter-transform.js";
import type { Series } from "./series.js";

/** The error structures a fit can assume, with the words a person reads. */
export const FIT_METHOD_LABELS = {
  observation: "observation error (the counts scatter about a deterministic trajectory)",
  process: "process error (each year's change is noisy, the counts exact)",
} as const;
export type FitMethod = keyof typeof FIT_METHOD_LABELS;
export const FIT_METHODS = Object.keys(FIT_METHOD_LABELS) as [FitMethod, ...FitMethod[]];

export interface FitOptions {
  readonly family: FamilyId;
  readonly delay?: number;
  /** "observation" (default): project from an estimated N0 through the catches; "process": one-step-ahead. */
  readonly method?: FitMethod;
  /** Default lognormal (indices); poisson or negative-binomial for raw counts with zeros. */
  readonly likelihood?: LikelihoodKind;
  readonly timing?: Timing;
  /** Seed of the random extra starts (default 1). */
  readonly seed?: number;
  /** Random extra starts of the multi-start search (default 8). */
  readonly extraStarts?: number;
  /** A start in the free coordinates (e.g. the undelayed model's optimum for a delayed fit). */
  readonly start?: readonly number[];
  /** Parameters to give 95% profile-likelihood intervals for (default: the growth rate and K). */
  readonly profiles?: readonly string[];
}

/** The fitted objective: a function of the free vector, and how to read it back. */
export interface FitProblem {
  readonly options: Required<Omit<FitOptions, "seed" | "extraStarts" | "start" | "profiles">>;
  /** Names of the free parameters, natural scale: family params, then N0, then q and k (negative binomial). */
  readonly names: string[];
  /** The allowed range of each free parameter, natural scale (the Allee A as a fraction of K). */
  readonly bounds: { readonly min: number; readonly max: number }[];
  readonly transforms: Transform[];
  /** Negative log-likelihood (+ catch-shortfall penalty) of a free vector. */
  objective(free: readonly number[]): number;
  /** Natural-scale values of a free vector. */
  natural(free: readonly number[]): number[];
  /** Index predictions (q·N, or the one-step prediction) and observations for a natural vector. */
  evaluate(
    values: readonly number[],
    full?: boolean,
  ): { predicted: (number | null)[]; q: number; sigma: number | null; nll: number; shortfall: number } | null;
  /** Number of observations used and estimated parameters (including concentrated q and σ). */
  readonly observations: number;
  readonly estimated: number;
  readonly start: number[];
}

const PENALTY = 1e4;

/**
 * Builds the likelihood of a growth model for a series.
 *
 * Observation error (Polacheck, Hilborn & Punt 1993, Can. J. Fish. Aquat. Sci. 50: 2597–2607):
 *   N[t] from projectThroughCatches(N0, recorded catches and releases); y[t] ~ L(q·N[t]).
 * Process error: ŷ[t+1] = G(y[t]) through that year's catch (q = 1: counts are abundance),
 *   using the pairs where both years (and y[t−T] for a delay) were observed.
 * q is estimated in closed form (likelihood.ts) when the series records catches or releases,
 * which give N an absolute scale; without them only q·K is identifiable, so q = 1 and the
 * counts are taken as abundance. A recorded catch the modelled stock could not supply adds
 * 1e4·(shortfall/Σcatch)² to the objective (common practice, no source).
 * Start values come from the Ricker regression ln(y[t+1]/y[t]) = r − (r/K)·y[t]
 * (Ricker 1954; Hilborn & Walters 1992, Quantitative Fisheries Stock Assessment, ch. 7).
 */
export function fitProblem(series: Series, options: FitOptions): Result<FitProblem> {
  if (!(FAMILY_IDS as readonly string[]).includes(options.family)) {
    return fail({
      code: "unknown_family",
      field: "family",
      value: String(options.family),
      allowed: FAMILY_IDS,
    });
  }
  const delay = options.delay ?? 0;
  if (!Number.isInteger(delay) || delay < 0 || delay > MAX_DELAY) {
    return fail({
      code: "param_out_of_range",
      field: "delay",
      value: delay,
      min: 0,
      max: MAX_DELAY,
      minInclusive: true,
      maxInclusive: true,
    });
  }
  const opts = {
    family: options.family,
    delay,
    method: options.method ?? "observation",
    likelihood: options.likelihood ?? "lognormal",
    timing: options.timing ?? "after",
  } as const;
  const growth = families[opts.family];
  const absolute = series.catch.some((c) => c > 0) || series.stocking.some((a) => a > 0);
  const y = series.count;
  const weightsAll = cvWeights(opts.likelihood, series.cv);
  const observed = y.map((v, i) => (v === null ? -1 : i)).filter((i) => i >= 0);
  if (opts.likelihood === "lognormal" && observed.some((i) => !(y[i]! > 0))) {
    const i = observed.find((k) => !(y[k]! > 0))!;
    return fail({
      code: "constraint_violated",
      field: `count[${series.years[i]}]`,
      constraint: "a lognormal likelihood needs positive counts; use poisson or negative-binomial for zeros",
    });
  }
  const maxY = Math.max(...observed.map((i) => y[i]!));
  const start = rickerStart(series);
  const familyNames = growth.params.map((p) => p.name);
  // The Allee threshold is fitted as a fraction of K (its range is then (0, 1)).
  const bounds: { min: number; max: number }[] = growth.params.map((p) =>
    p.name === "A" ? { min: 0, max: 1 } : { min: p.min, max: p.max },
  );
  const names = [...familyNames];
  const wide = { min: 0, max: 1e12 };
  if (opts.method === "observation") {
    names.push("N0");
    bounds.push(wide);
  }
  const nb = opts.likelihood === "negative-binomial";
  if (nb) {
    if (absolute) {
      names.push("q");
      bounds.push(wide);
    }
    names.push("k");
    bounds.push(wide);
  }
  const transforms: Transform[] = bounds.map((b) => transformFor(b));
  // With recorded removals N is absolute: K must at least sustain the largest catch.
  const maxCatch = Math.max(0, ...series.catch);
  const scaleK = absolute ? Math.max(maxY * 2, (10 * maxCatch) / Math.max(start.r, 0.2)) : maxY * 1.5;
  const natural0: number[] = growth.params.map((p) => {
    if (p.name === "K") return absolute ? scaleK : Math.max(scaleK, start.K);
    if (p.name === "r") return Math.min(Math.max(start.r, p.min + 0.05), Math.min(p.max * 0.9, 2.5));
    if (p.name === "R0") return Math.min(Math.max(Math.exp(start.r), 1.2), 50);
    if (p.name === "A") return 0.1; // as a fraction of K
    return p.default;
  });
  if (opts.method === "observation")
    natural0.push(absolute ? 0.7 * natural0[familyNames.indexOf("K")]! : y[observed[0]!]!);
  if (nb) {
    if (absolute) natural0.push(1);
    natural0.push(10);
  }
  const startFree = natural0.map((v, i) => transforms[i]!.toFree(v));

  // Observation pairs for the process-error form.
  const pairs: number[] = [];
  for (let t = delay; t + 1 < y.length; t++)
    if (y[t] !== null && y[t + 1] !== null && (delay === 0 || y[t - delay] !== null)) pairs.push(t);
  const used = opts.method === "observation" ? observed : pairs.map((t) => t + 1);
  const weights = used.map((i) => weightsAll[i]!);
  const obs = used.map((i) => y[i]!);
  const logObs = obs.map((v) => (v > 0 ? Math.log(v) : NaN));
  const totalCatch = series.catch.reduce((a, b) => a + b, 0) + 1e-12;

  // One parameter object and one prediction buffer, refilled at every evaluation (the
  // objective runs thousands of times per fit; allocation would dominate its cost).
  const scratchParams: Record<string, number> = {};
  const scratchModel: Model = { family: opts.family, params: scratchParams as Params, delay, growth };
  const hasA = familyNames.includes("A");
  const nBuffer = new Array<number>(used.length).fill(0);
  const year: YearWithCatch = { next: 0, base: 0, shortfall: 0 };
  const projectionBuffers = {
    abundance: new Array<number>(y.length).fill(0),
    base: new Array<number>(y.length).fill(0),
  };
  const modelOf = (v: readonly number[], fresh: boolean): Model => {
    const params: Record<string, number> = fresh ? {} : scratchParams;
    for (let i = 0; i < familyNames.length; i++) params[familyNames[i]!] = v[i]!;
    if (hasA) params.A = params.A! * params.K!;
    return fresh ? { family: opts.family, params: params as Params, delay, growth } : scratchModel;
  };
  const evaluate = (v: readonly number[], full = true) => {
    const model = modelOf(v, full);
    let predicted: (number | null)[];
    let shortfall = 0;
    if (opts.method === "observation") {
      const run = projectThroughCatches(
        model,
        opts.timing,
        v[familyNames.length]!,
        series.catch,
        series.stocking,
        full ? undefined : projectionBuffers,
      );
      if (!run) return null;
      predicted = run.abundance;
      shortfall = run.shortfall;
    } else {
      predicted = y.map(() => null);
      for (const t of pairs) {
        // One year of the closed loop from the observed stock, its density term T years back
        // (the observed abundance, or under harvest before reproduction what escaped the catch).
        const past =
          delay === 0
            ? null
            : opts.timing === "before"
              ? Math.max(y[t - delay]! - series.catch[t - delay]!, 0)
              : y[t - delay]!;
        yearWithCatch(model, opts.timing, y[t]!, past, series.catch[t]!, series.stocking[t]!, year);
        if (!Number.isFinite(year.next)) return null;
        shortfall += year.shortfall;
        predicted[t + 1] = year.next;
      }
    }
    // A modelled stock that collapsed cannot produce positive counts; a floor of 1e-9·K keeps
    // the likelihood finite (and very poor) so that the search can climb out of such regions.
    const floor = 1e-9 * model.params.K!;
    const n = full ? new Array<number>(used.length) : nBuffer;
    for (let k = 0; k < used.length; k++) n[k] = Math.max(predicted[used[k]!]!, floor);
    const qIndex = familyNames.length + (opts.method === "observation" ? 1 : 0);
    const fixedQ = absolute && opts.method === "observation" ? undefined : 1;
    const lik = nb
      ? negLogLikelihood("negative-binomial", obs, n, weights, {
          q: absolute && opts.method === "observation" ? v[qIndex]! : 1,
          size: v[v.length - 1]!,
        })
      : negLogLikelihood(
          opts.likelihood,
          obs,
          n,
          weights,
          fixedQ === undefined ? { logY: logObs } : { fixedQ, logY: logObs },
        );
    const scaled = full ? predicted.map((p) => (p === null ? null : lik.q * p)) : predicted;
    return { predicted: scaled, q: lik.q, sigma: lik.sigma, nll: lik.nll, shortfall };
  };
  const natural = (free: readonly number[]) => free.map((x, i) => transforms[i]!.fromFree(x));
  const objective = (free: readonly number[]) => {
    const e = evaluate(natural(free), false);
    if (!e || !Number.isFinite(e.nll)) return Infinity;
    const s = e.shortfall / totalCatch;
    return e.nll + PENALTY * s * s;
  };
  const concentrated = nb
    ? 0
    : opts.likelihood === "poisson"
      ? absolute && opts.method === "observation"
        ? 1
        : 0
      : 1 + (absolute && opts.method === "observation" ? 1 : 0);
  const estimated = names.length + concentrated;
  if (used.length < estimated + 2)
    return fail({ code: "series_too_short", minimum: estimated + 2, actual: used.length });
  return ok({
    options: opts,
    names,
    bounds,
    transforms,
    objective,
    natural,
    evaluate,
    observations: used.length,
    estimated,
    start: startFree,
  });
}

/** Start values from the Ricker regression ln(y[t+1]/y[t]) = r − (r/K)·y[t] (least squares). */
function rickerStart(series: Series): { r: number; K: number } {
  const xs: number[] = [];
  const zs: number[] = [];
  for (let t = 0; t + 1 < series.count.length; t++) {
    const a = series.count[t];
    const b = series.count[t + 1];
    if (a !== null && b !== null && a! > 0 && b! > 0) {
      const escaped = Math.max(a! - series.catch[t]!, a! * 0.05);
      xs.push(a!);
      zs.push(Math.log(b! / escaped));
    }
  }
  const max = Math.max(...series.count.map((v) => v ?? 0));
  if (xs.length < 3) return { r: 0.5, K: 1.5 * max };
  const mx = xs.reduce((p, q) => p + q, 0) / xs.length;
  const mz = zs.reduce((p, q) => p + q, 0) / zs.length;
  let sxz = 0;
  let sxx = 0;
  for (let i = 0; i < xs.length; i++) {
    sxz += (xs[i]! - mx) * (zs[i]! - mz);
    sxx += (xs[i]! - mx) ** 2;
  }
  const slope = sxx > 0 ? sxz / sxx : 0;
  const r = mz - slope * mx;
  if (!(slope < 0) || !(r > 0)) return { r: 0.5, K: 1.5 * max };
  return { r, K: -r / slope };
}

/** Runs the multi-start minimisation of a fit problem (seeded). */
export function optimiseFit(
  problem: FitProblem,
  seed = 1,
  extraStarts = 8,
  start = problem.start,
  quick = false,
): Optimum {
  return minimise(problem.objective, start, {
    random: extraStarts > 0 ? seededUniform(seed) : undefined,
    extraStarts,
    spread: 1.5,
    quick,
  });
}
