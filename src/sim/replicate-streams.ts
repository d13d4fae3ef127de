import { xoroshiro128plus } from "pure-rand/generator/xoroshiro128plus";
import type { IntSource } from "./ziggurat.js";

/** Replicates share one random stream per block of this many; blocks are never split. */
export const BLOCK_SIZE = 1024;

/** Blocks needed for `replicates` replicates. */
export function blockCount(replicates: number): number {
  return Math.ceil(replicates / BLOCK_SIZE);
}

/** Replicates in block b of a run of `replicates`. */
export function blockLength(b: number, replicates: number): number {
  return Math.min(BLOCK_SIZE, replicates - b * BLOCK_SIZE);
}

/**
 * The random streams of blocks from, from + 1, …: block b's stream is the seed's
 * xoroshiro128+ generator advanced by b jumps of 2^64 draws, so blocks never overlap and
 * each block's numbers depend only on the seed and b, not on which worker runs it. That is
 * what makes a run split across any number of workers identical to a run on one.
 * Source: Blackman, D. & Vigna, S. (2021). Scrambled linear pseudorandom number generators.
 * ACM Trans. Math. Softw. 47: 36 (the jump polynomial; pure-rand's jump()).
 */
export function* blockStreams(seed: number, from: number): Generator<IntSource> {
  yield* blockGenerators(seed, from);
}

/**
 * The same streams as blockStreams, as pure-rand's four 32-bit state words
 * [s01, s00, s11, s10] (what the WebAssembly kernel starts each block from).
 */
export function* blockStates(seed: number, from: number): Generator<readonly number[]> {
  for (const g of blockGenerators(seed, from)) yield g.getState();
}

function* blockGenerators(seed: number, from: number) {
  const base = xoroshiro128plus(seed | 0);
  for (let b = 0; b < from; b++) base.jump();
  for (;;) {
    yield base.clone();
    base.jump();
  }
}
