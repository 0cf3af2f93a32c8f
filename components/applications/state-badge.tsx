import type { State } from "@/lib/workflow";
import { stateLabel } from "@/lib/workflow";

// Words first, then a glyph of our own, then colour: nothing depends on colour alone.
const STYLE: Record<State, { cls: string; glyph: string }> = {
  draft: { cls: "border-rule-strong text-ink-soft bg-sheet", glyph: "○" },
  submitted: { cls: "border-info text-info bg-info-wash", glyph: "◔" },
  returned_incomplete: { cls: "border-warn text-warn bg-warn-wash", glyph: "↩" },
  in_review: { cls: "border-info text-info bg-info-wash", glyph: "◑" },
  corrections_issued: { cls: "border-bad text-bad bg-bad-wash", glyph: "✎" },
  resubmitted: { cls: "border-info text-info bg-info-wash", glyph: "◕" },
  approved: { cls: "border-ok text-ok bg-ok-wash", glyph: "●" },
  approved_with_conditions: { cls: "border-ok text-ok bg-ok-wash", glyph: "◉" },
  withdrawn: { cls: "border-rule-strong text-ink-faint bg-paper", glyph: "⊘" },
};

export function StateBadge({ state }: { state: State }) {
  const s = STYLE[state];
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-sm border px-1.5 py-0.5 text-xs font-medium ${s.cls}`} data-state={state}>
      <span aria-hidden="true">{s.glyph}</span>
      {stateLabel(state)}
    </span>
  );
}
