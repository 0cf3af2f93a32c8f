import { beforeAll, describe, expect, it } from "vitest";
import { inspectPdf, pdfRefusalMessage, type PdfLimits, type PdfRefusalCode } from "@/lib/pdf/inspect";
import {
  makeBrokenPageTreePdf,
  makeCalcPackage,
  makeCorruptPdf,
  makeDrawingSet,
  makeEmptyFile,
  makeEncryptedPdf,
  makeEscapedJavaScriptPdf,
  makeJavaScriptPdf,
  makeManyPages,
  makeOpenAtFirstSheetPdf,
  makePolyglot,
  makeRenamedHtml,
  makeRenamedPng,
  makeTruncatedPdf,
  sheetList,
} from "@/tests/fixtures/pdf/make";

const limits: PdfLimits = { maxBytes: 20_000_000, maxPages: 50, timeoutMs: 20_000 };

const refusals: [string, () => Uint8Array | Promise<Uint8Array>, PdfRefusalCode][] = [
  ["an empty file", makeEmptyFile, "empty"],
  ["a PNG renamed .pdf", makeRenamedPng, "not_pdf"],
  ["a web page renamed .pdf", makeRenamedHtml, "not_pdf"],
  ["a set cut off at 60 %", () => makeTruncatedPdf(0.6), "truncated"],
  ["a set cut off at 99 %", () => makeTruncatedPdf(0.99), "truncated"],
  ["HTML ahead of the PDF header", () => makePolyglot("html-first"), "polyglot"],
  ["HTML in a comment after the header", () => makePolyglot("comment"), "polyglot"],
  ["HTML after %%EOF", () => makePolyglot("trailing"), "polyglot"],
  ["owner-password-only encryption (opens without asking)", () => makeEncryptedPdf(), "encrypted"],
  ["a user password", () => makeEncryptedPdf({ userPassword: "tamarack" }), "encrypted"],
  ["JavaScript as /OpenAction", () => makeJavaScriptPdf("open-action"), "javascript"],
  ["JavaScript in the names tree", () => makeJavaScriptPdf("names"), "javascript"],
  ["JavaScript as a page-open action", () => makeJavaScriptPdf("page-action"), "javascript"],
  ["JavaScript behind a link, packed in an object stream", () => makeJavaScriptPdf("link"), "javascript"],
  ["JavaScript under #-escaped names", makeEscapedJavaScriptPdf, "javascript"],
  ["garbage between a header and a tail", makeCorruptPdf, "corrupt"],
  ["a page tree pointing at nothing", makeBrokenPageTreePdf, "corrupt"],
  ["51 pages against a limit of 50", () => makeManyPages(51), "too_many_pages"],
];

describe("inspectPdf refusals", () => {
  it.each(refusals)("refuses %s as %s", async (_label, make, code) => {
    const result = await inspectPdf(await make(), limits);
    expect(result).toEqual({ ok: false, code, message: pdfRefusalMessage(code, limits, code === "too_many_pages" ? 51 : undefined) });
  });

  it("refuses a file over the byte limit before reading it", async () => {
    const big = new Uint8Array(2_500_001);
    big.set(new TextEncoder().encode("%PDF-1.7\n"));
    const result = await inspectPdf(big, { maxBytes: 2_500_000, maxPages: 10 });
    expect(result).toMatchObject({ ok: false, code: "too_large" });
    // The limit is stated in SI megabytes, 1 MB = 10^6 bytes (NIST SP 811 §4.3, from memory).
    expect(!result.ok && result.message).toContain("2.5 MB");
  });

  it("accepts a file of exactly the byte limit", async () => {
    const pdf = await makeDrawingSet({ sheets: sheetList(1) });
    expect((await inspectPdf(pdf, { maxBytes: pdf.length, maxPages: 1 })).ok).toBe(true);
  });

  it("times out rather than reading forever", async () => {
    const pdf = await makeDrawingSet({ sheets: sheetList(40) });
    expect(await inspectPdf(pdf, { maxBytes: 1e8, maxPages: 100, timeoutMs: 1 })).toMatchObject({ ok: false, code: "timeout" });
  });
});

describe("refusal messages", () => {
  const codes: PdfRefusalCode[] = [
    "empty",
    "too_large",
    "not_pdf",
    "polyglot",
    "truncated",
    "corrupt",
    "encrypted",
    "too_many_pages",
    "javascript",
    "timeout",
  ];

  it("gives every code its own sentence", () => {
    const messages = codes.map((c) => pdfRefusalMessage(c, limits, 51));
    expect(new Set(messages).size).toBe(codes.length);
    for (const m of messages) expect(m).toMatch(/^[A-Z].*\.$/);
  });

  it("says the empty file is empty, in the words of the brief", () => {
    expect(pdfRefusalMessage("empty", limits)).toBe("The file is empty.");
  });

  it("names JavaScript, encryption, the page count and the limit where they are the reason", () => {
    expect(pdfRefusalMessage("javascript", limits)).toMatch(/JavaScript/);
    expect(pdfRefusalMessage("encrypted", limits)).toMatch(/password|encrypt/i);
    expect(pdfRefusalMessage("too_many_pages", limits, 51)).toMatch(/\b51\b.*\b50\b/);
  });
});

describe("inspectPdf on accepted files", () => {
  let strip: Uint8Array;
  beforeAll(async () => {
    strip = await makeDrawingSet({
      sheets: [
        { number: "S-001", title: "GENERAL STRUCTURAL NOTES" },
        { number: "S-101", title: "FOUNDATION PLAN" },
        { number: "S-201", title: "SECOND FLOOR FRAMING PLAN" },
        { number: "S-301", title: "ROOF FRAMING PLAN" },
        { title: "SHEAR WALL ELEVATIONS" },
      ],
    });
  });

  it("reads page count, sheet numbers and titles from a captioned title strip", async () => {
    const result = await inspectPdf(strip, limits);
    expect(result).toMatchObject({
      ok: true,
      pageCount: 5,
      sheets: [
        { page: 1, sheetNumber: "S-001", title: "GENERAL STRUCTURAL NOTES" },
        { page: 2, sheetNumber: "S-101", title: "FOUNDATION PLAN" },
        { page: 3, sheetNumber: "S-201", title: "SECOND FLOOR FRAMING PLAN" },
        { page: 4, sheetNumber: "S-301", title: "ROOF FRAMING PLAN" },
        // No number printed: the captioned title is still read.
        { page: 5, sheetNumber: null, title: "SHEAR WALL ELEVATIONS" },
      ],
    });
  });

  it.each([
    ["an uncaptioned corner block", { titleBlock: "corner" as const }],
    ["pages stored portrait with /Rotate 90", { rotated: true }],
    ["plain objects, no object streams", { objectStreams: false }],
  ])("reads %s", async (_label, layout) => {
    const sheets = [
      { number: "A1.01", title: "FLOOR PLAN" },
      { number: "S2.1", title: "SECOND FLOOR FRAMING PLAN" },
      { number: "G-001", title: "COVER SHEET" },
    ];
    const result = await inspectPdf(await makeDrawingSet({ sheets, ...layout }), limits);
    expect(result.ok && result.sheets).toEqual(sheets.map((s, k) => ({ page: k + 1, sheetNumber: s.number, title: s.title })));
  });

  it("takes a Node Buffer as well as a Uint8Array (what storage readAll returns)", async () => {
    const result = await inspectPdf(Buffer.from(strip), limits);
    expect(result.ok && result.pageCount).toBe(5);
  });

  it("accepts an /OpenAction that only opens the first sheet", async () => {
    const result = await inspectPdf(await makeOpenAtFirstSheetPdf(), limits);
    expect(result).toMatchObject({ ok: true, pageCount: 1, sheets: [{ page: 1, sheetNumber: "S-101", title: "FOUNDATION PLAN" }] });
  });

  it("inspects several uploads at once without mixing them up", async () => {
    const sets = [sheetList(3), [{ number: "A1.01", title: "FLOOR PLAN" }], sheetList(7)];
    const results = await Promise.all(sets.map(async (sheets) => inspectPdf(await makeDrawingSet({ sheets }), limits)));
    results.forEach((r, k) => {
      expect(r.ok && r.sheets.map((s) => s.sheetNumber)).toEqual(sets[k]!.map((s) => s.number));
    });
  });

  it("falls back to 'Page n' without a title block", async () => {
    const result = await inspectPdf(await makeDrawingSet({ sheets: sheetList(2), titleBlock: "none" }), limits);
    expect(result.ok && result.sheets).toEqual([
      { page: 1, sheetNumber: null, title: "Page 1" },
      { page: 2, sheetNumber: null, title: "Page 2" },
    ]);
  });

  it("returns each page's text for a calc package, in reading order, capped", async () => {
    const line1 = "FB-3  W = 160 plf  L = 16'-0\"  2x12 DF-L No.2  Δ_L = 0.42 in < L/360 = 0.53 in";
    const pdf = await makeCalcPackage({ pages: [[line1, "FB-4  W = 210 plf  L = 12'-0\"  4x10 DF-L No.2"], ["ROOF BEAM RB-1"]] });
    const result = await inspectPdf(pdf, limits);
    if (!result.ok) throw new Error(result.message);
    expect(result.sheets).toEqual([
      { page: 1, sheetNumber: null, title: "Page 1" },
      { page: 2, sheetNumber: null, title: "Page 2" },
    ]);
    const text = result.text ?? [];
    expect(text).toHaveLength(2);
    // pdfjs maps the Symbol font's glyph "Delta" (its built-in encoding, ISO 32000-1 Annex D.5)
    // to U+2206 INCREMENT rather than U+0394; either is a delta. Runs of spaces collapse.
    const flat = (text[0] ?? "").replace(/[\u0394\u2206]/g, "Δ").replace(/ +/g, " ");
    expect(flat).toContain("FB-3 W = 160 plf L = 16'-0\" 2x12 DF-L No.2 Δ_L = 0.42 in < L/360 = 0.53 in");
    expect(flat.indexOf("FB-3")).toBeLessThan(flat.indexOf("FB-4"));
    expect(text[1]).toContain("ROOF BEAM RB-1");

    const capped = await inspectPdf(pdf, { ...limits, textCharsPerPage: 40 });
    expect(capped.ok && capped.text?.map((t) => t.length)).toEqual([40, 40]);
    const none = await inspectPdf(pdf, { ...limits, textCharsPerPage: 0 });
    expect(none.ok && none.text).toBeUndefined();
  });
});
