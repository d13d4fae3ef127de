// Answers built from JSON text made elsewhere (a result the analysis thread serialised once,
// for the stored row and for the answer) without parsing it again and without slicing text.

/** JSON text already made by JSON.stringify, to be placed as one value of a larger document. */
export class JsonText {
  constructor(readonly text: string) {}
}

/**
 * JSON.stringify for plain objects and arrays whose values may be JsonText: keys and other
 * values are written as JSON.stringify writes them, a JsonText as its text; undefined
 * members are left out, as JSON.stringify leaves them out.
 */
export function serialise(value: unknown): string {
  if (value instanceof JsonText) return value.text;
  if (Array.isArray(value))
    return `[${value.map((v) => (v === undefined ? "null" : serialise(v))).join(",")}]`;
  if (value !== null && typeof value === "object" && Object.getPrototypeOf(value) === Object.prototype) {
    const members: string[] = [];
    for (const [k, v] of Object.entries(value))
      if (v !== undefined) members.push(`${JSON.stringify(k)}:${serialise(v)}`);
    return `{${members.join(",")}}`;
  }
  return JSON.stringify(value);
}
