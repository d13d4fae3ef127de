// Regime map 400 × 400 (r × harvest rate, Ricker, 1,000 burn-in + 128 classified years per
// cell) with 1 and 2 workers, against bench/reference/regime_map_numpy.py on the same grid.
import { createAnalysisPool } from "../server/workers/pool.js";
import { bestOf } from "./best-of.js";
import { havePythonNumpy, runReference } from "./python.js";

const N = 400;
const request = {
  model: { family: "ricker", params: { r: 1, K: 1000 } },
  rule: { kind: "constant-rate", rate: 0.1 },
  x: { path: "model.params.r", from: 0.05, to: 4, count: N },
  y: { path: "rule.rate", from: 0, to: 0.95, count: N },
  options: { burnIn: 1000, observe: 128, start: [500] },
};

export async function regimeMapBench(): Promise<void> {
  for (const threads of [1, 2]) {
    const pool = createAnalysisPool(threads);
    // One small warm-up map so thread start-up and compilation are not timed.
    await pool.regimeMap({ ...request, x: { ...request.x, count: 40 }, y: { ...request.y, count: 40 } });
    // Best of three runs; the numpy reference reports its best of three.
    const { seconds, last: map } = await bestOf(3, () => pool.regimeMap(request));
    await pool.close();
    if (!map.ok) throw new Error(JSON.stringify(map.issue));
    const counts: Record<string, number> = {};
    for (const v of map.regimes) counts[v] = (counts[v] ?? 0) + 1;
    console.log(
      JSON.stringify({
        bench: "regime-map",
        impl: "yieldloop",
        workers: threads,
        cells: N * N,
        bestSeconds: seconds,
        trials: 3,
        regimeCounts: counts,
        boundaryPoints: map.boundary.length,
      }),
    );
  }
  if (!havePythonNumpy()) {
    console.log(
      JSON.stringify({ bench: "regime-map", impl: "numpy", skipped: "python3 with numpy not found" }),
    );
    return;
  }
  console.log(
    JSON.stringify(runReference("regime_map_numpy.py", [String(N), String(N), "1000", "128", "3"])),
  );
}
