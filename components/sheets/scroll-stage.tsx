"use client";

import { useEffect, useLayoutEffect, useRef, useState, type ReactNode, type PointerEvent } from "react";
import type { Size } from "@/components/sheets/viewport-math";

interface ScrollStageProps {
  children: ReactNode;
  label: string;
  /** changes when the on-screen zoom changes: the point at the centre of the view stays put */
  zoomKey: string;
  /** changes when another sheet is shown: the view goes back to the sheet's top-left corner */
  sheetKey: string | number;
  onSize: (size: Size) => void;
  /** pan with a mouse drag (off while a pin is being placed) */
  pannable: boolean;
  onScrollRatio?: (r: { x: number; y: number }) => void;
  stageRef?: (el: HTMLDivElement | null) => void;
}

/** The drafting table: a scroll box with a faint dot grid, the sheet centred on it. */
export function ScrollStage({ children, label, zoomKey, sheetKey, onSize, pannable, onScrollRatio, stageRef }: ScrollStageProps) {
  const ref = useRef<HTMLDivElement>(null);
  // The point of the sheet at the middle of the view, as fractions of the content; `top`: the
  // view is at the sheet's top edge and stays there through a zoom (a new sheet opens at its top).
  const centre = useRef({ x: 0.5, y: 0, top: true });
  const drag = useRef<{ x: number; y: number; left: number; top: number; id: number } | null>(null);
  const [panning, setPanning] = useState(false);
  const onSizeRef = useRef(onSize);

  useEffect(() => {
    onSizeRef.current = onSize;
  }, [onSize]);

  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const report = () => onSizeRef.current({ width: el.clientWidth, height: el.clientHeight });
    report();
    const observer = new ResizeObserver(report);
    observer.observe(el);
    return () => observer.disconnect();
  }, []);

  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    el.scrollLeft = centre.current.x * el.scrollWidth - el.clientWidth / 2;
    el.scrollTop = centre.current.top ? 0 : centre.current.y * el.scrollHeight - el.clientHeight / 2;
  }, [zoomKey]);

  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    centre.current = { x: 0.5, y: 0, top: true };
    el.scrollLeft = (el.scrollWidth - el.clientWidth) / 2;
    el.scrollTop = 0;
  }, [sheetKey]);

  const remember = () => {
    const el = ref.current;
    if (!el || el.scrollWidth === 0 || el.scrollHeight === 0) return;
    centre.current = {
      x: (el.scrollLeft + el.clientWidth / 2) / el.scrollWidth,
      y: (el.scrollTop + el.clientHeight / 2) / el.scrollHeight,
      top: el.scrollTop <= 0,
    };
    const maxX = el.scrollWidth - el.clientWidth;
    const maxY = el.scrollHeight - el.clientHeight;
    onScrollRatio?.({ x: maxX > 0 ? el.scrollLeft / maxX : 0, y: maxY > 0 ? el.scrollTop / maxY : 0 });
  };

  const down = (e: PointerEvent<HTMLDivElement>) => {
    const el = ref.current;
    if (!pannable || !el || e.pointerType !== "mouse" || e.button !== 0) return;
    if ((e.target as HTMLElement).closest("button, a, select, input")) return;
    drag.current = { x: e.clientX, y: e.clientY, left: el.scrollLeft, top: el.scrollTop, id: e.pointerId };
  };
  const move = (e: PointerEvent<HTMLDivElement>) => {
    const el = ref.current;
    const d = drag.current;
    if (!el || !d) return;
    const dx = e.clientX - d.x;
    const dy = e.clientY - d.y;
    if (!panning && Math.hypot(dx, dy) < 4) return;
    if (!panning) {
      setPanning(true);
      el.setPointerCapture(d.id);
    }
    el.scrollLeft = d.left - dx;
    el.scrollTop = d.top - dy;
  };
  const up = () => {
    drag.current = null;
    setPanning(false);
  };

  return (
    <div
      ref={(el) => {
        ref.current = el;
        stageRef?.(el);
      }}
      role="region"
      aria-label={label}
      tabIndex={0}
      onScroll={remember}
      onPointerDown={down}
      onPointerMove={move}
      onPointerUp={up}
      onPointerCancel={up}
      className={`relative min-h-0 flex-1 overflow-auto bg-paper [scrollbar-gutter:stable] bg-[radial-gradient(var(--color-rule)_1px,transparent_1px)] bg-size-[24px_24px] focus-visible:outline-offset-[-2px] ${
        panning ? "cursor-grabbing select-none" : pannable ? "cursor-grab" : ""
      }`}
    >
      <div className="flex min-h-full w-max min-w-full items-center justify-center">{children}</div>
    </div>
  );
}
