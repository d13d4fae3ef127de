// Generates the invented demonstration series from documented models, parameters and seeds.
//   npx tsx data-demo/generate.ts
// Every place, stock and number here is made up; nothing is real data.
import { writeFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { parseModel } from "../src/models/model-spec.js";
import { projectThroughCatches } from "../src/sim/catch-driven.js";
import { seededUniform, standardNormal } from "../src/sim/rng.js";

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

function must<T>(r: { ok: true; value: T } | { ok: false; issue: unknown }): T {
  if (!r.ok) throw new Error(JSON.stringify(r.issue));
  return r.value;
}

/** Lake perch: Ricker r = 1.1, K = 12,000 fish; a rate rising 5% → 45%; stocking 300/yr in years 10–19. */
function perch(): string {
  const u = seededUniform(11);
  const model = must(parseModel({ family: "ricker", params: { r: 1.1, K: 12000 } }));
  const years = 32;
  const catches: number[] = [];
  const stocking: number[] = [];
  let n = 9000;
  const abundance: number[] = [];
  for (let t = 0; t < years; t++) {
    const rate = 0.05 + (0.4 * t) / (years - 1);
    // Process noise: lognormal, sd 0.1; the catch is the rate applied to that year's stock.
    abundance.push(n);
    const c = Math.round(rate * n);
    catches.push(c);
    stocking.push(t >= 10 && t < 20 ? 300 : 0);
    const step = projectThroughCatches(model, "after", n, [c, 0], [stocking[t]!, 0])!;
    n = step.abundance[1]! * Math.exp(0.1 * standardNormal(u));
  }
  const lines = ["year,count,catch,stocking,cv"];
  for (let t = 0; t < years; t++) {
    // Net survey index: q = 0.02 of the stock, lognormal observation error with cv 0.2.
    const index = 0.02 * abundance[t]! * Math.exp(0.198 * standardNormal(u) - 0.0196);
    const missing = t === 7 || t === 21; // two survey years lost to storms
    lines.push(`${1994 + t},${missing ? "" : index.toFixed(1)},${catches[t]},${stocking[t]},0.2`);
  }
  return `${lines.join("\n")}\n`;
}

/** Island deer: Beverton–Holt R0 = 1.6, K = 2,400 deer; culls 60–420 a year; full counts with Poisson error. */
function deer(): string {
  const u = seededUniform(7);
  const model = must(parseModel({ family: "beverton-holt", params: { R0: 1.6, K: 2400 } }));
  const years = 28;
  let n = 700;
  const lines = ["year,count,catch"];
  for (let t = 0; t < years; t++) {
    const cull = t < 10 ? 60 : t < 18 ? 420 : 180;
    // Poisson count by normal approximation (n is large), rounded.
    const count = Math.max(0, Math.round(n + Math.sqrt(n) * standardNormal(u)));
    lines.push(`${2000 + t},${count},${cull}`);
    const step = projectThroughCatches(model, "before", n, [cull, 0], [0, 0])!;
    n = step.abundance[1]! * Math.exp(0.05 * standardNormal(u));
  }
  return `${lines.join("\n")}\n`;
}

writeFileSync(here("./tarnvell-perch/series.csv"), perch());
writeFileSync(here("./skerra-deer/series.csv"), deer());
