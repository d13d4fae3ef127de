import { uniformFloat64 } from "pure-rand/distribution/uniformFloat64";
import { xoroshiro128plus } from "pure-rand/generator/xoroshiro128plus";

/** A seeded source of uniform numbers in [0, 1), passed to whatever needs randomness. */
export type Uniform = () => number;

/**
 * A seeded uniform generator: xoroshiro128+ from pure-rand, 53-bit floats in [0, 1).
 * The same seed gives the same sequence on every platform. There is no global random state:
 * each caller owns its generator.
 * Source: Blackman, D. & Vigna, S. (2021). Scrambled linear pseudorandom number generators.
 * ACM Trans. Math. Softw. 47: 36.
 */
export function seededUniform(seed: number): Uniform {
  const g = xoroshiro128plus(seed | 0);
  return () => uniformFloat64(g);
}

/**
 * A standard normal deviate from two uniforms (Box–Muller transform):
 *   z = √(−2 ln u₁)·cos(2π u₂).
 * Source: Box, G. E. P. & Muller, M. E. (1958). Ann. Math. Stat. 29: 610–611.
 */
export function standardNormal(u: Uniform): number {
  let u1 = u();
  while (u1 <= 0) u1 = u();
  return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u());
}
