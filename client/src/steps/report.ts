// Step 5: the printable report, and every table as CSV and every chart as PNG.
import { postJson } from "../api.js";
import { allCharts } from "../charts.js";
import { onChange, scenarioSpec, state } from "../state.js";
import { el, errorBox, setStatus, show } from "../ui.js";

export function reportStep(root: HTMLElement): void {
  const links = el("div", { id: "report-links" });
  const files = el("ul", { id: "downloads" });
  const pngs = el("ul", { id: "chart-downloads" });
  const build = el(
    "button",
    { type: "button", id: "report-build", onclick: () => void makeReport() },
    "Prepare the printable report",
  );

  async function makeReport(): Promise<void> {
    const spec = scenarioSpec();
    if (!spec) return show(links, el("p", { class: "note" }, "Choose a model and a rule first."));
    try {
      const sc = await postJson<{ id: string }>("/api/v1/scenarios", {
        name: state.scenarioName,
        spec: { ...spec, uncertainty: state.uncertainty },
      });
      const q = new URLSearchParams({ scenario: sc.id });
      if (state.fitId) q.set("fit", state.fitId);
      if (state.projectionId) q.set("projection", state.projectionId);
      if (state.comparisonId) q.set("comparison", state.comparisonId);
      show(
        links,
        el(
          "p",
          {},
          el(
            "a",
            { href: `/api/v1/report?${q}`, target: "_blank", rel: "noopener", id: "report-link" },
            "Open the printable report",
          ),
          " — print it from the browser (it is laid out for paper).",
        ),
      );
      setStatus("The report is ready.");
    } catch (e) {
      show(links, errorBox(e));
    }
  }

  function refresh(): void {
    const items: [string, string][] = [];
    if (state.series) items.push([`/api/v1/series/${state.series.id}/csv`, "the series"]);
    if (state.fitId) items.push([`/api/v1/fits/${state.fitId}/table.csv`, "the fitted models"]);
    if (state.stabilityId) items.push([`/api/v1/analyses/${state.stabilityId}/table.csv`, "the equilibria"]);
    if (state.projectionId)
      items.push(
        [`/api/v1/projections/${state.projectionId}/table.csv`, "the projection by year"],
        [`/api/v1/projections/${state.projectionId}/risk.csv`, "the risk table"],
      );
    if (state.comparisonId)
      items.push([`/api/v1/comparisons/${state.comparisonId}/table.csv`, "the rule comparison"]);
    show(
      files,
      ...items.map(([href, label]) => el("li", {}, el("a", { href, download: "" }, `CSV: ${label}`))),
    );
    show(
      pngs,
      ...allCharts().map(({ name, title, chart }) =>
        el(
          "li",
          {},
          el(
            "a",
            { href: chart.toBase64Image("image/png", 1), download: `${name}.png`, "data-png": name },
            `PNG: ${title}`,
          ),
        ),
      ),
    );
  }

  show(
    root,
    el("h2", {}, "Report"),
    el(
      "p",
      { class: "lead" },
      "A page for the management meeting: the scenario, the fit, the stability verdict and its margin, the fan charts, the risks, the rules compared, the caution and where every number came from.",
    ),
    build,
    links,
    el("h3", {}, "Tables"),
    files,
    el("h3", {}, "Charts"),
    pngs,
  );
  onChange(refresh);
}
