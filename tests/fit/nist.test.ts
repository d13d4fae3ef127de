import { describe, expect, it } from "vitest";
import { minimise } from "../../src/fit/minimise.js";
import { seededUniform } from "../../src/sim/rng.js";

// NIST Statistical Reference Datasets, nonlinear regression (public domain):
//   Misra1a  (lower difficulty)  https://www.itl.nist.gov/div898/strd/nls/data/misra1a.shtml
//   Rat42    (higher difficulty) https://www.itl.nist.gov/div898/strd/nls/data/ratkowsky2.shtml
//   BoxBOD   (higher difficulty) https://www.itl.nist.gov/div898/strd/nls/data/boxbod.shtml
// Data, both NIST start vectors and the certified values are those of the datasets' files.
// Each fit must reach the certified parameters to 6 significant digits (relative 1e-6 — the
// issue's requirement) and the certified residual sum of squares to 1e-9 relative.

interface Problem {
  name: string;
  model: (b: readonly number[], x: number) => number;
  x: number[];
  y: number[];
  starts: number[][];
  certified: number[];
  rss: number;
}

const problems: Problem[] = [
  {
    name: "Misra1a",
    model: (b, x) => b[0]! * (1 - Math.exp(-b[1]! * x)),
    x: [77.6, 114.9, 141.1, 190.8, 239.9, 289.0, 332.8, 378.4, 434.8, 477.3, 536.8, 593.1, 689.1, 760.0],
    y: [10.07, 14.73, 17.94, 23.93, 29.61, 35.18, 40.02, 44.82, 50.76, 55.05, 61.01, 66.4, 75.47, 81.78],
    starts: [
      [500, 1e-4],
      [250, 5e-4],
    ],
    certified: [2.3894212918e2, 5.5015643181e-4],
    rss: 1.2455138894e-1,
  },
  {
    name: "Rat42",
    model: (b, x) => b[0]! / (1 + Math.exp(b[1]! - b[2]! * x)),
    x: [9, 14, 21, 28, 42, 57, 63, 70, 79],
    y: [8.93, 10.8, 18.59, 22.33, 39.35, 56.11, 61.73, 64.62, 67.08],
    starts: [
      [100, 1, 0.1],
      [75, 2.5, 0.07],
    ],
    certified: [7.2462237576e1, 2.6180768402, 6.7359200066e-2],
    rss: 8.0565229338,
  },
  {
    name: "BoxBOD",
    model: (b, x) => b[0]! * (1 - Math.exp(-b[1]! * x)),
    x: [1, 2, 3, 5, 7, 10],
    y: [109, 149, 149, 191, 213, 224],
    starts: [
      [1, 1],
      [100, 0.75],
    ],
    certified: [2.1380940889e2, 5.4723748542e-1],
    rss: 1.1680088766e3,
  },
];

describe("optimiser against NIST StRD nonlinear regression", () => {
  for (const p of problems) {
    p.starts.forEach((start, k) => {
      it(`${p.name} from NIST start ${k + 1} reaches the certified values to 6 significant digits`, () => {
        const rss = (b: readonly number[]) => {
          let s = 0;
          for (let i = 0; i < p.x.length; i++) {
            const r = p.y[i]! - p.model(b, p.x[i]!);
            s += r * r;
          }
          return s;
        };
        const res = minimise(rss, start, { random: seededUniform(17), extraStarts: 8 });
        expect(res.converged).toBe(true);
        p.certified.forEach((c, i) => {
          const rel = Math.abs(res.x[i]! - c) / Math.abs(c);
          expect(rel, `${p.name} b${i + 1}: certified ${c}, found ${res.x[i]}`).toBeLessThan(1e-6);
        });
        expect(Math.abs(res.value - p.rss) / p.rss).toBeLessThan(1e-9);
      });
    });
  }
});
