import { describe, expect, it } from "vitest";
import { juryTest } from "../../src/equilibria/jury.js";
import { juryVerdict } from "../../src/equilibria/jury-verdict.js";
import { unwrap } from "../helpers.js";

// High degree, roots very close to the unit circle (as long survey lags give). The truth is
// known by construction: the polynomial is built from its roots. A plain double-precision
// table, whose rows square in magnitude (|b| ~ |a|²), underflows to zero after ~10 rows when
// the coefficients are small; the rescaled double-double table does not.

/** Real coefficients (highest power first) of lead·Π(z − ρ·e^{±iθ_k}) over conjugate pairs. */
function fromPairs(lead: number, pairs: [number, number][]): number[] {
  let c = [lead];
  for (const [rho, theta] of pairs) {
    const q = [1, -2 * rho * Math.cos(theta), rho * rho];
    const out = new Array<number>(c.length + 2).fill(0);
    for (let i = 0; i < c.length; i++) for (let j = 0; j < 3; j++) out[i + j]! += c[i]! * q[j]!;
    c = out;
  }
  return c;
}

/** The plain Jury table in doubles with no rescaling, as a foil. */
function plainVerdict(c: number[]): string {
  const n = c.length - 1;
  let row = [...c].reverse();
  if (!(Math.abs(row[0]!) < row[n]!)) return "unstable";
  while (row.length > 3) {
    const m = row.length - 1;
    const r0 = row[0]!;
    const rm = row[m]!;
    row = row.slice(0, m).map((_, i) => r0 * row[i]! - row[m - i]! * rm);
    if (row.every((v) => v === 0)) return "underflow";
    if (!(Math.abs(row[0]!) > Math.abs(row[m - 1]!))) return "unstable";
  }
  return "stable";
}

describe("Jury test at high degree near the unit circle", () => {
  for (const degree of [20, 30, 40]) {
    const angles = Array.from({ length: degree / 2 }, (_, k) => ((k + 0.5) * Math.PI) / (degree / 2 + 1));
    it(`degree ${degree}: all roots at radius 1 − 1e-7 is stable`, () => {
      const c = fromPairs(
        1,
        angles.map((t) => [1 - 1e-7, t]),
      );
      expect(unwrap(juryTest(c)).verdict).toBe("stable");
      expect(juryVerdict(c)).toBe(1);
    });
    it(`degree ${degree}: one pair at radius 1 + 1e-7 is unstable`, () => {
      const c = fromPairs(
        1,
        angles.map((t, k) => [k === 3 ? 1 + 1e-7 : 0.99, t]),
      );
      expect(unwrap(juryTest(c)).verdict).toBe("unstable");
      expect(juryVerdict(c)).toBe(-1);
    });
  }

  it("a small leading coefficient (1e-3) at degree 30 underflows the plain table but not ours", () => {
    const angles = Array.from({ length: 15 }, (_, k) => ((k + 0.5) * Math.PI) / 16);
    const c = fromPairs(
      1e-3,
      angles.map((t) => [0.9, t]),
    );
    expect(plainVerdict(c)).toBe("underflow");
    expect(unwrap(juryTest(c)).verdict).toBe("stable");
    expect(juryVerdict(c)).toBe(1);
  });
});
