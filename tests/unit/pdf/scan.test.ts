import { describe, expect, it } from "vitest";
import { containsHtmlMarkup, findEofTail, findPdfHeader, scanObjectNames } from "@/lib/pdf/scan";
import {
  makeDrawingSet,
  makeEncryptedPdf,
  makeEscapedJavaScriptPdf,
  makeJavaScriptPdf,
  makeMentionsOnlyPdf,
  makeRenamedPng,
} from "@/tests/fixtures/pdf/make";

const ascii = (s: string) => new TextEncoder().encode(s);

function withPrefix(prefixLength: number, body: string): Uint8Array {
  return ascii(" ".repeat(prefixLength) + body);
}

describe("findPdfHeader", () => {
  // PDF Reference 1.7, implementation note 13 (from memory): the header may start anywhere in
  // the first 1024 bytes.
  it("finds %PDF- at 0 and anywhere up to byte 1023", () => {
    expect(findPdfHeader(ascii("%PDF-1.7\n"))).toBe(0);
    expect(findPdfHeader(withPrefix(1023, "%PDF-1.7\n"))).toBe(1023);
  });

  it("does not look past the first 1024 bytes", () => {
    expect(findPdfHeader(withPrefix(1024, "%PDF-1.7\n"))).toBeNull();
  });

  it("refuses a PNG: its signature is 89 50 4E 47 0D 0A 1A 0A (ISO/IEC 15948 §5.2)", () => {
    const png = makeRenamedPng();
    expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    expect(findPdfHeader(png)).toBeNull();
  });

  it("needs the whole five-byte token", () => {
    expect(findPdfHeader(ascii("%PDF"))).toBeNull();
    expect(findPdfHeader(ascii("%PDX-1.7"))).toBeNull();
  });
});

describe("findEofTail", () => {
  const body = "%PDF-1.4\n1 0 obj\n<< >>\nendobj\nxref\n0 1\n0000000000 65535 f \ntrailer\n<< /Size 1 >>\n";
  it("accepts startxref <offset> %%EOF at the end", () => {
    const bytes = ascii(`${body}startxref\n29\n%%EOF\n`);
    expect(findEofTail(bytes)).toBe(bytes.length - 1);
  });

  it("accepts %%EOF followed by fewer than 1024 bytes of padding (PDF Reference 1.7, note 18, from memory)", () => {
    expect(findEofTail(ascii(`${body}startxref\n29\n%%EOF\n${"\0".repeat(1000)}`))).not.toBeNull();
  });

  it("refuses %%EOF further than 1024 bytes from the end", () => {
    expect(findEofTail(ascii(`${body}startxref\n29\n%%EOF\n${"\0".repeat(1100)}`))).toBeNull();
  });

  it("refuses a file with no %%EOF, a missing offset, or an offset past the end", () => {
    expect(findEofTail(ascii(`${body}startxref\n29\n`))).toBeNull();
    expect(findEofTail(ascii(`${body}startxref\n%%EOF\n`))).toBeNull();
    expect(findEofTail(ascii(`${body}startxref\n999999\n%%EOF\n`))).toBeNull();
  });
});

describe("containsHtmlMarkup", () => {
  it.each(["<!DOCTYPE html>", "<html>", "<SCRIPT src=x>", "<body onload=x>", "<svg/onload=x>", "<iframe src=x>", '<a href="x">'])(
    "flags %s",
    (s) => {
      expect(containsHtmlMarkup(ascii(`%PDF-1.7\n%${s}\n`))).toBe(true);
    },
  );

  it("does not flag PDF dictionaries or an XMP packet", () => {
    const xmp = '<?xpacket begin="" id="W5M0MpCehiHzreSzNTczkc9d"?><x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF></rdf:RDF></x:xmpmeta>';
    expect(containsHtmlMarkup(ascii(`%PDF-1.7\n1 0 obj\n<< /Type /Catalog /Pages 2 0 R >>\nendobj\n${xmp}`))).toBe(false);
  });
});

describe("scanObjectNames", () => {
  it("sees nothing in a plain drawing set, packed or not", async () => {
    for (const objectStreams of [true, false]) {
      const pdf = await makeDrawingSet({ sheets: [{ number: "S-101", title: "FOUNDATION PLAN" }], objectStreams });
      expect(scanObjectNames(pdf)).toEqual({ encrypt: false, javascript: false, htmlInComments: false });
    }
  });

  it("finds /Encrypt in the trailer", () => {
    expect(scanObjectNames(makeEncryptedPdf()).encrypt).toBe(true);
  });

  it("finds JavaScript names written with #xx escapes (ISO 32000-1 §7.3.5)", () => {
    expect(scanObjectNames(makeEscapedJavaScriptPdf()).javascript).toBe(true);
  });

  it("finds a link's JavaScript action in plain objects and inside a compressed object stream", async () => {
    const plain = await makeJavaScriptPdf("link", { objectStreams: false });
    const packed = await makeJavaScriptPdf("link", { objectStreams: true });
    // The packed file really hides the name from a plain byte search.
    expect(Buffer.from(packed).includes("/JavaScript")).toBe(false);
    expect(Buffer.from(plain).includes("/JavaScript")).toBe(true);
    expect(scanObjectNames(plain).javascript).toBe(true);
    expect(scanObjectNames(packed).javascript).toBe(true);
  });

  it("misses a packed action when object streams are not inflated (budget 0)", async () => {
    const packed = await makeJavaScriptPdf("link", { objectStreams: true });
    expect(scanObjectNames(packed, { maxInflatedBytes: 0 }).javascript).toBe(false);
  });

  it("is not fooled by the words in page text, literal strings or hex strings", () => {
    const pdf = makeMentionsOnlyPdf();
    expect(Buffer.from(pdf).includes("/Encrypt")).toBe(true);
    expect(scanObjectNames(pdf)).toEqual({ encrypt: false, javascript: false, htmlInComments: false });
  });
});
