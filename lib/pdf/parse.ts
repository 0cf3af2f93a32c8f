import "server-only";
import type { PDFDocumentProxy, TextItem, TextMarkedContent } from "pdfjs-dist/types/src/display/api";
import { loadPdfjs, pdfjsOptions } from "@/lib/pdf/pdfjs";
import type { PageText, PositionedText } from "@/lib/pdf/sheets";

export interface ReadLimits {
  /** Refuse documents with more pages than this. */
  maxPages: number;
  /** Wall-clock budget for opening the document and reading every page, milliseconds. */
  timeoutMs: number;
}

export type ReadResult =
  | { ok: true; pageCount: number; pages: PageText[] }
  | { ok: false; code: "encrypted" | "corrupt" | "too_many_pages" | "timeout" | "javascript"; pageCount?: number; detail?: string };

class Timeout extends Error {}

function isTextItem(it: TextItem | TextMarkedContent): it is TextItem {
  return "str" in it;
}

// pdfjs matrices are [a, b, c, d, e, f] (PDF 32000-1 §8.3.3).
function multiply(m: number[], n: number[]): number[] {
  const [a = 0, b = 0, c = 0, d = 0, e = 0, f = 0] = m;
  const [a2 = 0, b2 = 0, c2 = 0, d2 = 0, e2 = 0, f2 = 0] = n;
  return [a * a2 + c * b2, b * a2 + d * b2, a * c2 + c * d2, b * c2 + d * d2, a * e2 + c * f2 + e, b * e2 + d * f2 + f];
}

async function readPage(doc: PDFDocumentProxy, pageNumber: number): Promise<{ page: PageText; js: boolean }> {
  const page = await doc.getPage(pageNumber);
  try {
    const viewport = page.getViewport({ scale: 1 });
    const [content, js] = await Promise.all([page.getTextContent(), page.getJSActions()]);
    const items: PositionedText[] = [];
    for (const it of content.items) {
      if (!isTextItem(it) || it.str === "") continue;
      // Text space → displayed page (rotation and crop applied, y downward), points.
      const t = multiply(viewport.transform, it.transform);
      const fontSize = Math.hypot(t[2] ?? 0, t[3] ?? 0);
      items.push({ str: it.str, x: t[4] ?? 0, y: t[5] ?? 0, width: it.width, fontSize: fontSize || it.height });
    }
    return { page: { page: pageNumber, width: viewport.width, height: viewport.height, items }, js: js !== null && js.size > 0 };
  } finally {
    page.cleanup();
  }
}

/**
 * Opens the bytes with pdfjs and reads every page's positioned text. JavaScript is looked for
 * where pdfjs collects it: the catalog (names tree, /OpenAction, /AA), form fields, page /AA.
 * The timeout is checked between pages; one pathological page runs to its end before it is
 * noticed (parsing in a worker thread would make the limit hard).
 */
export async function readPdf(bytes: Uint8Array, limits: ReadLimits): Promise<ReadResult> {
  const pdfjs = await loadPdfjs();
  // pdfjs refuses Node Buffers and may transfer what it is given, so it gets its own copy.
  const task = pdfjs.getDocument(pdfjsOptions(new Uint8Array(bytes)));
  let timer: NodeJS.Timeout | undefined;
  let timedOut = false;
  const timeout = new Promise<never>((_, reject) => {
    timer = setTimeout(() => {
      timedOut = true;
      reject(new Timeout());
    }, limits.timeoutMs);
  });
  try {
    const work = (async (): Promise<ReadResult> => {
      const doc = await task.promise;
      const pageCount = doc.numPages;
      if (pageCount > limits.maxPages) return { ok: false, code: "too_many_pages", pageCount };
      const [docJs, anyJs] = await Promise.all([doc.getJSActions(), doc.hasJSActions()]);
      if ((docJs !== null && docJs.size > 0) || anyJs) return { ok: false, code: "javascript", pageCount };
      const pages: PageText[] = [];
      for (let n = 1; n <= pageCount; n++) {
        // In Node pdfjs runs on this thread and its messages are microtasks: yielding to the event
        // loop between pages lets other requests run and the timeout fire.
        await new Promise((resolve) => setImmediate(resolve));
        if (timedOut) throw new Timeout();
        const { page, js } = await readPage(doc, n);
        if (js) return { ok: false, code: "javascript", pageCount };
        pages.push(page);
      }
      return { ok: true, pageCount, pages };
    })();
    work.catch(() => undefined);
    return await Promise.race([work, timeout]);
  } catch (e) {
    if (e instanceof Timeout) return { ok: false, code: "timeout" };
    const name = e instanceof Error ? e.name : "";
    if (name === "PasswordException") return { ok: false, code: "encrypted" };
    return { ok: false, code: "corrupt", detail: e instanceof Error ? `${e.name}: ${e.message}` : String(e) };
  } finally {
    clearTimeout(timer);
    await task.destroy().catch(() => undefined);
  }
}
