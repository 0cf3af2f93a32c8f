"use client";

import { useEffect, useRef, useState } from "react";
import type { PDFPageProxy } from "pdfjs-dist";
import { PdfCache, loadPdfjs } from "@/components/sheets/pdf-cache";
import { describeLoadError } from "@/components/sheets/load-error";
import type { ViewerDocument } from "@/components/sheets/viewer-types";
import type { Size } from "@/components/sheets/viewport-math";

export type CacheState = { status: "loading" } | { status: "ready"; cache: PdfCache } | { status: "error"; message: string };

/** pdf.js is imported here, in the browser, on first mount: never in the server bundle or the shared chunks. */
export function usePdfCache(): CacheState {
  const [state, setState] = useState<CacheState>({ status: "loading" });
  useEffect(() => {
    let cache: PdfCache | null = null;
    let live = true;
    loadPdfjs().then(
      (pdfjs) => {
        if (!live) return;
        cache = new PdfCache(pdfjs);
        setState({ status: "ready", cache });
      },
      () => {
        if (live) setState({ status: "error", message: "The drawing viewer could not be loaded. Reload the page to try again." });
      },
    );
    return () => {
      live = false;
      cache?.destroy();
    };
  }, []);
  return state;
}

export type PageState =
  | { status: "loading" }
  | { status: "ready"; page: PDFPageProxy; size: Size }
  | { status: "error"; message: string };

interface Keyed {
  key: string;
  state: PageState;
}

/** size: the page at scale 1 in PDF points, after its own rotation and UserUnit. */
export function usePdfPage(cache: PdfCache | null, doc: ViewerDocument | undefined, pageNumber: number): PageState {
  const key = cache && doc ? `${doc.id}:${doc.url}:${pageNumber}` : "";
  const [result, setResult] = useState<Keyed>({ key: "", state: { status: "loading" } });
  // Pages rebuild their document objects on every render; only the key says the page changed.
  const docRef = useRef(doc);
  useEffect(() => {
    docRef.current = doc;
  });
  useEffect(() => {
    const current = docRef.current;
    if (!cache || !current || key === "") return;
    let live = true;
    cache.getPage(current, pageNumber).then(
      (page) => {
        if (!live) return;
        const vp = page.getViewport({ scale: 1 });
        setResult({ key, state: { status: "ready", page, size: { width: vp.width, height: vp.height } } });
      },
      (error: unknown) => {
        if (live && !cache.destroyed) setResult({ key, state: { status: "error", message: describeLoadError(error) } });
      },
    );
    return () => {
      live = false;
    };
  }, [cache, pageNumber, key]);
  if (!doc) return { status: "error", message: "The file for this sheet is missing." };
  // A result for another page is stale: show loading until this page's result arrives.
  return result.key === key ? result.state : { status: "loading" };
}
