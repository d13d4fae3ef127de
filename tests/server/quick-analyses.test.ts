import { afterAll, describe, expect, it } from "vitest";
import { startQuickAnalyses } from "../../server/workers/quick-analyses.js";
import { analyseStability } from "../../src/equilibria/stability.js";
import { fittedModels } from "../../src/fit/fitted-models.js";
import { robustVerdict } from "../../src/sim/robust-verdict.js";
import { parseScenario } from "../../src/sim/scenario.js";
import { unwrap } from "../helpers.js";

// The quick-analysis thread must answer exactly what the core computes in-process (the
// analyses themselves are checked against their sources in tests/equilibria).
const quick = startQuickAnalyses();
afterAll(() => quick.close());

const spec = (i: number) => ({
  model: { family: "ricker", params: { r: 1.2 + (i % 7) * 0.1, K: 1000 } },
  rule: {
    kind: "threshold",
    lowerTrigger: 200,
    upperTrigger: 500,
    maxRate: 0.05 + ((i * 0.618) % 0.6),
    surveyLag: i % 3,
  },
  start: 600,
  horizon: 20,
});

describe("quick analyses on their own thread", () => {
  it("answers a burst sent in one turn (one message each way) with the in-process results", async () => {
    const answers = await Promise.all(
      Array.from({ length: 60 }, (_, i) => quick.run({ kind: "stability", scenario: spec(i) })),
    );
    answers.forEach((a, i) => {
      expect(a.ok).toBe(true);
      if (a.ok) expect(a.json).toBe(JSON.stringify(analyseStability(unwrap(parseScenario(spec(i))).loop)));
    });
  });

  it("passes a core issue back (a margin in a setting the rule does not have)", async () => {
    const a = await quick.run({ kind: "margin", scenario: spec(1), parameter: "rule.quota" });
    expect(a.ok).toBe(false);
    if (!a.ok) expect(JSON.stringify(a.issue)).toContain("rule.quota");
    const b = await quick.run({ kind: "margin", scenario: spec(1), parameter: "rule.maxRate" });
    expect(b.ok && JSON.parse(b.json).parameter).toBe("rule.maxRate");
  });

  it("answers a robust verdict with the core's, from a stored comparison's fits", async () => {
    const fit = {
      fits: [
        { family: "ricker", delay: 0, estimates: { r: 1.2, K: 1000, N0: 500, sigma: 0.1 }, weight: 0.7 },
        { family: "beverton-holt", delay: 0, estimates: { R0: 3, K: 900, N0: 500, sigma: 0.1 }, weight: 0.3 },
      ],
    };
    const a = await quick.run({ kind: "robust", scenario: spec(3), fit });
    expect(a.ok).toBe(true);
    const models = unwrap(fittedModels(fit));
    const core = unwrap(
      robustVerdict(
        models.map((m) => ({ model: m.model, weight: m.weight })),
        unwrap(parseScenario(spec(3))).rule,
      ),
    );
    if (a.ok) expect(JSON.parse(a.json)).toEqual({ ...core, models: ["Ricker", "Beverton–Holt"] });
    const none = await quick.run({ kind: "robust", scenario: spec(3), fit: { fits: [] } });
    expect(none).toMatchObject({ ok: false, issue: { code: "constraint_violated", field: "fitId" } });
  });

  it("refuses work once closed", async () => {
    const q = startQuickAnalyses();
    expect((await q.run({ kind: "stability", scenario: spec(2) })).ok).toBe(true);
    await q.close();
    await expect(q.run({ kind: "stability", scenario: spec(2) })).rejects.toThrow(/closed/);
  });
});
