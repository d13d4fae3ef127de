import { analyseStability } from "../equilibria/stability.js";
import type { Model } from "../models/model-spec.js";
import { closedLoop } from "../policy/closed-loop.js";
import type { Rule } from "../policy/rule-spec.js";
import { fail, ok, type Result } from "../result.js";

/** The behaviour classes a robust verdict weighs. */
export const ROBUST_CLASSES = ["stable", "oscillating", "marginal", "collapse"] as const;
export type RobustClass = (typeof ROBUST_CLASSES)[number];

export interface RobustVerdict {
  /** Weight (summing to 1) of the models under which the rule gives each class. */
  readonly weights: Record<RobustClass, number>;
  /** Each model's class, in the order given. */
  readonly perModel: { readonly weight: number; readonly class: RobustClass; readonly label: string }[];
  /** One line for a report, e.g. "stable under 92% of the weighted model set; oscillating under 8%". */
  readonly summary: string;
}

/**
 * The verdict on one rule across a set of fitted models, each counted with its weight
 * (normally the Akaike weight from compareModels). Per model, the operating equilibrium of
 * the closed loop (analyseStability) is classed as
 *   stable       stable, monotone or damped
 *   oscillating  unstable by period doubling or with growing oscillations (cycles or
 *                irregular swings follow)
 *   marginal     a root on the unit circle
 *   collapse     no positive equilibrium, or only one lost through a fold
 * and the weights of each class are summed.
 * Source (model averaging by Akaike weight): Burnham, K. P. & Anderson, D. R. (2002). Model
 * Selection and Multimodel Inference, 2nd ed. Springer, §4.2.
 */
export function robustVerdict(
  models: readonly { model: Model; weight: number }[],
  rule: Rule,
): Result<RobustVerdict> {
  if (models.length === 0)
    return fail({ code: "constraint_violated", field: "models", constraint: "give at least one model" });
  let total = 0;
  for (let i = 0; i < models.length; i++) {
    const w = models[i]!.weight;
    if (!Number.isFinite(w) || w < 0)
      return fail({
        code: "param_out_of_range",
        field: `models[${i}].weight`,
        value: Number.isFinite(w) ? w : 0,
        min: 0,
        minInclusive: true,
      });
    total += w;
  }
  if (!(total > 0))
    return fail({
      code: "constraint_violated",
      field: "models",
      constraint: "the weights must not all be zero",
    });
  const weights: Record<RobustClass, number> = { stable: 0, oscillating: 0, marginal: 0, collapse: 0 };
  const perModel = models.map(({ model, weight }) => {
    const a = analyseStability(closedLoop(model, rule));
    const op = a.operating === null ? null : a.equilibria[a.operating]!;
    let cls: RobustClass;
    if (!op) cls = "collapse";
    else if (op.verdict.kind.startsWith("stable")) cls = "stable";
    else if (op.verdict.kind === "marginal") cls = "marginal";
    else if (op.verdict.kind === "unstable-fold") cls = "collapse";
    else cls = "oscillating";
    weights[cls] += weight / total;
    return {
      weight: weight / total,
      class: cls,
      label: op ? op.verdict.label : "no positive equilibrium: the stock collapses",
    };
  });
  const parts = ROBUST_CLASSES.filter((c) => weights[c] > 0)
    .sort((a, b) => weights[b] - weights[a])
    .map((c) => `${c} under ${percent(weights[c])} of the weighted model set`);
  return ok({ weights, perModel, summary: parts.join("; ") });
}

function percent(w: number): string {
  const p = 100 * w;
  return p >= 99.5 && w < 1 ? ">99%" : p < 0.5 ? "<1%" : `${Math.round(p)}%`;
}
