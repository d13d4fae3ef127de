// Step 4: projections under uncertainty (fan charts and the risk table) and candidate rules
// compared on the same random draws.
import { getJson, postJson, type JobView } from "../api.js";
import { catalogue, ruleOf } from "../catalogue.js";
import { fanChart } from "../charts.js";
import { changed, onChange, scenarioSpec, state, type RuleSpec, UNCERTAINTY_KEYS } from "../state.js";
import { el, fmt, pct, runJob, show, table } from "../ui.js";

interface Projection {
  replicates: number;
  years: number[];
  levels: number[];
  abundance: number[][];
  catch: number[][];
  risk: {
    limit: number;
    belowLimit: { probability: number; standardError: number };
    quasiExtinction: { probability: number; standardError: number };
    quasiExtinctionThreshold: number;
    recovery: { probability: number; medianYears: number | null };
    recoveryTarget: number;
    meanCatch: number;
    medianCatch: number;
    averageAnnualVariation: number | null;
    zeroCatchFraction: number;
  };
}

/** The projection settings the form shows, described by the catalogue (labels, ranges, steps). */
const fields = () =>
  UNCERTAINTY_KEYS.map((key) => {
    const s = catalogue().uncertainty.find((u) => u.name === key)!;
    return { key, label: s.label, step: s.integer ? "1" : "0.01", min: s.min, max: s.max };
  });

export function ruleName(r: RuleSpec): string {
  const kind = ruleOf(r.kind);
  const parts = [kind?.label ?? r.kind];
  for (const s of kind?.settings ?? [])
    if (typeof r[s.name] === "number") parts.push(`${s.label} ${fmt(Number(r[s.name]))}`);
  if (r.surveyLag) parts.push(`survey lag ${r.surveyLag}`);
  return parts.join(", ");
}

export function projectionStep(root: HTMLElement): void {
  const FIELDS = fields();
  const inputs = FIELDS.map((f) =>
    el("input", { type: "number", id: `u-${f.key}`, step: f.step, min: f.min, max: f.max }),
  );
  const horizon = el("input", { type: "number", id: "u-horizon", min: 1, max: 1000, step: "1" });
  const startN = el("input", { type: "number", id: "u-start", min: 0, step: "any" });
  const job = el("div", {});
  const abundance = el("div", { class: "chart" });
  const caught = el("div", { class: "chart" });
  const risk = el("div", { id: "risk" });
  const rules = el("fieldset", { id: "candidates" });
  const cmpJob = el("div", {});
  const cmp = el("div", { id: "comparison" });
  const needModel = el("p", { class: "note" }, "Choose a model and a rule first (steps 2 and 3).");

  function read(): void {
    FIELDS.forEach((f, i) => {
      const v = Number(inputs[i]!.value);
      if (inputs[i]!.value !== "" && Number.isFinite(v))
        (state.uncertainty as unknown as Record<string, number>)[f.key] = v;
    });
    if (Number.isFinite(Number(horizon.value)) && horizon.value) state.horizon = Number(horizon.value);
    if (startN.value && Number.isFinite(Number(startN.value)))
      state.start = [Number(startN.value), ...state.start.slice(1)];
  }

  async function project(): Promise<void> {
    read();
    const spec = scenarioSpec();
    if (!spec) return;
    const done = await runJob(job, "Projecting", () =>
      postJson<{ job: JobView }>("/api/v1/projections", { scenario: spec, uncertainty: state.uncertainty }),
    );
    if (!done?.links.result) return;
    const r = await getJson<{ id: string; result: Projection }>(done.links.result);
    state.projectionId = r.id;
    const p = r.result;
    fanChart(
      abundance,
      "abundance",
      "Abundance: median and percentile bands",
      p.years,
      p.levels,
      p.abundance,
      "abundance",
      { value: p.risk.limit, label: `limit ${fmt(p.risk.limit)}` },
    );
    fanChart(
      caught,
      "catch",
      "Catch: median and percentile bands",
      p.years.slice(0, -1),
      p.levels,
      p.catch,
      "catch per year",
    );
    const k = p.risk;
    show(
      risk,
      table(
        `Risk and yield over ${p.years.length - 1} years (${fmt(p.replicates)} replicates)`,
        ["measure", "value", "standard error"],
        [
          [
            `P(below the limit ${fmt(k.limit)} in some year)`,
            pct(k.belowLimit.probability),
            pct(k.belowLimit.standardError),
          ],
          [
            `P(below ${fmt(k.quasiExtinctionThreshold)}: quasi-extinction)`,
            pct(k.quasiExtinction.probability),
            pct(k.quasiExtinction.standardError),
          ],
          [`P(reaching ${fmt(k.recoveryTarget)})`, pct(k.recovery.probability), "—"],
          ["mean annual catch", fmt(k.meanCatch), "—"],
          ["median annual catch", fmt(k.medianCatch), "—"],
          [
            "average annual variation in catch",
            k.averageAnnualVariation === null ? "—" : pct(k.averageAnnualVariation),
            "—",
          ],
          ["years with zero catch", pct(k.zeroCatchFraction), "—"],
        ],
        "risk-table",
      ),
      el(
        "p",
        {},
        el("a", { href: `/api/v1/projections/${r.id}/table.csv`, download: "" }, "Percentiles by year (CSV)"),
        " · ",
        el(
          "a",
          { href: `/api/v1/projections/${r.id}/risk.csv`, download: "", id: "risk-csv" },
          "Risk table (CSV)",
        ),
      ),
    );
    changed();
  }

  function renderCandidates(): void {
    const current = el(
      "label",
      {},
      el("input", { type: "checkbox", checked: true, disabled: true }),
      ` the rule from step 3 (${ruleName(state.rule)})`,
    );
    show(
      rules,
      el("legend", {}, "Candidate rules"),
      current,
      ...state.candidates.map((c, i) =>
        el(
          "label",
          { for: `cand-${i}` },
          el("input", { type: "checkbox", id: `cand-${i}`, checked: true, "data-index": String(i) }),
          ` ${c.name.split(": ").slice(1).join(": ") || c.name} (${ruleName(c.spec)})`,
        ),
      ),
    );
  }

  async function compare(): Promise<void> {
    read();
    const spec = scenarioSpec();
    if (!spec) return;
    const chosen = state.candidates.filter(
      (_, i) => (document.getElementById(`cand-${i}`) as HTMLInputElement | null)?.checked,
    );
    const list = [state.rule, ...chosen.map((c) => c.spec)];
    const done = await runJob(cmpJob, "Comparing rules", () =>
      postJson<{ job: JobView }>("/api/v1/comparisons", {
        scenario: spec,
        uncertainty: state.uncertainty,
        rules: list,
      }),
    );
    if (!done?.links.result) return;
    const r = await getJson<{
      id: string;
      result: {
        rule: RuleSpec;
        verdictLabel: string;
        equilibrium: number | null;
        margin: {
          parameter: string;
          increase: { boundary: number | null };
          decrease: { boundary: number | null };
        } | null;
        projection: Projection;
      }[];
    }>(done.links.result);
    state.comparisonId = r.id;
    show(
      cmp,
      table(
        "Candidate rules on the same random draws",
        [
          "rule",
          "stability",
          "equilibrium",
          "P(below limit)",
          "P(quasi-extinction)",
          "mean catch",
          "catch variation",
          "zero-catch years",
        ],
        r.result.map((row) => [
          ruleName(row.rule),
          row.verdictLabel,
          row.equilibrium,
          pct(row.projection.risk.belowLimit.probability),
          pct(row.projection.risk.quasiExtinction.probability),
          row.projection.risk.meanCatch,
          row.projection.risk.averageAnnualVariation === null
            ? "—"
            : pct(row.projection.risk.averageAnnualVariation),
          pct(row.projection.risk.zeroCatchFraction),
        ]),
        "comparison-table",
      ),
      el(
        "p",
        {},
        el(
          "a",
          { href: `/api/v1/comparisons/${r.id}/table.csv`, download: "", id: "comparison-csv" },
          "Comparison table (CSV)",
        ),
      ),
    );
    changed();
  }

  show(
    root,
    el("h2", {}, "Projection"),
    el(
      "p",
      { class: "lead" },
      "Simulate many possible futures under the rule, with the uncertainty you set, and read the risks off the bands.",
    ),
    needModel,
    el(
      "div",
      { class: "grid-form" },
      ...FIELDS.map((f, i) => el("label", { for: inputs[i]!.id }, f.label, inputs[i]!)),
      el("label", { for: "u-start" }, "start abundance", startN),
      el("label", { for: "u-horizon" }, "years ahead", horizon),
    ),
    el("button", { type: "button", id: "project-run", onclick: () => void project() }, "Run the projection"),
    job,
    el("div", { class: "two" }, abundance, caught),
    risk,
    el("h3", {}, "Compare rules"),
    rules,
    el("button", { type: "button", id: "compare-run", onclick: () => void compare() }, "Compare the rules"),
    cmpJob,
    cmp,
  );
  onChange(() => {
    needModel.hidden = Boolean(state.model);
    FIELDS.forEach((f, i) => {
      if (document.activeElement !== inputs[i]) inputs[i]!.value = String(state.uncertainty[f.key]);
    });
    if (document.activeElement !== horizon) horizon.value = String(state.horizon);
    if (document.activeElement !== startN && state.start[0] !== undefined)
      startN.value = String(state.start[0]);
    renderCandidates();
  });
}
