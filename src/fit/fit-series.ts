import { analyseStability } from "../equilibria/stability.js";
import type { StabilityKind } from "../equilibria/classify.js";
import { families } from "../models/families.js";
import type { FamilyId } from "../models/families.js";
import { closedLoop } from "../policy/closed-loop.js";
import { msy } from "../policy/msy.js";
import { parseRule } from "../policy/rule-spec.js";
import { fail, ok, type Result } from "../result.js";
import type { LikelihoodKind } from "./likelihood.js";
import { covarianceFromHessian } from "./covariance.js";
import { residualDiagnostics, type ResidualDiagnostics } from "./diagnostics.js";
import { fitProblem, optimiseFit, type FitMethod, type FitOptions, type FitProblem } from "./fit-model.js";
import type { Series } from "./series.js";
import type { Timing } from "../policy/rule-spec.js";
import type { Model } from "../models/model-spec.js";
import { yearWithCatch, type YearWithCatch } from "../sim/project-through-catches.js";
import { profileInterval, type ProfileInterval } from "./profile-likelihood.js";

/** A fitted growth model with everything a review panel asks for. */
export interface SeriesFit {
  readonly family: FamilyId;
  readonly delay: number;
  readonly method: FitMethod;
  readonly likelihood: LikelihoodKind;
  readonly timing: Timing;
  /** Estimates on the natural scale, by name (family parameters, N0, and q/k where estimated). */
  readonly estimates: Record<string, number>;
  /** The survey scale q (closed-form, or 1 when counts are taken as abundance), and σ where estimated. */
  readonly q: number;
  readonly sigma: number | null;
  readonly standardErrors: Record<string, number | null>;
  readonly correlation: { readonly names: string[]; readonly matrix: (number | null)[][] };
  readonly negLogLikelihood: number;
  readonly parameters: number;
  readonly observations: number;
  readonly aicc: number;
  readonly convergence: {
    readonly converged: boolean;
    readonly iterations: number;
    readonly gradientNorm: number;
    readonly atBound: string[];
    readonly agreeingStarts: number;
    readonly starts: number;
  };
  /** Predicted index per year (null where not predicted) and standardised residuals. */
  readonly fitted: (number | null)[];
  readonly residuals: (number | null)[];
  readonly diagnostics: ResidualDiagnostics & { readonly oneStepRmse: number | null };
  readonly management: {
    readonly equilibrium: number | null;
    readonly msy: number | null;
    readonly nMsy: number | null;
    readonly hMsy: number | null;
    readonly verdict: StabilityKind | null;
    readonly verdictLabel: string | null;
  };
  readonly identifiability: { readonly trustworthy: boolean; readonly problems: IdentifiabilityProblem[] };
  /**
   * Approximate 95% intervals for every estimate from the Hessian: x ± 1.96·se on the
   * optimiser's free scale (log or logit), carried back to the natural scale, so they stay
   * inside each parameter's range; null where the standard error is not available. Cheaper
   * and rougher than the profile intervals below.
   * Source: the Wald interval on a transformed scale, e.g. Bolker, B. M. (2008). Ecological
   * Models and Data in R. Princeton University Press, §6.5 (from memory).
   */
  readonly intervals: Record<string, { readonly lower: number; readonly upper: number } | null>;
  /** 95% profile-likelihood intervals (profile-likelihood.ts) for the parameters asked for. */
  readonly profiles: ProfileInterval[];
  /** The optimum in the optimiser's free coordinates (to warm-start related fits). */
  readonly free: number[];
}

export type IdentifiabilityProblem =
  | { code: "correlated"; a: string; b: string; correlation: number }
  | { code: "at_bound"; parameter: string }
  | { code: "hessian_singular" }
  | { code: "implausible_scale"; parameter: string; value: number; largestAbundance: number }
  | { code: "not_converged" }
  | { code: "flat_profile"; parameter: string; side: "lower" | "upper" | "both" }
  | { code: "unbounded_interval"; parameter: string; side: "lower" | "upper" };

/**
 * Fits one growth model to a series and reports estimates, standard errors and correlations
 * (covariance.ts), AICc = 2k + 2·NLL + 2k(k + 1)/(n − k − 1) (Hurvich, C. M. & Tsai, C.-L.
 * (1989). Biometrika 76: 297–307), residual diagnostics, the one-step-ahead prediction error,
 * MSY quantities and the stability verdict of the fitted unharvested model, and an
 * 95% profile-likelihood intervals (by default for the growth rate and K), and an
 * identifiability check: |correlation| > 0.995 between two parameters, an estimate at a bound,
 * a profile that stays flat to the end of the range, an approximate 95% interval that reaches
 * the parameter's allowed upper bound (or, for a parameter bounded below by 0, falls a
 * millionfold below the estimate),
 * K or N0 above 1000× the largest abundance the survey implies, a singular Hessian or a
 * failed convergence make the fit "not trustworthy" (thresholds:
 * common practice, no source; see Hilborn & Walters 1992, ch. 8, on one-way trips).
 */
export function fitSeries(series: Series, options: FitOptions): Result<SeriesFit> {
  const problem = fitProblem(series, options);
  if (!problem.ok) return problem;
  const p = problem.value;
  const opt = optimiseFit(
    p,
    options.seed ?? 1,
    options.extraStarts ?? 8,
    options.start ? Array.from(options.start) : p.start,
  );
  if (!Number.isFinite(opt.value)) return fail({ code: "fit_not_converged", iterations: opt.iterations });
  const growthRate = p.names.find((n) => n === "r" || n === "R0");
  const wanted = options.profiles ?? [growthRate, "K"].filter((n): n is string => n !== undefined);
  const profiles: ProfileInterval[] = [];
  for (const name of wanted) {
    if (!p.names.includes(name))
      return fail({ code: "unknown_option", field: "profiles", value: name, allowed: p.names });
    const ci = profileInterval(p, opt.x, name);
    if (ci) profiles.push(ci);
  }
  return ok(summarise(series, p, opt.x, opt, profiles));
}

/** Builds the full report of a fit problem at a free-parameter optimum. */
export function summarise(
  series: Series,
  p: FitProblem,
  free: readonly number[],
  opt: {
    value: number;
    iterations: number;
    gradientNorm: number;
    converged: boolean;
    agreeingStarts: number;
    starts: number;
  },
  profiles: ProfileInterval[] = [],
): SeriesFit {
  const values = p.natural(free);
  const ev = p.evaluate(values)!;
  const estimates: Record<string, number> = {};
  p.names.forEach((n, i) => (estimates[n] = values[i]!));
  if ("A" in estimates) estimates.A = estimates.A! * estimates.K!;
  // Covariance from the Hessian in the free coordinates (better conditioned), carried to the
  // natural scale by the delta method: Cov(v) = D·Cov(x)·D, D = diag(dv/dx).
  const covFree = covarianceFromHessian(p.objective, free);
  const slopes = values.map((v, i) => p.transforms[i]!.slope(v) * (p.names[i] === "A" ? estimates.K! : 1));
  const cov = { ...covFree, se: covFree.se.map((s, i) => (s === null ? null : Math.abs(slopes[i]!) * s)) };
  const standardErrors: Record<string, number | null> = {};
  p.names.forEach((n, i) => (standardErrors[n] = cov.se[i]!));
  const intervals: SeriesFit["intervals"] = {};
  p.names.forEach((n, i) => {
    const se = covFree.se[i];
    const t = p.transforms[i]!;
    const scale = n === "A" ? estimates.K! : 1;
    if (se === null || se === undefined || !Number.isFinite(se)) intervals[n] = null;
    else {
      const a = t.fromFree(free[i]! - 1.96 * se) * scale;
      const b = t.fromFree(free[i]! + 1.96 * se) * scale;
      intervals[n] =
        Number.isFinite(a) && Number.isFinite(b) ? { lower: Math.min(a, b), upper: Math.max(a, b) } : null;
    }
  });
  const atBound = p.names.filter((_n, i) => p.transforms[i]!.atBound(values[i]!));
  const k = p.estimated;
  const n = p.observations;
  const aicc = 2 * k + 2 * ev.nll + (2 * k * (k + 1)) / Math.max(n - k - 1, 1);
  const residuals = series.count.map((y, t) => {
    const mu = ev.predicted[t];
    if (y === null || mu === null || mu === undefined) return null;
    if (p.options.likelihood === "lognormal")
      return y > 0 && mu > 0 ? (Math.log(y) - Math.log(mu)) / (ev.sigma ?? 1) : null;
    if (p.options.likelihood === "normal") return (y - mu) / (ev.sigma ?? 1);
    return mu > 0 ? (y - mu) / Math.sqrt(mu) : null;
  });
  const problems: IdentifiabilityProblem[] = [];
  if (!opt.converged) problems.push({ code: "not_converged" });
  if (!cov.positiveDefinite) problems.push({ code: "hessian_singular" });
  for (const b of atBound) problems.push({ code: "at_bound", parameter: b });
  p.names.forEach((name, i) => {
    const ci = intervals[name];
    const info = p.bounds[i];
    if (!ci || !info || name === "A") return;
    const est = estimates[name]!;
    if (Number.isFinite(info.max) && ci.upper >= info.max * (1 - 1e-9))
      problems.push({ code: "unbounded_interval", parameter: name, side: "upper" });
    else if (info.min === 0 && ci.lower < 1e-6 * est)
      problems.push({ code: "unbounded_interval", parameter: name, side: "lower" });
  });
  for (const ci of profiles) {
    if (ci.lowerOpen || ci.upperOpen)
      problems.push({
        code: "flat_profile",
        parameter: ci.parameter,
        side: ci.lowerOpen && ci.upperOpen ? "both" : ci.lowerOpen ? "lower" : "upper",
      });
  }
  // An abundance-scale estimate a thousand times the largest abundance the survey implies
  // (max count / q) is the fit running off towards an unbounded direction.
  const largest = Math.max(...series.count.map((c) => c ?? 0)) / ev.q;
  for (const name of ["K", "N0"]) {
    const v = estimates[name];
    if (v !== undefined && v > 1000 * largest)
      problems.push({ code: "implausible_scale", parameter: name, value: v, largestAbundance: largest });
  }
  for (let i = 0; i < p.names.length; i++) {
    for (let j = 0; j < i; j++) {
      const c = cov.correlation[i]![j];
      if (c !== null && c !== undefined && Math.abs(c) > 0.995)
        problems.push({ code: "correlated", a: p.names[j]!, b: p.names[i]!, correlation: c });
    }
  }
  return {
    family: p.options.family,
    delay: p.options.delay,
    method: p.options.method,
    likelihood: p.options.likelihood,
    timing: p.options.timing,
    estimates,
    q: ev.q,
    sigma: ev.sigma,
    standardErrors,
    intervals,
    correlation: { names: p.names, matrix: cov.correlation },
    negLogLikelihood: ev.nll,
    parameters: k,
    observations: n,
    aicc,
    convergence: {
      converged: opt.converged,
      iterations: opt.iterations,
      gradientNorm: opt.gradientNorm,
      atBound,
      agreeingStarts: opt.agreeingStarts,
      starts: opt.starts,
    },
    fitted: ev.predicted,
    residuals,
    diagnostics: { ...residualDiagnostics(residuals), oneStepRmse: oneStepRmse(series, p, values, ev.q) },
    management: management(p, values),
    identifiability: { trustworthy: problems.length === 0, problems },
    profiles,
    free: Array.from(free),
  };
}

/** RMSE of log one-step-ahead predictions ŷ[t+1] = q·G(y[t]/q) through that year's catch (the process-error forecast). */
function oneStepRmse(series: Series, p: FitProblem, values: readonly number[], q: number): number | null {
  const model = fittedModel(p, values);
  const year: YearWithCatch = { next: 0, base: 0, shortfall: 0 };
  const T = p.options.delay;
  let ss = 0;
  let m = 0;
  for (let t = T; t + 1 < series.count.length; t++) {
    const a = series.count[t];
    const b = series.count[t + 1];
    const past = T === 0 ? null : series.count[t - T];
    if (a === null || b === null || !(a! > 0) || !(b! > 0) || past === undefined || (T > 0 && past === null))
      continue;
    yearWithCatch(
      model,
      p.options.timing,
      a! / q,
      past === null ? null : past / q,
      series.catch[t]!,
      series.stocking[t]!,
      year,
    );
    if (!(year.next > 0)) continue;
    ss += (Math.log(b!) - Math.log(q * year.next)) ** 2;
    m++;
  }
  return m > 0 ? Math.sqrt(ss / m) : null;
}

/** The growth model at a natural-scale parameter vector (the Allee A is stored as a fraction of K). */
function fittedModel(p: FitProblem, values: readonly number[]): Model {
  const growth = families[p.options.family];
  const params: Record<string, number> = {};
  growth.params.forEach((g, i) => (params[g.name] = values[i]!));
  if ("A" in params) params.A = params.A! * params.K!;
  return { family: p.options.family, params, delay: p.options.delay, growth };
}

function management(p: FitProblem, values: readonly number[]): SeriesFit["management"] {
  const model = fittedModel(p, values);
  const rule = parseRule({ kind: "no-harvest", timing: p.options.timing });
  if (!rule.ok) throw new Error("management: the no-harvest rule is valid");
  const analysis = analyseStability(closedLoop(model, rule.value), { gridPoints: 400 });
  const op = analysis.operating === null ? null : analysis.equilibria[analysis.operating]!;
  const y = msy(model, p.options.timing);
  return {
    equilibrium: op?.equilibrium.abundance ?? null,
    msy: y.ok ? y.value.msy : null,
    nMsy: y.ok ? y.value.nMsy : null,
    hMsy: y.ok ? y.value.hMsy : null,
    verdict: op?.verdict.kind ?? null,
    verdictLabel: op?.verdict.label ?? null,
  };
}
