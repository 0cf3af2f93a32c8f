// pdfjs-dist ships no declaration for its worker entry; only the handler is read from it.
declare module "pdfjs-dist/legacy/build/pdf.worker.mjs" {
  export const WorkerMessageHandler: unknown;
}
