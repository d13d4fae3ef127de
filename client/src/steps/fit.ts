// Step 2: fit the growth families, compare them by AICc, choose the model to carry on with.
import { getJson, postJson, type JobView } from "../api.js";
import { catalogue, familyOf } from "../catalogue.js";
import { fitChart, residualChart } from "../charts.js";
import { changed, NUISANCE, onChange, state } from "../state.js";
import { el, fmt, runJob, setStatus, show } from "../ui.js";

interface Skipped {
  family: string;
  delay: number;
  reason: string;
  detail: string;
}

interface Fit {
  family: string;
  delay: number;
  timing: string;
  aicc: number;
  deltaAicc: number;
  weight: number;
  estimates: Record<string, number>;
  intervals: Record<string, { lower: number; upper: number } | null>;
  fitted: (number | null)[];
  residuals: (number | null)[];
  management: { verdictLabel: string | null; msy: number | null };
  identifiability: { trustworthy: boolean; problems: { code: string }[] };
}

const label = (f: Fit) => `${familyOf(f.family)?.label ?? f.family}${f.delay ? ` (delay ${f.delay})` : ""}`;
const withInterval = (v: number | undefined, ci: { lower: number; upper: number } | null | undefined) =>
  v === undefined ? "—" : ci ? `${fmt(v)} (${fmt(ci.lower, 3)}–${fmt(ci.upper, 3)})` : fmt(v);

export function fitStep(root: HTMLElement): void {
  const FAMILIES = catalogue().families;
  const boxes = FAMILIES.map((f) =>
    el("input", { type: "checkbox", id: `fam-${f.id}`, value: f.id, checked: true }),
  );
  const delay1 = el("input", { type: "checkbox", id: "fit-delay1", checked: true });
  const likelihood = el(
    "select",
    { id: "fit-likelihood" },
    ...catalogue().fitOptions.likelihoods.map((l) => el("option", { value: l.value }, l.label)),
  );
  const timing = el(
    "select",
    { id: "fit-timing" },
    ...catalogue().timings.map((t) =>
      el("option", { value: t.value, selected: t.value === catalogue().defaultTiming }, `catch ${t.label}`),
    ),
  );
  const job = el("div", { class: "job-area" });
  const results = el("div", { id: "fit-results" });
  const curves = el("div", { class: "chart" });
  const resid = el("div", { class: "chart" });
  const needSeries = el("p", { class: "note" }, "Load a series in step 1 first.");
  const button = el("button", { type: "button", id: "fit-run", onclick: () => void run() }, "Fit the models");
  let fits: Fit[] = [];

  async function run(): Promise<void> {
    if (!state.series) return;
    const families = boxes.filter((b) => b.checked).map((b) => b.value);
    if (!families.length)
      return show(job, el("p", { class: "error", role: "alert" }, "Choose at least one family."));
    const done = await runJob(job, "Fitting", () =>
      postJson<{ job: JobView }>("/api/v1/fits", {
        seriesId: state.series!.id,
        families,
        delays: delay1.checked ? [0, 1] : [0],
        likelihood: likelihood.value,
        timing: timing.value,
      }),
    );
    if (!done?.links.result) return;
    const rec = await getJson<{
      id: string;
      result: { fits: Fit[]; skipped: Skipped[] };
    }>(done.links.result);
    state.fitId = rec.id;
    fits = rec.result.fits;
    render(rec.result.skipped);
    choose(0);
  }

  function choose(i: number): void {
    const f = fits[i];
    if (!f || !state.series) return;
    const params: Record<string, number> = {};
    for (const [k, v] of Object.entries(f.estimates)) if (!NUISANCE.has(k)) params[k] = v;
    state.model = { family: f.family, params, delay: f.delay };
    state.rule = { ...state.rule, timing: f.timing };
    residualChart(
      resid,
      state.series.rows.map((r) => r.year),
      f.residuals,
      label(f),
    );
    changed();
    setStatus(`Carrying on with ${label(f)}.`);
  }

  function render(skipped: Skipped[]): void {
    const rows = fits.map((f, i) => {
      const g = f.estimates.r !== undefined ? "r" : "R0";
      const radio = el("input", {
        type: "radio",
        name: "chosen-model",
        id: `choose-${i}`,
        value: String(i),
        checked: i === 0,
        onchange: () => choose(i),
        "aria-label": `carry on with ${label(f)}`,
      });
      return el(
        "tr",
        {},
        el("td", {}, radio),
        el("td", {}, el("label", { for: `choose-${i}` }, label(f))),
        el("td", { class: "num" }, fmt(f.aicc)),
        el("td", { class: "num" }, fmt(f.deltaAicc, 3)),
        el("td", { class: "num" }, fmt(f.weight, 3)),
        el("td", { class: "num" }, `${g} = ${withInterval(f.estimates[g], f.intervals[g])}`),
        el("td", { class: "num" }, withInterval(f.estimates.K, f.intervals.K)),
        el("td", {}, f.management.verdictLabel ?? "—"),
        el(
          "td",
          {},
          f.identifiability.trustworthy
            ? "yes"
            : el(
                "span",
                { class: "warn" },
                `no (${f.identifiability.problems.map((p) => p.code).join(", ")})`,
              ),
        ),
      );
    });
    show(
      results,
      el(
        "table",
        { class: "data", id: "fit-table" },
        el("caption", {}, "Models ranked by AICc (intervals: approximate 95%)"),
        el(
          "thead",
          {},
          el(
            "tr",
            {},
            ...[
              "use",
              "model",
              "AICc",
              "ΔAICc",
              "weight",
              "growth rate",
              "K",
              "unharvested",
              "trustworthy",
            ].map((h) => el("th", { scope: "col" }, h)),
          ),
        ),
        el("tbody", {}, ...rows),
      ),
      skipped.length
        ? el(
            "p",
            { class: "note" },
            `Not fitted: ${skipped.map((s) => `${s.family} (delay ${s.delay}): ${s.detail}`).join("; ")}`,
          )
        : null,
      state.fitId
        ? el(
            "p",
            {},
            el(
              "a",
              { href: `/api/v1/fits/${state.fitId}/table.csv`, download: "" },
              "Download the table (CSV)",
            ),
          )
        : null,
    );
    const s = state.series!;
    fitChart(
      curves,
      s.rows.map((r) => r.year),
      s.rows.map((r) => r.count),
      fits.slice(0, 3).map((f) => ({ label: label(f), fitted: f.fitted })),
    );
  }

  show(
    root,
    el("h2", {}, "Fit"),
    el(
      "p",
      { class: "lead" },
      "Fit density-dependent growth models to the counts, with the catches, and rank them by AICc. The chosen model carries on to the stability step.",
    ),
    needSeries,
    el(
      "fieldset",
      {},
      el("legend", {}, "Families"),
      el(
        "div",
        { class: "checks" },
        ...FAMILIES.map((f, i) =>
          el("label", { for: `fam-${f.id}`, title: f.equation }, boxes[i]!, ` ${f.label}`),
        ),
      ),
    ),
    el(
      "div",
      { class: "row" },
      el("label", { for: "fit-delay1" }, delay1, " also with a one-year delay"),
      el("label", { for: "fit-likelihood" }, "Error"),
      likelihood,
      el("label", { for: "fit-timing" }, "Timing"),
      timing,
      button,
    ),
    job,
    results,
    el("div", { class: "two" }, curves, resid),
  );
  const sync = () => {
    needSeries.hidden = Boolean(state.series);
    button.disabled = !state.series;
    if (catalogue().timings.some((t) => t.value === state.rule.timing))
      timing.value = String(state.rule.timing);
  };
  onChange(sync);
  sync();
}
