import { describe, expect, it } from "vitest";
import fixtures from "../fixtures/projection/projection-fixtures.json" with { type: "json" };
import { parseScenario } from "../../src/sim/scenario.js";
import { project } from "../../src/sim/project.js";
import { expectClose, unwrap } from "../helpers.js";

// Hand-iterated reference: an independent plain-Python iteration of every family and rule,
// tests/fixtures/projection/make_projection_fixtures.py, with its output as the fixture.
describe("deterministic projection against the independent Python iteration", () => {
  for (const c of fixtures.cases) {
    it(c.name, () => {
      const s = unwrap(parseScenario({ model: c.model, rule: c.rule, start: c.start, horizon: c.horizon }));
      const p = project(s);
      expect(p.status).toBe("completed");
      expect(p.abundance.length).toBe(c.expected.abundance.length);
      // Same operations in another language: agreement to 1e-9 relative allows for a
      // different order of floating-point operations growing through chaotic stretches.
      for (let t = 0; t < c.expected.abundance.length; t++) {
        expectClose(p.abundance[t]!, c.expected.abundance[t]!, 1e-9, `${c.name}: N[${t}]`);
      }
      for (let t = 0; t < c.horizon; t++) {
        expectClose(p.catch[t]!, c.expected.catch[t]!, 1e-9, `${c.name}: C[${t}]`);
        expectClose(p.quota[t]!, c.expected.quota[t]!, 1e-9, `${c.name}: Q[${t}]`);
        expectClose(p.survey[t]!, c.expected.survey[t]!, 1e-9, `${c.name}: y[${t}]`);
      }
    });
  }
});
