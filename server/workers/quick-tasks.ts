// The quick analyses the quick-analysis thread runs (see quick-analyses.ts): a stability
// analysis, a stability margin, or the robust verdict of a rule under a fit's model set, of a
// scenario spec already validated by the server, as the JSON text the server stores and sends.
import { stabilityMargin } from "../../src/equilibria/margin.js";
import { analyseStability } from "../../src/equilibria/stability.js";
import { fittedModels } from "../../src/fit/fitted-models.js";
import type { Issue } from "../../src/issues.js";
import { robustVerdict } from "../../src/sim/robust-verdict.js";
import { parseScenario } from "../../src/sim/scenario.js";

export type QuickRequest =
  | { readonly kind: "stability"; readonly scenario: unknown }
  | { readonly kind: "margin"; readonly scenario: unknown; readonly parameter: string }
  /** `fit` is a stored model comparison (its `fits` are read). */
  | { readonly kind: "robust"; readonly scenario: unknown; readonly fit: unknown };

/** The answer to one task; a batch's answers come back in the order of its tasks. */
export type QuickAnswer =
  | { readonly ok: true; readonly json: string }
  | { readonly ok: false; readonly issue: Issue }
  | { readonly ok: false; readonly error: string };

// A stability analysis, a margin and a robust verdict are plain numbers, strings and arrays,
// so JSON.stringify writes them whole (a test checks all three).
export function runQuickTask(t: QuickRequest): QuickAnswer {
  const sc = parseScenario(t.scenario);
  if (!sc.ok) return { ok: false, issue: sc.issue };
  if (t.kind === "stability") return { ok: true, json: JSON.stringify(analyseStability(sc.value.loop)) };
  if (t.kind === "margin") {
    const m = stabilityMargin(sc.value.model, sc.value.rule, t.parameter);
    return m.ok ? { ok: true, json: JSON.stringify(m.value) } : { ok: false, issue: m.issue };
  }
  const models = fittedModels(t.fit);
  if (!models.ok) return { ok: false, issue: models.issue };
  const v = robustVerdict(
    models.value.map((m) => ({ model: m.model, weight: m.weight })),
    sc.value.rule,
  );
  if (!v.ok) return { ok: false, issue: v.issue };
  return {
    ok: true,
    json: JSON.stringify({ ...v.value, models: models.value.map((m) => m.label) }),
  };
}

/** A batch of tasks, each answered (an exception becomes that task's error, not the batch's). */
export function runQuickBatch(batch: readonly QuickRequest[]): QuickAnswer[] {
  return batch.map((task) => {
    try {
      return runQuickTask(task);
    } catch (e) {
      return { ok: false, error: e instanceof Error ? (e.stack ?? e.message) : String(e) };
    }
  });
}
