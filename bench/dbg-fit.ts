import { readFileSync } from "node:fs";
import { parseSeriesCsv } from "../src/fit/series.js";
import { fitSeries } from "../src/fit/fit-series.js";
for (const [file, family, timing, lik] of [["data-demo/tarnvell-perch/series.csv", "ricker", "after", "lognormal"], ["data-demo/skerra-deer/series.csv", "beverton-holt", "before", "poisson"]] as const) {
  const s = parseSeriesCsv(readFileSync(file, "utf8"));
  if (!s.ok) throw new Error(JSON.stringify(s.issue));
  const t0 = performance.now();
  const f = fitSeries(s.value, { family, timing, likelihood: lik });
  const ms = performance.now() - t0;
  if (!f.ok) { console.log(JSON.stringify(f.issue)); continue; }
  const v = f.value;
  console.log(file, ms.toFixed(0) + "ms", JSON.stringify(v.estimates), "q", v.q, "se", JSON.stringify(v.standardErrors), "aicc", v.aicc.toFixed(2), JSON.stringify(v.convergence), JSON.stringify(v.management), JSON.stringify(v.identifiability), JSON.stringify(v.diagnostics));
}
