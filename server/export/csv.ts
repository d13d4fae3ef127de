// RFC 4180 CSV: CRLF line ends, one header row, fields quoted when they hold a comma, a
// quote, CR or LF, with quotes doubled. Numbers are written with up to 10 significant
// digits (a table for a report, not a store); null or undefined is an empty field.
export type Cell = string | number | boolean | null | undefined;

export function csvField(v: Cell): string {
  if (v === null || v === undefined) return "";
  const s = typeof v === "number" ? (Number.isFinite(v) ? String(Number(v.toPrecision(10))) : "") : String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function toCsv(header: readonly string[], rows: readonly (readonly Cell[])[]): string {
  return `${[header, ...rows].map((r) => r.map(csvField).join(",")).join("\r\n")}\r\n`;
}
