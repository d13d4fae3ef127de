// `yieldloop help models` and `yieldloop help rules`: the catalogue in words, from the same
// description the schemas, the API and the page use.
import { catalogue } from "../../src/catalogue.js";
import { rangeText } from "../../src/issues.js";
import type { ParamInfo } from "../../src/params.js";

function settingLine(s: ParamInfo, path: string): string {
  const unit = s.unitKind === "dimensionless" ? "" : `, ${s.unit}`;
  return `    ${path.padEnd(30)} ${s.label}${unit}; allowed ${rangeText(s)}${s.integer ? ", whole numbers" : ""}`;
}

/** The growth families with their equations and parameters. */
export function modelsHelp(): string {
  const c = catalogue();
  const lines = ["growth families (the scenario's model.family) and their parameters (model.params):", ""];
  for (const f of c.families) {
    lines.push(`  ${f.id} — ${f.label}: ${f.equation}`);
    for (const p of f.params) lines.push(settingLine(p, `model.params.${p.name}`));
    for (const o of f.constraints) lines.push(`    (${o.lower} must be below ${o.upper})`);
  }
  lines.push("", "every family:", settingLine(c.delay, "model.delay"));
  return lines.join("\n");
}

/** The harvest rule kinds with their settings. */
export function rulesHelp(): string {
  const c = catalogue();
  const lines = ["harvest rules (the scenario's rule.kind) and their settings:", ""];
  for (const r of c.rules) {
    lines.push(`  ${r.kind} — ${r.label}: ${r.equation}`);
    for (const s of r.settings) lines.push(settingLine(s, `rule.${s.name}`));
    for (const o of r.constraints) lines.push(`    (${o.lower} must be below ${o.upper})`);
  }
  lines.push("", "every rule:");
  for (const s of c.ruleCommon) lines.push(settingLine(s, `rule.${s.name}`));
  lines.push(
    `    ${"rule.timing".padEnd(30)} ${c.timings.map((t) => `"${t.value}" (${t.label})`).join(" or ")}`,
  );
  for (const s of c.quotaChange) lines.push(settingLine(s, `rule.quotaChange.${s.name}`));
  return lines.join("\n");
}
