import { modulus, type Complex } from "./eigenvalues.js";
import type { JuryVerdict } from "./jury.js";

/** How an equilibrium behaves, in the terms a practitioner uses. */
export const STABILITY_KINDS = [
  "stable-monotone",
  "stable-oscillating",
  "unstable-period-doubling",
  "unstable-fold",
  "unstable-oscillating",
  "marginal",
] as const;
export type StabilityKind = (typeof STABILITY_KINDS)[number];

/** The verdict on one equilibrium, with a one-line meaning for reports. */
export interface StabilityVerdict {
  readonly kind: StabilityKind;
  /** Short label, e.g. "stable (damped oscillation)". */
  readonly label: string;
  /** One sentence for a management report. */
  readonly meaning: string;
  /** Largest eigenvalue modulus |λ|. */
  readonly dominantModulus: number;
  /** The dominant eigenvalue. */
  readonly dominant: Complex;
  /** Years for a disturbance to shrink by a factor e, −1/ln|λ| (stable only), else null. */
  readonly returnTime: number | null;
  /** Period 2π/|arg λ| of the dominant oscillation in years (2 for a negative real root), else null. */
  readonly period: number | null;
}

const LABELS: Record<StabilityKind, string> = {
  "stable-monotone": "stable (monotone return)",
  "stable-oscillating": "stable (damped oscillation)",
  "unstable-period-doubling": "unstable by period doubling (a root through −1)",
  "unstable-fold": "unstable by a fold (a root through +1)",
  "unstable-oscillating": "unstable with growing oscillations (a complex pair outside the unit circle)",
  marginal: "marginal (a root on the unit circle)",
};

/**
 * Classifies an equilibrium from the Jury verdict (which decides stable, unstable or
 * marginal) and the eigenvalues (which say how): the dominant eigenvalue λ — the one of
 * largest modulus — is real positive (monotone; a fold when |λ| > 1), real negative
 * (alternating; period doubling when |λ| < −1) or a complex pair (oscillating with period
 * 2π/|arg λ|). Return time −1/ln|λ|.
 * Sources: May, R. M. (1976). Nature 261: 459–467; Jury, E. I. (1964). Theory and
 * Application of the z-Transform Method. Wiley.
 */
export function classifyEquilibrium(verdict: JuryVerdict, eigs: readonly Complex[]): StabilityVerdict {
  const dominant = eigs[0] ?? { re: 0, im: 0 };
  const dominantModulus = modulus(dominant);
  const complex = Math.abs(dominant.im) > 1e-12 * Math.max(1, dominantModulus);
  const angle = Math.abs(Math.atan2(dominant.im, dominant.re));
  const period = complex ? (2 * Math.PI) / angle : dominant.re < 0 ? 2 : null;
  let kind: StabilityKind;
  if (verdict === "marginal") kind = "marginal";
  else if (verdict === "stable")
    kind = !complex && dominant.re >= 0 ? "stable-monotone" : "stable-oscillating";
  else {
    // The kind of instability is named after the eigenvalue furthest outside the circle.
    const outside = eigs.filter((z) => modulus(z) > 1);
    const worst = outside[0] ?? dominant;
    const worstComplex = Math.abs(worst.im) > 1e-12 * Math.max(1, modulus(worst));
    kind = worstComplex
      ? "unstable-oscillating"
      : worst.re > 0
        ? "unstable-fold"
        : "unstable-period-doubling";
  }
  const returnTime =
    verdict === "stable" && dominantModulus > 0
      ? -1 / Math.log(dominantModulus)
      : verdict === "stable"
        ? 0
        : null;
  return {
    kind,
    label: LABELS[kind],
    meaning: meaning(kind, period, returnTime, dominant),
    dominantModulus,
    dominant,
    returnTime,
    period,
  };
}

function meaning(
  kind: StabilityKind,
  period: number | null,
  returnTime: number | null,
  dominant: Complex,
): string {
  const p = period === null ? "" : ` (period about ${period.toFixed(1)} years)`;
  const r =
    returnTime === null
      ? ""
      : returnTime === 0
        ? " at once"
        : `, a disturbance shrinking by a factor e in about ${returnTime.toFixed(1)} years`;
  switch (kind) {
    case "stable-monotone":
      return `After a disturbance the stock returns to this level without overshooting${r}.`;
    case "stable-oscillating":
      return `After a disturbance the stock overshoots and swings back${p}, the swings dying out${r}.`;
    case "unstable-period-doubling":
      return "The stock cannot settle here: it alternates high and low from year to year, in a two-year cycle or wider swings.";
    case "unstable-fold":
      return "A small disturbance grows in one direction: the stock drifts away from this level, up to another equilibrium or down towards collapse.";
    case "unstable-oscillating":
      return `Swings${p} grow instead of dying out, leading to sustained cycles or a collapse.`;
    case "marginal": {
      const where =
        Math.abs(dominant.im) > 1e-12
          ? `a complex pair${p}`
          : dominant.re < 0
            ? "a root at −1"
            : "a root at +1";
      return `The rule sits on the edge of stability (${where}): a small change in the rule or in the stock's biology tips it either way.`;
    }
  }
}
