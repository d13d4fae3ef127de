// The analysis subcommands: fit, check, project, compare, map. They call src/ (directly or
// on the worker pool) and print plain text, JSON (--json) or write CSV (--out).
import { readFileSync, writeFileSync } from "node:fs";
import { compareModels } from "../../src/fit/compare-models.js";
import { parseSeriesCsv } from "../../src/fit/series.js";
import { FAMILY_IDS, type FamilyId } from "../../src/models/families.js";
import { describeIssue, type Issue } from "../../src/issues.js";
import { stabilityMargin } from "../../src/equilibria/margin.js";
import { parameterAxis } from "../../src/equilibria/parameter-path.js";
import { analyseStability } from "../../src/equilibria/stability.js";
import { RULE_CATALOGUE } from "../../src/policy/rule-catalogue.js";
import { toCsv, type Cell } from "../export/csv.js";
import { CAUTION } from "../export/report.js";
import { ISSUE_TABLE } from "../issue-table.js";
import { formatCell, formatNumber } from "../export/text.js";
import { scenarioOnly } from "../http/scenario-input.js";
import { comparisonTable, projectionTable, riskTable, type Table } from "../export/tables.js";
import { jsonSafe } from "../http/json-safe.js";
import { createAnalysisPool } from "../workers/pool.js";
import { CliError, EXIT } from "./exit-codes.js";
import { progressBar } from "./progress-bar.js";
import { readJsonFile, readScenarioFile } from "./scenario-file.js";

export interface CommonOptions {
  readonly json?: boolean;
  readonly out?: string;
}

const print = (s: string) => process.stdout.write(s.endsWith("\n") ? s : `${s}\n`);
const fmt = (v: unknown) => formatNumber(v);

function rejected(issue: Issue, where: string): never {
  throw new CliError(
    `${where}: ${ISSUE_TABLE[issue.code].title}: ${describeIssue(issue)}`,
    EXIT.invalidInput,
  );
}

function emit(o: CommonOptions, value: unknown, table: Table | null, text: () => string): void {
  if (o.out) {
    if (!table)
      throw new CliError("--out writes a CSV table; this command has none (use --json)", EXIT.usage);
    writeFileSync(o.out, toCsv(table.header, table.rows));
  }
  if (o.json) print(JSON.stringify(jsonSafe(value), null, 2));
  else print(text());
}

function textTable(t: Table): string {
  const cells = [t.header, ...t.rows.map((r) => r.map((c, i) => formatCell(t.header[i], c)))];
  const widths = t.header.map((_, i) => Math.max(...cells.map((r) => (r[i] ?? "").length)));
  return cells
    .map((r) => r.map((c, i) => (i === 0 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join("  "))
    .join("\n");
}

async function withPool<T>(
  workers: number,
  label: string,
  work: (
    pool: ReturnType<typeof createAnalysisPool>,
    bar: ReturnType<typeof progressBar>,
    signal: AbortSignal,
  ) => Promise<T>,
): Promise<T> {
  const pool = createAnalysisPool(workers);
  const bar = progressBar(label);
  const controller = new AbortController();
  const interrupt = () => controller.abort();
  process.once("SIGINT", interrupt);
  try {
    return await work(pool, bar, controller.signal);
  } catch (e) {
    if (controller.signal.aborted) throw new CliError("interrupted", EXIT.interrupted);
    throw e;
  } finally {
    process.off("SIGINT", interrupt);
    bar.end();
    await pool.close();
  }
}

export function fitCommand(
  file: string,
  o: CommonOptions & {
    families?: string;
    delays?: string;
    likelihood?: string;
    timing?: string;
    method?: string;
  },
): void {
  let csv: string;
  try {
    csv = readFileSync(file, "utf8");
  } catch (e) {
    throw new CliError(`cannot read ${file}: ${(e as Error).message}`, EXIT.invalidInput);
  }
  const series = parseSeriesCsv(csv);
  if (!series.ok) rejected(series.issue, file);
  const families = o.families?.split(",").map((s) => s.trim());
  for (const f of families ?? [])
    if (!(FAMILY_IDS as readonly string[]).includes(f))
      throw new CliError(`--families: "${f}" is not one of ${FAMILY_IDS.join(", ")}`, EXIT.usage);
  const delays = o.delays?.split(",").map(Number);
  if (delays?.some((d) => !Number.isInteger(d) || d < 0 || d > 3))
    throw new CliError("--delays: give whole numbers from 0 to 3, e.g. 0,1", EXIT.usage);
  const r = compareModels(series.value, {
    ...(families ? { families: families as FamilyId[] } : {}),
    ...(delays ? { delays } : {}),
    ...(o.likelihood ? { likelihood: o.likelihood as never } : {}),
    ...(o.timing ? { timing: o.timing as never } : {}),
    ...(o.method ? { method: o.method as never } : {}),
  });
  if (!r.ok) rejected(r.issue, file);
  const table: Table = {
    header: [
      "model",
      "AICc",
      "delta AICc",
      "Akaike weight",
      "r or R0",
      "K (stock units)",
      "unharvested verdict",
    ],
    rows: r.value.fits.map((f) => [
      `${f.family}${f.delay ? ` delay ${f.delay}` : ""}`,
      f.aicc,
      f.deltaAicc,
      f.weight,
      f.estimates.r ?? f.estimates.R0 ?? null,
      f.estimates.K ?? null,
      f.management.verdictLabel,
    ]),
  };
  emit(
    o,
    r.value,
    table,
    () =>
      `${r.value.converged ? textTable(table) : "No model could be fitted to this series."}\n\n${r.value.skipped.length ? `not fitted: ${r.value.skipped.map((s) => `${s.family} (delay ${s.delay}): ${s.detail}`).join("; ")}\n` : ""}`,
  );
}

export function checkCommand(file: string, o: CommonOptions): void {
  const sf = readScenarioFile(file);
  const { model, rule, loop } = sf.scenario;
  const a = analyseStability(loop);
  const m = stabilityMargin(model, rule, RULE_CATALOGUE[rule.kind].main);
  // The words for the setting, from the catalogue (the path stays beside them for scripts).
  const axis = parameterAxis(model, rule, RULE_CATALOGUE[rule.kind].main);
  const marginLabel = axis.ok ? axis.value.info.label : RULE_CATALOGUE[rule.kind].main;
  const table: Table = {
    header: ["equilibrium (stock units)", "verdict", "dominant |λ|", "return time (years)", "period (years)"],
    rows: a.equilibria.map((e) => [
      e.equilibrium.abundance,
      e.verdict.label,
      e.verdict.dominantModulus,
      e.verdict.returnTime,
      e.verdict.period,
    ]),
  };
  emit(o, { analysis: a, margin: m.ok ? m.value : null }, table, () => {
    const op = a.operating === null ? null : a.equilibria[a.operating]!;
    const lines = [sf.title, "", textTable(table), ""];
    lines.push(
      op
        ? `Operating equilibrium ${fmt(op.equilibrium.abundance)}: ${op.verdict.label}. ${op.verdict.meaning}`
        : "No positive equilibrium: under this rule the stock collapses.",
    );
    if (m.ok) {
      const side = (s: typeof m.value.increase) =>
        s.boundary === null
          ? `no change up to ${fmt(s.searchedTo)}`
          : `changes at ${fmt(s.boundary)} (${s.kind})`;
      lines.push(
        `Stability margin in the ${marginLabel} (${m.value.parameter}, now ${fmt(m.value.current)}): raising it ${side(m.value.increase)}; lowering it ${side(m.value.decrease)}.`,
      );
    }
    lines.push("", CAUTION);
    return lines.join("\n");
  });
}

function uncertaintyOf(
  spec: Record<string, unknown>,
  o: { replicates?: string; seed?: string },
): Record<string, unknown> {
  const u: Record<string, unknown> = {
    replicates: 1000,
    seed: 1,
    ...((spec.uncertainty as Record<string, unknown> | undefined) ?? {}),
  };
  if (o.replicates !== undefined) u.replicates = Number(o.replicates);
  if (o.seed !== undefined) u.seed = Number(o.seed);
  return u;
}

export async function projectCommand(
  file: string,
  o: CommonOptions & { replicates?: string; seed?: string; workers?: string },
): Promise<void> {
  const sf = readScenarioFile(file);
  const uncertainty = uncertaintyOf(sf.spec, o);
  const r = await withPool(Number(o.workers ?? 2), "projecting", (pool, bar, signal) =>
    pool.projection({ scenario: scenarioOnly(sf.spec), uncertainty }, signal, (d, t) => bar.update(d, t)),
  );
  if (!r.ok) rejected(r.issue, file);
  const p = r.value;
  emit(o, p, projectionTable(p), () =>
    [sf.title, "", textTable(riskTable(p)), "", textTable(projectionTable(p)), "", CAUTION].join("\n"),
  );
}

export async function compareCommand(
  file: string,
  o: CommonOptions & { rules?: string; replicates?: string; seed?: string; workers?: string },
): Promise<void> {
  const sf = readScenarioFile(file);
  const rules = o.rules ? readJsonFile(o.rules) : [sf.spec.rule, ...sf.alternatives.map((a) => a.rule)];
  const uncertainty = uncertaintyOf(sf.spec, o);
  const r = await withPool(Number(o.workers ?? 2), "comparing", (pool, bar, signal) =>
    pool.compareRules({ scenario: scenarioOnly(sf.spec), uncertainty, rules }, signal, (d, t) =>
      bar.update(d, t),
    ),
  );
  if (!r.ok) rejected(r.issue, o.rules ?? file);
  const rows = jsonSafe(r.value) as Parameters<typeof comparisonTable>[0];
  const table = comparisonTable(rows);
  emit(o, rows, table, () => [sf.title, "", textTable(table), "", CAUTION].join("\n"));
}

/** "path:from:to:count", e.g. model.params.r:0.1:3:100. */
export function axisArg(
  v: string | undefined,
  name: string,
): { path: string; from: number; to: number; count: number } {
  const parts = v?.split(":") ?? [];
  const [path, from, to, count] = [parts[0], Number(parts[1]), Number(parts[2]), Number(parts[3])];
  if (
    parts.length !== 4 ||
    !path ||
    !Number.isFinite(from) ||
    !Number.isFinite(to) ||
    !Number.isInteger(count)
  ) {
    throw new CliError(`--${name} must look like PATH:FROM:TO:COUNT, e.g. rule.rate:0:0.9:100`, EXIT.usage);
  }
  return { path, from, to, count };
}

export async function mapCommand(
  file: string,
  o: CommonOptions & { x?: string; y?: string; workers?: string },
): Promise<void> {
  const sf = readScenarioFile(file);
  const x = axisArg(o.x, "x");
  const y = axisArg(o.y, "y");
  const r = await withPool(Number(o.workers ?? 2), "mapping", (pool, bar, signal) =>
    pool.regimeMap({ model: sf.spec.model, rule: sf.spec.rule, x, y }, signal, (d, t) => bar.update(d, t)),
  );
  if (!r.ok) rejected(r.issue, file);
  const rows: Cell[][] = [];
  for (let j = 0; j < r.y.values.length; j++) {
    for (let i = 0; i < r.x.values.length; i++) {
      const k = j * r.x.values.length + i;
      rows.push([r.x.values[i]!, r.y.values[j]!, r.regimes[k]!, r.periods[k] ?? null]);
    }
  }
  const table: Table = { header: [x.path, y.path, "regime", "period (years)"], rows };
  const counts: Record<string, number> = {};
  for (const v of r.regimes) counts[v] = (counts[v] ?? 0) + 1;
  emit(o, r, table, () =>
    [
      `${sf.title}: regime map over ${x.path} × ${y.path} (${r.x.values.length} × ${r.y.values.length} cells)`,
      ...Object.entries(counts).map(([k, v]) => `  ${k}: ${v} cells`),
      `  stability boundary: ${r.boundary.length} points`,
      o.out ? `cells written to ${o.out}` : "use --out FILE.csv for every cell",
    ].join("\n"),
  );
}
