"use client";

import { orderPins, pinName } from "@/components/sheets/sheet-model";
import type { ViewerPin, PinStatus } from "@/components/sheets/viewer-types";
import type { Fraction } from "@/components/sheets/viewport-math";

// Shape carries the status as much as colour does: solid disc, dashed ring, grey disc with a tick.
const BUBBLE: Record<PinStatus, string> = {
  open: "bg-accent text-white border-2 border-accent-strong",
  draft: "bg-sheet text-accent border-2 border-dashed border-accent",
  resolved: "bg-rule text-ink-soft border border-ink-faint",
};

/** A tick of two strokes meeting low and left, drawn in a 10-unit box. */
function ResolvedMark() {
  return (
    <span aria-hidden="true" className="absolute -right-1.5 -top-1.5 flex h-3.5 w-3.5 items-center justify-center rounded-full border border-ink-faint bg-sheet">
      <svg viewBox="0 0 10 10" className="h-2.5 w-2.5" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="square">
        <path d="M1.8 5.4 L4.2 7.6 L8.4 2.4" className="text-ink-soft" />
      </svg>
    </span>
  );
}

export function PinBubble({ status, number, className = "" }: { status: PinStatus; number: number; className?: string }) {
  return (
    <span className={`num relative inline-flex h-6 min-w-6 items-center justify-center rounded-full px-1 text-[11px] font-semibold leading-none ${BUBBLE[status]} ${className}`}>
      {number}
      {status === "resolved" ? <ResolvedMark /> : null}
    </span>
  );
}

interface PinLayerProps {
  pins: ViewerPin[];
  selectedPinId?: number | null;
  onSelectPin?: (pinId: number) => void;
  /** While a new pin is being placed, clicks pass through to the sheet. */
  placing: boolean;
}

/**
 * Pins as callout bubbles: a dot on the spot, a short leader, and the numbered bubble up and to
 * the right so the bubble never hides the detail it points at.
 */
export function PinLayer({ pins, selectedPinId, onSelectPin, placing }: PinLayerProps) {
  const ordered = orderPins(pins);
  return (
    <div className="pointer-events-none absolute inset-0" data-testid="pin-layer">
      {ordered.map((pin) => {
        const selected = pin.id === selectedPinId;
        return (
          <div
            key={pin.id}
            className={`absolute h-0 w-0 ${selected ? "z-20" : "z-10"}`}
            style={{ left: `${pin.x * 100}%`, top: `${pin.y * 100}%` }}
          >
            <svg aria-hidden="true" className="absolute -left-1 -top-5 h-6 w-6 overflow-visible" viewBox="0 0 24 24">
              <line x1="4" y1="20" x2="13" y2="11" stroke="var(--color-ink)" strokeWidth="1" />
              <circle cx="4" cy="20" r="2.2" fill={selected ? "var(--color-ink)" : "var(--color-accent)"} stroke="var(--color-sheet)" strokeWidth="0.8" />
            </svg>
            <button
              type="button"
              aria-label={pinName(pin)}
              aria-current={selected ? "true" : undefined}
              title={pin.summary ? `${pinName(pin)}: ${pin.summary}` : pinName(pin)}
              onClick={() => onSelectPin?.(pin.id)}
              data-pin-id={pin.id}
              className={`absolute left-2.5 -top-[34px] rounded-full shadow-[0_1px_2px_rgba(36,39,42,0.35)] ${placing ? "pointer-events-none" : "pointer-events-auto cursor-pointer"} ${
                selected ? "scale-115 outline-2 outline-offset-2 outline-ink" : ""
              }`}
            >
              <PinBubble status={pin.status} number={pin.number} />
            </button>
          </div>
        );
      })}
    </div>
  );
}

/** T-square and set-square hairlines across the whole sheet, meeting at the spot to be pinned. */
export function PlacementCrosshair({ at }: { at: Fraction }) {
  return (
    <div aria-hidden="true" className="pointer-events-none absolute inset-0 z-30">
      <div className="absolute inset-x-0 h-px bg-accent/60" style={{ top: `${at.y * 100}%` }} />
      <div className="absolute inset-y-0 w-px bg-accent/60" style={{ left: `${at.x * 100}%` }} />
      <div
        className="absolute h-5 w-5 -translate-x-1/2 -translate-y-1/2 rounded-full border-2 border-accent bg-accent-wash/40"
        style={{ left: `${at.x * 100}%`, top: `${at.y * 100}%` }}
      />
    </div>
  );
}
