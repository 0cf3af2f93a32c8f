import { clockWords, type ClockStatus } from "@/lib/review-clock";

// Words first, a glyph of our own, then colour: nothing depends on colour alone.
const STYLE: Record<ClockStatus["kind"] | "stopped" | "not_started", { cls: string; glyph: string }> = {
  on_track: { cls: "border-ok text-ok bg-ok-wash", glyph: "◷" },
  due_soon: { cls: "border-warn text-warn bg-warn-wash", glyph: "◔" },
  due_today: { cls: "border-warn text-warn bg-warn-wash", glyph: "◑" },
  overdue: { cls: "border-bad text-bad bg-bad-wash", glyph: "▲" },
  no_due_date: { cls: "border-rule-strong text-ink-soft bg-sheet", glyph: "–" },
  stopped: { cls: "border-rule-strong text-ink-soft bg-paper", glyph: "‖" },
  not_started: { cls: "border-rule-strong text-ink-faint bg-paper", glyph: "○" },
};

export function ClockBadge({ status, label }: { status: ClockStatus | { kind: "stopped" | "not_started" }; label?: string }) {
  const s = STYLE[status.kind];
  const words = label ?? ("dueDay" in status ? clockWords(status) : status.kind === "stopped" ? "Clock stopped" : "Clock not started");
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-sm border px-1.5 py-0.5 text-xs font-medium ${s.cls}`} data-clock={status.kind}>
      <span aria-hidden="true">{s.glyph}</span>
      {words}
    </span>
  );
}
