"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage, TextField } from "@/components/ui/field";
import { ApiError, fetchJson } from "@/lib/client/fetch-json";
import { formatDayLong } from "@/lib/review-clock/format";
import type { ReviewTargets } from "@/lib/review-clock/targets";

interface Holiday {
  day: string;
  name: string;
}

type Notice = { kind: "ok" | "error"; text: string } | null;

export function ReviewClockSettings({ initialTargets, initialHolidays }: { initialTargets: ReviewTargets; initialHolidays: Holiday[] }) {
  const qc = useQueryClient();
  const settings = useQuery({
    queryKey: ["review-clock"],
    queryFn: () => fetchJson<{ targets: ReviewTargets; holidays: Holiday[] }>("/api/settings/review-clock"),
    initialData: { targets: initialTargets, holidays: initialHolidays },
  });
  const [notice, setNotice] = useState<Notice>(null);
  const refresh = () => qc.invalidateQueries({ queryKey: ["review-clock"] });

  const remove = useMutation({
    mutationFn: (day: string) => fetchJson(`/api/settings/holidays/${day}`, { method: "DELETE" }),
    onSuccess: (_r, day) => {
      setNotice({ kind: "ok", text: `${formatDayLong(day)} is a working day again. Due dates already given stay as they are.` });
      void refresh();
    },
    onError: (e) => setNotice({ kind: "error", text: e.message }),
  });

  const years = [...new Set(settings.data.holidays.map((h) => h.day.slice(0, 4)))].sort();

  return (
    <div className="grid gap-8 lg:grid-cols-[22rem_1fr]">
      <div>
        <TargetsForm targets={settings.data.targets} onSaved={(t) => (setNotice({ kind: "ok", text: `Saved: ${t.firstReviewDays} business days for a first review, ${t.resubmittalDays} for a resubmittal. Cycles that start from now on use them.` }), void refresh())} />
        <HolidayForm onAdded={(text) => (setNotice({ kind: "ok", text }), void refresh())} />
      </div>
      <section aria-labelledby="holidays-title" className="min-w-0">
        <h2 id="holidays-title" className="mb-3 text-lg font-semibold">Holidays and closures</h2>
        {notice ? <FormMessage kind={notice.kind}>{notice.text}</FormMessage> : null}
        {settings.data.holidays.length === 0 ? <p className="text-sm text-ink-soft">No holidays yet: only weekends are skipped.</p> : null}
        {years.map((y) => (
          <div key={y} className="mb-5">
            <h3 className="mb-1 text-sm font-semibold">{y}</h3>
            <table className="w-full border-collapse text-sm">
              <caption className="sr-only">Holidays in {y}</caption>
              <tbody>
                {settings.data.holidays
                  .filter((h) => h.day.startsWith(y))
                  .map((h) => (
                    <tr key={h.day} className="border-b border-rule last:border-b-0">
                      <td className="num w-64 py-1.5 pr-3">{formatDayLong(h.day)}</td>
                      <td className="py-1.5 pr-3">{h.name}</td>
                      <td className="py-1.5 text-right">
                        <Button variant="quiet" disabled={remove.isPending} onClick={() => remove.mutate(h.day)} aria-label={`Remove ${h.name} ${h.day}`}>
                          Remove
                        </Button>
                      </td>
                    </tr>
                  ))}
              </tbody>
            </table>
          </div>
        ))}
      </section>
    </div>
  );
}

function TargetsForm({ targets, onSaved }: { targets: ReviewTargets; onSaved: (t: ReviewTargets) => void }) {
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const save = useMutation({ mutationFn: (t: ReviewTargets) => fetchJson<{ targets: ReviewTargets }>("/api/settings/review-clock", { method: "PUT", json: t }) });

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const body = { firstReviewDays: Number(f.get("firstReviewDays")), resubmittalDays: Number(f.get("resubmittalDays")) };
    setErrors({});
    setMessage(null);
    try {
      const r = await save.mutateAsync(body);
      onSaved(r.targets);
    } catch (err) {
      if (err instanceof ApiError) {
        setErrors(err.fields ?? {});
        setMessage(err.message);
      } else setMessage("The targets could not be saved.");
    }
  }

  return (
    <section aria-labelledby="targets-title" className="mb-8">
      <h2 id="targets-title" className="mb-3 text-lg font-semibold">Review targets</h2>
      {message ? <FormMessage kind="error">{message}</FormMessage> : null}
      <form onSubmit={submit} noValidate key={`${targets.firstReviewDays}-${targets.resubmittalDays}`}>
        <TextField label="First review (business days)" name="firstReviewDays" type="number" min={1} max={60} defaultValue={targets.firstReviewDays} error={errors.firstReviewDays} hint="Cycle 1, from acceptance at intake." />
        <TextField label="Resubmittal review (business days)" name="resubmittalDays" type="number" min={1} max={60} defaultValue={targets.resubmittalDays} error={errors.resubmittalDays} hint="Every later cycle, from the resubmittal." />
        <Button type="submit" disabled={save.isPending}>
          Save targets
        </Button>
      </form>
    </section>
  );
}

function HolidayForm({ onAdded }: { onAdded: (text: string) => void }) {
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const add = useMutation({
    mutationFn: (h: Holiday) => fetchJson<{ movedDueDates: number }>("/api/settings/holidays", { method: "POST", json: h }),
  });

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const f = new FormData(form);
    const body = { day: String(f.get("day") ?? ""), name: String(f.get("name") ?? "") };
    setErrors({});
    setMessage(null);
    try {
      const r = await add.mutateAsync(body);
      form.reset();
      onAdded(`${formatDayLong(body.day)} added (${body.name}).${r.movedDueDates ? ` ${r.movedDueDates} due date${r.movedDueDates === 1 ? "" : "s"} on that day moved to the next business day.` : ""}`);
    } catch (err) {
      if (err instanceof ApiError) {
        setErrors(err.fields ?? {});
        setMessage(err.message);
      } else setMessage("The holiday could not be added.");
    }
  }

  return (
    <section aria-labelledby="add-holiday-title">
      <h2 id="add-holiday-title" className="mb-3 text-lg font-semibold">Add a holiday or closure</h2>
      {message ? <FormMessage kind="error">{message}</FormMessage> : null}
      <form onSubmit={submit} noValidate>
        <TextField label="Date" name="day" type="date" required error={errors.day} />
        <TextField label="Name" name="name" required maxLength={80} error={errors.name} hint="e.g. Day after Thanksgiving, or Office closed: snow" />
        <Button type="submit" disabled={add.isPending}>
          Add to the calendar
        </Button>
      </form>
    </section>
  );
}
