import type { ParamInfo } from "../params.js";

/**
 * The unconstrained coordinate the optimiser moves in for one parameter, keeping the
 * parameter strictly inside its documented range:
 *   range with max/min > 1e6 or min = 0 and max ≥ 1e6 (carrying capacity, abundances): v = e^x
 *   other ranges (min, max):                                                v = min + (max − min)·σ(x)
 * with σ(x) = 1/(1 + e^(−x)). `atBound` is true within 1e-6 (relative) of an end.
 * Source: Hilborn & Mangel (1997), The Ecological Detective, ch. 7 (fitting on transformed
 * scales; from memory).
 */
export interface Transform {
  toFree(v: number): number;
  fromFree(x: number): number;
  atBound(v: number): boolean;
  /** dv/dx at the natural value v (for the delta method). */
  slope(v: number): number;
}

export function transformFor(info: Pick<ParamInfo, "min" | "max">): Transform {
  const { min, max } = info;
  if (max >= 1e6 && min <= 0) {
    return {
      toFree: (v) => Math.log(v),
      fromFree: (x) => Math.min(Math.exp(x), max),
      atBound: (v) => v >= max * (1 - 1e-6) || v <= 1e-300,
      slope: (v) => v,
    };
  }
  const w = max - min;
  return {
    toFree: (v) => {
      const u = Math.min(Math.max((v - min) / w, 1e-12), 1 - 1e-12);
      return Math.log(u / (1 - u));
    },
    fromFree: (x) => min + w / (1 + Math.exp(-x)),
    atBound: (v) => (v - min) / w < 1e-6 || (max - v) / w < 1e-6,
    slope: (v) => ((v - min) * (max - v)) / w,
  };
}
