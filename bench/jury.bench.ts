// Jury verdicts for 10,000 random degree-6 polynomials, against numpy.roots and a
// plain-Python Jury table run on the same polynomials (bench/reference/).
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { juryVerdict } from "../src/equilibria/jury-verdict.js";
import { seededUniform } from "../src/sim/rng.js";
import { bestOf } from "./best-of.js";
import { havePythonNumpy, runReference } from "./python.js";

/** Monic real degree-6 polynomials from roots of modulus U(0, 1.08): about 60% stable. */
export function randomPolynomials(count: number, seed: number): number[][] {
  const u = seededUniform(seed);
  const out: number[][] = [];
  for (let k = 0; k < count; k++) {
    let re = [1];
    let im = [0];
    const roots: [number, number][] = [];
    while (roots.length < 6) {
      const rho = 1.08 * u();
      if (roots.length <= 4 && u() < 0.5) {
        const th = Math.PI * u();
        roots.push([rho * Math.cos(th), rho * Math.sin(th)], [rho * Math.cos(th), -rho * Math.sin(th)]);
      } else roots.push([u() < 0.5 ? rho : -rho, 0]);
    }
    for (const [a, b] of roots) {
      const nr = new Array<number>(re.length + 1).fill(0);
      const ni = new Array<number>(re.length + 1).fill(0);
      for (let i = 0; i < re.length; i++) {
        nr[i]! += re[i]!;
        ni[i]! += im[i]!;
        nr[i + 1]! -= re[i]! * a - im[i]! * b;
        ni[i + 1]! -= re[i]! * b + im[i]! * a;
      }
      re = nr;
      im = ni;
    }
    out.push(re);
  }
  return out;
}

export async function juryBench(): Promise<void> {
  const polys = randomPolynomials(10_000, 20261201);
  const flat = polys.map((p) => Float64Array.from(p));
  let verdicts: number[] = [];
  for (let w = 0; w < 20; w++) verdicts = flat.map((p) => juryVerdict(p));
  // Best of 10 trials of 20 passes over the 10,000 polynomials.
  const repeats = 20;
  const { seconds, last: stable } = await bestOf(10, () => {
    let s = 0;
    for (let r = 0; r < repeats; r++)
      for (let i = 0; i < flat.length; i++) if (juryVerdict(flat[i]!) === 1) s++;
    return s;
  });
  const rate = (repeats * flat.length) / seconds;
  console.log(
    JSON.stringify({
      bench: "jury-verdicts",
      impl: "yieldloop",
      polynomials: flat.length,
      repeats,
      trials: 10,
      bestSeconds: seconds,
      verdictsPerSecond: rate,
      stableFraction: stable / (repeats * flat.length),
      target: 1e7,
    }),
  );
  if (!havePythonNumpy()) {
    console.log(
      JSON.stringify({ bench: "jury-verdicts", impl: "reference", skipped: "python3 with numpy not found" }),
    );
    return;
  }
  const dir = mkdtempSync(join(tmpdir(), "yieldloop-bench-"));
  const file = join(dir, "polynomials.json");
  writeFileSync(file, JSON.stringify(polys));
  for (const script of ["jury_numpy_roots.py", "jury_plain_python.py"]) {
    const ref = runReference(script, [file]);
    const theirs = ref.verdicts as number[];
    // Roots within 1e-9 of the circle could legitimately differ; count disagreements.
    let disagree = 0;
    for (let i = 0; i < theirs.length; i++) if ((verdicts[i] === 1 ? 1 : -1) !== theirs[i]) disagree++;
    const { verdicts: _v, ...summary } = ref;
    console.log(
      JSON.stringify({
        ...summary,
        sameVerdicts: disagree === 0,
        disagreements: disagree,
        speedup: rate / (ref.verdictsPerSecond as number),
      }),
    );
  }
}
