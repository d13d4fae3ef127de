// Timing for the benchmarks: the machine is shared, so each figure is the best (least
// disturbed) of several trials; the Python references report their best trial too.

/** Runs `run` `trials` times; the shortest run in seconds, and the last run's value. */
export async function bestOf<T>(
  trials: number,
  run: () => T | Promise<T>,
): Promise<{ seconds: number; last: T }> {
  let seconds = Infinity;
  let last!: T;
  for (let trial = 0; trial < trials; trial++) {
    const t0 = process.hrtime.bigint();
    last = await run();
    seconds = Math.min(seconds, Number(process.hrtime.bigint() - t0) / 1e9);
  }
  return { seconds, last };
}
