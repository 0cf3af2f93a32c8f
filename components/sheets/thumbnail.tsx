"use client";

import { useEffect, useRef, useState } from "react";
import type { PdfCache } from "@/components/sheets/pdf-cache";
import type { ViewerDocument } from "@/components/sheets/viewer-types";

interface ThumbnailProps {
  cache: PdfCache | null;
  doc: ViewerDocument | undefined;
  page: number;
  /** the scrolling list, so "near view" is measured against it */
  root: Element | null;
}

/**
 * Drawn only once the row comes near view, at thumbnail size, and kept as a small PNG: a list of
 * 200 sheets holds 200 images and no canvases.
 */
export function Thumbnail({ cache, doc, page, root }: ThumbnailProps) {
  const ref = useRef<HTMLSpanElement>(null);
  const [near, setNear] = useState(false);
  const [loaded, setLoaded] = useState<{ key: string; url: string | null } | null>(null);
  const key = doc ? `${doc.id}:${page}` : "";
  const cached = cache && doc ? cache.cachedThumbnail(doc.id, page) : null;
  const url = cached ?? (loaded?.key === key ? loaded.url : null);
  const failed = loaded?.key === key && loaded.url === null;

  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const observer = new IntersectionObserver((entries) => setNear(entries.some((e) => e.isIntersecting)), {
      root,
      rootMargin: "120px 0px",
    });
    observer.observe(el);
    return () => observer.disconnect();
  }, [root]);

  useEffect(() => {
    if (!near || !cache || !doc || cached) return;
    const abort = new AbortController();
    cache.thumbnail(doc, page, abort.signal).then(
      (u) => setLoaded({ key, url: u }),
      (error: unknown) => {
        if ((error as { name?: string } | null)?.name !== "AbortError" && !abort.signal.aborted) setLoaded({ key, url: null });
      },
    );
    return () => abort.abort();
  }, [near, cache, doc, page, key, cached]);

  return (
    <span ref={ref} className="flex h-16 w-24 shrink-0 items-center justify-center overflow-hidden border border-rule bg-sheet">
      {url ? (
        // A blob: URL of our own rendering; next/image has nothing to optimise here.
        // eslint-disable-next-line @next/next/no-img-element
        <img src={url} alt="" className="max-h-full max-w-full object-contain" draggable={false} />
      ) : (
        <span aria-hidden="true" className="text-[10px] text-ink-faint">
          {failed ? "—" : ""}
        </span>
      )}
    </span>
  );
}
