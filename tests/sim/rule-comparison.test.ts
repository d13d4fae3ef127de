import { afterAll, describe, expect, it } from "vitest";
import { createAnalysisPool } from "../../server/workers/pool.js";
import { compareRules, parseRules } from "../../src/sim/rule-comparison.js";
import { robustVerdict } from "../../src/sim/robust-verdict.js";
import { parseScenario } from "../../src/sim/scenario.js";
import { parseUncertainty } from "../../src/sim/uncertainty.js";
import { expectClose, model, rule, unwrap } from "../helpers.js";

// A harvest rate h taken before reproduction leaves spawners B = (1 − h)N, and then
//   B' = (1 − h)·B·exp(r(1 − B/K)) = B·exp(r' − rB/K),  r' = r + ln(1 − h),
// a Ricker in B whose equilibrium B* = K(1 + ln(1 − h)/r) has slope 1 − r', so it is stable
// iff r' < 2 (May 1976, Nature 261:
// 459–467: the Ricker period-doubles at r = 2). For r = 2.3 the boundary is
// h = 1 − e^(2 − r) = 1 − e^(−0.3) ≈ 0.2592: below it the stock oscillates, above it settles.
const spec = {
  model: { family: "ricker", params: { r: 2.3, K: 1000 } },
  rule: { kind: "no-harvest" },
  start: 500,
  horizon: 30,
};
const rules = [
  { kind: "constant-rate", rate: 0.2, timing: "before" },
  { kind: "constant-rate", rate: 0.3, timing: "before" },
  { kind: "constant-rate", rate: 0.3, timing: "before" },
];
const noise = { replicates: 2000, seed: 4, processSd: 0.2 };
const hc = 1 - Math.exp(-0.3);

describe("rule comparison on common random numbers", () => {
  const sc = unwrap(parseScenario(spec));
  const rows = compareRules(sc, unwrap(parseRules(rules)), unwrap(parseUncertainty(noise, sc.model)));

  it("each rule's deterministic verdict and margin follow r' = r + ln(1 − h) < 2", () => {
    expect(rows[0]!.verdict).toBe("unstable-period-doubling");
    expect(rows[1]!.verdict).toBe("stable-oscillating");
    expectClose(rows[0]!.margin!.increase.boundary!, hc, 1e-7, "h where stability is gained");
    expectClose(rows[1]!.margin!.decrease.boundary!, hc, 1e-7, "h where stability is lost");
    expect(rows[1]!.margin!.decrease.kind).toBe("unstable-period-doubling");
    expectClose(rows[1]!.equilibrium!, (1000 * (1 + Math.log(0.7) / 2.3)) / 0.7, 1e-9, "N* = B*/(1 − h)");
  });

  it("identical rules give identical rows; different rules differ", () => {
    expect(rows[2]!.projection).toEqual(rows[1]!.projection);
    expect(rows[0]!.projection.risk.meanCatch).not.toBe(rows[1]!.projection.risk.meanCatch);
  });

  it("bad rules are named by position", () => {
    expect(parseRules([rules[0], { kind: "constant-rate", rate: 1.5 }])).toMatchObject({
      ok: false,
      issue: { code: "param_out_of_range", field: "rules[1].rate" },
    });
    expect(parseRules([])).toMatchObject({ ok: false, issue: { field: "rules" } });
    expect(parseRules("rate")).toMatchObject({ ok: false, issue: { code: "wrong_type", field: "rules" } });
  });

  const pool = createAnalysisPool(2);
  afterAll(() => pool.close());
  it("the worker pool gives the same table", async () => {
    const r = await pool.compareRules({ scenario: spec, uncertainty: noise, rules });
    expect(r).toEqual({ ok: true, value: rows });
  });
});

describe("robust verdict across a weighted model set", () => {
  it("weights the verdicts by Akaike weight (May 1976: Ricker stable for r < 2)", () => {
    const v = unwrap(
      robustVerdict(
        [
          { model: model("ricker", { r: 1.5, K: 1000 }), weight: 0.92 },
          { model: model("ricker", { r: 2.5, K: 1000 }), weight: 0.08 },
        ],
        rule({ kind: "no-harvest" }),
      ),
    );
    expectClose(v.weights.stable, 0.92, 1e-12, "stable");
    expectClose(v.weights.oscillating, 0.08, 1e-12, "oscillating");
    expect(v.summary).toBe(
      "stable under 92% of the weighted model set; oscillating under 8% of the weighted model set",
    );
  });
  it("a quota above one model's MSY counts as collapse under that model", () => {
    // Schaefer (1954): the discrete logistic's MSY is rK/4 = 62.5 for r = 0.25, K = 1000.
    const v = unwrap(
      robustVerdict(
        [
          { model: model("discrete-logistic", { r: 0.25, K: 1000 }), weight: 1 },
          { model: model("discrete-logistic", { r: 0.5, K: 1000 }), weight: 3 },
        ],
        rule({ kind: "constant-catch", quota: 80 }),
      ),
    );
    expect(v.perModel.map((m) => m.class)).toEqual(["collapse", "stable"]);
    expectClose(v.weights.collapse, 0.25, 1e-12, "collapse weight");
  });
  it("rejects negative or all-zero weights, naming the field", () => {
    const m = model("ricker", { r: 1, K: 10 });
    expect(robustVerdict([{ model: m, weight: -1 }], rule({ kind: "no-harvest" }))).toMatchObject({
      ok: false,
      issue: { field: "models[0].weight" },
    });
    expect(robustVerdict([{ model: m, weight: 0 }], rule({ kind: "no-harvest" }))).toMatchObject({
      ok: false,
      issue: { field: "models" },
    });
  });
});
