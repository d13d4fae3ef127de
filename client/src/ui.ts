// Small DOM helpers: elements, tables, number formats, job progress with a cancel button.
import { ApiError, del, watchJob, type JobView } from "./api.js";

type Child = Node | string | number | null | undefined | false;

/** Creates an element with attributes (`on*` keys become listeners) and children. */
export function el<K extends keyof HTMLElementTagNameMap>(
  tag: K,
  attrs: Record<string, unknown> = {},
  ...children: Child[]
): HTMLElementTagNameMap[K] {
  const node = document.createElement(tag);
  for (const [k, v] of Object.entries(attrs)) {
    if (v === undefined || v === null || v === false) continue;
    if (k.startsWith("on") && typeof v === "function") node.addEventListener(k.slice(2), v as EventListener);
    else if (k === "class") node.className = String(v);
    else if (k in node && typeof v !== "string") (node as unknown as Record<string, unknown>)[k] = v;
    else node.setAttribute(k, v === true ? "" : String(v));
  }
  for (const c of children)
    if (c !== null && c !== undefined && c !== false) node.append(c instanceof Node ? c : String(c));
  return node;
}

/** Numbers as a report shows them: thousands separators above 1,000, else 4 significant digits. */
export function fmt(v: unknown, digits = 4): string {
  if (typeof v !== "number" || !Number.isFinite(v)) return v === null || v === undefined ? "—" : String(v);
  if (Math.abs(v) >= 1000) return Math.round(v).toLocaleString("en-GB");
  if (v === 0) return "0";
  return String(Number(v.toPrecision(digits)));
}

export function pct(v: number): string {
  return `${(100 * v).toFixed(v < 0.1 ? 1 : 0)}%`;
}

/** A table with a caption, header cells scoped to columns, and numbers right-aligned. */
export function table(caption: string, header: string[], rows: unknown[][], id?: string): HTMLTableElement {
  return el(
    "table",
    { class: "data", ...(id ? { id } : {}) },
    el("caption", {}, caption),
    el("thead", {}, el("tr", {}, ...header.map((h) => el("th", { scope: "col" }, h)))),
    el(
      "tbody",
      {},
      ...rows.map((r) =>
        el(
          "tr",
          {},
          ...r.map((c) =>
            c instanceof Node
              ? el("td", {}, c)
              : el("td", { class: typeof c === "number" ? "num" : "" }, fmt(c)),
          ),
        ),
      ),
    ),
  );
}

/** Replaces a container's content. */
export function show(container: Element, ...children: Child[]): void {
  container.replaceChildren(
    ...children
      .filter((c): c is Node | string => c !== null && c !== undefined && c !== false)
      .map((c) => (c instanceof Node ? c : String(c))),
  );
}

/** A problem from the API, in words, with the field or row and column it names. */
export function problemText(e: unknown): string {
  if (e instanceof ApiError) {
    const p = e.problem;
    // A CSV problem's detail already names its row and column.
    return p.field && p.row === undefined ? `${p.detail} (field: ${p.field})` : p.detail;
  }
  return e instanceof Error ? e.message : String(e);
}

export function errorBox(e: unknown): HTMLElement {
  return el("p", { class: "error", role: "alert" }, problemText(e));
}

let statusTimer: ReturnType<typeof setTimeout> | undefined;

/** A short message in the status line (read out by screen readers), cleared after 6 s. */
export function setStatus(text: string): void {
  const s = document.getElementById("status");
  if (!s) return;
  s.textContent = text;
  clearTimeout(statusTimer);
  statusTimer = setTimeout(() => (s.textContent = ""), 6000);
}

/**
 * Runs a job with a progress bar and a Cancel button in `container`; resolves with the
 * finished job, or null when it was cancelled or failed (the reason is shown).
 */
export async function runJob(
  container: HTMLElement,
  label: string,
  start: () => Promise<{ job: JobView }>,
): Promise<JobView | null> {
  const bar = el("progress", { max: 1, value: 0, "aria-label": `${label}: progress` });
  const text = el("span", { class: "progress-text" }, "starting…");
  let jobRef: JobView | null = null;
  const cancel = el(
    "button",
    {
      type: "button",
      class: "secondary",
      onclick: () => jobRef && void del(jobRef.links.self).catch(() => undefined),
    },
    "Cancel",
  );
  show(container, el("div", { class: "job" }, el("strong", {}, label), bar, text, cancel));
  try {
    const { job } = await start();
    jobRef = job;
    const end = await watchJob(job, (f) => {
      bar.value = f;
      text.textContent = `${Math.round(f * 100)}%`;
    });
    cancel.remove();
    if (end.status === "done") {
      bar.value = 1;
      text.textContent = "done";
      return end;
    }
    show(
      container,
      el(
        "p",
        { class: end.status === "cancelled" ? "note" : "error", role: "alert" },
        end.status === "cancelled"
          ? `${label}: cancelled.`
          : `${label} failed: ${problemText(new ApiError({ type: "", title: "", status: 422, detail: describeJobError(end.error) }))}`,
      ),
    );
    return null;
  } catch (e) {
    show(container, errorBox(e));
    return null;
  }
}

function describeJobError(error: unknown): string {
  if (error && typeof error === "object") {
    const e = error as Record<string, unknown>;
    if (typeof e.detail === "string") return e.detail;
  }
  return "the server gave no reason";
}

/** A link that downloads a file from the API. */
export function downloadLink(href: string, label: string): HTMLAnchorElement {
  return el("a", { href, download: "", class: "download" }, label);
}
