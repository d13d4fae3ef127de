import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { closedLoop } from "../../src/policy/closed-loop.js";
import { operatingVerdict } from "../../src/equilibria/operating-verdict.js";
import { parameterAxis, parameterPaths, withParameter } from "../../src/equilibria/parameter-path.js";
import { analyseStability } from "../../src/equilibria/stability.js";
import { equilibriumResidual, steadyState } from "../../src/equilibria/steady-state.js";
import { parseScenario } from "../../src/sim/scenario.js";
import { unwrap } from "../helpers.js";
import { GENERATED_K, laggedSpecArb, unit } from "./generated-loops.js";

// Each shortcut against its plain reference on generated scenarios of every family and rule
// kind (with delays and survey lags). Identities of the closed-loop map and of validation;
// no external source.
const K = GENERATED_K;

describe("fast paths against their plain references", () => {
  it("the one-number equilibrium residual equals the full state-vector step", () => {
    fc.assert(
      fc.property(laggedSpecArb, unit, (spec, u) => {
        const sc = unwrap(parseScenario(spec));
        const phi = equilibriumResidual(sc.loop);
        const y = new Float64Array(sc.loop.layout.dimension);
        const n = 3 * K * u;
        sc.loop.step(steadyState(sc.loop, n), y);
        expect(phi(n)).toBe(y[0]! - n);
      }),
      { numRuns: 2000, seed: 20261202 },
    );
  });

  it("the sweeps' operating verdict is the full analysis's verdict of the same equilibrium", () => {
    const verdicts = new Map<string, number>();
    fc.assert(
      fc.property(laggedSpecArb, (spec) => {
        const loop = unwrap(parseScenario(spec)).loop;
        const full = analyseStability(loop, { gridPoints: 2000 });
        const positive = full.equilibria.filter((e) => e.equilibrium.abundance > 0);
        // Past 10⁶·K the loop counts a stock as unbounded, and no equilibrium there is real.
        if (positive.some((e) => e.equilibrium.abundance > 1e6 * K)) return;
        const fast = operatingVerdict(loop);
        verdicts.set(fast.verdict, (verdicts.get(fast.verdict) ?? 0) + 1);
        if (positive.length === 0) {
          expect(fast.verdict).toBe("none");
          return;
        }
        // The largest positive equilibrium, as operatingVerdict takes it.
        const top = positive[positive.length - 1]!;
        expect(
          Math.abs(fast.abundance - top.equilibrium.abundance),
          `${JSON.stringify(spec)}: ${fast.abundance} against ${positive.map((e) => e.equilibrium.abundance)}`,
        ).toBeLessThan(1e-6 * K);
        const kind = top.verdict.kind;
        const word = kind.startsWith("stable")
          ? "stable"
          : kind.startsWith("unstable")
            ? "unstable"
            : "marginal";
        expect(fast.verdict, `${JSON.stringify(spec)}: ${kind}`).toBe(word);
      }),
      { numRuns: 600, seed: 20261203 },
    );
    // Both verdicts occur, and collapse ("none") too.
    for (const v of ["stable", "unstable", "none"]) expect(verdicts.get(v) ?? 0, v).toBeGreaterThan(10);
  });

  it("one parameter changed without re-parsing gives the loop the full parse gives, or the same refusal", () => {
    let refused = 0;
    let accepted = 0;
    fc.assert(
      fc.property(
        laggedSpecArb,
        fc.nat(),
        fc.double({ min: -0.5, max: 2.5, noNaN: true }),
        (spec, pick, f) => {
          const sc = unwrap(parseScenario(spec));
          const paths = parameterPaths(sc.model, sc.rule);
          const path = paths[pick % paths.length]!;
          const axis = unwrap(parameterAxis(sc.model, sc.rule, path));
          const value = axis.integer ? Math.round(f * 3) : axis.current * f + (f - 1) * K * 0.1;
          const fast = withParameter(sc.model, sc.rule, axis, value);
          // The plain path: the spec with the value written in, parsed from scratch.
          const edited = structuredClone(spec) as unknown as Record<string, Record<string, unknown>>;
          const [head, ...rest] = path.split(".");
          let o = edited[head!] as Record<string, unknown>;
          for (const k of rest.slice(0, -1)) o = o[k] as Record<string, unknown>;
          o[rest[rest.length - 1]!] = value;
          const plain = parseScenario(edited);
          expect(fast.ok, `${path} = ${value}`).toBe(plain.ok);
          if (!fast.ok || !plain.ok) {
            refused++;
            if (!fast.ok && !plain.ok) expect(fast.issue.code).toBe(plain.issue.code);
            return;
          }
          accepted++;
          const a = closedLoop(fast.value.model, fast.value.rule);
          const y = new Float64Array(a.layout.dimension);
          const z = new Float64Array(a.layout.dimension);
          a.step(a.initialState([0.4 * K]), y);
          plain.value.loop.step(plain.value.loop.initialState([0.4 * K]), z);
          expect(Array.from(y)).toEqual(Array.from(z));
          expect(fast.value.rule.harvest.quota(0.7 * K)).toBe(plain.value.rule.harvest.quota(0.7 * K));
        },
      ),
      { numRuns: 2000, seed: 20261204 },
    );
    expect(refused).toBeGreaterThan(50);
    expect(accepted).toBeGreaterThan(500);
  });
});
