import { describe, expect, it } from "vitest";
import { readPdf } from "@/lib/pdf/parse";
import { makeDrawingSet, makeEncryptedPdf, makeJavaScriptPdf, makeManyPages } from "@/tests/fixtures/pdf/make";

// The pdfjs layer on its own, behind the byte checks: what it refuses without their help.
const limits = { maxPages: 50, timeoutMs: 20_000 };

describe("readPdf (pdfjs)", () => {
  it("raises PasswordException for a user password, reported as encrypted", async () => {
    expect(await readPdf(makeEncryptedPdf({ userPassword: "tamarack" }), limits)).toEqual({ ok: false, code: "encrypted" });
  });

  it("opens owner-only encryption and decrypts it — which is why /Encrypt is checked in the bytes", async () => {
    // The text only comes out right if RC4 key and padding follow ISO 32000-1 §7.6.3.3.
    const result = await readPdf(makeEncryptedPdf(), limits);
    expect(result.ok).toBe(true);
    const strings = result.ok ? result.pages[0]?.items.map((i) => i.str) : [];
    expect(strings).toEqual(["ENCRYPTED SHEET S-101", "FOUNDATION PLAN", "Corbel & Finch Structural, Larkspur Falls"]);
  });

  it.each(["open-action", "names", "page-action"] as const)("finds JavaScript placed as %s, even packed in object streams", async (placement) => {
    expect(await readPdf(await makeJavaScriptPdf(placement, { objectStreams: true }), limits)).toMatchObject({ ok: false, code: "javascript" });
  });

  it("counts pages before reading them", async () => {
    expect(await readPdf(await makeManyPages(60), limits)).toEqual({ ok: false, code: "too_many_pages", pageCount: 60 });
  });

  it("places text in displayed coordinates, y down, rotation applied", async () => {
    const sheets = [{ number: "S-101", title: "FOUNDATION PLAN" }];
    for (const rotated of [false, true]) {
      const result = await readPdf(await makeDrawingSet({ sheets, rotated }), limits);
      if (!result.ok) throw new Error(result.code);
      const page = result.pages[0]!;
      // ARCH D landscape as displayed: 36 × 24 in = 2592 × 1728 pt (ASME Y14.1, from memory).
      expect([page.width, page.height]).toEqual([2592, 1728]);
      const number = page.items.find((i) => i.str === "S-101" && i.fontSize > 30)!;
      // Drawn 40 pt high with its baseline 80 pt above the bottom edge, 2318 pt from the left.
      expect(number.fontSize).toBeCloseTo(40, 6);
      expect(number.x).toBeCloseTo(2592 - 36 - 252 + 14, 6);
      expect(number.y).toBeCloseTo(1728 - (36 + 44), 6);
    }
  });
});
