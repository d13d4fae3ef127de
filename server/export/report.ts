// The printable management report: one self-contained HTML page (inline SVG charts, no
// scripts) that a meeting can read on paper. Presentation only: every number comes from
// src/ or from stored results.
import type { StabilityAnalysis } from "../../src/equilibria/stability.js";
import type { StabilityMargin } from "../../src/equilibria/margin.js";
import type { StochasticProjection } from "../../src/sim/risk-metrics.js";
import type { ResultRecord } from "../store/repository.js";
import { fanChartSvg } from "./svg-chart.js";
import { escapeHtml, formatCell, formatNumber } from "./text.js";
import { comparisonTable, projectionTable, riskTable, ruleText, type Table } from "./tables.js";

export const CAUTION =
  "These projections come from a fitted model and are uncertain: the model may be wrong, the data noisy, and the future unlike the past. " +
  "They inform a decision and do not make it. Quotas and harvest rules are set through the management authority's own procedures, " +
  "with peer review and within local regulations; check any rule against them before it is used.";

export interface ReportInput {
  readonly title: string;
  readonly scenario: { id: string | null; name: string; spec: Record<string, unknown> };
  readonly stability: StabilityAnalysis;
  readonly margin: StabilityMargin | null;
  readonly fit: ResultRecord | null;
  readonly projection: ResultRecord | null;
  readonly comparison: ResultRecord | null;
  readonly programVersion: string;
  readonly generatedAt: string;
}

const esc = escapeHtml;
const num = (v: unknown, digits = 4) => escapeHtml(formatNumber(v, digits));

function table(t: Table, caption: string): string {
  const head = t.header.map((h) => `<th scope="col">${esc(h)}</th>`).join("");
  const body = t.rows
    .map((r) => `<tr>${r.map((c, i) => `<td>${esc(formatCell(t.header[i], c))}</td>`).join("")}</tr>`)
    .join("");
  return `<table><caption>${esc(caption)}</caption><thead><tr>${head}</tr></thead><tbody>${body}</tbody></table>`;
}

function stabilitySection(s: StabilityAnalysis, margin: StabilityMargin | null): string {
  const op = s.operating === null ? null : s.equilibria[s.operating]!;
  if (!op) return `<p class="verdict bad">No positive equilibrium under this rule: the stock collapses.</p>`;
  const v = op.verdict;
  const good = v.kind.startsWith("stable");
  let text = `<p class="verdict ${good ? "good" : "bad"}">${esc(v.label)} at N* = ${num(op.equilibrium.abundance)}.</p><p>${esc(v.meaning)}</p>`;
  text += `<p>Dominant eigenvalue modulus ${num(v.dominantModulus)}${v.returnTime !== null ? `; return time ${num(v.returnTime, 3)} years` : ""}${v.period !== null ? `; oscillation period ${num(v.period, 3)} years` : ""}.</p>`;
  if (margin) {
    const side = (label: string, m: StabilityMargin["increase"]) =>
      m.boundary === null
        ? `${label}: no change of stability up to ${num(m.searchedTo)}`
        : `${label}: stability ${margin.stableNow ? "is lost" : "is gained"} at ${num(m.boundary)} (${m.kind ?? "—"}; margin ${num(m.margin, 3)})`;
    text += `<p>Stability margin in <code>${esc(margin.parameter)}</code> (now ${num(margin.current)}): ${esc(side("raising it", margin.increase))}; ${esc(side("lowering it", margin.decrease))}.</p>`;
  }
  return text;
}

function fitSection(fit: ResultRecord): string {
  const r = fit.result as {
    fits?: {
      family: string;
      delay: number;
      aicc: number;
      deltaAicc: number;
      weight: number;
      estimates: Record<string, number>;
      management?: { verdictLabel: string | null };
    }[];
  };
  const rows = (r.fits ?? [])
    .slice(0, 8)
    .map((f) => [
      `${f.family}${f.delay ? ` (delay ${f.delay})` : ""}`,
      f.aicc,
      f.deltaAicc,
      f.weight,
      f.estimates.r ?? f.estimates.R0 ?? null,
      f.estimates.K ?? null,
      f.management?.verdictLabel ?? "—",
    ]);
  return table(
    {
      header: [
        "model",
        "AICc",
        "ΔAICc",
        "Akaike weight",
        "r or R0",
        "K (stock units)",
        "unharvested verdict",
      ],
      rows,
    },
    "Models fitted to the series, best first",
  );
}

export function reportHtml(input: ReportInput, nonce: string): string {
  const sc = input.scenario.spec;
  const sections: string[] = [];
  sections.push(`<section><h2>Caution</h2><p class="caution">${esc(CAUTION)}</p></section>`);
  const model = sc.model as { family: string; params: Record<string, number>; delay: number };
  const rule = sc.rule as Record<string, unknown>;
  sections.push(
    `<section><h2>Scenario</h2><dl><dt>Name</dt><dd>${esc(input.scenario.name)}</dd><dt>Model</dt><dd>${esc(model.family)} ${esc(
      Object.entries(model.params)
        .map(([k, v]) => `${k} = ${v}`)
        .join(", "),
    )}${model.delay ? `, delay ${model.delay}` : ""}</dd>` +
      `<dt>Harvest rule</dt><dd>${esc(ruleText(rule))}</dd><dt>Start</dt><dd>${esc(JSON.stringify(sc.start))} in ${esc(sc.startYear)}</dd><dt>Horizon</dt><dd>${esc(sc.horizon)} years</dd></dl></section>`,
  );
  if (input.fit) sections.push(`<section><h2>Fit</h2>${fitSection(input.fit)}</section>`);
  sections.push(
    `<section><h2>Stability of the harvest rule</h2>${stabilitySection(input.stability, input.margin)}</section>`,
  );
  if (input.projection) {
    const p = input.projection.result as StochasticProjection;
    sections.push(
      `<section><h2>Projection</h2><p>${num(p.replicates)} simulated futures (seed ${p.seed}); bands are the 5–95, 10–90 and 25–75 percentiles, the line the median.</p>` +
        fanChartSvg({
          title: "Abundance",
          yLabel: "stock units",
          years: p.years,
          levels: p.levels,
          series: p.abundance,
          reference: { value: p.risk.limit, label: "limit" },
        }) +
        fanChartSvg({
          title: "Catch",
          yLabel: "stock units per year",
          years: p.years.slice(0, -1),
          levels: p.levels,
          series: p.catch,
        }) +
        table(riskTable(p), "Risk and yield") +
        `</section>`,
    );
    sections.push(
      `<section class="wide"><h2>Projection by year</h2>${table(projectionTable(p), "Percentiles of abundance and catch")}</section>`,
    );
  }
  if (input.comparison) {
    sections.push(
      `<section class="wide"><h2>Candidate rules compared (same random draws)</h2>${table(comparisonTable(input.comparison.result as Parameters<typeof comparisonTable>[0]), "One row per rule")}</section>`,
    );
  }
  const prov = [input.fit, input.projection, input.comparison]
    .filter((r): r is ResultRecord => r !== null)
    .map(
      (r) =>
        `<tr><td>${esc(r.kind)}</td><td>${esc(r.id)}</td><td>${esc(r.createdAt)}</td><td>${esc(r.programVersion)}</td><td>${esc(r.seed ?? "—")}</td><td><code>${esc((r.dataHash ?? "—").slice(0, 16))}</code></td></tr>`,
    )
    .join("");
  sections.push(
    `<section><h2>Provenance</h2><p>Scenario ${esc(input.scenario.id ?? "(inline)")}; report generated ${esc(input.generatedAt)} by yieldloop ${esc(input.programVersion)}.</p>` +
      (prov
        ? `<table><thead><tr><th>result</th><th>id</th><th>computed</th><th>program</th><th>seed</th><th>data hash</th></tr></thead><tbody>${prov}</tbody></table>`
        : "") +
      `</section>`,
  );
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${esc(input.title)}</title><style nonce="${nonce}">${CSS}</style></head><body><header><h1>${esc(input.title)}</h1><p class="sub">Management report — yieldloop ${esc(input.programVersion)}</p></header><main>${sections.join("")}</main></body></html>`;
}

const CSS = `
body{font:15px/1.45 Georgia,"Times New Roman",serif;color:#1f2623;margin:0 auto;max-width:980px;padding:24px}
h1{font-size:26px;margin:0}h2{font-size:18px;border-bottom:1px solid #c8d2cd;padding-bottom:3px;margin-top:28px}
.sub{color:#55615b;margin:2px 0 0}.caution{background:#fbf3e4;border-left:4px solid #b7791f;padding:8px 12px}
.verdict{font-weight:bold}.verdict.good{color:#1d4d44}.verdict.bad{color:#a33b20}
table{border-collapse:collapse;margin:10px 0;font:13px/1.3 system-ui,sans-serif;width:100%}caption{text-align:left;font-style:italic;padding:4px 0}
th,td{border:1px solid #d5ddd9;padding:3px 6px;text-align:right}th{background:#eef3f1}td:first-child,th:first-child{text-align:left}
dl{display:grid;grid-template-columns:max-content 1fr;gap:2px 14px}dt{font-weight:bold}dd{margin:0}
svg.fan{width:100%;max-width:640px;display:block;margin:8px 0}svg .t{font:bold 14px system-ui,sans-serif}svg .a{font:11px system-ui,sans-serif;fill:#38423e}
svg .g{stroke:#e3e9e6}svg .ax{stroke:#38423e}
@media print{body{padding:0;font-size:12px}section{break-inside:avoid}section.wide{break-inside:auto}}
`;
