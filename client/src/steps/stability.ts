// Step 3: the chosen model under a harvest rule set with sliders: equilibria and their
// verdict, eigenvalues against the unit circle, the stability margin, a bifurcation diagram
// and a regime map. Slider moves redraw from a preview analysis (not stored).
import { getJson, postJson, type JobView } from "../api.js";
import { bifurcationChart, eigenChart, regimeChart } from "../charts.js";
import { changed, onChange, scenarioSpec, state } from "../state.js";
import {
  catalogue,
  defaultRule,
  familyOf,
  labelWithUnit,
  unitText,
  ruleOf,
  settingAt,
  sliderOf,
  sweepOf,
  variablePaths,
} from "../catalogue.js";
import { el, errorBox, fmt, runJob, setStatus, show, table } from "../ui.js";

interface Stability {
  equilibria: {
    equilibrium: { abundance: number };
    eigenvalues: { re: number; im: number }[];
    verdict: {
      kind: string;
      label: string;
      meaning: string;
      dominantModulus: number;
      returnTime: number | null;
      period: number | null;
    };
  }[];
  operating: number | null;
  noPositiveEquilibrium: boolean;
}
interface Margin {
  parameter: string;
  current: number;
  stableNow: boolean;
  increase: { boundary: number | null; kind: string | null; margin: number | null; searchedTo: number };
  decrease: { boundary: number | null; kind: string | null; margin: number | null; searchedTo: number };
}

export function stabilityStep(root: HTMLElement): void {
  const modelBox = el("fieldset", { id: "model-box" });
  const ruleBox = el("fieldset", { id: "rule-box" });
  const verdict = el("div", { id: "verdict", "aria-live": "polite" });
  const eqTable = el("div", { id: "equilibria" });
  const eigen = el("div", { class: "chart square" });
  const marginParam = el("select", { id: "margin-parameter", onchange: () => void margin() });
  const marginOut = el("p", { id: "margin", "aria-live": "polite" });
  const robustOut = el("p", { id: "robust", "aria-live": "polite" });
  const timing = el("p", { class: "timing", id: "update-time" });
  const keep = el(
    "button",
    { type: "button", class: "secondary", id: "keep-analysis", onclick: () => void keepAnalysis() },
    "Keep this analysis for the report",
  );
  const bifArea = el("div", {});
  const mapArea = el("div", {});
  const needModel = el("p", { class: "note" }, "Fit a model in step 2, or open a demo in step 1.");

  let busy = false;
  let pending = false;
  let marginTimer: ReturnType<typeof setTimeout> | undefined;

  const K = () => state.model?.params.K ?? 1000;

  const paths = () => variablePaths(state.model, state.rule);
  const labelOf = (path: string) => settingAt(path, state.model, state.rule)?.label ?? path;
  const mainPath = () => ruleOf(state.rule.kind)?.main ?? paths()[0]!;

  function renderModel(): void {
    const m = state.model;
    if (!m) {
      show(modelBox);
      return;
    }
    show(
      modelBox,
      el(
        "legend",
        {},
        `Model: ${familyOf(m.family)?.label ?? m.family}${m.delay ? `, delay ${m.delay}` : ""}`,
      ),
      ...Object.entries(m.params).map(([k, v]) =>
        el(
          "label",
          { class: "field" },
          `${(() => {
            const s = settingAt(`model.params.${k}`, m, state.rule);
            return s ? labelWithUnit(s) : k;
          })()} `,
          el("input", {
            type: "number",
            value: String(Number(v.toPrecision(6))),
            step: "any",
            "data-param": k,
            oninput: (e: Event) => {
              const x = Number((e.target as HTMLInputElement).value);
              if (Number.isFinite(x)) {
                m.params[k] = x;
                schedule();
              }
            },
          }),
        ),
      ),
    );
  }

  function renderRule(): void {
    const r = state.rule;
    const kind = el(
      "select",
      {
        id: "rule-kind",
        onchange: () => {
          state.rule = defaultRule(kind.value, K(), r);
          renderRule();
          fillMarginParams();
          schedule();
        },
      },
      ...catalogue().rules.map((k) => el("option", { value: k.kind, selected: k.kind === r.kind }, k.label)),
    );
    // One slider per setting: the rule's own, then those every rule has (stocking, survey lag).
    const sliders = [...(ruleOf(r.kind)?.settings ?? []), ...catalogue().ruleCommon].map((s) => {
      const name = s.name;
      const value = Number(r[name] ?? s.default);
      const { min, max, step } = sliderOf(s, K(), value);
      const out = el("output", { for: `rule-${name}`, id: `rule-${name}-value` }, fmt(value));
      const input = el("input", {
        type: "range",
        id: `rule-${name}`,
        min,
        max: Math.max(max, value),
        step,
        value: String(value),
        oninput: () => {
          state.rule = { ...state.rule, [name]: Number(input.value) };
          out.textContent = fmt(Number(input.value));
          schedule();
        },
      });
      return el(
        "div",
        { class: "slider" },
        el("label", { for: `rule-${name}`, title: s.description }, s.label, el("small", {}, unitText(s))),
        input,
        out,
      );
    });
    const when = el(
      "select",
      {
        id: "rule-timing",
        onchange: () => {
          state.rule = { ...state.rule, timing: when.value };
          schedule();
        },
      },
      ...catalogue().timings.map((t) =>
        el(
          "option",
          { value: t.value, selected: (r.timing ?? catalogue().defaultTiming) === t.value },
          t.label,
        ),
      ),
    );
    show(
      ruleBox,
      el("legend", {}, "Harvest rule"),
      el("label", { for: "rule-kind" }, "Rule "),
      kind,
      ...sliders,
      el("label", { for: "rule-timing" }, "Catch taken "),
      when,
    );
  }

  function fillMarginParams(): void {
    const main = mainPath();
    show(marginParam, ...paths().map((p) => el("option", { value: p, selected: p === main }, labelOf(p))));
  }

  /** Sends one preview analysis at a time; a move made meanwhile is sent when it returns. */
  function schedule(): void {
    if (busy) {
      pending = true;
      return;
    }
    void update();
    clearTimeout(marginTimer);
    marginTimer = setTimeout(() => {
      void margin();
      void robust();
    }, 250);
  }

  async function update(): Promise<void> {
    const spec = scenarioSpec();
    if (!spec) return;
    busy = true;
    const t0 = performance.now();
    try {
      const r = await postJson<{ result: Stability }>("/api/v1/analyses", {
        kind: "stability",
        scenario: spec,
        store: false,
      });
      render(r.result);
      const ms = performance.now() - t0;
      timing.textContent = `updated in ${ms.toFixed(0)} ms`;
      timing.dataset.ms = ms.toFixed(1);
    } catch (e) {
      show(verdict, errorBox(e));
    } finally {
      busy = false;
      if (pending) {
        pending = false;
        schedule();
      }
    }
  }

  function render(s: Stability): void {
    const op = s.operating === null ? null : s.equilibria[s.operating]!;
    if (!op)
      show(
        verdict,
        el("p", { class: "verdict bad" }, "No positive equilibrium: under this rule the stock collapses."),
      );
    else {
      const good = op.verdict.kind.startsWith("stable");
      show(
        verdict,
        el(
          "p",
          { class: `verdict ${good ? "good" : "bad"}`, "data-kind": op.verdict.kind },
          `${op.verdict.label} at N* = ${fmt(op.equilibrium.abundance)}`,
        ),
        el("p", {}, op.verdict.meaning),
      );
    }
    show(
      eqTable,
      table(
        "Equilibria of the closed loop",
        ["equilibrium", "verdict", "|λ| dominant", "return time (y)", "period (y)"],
        s.equilibria.map((e) => [
          e.equilibrium.abundance,
          e.verdict.label,
          e.verdict.dominantModulus,
          e.verdict.returnTime,
          e.verdict.period,
        ]),
        "equilibria-table",
      ),
    );
    eigenChart(eigen, op ? op.eigenvalues : []);
  }

  async function margin(): Promise<void> {
    const spec = scenarioSpec();
    if (!spec || !marginParam.value) return;
    try {
      const r = await postJson<{ result: Margin }>("/api/v1/analyses", {
        kind: "margin",
        scenario: spec,
        parameter: marginParam.value,
        store: false,
      });
      const m = r.result;
      const side = (word: string, s: Margin["increase"]) =>
        s.boundary === null
          ? `${word}: no change up to ${fmt(s.searchedTo)}`
          : `${word}: ${m.stableNow ? "stability is lost" : "stability is gained"} at ${fmt(s.boundary)} (${s.kind})`;
      show(
        marginOut,
        `${labelOf(m.parameter)} is ${fmt(m.current)}. `,
        side("Raising it", m.increase),
        "; ",
        side("lowering it", m.decrease),
        ".",
      );
    } catch (e) {
      show(marginOut, errorBox(e));
    }
  }

  /** The rule's verdict under every fitted model, weighted by Akaike weight. */
  async function robust(): Promise<void> {
    const spec = scenarioSpec();
    if (!spec || !state.fitId) return show(robustOut);
    try {
      const r = await postJson<{ result: { summary: string } }>("/api/v1/analyses", {
        kind: "robust",
        scenario: spec,
        fitId: state.fitId,
        store: false,
      });
      show(robustOut, el("strong", {}, "Across the fitted models: "), `${r.result.summary}.`);
    } catch (e) {
      show(robustOut, errorBox(e));
    }
  }

  async function keepAnalysis(): Promise<void> {
    const spec = scenarioSpec();
    if (!spec) return;
    try {
      const r = await postJson<{ id: string }>("/api/v1/analyses", { kind: "stability", scenario: spec });
      state.stabilityId = r.id;
      setStatus("Stability analysis kept for the report.");
      changed();
    } catch (e) {
      show(verdict, errorBox(e));
    }
  }

  function current(path: string): number {
    if (path.startsWith("model.params.")) return state.model!.params[path.slice(13)]!;
    return Number(state.rule[path.slice(5)] ?? 0);
  }

  function sweepForm(
    id: string,
    onRun: (axes: { path: string; from: number; to: number; count: number }[]) => void,
    two: boolean,
  ): HTMLElement {
    const axes = (two ? ["x", "y"] : ["axis"]).map((a, i) => {
      const sel = el(
        "select",
        { id: `${id}-${a}-path` },
        ...paths().map((p, k) =>
          el(
            "option",
            { value: p, selected: k === (two ? (i === 0 ? 0 : paths().indexOf(mainPath())) : 0) },
            labelOf(p),
          ),
        ),
      );
      const from = el("input", { type: "number", id: `${id}-${a}-from`, step: "any" });
      const to = el("input", { type: "number", id: `${id}-${a}-to`, step: "any" });
      const fill = () => {
        const setting = settingAt(sel.value, state.model, state.rule);
        const [lo, hi] = setting ? sweepOf(setting, K(), current(sel.value)) : [0, 1];
        from.value = String(Number(lo.toPrecision(4)));
        to.value = String(Number(hi.toPrecision(4)));
      };
      sel.addEventListener("change", fill);
      fill();
      return { a, sel, from, to };
    });
    const count = el("input", {
      type: "number",
      id: `${id}-count`,
      min: 5,
      max: two ? 200 : 1000,
      value: two ? "40" : "200",
    });
    return el(
      "div",
      { class: "row" },
      ...axes.flatMap(({ a, sel, from, to }) => [
        el("label", { for: sel.id }, two ? `${a} ` : "parameter "),
        sel,
        el("label", { for: from.id }, "from"),
        from,
        el("label", { for: to.id }, "to"),
        to,
      ]),
      el("label", { for: count.id }, two ? "cells per side" : "values"),
      count,
      el(
        "button",
        {
          type: "button",
          id: `${id}-run`,
          onclick: () =>
            onRun(
              axes.map(({ sel, from, to }) => ({
                path: sel.value,
                from: Number(from.value),
                to: Number(to.value),
                count: Number(count.value),
              })),
            ),
        },
        two ? "Draw the regime map" : "Draw the diagram",
      ),
    );
  }

  function renderSweeps(): void {
    const bifJob = el("div", {});
    const bifChart = el("div", { class: "chart" });
    const mapJob = el("div", {});
    const mapChart = el("div", { class: "chart tall" });
    show(
      bifArea,
      el("h3", {}, "Bifurcation diagram"),
      sweepForm(
        "bif",
        async ([axis]) => {
          const done = await runJob(bifJob, "Diagram", () =>
            postJson<{ job: JobView }>("/api/v1/analyses", {
              kind: "bifurcation",
              scenario: scenarioSpec(),
              axis,
            }),
          );
          if (!done?.links.result) return;
          const r = await getJson<{ result: Parameters<typeof bifurcationChart>[1] }>(done.links.result);
          bifurcationChart(bifChart, r.result, current(axis!.path));
        },
        false,
      ),
      bifJob,
      bifChart,
    );
    show(
      mapArea,
      el("h3", {}, "Regime map"),
      sweepForm(
        "map",
        async ([x, y]) => {
          const done = await runJob(mapJob, "Regime map", () =>
            postJson<{ job: JobView }>("/api/v1/analyses", {
              kind: "regime-map",
              scenario: scenarioSpec(),
              x,
              y: { ...y!, count: x!.count },
            }),
          );
          if (!done?.links.result) return;
          const r = await getJson<{ result: Parameters<typeof regimeChart>[1] }>(done.links.result);
          regimeChart(mapChart, r.result, { x: current(x!.path), y: current(y!.path) });
        },
        true,
      ),
      mapJob,
      mapChart,
    );
  }

  show(
    root,
    el("h2", {}, "Stability"),
    el(
      "p",
      { class: "lead" },
      "Move the sliders: the verdict, the equilibria and the eigenvalues follow. A root outside the unit circle means the equilibrium is unstable.",
    ),
    needModel,
    el("div", { class: "two" }, el("div", {}, modelBox, ruleBox), el("div", {}, verdict, timing, eigen)),
    eqTable,
    el(
      "div",
      { class: "row" },
      el("label", { for: "margin-parameter" }, "Stability margin in"),
      marginParam,
      keep,
    ),
    marginOut,
    robustOut,
    bifArea,
    mapArea,
  );
  let lastModel: unknown = null;
  onChange(() => {
    needModel.hidden = Boolean(state.model);
    if (state.model && state.model !== lastModel) {
      lastModel = state.model;
      renderModel();
      renderRule();
      fillMarginParams();
      renderSweeps();
      schedule();
    }
  });
}
