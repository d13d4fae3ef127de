import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { catalogue } from "../../src/catalogue.js";
import { describe, expect, it } from "vitest";

// The command line's documented behaviour (README and `yieldloop help`): output formats
// and exit codes. No external source: these are the program's own contract.
const bin = fileURLToPath(new URL("../../bin/yieldloop.mjs", import.meta.url));
const demo = (p: string) => fileURLToPath(new URL(`../../data-demo/${p}`, import.meta.url));
const run = (...args: string[]) =>
  spawnSync(process.execPath, [bin, ...args], {
    encoding: "utf8",
    env: { ...process.env, YIELDLOOP_TOKEN: "" },
  });
const tmp = mkdtempSync(join(tmpdir(), "yieldloop-cli-"));

// Each case starts one or more real processes, so each gets 60 s on a loaded machine.
describe("yieldloop command line", { timeout: 60_000 }, () => {
  it("check: a verdict in plain words, the margin and the caution (exit 0)", () => {
    const r = run("check", demo("scenarios/skerra-deer.json"));
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/Operating equilibrium 2,006: stable \(monotone return\)/);
    expect(r.stdout).toMatch(/Stability margin in the annual quota Q \(rule\.quota, now 180\)/);
    expect(r.stdout).toMatch(/management authority/);
  });
  it("project --json --out: JSON on stdout, the per-year table as RFC 4180 CSV", () => {
    const out = join(tmp, "projection.csv");
    const r = run(
      "project",
      demo("scenarios/skerra-deer.json"),
      "--replicates",
      "200",
      "--workers",
      "1",
      "--json",
      "--out",
      out,
    );
    expect(r.status).toBe(0);
    const p = JSON.parse(r.stdout);
    expect(p.replicates).toBe(200);
    expect(p.years).toHaveLength(21);
    const lines = readFileSync(out, "utf8").split("\r\n");
    expect(lines[0]!.startsWith("year,abundance p5 (stock units)")).toBe(true);
    expect(lines[1]!.startsWith("2028,780,")).toBe(true);
  });
  it("project as text: years as written (2028, not 2,028), quantities with separators", () => {
    const r = run(
      "project",
      demo("scenarios/skerra-deer.json"),
      "--replicates",
      "200",
      "--workers",
      "1",
      "--seed",
      "2028",
    );
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^seed +2028 /m);
    expect(r.stdout).toMatch(/^2028 +780 /m);
    expect(r.stdout).toMatch(/^2048 /m);
    expect(r.stdout).not.toMatch(/^2,0\d\d/m);
    expect(r.stdout).toMatch(/\d,\d{3}/); // abundances above 1,000 keep their separator
  });
  it("compare: the scenario's own rule and its alternatives, one row each", () => {
    const r = run(
      "compare",
      demo("scenarios/skerra-deer.json"),
      "--replicates",
      "200",
      "--workers",
      "1",
      "--json",
    );
    expect(r.status).toBe(0);
    const rows = JSON.parse(r.stdout);
    expect(rows).toHaveLength(4);
    expect(rows[3].verdict).toBe("collapse"); // 420 a year is above the herd's largest surplus
  });
  it("fit: a ranking of the models", () => {
    const r = run(
      "fit",
      demo("skerra-deer/series.csv"),
      "--families",
      "beverton-holt,ricker",
      "--delays",
      "0",
      "--likelihood",
      "poisson",
      "--timing",
      "before",
      "--json",
    );
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).fits).toHaveLength(2);
  });
  it("map: cells to CSV", () => {
    const out = join(tmp, "map.csv");
    const r = run(
      "map",
      demo("scenarios/skerra-deer.json"),
      "--x",
      "model.params.R0:1.2:3:6",
      "--y",
      "rule.quota:0:500:5",
      "--workers",
      "1",
      "--out",
      out,
    );
    expect(r.status).toBe(0);
    expect(readFileSync(out, "utf8").split("\r\n")).toHaveLength(1 + 30 + 1);
  });
  it("exit 1 for rejected input, naming the field or row", () => {
    const bad = run("project", demo("scenarios/skerra-deer.json"), "--replicates", "5");
    expect(bad.status).toBe(1);
    expect(bad.stderr).toMatch(/uncertainty\.replicates = 5 is outside the allowed range \[10, 1000000\]/);
    const csv = run("fit", fileURLToPath(new URL("../../package.json", import.meta.url)));
    expect(csv.status).toBe(1);
  });
  it("exit 2 for a wrong command line, and serve refuses a public address without a token", () => {
    expect(run("frobnicate").status).toBe(2);
    expect(run("check").status).toBe(2);
    expect(run("check", "x.json", "--colour").status).toBe(2);
    const s = run("serve", "--host", "0.0.0.0", "--db", join(tmp, "x.db"));
    expect(s.status).toBe(2);
    expect(s.stderr).toMatch(/needs an API token/);
    expect(run("help").status).toBe(0);
  });
  it("help models and help rules list the catalogue: every family, rule kind and setting with its label", () => {
    const cat = catalogue();
    const models = run("help", "models");
    expect(models.status).toBe(0);
    for (const f of cat.families) {
      expect(models.stdout).toContain(`${f.id} — ${f.label}`);
      for (const p of f.params) expect(models.stdout).toContain(`model.params.${p.name}`);
    }
    const rules = run("help", "rules");
    expect(rules.status).toBe(0);
    for (const r of cat.rules) {
      expect(rules.stdout).toContain(`${r.kind} — ${r.label}`);
      for (const s2 of r.settings) expect(rules.stdout).toContain(`${s2.label}, ${s2.unit}`);
    }
  });
});
