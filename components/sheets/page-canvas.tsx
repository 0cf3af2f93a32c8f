"use client";

import { useEffect, useRef, useState } from "react";
import type { PDFPageProxy, RenderTask } from "pdfjs-dist";
import { SHEET_BACKGROUND, type PdfCache } from "@/components/sheets/pdf-cache";
import { isRenderCancelled } from "@/components/sheets/load-error";
import { CSS_PX_PER_PT, canvasPixels, cssSize, outputScale, type Size } from "@/components/sheets/viewport-math";

interface PageCanvasProps {
  cache: PdfCache;
  docId: number;
  page: PDFPageProxy;
  /** page at scale 1, PDF points */
  size: Size;
  /** 1 = printed size */
  zoom: number;
  label: string;
  /** false: keep the last picture, start no render (a neighbour waiting for the current sheet). */
  active: boolean;
  onRendered?: () => void;
}

function useDevicePixelRatio(): number {
  const [dpr, setDpr] = useState(() => (typeof window === "undefined" ? 1 : window.devicePixelRatio || 1));
  useEffect(() => {
    // A zoomed browser or a window dragged to another screen changes the ratio.
    const query = window.matchMedia(`(resolution: ${dpr}dppx)`);
    const update = () => setDpr(window.devicePixelRatio || 1);
    query.addEventListener("change", update);
    return () => query.removeEventListener("change", update);
  }, [dpr]);
  return dpr;
}

/**
 * One page on one canvas. A new zoom cancels the render in flight and waits for it to settle
 * before drawing again, because pdf.js refuses two renders on one canvas.
 */
export function PageCanvas({ cache, docId, page, size, zoom, label, active, onRendered }: PageCanvasProps) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const settledRef = useRef<Promise<void>>(Promise.resolve());
  const onRenderedRef = useRef(onRendered);
  const dpr = useDevicePixelRatio();
  const [drawn, setDrawn] = useState<string | null>(null);
  const [failed, setFailed] = useState(false);

  const css = cssSize(size, zoom);
  const scale = outputScale(css, dpr);
  const renderKey = `${page.pageNumber}:${zoom}:${scale}`;

  useEffect(() => {
    onRenderedRef.current = onRendered;
  }, [onRendered]);

  useEffect(() => {
    cache.retain(docId, page.pageNumber);
    const canvas = canvasRef.current;
    return () => {
      void settledRef.current.then(() => {
        cache.release(page, docId);
        // Give the backing store back now; a detached canvas may linger until garbage collection.
        if (canvas) {
          canvas.width = 0;
          canvas.height = 0;
        }
      });
    };
  }, [cache, docId, page]);

  useEffect(() => {
    const canvas = canvasRef.current;
    if (!active || !canvas) return;
    let task: RenderTask | null = null;
    let cancelled = false;
    const draw = async () => {
      await settledRef.current;
      if (cancelled) return;
      const viewport = page.getViewport({ scale: zoom * CSS_PX_PER_PT * scale });
      const px = canvasPixels(css, scale);
      canvas.width = px.width;
      canvas.height = px.height;
      task = page.render({ canvas, viewport, background: SHEET_BACKGROUND });
      await task.promise;
      if (cancelled) return;
      setDrawn(renderKey);
      setFailed(false);
      onRenderedRef.current?.();
    };
    const run = draw().catch((error: unknown) => {
      if (!cancelled && !isRenderCancelled(error)) setFailed(true);
    });
    settledRef.current = run;
    return () => {
      cancelled = true;
      task?.cancel();
    };
    // css is derived from size and zoom, which are listed.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [active, page, zoom, scale, renderKey, size.width, size.height]);

  const state = failed ? "failed" : drawn === renderKey ? "rendered" : drawn ? "stale" : "rendering";
  return (
    <>
      <canvas
        ref={canvasRef}
        role="img"
        aria-label={label}
        data-state={state}
        className="block"
        style={{ width: `${css.width}px`, height: `${css.height}px` }}
      />
      {failed ? (
        <p className="absolute inset-x-0 top-1/3 text-center text-sm text-bad" role="alert">
          This sheet could not be drawn.
        </p>
      ) : null}
    </>
  );
}
