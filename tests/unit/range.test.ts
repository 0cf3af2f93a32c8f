import { describe, expect, it } from "vitest";
import { parseRange } from "@/lib/api/range";

// RFC 9110 §14.1.2 examples, for a 10,000-byte representation.
describe("HTTP byte ranges", () => {
  it.each([
    ["bytes=0-499", { start: 0, end: 499 }], // the first 500 bytes
    ["bytes=500-999", { start: 500, end: 999 }], // the second 500 bytes
    ["bytes=-500", { start: 9500, end: 9999 }], // the final 500 bytes
    ["bytes=9500-", { start: 9500, end: 9999 }], // the final 500 bytes
    ["bytes=0-", { start: 0, end: 9999 }],
    ["bytes=9000-20000", { start: 9000, end: 9999 }], // last-pos beyond the end is clamped
    ["bytes=-20000", { start: 0, end: 9999 }],
  ])("%s", (header, expected) => {
    expect(parseRange(header, 10_000)).toEqual(expected);
  });

  it("answers 416 for a range that starts past the end, and ignores what it cannot serve", () => {
    expect(parseRange("bytes=10000-", 10_000)).toBe("unsatisfiable");
    expect(parseRange("bytes=-0", 10_000)).toBe("unsatisfiable");
    expect(parseRange("bytes=0-1,5-6", 10_000)).toBeNull();
    expect(parseRange("items=0-5", 10_000)).toBeNull();
    expect(parseRange("bytes=500-100", 10_000)).toBeNull();
    expect(parseRange(null, 10_000)).toBeNull();
  });
});
