import "server-only";
import { readPdf } from "@/lib/pdf/parse";
import { containsHtmlMarkup, findEofTail, findPdfHeader, scanObjectNames, SNIFF_WINDOW } from "@/lib/pdf/scan";
import { identifySheet, pageTextLines, type SheetIdentity } from "@/lib/pdf/sheets";

export { checkUploadName, UPLOAD_NAME_MESSAGES, type UploadNameCode, type UploadNameResult } from "@/lib/pdf/upload-name";

export interface PdfLimits {
  /** Largest accepted file, bytes. */
  maxBytes: number;
  /** Most pages accepted in one file. */
  maxPages: number;
  /** Budget for parsing and reading every page, milliseconds. */
  timeoutMs?: number;
  /** Text kept per page, characters; 0 returns no text. */
  textCharsPerPage?: number;
}

export const DEFAULT_PDF_LIMITS = {
  maxBytes: 100_000_000,
  maxPages: 500,
  timeoutMs: 60_000,
  textCharsPerPage: 20_000,
} as const satisfies Required<PdfLimits>;

export type PdfRefusalCode =
  | "empty"
  | "too_large"
  | "not_pdf"
  | "polyglot"
  | "truncated"
  | "corrupt"
  | "encrypted"
  | "too_many_pages"
  | "javascript"
  | "timeout";

export type PdfInspection =
  | { ok: true; pageCount: number; sheets: SheetIdentity[]; text?: string[] }
  | { ok: false; code: PdfRefusalCode; message: string };

function formatBytes(n: number): string {
  if (n >= 1_000_000) return `${Number((n / 1_000_000).toFixed(1))} MB`;
  if (n >= 1_000) return `${Number((n / 1_000).toFixed(1))} kB`;
  return `${n} bytes`;
}

/** Plain-language reason for each refusal, written for the applicant who uploaded the file. */
export function pdfRefusalMessage(code: PdfRefusalCode, limits: PdfLimits, pageCount?: number): string {
  switch (code) {
    case "empty":
      return "The file is empty.";
    case "too_large":
      return `The file is larger than the ${formatBytes(limits.maxBytes)} limit. Split the set into smaller files, or reduce image resolution when exporting.`;
    case "not_pdf":
      return "The file is not a PDF, even though its name may end in .pdf. Export or print it to PDF and upload that.";
    case "polyglot":
      return "The file mixes a PDF with web page code (HTML), which is not accepted. Export the drawings again as a plain PDF.";
    case "truncated":
      return "The PDF is incomplete: its end is missing, as happens when a download or copy is cut short. Upload the complete file.";
    case "corrupt":
      return "The PDF is damaged and cannot be read. Open it in a PDF reader, save a fresh copy and upload that.";
    case "encrypted":
      return "The PDF is password-protected or encrypted. Upload a copy saved without a password or security settings.";
    case "too_many_pages":
      return `The PDF has ${pageCount ?? "too many"} pages; the limit is ${limits.maxPages} per file. Split the set into smaller files.`;
    case "javascript":
      return "The PDF contains JavaScript, which is refused for safety. Print or export it to a new PDF without scripts or form actions and upload that.";
    case "timeout":
      return "The PDF took too long to read. If it is very large or complex, split it into smaller files.";
  }
}

/**
 * Server-side intake check of an uploaded file, cheapest test first: size, header, markup,
 * tail, encryption and JavaScript names in the raw bytes, then a full parse with pdfjs that
 * reads every page's text for sheet numbers and titles.
 */
export async function inspectPdf(bytes: Uint8Array, limits: PdfLimits): Promise<PdfInspection> {
  const timeoutMs = limits.timeoutMs ?? DEFAULT_PDF_LIMITS.timeoutMs;
  const textCap = limits.textCharsPerPage ?? DEFAULT_PDF_LIMITS.textCharsPerPage;
  const refuse = (code: PdfRefusalCode, pageCount?: number): PdfInspection => ({
    ok: false,
    code,
    message: pdfRefusalMessage(code, limits, pageCount),
  });

  if (bytes.length === 0) return refuse("empty");
  if (bytes.length > limits.maxBytes) return refuse("too_large");
  const header = findPdfHeader(bytes);
  if (header === null) return refuse("not_pdf");
  const eof = findEofTail(bytes);
  // Markup before the header, in the bytes a browser sniffs, or after the last %%EOF.
  const suspect =
    containsHtmlMarkup(bytes.subarray(0, Math.max(header, SNIFF_WINDOW))) ||
    (eof !== null && eof < bytes.length && containsHtmlMarkup(bytes.subarray(eof)));
  if (suspect) return refuse("polyglot");
  if (eof === null) return refuse("truncated");
  const names = scanObjectNames(bytes, { start: header });
  if (names.htmlInComments) return refuse("polyglot");
  if (names.encrypt) return refuse("encrypted");
  if (names.javascript) return refuse("javascript");

  const read = await readPdf(bytes, { maxPages: limits.maxPages, timeoutMs });
  if (!read.ok) return refuse(read.code, read.pageCount);

  const sheets = read.pages.map(identifySheet);
  if (textCap <= 0) return { ok: true, pageCount: read.pageCount, sheets };
  const text = read.pages.map((p) => pageTextLines(p).join("\n").slice(0, textCap));
  return { ok: true, pageCount: read.pageCount, sheets, text };
}
