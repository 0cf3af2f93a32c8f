import { COMBO_STATUS, CLAIM_INFO, VERDICT_INFO, type CheckVerdict, type ComboStatus, type Tone } from "@/lib/checks/verdict";

// Words, a glyph and a colour together: nothing on these screens depends on colour alone.
export const TONE_CLASS: Record<Tone, string> = {
  ok: "border-ok text-ok bg-ok-wash",
  warn: "border-warn text-warn bg-warn-wash",
  bad: "border-bad text-bad bg-bad-wash",
  info: "border-info text-info bg-info-wash",
};

function Badge({ label, glyph, tone, testId }: { label: string; glyph: string; tone: Tone; testId?: string }) {
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-sm border px-1.5 py-0.5 text-xs font-medium ${TONE_CLASS[tone]}`} data-testid={testId}>
      <span aria-hidden="true">{glyph}</span>
      {label}
    </span>
  );
}

export function VerdictBadge({ verdict }: { verdict: CheckVerdict }) {
  return <Badge {...VERDICT_INFO[verdict]} testId={`verdict-${verdict}`} />;
}

export function ComboBadge({ status }: { status: ComboStatus }) {
  return <Badge {...COMBO_STATUS[status]} />;
}

export function ClaimBadge({ verdict }: { verdict: keyof typeof CLAIM_INFO }) {
  return <Badge {...CLAIM_INFO[verdict]} />;
}

export function ReverifyBadge() {
  return <Badge label="Re-verify: calc replaced" glyph="↻" tone="warn" />;
}
