import { FAMILY_IDS, type FamilyId, families } from "../models/families.js";
import { type Model, parseModel } from "../models/model-spec.js";
import { fail, ok, type Result } from "../result.js";

/** What a stored model comparison says about one fitted model (the fields read here). */
export interface StoredFit {
  readonly family: string;
  readonly delay: number;
  readonly estimates: Readonly<Record<string, number>>;
  readonly weight: number;
}

/** A fitted model rebuilt from a stored comparison, with its Akaike weight and a label. */
export interface FittedModel {
  readonly model: Model;
  readonly weight: number;
  readonly label: string;
}

/**
 * The models of a stored fit (compareModels' result) rebuilt as model specs, with their
 * Akaike weights. A fit's nuisance estimates (N0, σ, q) are left out; a fit whose estimate
 * sits at the edge of a parameter's range is not a valid model spec and is left out too.
 * Fails naming `field` when no usable model remains.
 */
export function fittedModels(result: unknown, field = "fitId"): Result<FittedModel[]> {
  const fits = (result as { fits?: readonly StoredFit[] } | null)?.fits ?? [];
  const out: FittedModel[] = [];
  for (const f of fits) {
    if (!(FAMILY_IDS as readonly string[]).includes(f.family)) continue;
    const family = families[f.family as FamilyId];
    const params: Record<string, number> = {};
    for (const p of family.params)
      if (f.estimates[p.name] !== undefined) params[p.name] = f.estimates[p.name]!;
    const m = parseModel({ family: f.family, params, delay: f.delay });
    if (m.ok)
      out.push({
        model: m.value,
        weight: f.weight,
        label: `${family.label}${f.delay ? ` (delay ${f.delay})` : ""}`,
      });
  }
  return out.length
    ? ok(out)
    : fail({ code: "constraint_violated", field, constraint: "the fit holds no usable model" });
}
