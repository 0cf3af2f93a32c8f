"use client";

import { useState, useTransition, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage, TextField } from "@/components/ui/field";
import {
  bracketJumps,
  bracketRangeText,
  centsToInput,
  feeScheduleInputSchema,
  formatBasisPoints,
  formatCents,
  parseDollarsToCents,
  parsePercentToBasisPoints,
  quoteResubmittalFee,
  quoteReviewFee,
  type FeeSchedule,
  type FeeScheduleInput,
} from "@/lib/fees";
import { InvoiceLines } from "./invoice-lines";

type SaveResult = { ok: true; schedule: FeeSchedule } | { ok: false; message: string; fields?: Record<string, string> };

interface BracketDraft {
  key: number;
  upTo: string;
  base: string;
  perStep: string;
  step: string;
}
interface FixedDraft {
  key: number;
  code: string;
  label: string;
  amount: string;
}
interface Draft {
  label: string;
  brackets: BracketDraft[];
  percent: string;
  fixed: FixedDraft[];
  includedCycles: string;
  resubmittalFee: string;
}

let seq = 0;
const nextKey = () => ++seq;

function toDraft(s: FeeSchedule): Draft {
  return {
    label: s.label,
    brackets: s.brackets.map((b) => ({
      key: nextKey(),
      upTo: b.upToCents === null ? "" : centsToInput(b.upToCents),
      base: centsToInput(b.baseCents),
      perStep: centsToInput(b.perStepCents),
      step: centsToInput(b.stepCents),
    })),
    percent: formatBasisPoints(s.planReviewBasisPoints).replace("%", ""),
    fixed: s.fixedFees.map((f) => ({ key: nextKey(), code: f.code, label: f.label, amount: centsToInput(f.amountCents) })),
    includedCycles: String(s.resubmittal.includedCycles),
    resubmittalFee: centsToInput(s.resubmittal.feeCents),
  };
}

const slug = (label: string) => `fee_${label.toLowerCase().replace(/[^a-z0-9]+/g, "_").replace(/^_|_$/g, "").slice(0, 24) || "fixed"}`;

/** The draft as the schedule the server takes, or the field messages that stop it. */
function fromDraft(d: Draft): { input: FeeScheduleInput | null; errors: Record<string, string> } {
  const errors: Record<string, string> = {};
  const money = (text: string, key: string, what: string): number => {
    const c = parseDollarsToCents(text);
    if (c === null) errors[key] = `Enter ${what} in dollars, e.g. 1,022.50.`;
    return c ?? 0;
  };
  const brackets = d.brackets.map((b, i) => {
    const last = i === d.brackets.length - 1;
    return {
      upToCents: last ? null : money(b.upTo, `brackets.${i}.upToCents`, "the upper limit"),
      baseCents: money(b.base, `brackets.${i}.baseCents`, "the base fee"),
      perStepCents: money(b.perStep || "0", `brackets.${i}.perStepCents`, "the fee per step"),
      stepCents: money(b.step || "0", `brackets.${i}.stepCents`, "the step"),
    };
  });
  const bp = parsePercentToBasisPoints(d.percent);
  if (bp === null) errors.planReviewBasisPoints = "Enter a percentage, e.g. 65 or 62.5.";
  const used = new Set<string>();
  const fixedFees = d.fixed.map((f, i) => {
    let code = f.code || slug(f.label);
    while (used.has(code)) code = `${code}_2`;
    used.add(code);
    return { code, label: f.label.trim(), amountCents: money(f.amount, `fixedFees.${i}.amountCents`, "the amount") };
  });
  const cycles = /^\d{1,2}$/.test(d.includedCycles.trim()) ? Number(d.includedCycles) : NaN;
  if (Number.isNaN(cycles)) errors["resubmittal.includedCycles"] = "Enter a whole number of review cycles.";
  const candidate = {
    label: d.label,
    currency: "usd" as const,
    brackets,
    planReviewBasisPoints: bp ?? 0,
    fixedFees,
    resubmittal: { includedCycles: cycles, feeCents: money(d.resubmittalFee, "resubmittal.feeCents", "the resubmittal fee") },
  };
  const parsed = feeScheduleInputSchema.safeParse(candidate);
  if (!parsed.success) for (const issue of parsed.error.issues) errors[issue.path.join(".")] ??= issue.message;
  return { input: Object.keys(errors).length === 0 && parsed.success ? parsed.data : null, errors };
}

/** "up to $2,000.00", "$2,000.01 to $25,000.00", … for the rows as typed ("—" where a limit is not yet an amount). */
function bracketRanges(rows: BracketDraft[]): string[] {
  const out: string[] = [];
  let lower = 0;
  rows.forEach((b, i) => {
    const last = i === rows.length - 1;
    const up = last ? null : parseDollarsToCents(b.upTo);
    out.push(up === null && !last ? "—" : bracketRangeText(lower, up));
    if (up !== null) lower = up;
  });
  return out;
}

const box = "w-full rounded-sm border border-rule-strong bg-sheet px-2 py-1 text-sm aria-[invalid=true]:border-bad";
const cell = `${box} num text-right`;

export function FeeScheduleEditor({ initial, save }: { initial: FeeSchedule; save: (input: FeeScheduleInput) => Promise<SaveResult> }) {
  const [current, setCurrent] = useState(initial);
  const [draft, setDraft] = useState<Draft>(() => toDraft(initial));
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const [notice, setNotice] = useState<{ kind: "ok" | "error"; text: string } | null>(null);
  const [showErrors, setShowErrors] = useState(false);
  const [pending, start] = useTransition();
  const [valuation, setValuation] = useState("185,000");

  const { input, errors: draftErrors } = fromDraft(draft);
  const errors = { ...(showErrors ? draftErrors : {}), ...serverErrors };
  const err = (key: string) => errors[key];
  const setB = (i: number, p: Partial<BracketDraft>) => setDraft((d) => ({ ...d, brackets: d.brackets.map((b, j) => (j === i ? { ...b, ...p } : b)) }));
  const setF = (i: number, p: Partial<FixedDraft>) => setDraft((d) => ({ ...d, fixed: d.fixed.map((f, j) => (j === i ? { ...f, ...p } : f)) }));

  const preview = input ? { ...input, version: "draft", revision: 0 } : null;
  const valuationCents = parseDollarsToCents(valuation);
  const quote = preview && valuationCents && valuationCents > 0 ? quoteReviewFee(preview, valuationCents) : null;
  const nextCycle = preview ? preview.resubmittal.includedCycles + 1 : null;
  const resub = preview && nextCycle ? quoteResubmittalFee(preview, nextCycle) : null;
  const jumps = preview ? bracketJumps(preview) : [];

  function submit(e: FormEvent) {
    e.preventDefault();
    setShowErrors(true);
    setServerErrors({});
    setNotice(null);
    if (!input) {
      setNotice({ kind: "error", text: "Some fields need attention." });
      return;
    }
    start(async () => {
      const r = await save(input);
      if (r.ok) {
        setCurrent(r.schedule);
        setDraft(toDraft(r.schedule));
        setShowErrors(false);
        setNotice({ kind: "ok", text: `Saved as ${r.schedule.version}. Invoices issued from now on use it; invoices already issued keep their amounts.` });
      } else {
        setServerErrors(r.fields ?? {});
        setNotice({ kind: "error", text: r.message });
      }
    });
  }

  const ranges = bracketRanges(draft.brackets);

  return (
    <div className="grid gap-8 xl:grid-cols-[minmax(0,1fr)_24rem]">
      <form onSubmit={submit} noValidate aria-label="Fee schedule" className="min-w-0">
        <p className="mb-4 text-sm">
          In force: <strong className="num">{current.version}</strong> — {current.label}
        </p>
        {notice ? <FormMessage kind={notice.kind}>{notice.text}</FormMessage> : null}
        <TextField label="Name of the schedule" name="label" value={draft.label} onChange={(e) => setDraft({ ...draft, label: e.target.value })} error={err("label")} hint="Say where the numbers come from; the demo schedule is invented." />

        <fieldset className="mb-6 min-w-0">
          <legend className="mb-2 text-base font-semibold">Building permit fee by valuation</legend>
          <p className="mb-2 text-xs text-ink-soft">
            Each bracket covers valuations above the previous upper limit up to and including its own. Fee = base + fee per step × the number of steps above the lower limit, a part step counting as a whole one (&ldquo;for each additional $1,000 or fraction thereof&rdquo;). A step of 0 makes the bracket a flat fee.
          </p>
          <div className="overflow-x-auto">
            <table className="w-full border-collapse text-sm">
              <caption className="sr-only">Valuation brackets</caption>
              <thead>
                <tr className="border-b border-rule text-left text-ink-soft">
                  <th scope="col" className="py-1 pr-2 font-medium">Valuations</th>
                  <th scope="col" className="py-1 pr-2 font-medium">Up to ($)</th>
                  <th scope="col" className="py-1 pr-2 font-medium">Base fee ($)</th>
                  <th scope="col" className="py-1 pr-2 font-medium">Plus ($)</th>
                  <th scope="col" className="py-1 pr-2 font-medium">For each additional ($)</th>
                  <th scope="col"><span className="sr-only">Remove</span></th>
                </tr>
              </thead>
              <tbody>
                {draft.brackets.map((b, i) => {
                  const n = i + 1;
                  const last = i === draft.brackets.length - 1;
                  const rowErrors = ["upToCents", "baseCents", "perStepCents", "stepCents"].map((f) => err(`brackets.${i}.${f}`)).filter(Boolean);
                  return (
                    <tr key={b.key} className="border-b border-rule align-top">
                      <td className="num py-1.5 pr-2 text-xs text-ink-soft">
                        {ranges[i]}
                        {rowErrors.length ? <p role="alert" className="mt-1 font-sans font-medium text-bad">{rowErrors[0]}</p> : null}
                      </td>
                      <td className="py-1.5 pr-2">
                        {last ? (
                          <span className="text-xs text-ink-soft">no upper limit</span>
                        ) : (
                          <input aria-label={`Bracket ${n}: valuation up to`} className={`${cell} min-w-[7.5rem]`} inputMode="decimal" value={b.upTo} aria-invalid={err(`brackets.${i}.upToCents`) ? true : undefined} onChange={(e) => setB(i, { upTo: e.target.value })} />
                        )}
                      </td>
                      <td className="py-1.5 pr-2">
                        <input aria-label={`Bracket ${n}: base fee`} className={`${cell} min-w-[5.5rem]`} inputMode="decimal" value={b.base} aria-invalid={err(`brackets.${i}.baseCents`) ? true : undefined} onChange={(e) => setB(i, { base: e.target.value })} />
                      </td>
                      <td className="py-1.5 pr-2">
                        <input aria-label={`Bracket ${n}: fee per step`} className={`${cell} min-w-[4.5rem]`} inputMode="decimal" value={b.perStep} aria-invalid={err(`brackets.${i}.perStepCents`) ? true : undefined} onChange={(e) => setB(i, { perStep: e.target.value })} />
                      </td>
                      <td className="py-1.5 pr-2">
                        <input aria-label={`Bracket ${n}: step`} className={`${cell} min-w-[5.5rem]`} inputMode="decimal" value={b.step} aria-invalid={err(`brackets.${i}.stepCents`) ? true : undefined} onChange={(e) => setB(i, { step: e.target.value })} />
                      </td>
                      <td className="py-1.5">
                        <Button
                          type="button"
                          variant="quiet"
                          aria-label={`Remove bracket ${n}`}
                          disabled={draft.brackets.length === 1}
                          onClick={() => setDraft((d) => ({ ...d, brackets: d.brackets.filter((_, j) => j !== i) }))}
                        >
                          Remove
                        </Button>
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          <Button
            type="button"
            variant="secondary"
            className="mt-2"
            onClick={() =>
              setDraft((d) => {
                // A new bracket goes before the open-ended last one.
                const rows = [...d.brackets];
                const last = rows.pop()!;
                return { ...d, brackets: [...rows, { key: nextKey(), upTo: "", base: last.base, perStep: last.perStep, step: last.step }, last] };
              })
            }
          >
            Add a bracket
          </Button>
          {jumps.length ? (
            <div className="mt-3 text-xs text-warn" role="status">
              <p className="font-medium">The fee steps at these edges (allowed; some published schedules do):</p>
              <ul className="ml-4 list-disc">{jumps.map((j) => <li key={j}>{j}</li>)}</ul>
            </div>
          ) : null}
        </fieldset>

        <fieldset className="mb-6 grid gap-x-6 sm:grid-cols-2">
          <legend className="mb-2 text-base font-semibold">Plan review and resubmittals</legend>
          <TextField label="Plan-review fee (% of the permit fee)" name="percent" inputMode="decimal" value={draft.percent} onChange={(e) => setDraft({ ...draft, percent: e.target.value })} error={err("planReviewBasisPoints")} hint="Rounded half up to the cent." />
          <div />
          <TextField label="Review cycles the plan-review fee covers" name="includedCycles" inputMode="numeric" value={draft.includedCycles} onChange={(e) => setDraft({ ...draft, includedCycles: e.target.value })} error={err("resubmittal.includedCycles")} hint="Cycle 1 is the first review; 3 covers two resubmittals." />
          <TextField label="Fee for each later review cycle ($)" name="resubmittalFee" inputMode="decimal" value={draft.resubmittalFee} onChange={(e) => setDraft({ ...draft, resubmittalFee: e.target.value })} error={err("resubmittal.feeCents")} hint="0 charges nothing." />
        </fieldset>

        <fieldset className="mb-6">
          <legend className="mb-2 text-base font-semibold">Fixed fees charged with the plan-review fee</legend>
          {draft.fixed.length === 0 ? <p className="mb-2 text-sm text-ink-soft">None.</p> : null}
          {draft.fixed.map((f, i) => (
            <div key={f.key} className="mb-2 grid grid-cols-[minmax(0,1fr)_8rem_auto] items-start gap-2">
              <div>
                <input aria-label={`Fixed fee ${i + 1}: name`} className={box} value={f.label} aria-invalid={err(`fixedFees.${i}.label`) ? true : undefined} onChange={(e) => setF(i, { label: e.target.value })} />
                {err(`fixedFees.${i}.label`) || err(`fixedFees.${i}.amountCents`) ? <p role="alert" className="mt-1 text-xs font-medium text-bad">{err(`fixedFees.${i}.label`) ?? err(`fixedFees.${i}.amountCents`)}</p> : null}
              </div>
              <input aria-label={`Fixed fee ${i + 1}: amount`} className={cell} inputMode="decimal" value={f.amount} aria-invalid={err(`fixedFees.${i}.amountCents`) ? true : undefined} onChange={(e) => setF(i, { amount: e.target.value })} />
              <Button type="button" variant="quiet" aria-label={`Remove fixed fee ${i + 1}`} onClick={() => setDraft((d) => ({ ...d, fixed: d.fixed.filter((_, j) => j !== i) }))}>
                Remove
              </Button>
            </div>
          ))}
          <Button type="button" variant="secondary" disabled={draft.fixed.length >= 10} onClick={() => setDraft((d) => ({ ...d, fixed: [...d.fixed, { key: nextKey(), code: "", label: "", amount: "" }] }))}>
            Add a fixed fee
          </Button>
        </fieldset>

        <div className="flex items-center gap-3">
          <Button type="submit" disabled={pending}>
            {pending ? "Saving…" : "Save as a new revision"}
          </Button>
          <Button type="button" variant="quiet" onClick={() => (setDraft(toDraft(current)), setShowErrors(false), setServerErrors({}), setNotice(null))}>
            Discard changes
          </Button>
        </div>
      </form>

      <aside aria-labelledby="preview-title" className="min-w-0">
        <h2 id="preview-title" className="mb-2 text-lg font-semibold">Try a valuation</h2>
        <TextField label="Project valuation ($)" name="previewValuation" inputMode="decimal" value={valuation} onChange={(e) => setValuation(e.target.value)} hint="Shows what an application with this valuation would be charged at acceptance, with the schedule as edited." />
        {!preview ? (
          <p className="text-sm text-ink-soft">Correct the schedule to see the fee.</p>
        ) : !quote ? (
          <p className="text-sm text-ink-soft">Enter a valuation above zero.</p>
        ) : (
          <div className="border border-rule bg-sheet p-3" data-testid="fee-preview">
            <InvoiceLines invoice={{ ...quote, scheduleVersion: "as edited" }} caption="Fee for the valuation entered" />
            <p className="mt-2 text-xs text-ink-soft">Building permit fee (charged at permit issuance, not now): <span className="num">{formatCents(quote.permitFeeCents)}</span>.</p>
            {resub ? <p className="mt-1 text-xs text-ink-soft">Review cycle {nextCycle} and each later one: <span className="num">{formatCents(resub.totalCents)}</span>.</p> : null}
          </div>
        )}
      </aside>
    </div>
  );
}
