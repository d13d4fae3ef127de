// Benchmarks: JSON lines on stdout, one per measurement. Each benchmark races its
// numpy/scipy reference (bench/reference/*.py) in the same run when python3 has numpy.
// `npm run bench -- jury` runs one benchmark by name.
import { closedLoop, parseModel, parseRule } from "../src/index.js";
import { juryBench } from "./jury.bench.js";
import { regimeMapBench } from "./regime-map.bench.js";
import { fitBench } from "./fit.bench.js";
import { projectionBench } from "./projection.bench.js";
import { loadBench } from "./load.bench.js";

function must<T>(r: { ok: true; value: T } | { ok: false; issue: unknown }): T {
  if (!r.ok) throw new Error(JSON.stringify(r.issue));
  return r.value;
}

/** Deterministic closed-loop steps per second (Ricker, threshold rule, survey lag 1). */
function closedLoopSteps(): void {
  const loop = closedLoop(
    must(parseModel({ family: "ricker", params: { r: 1.2, K: 1000 } })),
    must(parseRule({ kind: "threshold", lowerTrigger: 200, upperTrigger: 500, maxRate: 0.3, surveyLag: 1 })),
  );
  const x = loop.initialState([600]);
  const steps = 20_000_000;
  const t0 = process.hrtime.bigint();
  for (let i = 0; i < steps; i++) loop.step(x, x);
  const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
  console.log(
    JSON.stringify({
      bench: "closed-loop-steps",
      impl: "yieldloop",
      steps,
      seconds,
      stepsPerSecond: steps / seconds,
      final: x[0],
    }),
  );
}

const benches: Record<string, () => void | Promise<void>> = {
  "closed-loop": closedLoopSteps,
  jury: juryBench,
  "regime-map": regimeMapBench,
  fit: fitBench,
  projection: projectionBench,
  load: loadBench,
};
const only = process.argv.slice(2);
for (const [name, run] of Object.entries(benches)) if (only.length === 0 || only.includes(name)) await run();
