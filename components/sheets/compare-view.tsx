"use client";

import { useRef, useState } from "react";
import type { PdfCache } from "@/components/sheets/pdf-cache";
import { ScrollStage } from "@/components/sheets/scroll-stage";
import { SheetPane, type PlacementProps } from "@/components/sheets/sheet-pane";
import { cycleLabel, sheetDescription } from "@/components/sheets/sheet-model";
import type { ViewerDocument, ViewerPin, ViewerSheet } from "@/components/sheets/viewer-types";
import type { Size, ZoomSpec } from "@/components/sheets/viewport-math";

interface CompareViewProps {
  cache: PdfCache;
  documents: Map<number, ViewerDocument>;
  earlier: ViewerSheet;
  later: ViewerSheet;
  latestCycle: number;
  zoomSpec: ZoomSpec;
  pinsBySheet: Map<number, ViewerPin[]>;
  selectedPinId?: number | null;
  onSelectPin?: (pinId: number) => void;
  placement: PlacementProps;
  onBox: (box: Size) => void;
  onRendered: (sheetId: number) => void;
  laterStageRef: (el: HTMLDivElement | null) => void;
}

const SAME = (a: Size, b: Size) => a.width === b.width && a.height === b.height;

/**
 * Earlier cycle left, later right, each on its own canvas; scrolling one pane scrolls the other
 * to the same place on the sheet.
 */
export function CompareView(p: CompareViewProps) {
  const [leftBox, setLeftBox] = useState<Size>({ width: 0, height: 0 });
  const [rightBox, setRightBox] = useState<Size>({ width: 0, height: 0 });
  const stages = useRef<{ left: HTMLDivElement | null; right: HTMLDivElement | null }>({ left: null, right: null });
  // The pane we last moved ourselves: its scroll event is an echo, not the user.
  const echo = useRef<"left" | "right" | null>(null);

  const follow = (from: "left" | "right") => (r: { x: number; y: number }) => {
    if (echo.current === from) {
      echo.current = null;
      return;
    }
    const other = from === "left" ? "right" : "left";
    const el = stages.current[other];
    if (!el) return;
    const left = r.x * (el.scrollWidth - el.clientWidth);
    const top = r.y * (el.scrollHeight - el.clientHeight);
    if (Math.abs(el.scrollLeft - left) < 1 && Math.abs(el.scrollTop - top) < 1) return;
    echo.current = other;
    el.scrollLeft = left;
    el.scrollTop = top;
  };

  const zoomKey = (box: Size) => `${p.zoomSpec.mode}:${p.zoomSpec.mode === "zoom" ? p.zoomSpec.zoom : ""}:${box.width}x${box.height}`;
  const panes = [
    { side: "left" as const, sheet: p.earlier, box: leftBox, setBox: setLeftBox },
    { side: "right" as const, sheet: p.later, box: rightBox, setBox: setRightBox },
  ];

  return (
    <div className="grid min-h-0 flex-1 grid-cols-2 divide-x divide-rule-strong">
      {panes.map(({ side, sheet, box, setBox }) => {
        const isLater = side === "right";
        return (
          <div key={side} className="flex min-h-0 min-w-0 flex-col">
            <div className="flex items-baseline gap-2 border-b border-rule bg-sheet px-3 py-1 text-xs">
              <span className={`font-semibold ${isLater ? "text-accent-strong" : "text-ink"}`}>{cycleLabel(sheet.cycle, p.latestCycle)}</span>
              <span className="num text-ink-soft">{sheet.sheetNumber}</span>
              <span className="truncate text-ink-soft">{sheet.title}</span>
            </div>
            <ScrollStage
              label={`${cycleLabel(sheet.cycle, p.latestCycle)}: ${sheetDescription(sheet)}`}
              zoomKey={zoomKey(box)}
              sheetKey={sheet.id}
              pannable={!(isLater && p.placement.placing)}
              onSize={(b) => {
                setBox((prev) => (SAME(prev, b) ? prev : b));
                if (isLater) p.onBox(b);
              }}
              onScrollRatio={follow(side)}
              stageRef={(el) => {
                stages.current[side] = el;
                if (isLater) p.laterStageRef(el);
              }}
            >
              {box.width > 0 ? (
                <SheetPane
                  cache={p.cache}
                  doc={p.documents.get(sheet.documentId)}
                  sheet={sheet}
                  zoomSpec={p.zoomSpec}
                  box={box}
                  pins={p.pinsBySheet.get(sheet.id) ?? []}
                  selectedPinId={p.selectedPinId}
                  onSelectPin={p.onSelectPin}
                  placement={isLater ? p.placement : undefined}
                  visible
                  active
                  onRendered={p.onRendered}
                />
              ) : null}
            </ScrollStage>
          </div>
        );
      })}
    </div>
  );
}
