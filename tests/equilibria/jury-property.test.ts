import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { eigenvalues, companionMatrix, modulus } from "../../src/equilibria/eigenvalues.js";
import { juryTest } from "../../src/equilibria/jury.js";
import { juryVerdict } from "../../src/equilibria/jury-verdict.js";
import { unwrap } from "../helpers.js";

// Property: over thousands of random real polynomials of degree 1–12, the Jury verdict
// equals "every companion-matrix eigenvalue strictly inside the unit circle" computed by a
// general-purpose library (ml-matrix's EigenvalueDecomposition, EISPACK hqr2), on every
// polynomial whose largest root modulus is not within 1e-6 of 1 (there eigenvalue rounding,
// about 1e-12 here, could decide either way).

const polynomial = fc
  .integer({ min: 1, max: 12 })
  .chain((n) =>
    fc
      .tuple(
        fc.double({ min: 0.1, max: 3, noNaN: true }),
        fc.array(fc.double({ min: -1.5, max: 1.5, noNaN: true }), { minLength: n, maxLength: n }),
        fc.double({ min: 0.3, max: 1.6, noNaN: true }),
      )
      .map(([lead, rest, spread]) => [lead, ...rest.map((v, i) => lead * v * Math.pow(spread, i + 1))]),
  );

describe("Jury verdict against companion-matrix eigenvalues (ml-matrix)", () => {
  it("agree on 5,000 random polynomials of degree 1–12 away from the circle", () => {
    let checked = 0;
    let stable = 0;
    fc.assert(
      fc.property(polynomial, (c) => {
        const roots = eigenvalues(companionMatrix(c));
        const rho = Math.max(...roots.map(modulus));
        if (Math.abs(rho - 1) < 1e-6) return;
        checked++;
        const inside = rho < 1;
        if (inside) stable++;
        const verdict = unwrap(juryTest(c)).verdict;
        expect(verdict, `P = [${c.join(", ")}], max |root| = ${rho}`).toBe(inside ? "stable" : "unstable");
        expect(juryVerdict(c)).toBe(inside ? 1 : -1);
      }),
      { numRuns: 5000, seed: 1964 },
    );
    // The generator must exercise both outcomes, or the property proves little.
    expect(checked).toBeGreaterThan(4900);
    expect(stable).toBeGreaterThan(500);
    expect(checked - stable).toBeGreaterThan(500);
  });
});
