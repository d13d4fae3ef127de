import { FAMILY_IDS, type FamilyId } from "../models/families.js";
import { describeIssue, type IssueCode } from "../issues.js";
import { fail, ok, type Result } from "../result.js";
import { fitSeries, type SeriesFit } from "./fit-series.js";
import type { FitOptions } from "./fit-model.js";
import type { Series } from "./series.js";

export interface ModelComparison {
  /** Fits ordered by AICc, best first. */
  readonly fits: (SeriesFit & { readonly deltaAicc: number; readonly weight: number })[];
  /**
   * Families or delays that could not be fitted (a fit that did not converge among them),
   * with the issue's code as `reason` and its words as `detail`.
   */
  readonly skipped: {
    readonly family: FamilyId;
    readonly delay: number;
    readonly reason: IssueCode;
    readonly detail: string;
  }[];
  /** True when at least one model was fitted; false when every model failed (see skipped). */
  readonly converged: boolean;
}

/**
 * Fits every family (by default each with delay 0 and 1) to one series and ranks them:
 *   ΔAICc_i = AICc_i − min AICc,   Akaike weight w_i = exp(−Δ_i/2) / Σ_j exp(−Δ_j/2).
 * Source: Burnham, K. P. & Anderson, D. R. (2002). Model Selection and Multimodel Inference,
 * 2nd ed. Springer, §2.4 and §2.9.
 */
export function compareModels(
  series: Series,
  options: Omit<FitOptions, "family" | "delay"> & {
    families?: readonly FamilyId[];
    delays?: readonly number[];
  } = {},
): Result<ModelComparison> {
  const fams = options.families ?? FAMILY_IDS;
  const delays = options.delays ?? [0, 1];
  const fits: SeriesFit[] = [];
  const skipped: ModelComparison["skipped"] = [];
  for (const family of fams) {
    let undelayed: SeriesFit | null = null;
    for (const delay of [...delays].sort((a, b) => a - b)) {
      // A delayed fit starts from the undelayed optimum (the same free coordinates), plus its
      // own random starts; comparisons use 3 random starts per model (fitSeries uses 8).
      const start = undelayed ? undelayed.free : undefined;
      // Profile intervals are left to the chosen model (fitSeries on it), to keep the
      // comparison fast.
      const r = fitSeries(series, {
        extraStarts: 3,
        profiles: [],
        ...options,
        family,
        delay,
        ...(start ? { start } : {}),
      });
      if (r.ok) {
        fits.push(r.value);
        if (delay === 0) undelayed = r.value;
      } else skipped.push({ family, delay, reason: r.issue.code, detail: describeIssue(r.issue) });
    }
  }
  // Nothing was asked for: a request error. Everything asked for failed: a result that says so.
  if (fits.length === 0 && skipped.length === 0)
    return fail({ code: "series_too_short", minimum: 1, actual: 0 });
  if (fits.length === 0) return ok({ fits: [], skipped, converged: false });
  fits.sort((a, b) => a.aicc - b.aicc);
  const best = fits[0]!.aicc;
  const raw = fits.map((f) => Math.exp(-(f.aicc - best) / 2));
  const total = raw.reduce((a, b) => a + b, 0);
  return ok({
    fits: fits.map((f, i) => ({ ...f, deltaAicc: f.aicc - best, weight: raw[i]! / total })),
    skipped,
    converged: true,
  });
}
