import { describe, expect, it } from "vitest";
import {
  bevertonHoltFromStockRecruitment,
  bevertonHoltToStockRecruitment,
  rickerFromStockRecruitment,
  rickerToStockRecruitment,
} from "../../src/models/stock-recruitment.js";
import { production } from "../../src/models/growth-family.js";
import { ricker } from "../../src/models/ricker.js";
import { bevertonHolt } from "../../src/models/beverton-holt.js";
import { expectClose, unwrap } from "../helpers.js";

// Ricker (1954): R = a·S·e^(−bS) is N·exp(r(1 − N/K)) with a = e^r, b = r/K.
// Beverton & Holt (1957): R = a·S/(1 + bS) is R0·N/(1 + (R0 − 1)N/K) with a = R0, b = (R0 − 1)/K.

describe("stock–recruitment conversions", () => {
  it("Ricker a = e, b = 0.001 is r = 1, K = 1000, and both forms give the same recruits", () => {
    const p = unwrap(rickerFromStockRecruitment({ a: Math.E, b: 0.001 }));
    expectClose(p.r, 1, 1e-15, "r");
    expectClose(p.K, 1000, 1e-13, "K");
    for (const S of [1, 100, 1000, 4000]) {
      expectClose(production(ricker, S, p), Math.E * S * Math.exp(-0.001 * S), 1e-13, `R(${S})`);
    }
    const back = rickerToStockRecruitment(p);
    expectClose(back.a, Math.E, 1e-15, "a");
    expectClose(back.b, 0.001, 1e-15, "b");
  });

  it("Beverton–Holt a = 3, b = 0.002 is R0 = 3, K = 1000, and both forms agree", () => {
    const p = unwrap(bevertonHoltFromStockRecruitment({ a: 3, b: 0.002 }));
    expect(p).toEqual({ R0: 3, K: 1000 });
    for (const S of [1, 100, 1000, 4000]) {
      expectClose(production(bevertonHolt, S, p), (3 * S) / (1 + 0.002 * S), 1e-14, `R(${S})`);
    }
    expect(bevertonHoltToStockRecruitment(p)).toEqual({ a: 3, b: 0.002 });
  });

  it("a ≤ 1 (no positive equilibrium), b ≤ 0 and non-finite values are refused with the field named", () => {
    const r1 = rickerFromStockRecruitment({ a: 0.9, b: 0.01 });
    expect(r1).toEqual({
      ok: false,
      issue: { code: "param_out_of_range", field: "a", value: 0.9, min: 1, minInclusive: false },
    });
    const r2 = bevertonHoltFromStockRecruitment({ a: 2, b: -1 });
    expect(r2.ok || r2.issue).toMatchObject({ code: "param_out_of_range", field: "b", value: -1 });
    const r3 = rickerFromStockRecruitment({ a: Number.NaN, b: 1 });
    expect(r3.ok || r3.issue.code).toBe("not_finite");
  });
});
