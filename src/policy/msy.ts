import type { Model } from "../models/model-spec.js";
import { production } from "../models/growth-family.js";
import { maximiseOnInterval } from "../numeric/golden-section.js";
import { fail, ok, type Result } from "../result.js";
import type { Timing } from "./rule-spec.js";

/** Maximum sustainable yield under a constant harvest rate, and where it is taken. */
export interface MsyQuantities {
  /** MSY: the largest equilibrium catch per year. */
  readonly msy: number;
  /** N_MSY: the equilibrium abundance at the start of the year (what a survey counts). */
  readonly nMsy: number;
  /** h_MSY: the constant rate, on the start-of-year abundance, that gives MSY. */
  readonly hMsy: number;
  /** The stock left to reproduce at MSY: S* = argmax of f(S) − S. */
  readonly escapementMsy: number;
  readonly method: "closed form" | "numeric";
  readonly source: string;
}

/**
 * MSY, N_MSY and h_MSY of a growth model under a constant harvest rate.
 *
 * At an equilibrium the catch equals the surplus production f(S) − S of the stock S that
 * reproduces, so MSY = max_S (f(S) − S) at S = S* (delays do not move equilibria).
 *   timing "after"  (catch after reproduction, C = h·N):  N_MSY = S*,        h_MSY = MSY/S*
 *   timing "before" (catch before reproduction, S = N − C): N_MSY = S* + MSY, h_MSY = MSY/N_MSY
 * S* and MSY are closed-form where published (Schaefer 1954 for the logistic: MSY = rK/4 at
 * K/2; Pella & Tomlinson 1969; Beverton & Holt 1957; Scheuerell 2016 for the Ricker through
 * Lambert W) and found numerically on [largest equilibrium below K, K] otherwise.
 * Fails with `no_finite_msy` where the surplus has no finite maximum (Gompertz, r ≥ 1).
 */
export function msy(model: Model, timing: Timing = "after"): Result<MsyQuantities> {
  const { growth, params } = model;
  if (growth.finiteMsy && !growth.finiteMsy(params)) {
    return fail({ code: "no_finite_msy", field: "model.params.r", value: params.r!, family: growth.id });
  }
  const peak = growth.surplusPeak?.(params);
  let s: number;
  let value: number;
  let source: string;
  if (peak) {
    s = peak.escapement;
    value = peak.msy;
    source = peak.source;
  } else {
    const eq = growth.equilibria(params);
    const K = params.K!;
    const lower = eq.filter((e) => e < K).reduce((a, b) => Math.max(a, b), 0);
    const best = maximiseOnInterval((x) => production(growth, x, params) - x, lower, K);
    s = best.x;
    value = best.value;
    source = "numeric: grid scan and golden-section search of f(S) − S";
  }
  const nMsy = timing === "after" ? s : s + value;
  return ok({
    msy: value,
    nMsy,
    hMsy: value / nMsy,
    escapementMsy: s,
    method: peak ? "closed form" : "numeric",
    source,
  });
}
