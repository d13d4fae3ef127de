import { afterAll, describe, expect, it } from "vitest";
import { startQuickAnalyses } from "../../server/workers/quick-analyses.js";
import { analyseStability } from "../../src/equilibria/stability.js";
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
    const answers = await Promise.all(Array.from({ length: 60 }, (_, i) => quick.run("stability", spec(i))));
    answers.forEach((a, i) => {
      expect(a.ok).toBe(true);
      if (a.ok) expect(a.json).toBe(JSON.stringify(analyseStability(unwrap(parseScenario(spec(i))).loop)));
    });
  });

  it("passes a core issue back (a margin in a setting the rule does not have)", async () => {
    const a = await quick.run("margin", spec(1), "rule.quota");
    expect(a.ok).toBe(false);
    if (!a.ok) expect(JSON.stringify(a.issue)).toContain("rule.quota");
    const b = await quick.run("margin", spec(1), "rule.maxRate");
    expect(b.ok && JSON.parse(b.json).parameter).toBe("rule.maxRate");
  });

  it("refuses work once closed", async () => {
    const q = startQuickAnalyses();
    expect((await q.run("stability", spec(2))).ok).toBe(true);
    await q.close();
    await expect(q.run("stability", spec(2))).rejects.toThrow(/closed/);
  });
});
