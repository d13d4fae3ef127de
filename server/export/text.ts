// How numbers and text are written into reports and terminal tables.

/** A number as a report shows it: whole with thousands separators from 1,000, else `digits` significant digits; "—" for none. */
export function formatNumber(v: unknown, digits = 4): string {
  if (typeof v !== "number") return v === null || v === undefined ? "—" : String(v);
  return Math.abs(v) >= 1000 ? Math.round(v).toLocaleString("en-GB") : String(Number(v.toPrecision(digits)));
}

/** A table cell as a report shows it: numbers by formatNumber, except in a "year" column (a calendar year, not a quantity: no separator); "—" for none. */
export function formatCell(column: string | undefined, v: unknown): string {
  if (typeof v === "number") return column === "year" ? String(v) : formatNumber(v);
  return v === null || v === undefined ? "—" : String(v);
}

/** Text made safe inside HTML or SVG, in element content and in quoted attributes. */
export function escapeHtml(s: unknown): string {
  return String(s ?? "").replace(
    /[&<>"']/g,
    (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!,
  );
}
