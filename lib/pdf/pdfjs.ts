import "server-only";
import path from "node:path";
import type { DocumentInitParameters } from "pdfjs-dist/types/src/display/api";

type Pdfjs = typeof import("pdfjs-dist/legacy/build/pdf.mjs");

let loading: Promise<Pdfjs> | undefined;

// Node 20 lacks Promise.withResolvers (Node 22+); pdfjs calls it at module scope and per document.
function polyfillWithResolvers(): void {
  if (typeof (Promise as { withResolvers?: unknown }).withResolvers === "function") return;
  Object.defineProperty(Promise, "withResolvers", {
    configurable: true,
    writable: true,
    value: function withResolvers<T>() {
      let resolve!: (value: T | PromiseLike<T>) => void;
      let reject!: (reason?: unknown) => void;
      const promise = new Promise<T>((res, rej) => {
        resolve = res;
        reject = rej;
      });
      return { promise, resolve, reject };
    },
  });
}

/**
 * The legacy (Node-compatible) pdfjs build, loaded once. In Node pdfjs parses on the main thread
 * ("fake worker"); the worker module is imported here and handed over through
 * `globalThis.pdfjsWorker` so pdfjs never resolves "./pdf.worker.mjs" relative to a bundle.
 */
export function loadPdfjs(): Promise<Pdfjs> {
  loading ??= (async () => {
    polyfillWithResolvers();
    const [pdfjs, worker] = await Promise.all([
      import("pdfjs-dist/legacy/build/pdf.mjs"),
      import("pdfjs-dist/legacy/build/pdf.worker.mjs"),
    ]);
    const g = globalThis as { pdfjsWorker?: { WorkerMessageHandler: unknown } };
    g.pdfjsWorker ??= { WorkerMessageHandler: worker.WorkerMessageHandler };
    return pdfjs;
  })();
  loading.catch(() => {
    loading = undefined;
  });
  return loading;
}

/**
 * getDocument options for untrusted uploads.
 * - `isEvalSupported` is gone from pdfjs 5+ (no eval left to switch off); it is still passed so a
 *   downgrade to a version that has it (≤ 4.1 was open to CVE-2024-4367) keeps it off.
 * - `enableScripting` is not a getDocument option in 6.5 (it belongs to the viewer's annotation
 *   layer); the server never runs the scripting sandbox, and JavaScript is refused outright.
 * - Font faces and system fonts are off: text extraction needs neither, and they reach outside.
 */
export function pdfjsOptions(data: Uint8Array): DocumentInitParameters & { isEvalSupported: false } {
  return {
    data,
    isEvalSupported: false,
    disableFontFace: true,
    useSystemFonts: false,
    useWorkerFetch: false,
    disableAutoFetch: true,
    stopAtErrors: false,
    verbosity: 0,
    standardFontDataUrl: path.join(process.cwd(), "node_modules/pdfjs-dist/standard_fonts") + "/",
    cMapUrl: path.join(process.cwd(), "node_modules/pdfjs-dist/cmaps") + "/",
    cMapPacked: true,
  };
}
