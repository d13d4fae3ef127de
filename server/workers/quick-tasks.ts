// The quick analyses a quick-analysis thread runs (see quick-analyses.ts): a stability
// analysis or a stability margin of a scenario spec already validated by the server, as the
// JSON text the server stores and sends.
import { stabilityMargin } from "../../src/equilibria/margin.js";
import { analyseStability } from "../../src/equilibria/stability.js";
import type { Issue } from "../../src/issues.js";
import { parseScenario } from "../../src/sim/scenario.js";

export interface QuickTask {
  readonly id: number;
  readonly kind: "stability" | "margin";
  readonly scenario: unknown;
  readonly parameter?: string;
}

export type QuickAnswer =
  | { readonly id: number; readonly ok: true; readonly json: string }
  | { readonly id: number; readonly ok: false; readonly issue: Issue };

export function runQuickTask(t: QuickTask): QuickAnswer {
  const sc = parseScenario(t.scenario);
  if (!sc.ok) return { id: t.id, ok: false, issue: sc.issue };
  if (t.kind === "stability")
    return { id: t.id, ok: true, json: JSON.stringify(analyseStability(sc.value.loop)) };
  const m = stabilityMargin(sc.value.model, sc.value.rule, t.parameter ?? "");
  // A margin is plain numbers, strings and arrays, like a stability analysis (a test checks both).
  return m.ok
    ? { id: t.id, ok: true, json: JSON.stringify(m.value) }
    : { id: t.id, ok: false, issue: m.issue };
}
