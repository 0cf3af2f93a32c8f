import { describe, expect, it } from "vitest";
import { csvField, toCsv } from "@/lib/csv";

// RFC 4180 §2 (quoting rules) and OWASP's CSV injection guidance (leading = + - @ neutralised).
describe("CSV export", () => {
  it("quotes fields with commas, quotes and line breaks, doubling inner quotes", () => {
    expect(csvField("plain")).toBe("plain");
    expect(csvField("a,b")).toBe('"a,b"');
    expect(csvField('say "yes"')).toBe('"say ""yes"""');
    expect(csvField("two\nlines")).toBe('"two\nlines"');
    expect(csvField(null)).toBe("");
    expect(csvField(new Date("2026-12-01T08:30:00Z"))).toBe("2026-12-01T08:30:00.000Z");
  });
  it("never lets a spreadsheet read a cell as a formula", () => {
    expect(csvField("=HYPERLINK(\"x\")")).toBe("\"'=HYPERLINK(\"\"x\"\")\"");
    expect(csvField("+1")).toBe("'+1");
    expect(csvField("-2")).toBe("'-2");
    expect(csvField("@SUM(A1)")).toBe("'@SUM(A1)");
  });
  it("writes CRLF-terminated records", () => {
    expect(toCsv(["a", "b"], [[1, "x,y"]])).toBe('a,b\r\n1,"x,y"\r\n');
  });
});
