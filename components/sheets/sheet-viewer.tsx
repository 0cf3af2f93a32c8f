"use client";

import { useCallback, useEffect, useId, useMemo, useRef, useState, type JSX, type KeyboardEvent } from "react";
import { CompareView } from "@/components/sheets/compare-view";
import { PinLegend } from "@/components/sheets/legend";
import { ScrollStage } from "@/components/sheets/scroll-stage";
import { centreWithin } from "@/components/sheets/scroll-within";
import { SheetList, type SetChoice } from "@/components/sheets/sheet-list";
import { buildSheetSets, cycleLabel, normalizeSheetNumber, sheetDescription, type SetEntry, type SheetSets } from "@/components/sheets/sheet-model";
import { SheetPane, type PlacementProps } from "@/components/sheets/sheet-pane";
import { Toolbar } from "@/components/sheets/toolbar";
import { usePdfCache, usePdfPage } from "@/components/sheets/use-pdf-document";
import type { SheetViewerProps, ViewerPin, ViewerSheet } from "@/components/sheets/viewer-types";
import {
  NEIGHBOUR_PIXEL_BUDGET,
  canvasPixels,
  cssSize,
  movePoint,
  neighbourWindow,
  outputScale,
  resolveZoom,
  stepZoom,
  type Fraction,
  type Size,
  type ZoomSpec,
} from "@/components/sheets/viewport-math";

export type { PinStatus, SheetViewerProps, ViewerDocument, ViewerPin, ViewerSheet } from "@/components/sheets/viewer-types";

function entriesOf(sets: SheetSets, choice: SetChoice): SetEntry[] {
  return choice === "current" ? sets.current : (sets.byCycle.get(choice) ?? sets.current);
}

/** Where a sheet lives: the current set if it is the version in force, else its own cycle. */
function locate(sets: SheetSets, sheetId: number): SetChoice | null {
  if (sets.current.some((e) => e.sheet.id === sheetId)) return "current";
  for (const [cycle, list] of sets.byCycle) if (list.some((e) => e.sheet.id === sheetId)) return cycle;
  return null;
}

const TYPING = new Set(["INPUT", "SELECT", "TEXTAREA"]);
const SAME = (a: Size, b: Size) => a.width === b.width && a.height === b.height;

export function SheetViewer(props: SheetViewerProps): JSX.Element {
  const { documents, sheets, pins, canPlacePins = false, onPlacePin, selectedPinId, onSelectPin, initialSheetId, onSheetChange } = props;
  const cacheState = usePdfCache();
  const cache = cacheState.status === "ready" ? cacheState.cache : null;

  const sets = useMemo(() => buildSheetSets(documents, sheets), [documents, sheets]);
  const docMap = useMemo(() => new Map(documents.map((d) => [d.id, d])), [documents]);
  const pinsBySheet = useMemo(() => {
    const m = new Map<number, ViewerPin[]>();
    for (const p of pins) m.set(p.sheetId, [...(m.get(p.sheetId) ?? []), p]);
    return m;
  }, [pins]);

  const [choice, setChoice] = useState<SetChoice>(() => (initialSheetId !== undefined ? (locate(sets, initialSheetId) ?? "current") : "current"));
  const [sheetId, setSheetId] = useState<number | null>(() => initialSheetId ?? sets.current[0]?.sheet.id ?? null);
  const [zoomSpec, setZoomSpec] = useState<ZoomSpec>({ mode: "fit-width" });
  const [box, setBox] = useState<Size>({ width: 0, height: 0 });
  const [listOpen, setListOpen] = useState(true);
  const [placing, setPlacing] = useState(false);
  const [crosshair, setCrosshair] = useState<Fraction>({ x: 0.5, y: 0.5 });
  const [compareOn, setCompareOn] = useState(false);
  const [compareCycle, setCompareCycle] = useState<number | null>(null);
  const [renderedId, setRenderedId] = useState<number | null>(null);
  const [notice, setNotice] = useState<{ sheetId: number; text: string } | null>(null);
  const stageEl = useRef<HTMLDivElement | null>(null);
  const rootEl = useRef<HTMLElement | null>(null);
  const listId = useId();

  const entries = entriesOf(sets, choice);
  const found = entries.findIndex((e) => e.sheet.id === sheetId);
  const index = found >= 0 ? found : 0;
  const entry: SetEntry | undefined = entries[index];
  const sheet: ViewerSheet | undefined = entry?.sheet;

  const goToSheet = useCallback(
    (id: number) => {
      const where = locate(sets, id);
      if (where === null) return;
      if (!entriesOf(sets, choice).some((e) => e.sheet.id === id)) setChoice(where);
      setSheetId(id);
      setPlacing(false);
    },
    [sets, choice],
  );

  // A pin chosen outside the viewer (the comment list) brings its sheet up.
  const [seenSelected, setSeenSelected] = useState(selectedPinId);
  if (selectedPinId !== seenSelected) {
    setSeenSelected(selectedPinId);
    const pin = pins.find((p) => p.id === selectedPinId);
    if (pin && pin.sheetId !== sheet?.id && locate(sets, pin.sheetId) !== null) {
      const where = locate(sets, pin.sheetId);
      if (where !== null && !entries.some((e) => e.sheet.id === pin.sheetId)) setChoice(where);
      setSheetId(pin.sheetId);
    }
  }

  const go = (i: number) => {
    const target = entries[Math.min(entries.length - 1, Math.max(0, i))];
    if (target && target.sheet.id !== sheet?.id) {
      setSheetId(target.sheet.id);
      setPlacing(false);
    }
  };

  const chooseSet = (next: SetChoice) => {
    const list = entriesOf(sets, next);
    const number = sheet ? normalizeSheetNumber(sheet.sheetNumber) : null;
    const same = number ? list.find((e) => normalizeSheetNumber(e.sheet.sheetNumber) === number) : undefined;
    setChoice(next);
    setSheetId((same ?? list[0])?.sheet.id ?? null);
    setPlacing(false);
  };

  const onSheetChangeRef = useRef(onSheetChange);
  useEffect(() => {
    onSheetChangeRef.current = onSheetChange;
  }, [onSheetChange]);
  const shownId = sheet?.id;
  useEffect(() => {
    if (shownId !== undefined) onSheetChangeRef.current?.(shownId);
  }, [shownId]);

  // The current page's size drives the zoom read-out and whether neighbours may be pre-drawn.
  const currentPage = usePdfPage(cache, sheet ? docMap.get(sheet.documentId) : undefined, sheet?.page ?? 1);
  const size = currentPage.status === "ready" ? currentPage.size : null;
  const zoom = size ? resolveZoom(zoomSpec, size, box) : zoomSpec.mode === "zoom" ? zoomSpec.zoom : 1;
  const dpr = typeof window === "undefined" ? 1 : window.devicePixelRatio || 1;
  const neighbourCost = size ? (() => {
    const css = cssSize(size, zoom);
    const px = canvasPixels(css, outputScale(css, dpr));
    return px.width * px.height;
  })() : Infinity;
  const preRender = neighbourCost <= NEIGHBOUR_PIXEL_BUDGET && renderedId === sheet?.id;

  const earlierCycles = [...new Set((entry?.earlier ?? []).map((s) => s.cycle))];
  const compareSheet = compareOn ? (entry?.earlier.find((s) => s.cycle === compareCycle) ?? entry?.earlier[0]) : undefined;

  const zoomStep = (direction: 1 | -1) => setZoomSpec({ mode: "zoom", zoom: stepZoom(zoom, direction) });

  const startPlacing = () => {
    if (!sheet) return;
    setPlacing(true);
    setCrosshair({ x: 0.5, y: 0.5 });
    setNotice({ sheetId: sheet.id, text: `Placing a comment pin on ${sheetDescription(sheet)}. Click the spot, or move with the arrow keys and press Enter. Escape cancels.` });
    stageEl.current?.focus({ preventScroll: true });
  };
  const stopPlacing = (text: string) => {
    setPlacing(false);
    if (sheet) setNotice({ sheetId: sheet.id, text });
  };
  const place = (at: Fraction) => {
    if (!sheet) return;
    stopPlacing(`Comment pin placed on ${sheet.sheetNumber ?? sheet.title}.`);
    onPlacePin?.({ sheetId: sheet.id, x: at.x, y: at.y });
  };

  const placement: PlacementProps = { placing, crosshair, onCrosshair: setCrosshair, onPlace: place };

  const onKeyDown = (e: KeyboardEvent<HTMLElement>) => {
    const target = e.target as HTMLElement;
    if (TYPING.has(target.tagName) || target.isContentEditable || e.altKey || e.ctrlKey || e.metaKey) return;
    if (placing) {
      const step = e.shiftKey ? 0.05 : 0.01;
      const moves: Record<string, [number, number]> = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, -step], ArrowDown: [0, step] };
      const m = moves[e.key];
      if (m) setCrosshair((c) => movePoint(c, m[0], m[1]));
      else if (e.key === "Enter" || (e.key === " " && target.tagName !== "BUTTON")) place(crosshair);
      else if (e.key === "Escape") stopPlacing("Pin placement cancelled.");
      else return;
      e.preventDefault();
      return;
    }
    if (e.key === "ArrowLeft" || e.key === "PageUp") go(index - 1);
    else if (e.key === "ArrowRight" || e.key === "PageDown") go(index + 1);
    else if (e.key === "+" || e.key === "=") zoomStep(1);
    else if (e.key === "-" || e.key === "_") zoomStep(-1);
    else return;
    e.preventDefault();
  };

  // Bring a newly selected pin into view once, as soon as its sheet is drawn.
  const revealedPin = useRef<number | null>(null);
  useEffect(() => {
    if (selectedPinId == null || revealedPin.current === selectedPinId) return;
    const el = rootEl.current?.querySelector<HTMLElement>(`[data-pin-id="${selectedPinId}"]`);
    if (!el || !stageEl.current) return;
    revealedPin.current = selectedPinId;
    centreWithin(stageEl.current, el);
  }, [selectedPinId, renderedId]);

  const onBox = useCallback((b: Size) => setBox((prev) => (SAME(prev, b) ? prev : b)), []);
  const onRendered = useCallback((id: number) => setRenderedId(id), []);

  const announcement = sheet
    ? notice?.sheetId === sheet.id
      ? notice.text
      : `${sheetDescription(sheet)}, ${index + 1} of ${entries.length}`
    : "No sheets to show.";

  const windowIdx = neighbourWindow(index, entries.length);

  return (
    <section
      ref={rootEl}
      aria-label="Sheets viewer"
      onKeyDown={onKeyDown}
      className={`flex flex-col overflow-hidden border border-rule bg-paper text-ink ${props.className ?? "h-[80vh] min-h-[30rem]"}`}
    >
      <Toolbar
        entries={entries}
        index={index}
        onGo={go}
        zoom={zoom}
        zoomSpec={zoomSpec}
        onZoomSpec={setZoomSpec}
        onZoomStep={zoomStep}
        canPlacePins={canPlacePins}
        placing={placing}
        onTogglePlacing={() => (placing ? stopPlacing("Pin placement cancelled.") : startPlacing())}
        compare={{
          cycles: earlierCycles,
          on: compareOn && compareSheet !== undefined,
          cycle: compareSheet?.cycle ?? null,
          onToggle: () => setCompareOn((on) => !on),
          onCycle: setCompareCycle,
        }}
        listOpen={listOpen}
        onToggleList={() => setListOpen((o) => !o)}
        listId={listId}
      />
      <div className="flex min-h-0 flex-1">
        {listOpen ? (
          <div id={listId} className="flex w-64 shrink-0 flex-col border-r border-rule bg-paper">
            <SheetList
              cache={cache}
              documents={docMap}
              entries={entries}
              cycles={sets.cycles}
              latestCycle={sets.latestCycle}
              choice={choice}
              onChoice={chooseSet}
              currentSheetId={sheet?.id ?? null}
              onPick={goToSheet}
            />
          </div>
        ) : null}
        <div className="flex min-w-0 flex-1 flex-col">
          {placing && sheet ? (
            <p className="border-b border-accent bg-accent-wash px-3 py-1 text-xs text-accent-strong">
              Click the spot on {sheet.sheetNumber ?? "the sheet"} for the new comment — or move with the arrow keys (Shift for larger steps) and press Enter. Esc cancels.
            </p>
          ) : null}
          {cacheState.status === "error" ? (
            <p role="alert" className="m-6 text-sm text-bad">
              {cacheState.message}
            </p>
          ) : !sheet ? (
            <p className="m-6 text-sm text-ink-soft">No sheets in this set yet.</p>
          ) : !cache ? (
            <p className="m-6 text-sm text-ink-soft">Opening the drawings…</p>
          ) : compareSheet ? (
            <CompareView
              cache={cache}
              documents={docMap}
              earlier={compareSheet}
              later={sheet}
              latestCycle={sets.latestCycle}
              zoomSpec={zoomSpec}
              pinsBySheet={pinsBySheet}
              selectedPinId={selectedPinId}
              onSelectPin={onSelectPin}
              placement={placement}
              onBox={onBox}
              onRendered={onRendered}
              laterStageRef={(el) => {
                stageEl.current = el;
              }}
            />
          ) : (
            <>
              <div className="flex items-baseline gap-2 border-b border-rule bg-sheet/70 px-3 py-1 text-xs">
                <span className="num font-semibold">{sheet.sheetNumber ?? `p. ${sheet.page}`}</span>
                <span className="truncate text-ink-soft">{sheet.title}</span>
                <span className="ml-auto shrink-0 text-ink-faint">{cycleLabel(sheet.cycle, sets.latestCycle)}</span>
              </div>
              <ScrollStage
                label={`Drawing: ${sheetDescription(sheet)}`}
                zoomKey={String(zoom)}
                sheetKey={sheet.id}
                onSize={onBox}
                pannable={!placing}
                stageRef={(el) => {
                  stageEl.current = el;
                }}
              >
                {box.width > 0
                  ? windowIdx.map((i) => {
                      const s = entries[i]?.sheet;
                      if (!s) return null;
                      const isCurrent = i === index;
                      return (
                        <SheetPane
                          key={s.id}
                          cache={cache}
                          doc={docMap.get(s.documentId)}
                          sheet={s}
                          zoomSpec={zoomSpec}
                          box={box}
                          pins={isCurrent ? (pinsBySheet.get(s.id) ?? []) : []}
                          selectedPinId={selectedPinId}
                          onSelectPin={onSelectPin}
                          placement={isCurrent ? placement : undefined}
                          visible={isCurrent}
                          active={isCurrent || preRender}
                          onRendered={isCurrent ? onRendered : undefined}
                        />
                      );
                    })
                  : null}
              </ScrollStage>
            </>
          )}
          <PinLegend />
        </div>
      </div>
      <div role="status" aria-live="polite" className="sr-only">
        {announcement}
      </div>
    </section>
  );
}
