import { fail, ok, type Result } from "../result.js";
import type { BevertonHoltParams } from "./beverton-holt.js";
import type { RickerParams } from "./ricker.js";

/** Stock–recruitment parameters R = f(S; a, b) as fisheries assessments often report them. */
export interface StockRecruitmentParams {
  /** Recruits per spawner at low stock (slope at the origin), dimensionless. */
  readonly a: number;
  /** Density-dependence coefficient, per unit of stock. */
  readonly b: number;
}

/**
 * Ricker r,K from the stock–recruitment form R = a·S·e^(−b·S).
 *
 *   r = ln a,   K = ln a / b        (so that a·e^(−bK) = 1)
 *
 * Needs a > 1 (otherwise no positive equilibrium) and b > 0.
 * Source: Ricker, W. E. (1954). J. Fish. Res. Board Can. 11: 559–623.
 * @example rickerFromStockRecruitment({ a: Math.E, b: 0.001 }) // => ok({ r: 1, K: 1000 })
 */
export function rickerFromStockRecruitment(sr: StockRecruitmentParams, field = "a"): Result<RickerParams> {
  const bad = checkAB(sr, field);
  if (bad) return bad;
  const r = Math.log(sr.a);
  return ok({ r, K: r / sr.b });
}

/** Ricker stock–recruitment form from r,K: a = e^r, b = r/K (inverse of the above). */
export function rickerToStockRecruitment(p: RickerParams): StockRecruitmentParams {
  return { a: Math.exp(p.r), b: p.r / p.K };
}

/**
 * Beverton–Holt R0,K from the stock–recruitment form R = a·S / (1 + b·S).
 *
 *   R0 = a,   K = (a − 1) / b        (so that a / (1 + bK) = 1)
 *
 * Needs a > 1 and b > 0.
 * Source: Beverton, R. J. H. & Holt, S. J. (1957). Fishery Investigations Ser. II, 19.
 * @example bevertonHoltFromStockRecruitment({ a: 3, b: 0.002 }) // => ok({ R0: 3, K: 1000 })
 */
export function bevertonHoltFromStockRecruitment(
  sr: StockRecruitmentParams,
  field = "a",
): Result<BevertonHoltParams> {
  const bad = checkAB(sr, field);
  if (bad) return bad;
  return ok({ R0: sr.a, K: (sr.a - 1) / sr.b });
}

/** Beverton–Holt stock–recruitment form from R0,K: a = R0, b = (R0 − 1)/K. */
export function bevertonHoltToStockRecruitment(p: BevertonHoltParams): StockRecruitmentParams {
  return { a: p.R0, b: (p.R0 - 1) / p.K };
}

function checkAB(sr: StockRecruitmentParams, field: string): Result<never> | undefined {
  const bField = field.replace(/a$/, "b");
  if (!Number.isFinite(sr.a)) return fail({ code: "not_finite", field, received: String(sr.a) });
  if (!Number.isFinite(sr.b)) return fail({ code: "not_finite", field: bField, received: String(sr.b) });
  if (!(sr.a > 1))
    return fail({ code: "param_out_of_range", field, value: sr.a, min: 1, minInclusive: false });
  if (!(sr.b > 0))
    return fail({ code: "param_out_of_range", field: bField, value: sr.b, min: 0, minInclusive: false });
  return undefined;
}
