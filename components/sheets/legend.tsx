import { PinBubble } from "@/components/sheets/pin-layer";

export function PinLegend() {
  return (
    <div className="flex flex-wrap items-center gap-x-4 gap-y-1 border-t border-rule bg-sheet px-3 py-1.5 text-xs text-ink-soft">
      <span className="inline-flex items-center gap-1.5">
        <PinBubble status="open" number={1} className="scale-90" /> Open
      </span>
      <span className="inline-flex items-center gap-1.5">
        <PinBubble status="draft" number={2} className="scale-90" /> Draft
      </span>
      <span className="inline-flex items-center gap-1.5">
        <PinBubble status="resolved" number={3} className="scale-90" /> Resolved
      </span>
      <span className="ml-auto hidden text-ink-faint md:inline">
        <kbd className="num">←</kbd> <kbd className="num">→</kbd> sheets · <kbd className="num">+</kbd> <kbd className="num">−</kbd> zoom · drag to pan
      </span>
    </div>
  );
}
