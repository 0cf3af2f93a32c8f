import { createHash } from "node:crypto";
import { crc32 } from "node:zlib";
import { PDFDocument } from "pdf-lib";
import { describe, expect, it } from "vitest";
import {
  makeCalcPackage,
  makeDrawingSet,
  makeEncryptedPdf,
  makeJavaScriptPdf,
  makePolyglot,
  makeRenamedPng,
  makeTruncatedPdf,
  sheetList,
} from "@/tests/fixtures/pdf/make";

const sha256 = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

// The fixtures feed the seed and browser tests, so they must be the same bytes every run.
describe("test PDFs", () => {
  it("are deterministic", async () => {
    const makers = [
      () => makeDrawingSet({ sheets: sheetList(4) }),
      () => makeDrawingSet({ sheets: sheetList(2), rotated: true, titleBlock: "corner" }),
      () => makeCalcPackage({ pages: [["FB-3  W = 160 plf"]] }),
      () => makeJavaScriptPdf("link"),
      () => makePolyglot("comment"),
      async () => makeEncryptedPdf(),
    ];
    for (const make of makers) expect(sha256(await make())).toBe(sha256(await make()));
  });

  it("drawing sets reopen in pdf-lib with one ARCH D page per sheet and fixed dates", async () => {
    const doc = await PDFDocument.load(await makeDrawingSet({ sheets: sheetList(6) }), { updateMetadata: false });
    expect(doc.getPageCount()).toBe(6);
    // ARCH D is 24 × 36 in (ASME Y14.1, from memory); 72 pt per inch (ISO 32000-1 §8.3.2.3).
    expect(doc.getPage(0).getSize()).toEqual({ width: 36 * 72, height: 24 * 72 });
    expect(doc.getCreationDate()?.toISOString()).toBe("2025-03-14T09:00:00.000Z");
    expect(doc.getAuthor()).toBe("Corbel & Finch Structural");
  });

  it("a rotated set is stored portrait with /Rotate 90", async () => {
    const doc = await PDFDocument.load(await makeDrawingSet({ sheets: sheetList(1), rotated: true }));
    const page = doc.getPage(0);
    expect(page.getRotation().angle).toBe(90);
    expect(page.getSize()).toEqual({ width: 24 * 72, height: 36 * 72 });
  });

  it("the renamed PNG is a well-formed PNG: chunk CRCs agree with zlib's CRC-32 (ISO/IEC 15948 §5.3)", () => {
    const png = Buffer.from(makeRenamedPng());
    let at = 8;
    const types: string[] = [];
    while (at < png.length) {
      const length = png.readUInt32BE(at);
      const typeAndData = png.subarray(at + 4, at + 8 + length);
      expect(png.readUInt32BE(at + 8 + length)).toBe(crc32(typeAndData));
      types.push(typeAndData.subarray(0, 4).toString("latin1"));
      at += 12 + length;
    }
    expect(types).toEqual(["IHDR", "IDAT", "IEND"]);
  });

  it("a truncated set is a strict prefix of the full set", async () => {
    const full = await makeDrawingSet({ sheets: sheetList(3) });
    const cut = await makeTruncatedPdf(0.6);
    expect(cut.length).toBe(Math.floor(full.length * 0.6));
    expect(Buffer.from(full.subarray(0, cut.length)).equals(Buffer.from(cut))).toBe(true);
  });
});
