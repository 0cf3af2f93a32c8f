"use client";

import { useId, type ReactNode } from "react";
import type { SetEntry } from "@/components/sheets/sheet-model";
import { formatZoom, type ZoomSpec } from "@/components/sheets/viewport-math";

const tool =
  "inline-flex h-8 items-center justify-center gap-1.5 rounded-sm border px-2 text-sm transition-colors disabled:cursor-not-allowed disabled:opacity-40";
const plain = `${tool} border-transparent text-ink hover:border-rule-strong hover:bg-sheet`;
const pressedStyle = "border-accent-strong bg-accent text-white hover:bg-accent-strong";

function Icon({ children }: { children: ReactNode }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 16 16" className="h-4 w-4 shrink-0" fill="none" stroke="currentColor" strokeWidth="1.4" strokeLinecap="square">
      {children}
    </svg>
  );
}

function Divider() {
  return <span aria-hidden="true" className="mx-1 h-5 w-px bg-rule" />;
}

export interface CompareControl {
  /** earlier cycles holding this sheet number, most recent first */
  cycles: number[];
  on: boolean;
  cycle: number | null;
  onToggle: () => void;
  onCycle: (cycle: number) => void;
}

interface ToolbarProps {
  entries: SetEntry[];
  index: number;
  onGo: (index: number) => void;
  zoom: number;
  zoomSpec: ZoomSpec;
  onZoomSpec: (spec: ZoomSpec) => void;
  onZoomStep: (direction: 1 | -1) => void;
  canPlacePins: boolean;
  placing: boolean;
  onTogglePlacing: () => void;
  compare: CompareControl;
  listOpen: boolean;
  onToggleList: () => void;
  listId: string;
}

export function Toolbar(p: ToolbarProps) {
  const count = p.entries.length;
  const defaultCycle = p.compare.cycles[0];
  const goId = useId();
  const compareId = useId();
  return (
    <div role="toolbar" aria-label="Sheet tools" className="flex flex-wrap items-center gap-1 border-b border-rule bg-sheet px-2 py-1.5">
      <button type="button" className={plain} onClick={p.onToggleList} aria-expanded={p.listOpen} aria-controls={p.listId} aria-label={p.listOpen ? "Hide sheet list" : "Show sheet list"}>
        <Icon>
          <path d="M2 4h12M2 8h12M2 12h12" />
        </Icon>
      </button>
      <Divider />
      <button type="button" className={plain} onClick={() => p.onGo(p.index - 1)} disabled={p.index <= 0} aria-label="Previous sheet">
        <Icon>
          <path d="M10 3 5 8l5 5" />
        </Icon>
      </button>
      <label className="sr-only" htmlFor={goId}>
        Go to sheet
      </label>
      <select
        id={goId}
        value={count > 0 ? String(p.index) : ""}
        onChange={(e) => p.onGo(Number(e.target.value))}
        disabled={count === 0}
        className="num h-8 max-w-[16rem] rounded-sm border border-rule-strong bg-sheet px-1.5 text-sm text-ink"
      >
        {p.entries.map(({ sheet }, i) => (
          <option key={sheet.id} value={i}>
            {sheet.sheetNumber ? `${sheet.sheetNumber} — ${sheet.title}` : sheet.title}
          </option>
        ))}
      </select>
      <span className="num px-1 text-xs text-ink-soft" aria-hidden="true">
        {count > 0 ? `${p.index + 1} / ${count}` : "0 / 0"}
      </span>
      <button type="button" className={plain} onClick={() => p.onGo(p.index + 1)} disabled={p.index >= count - 1} aria-label="Next sheet">
        <Icon>
          <path d="m6 3 5 5-5 5" />
        </Icon>
      </button>
      <Divider />
      <button type="button" className={plain} onClick={() => p.onZoomStep(-1)} aria-label="Zoom out">
        <Icon>
          <path d="M3 8h10" />
        </Icon>
      </button>
      <span className="num w-12 text-center text-xs text-ink" data-testid="zoom-level">
        <span className="sr-only">Zoom level </span>
        {formatZoom(p.zoom)}
      </span>
      <button type="button" className={plain} onClick={() => p.onZoomStep(1)} aria-label="Zoom in">
        <Icon>
          <path d="M3 8h10M8 3v10" />
        </Icon>
      </button>
      <button
        type="button"
        className={`${tool} ${p.zoomSpec.mode === "fit-width" ? "border-rule-strong bg-accent-wash text-accent-strong" : "border-transparent text-ink hover:border-rule-strong hover:bg-sheet"}`}
        aria-pressed={p.zoomSpec.mode === "fit-width"}
        onClick={() => p.onZoomSpec({ mode: "fit-width" })}
      >
        <Icon>
          <path d="M1.5 3v10M14.5 3v10M4 8h8M6 6 4 8l2 2M10 6l2 2-2 2" />
        </Icon>
        <span className="text-xs">Fit width</span>
      </button>
      <button
        type="button"
        className={`${tool} ${p.zoomSpec.mode === "fit-page" ? "border-rule-strong bg-accent-wash text-accent-strong" : "border-transparent text-ink hover:border-rule-strong hover:bg-sheet"}`}
        aria-pressed={p.zoomSpec.mode === "fit-page"}
        onClick={() => p.onZoomSpec({ mode: "fit-page" })}
      >
        <Icon>
          <path d="M2.5 4.5h11v7h-11zM1 2.5v2M1 2.5h2M15 13.5v-2M15 13.5h-2" />
        </Icon>
        <span className="text-xs">Fit page</span>
      </button>
      {defaultCycle !== undefined ? (
        <>
          <Divider />
          <button
            type="button"
            className={`${tool} ${p.compare.on ? pressedStyle : "border-rule-strong text-ink hover:bg-sheet"}`}
            aria-pressed={p.compare.on}
            onClick={p.compare.onToggle}
          >
            <Icon>
              <path d="M1.5 3.5h5.5v9H1.5zM9 3.5h5.5v9H9z" />
            </Icon>
            <span className="text-xs">Compare with cycle {p.compare.on && p.compare.cycle !== null ? p.compare.cycle : defaultCycle}</span>
          </button>
          {p.compare.on && p.compare.cycles.length > 1 ? (
            <>
              <label className="sr-only" htmlFor={compareId}>
                Compare against
              </label>
              <select
                id={compareId}
                value={String(p.compare.cycle ?? defaultCycle)}
                onChange={(e) => p.compare.onCycle(Number(e.target.value))}
                className="h-8 rounded-sm border border-rule-strong bg-sheet px-1.5 text-xs text-ink"
              >
                {p.compare.cycles.map((c) => (
                  <option key={c} value={c}>
                    Cycle {c}
                  </option>
                ))}
              </select>
            </>
          ) : null}
        </>
      ) : null}
      {p.canPlacePins ? (
        <div className="ml-auto">
          <button
            type="button"
            className={`${tool} ${p.placing ? pressedStyle : "border-accent text-accent hover:bg-accent-wash"}`}
            aria-pressed={p.placing}
            onClick={p.onTogglePlacing}
            disabled={count === 0}
          >
            <Icon>
              <path d="M2.5 13.5 6 10" />
              <circle cx="10" cy="6" r="4" />
            </Icon>
            <span>Place comment pin</span>
          </button>
        </div>
      ) : null}
    </div>
  );
}
