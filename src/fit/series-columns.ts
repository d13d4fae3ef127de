import type { Issue } from "../issues.js";

/** What a column of a series CSV is read as. */
export type ColumnRole = "year" | "count" | "catch" | "stocking" | "cv" | "index";

/** One column of an uploaded series: its header as written, its role and its declared unit. */
export interface SeriesColumn {
  readonly column: string;
  readonly readAs: ColumnRole;
  /** The unit declared in the header ("Catch (t)", "catch_kg"), or null. */
  readonly unit: string | null;
}

/** The header names each role accepts (compared in lower case, after the unit is taken off). */
export const COLUMN_NAMES: Readonly<Record<Exclude<ColumnRole, "index">, readonly string[]>> = {
  year: ["year"],
  count: ["count", "index", "abundance"],
  catch: ["catch"],
  stocking: ["stocking"],
  cv: ["cv"],
};

/** Words that make a column look like a catch, stocking or error column (common practice, no source). */
const SUSPICIOUS = /catch|harvest|landing|removal|cull|kill|take|stock|release|cv|se$|^se|error|sd$/;

/**
 * A header cell split into its name and a declared unit: "Catch (t)" → catch, t;
 * "catch_kg" → catch, kg (a suffix after the last underscore, when the rest is a name this
 * table accepts); a plain name has no unit.
 */
export function splitHeader(header: string): { name: string; unit: string | null } {
  const h = header.trim();
  const paren = /^(.*?)\s*[([]\s*([^)\]]+?)\s*[)\]]$/.exec(h);
  if (paren) return { name: paren[1]!.toLowerCase(), unit: paren[2]! };
  const lower = h.toLowerCase();
  const cut = lower.lastIndexOf("_");
  if (cut > 0) {
    const base = lower.slice(0, cut);
    if (Object.values(COLUMN_NAMES).some((names) => names.includes(base)) && base !== "year")
      return { name: base, unit: h.slice(cut + 1) };
  }
  return { name: lower, unit: null };
}

/**
 * The role of every column of a header row, or the issue that stops the file being read: a
 * missing year or count column, or a column whose name suggests a catch, stocking or error
 * column but that is not one of the names accepted (never read in silence as an index).
 */
export function mapColumns(
  header: readonly string[],
): { ok: true; columns: SeriesColumn[] } | { ok: false; issue: Issue } {
  const split = header.map(splitHeader);
  const roleOf = (name: string): Exclude<ColumnRole, "index"> | null => {
    for (const [role, names] of Object.entries(COLUMN_NAMES)) if (names.includes(name)) return role as never;
    return null;
  };
  const taken = new Set<ColumnRole>();
  const columns: SeriesColumn[] = split.map((s, i) => {
    let role: ColumnRole = roleOf(s.name) ?? "index";
    if (role !== "index" && taken.has(role)) role = "index"; // a second count column is a further index
    taken.add(role);
    return { column: header[i]!, readAs: role, unit: s.unit };
  });
  if (!taken.has("year"))
    return { ok: false, issue: { code: "csv_missing_column", column: "year", allowed: COLUMN_NAMES.year } };
  if (!taken.has("count"))
    return { ok: false, issue: { code: "csv_missing_column", column: "count", allowed: COLUMN_NAMES.count } };
  for (const c of columns) {
    const name = splitHeader(c.column).name;
    if (c.readAs === "index" && SUSPICIOUS.test(name) && !COLUMN_NAMES.count.includes(name)) {
      return {
        ok: false,
        issue: {
          code: "csv_unrecognised_column",
          column: c.column,
          allowed: [...COLUMN_NAMES.catch, ...COLUMN_NAMES.stocking, ...COLUMN_NAMES.cv],
        },
      };
    }
  }
  return { ok: true, columns };
}
