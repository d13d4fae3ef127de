// A fan chart as standalone SVG, for the printable report: nested percentile bands and
// the median of a quantity per year, with labelled axes and an optional dashed reference
// line (e.g. the limit reference point). Presentation only; the numbers come from src/.
import { escapeHtml } from "./text.js";

export interface FanChart {
  readonly title: string;
  readonly yLabel: string;
  readonly years: readonly number[];
  /** Percentile levels (increasing) and one series per level. */
  readonly levels: readonly number[];
  readonly series: readonly (readonly number[])[];
  readonly reference?: { readonly value: number; readonly label: string };
}

const W = 640;
const H = 300;
const M = { left: 64, right: 16, top: 28, bottom: 40 };
const esc = escapeHtml;

/** "Nice" axis ticks covering [lo, hi]: steps of 1, 2 or 5 × 10^k. */
export function niceTicks(lo: number, hi: number, target = 5): number[] {
  if (!(hi > lo)) return [lo];
  const raw = (hi - lo) / target;
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step)
    out.push(Number(v.toPrecision(12)));
  return out;
}

export function fanChartSvg(c: FanChart): string {
  const n = c.years.length;
  const x0 = c.years[0] ?? 0;
  const x1 = c.years[n - 1] ?? 1;
  let top = 0;
  for (const s of c.series) for (const v of s) top = Math.max(top, v);
  if (c.reference) top = Math.max(top, c.reference.value);
  const yTicks = niceTicks(0, top > 0 ? top * 1.05 : 1);
  // The axis ends at the first tick at or above the data.
  if (yTicks.length > 1 && yTicks[yTicks.length - 1]! < top)
    yTicks.push(Number((2 * yTicks[yTicks.length - 1]! - yTicks[yTicks.length - 2]!).toPrecision(12)));
  const yMax = yTicks[yTicks.length - 1]!;
  const px = (year: number) => M.left + ((year - x0) / (x1 - x0 || 1)) * (W - M.left - M.right);
  const py = (v: number) => H - M.bottom - (v / (yMax || 1)) * (H - M.top - M.bottom);
  const pts = (s: readonly number[]) => s.map((v, i) => `${px(c.years[i]!).toFixed(1)},${py(v).toFixed(1)}`);
  const parts: string[] = [];
  parts.push(
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${W} ${H}" role="img" aria-label="${esc(c.title)}" class="fan">`,
  );
  parts.push(`<text x="${M.left}" y="18" class="t">${esc(c.title)}</text>`);
  for (const t of yTicks) {
    parts.push(
      `<line x1="${M.left}" x2="${W - M.right}" y1="${py(t).toFixed(1)}" y2="${py(t).toFixed(1)}" class="g"/>`,
    );
    parts.push(
      `<text x="${M.left - 6}" y="${(py(t) + 4).toFixed(1)}" text-anchor="end" class="a">${t.toLocaleString("en-GB")}</text>`,
    );
  }
  for (const t of niceTicks(x0, x1, 8)) {
    parts.push(
      `<text x="${px(t).toFixed(1)}" y="${H - M.bottom + 16}" text-anchor="middle" class="a">${t}</text>`,
    );
  }
  parts.push(
    `<text x="14" y="${(H / 2).toFixed(0)}" transform="rotate(-90 14 ${(H / 2).toFixed(0)})" text-anchor="middle" class="a">${esc(c.yLabel)}</text>`,
  );
  // Bands from the outside in: (first, last), (second, second last), …
  const shades = ["#cfe3dd", "#9fc8bb", "#6aa797"];
  for (let b = 0; b < Math.floor(c.levels.length / 2); b++) {
    const lo = c.series[b]!;
    const hi = c.series[c.levels.length - 1 - b]!;
    const poly = [...pts(hi), ...pts(lo).reverse()].join(" ");
    parts.push(
      `<polygon points="${poly}" fill="${shades[Math.min(b, shades.length - 1)]}"><title>p${c.levels[b]}–p${c.levels[c.levels.length - 1 - b]}</title></polygon>`,
    );
  }
  const mid = c.series[Math.floor(c.levels.length / 2)]!;
  parts.push(
    `<polyline points="${pts(mid).join(" ")}" fill="none" stroke="#1d4d44" stroke-width="2"><title>median</title></polyline>`,
  );
  if (c.reference) {
    const y = py(c.reference.value).toFixed(1);
    parts.push(
      `<line x1="${M.left}" x2="${W - M.right}" y1="${y}" y2="${y}" stroke="#a33b20" stroke-dasharray="6 4"/>`,
    );
    parts.push(
      `<text x="${W - M.right}" y="${(Number(y) - 5).toFixed(1)}" text-anchor="end" class="a" fill="#a33b20">${esc(c.reference.label)}</text>`,
    );
  }
  parts.push(
    `<line x1="${M.left}" x2="${M.left}" y1="${M.top}" y2="${H - M.bottom}" class="ax"/><line x1="${M.left}" x2="${W - M.right}" y1="${H - M.bottom}" y2="${H - M.bottom}" class="ax"/>`,
  );
  parts.push("</svg>");
  return parts.join("");
}
