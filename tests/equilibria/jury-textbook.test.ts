import { describe, expect, it } from "vitest";
import { juryTest } from "../../src/equilibria/jury.js";
import { juryVerdict } from "../../src/equilibria/jury-verdict.js";
import { expectClose, unwrap } from "../helpers.js";

// Ogata, K. (1995). Discrete-Time Control Systems, 2nd ed. Prentice Hall, §4-3, Example 4-3
// (example number from memory): P(z) = z^4 − 1.2z^3 + 0.07z^2 + 0.3z − 0.08 is stable.
// The table entries below were computed by hand from Jury's determinants
// b_k = a4·a(k+1) − a(3−k)·a0 and c_k = b3·b(k+1) − b(2−k)·b0, and agree with the printed
// table as remembered (from memory): b3 = −0.9936, b2 = 1.176, b1 = −0.0756, b0 = −0.204,
// c2 = 0.94562, c1 = −1.18390, c0 = 0.31502.
describe("Jury table, textbook example (Ogata 1995, Example 4-3)", () => {
  const table = unwrap(juryTest([1, -1.2, 0.07, 0.3, -0.08]));

  it("first row is [a4 … a0]", () => {
    expect(table.rows[0]!.entries).toEqual([-0.08, 0.3, 0.07, -1.2, 1]);
  });

  it("b row: b3 = −0.9936, b2 = 1.176, b1 = −0.0756, b0 = −0.204", () => {
    const row = table.rows[1]!;
    const b = row.entries.map((v) => v * Math.pow(2, row.exponent));
    [-0.9936, 1.176, -0.0756, -0.204].forEach((want, i) => expectClose(b[i]!, want, 1e-15, `b${3 - i}`));
  });

  it("c row: c2 = 0.94562496, c1 = −1.183896, c0 = 0.31502016", () => {
    const row = table.rows[2]!;
    const c = row.entries.map((v) => v * Math.pow(2, row.exponent));
    [0.94562496, -1.183896, 0.31502016].forEach((want, i) => expectClose(c[i]!, want, 1e-15, `c${2 - i}`));
  });

  it("every condition holds, with P(1) = 0.09 and P(−1) = 1.89 (hand arithmetic)", () => {
    expect(table.verdict).toBe("stable");
    expect(table.conditions.map((c) => c.holds)).toEqual([true, true, true, true, true]);
    const sumAbs = 1 + 1.2 + 0.07 + 0.3 + 0.08;
    expectClose(table.conditions[1]!.value * sumAbs, 0.09, 1e-14, "P(1)");
    expectClose(table.conditions[2]!.value * sumAbs, 1.89, 1e-14, "P(−1)");
    expect(juryVerdict([1, -1.2, 0.07, 0.3, -0.08])).toBe(1);
  });
});

describe("Jury test, hand-checkable cases", () => {
  it("z^3 − 1.3z^2 − 0.08z + 0.24 = (z − 0.5)(z − 1.2)(z + 0.4) is unstable", () => {
    // Factorisation checked by expanding; the root 1.2 lies outside the unit circle.
    expect(unwrap(juryTest([1, -1.3, -0.08, 0.24])).verdict).toBe("unstable");
    expect(juryVerdict([1, -1.3, -0.08, 0.24])).toBe(-1);
  });

  it("(z² + 1)(z + 0.25) with roots ±i on the circle is marginal, not flipped by rounding", () => {
    expect(unwrap(juryTest([1, 0.25, 1, 0.25])).verdict).toBe("marginal");
    expect(juryVerdict([1, 0.25, 1, 0.25])).toBe(0);
  });

  it("a root at exactly +1 or −1 is marginal", () => {
    expect(unwrap(juryTest([1, -1.5, 0.5])).verdict).toBe("marginal"); // (z − 1)(z − 0.5)
    expect(unwrap(juryTest([1, 1.5, 0.5])).verdict).toBe("marginal"); // (z + 1)(z + 0.5)
  });

  it("a negative leading coefficient is normalised; a constant has no roots and is stable", () => {
    expect(unwrap(juryTest([-1, 1.2, -0.07, -0.3, 0.08])).verdict).toBe("stable");
    expect(unwrap(juryTest([5])).verdict).toBe("stable");
    expect(unwrap(juryTest([0, 0, 1, -0.5])).degree).toBe(1);
  });

  it("the zero polynomial and non-finite coefficients are refused with the field named", () => {
    const zero = juryTest([0, 0, 0]);
    expect(zero.ok || zero.issue).toMatchObject({ code: "constraint_violated", field: "coefficients" });
    const nan = juryTest([1, Number.NaN, 0.2]);
    expect(nan.ok || nan.issue).toEqual({ code: "not_finite", field: "coefficients[1]", received: "NaN" });
    expect(juryVerdict([0, 0])).toBe(-2);
  });
});
