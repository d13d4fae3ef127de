import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { JsonText, serialise } from "../../server/http/json-text.js";

// The answers' serialiser against the plain reference, JSON.stringify (ECMA-262 §25.5.2),
// on generated JSON values; property: common practice, no source.
describe("serialise", () => {
  it("writes plain JSON values exactly as JSON.stringify does", () => {
    fc.assert(
      fc.property(fc.jsonValue(), (v) => {
        expect(serialise(v)).toBe(JSON.stringify(v));
      }),
      { numRuns: 2000, seed: 20261202 },
    );
  });

  it("places JSON text made elsewhere as a value, so the whole parses to the intended document", () => {
    fc.assert(
      fc.property(fc.dictionary(fc.string(), fc.jsonValue()), fc.jsonValue(), (envelope, inner) => {
        const doc = { ...envelope, "the result": new JsonText(JSON.stringify(inner)), gone: undefined };
        expect(JSON.parse(serialise(doc))).toEqual(
          JSON.parse(JSON.stringify({ ...envelope, "the result": inner })),
        );
      }),
      { numRuns: 1000, seed: 20261203 },
    );
  });
});
