import { beforeAll, describe, expect, it } from "vitest";
import { inspectPdf } from "@/lib/pdf/inspect";
import { makeDrawingSet, sheetList, type FixtureSheet } from "@/tests/fixtures/pdf/make";

// A 200-sheet set, the size the viewer must stay fast on (issue 4); here the intake side.
describe("a 200-sheet drawing set", () => {
  let sheets: FixtureSheet[];
  let pdf: Uint8Array;
  beforeAll(async () => {
    sheets = sheetList(200);
    pdf = await makeDrawingSet({ sheets });
  }, 30_000);

  // Time is measured by the benchmark scripts, not asserted here.
  it("is inspected with every sheet number and title read back", async () => {
    const result = await inspectPdf(pdf, { maxBytes: 100_000_000, maxPages: 500 });
    if (!result.ok) throw new Error(result.message);
    expect(result.pageCount).toBe(200);
    expect(new Set(sheets.map((s) => s.number)).size).toBe(200);
    expect(result.sheets).toEqual(sheets.map((s, k) => ({ page: k + 1, sheetNumber: s.number, title: s.title })));
  }, 30_000);
});
