import type { CheckComboResult, CheckResult, SolveResult } from "@/lib/solver";
import { bothLengths, fmt, isUs } from "@/lib/checks/quantities";

// One verdict per saved check (the worst of its combinations), the words and glyph each
// combination shows, and the correction comment a check turns into.

export const CHECK_VERDICTS = ["pass", "fail", "near_limit", "disputed", "no_limit"] as const;
export type CheckVerdict = (typeof CHECK_VERDICTS)[number];

export type Tone = "ok" | "warn" | "bad" | "info";

export const VERDICT_INFO: Record<CheckVerdict, { label: string; glyph: string; tone: Tone }> = {
  pass: { label: "Within limit", glyph: "✓", tone: "ok" },
  near_limit: { label: "Near limit — look closer", glyph: "◆", tone: "warn" },
  fail: { label: "Exceeds limit", glyph: "✕", tone: "bad" },
  disputed: { label: "Claim does not hold — ask or correct", glyph: "≠", tone: "warn" },
  no_limit: { label: "No limit applies", glyph: "–", tone: "info" },
};

export type ComboStatus = "within" | "near" | "exceeds";

export const COMBO_STATUS: Record<ComboStatus, { label: string; glyph: string; tone: Tone }> = {
  within: { label: "Within limit", glyph: "✓", tone: "ok" },
  near: { label: "Near limit — look closer", glyph: "◆", tone: "warn" },
  exceeds: { label: "Exceeds limit", glyph: "✕", tone: "bad" },
};

export const CLAIM_INFO: Record<"agree" | "ask" | "correction", { label: string; glyph: string; tone: Tone }> = {
  agree: { label: "Claim agrees", glyph: "✓", tone: "ok" },
  ask: { label: "Ask for the assumptions", glyph: "?", tone: "warn" },
  correction: { label: "Claim does not hold", glyph: "✕", tone: "bad" },
};

export function comboStatus(c: CheckComboResult): ComboStatus {
  if (!c.verdict.pass) return "exceeds";
  return c.verdict.near_limit ? "near" : "within";
}

/** The worst finding: a limit exceeded, then a claim that does not hold, then a result near its limit. */
export function overallVerdict(result: Pick<SolveResult, "checks">): CheckVerdict {
  const combos = result.checks.flatMap((c) => c.combos);
  if (combos.length === 0) return "no_limit";
  if (combos.some((c) => !c.verdict.pass)) return "fail";
  if (combos.some((c) => c.claim && c.claim.verdict !== "agree")) return "disputed";
  if (combos.some((c) => c.verdict.near_limit)) return "near_limit";
  return "pass";
}

const pct = (v: number) => `${v > 0 ? "+" : v < 0 ? "−" : ""}${Math.abs(100 * v).toFixed(1)} %`;

function comboLine(c: CheckComboResult, primary: "in" | "mm"): string {
  const v = c.verdict;
  const ratio = Number.isFinite(v.span_over_delta) ? `l/${Math.round(v.span_over_delta)}` : "no deflection";
  const status = COMBO_STATUS[comboStatus(c)].label.toLowerCase();
  let s = `${c.name}: ${bothLengths(v.delta_m, primary)} = ${ratio}, limit ${v.limit} = ${bothLengths(v.allowable_m, primary)} — ${status}`;
  if (c.claim) {
    const claimed = bothLengths(c.claim.claimed_m, primary);
    s += `; claimed ${claimed}, ${Number.isFinite(c.claim.difference) ? pct(c.claim.difference) : "no deflection computed"} (${c.claim.reason})`;
  }
  return s;
}

/** A short summary for lists and the saved row (≤ 500 characters). */
export function summarize(result: SolveResult): string {
  const primary = isUs(result.units.display.displacement) ? "in" : "mm";
  if (result.checks.length === 0) return "No deflection limit was checked (the model asks for none).";
  const parts = result.checks.map((c) => {
    const worst = [...c.combos].sort((a, b) => b.verdict.delta_m / b.verdict.allowable_m - a.verdict.delta_m / a.verdict.allowable_m)[0];
    if (!worst) return `${c.id}: no combination of this row applies to the model's load cases`;
    const claims = c.combos.filter((k) => k.claim).map((k) => `the ${k.name} claim: ${CLAIM_INFO[k.claim!.verdict].label.replace(/^Claim /, "").toLowerCase()}`);
    const v = worst.verdict;
    return `${c.id}: ${worst.name} ${fmt(primary === "in" ? v.delta_m / 0.0254 : v.delta_m * 1000)} ${primary} vs ${v.limit} = ${fmt(primary === "in" ? v.allowable_m / 0.0254 : v.allowable_m * 1000)} ${primary}, ${COMBO_STATUS[comboStatus(worst)].label.toLowerCase()}${claims.length ? `; ${claims.join(", ")}` : ""}`;
  });
  const text = parts.join(". ");
  return text.length > 500 ? `${text.slice(0, 497)}…` : text;
}

export interface CommentContext {
  checkId: number;
  memberMark: string;
  sheetNumber: string | null;
  calcPage: number | null;
  cycle: number;
  url: string;
  edition: string;
}

function checkBlock(c: CheckResult, primary: "in" | "mm"): string[] {
  return [`${c.id} — ${c.row_label}, span ${fmt(c.span_m / (primary === "in" ? 0.3048 : 1), 4)} ${primary === "in" ? "ft" : "m"}${c.cantilever ? " (cantilever: l = 2 × length)" : ""}:`, ...c.combos.map((k) => `  • ${comboLine(k, primary)}`)];
}

/** The correction comment a failed or disputed check becomes: the numbers, the code section, the link. */
export function commentBody(result: SolveResult, verdict: CheckVerdict, ctx: CommentContext): string {
  const primary = isUs(result.units.display.displacement) ? "in" : "mm";
  const where = [ctx.sheetNumber ? `sheet ${ctx.sheetNumber}` : null, ctx.calcPage ? `calc page ${ctx.calcPage}` : null].filter(Boolean).join(", ");
  const head = `${ctx.memberMark}${where ? ` (${where})` : ""}: an independent deflection check (check #${ctx.checkId}, review cycle ${ctx.cycle}, unit-load method) gives:`;
  const lines = result.checks.flatMap((c) => checkBlock(c, primary));
  const ask =
    verdict === "fail"
      ? `Revise ${ctx.memberMark} so that its deflection meets ${ctx.edition} Table 1604.3, or show by calculation that it does.`
      : verdict === "disputed"
        ? `The claimed deflection of ${ctx.memberMark} does not agree with the independent check. Revise the calculation, or state the assumptions that give the claimed value (span, loads, E, I, creep factor).`
        : `${ctx.memberMark} is within 2 % of its deflection limit: confirm the span, loads and section properties used.`;
  return [head, ...lines, `Creep: ${result.creep.description}.`, ask, `Check: ${ctx.url}`].join("\n");
}
