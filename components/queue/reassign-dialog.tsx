"use client";

import { useMutation, useQuery } from "@tanstack/react-query";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { FormMessage, SelectField, TextArea } from "@/components/ui/field";
import { ApiError, fetchJson } from "@/lib/client/fetch-json";

export interface Examiner {
  id: number;
  name: string;
  role: string;
  openReviews: number;
}

interface Outcome {
  applicationId: number;
  number: string | null;
  ok: boolean;
  code?: string;
  message?: string;
}

export function useExaminers() {
  return useQuery({
    queryKey: ["examiners"],
    queryFn: () => fetchJson<{ examiners: Examiner[] }>("/api/examiners").then((r) => r.examiners),
    staleTime: 15_000,
  });
}

/** Reassign the chosen reviews to one examiner, chosen by current load, with an internal reason. */
export function ReassignDialog({
  open,
  selected,
  onClose,
  onDone,
}: {
  open: boolean;
  selected: { id: number; number: string | null }[];
  onClose: () => void;
  onDone: (summary: string) => void;
}) {
  const examiners = useExaminers();
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [outcomes, setOutcomes] = useState<{ examiner: string; results: Outcome[] } | null>(null);
  const send = useMutation({
    mutationFn: (body: { applicationIds: number[]; examinerId: number; reason: string }) =>
      fetchJson<{ examiner: { name: string }; results: Outcome[]; reassigned: number }>("/api/queue/reassign", { method: "POST", json: body }),
  });

  function close() {
    setErrors({});
    setMessage(null);
    const done = outcomes;
    setOutcomes(null);
    if (done) {
      const n = done.results.filter((r) => r.ok).length;
      onDone(`${n} review${n === 1 ? "" : "s"} reassigned to ${done.examiner}.`);
    } else onClose();
  }

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const examinerId = Number(f.get("examinerId"));
    const reason = String(f.get("reason") ?? "");
    const local: Record<string, string> = {};
    if (!examinerId) local.examinerId = "Choose a plans examiner.";
    if (reason.trim().length < 3) local.reason = "Give the reason (kept internal, never shown to the applicant).";
    setErrors(local);
    setMessage(null);
    if (Object.keys(local).length) return;
    try {
      const r = await send.mutateAsync({ applicationIds: selected.map((s) => s.id), examinerId, reason });
      setOutcomes({ examiner: r.examiner.name, results: r.results });
    } catch (err) {
      if (err instanceof ApiError) {
        setErrors(err.fields ?? {});
        setMessage(err.message);
      } else setMessage("The reviews could not be reassigned.");
    }
  }

  const numbers = selected.map((s) => s.number ?? `#${s.id}`);
  return (
    <Dialog open={open} onClose={close} title={`Reassign ${selected.length} review${selected.length === 1 ? "" : "s"}`}>
      {outcomes ? (
        <div>
          <ul aria-label="Reassignment results" className="mb-4 space-y-1 text-sm">
            {outcomes.results.map((r) => (
              <li key={r.applicationId} className={r.ok ? "text-ok" : "text-bad"}>
                <span aria-hidden="true">{r.ok ? "✓ " : "✕ "}</span>
                <span className="num">{r.number ?? `#${r.applicationId}`}</span>: {r.ok ? `now with ${outcomes.examiner}` : r.message}
              </li>
            ))}
          </ul>
          <p className="mb-4 text-xs text-ink-soft">Both examiners are e-mailed. The reason stays in the audit trail; the applicant sees only the new examiner&apos;s name.</p>
          <Button type="button" onClick={close}>
            Done
          </Button>
        </div>
      ) : (
        <form onSubmit={submit} noValidate>
          {message ? <FormMessage kind="error">{message}</FormMessage> : null}
          <p className="mb-3 text-sm">
            <span className="text-ink-soft">Reviews: </span>
            <span className="num">{numbers.join(", ")}</span>
          </p>
          <SelectField label="Plans examiner" name="examinerId" defaultValue="" error={errors.examinerId} hint="Open reviews each one holds now, in brackets.">
            <option value="" disabled>
              {examiners.isPending ? "Loading…" : "Choose an examiner"}
            </option>
            {(examiners.data ?? []).map((x) => (
              <option key={x.id} value={x.id}>
                {x.name} ({x.openReviews} open{x.role === "supervisor" ? ", supervisor" : ""})
              </option>
            ))}
          </SelectField>
          <TextArea
            label="Reason for the move"
            name="reason"
            rows={3}
            maxLength={500}
            error={errors.reason}
            hint="Internal: kept in the audit trail, never shown to the applicant."
          />
          <div className="flex gap-2">
            <Button type="submit" disabled={send.isPending}>
              {send.isPending ? "Reassigning…" : "Reassign"}
            </Button>
            <Button type="button" variant="secondary" onClick={close}>
              Cancel
            </Button>
          </div>
        </form>
      )}
    </Dialog>
  );
}
