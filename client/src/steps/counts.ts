// Step 1: a series of counts, from a CSV (file picker or drag and drop) or a demo.
import { ApiError, getJson, postCsv } from "../api.js";
import { countsChart } from "../charts.js";
import { changed, state, type RuleSpec, type SeriesRow } from "../state.js";
import { el, errorBox, setStatus, show, table } from "../ui.js";

interface SeriesRecord {
  id: string;
  name: string;
  years: number;
  warnings: { code: string; years?: number[] }[];
}
interface SpecRecord {
  id: string;
  name: string;
  spec: Record<string, unknown>;
}

const WARNINGS: Record<string, string> = {
  years_sorted: "the rows were not in year order; they have been sorted",
  years_missing: "some years are missing (gaps are allowed and mean 'not surveyed')",
  catch_not_recorded: "some years have no catch recorded; they are taken as 0",
};

export function countsStep(root: HTMLElement): void {
  const demos = el("div", { class: "demos" }, "Loading the demonstration data…");
  const name = el("input", { id: "series-name", type: "text", value: "my survey", autocomplete: "off" });
  const file = el("input", {
    id: "series-file",
    type: "file",
    accept: ".csv,text/csv",
    onchange: () => file.files?.[0] && void readFile(file.files[0]),
  });
  const drop = el(
    "div",
    {
      class: "drop",
      tabindex: "0",
      role: "button",
      "aria-describedby": "drop-help",
      onkeydown: (e: KeyboardEvent) => {
        if (e.key !== "Enter" && e.key !== " ") return;
        e.preventDefault();
        file.click();
      },
    },
    el(
      "p",
      { id: "drop-help" },
      "Drop a CSV file here, or press Enter to choose one. Columns: year, count, and optionally catch, stocking, cv.",
    ),
  );
  drop.addEventListener("click", () => file.click());
  drop.addEventListener("dragover", (e) => {
    e.preventDefault();
    drop.classList.add("over");
  });
  drop.addEventListener("dragleave", () => drop.classList.remove("over"));
  drop.addEventListener("drop", (e) => {
    e.preventDefault();
    drop.classList.remove("over");
    const f = e.dataTransfer?.files[0];
    if (f) void readFile(f);
  });
  const problems = el("div", { id: "series-problems" });
  const view = el("div", { id: "series-view" });
  const chart = el("div", { class: "chart" });

  async function readFile(f: File): Promise<void> {
    const text = await f.text();
    if (name.value === "my survey") name.value = f.name.replace(/\.csv$/i, "");
    await upload(text, name.value);
  }

  async function upload(csv: string, label: string): Promise<void> {
    show(problems);
    try {
      const rec = await postCsv<SeriesRecord>(`/api/v1/series?name=${encodeURIComponent(label)}`, csv);
      await open(rec.id);
    } catch (e) {
      const list = e instanceof ApiError ? (e.problem.problems ?? []) : [];
      show(
        problems,
        el("h3", {}, "Data problems"),
        list.length > 1
          ? el(
              "div",
              { role: "alert", class: "error" },
              el("p", {}, `${list.length} problems, row by row:`),
              el("ul", { id: "problem-list" }, ...list.map((p) => el("li", {}, p.detail))),
            )
          : errorBox(e),
      );
    }
  }

  async function open(id: string): Promise<void> {
    const s = await getJson<SeriesRecord & { rows: SeriesRow[] }>(`/api/v1/series/${id}`);
    state.series = { id: s.id, name: s.name, rows: s.rows, warnings: s.warnings };
    state.fitId = null;
    const last = [...s.rows].reverse().find((r) => r.count !== null);
    if (last && !state.start.length) state.start = [last.count!];
    if (last && !state.startYear) state.startYear = last.year + 1;
    render();
    changed();
    setStatus(`Series "${s.name}" loaded: ${s.rows.length} years.`);
  }

  function render(): void {
    const s = state.series;
    if (!s) return;
    const w = (s.warnings as { code: string; years?: number[] }[]).map((x) =>
      el("li", {}, `${WARNINGS[x.code] ?? x.code}${x.years ? `: ${x.years.join(", ")}` : ""}`),
    );
    show(
      problems,
      w.length ? el("div", { class: "note" }, el("h3", {}, "Data notes"), el("ul", {}, ...w)) : null,
    );
    show(
      view,
      el(
        "p",
        {},
        `${s.name}: ${s.rows.length} years, ${s.rows[0]?.year}–${s.rows[s.rows.length - 1]?.year}. `,
        el("a", { href: `/api/v1/series/${s.id}/csv`, download: "" }, "Download the CSV"),
      ),
      el(
        "div",
        { class: "scroll" },
        table(
          "The series",
          ["year", "count", "catch", "stocking", "cv"],
          s.rows.map((r) => [String(r.year), r.count, r.catch, r.stocking, r.cv]),
          "series-table",
        ),
      ),
    );
    countsChart(
      chart,
      s.rows.map((r) => r.year),
      s.rows.map((r) => r.count),
      s.rows.map((r) => r.catch),
      s.rows.map((r) => r.stocking),
    );
  }

  async function loadDemos(): Promise<void> {
    try {
      const [series, scenarios, rules] = await Promise.all([
        getJson<{ items: SeriesRecord[] }>("/api/v1/series?limit=1000"),
        getJson<{ items: SpecRecord[] }>("/api/v1/scenarios?limit=1000"),
        getJson<{ items: SpecRecord[] }>("/api/v1/rules?limit=1000"),
      ]);
      // A demo is a stored scenario whose title starts with a stored series' name and a colon.
      // The first such scenario per series (later ones are copies saved for reports).
      const seen = new Set<string>();
      const pairs = scenarios.items.flatMap((sc) => {
        const s = series.items.find((x) => sc.name.startsWith(`${x.name}:`));
        if (!s || seen.has(s.name)) return [];
        seen.add(s.name);
        return [{ sc, s }];
      });
      if (!pairs.length) return show(demos, "No demonstration data in this database.");
      show(
        demos,
        el("span", {}, "Or open an invented demo: "),
        ...pairs.map(({ sc, s }) =>
          el(
            "button",
            {
              type: "button",
              class: "secondary",
              "data-demo": s.name,
              onclick: async () => {
                const spec = sc.spec as {
                  model: Record<string, unknown>;
                  rule: RuleSpec;
                  start: number[];
                  horizon: number;
                  startYear: number;
                  uncertainty?: Record<string, number>;
                };
                state.rule = spec.rule;
                state.start = spec.start;
                state.horizon = spec.horizon;
                state.startYear = spec.startYear;
                state.model = spec.model as never;
                if (spec.uncertainty) Object.assign(state.uncertainty, spec.uncertainty);
                state.scenarioName = sc.name;
                state.candidates = rules.items
                  .filter((r) => r.name.startsWith(`${s.name}:`))
                  .map((r) => ({ id: r.id, name: r.name, spec: r.spec as RuleSpec }));
                await open(s.id);
              },
            },
            s.name,
          ),
        ),
      );
    } catch (e) {
      show(demos, errorBox(e));
    }
  }

  show(
    root,
    el("h2", {}, "Counts"),
    el(
      "p",
      { class: "lead" },
      "Start from a survey or census series with the catches and releases of each year.",
    ),
    el(
      "div",
      { class: "row" },
      el("label", { for: "series-name" }, "Name of the series"),
      name,
      el("label", { for: "series-file", class: "file-label" }, "Choose a CSV file"),
      file,
    ),
    drop,
    demos,
    problems,
    el("div", { class: "two" }, view, chart),
  );
  void loadDemos();
}
