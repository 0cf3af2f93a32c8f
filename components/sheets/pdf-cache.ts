// One pdf.js worker and one PDFDocumentProxy per document for a viewer's lifetime, plus the
// thumbnail images. Browser only: create it inside an effect, destroy it on unmount.
import type { PDFDocumentLoadingTask, PDFDocumentProxy, PDFPageProxy, PDFWorker } from "pdfjs-dist";
import type { ViewerDocument } from "@/components/sheets/viewer-types";

type Pdfjs = typeof import("pdfjs-dist");

/** Copied from node_modules by scripts/copy-pdf-worker.mjs before dev and build. */
export const PDF_WORKER_SRC = "/pdf.worker.min.mjs";

/** Paper colour behind the drawing: the --color-sheet token. */
export const SHEET_BACKGROUND = "#fffdf8";

/** Thumbnail width, CSS px. */
export const THUMBNAIL_WIDTH = 96;

let pdfjsPromise: Promise<Pdfjs> | null = null;

/** The library is fetched on first use only, so pages without a viewer never load it. */
export function loadPdfjs(): Promise<Pdfjs> {
  pdfjsPromise ??= import("pdfjs-dist").then(
    (m) => {
      m.GlobalWorkerOptions.workerSrc = PDF_WORKER_SRC;
      return m;
    },
    (error: unknown) => {
      pdfjsPromise = null;
      throw error;
    },
  );
  return pdfjsPromise;
}

interface ThumbnailJob {
  /** Callers still waiting; aborted callers subtract themselves. */
  interest: number;
  promise: Promise<string>;
  run: () => Promise<void>;
  reject: (reason: unknown) => void;
}

export class PdfCache {
  readonly #pdfjs: Pdfjs;
  readonly #worker: PDFWorker;
  readonly #tasks = new Map<number, PDFDocumentLoadingTask>();
  readonly #thumbnails = new Map<string, string>();
  readonly #pending = new Map<string, ThumbnailJob>();
  readonly #retained = new Map<string, number>();
  readonly #queue: ThumbnailJob[] = [];
  #thumbnailRunning = false;
  #destroyed = false;

  constructor(pdfjs: Pdfjs) {
    this.#pdfjs = pdfjs;
    // Shared by every document of the viewer: one thread, not one per file.
    this.#worker = new pdfjs.PDFWorker({ verbosity: pdfjs.VerbosityLevel.ERRORS });
  }

  get destroyed(): boolean {
    return this.#destroyed;
  }

  getDocument(doc: ViewerDocument): Promise<PDFDocumentProxy> {
    if (this.#destroyed) return Promise.reject(new Error("viewer closed"));
    let task = this.#tasks.get(doc.id);
    if (!task) {
      task = this.#pdfjs.getDocument({
        url: doc.url,
        worker: this.#worker,
        // Range requests fetch only the pages looked at when the server allows them.
        disableStream: true,
        disableAutoFetch: true,
        // No renderer worker file is shipped; pages draw on the main thread.
        disableWorkerRendering: true,
        enableXfa: false,
        verbosity: this.#pdfjs.VerbosityLevel.ERRORS,
      });
      this.#tasks.set(doc.id, task);
      const failed = task;
      // A failed load is forgotten so a later visit can try again.
      task.promise.catch(() => {
        if (this.#tasks.get(doc.id) === failed) this.#tasks.delete(doc.id);
      });
    }
    return task.promise;
  }

  async getPage(doc: ViewerDocument, pageNumber: number): Promise<PDFPageProxy> {
    const pdf = await this.getDocument(doc);
    if (pageNumber < 1 || pageNumber > pdf.numPages) {
      throw Object.assign(new Error(`page ${pageNumber} of ${pdf.numPages}`), { name: "PageOutOfRange" });
    }
    return pdf.getPage(pageNumber);
  }

  /** Main-view pages hold their parsed resources; the last release frees them. */
  retain(docId: number, pageNumber: number): void {
    const key = `${docId}:${pageNumber}`;
    this.#retained.set(key, (this.#retained.get(key) ?? 0) + 1);
  }

  release(page: PDFPageProxy, docId: number): void {
    const key = `${docId}:${page.pageNumber}`;
    const n = (this.#retained.get(key) ?? 1) - 1;
    if (n > 0) {
      this.#retained.set(key, n);
      return;
    }
    this.#retained.delete(key);
    if (!this.#destroyed) page.cleanup();
  }

  cachedThumbnail(docId: number, pageNumber: number): string | null {
    return this.#thumbnails.get(`${docId}:${pageNumber}`) ?? null;
  }

  /**
   * An object URL of a small PNG of the page. One render at a time, so the main sheet comes
   * first; a request whose every caller has aborted (row scrolled away) is dropped unrendered.
   */
  thumbnail(doc: ViewerDocument, pageNumber: number, signal: AbortSignal): Promise<string> {
    const key = `${doc.id}:${pageNumber}`;
    const done = this.#thumbnails.get(key);
    if (done) return Promise.resolve(done);
    let job = this.#pending.get(key);
    if (!job) {
      let resolve!: (url: string) => void;
      let reject!: (reason: unknown) => void;
      const promise = new Promise<string>((res, rej) => {
        resolve = res;
        reject = rej;
      });
      const created: ThumbnailJob = {
        interest: 0,
        promise,
        reject,
        run: async () => {
          const page = await this.getPage(doc, pageNumber);
          const url = await this.#drawThumbnail(page);
          if (this.#destroyed) {
            URL.revokeObjectURL(url);
            throw new Error("viewer closed");
          }
          this.#thumbnails.set(key, url);
          if (!this.#retained.has(key)) page.cleanup();
          resolve(url);
        },
      };
      const forget = () => this.#pending.delete(key);
      promise.then(forget, forget);
      this.#pending.set(key, created);
      this.#queue.push(created);
      job = created;
    }
    const interested = job;
    interested.interest += 1;
    signal.addEventListener("abort", () => (interested.interest -= 1), { once: true });
    void this.#pump();
    return interested.promise;
  }

  async #pump(): Promise<void> {
    if (this.#thumbnailRunning) return;
    this.#thumbnailRunning = true;
    try {
      // Most recent request first: the rows scrolled to last are the ones on screen.
      for (let job = this.#queue.pop(); job; job = this.#queue.pop()) {
        if (this.#destroyed) job.reject(new Error("viewer closed"));
        else if (job.interest <= 0) job.reject(new DOMException("thumbnail no longer needed", "AbortError"));
        else await job.run().catch(job.reject);
      }
    } finally {
      this.#thumbnailRunning = false;
    }
  }

  async #drawThumbnail(page: PDFPageProxy): Promise<string> {
    const base = page.getViewport({ scale: 1 });
    const dpr = Math.min(2, globalThis.devicePixelRatio || 1);
    // Viewport units are points × scale, so this scale gives THUMBNAIL_WIDTH CSS px at the device ratio.
    const viewport = page.getViewport({ scale: (THUMBNAIL_WIDTH * dpr) / base.width });
    const canvas = document.createElement("canvas");
    canvas.width = Math.max(1, Math.floor(viewport.width));
    canvas.height = Math.max(1, Math.floor(viewport.height));
    try {
      await page.render({ canvas, viewport, background: SHEET_BACKGROUND }).promise;
      const blob = await new Promise<Blob | null>((res) => canvas.toBlob(res, "image/png"));
      if (!blob) throw new Error("thumbnail encoding failed");
      return URL.createObjectURL(blob);
    } finally {
      // Free the backing store now rather than at garbage collection.
      canvas.width = 0;
      canvas.height = 0;
    }
  }

  destroy(): void {
    if (this.#destroyed) return;
    this.#destroyed = true;
    for (const job of this.#queue.splice(0)) job.reject(new Error("viewer closed"));
    for (const task of this.#tasks.values()) void task.destroy();
    this.#tasks.clear();
    this.#worker.destroy();
    for (const url of this.#thumbnails.values()) URL.revokeObjectURL(url);
    this.#thumbnails.clear();
  }
}
