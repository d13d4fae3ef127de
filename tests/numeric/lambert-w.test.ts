import { describe, expect, it } from "vitest";
import fixtures from "../fixtures/projection/projection-fixtures.json" with { type: "json" };
import { lambertW0 } from "../../src/numeric/lambert-w.js";
import { expectClose } from "../helpers.js";

// Reference values from scipy.special.lambertw (SciPy), made by
// tests/fixtures/projection/make_projection_fixtures.py.
describe("lambertW0 against scipy.special.lambertw", () => {
  for (const { x, w } of fixtures.lambertW0) {
    it(`W0(${x}) = ${w}`, () => {
      // Halley's iteration stops at 4·EPS relative; near the branch point −1/e the problem
      // is ill-conditioned (dW/dx → ∞), so there the bound is 1e-7 in W.
      const tol = x < -0.36 ? 1e-7 : 1e-14;
      expectClose(lambertW0(x), w, tol, `W0(${x})`);
    });
  }
  it("returns NaN below −1/e and 0 at 0 (documented special cases)", () => {
    expect(lambertW0(-0.5)).toBeNaN();
    expect(lambertW0(0)).toBe(0);
  });
});
