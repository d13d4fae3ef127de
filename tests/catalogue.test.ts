import { readdirSync, readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { catalogue } from "../src/catalogue.js";
import { FAMILY_IDS } from "../src/models/families.js";
import { modelSpecSchema, parseModel } from "../src/models/model-spec.js";
import { defaultValue, type ParamInfo } from "../src/params.js";
import { RULE_KINDS } from "../src/policy/rule-catalogue.js";
import { parseRule } from "../src/policy/rule-spec.js";
import { KERNEL_FAMILIES, KERNEL_RULES } from "../src/sim/wasm/kernel-layout.js";
import { testRuntime } from "./server/helpers.js";

// The catalogue is the one description of families, rules and settings: the schemas, the
// kernel table, the API and the page must agree with it (an internal consistency check).
const cat = catalogue();
const K = 1000;

/** A value just outside a setting's allowed range, above or below. */
function outside(s: ParamInfo, side: "above" | "below"): number {
  if (side === "above") return s.maxInclusive ? s.max + Math.max(1, Math.abs(s.max)) * 1e-3 : s.max;
  return s.minInclusive ? s.min - Math.max(1, Math.abs(s.min)) * 1e-3 : s.min;
}

describe("the catalogue", () => {
  it("lists the same families and rule kinds as the schemas and the kernel table", () => {
    const ids = cat.families.map((f) => f.id);
    expect(ids).toEqual([...FAMILY_IDS]);
    expect([...modelSpecSchema.options.map((o) => o.shape.family.value)]).toEqual(ids);
    expect(Object.keys(KERNEL_FAMILIES).sort()).toEqual([...ids].sort());
    const kinds = cat.rules.map((r) => r.kind);
    expect(kinds).toEqual([...RULE_KINDS]);
    expect(Object.keys(KERNEL_RULES).sort()).toEqual([...kinds].sort());
  });

  it("gives every family's defaults as a valid model, and the schema refuses each parameter past its range", () => {
    for (const f of cat.families) {
      const params = Object.fromEntries(f.params.map((p) => [p.name, defaultValue(p, K)]));
      expect(parseModel({ family: f.id, params }).ok, f.id).toBe(true);
      for (const p of f.params) {
        for (const side of ["above", "below"] as const) {
          if (side === "above" && p.max >= 1e12) continue;
          const r = parseModel({ family: f.id, params: { ...params, [p.name]: outside(p, side) } });
          expect(r.ok, `${f.id}.${p.name} ${side}`).toBe(false);
          if (!r.ok && r.issue.code === "param_out_of_range")
            expect(r.issue).toMatchObject({ field: `model.params.${p.name}`, min: p.min, max: p.max });
          else if (!r.ok) expect(r.issue.code).toBe("settings_out_of_order");
        }
      }
    }
  });

  it("gives every rule kind's defaults as a valid rule, and the schema refuses each setting past its range", () => {
    for (const r of cat.rules) {
      const spec = Object.fromEntries([
        ["kind", r.kind],
        ...r.settings.map((s) => [s.name, defaultValue(s, K)]),
      ]);
      expect(parseRule(spec).ok, r.kind).toBe(true);
      for (const s of [...r.settings, ...cat.ruleCommon]) {
        for (const side of ["above", "below"] as const) {
          if (side === "above" && s.max >= 1e12) continue;
          const bad = parseRule({ ...spec, [s.name]: outside(s, side) });
          expect(bad.ok, `${r.kind}.${s.name} ${side}`).toBe(false);
          if (!bad.ok && bad.issue.code === "param_out_of_range")
            expect(bad.issue).toMatchObject({ field: `rule.${s.name}`, min: s.min, max: s.max });
          else if (!bad.ok) expect(["settings_out_of_order", "not_an_integer"]).toContain(bad.issue.code);
        }
      }
    }
  });

  it("states each order constraint, and the schema enforces it", () => {
    const threshold = cat.rules.find((r) => r.kind === "threshold")!;
    expect(threshold.constraints).toEqual([
      { lower: "lowerTrigger", upper: "upperTrigger", field: "upperTrigger" },
    ]);
    const swapped = parseRule({ kind: "threshold", lowerTrigger: 500, upperTrigger: 200, maxRate: 0.3 });
    expect(swapped.ok || swapped.issue.code).toBe("settings_out_of_order");
    const allee = cat.families.find((f) => f.id === "allee-ricker")!;
    expect(allee.constraints).toEqual([{ lower: "A", upper: "K", field: "A" }]);
  });

  it("is served whole at GET /api/v1/catalogue", async () => {
    const { rt, api } = testRuntime();
    try {
      const r = await api.get("/api/v1/catalogue").expect(200);
      expect(r.body).toEqual(JSON.parse(JSON.stringify(cat)));
    } finally {
      await rt.close();
    }
  });

  it("is the page's only source of family ids, rule kinds and setting names", () => {
    const dir = new URL("../client/src/", import.meta.url);
    const files = readdirSync(dir, { recursive: true, withFileTypes: true })
      .filter((d) => d.isFile() && d.name.endsWith(".ts"))
      .map((d) => readFileSync(`${d.parentPath}/${d.name}`, "utf8"));
    const names = [
      ...cat.families.map((f) => f.id),
      ...cat.rules.map((r) => r.kind),
      ...cat.rules.flatMap((r) => r.settings.map((s) => s.name)),
    ];
    for (const text of files) for (const n of names) expect(text, n).not.toContain(`"${n}"`);
  });
});
