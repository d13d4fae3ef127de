import { describe, expect, it } from "vitest";
import { timeOrderedId } from "../../server/store/ids.js";

// The layout checked is RFC 9562 §5.7 (UUID version 7): 48-bit big-endian Unix milliseconds,
// version nibble 7, variant bits 10.
describe("timeOrderedId (RFC 9562 UUID version 7)", () => {
  it("has the version-7 layout and carries the time in its first 48 bits", () => {
    const t = Date.UTC(2026, 0, 2, 3, 4, 5, 678);
    const id = timeOrderedId(t);
    expect(id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-7[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(parseInt(id.slice(0, 8) + id.slice(9, 13), 16)).toBe(t);
  });

  it("never goes backwards, within a millisecond, across many ids, or when the clock steps back", () => {
    const t = Date.UTC(2026, 5, 1);
    const ids: string[] = [];
    for (let i = 0; i < 10_000; i++) ids.push(timeOrderedId(t)); // more than the 12-bit counter holds
    ids.push(timeOrderedId(t - 5000));
    for (let i = 1; i < ids.length; i++) expect(ids[i]! > ids[i - 1]!).toBe(true);
    expect(new Set(ids).size).toBe(ids.length);
  });
});
