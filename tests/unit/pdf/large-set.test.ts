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

  it("is inspected in reasonable time with every sheet number and title read back", async () => {
    const started = performance.now();
    const result = await inspectPdf(pdf, { maxBytes: 100_000_000, maxPages: 500 });
    const ms = performance.now() - started;
    console.info(`inspectPdf: 200 sheets, ${pdf.length} bytes, ${ms.toFixed(0)} ms`);
    if (!result.ok) throw new Error(result.message);
    expect(result.pageCount).toBe(200);
    expect(new Set(sheets.map((s) => s.number)).size).toBe(200);
    expect(result.sheets).toEqual(sheets.map((s, k) => ({ page: k + 1, sheetNumber: s.number, title: s.title })));
    // Budget on a shared 2-core machine; measured about 1–1.5 s.
    expect(ms).toBeLessThan(15_000);
  }, 30_000);
});
