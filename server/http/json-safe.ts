// Turns core results into plain JSON: typed arrays become arrays, built objects (a rule's
// harvest function, a model's growth family, a closed loop) are dropped, and a non-finite
// number — which the core never returns — would become null rather than break the JSON.
const DROP = new Set(["harvest", "growth", "loop"]);

export function jsonSafe(value: unknown): unknown {
  if (typeof value === "number") return Number.isFinite(value) ? value : null;
  if (value === null || typeof value !== "object") return value;
  if (ArrayBuffer.isView(value)) return Array.from(value as unknown as ArrayLike<number>, (v) => jsonSafe(v));
  if (Array.isArray(value)) return value.map(jsonSafe);
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(value)) {
    if (DROP.has(k) || typeof v === "function") continue;
    out[k] = jsonSafe(v);
  }
  return out;
}
