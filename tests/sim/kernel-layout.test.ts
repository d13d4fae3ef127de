import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { catalogue } from "../../src/catalogue.js";
import { FAMILY_IDS } from "../../src/models/families.js";
import { RULE_KINDS } from "../../src/policy/rule-catalogue.js";
import {
  constantName,
  KERNEL_ARRAYS,
  KERNEL_CONFIG,
  KERNEL_FAMILIES,
  KERNEL_RULES,
  kernelLayoutSource,
} from "../../src/sim/wasm/kernel-layout.js";

// The projection kernel's layout table against the catalogue and the kernel's own source
// (an internal consistency check; the kernel's numbers are checked against the TypeScript
// loop in projection-kernel.test.ts).
const kernelSource = readFileSync(
  new URL("../../src/sim/wasm/projection-kernel.ts", import.meta.url),
  "utf8",
);
const generated = readFileSync(
  new URL("../../src/sim/wasm/kernel-layout.generated.ts", import.meta.url),
  "utf8",
);

describe("the projection kernel's layout table", () => {
  it("has an entry, kernel or 'typescript-loop-only', for every family and rule kind of the catalogue", () => {
    expect(Object.keys(KERNEL_FAMILIES).sort()).toEqual([...FAMILY_IDS].sort());
    expect(Object.keys(KERNEL_RULES).sort()).toEqual([...RULE_KINDS].sort());
    for (const e of [...Object.values(KERNEL_FAMILIES), ...Object.values(KERNEL_RULES)]) {
      expect(e === "typescript-loop-only" || (typeof e === "object" && Number.isInteger(e.code))).toBe(true);
    }
  });

  it("gives every kernel family and rule kind a code of its own", () => {
    const codes = (entries: object) =>
      Object.values(entries)
        .filter((e) => e !== "typescript-loop-only")
        .map((e) => (e as { code: number }).code);
    for (const c of [codes(KERNEL_FAMILIES), codes(KERNEL_RULES)]) expect(new Set(c).size).toBe(c.length);
  });

  it("is the table the kernel was compiled with (the generated constants are written from it)", () => {
    expect(generated).toBe(kernelLayoutSource());
  });

  it("has a case in the kernel for every family and rule kind it says the kernel runs", () => {
    for (const [id, e] of Object.entries(KERNEL_FAMILIES)) {
      if (e === "typescript-loop-only") continue;
      expect(kernelSource, `family ${id}`).toContain(`case FAMILY_${constantName(id)}:`);
    }
    for (const [kind, e] of Object.entries(KERNEL_RULES)) {
      // No harvest is the kernel's default case (a zero quota).
      if (e === "typescript-loop-only" || kind === "no-harvest") continue;
      expect(kernelSource, `rule ${kind}`).toContain(`case RULE_${constantName(kind)}:`);
    }
  });

  it("has every setting and array read by the kernel's configure() from its named slot", () => {
    for (const name of KERNEL_CONFIG)
      expect(kernelSource).toContain(`load<f64>(cfg + CFG_${constantName(name)})`);
    for (const name of KERNEL_ARRAYS)
      expect(kernelSource).toContain(`load<u32>(ptr + PTR_${constantName(name)})`);
    // Nothing is read from a slot by number.
    expect(kernelSource).not.toMatch(/load<(f64|u32)>\((cfg|ptr), \d+\)/);
  });

  it("agrees with the catalogue on which families and rules run in the kernel", () => {
    for (const f of catalogue().families) {
      expect(f.projection).toBe(
        KERNEL_FAMILIES[f.id as keyof typeof KERNEL_FAMILIES] === "typescript-loop-only"
          ? "typescript-loop-only"
          : "kernel",
      );
    }
    for (const r of catalogue().rules) {
      expect(r.projection).toBe(
        KERNEL_RULES[r.kind as keyof typeof KERNEL_RULES] === "typescript-loop-only"
          ? "typescript-loop-only"
          : "kernel",
      );
    }
  });

  it("names constants as the generated source does", () => {
    expect(constantName("beverton-holt")).toBe("BEVERTON_HOLT");
    expect(constantName("sdP")).toBe("SD_P");
    expect(constantName("recoveryTarget")).toBe("RECOVERY_TARGET");
  });
});
