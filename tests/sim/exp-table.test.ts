import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { expTable } from "../../src/sim/exp-table.js";

// The table the kernel's two-lane exp reads, built here with integer arithmetic, against the
// table of musl's exp as AssemblyScript ships it (std/assembly/util/math.ts, EXP_DATA_TAB;
// source: musl libc src/math/exp_data.c, from ARM optimized-routines). Equal entries make
// the two-lane exp give Math.exp's numbers in the kernel bit for bit.
describe("exp table", () => {
  it("equals musl's __exp_data table, all 256 words", () => {
    const src = readFileSync(
      new URL("../../node_modules/assemblyscript/std/assembly/util/math.ts", import.meta.url),
      "utf8",
    );
    const at = src.indexOf("EXP_DATA_TAB = memory.data");
    expect(at).toBeGreaterThan(0);
    const words = [...src.slice(at, src.indexOf("]);", at)).matchAll(/0x([0-9A-Fa-f]{16})/g)].map((m) =>
      BigInt(`0x${m[1]}`),
    );
    expect(words.length).toBe(256);
    expect(Array.from(expTable())).toEqual(words);
  });
});
