import { logGamma } from "../numeric/log-gamma.js";

/** The observation models a series can be fitted with. */
/** The observation likelihoods a fit can use, with the words a person reads. */
export const LIKELIHOOD_LABELS = {
  lognormal: "lognormal (multiplicative survey error)",
  normal: "normal (additive survey error)",
  poisson: "Poisson (counts)",
  "negative-binomial": "negative binomial (overdispersed counts)",
} as const;
export type LikelihoodKind = keyof typeof LIKELIHOOD_LABELS;
export const LIKELIHOODS = Object.keys(LIKELIHOOD_LABELS) as [LikelihoodKind, ...LikelihoodKind[]];

/**
 * Negative log-likelihood of observations y_t given predictions μ_t = q·N_t, with the scale
 * q and the variance handled as their maximum-likelihood (closed-form, "concentrated")
 * values where those exist.
 *
 *   lognormal: ln y ~ N(ln μ, σ²/w);  ln q̂ = Σw(ln y − ln N)/Σw,  σ̂² = Σw·e²/n,  e = ln y − ln μ
 *   normal:    y ~ N(μ, σ²/w);        q̂ = Σw·y·N / Σw·N²,         σ̂² = Σw·e²/n,  e = y − μ
 *   poisson:   y ~ Poisson(μ);        q̂ = Σy / ΣN
 *   negative binomial: y ~ NB(mean μ, size k), q and k supplied (estimated numerically)
 * Weights w_t = 1/ln(1 + cv_t²) (lognormal) or 1/cv_t² (normal) where a cv is given, else 1,
 * normalised to mean 1. With `fixedQ` the scale is not estimated.
 * Sources: Hilborn, R. & Mangel, M. (1997). The Ecological Detective. Princeton University
 * Press, ch. 7; Polacheck, T., Hilborn, R. & Punt, A. E. (1993). Fitting surplus production
 * models. Can. J. Fish. Aquat. Sci. 50: 2597–2607 (from memory).
 * Returns Infinity where a prediction is not positive and the likelihood needs it.
 */
export function negLogLikelihood(
  kind: LikelihoodKind,
  y: readonly number[],
  n: readonly number[],
  w: readonly number[],
  options: { fixedQ?: number; q?: number; size?: number; logY?: readonly number[] } = {},
): { nll: number; q: number; sigma: number | null } {
  const m = y.length;
  if (kind === "lognormal") {
    // ln y and its sums are fixed for a series: pass them in (`logY`) to spare the logarithms.
    const ly = options.logY ?? y.map((v) => (v > 0 ? Math.log(v) : NaN));
    let lnq = options.fixedQ === undefined ? 0 : Math.log(options.fixedQ);
    let sw = 0;
    let s = 0;
    const ln = lnScratch.length >= m ? lnScratch : (lnScratch = new Float64Array(2 * m));
    for (let i = 0; i < m; i++) {
      if (!(n[i]! > 0) || !(y[i]! > 0)) return { nll: Infinity, q: NaN, sigma: null };
      const l = Math.log(n[i]!);
      ln[i] = l;
      s += w[i]! * (ly[i]! - l);
      sw += w[i]!;
    }
    if (options.fixedQ === undefined) lnq = s / sw;
    let ss = 0;
    let jac = 0;
    let lw = 0;
    for (let i = 0; i < m; i++) {
      const e = ly[i]! - lnq - ln[i]!;
      ss += w[i]! * e * e;
      jac += ly[i]!;
      lw += w[i]! === 1 ? 0 : Math.log(w[i]!);
    }
    const s2 = Math.max(ss / m, 1e-300);
    return {
      nll: 0.5 * m * (Math.log(2 * Math.PI * s2) + 1) - 0.5 * lw + jac,
      q: Math.exp(lnq),
      sigma: Math.sqrt(s2),
    };
  }
  if (kind === "normal") {
    let q = options.fixedQ;
    if (q === undefined) {
      let a = 0;
      let b = 0;
      for (let i = 0; i < m; i++) {
        a += w[i]! * y[i]! * n[i]!;
        b += w[i]! * n[i]! * n[i]!;
      }
      q = b > 0 ? a / b : 1;
    }
    let ss = 0;
    let lw = 0;
    for (let i = 0; i < m; i++) {
      const e = y[i]! - q * n[i]!;
      ss += w[i]! * e * e;
      lw += Math.log(w[i]!);
    }
    const s2 = Math.max(ss / m, 1e-300);
    return { nll: 0.5 * m * (Math.log(2 * Math.PI * s2) + 1) - 0.5 * lw, q, sigma: Math.sqrt(s2) };
  }
  if (kind === "poisson") {
    let q = options.fixedQ;
    if (q === undefined) {
      let sy = 0;
      let sn = 0;
      for (let i = 0; i < m; i++) {
        sy += y[i]!;
        sn += n[i]!;
      }
      q = sn > 0 ? sy / sn : 1;
    }
    let nll = 0;
    for (let i = 0; i < m; i++) {
      const mu = q * n[i]!;
      if (!(mu > 0)) {
        if (y[i]! > 0) return { nll: Infinity, q, sigma: null };
        continue;
      }
      nll += mu - y[i]! * Math.log(mu) + logGamma(y[i]! + 1);
    }
    return { nll, q, sigma: null };
  }
  const q = options.fixedQ ?? options.q ?? 1;
  const k = options.size ?? 10;
  let nll = 0;
  for (let i = 0; i < m; i++) {
    const mu = q * n[i]!;
    if (!(mu > 0)) {
      if (y[i]! > 0) return { nll: Infinity, q, sigma: null };
      continue;
    }
    const yi = y[i]!;
    nll -=
      logGamma(yi + k) -
      logGamma(k) -
      logGamma(yi + 1) +
      k * Math.log(k / (k + mu)) +
      yi * Math.log(mu / (k + mu));
  }
  return { nll, q, sigma: null };
}

let lnScratch = new Float64Array(64);

/** Observation weights from per-point cv (mean 1; 1 where no cv is given). */
export function cvWeights(kind: LikelihoodKind, cv: readonly (number | null)[]): number[] {
  const raw = cv.map((c) =>
    c === null || !(c > 0) ? null : kind === "lognormal" ? 1 / Math.log(1 + c * c) : 1 / (c * c),
  );
  const given = raw.filter((v): v is number => v !== null);
  if (given.length === 0) return cv.map(() => 1);
  const mean = given.reduce((a, b) => a + b, 0) / given.length;
  return raw.map((v) => (v === null ? 1 : v / mean));
}
