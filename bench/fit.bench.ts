// Fit benchmarks: an observation-error Ricker fit to a 40-year series with catches (harvest
// rate rising 5% → 60%, so the problem has contrast) against scipy.optimize.least_squares on
// the same data and objective; and every family compared plus a 1,000-draw bootstrap.
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { parseModel } from "../src/models/model-spec.js";
import { projectThroughCatches } from "../src/sim/project-through-catches.js";
import { seededUniform, standardNormal } from "../src/sim/rng.js";
import { fitProblem, optimiseFit } from "../src/fit/fit-model.js";
import { compareModels } from "../src/fit/compare-models.js";
import { parametricBootstrap } from "../src/fit/bootstrap.js";
import { parseSeriesCsv } from "../src/fit/series.js";
import type { Series } from "../src/fit/series.js";
import { bestOf } from "./best-of.js";
import { havePythonNumpy, runReference } from "./python.js";

function benchSeries(): Series {
  const r = parseModel({ family: "ricker", params: { r: 0.9, K: 10000 } });
  if (!r.ok) throw new Error("model");
  const u = seededUniform(2026);
  const years = 40;
  const ab: number[] = [];
  const catches: number[] = [];
  let n = 8000;
  for (let t = 0; t < years; t++) {
    ab.push(n);
    const c = (0.05 + (0.55 * t) / (years - 1)) * n;
    catches.push(c);
    n =
      projectThroughCatches(r.value, "after", n, [c, 0], [0, 0])!.abundance[1]! *
      Math.exp(0.05 * standardNormal(u));
  }
  return {
    years: ab.map((_, i) => i),
    count: ab.map((a) => 0.01 * a * Math.exp(0.15 * standardNormal(u))),
    catch: catches,
    stocking: ab.map(() => 0),
    cv: ab.map(() => null),
    indices: {},
    warnings: [],
  };
}

export async function fitBench(): Promise<void> {
  const series = benchSeries();
  const p = fitProblem(series, { family: "ricker" });
  if (!p.ok) throw new Error(JSON.stringify(p.issue));
  const problem = p.value;
  let opt = optimiseFit(problem, 1, 0);
  for (let w = 0; w < 20; w++) opt = optimiseFit(problem, 1, 0);
  const { seconds, last } = await bestOf(50, () => optimiseFit(problem, 1, 0));
  opt = last;
  const ev = problem.evaluate(problem.natural(opt.x))!;
  // The same objective as scipy's: the sum of squared log residuals at the optimum.
  let sse = 0;
  series.count.forEach((y, t) => (sse += (Math.log(y!) - Math.log(ev.predicted[t]!)) ** 2));
  const natural = problem.natural(opt.x);
  console.log(
    JSON.stringify({
      bench: "ricker-fit",
      impl: "yieldloop",
      seconds,
      trials: 50,
      sse,
      params: [...natural, ev.q],
      converged: opt.converged,
    }),
  );
  if (havePythonNumpy()) {
    const dir = mkdtempSync(join(tmpdir(), "yieldloop-bench-"));
    const file = join(dir, "series.json");
    const start = problem.natural(problem.start);
    // q's start: the closed-form value at the start parameters.
    const q0 = problem.evaluate(start)!.q;
    // scipy starts from the generating values (r 0.9, K 10,000, N0 8,000, q 0.01): from
    // yieldloop's automatic start values it stops at a local optimum on this series.
    void q0;
    writeFileSync(
      file,
      JSON.stringify({ count: series.count, catch: series.catch, start: [0.9, 10000, 8000, 0.01] }),
    );
    const ref = runReference("ricker_fit_scipy.py", [file, "20"]);
    const rel = Math.abs(sse - (ref.sse as number)) / (ref.sse as number);
    console.log(
      JSON.stringify({
        ...ref,
        speedup: (ref.seconds as number) / seconds,
        objectiveRelativeDifference: rel,
        sameOptimum: rel < 1e-6,
        target: "speedup ≥ 10 at objective within 1e-6",
      }),
    );
  } else
    console.log(
      JSON.stringify({ bench: "ricker-fit", impl: "scipy", skipped: "python3 with numpy not found" }),
    );

  // All families (delay 0 and 1) on the demo lake series, then a 1,000-draw bootstrap of the best.
  const lake = parseSeriesCsv(
    readFileSync(new URL("../data-demo/tarnvell-perch/series.csv", import.meta.url), "utf8"),
  );
  if (!lake.ok) throw new Error(JSON.stringify(lake.issue));
  const t0 = process.hrtime.bigint();
  const cmp = compareModels(lake.value);
  if (!cmp.ok) throw new Error(JSON.stringify(cmp.issue));
  const t1 = process.hrtime.bigint();
  const best = cmp.value.fits[0]!;
  const boot = parametricBootstrap(lake.value, best, best.free, 1000, 7);
  const t2 = process.hrtime.bigint();
  console.log(
    JSON.stringify({
      bench: "compare-and-bootstrap",
      impl: "yieldloop",
      models: cmp.value.fits.length,
      skipped: cmp.value.skipped.length,
      best: `${best.family} T=${best.delay}`,
      draws: boot.draws.length,
      failed: boot.failed,
      compareSeconds: Number(t1 - t0) / 1e9,
      bootstrapSeconds: Number(t2 - t1) / 1e9,
      totalSeconds: Number(t2 - t0) / 1e9,
      target: "total < 2 s",
    }),
  );
}
