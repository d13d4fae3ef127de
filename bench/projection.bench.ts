// Stochastic projection: 100,000 replicates × 50 years, Ricker (r = 1.2, K = 1000, start
// 600), threshold rule (0 at or below 200, rising to 0.3 at 500), lognormal process noise of
// sd 0.4, with 1 and 2 workers, against bench/reference/projection_numpy.py on the same
// scenario. Both sides compute the per-year percentiles and the risk metrics.
import { createAnalysisPool } from "../server/workers/pool.js";
import { bestOf } from "./best-of.js";
import { havePythonNumpy, runReference } from "./python.js";

const REPLICATES = 100_000;
const YEARS = 50;
const request = {
  scenario: {
    model: { family: "ricker", params: { r: 1.2, K: 1000 } },
    rule: { kind: "threshold", lowerTrigger: 200, upperTrigger: 500, maxRate: 0.3 },
    start: 600,
    horizon: YEARS,
  },
  uncertainty: { replicates: REPLICATES, seed: 7, processSd: 0.4 },
};

export async function projectionBench(): Promise<void> {
  for (const threads of [1, 2]) {
    const pool = createAnalysisPool(threads);
    // A small warm-up run so thread start-up and compilation are not timed.
    await pool.projection({ ...request, uncertainty: { ...request.uncertainty, replicates: 20_000 } });
    // Best of five runs; the numpy reference reports its best of three.
    const { seconds, last } = await bestOf(5, () => pool.projection(request));
    await pool.close();
    if (!last.ok) throw new Error(JSON.stringify(last.issue));
    const r = last.value.risk;
    console.log(
      JSON.stringify({
        bench: "stochastic-projection",
        impl: "yieldloop",
        workers: threads,
        replicates: REPLICATES,
        years: YEARS,
        trials: 5,
        bestSeconds: seconds,
        populationStepsPerSecond: (REPLICATES * YEARS) / seconds,
        target: threads === 2 ? 1e8 : undefined,
        metrics: {
          meanCatch: r.meanCatch,
          medianCatch: r.medianCatch,
          belowLimit: r.belowLimit.probability,
          quasiExtinction: r.quasiExtinction.probability,
          averageAnnualVariation: r.averageAnnualVariation,
          zeroCatchFraction: r.zeroCatchFraction,
          medianAbundanceLastYear: last.value.abundance[3]![YEARS],
          p95AbundanceLastYear: last.value.abundance[6]![YEARS],
        },
      }),
    );
  }
  if (!havePythonNumpy()) {
    console.log(
      JSON.stringify({
        bench: "stochastic-projection",
        impl: "numpy",
        skipped: "python3 with numpy not found",
      }),
    );
    return;
  }
  console.log(JSON.stringify(runReference("projection_numpy.py", [String(REPLICATES), String(YEARS), "3"])));
}
