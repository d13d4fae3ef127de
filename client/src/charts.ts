// The page's charts (chart.js). Every chart is kept by name so the Report step can offer it
// as a PNG. Presentation only: the numbers come from the API.
import {
  BarController,
  BarElement,
  CategoryScale,
  Chart,
  Filler,
  Legend,
  LinearScale,
  LineController,
  LineElement,
  PointElement,
  ScatterController,
  Title,
  Tooltip,
  type ChartConfiguration,
  type ChartDataset,
} from "chart.js";
import { el } from "./ui.js";

Chart.register(
  LineController,
  ScatterController,
  BarController,
  LineElement,
  PointElement,
  BarElement,
  LinearScale,
  CategoryScale,
  Filler,
  Legend,
  Tooltip,
  Title,
);
Chart.defaults.animation = false;
Chart.defaults.font.family = "system-ui, sans-serif";
Chart.defaults.color = "#2b3531";
Chart.defaults.maintainAspectRatio = false;

export const PALETTE = {
  ink: "#1d4d44",
  sea: "#2f7f8f",
  sand: "#c9a227",
  rust: "#a33b20",
  moss: "#6a8f3a",
  plum: "#6b4c8a",
  grey: "#7c8a84",
};
export const BANDS = ["rgba(47,127,143,0.16)", "rgba(47,127,143,0.28)", "rgba(47,127,143,0.42)"];

const charts = new Map<string, { chart: Chart; title: string }>();

/** All charts on the page, by name, with their titles (for PNG downloads). */
export function allCharts(): { name: string; title: string; chart: Chart }[] {
  return [...charts.entries()].map(([name, c]) => ({ name, title: c.title, chart: c.chart }));
}

/** The number of finite data points a chart draws (kept on the canvas as data-points). */
function pointCount(config: ChartConfiguration): number {
  let n = 0;
  for (const d of config.data.datasets)
    for (const v of d.data as unknown[])
      if (
        typeof v === "number"
          ? Number.isFinite(v)
          : v !== null && typeof v === "object" && Number.isFinite((v as { y: number }).y)
      )
        n++;
  return n;
}

/** Draws (or redraws in place) the chart called `name` inside `container`. */
export function drawChart(
  container: HTMLElement,
  name: string,
  title: string,
  config: ChartConfiguration,
): Chart {
  const existing = charts.get(name);
  if (existing && container.contains(existing.chart.canvas)) {
    existing.chart.data = config.data;
    if (config.options)
      existing.chart.options = {
        ...config.options,
        plugins: { ...config.options.plugins, title: { display: true, text: title } },
      };
    existing.chart.update("none");
    existing.chart.canvas.dataset.points = String(pointCount(config));
    return existing.chart;
  }
  existing?.chart.destroy();
  const canvas = el("canvas", {
    role: "img",
    "aria-label": title,
    "data-chart": name,
    "data-points": String(pointCount(config)),
  });
  container.replaceChildren(el("div", { class: "chart-box" }, canvas));
  const chart = new Chart(canvas, {
    ...config,
    options: {
      ...config.options,
      plugins: { ...config.options?.plugins, title: { display: true, text: title } },
    },
  });
  charts.set(name, { chart, title });
  return chart;
}

const axis = (title: string, extra: Record<string, unknown> = {}) => ({
  title: { display: true, text: title },
  ...extra,
});

export function countsChart(
  container: HTMLElement,
  years: number[],
  counts: (number | null)[],
  caught: number[],
  stocked: number[],
): Chart {
  return drawChart(container, "counts", "Survey counts, catch and stocking", {
    type: "bar",
    data: {
      labels: years,
      datasets: [
        {
          type: "line",
          label: "count",
          data: counts,
          borderColor: PALETTE.ink,
          backgroundColor: PALETTE.ink,
          spanGaps: false,
          yAxisID: "y",
        },
        { type: "bar", label: "catch", data: caught, backgroundColor: "rgba(201,162,39,0.6)", yAxisID: "y" },
        {
          type: "bar",
          label: "stocking",
          data: stocked,
          backgroundColor: "rgba(107,76,138,0.5)",
          yAxisID: "y",
        },
      ],
    },
    options: { scales: { x: axis("year"), y: axis("count, catch, stocking", { beginAtZero: true }) } },
  });
}

export function fitChart(
  container: HTMLElement,
  years: number[],
  observed: (number | null)[],
  fits: { label: string; fitted: (number | null)[] }[],
): Chart {
  const colours = [PALETTE.rust, PALETTE.sea, PALETTE.moss, PALETTE.plum];
  return drawChart(container, "fit", "Fitted curves over the counts", {
    type: "line",
    data: {
      labels: years,
      datasets: [
        {
          label: "observed",
          data: observed,
          showLine: false,
          pointRadius: 3,
          borderColor: PALETTE.ink,
          backgroundColor: PALETTE.ink,
        },
        ...fits.map((f, i) => ({
          label: f.label,
          data: f.fitted,
          pointRadius: 0,
          borderWidth: 2,
          borderColor: colours[i % colours.length],
          spanGaps: true,
        })),
      ],
    },
    options: { scales: { x: axis("year"), y: axis("count", { beginAtZero: true }) } },
  });
}

export function residualChart(
  container: HTMLElement,
  years: number[],
  residuals: (number | null)[],
  label: string,
): Chart {
  return drawChart(container, "residuals", `Standardised residuals: ${label}`, {
    type: "bar",
    data: {
      labels: years,
      datasets: [
        {
          label: "residual",
          data: residuals,
          backgroundColor: residuals.map((r) =>
            (r ?? 0) >= 0 ? "rgba(47,127,143,0.7)" : "rgba(163,59,32,0.7)",
          ),
        },
      ],
    },
    options: {
      plugins: { legend: { display: false } },
      scales: { x: axis("year"), y: axis("residual (sd units)") },
    },
  });
}

export function eigenChart(container: HTMLElement, eigs: { re: number; im: number }[]): Chart {
  const circle = Array.from({ length: 121 }, (_, i) => ({
    x: Math.cos((i / 60) * Math.PI),
    y: Math.sin((i / 60) * Math.PI),
  }));
  const lim = Math.max(1.2, ...eigs.map((e) => Math.hypot(e.re, e.im) * 1.1));
  return drawChart(container, "eigenvalues", "Eigenvalues and the unit circle", {
    type: "scatter",
    data: {
      datasets: [
        {
          label: "unit circle",
          data: circle,
          showLine: true,
          pointRadius: 0,
          borderColor: PALETTE.grey,
          borderWidth: 1,
        },
        {
          label: "eigenvalues",
          data: eigs.map((e) => ({ x: e.re, y: e.im })),
          pointRadius: 6,
          pointStyle: "crossRot",
          borderColor: PALETTE.rust,
          borderWidth: 2,
        },
      ],
    },
    options: {
      aspectRatio: 1,
      scales: {
        x: axis("real part", { min: -lim, max: lim }),
        y: axis("imaginary part", { min: -lim, max: lim }),
      },
    },
  });
}

/** Nested percentile bands and the median. */
export function fanChart(
  container: HTMLElement,
  name: string,
  title: string,
  years: number[],
  levels: number[],
  series: number[][],
  yLabel: string,
  reference?: { value: number; label: string },
): Chart {
  const n = levels.length;
  const datasets: ChartDataset<"line">[] = [];
  for (let b = 0; b < Math.floor(n / 2); b++) {
    datasets.push({ label: `p${levels[b]}`, data: series[b]!, pointRadius: 0, borderWidth: 0, fill: false });
    datasets.push({
      label: `p${levels[b]}–p${levels[n - 1 - b]}`,
      data: series[n - 1 - b]!,
      pointRadius: 0,
      borderWidth: 0,
      backgroundColor: BANDS[Math.min(b, BANDS.length - 1)],
      fill: "-1",
    });
  }
  datasets.push({
    label: "median",
    data: series[Math.floor(n / 2)]!,
    pointRadius: 0,
    borderWidth: 2,
    borderColor: PALETTE.ink,
    fill: false,
  });
  if (reference)
    datasets.push({
      label: reference.label,
      data: years.map(() => reference.value),
      pointRadius: 0,
      borderWidth: 1.5,
      borderDash: [6, 4],
      borderColor: PALETTE.rust,
      fill: false,
    });
  return drawChart(container, name, title, {
    type: "line",
    data: { labels: years, datasets },
    options: {
      plugins: { legend: { labels: { filter: (item) => !/^p\d+$/.test(item.text) } } },
      scales: { x: axis("year"), y: axis(yLabel, { beginAtZero: true }) },
    },
  });
}

export function bifurcationChart(
  container: HTMLElement,
  d: {
    parameter: string;
    values: number[];
    points: number[][];
    equilibrium: (number | null)[];
    stability: string[];
  },
  current: number,
): Chart {
  const pts: { x: number; y: number }[] = [];
  d.values.forEach((v, i) => d.points[i]!.forEach((p) => pts.push({ x: v, y: p })));
  const stable = d.values.map((v, i) => ({ x: v, y: d.stability[i] === "stable" ? d.equilibrium[i] : null }));
  const unstable = d.values.map((v, i) => ({
    x: v,
    y: d.stability[i] === "unstable" ? d.equilibrium[i] : null,
  }));
  const top = Math.max(1, ...pts.map((p) => p.y));
  return drawChart(container, "bifurcation", `Long-run abundance against ${d.parameter}`, {
    type: "scatter",
    data: {
      datasets: [
        { label: "long-run abundance", data: pts, pointRadius: 1.2, backgroundColor: PALETTE.ink },
        {
          label: "equilibrium, stable",
          data: stable as { x: number; y: number }[],
          showLine: true,
          pointRadius: 0,
          borderColor: PALETTE.sea,
          borderWidth: 2,
          spanGaps: false,
        },
        {
          label: "equilibrium, unstable",
          data: unstable as { x: number; y: number }[],
          showLine: true,
          pointRadius: 0,
          borderColor: PALETTE.rust,
          borderDash: [4, 3],
          borderWidth: 2,
          spanGaps: false,
        },
        {
          label: "current value",
          data: [
            { x: current, y: 0 },
            { x: current, y: top },
          ],
          showLine: true,
          pointRadius: 0,
          borderColor: PALETTE.sand,
          borderWidth: 2,
        },
      ],
    },
    options: { scales: { x: axis(d.parameter), y: axis("abundance", { beginAtZero: true }) } },
  });
}

const REGIME_COLOURS: Record<string, string> = {
  extinct: "#4a4a4a",
  equilibrium: "#9fc8bb",
  cycle: "#c9a227",
  "quasi-periodic": "#6b4c8a",
  irregular: "#a33b20",
  transient: "#d9d3c3",
};

export function regimeChart(
  container: HTMLElement,
  m: {
    x: { path: string; values: number[] };
    y: { path: string; values: number[] };
    regimes: string[];
    boundary: { x: number; y: number }[];
  },
  current: { x: number; y: number },
): Chart {
  const nx = m.x.values.length;
  const groups = new Map<string, { x: number; y: number }[]>();
  m.regimes.forEach((name, k) => {
    if (!groups.has(name)) groups.set(name, []);
    groups.get(name)!.push({ x: m.x.values[k % nx]!, y: m.y.values[Math.floor(k / nx)]! });
  });
  // Square cells that tile the (roughly square) plot area.
  const size = Math.max(2, Math.min(30, 440 / Math.max(nx, m.y.values.length)));
  return drawChart(container, "regime-map", `Regimes over ${m.x.path} × ${m.y.path}`, {
    type: "scatter",
    data: {
      datasets: [
        ...[...groups.entries()].map(([name, data]) => ({
          label: name,
          data,
          pointStyle: "rect" as const,
          pointRadius: size / 2 + 0.5,
          backgroundColor: REGIME_COLOURS[name] ?? PALETTE.grey,
          borderWidth: 0,
        })),
        {
          label: "stability boundary",
          data: m.boundary.map((b) => ({ x: b.x, y: b.y })),
          pointRadius: 4,
          backgroundColor: "#000",
          borderColor: "#fff",
          borderWidth: 1.5,
        },
        {
          label: "current rule",
          data: [current],
          pointStyle: "rectRot",
          pointRadius: 8,
          borderColor: "#000",
          backgroundColor: "#e8c766",
          borderWidth: 2,
        },
      ],
    },
    options: { scales: { x: axis(m.x.path), y: axis(m.y.path) } },
  });
}
