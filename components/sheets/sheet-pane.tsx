"use client";

import type { MouseEvent } from "react";
import type { PdfCache } from "@/components/sheets/pdf-cache";
import { PageCanvas } from "@/components/sheets/page-canvas";
import { PinLayer, PlacementCrosshair } from "@/components/sheets/pin-layer";
import { sheetDescription } from "@/components/sheets/sheet-model";
import { usePdfPage } from "@/components/sheets/use-pdf-document";
import type { ViewerDocument, ViewerPin, ViewerSheet } from "@/components/sheets/viewer-types";
import { cssSize, fractionFromPoint, resolveZoom, type Fraction, type Size, type ZoomSpec } from "@/components/sheets/viewport-math";

export interface PlacementProps {
  placing: boolean;
  crosshair: Fraction;
  onCrosshair: (at: Fraction) => void;
  onPlace: (at: Fraction) => void;
}

interface SheetPaneProps {
  cache: PdfCache;
  doc: ViewerDocument | undefined;
  sheet: ViewerSheet;
  zoomSpec: ZoomSpec;
  /** the scroll box the sheet sits in, CSS px */
  box: Size;
  pins: ViewerPin[];
  selectedPinId?: number | null;
  onSelectPin?: (pinId: number) => void;
  placement?: PlacementProps;
  /** false: a pre-rendered neighbour, kept out of sight and out of the accessibility tree */
  visible: boolean;
  /** false: hold off rendering (neighbours wait for the current sheet) */
  active: boolean;
  onRendered?: (sheetId: number) => void;
}

export function SheetPane({ cache, doc, sheet, zoomSpec, box, pins, selectedPinId, onSelectPin, placement, visible, active, onRendered }: SheetPaneProps) {
  const state = usePdfPage(cache, doc, sheet.page);
  const label = sheetDescription(sheet);

  if (state.status !== "ready") {
    if (!visible) return null;
    return (
      <div className="mx-auto my-4 flex aspect-[3/2] w-full max-w-3xl items-center justify-center border border-dashed border-rule-strong bg-sheet/60 p-6 text-center text-sm text-ink-soft">
        {state.status === "loading" ? (
          <span>Loading {label}…</span>
        ) : (
          <span role="alert" className="text-bad">
            {state.message}
            {doc ? (
              <>
                {" "}
                <a className="text-accent underline" href={doc.url}>
                  Download {doc.name}
                </a>
              </>
            ) : null}
          </span>
        )}
      </div>
    );
  }

  const zoom = resolveZoom(zoomSpec, state.size, box);
  const css = cssSize(state.size, zoom);
  const placing = placement?.placing === true;

  const at = (e: MouseEvent<HTMLDivElement>) => fractionFromPoint(e.clientX, e.clientY, e.currentTarget.getBoundingClientRect());

  return (
    <div
      hidden={!visible}
      data-sheet-id={sheet.id}
      className="relative m-4 inline-block shrink-0 border border-rule-strong bg-sheet align-top shadow-[0_1px_4px_rgba(36,39,42,0.18)]"
      style={{ width: `${css.width + 2}px`, height: `${css.height + 2}px` }}
    >
      <div
        className={`relative ${placing ? "cursor-crosshair" : ""}`}
        style={{ width: `${css.width}px`, height: `${css.height}px` }}
        onClick={placing ? (e) => placement?.onPlace(at(e)) : undefined}
        onMouseMove={placing ? (e) => placement?.onCrosshair(at(e)) : undefined}
      >
        <PageCanvas
          cache={cache}
          docId={sheet.documentId}
          page={state.page}
          size={state.size}
          zoom={zoom}
          label={label}
          active={active}
          onRendered={onRendered ? () => onRendered(sheet.id) : undefined}
        />
        {visible ? <PinLayer pins={pins} selectedPinId={selectedPinId} onSelectPin={onSelectPin} placing={placing} /> : null}
        {visible && placing && placement ? <PlacementCrosshair at={placement.crosshair} /> : null}
      </div>
    </div>
  );
}
