"use client";

import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { FormMessage } from "@/components/ui/field";
import { ApiError, fetchJson } from "@/lib/client/fetch-json";
import type { WorkflowEvent } from "@/lib/workflow";
import type { View } from "./types";
import { useAppMutation } from "./use-application";

// The completeness screen at intake (IBC 2021 §107.1 construction documents, §1603 design data;
// from memory). The technician ticks each item before accepting.
export const INTAKE_CHECKLIST = [
  { key: "drawings", label: "Drawing set uploaded and legible" },
  { key: "calculations", label: "Structural calculation package included" },
  { key: "designData", label: "Design loads and data shown on the drawings (IBC 1603)" },
  { key: "seal", label: "Seal, signature and licence of the design professional present" },
] as const;

interface Examiner {
  id: number;
  name: string;
  role: string;
  openReviews: number;
}

const VARIANT: Partial<Record<WorkflowEvent, "primary" | "secondary" | "danger">> = {
  withdraw: "danger",
  return_incomplete: "secondary",
  reassign: "secondary",
  approve_with_conditions: "secondary",
};

export function ActionBar({ view }: { view: View }) {
  const app = view.application;
  const [open, setOpen] = useState<WorkflowEvent | null>(null);
  const [error, setError] = useState<{ message: string; stale: boolean } | null>(null);
  const fire = useAppMutation(app.id, (v: { event: WorkflowEvent; input?: unknown; checklist?: Record<string, boolean> }) =>
    fetchJson(`/api/applications/${app.id}/events`, { method: "POST", json: { ...v, version: app.version } }),
  );

  async function run(event: WorkflowEvent, input?: unknown, checklist?: Record<string, boolean>) {
    setError(null);
    try {
      await fire.mutateAsync({ event, input, checklist });
      setOpen(null);
    } catch (e) {
      setError({ message: e instanceof Error ? e.message : "That did not work.", stale: e instanceof ApiError && e.status === 409 });
    }
  }

  if (view.actions.length === 0) return null;
  // One line per reason: an unpaid fee, say, holds several steps and is said once for all of them.
  const reasons = new Map<string, { id: string; labels: string[] }>();
  for (const a of view.actions) {
    if (!a.blockedBy) continue;
    const r = reasons.get(a.blockedBy) ?? { id: `blocked-${a.event}`, labels: [] };
    r.labels.push(a.label);
    reasons.set(a.blockedBy, r);
  }
  return (
    <div className="flex flex-col items-end gap-2">
      <div className="flex flex-wrap justify-end gap-2" role="group" aria-label="Actions on this application">
        {view.actions.map((a) => (
          <Button
            key={a.event}
            variant={VARIANT[a.event] ?? "primary"}
            disabled={!a.allowed || fire.isPending}
            title={a.blockedBy}
            aria-describedby={a.blockedBy ? reasons.get(a.blockedBy)!.id : undefined}
            onClick={() => (needsDialog(a.event) ? setOpen(a.event) : void run(a.event))}
          >
            {a.label}
          </Button>
        ))}
      </div>
      {[...reasons].map(([reason, r]) => (
        <p key={r.id} id={r.id} className="text-xs text-ink-soft">
          {r.labels.join(", ")}: {reason}
        </p>
      ))}
      {error && !open ? <Problem error={error} /> : null}
      <EventDialog event={open} view={view} busy={fire.isPending} error={error} onClose={() => { setOpen(null); setError(null); }} onRun={run} />
    </div>
  );
}

const needsDialog = (e: WorkflowEvent) => ["return_incomplete", "accept", "approve_with_conditions", "withdraw", "reassign", "approve", "issue_corrections", "resubmit"].includes(e);

function Problem({ error }: { error: { message: string; stale: boolean } }) {
  return (
    <FormMessage kind="error">
      {error.message}{" "}
      {error.stale ? (
        <button type="button" className="underline" onClick={() => window.location.reload()}>
          Reload
        </button>
      ) : null}
    </FormMessage>
  );
}

function EventDialog({
  event,
  view,
  busy,
  error,
  onClose,
  onRun,
}: {
  event: WorkflowEvent | null;
  view: View;
  busy: boolean;
  error: { message: string; stale: boolean } | null;
  onClose: () => void;
  onRun: (event: WorkflowEvent, input?: unknown, checklist?: Record<string, boolean>) => Promise<void>;
}) {
  const title = event ? (view.actions.find((a) => a.event === event)?.label ?? "") : "";
  return (
    <Dialog open={event !== null} onClose={onClose} title={title}>
      {error ? <Problem error={error} /> : null}
      {event ? <EventForm event={event} view={view} busy={busy} onCancel={onClose} onRun={onRun} /> : null}
    </Dialog>
  );
}

function EventForm({
  event,
  view,
  busy,
  onCancel,
  onRun,
}: {
  event: WorkflowEvent;
  view: View;
  busy: boolean;
  onCancel: () => void;
  onRun: (event: WorkflowEvent, input?: unknown, checklist?: Record<string, boolean>) => Promise<void>;
}) {
  const [checks, setChecks] = useState<Record<string, boolean>>({});
  const wantsExaminer = event === "accept" || event === "reassign";
  const examiners = useQuery({
    queryKey: ["examiners"],
    queryFn: () => fetchJson<{ examiners: Examiner[] }>("/api/examiners").then((r) => r.examiners),
    enabled: wantsExaminer,
  });
  const openComments = view.comments.filter((c) => c.status !== "resolved");
  const lines = (s: FormDataEntryValue | null) =>
    String(s ?? "")
      .split("\n")
      .map((l) => l.trim())
      .filter(Boolean);

  function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    switch (event) {
      case "return_incomplete": {
        const missing = INTAKE_CHECKLIST.filter((c) => !checks[c.key]).map((c) => `Missing: ${c.label.toLowerCase()}`);
        return void onRun(event, { reasons: [...missing, ...lines(f.get("reasons"))] }, checks);
      }
      case "accept":
        return void onRun(event, { examinerId: Number(f.get("examinerId")) }, checks);
      case "reassign":
        return void onRun(event, { examinerId: Number(f.get("examinerId")), reason: String(f.get("reason") ?? "") });
      case "approve_with_conditions":
        return void onRun(event, {
          conditions: lines(f.get("conditions")).map((text) => ({ text })),
        });
      case "withdraw":
        return void onRun(event, { reason: String(f.get("reason") ?? "") });
      default:
        return void onRun(event);
    }
  }

  const allChecked = INTAKE_CHECKLIST.every((c) => checks[c.key]);
  return (
    <form onSubmit={submit}>
      {event === "accept" || event === "return_incomplete" ? (
        <fieldset className="mb-4">
          <legend className="mb-2 text-sm font-medium">Completeness screen</legend>
          {INTAKE_CHECKLIST.map((c) => (
            <label key={c.key} className="mb-1 flex items-start gap-2 text-sm">
              <input type="checkbox" checked={Boolean(checks[c.key])} onChange={(e) => setChecks((s) => ({ ...s, [c.key]: e.target.checked }))} className="mt-0.5" />
              {c.label}
            </label>
          ))}
        </fieldset>
      ) : null}
      {wantsExaminer ? (
        <label className="mb-4 block text-sm">
          <span className="font-medium">Plans examiner</span>
          <select name="examinerId" required className="mt-1 block w-full rounded-sm border border-rule-strong bg-sheet px-2 py-1.5">
            <option value="">Choose…</option>
            {(examiners.data ?? [])
              .filter((x) => x.id !== view.application.assignedExaminerId)
              .map((x) => (
                <option key={x.id} value={x.id}>
                  {x.name} — {x.openReviews} open review{x.openReviews === 1 ? "" : "s"}
                </option>
              ))}
          </select>
        </label>
      ) : null}
      {event === "return_incomplete" ? (
        <label className="mb-4 block text-sm">
          <span className="font-medium">Other reasons (one per line)</span>
          <textarea name="reasons" rows={3} className="mt-1 block w-full rounded-sm border border-rule-strong bg-sheet px-2 py-1.5" />
          <span className="text-xs text-ink-soft">Unticked checklist items are sent as reasons too. The applicant receives them in writing.</span>
        </label>
      ) : null}
      {event === "reassign" ? (
        <label className="mb-4 block text-sm">
          <span className="font-medium">Reason (internal; the applicant does not see it)</span>
          <textarea name="reason" rows={2} required className="mt-1 block w-full rounded-sm border border-rule-strong bg-sheet px-2 py-1.5" />
        </label>
      ) : null}
      {event === "approve_with_conditions" ? (
        <label className="mb-4 block text-sm">
          <span className="font-medium">Conditions of approval (one per line)</span>
          <textarea name="conditions" rows={4} required className="mt-1 block w-full rounded-sm border border-rule-strong bg-sheet px-2 py-1.5" placeholder="Deferred submittal: pre-engineered roof truss drawings before framing inspection." />
        </label>
      ) : null}
      {event === "withdraw" ? (
        <label className="mb-4 block text-sm">
          <span className="font-medium">Reason (optional)</span>
          <textarea name="reason" rows={2} className="mt-1 block w-full rounded-sm border border-rule-strong bg-sheet px-2 py-1.5" />
          <span className="text-xs text-ink-soft">A withdrawn application cannot be reopened.</span>
        </label>
      ) : null}
      {event === "issue_corrections" ? (
        <p className="mb-4 text-sm">
          The correction list goes to the applicant with {openComments.length} comment{openComments.length === 1 ? "" : "s"}. Draft comments become final and can no longer be edited.
        </p>
      ) : null}
      {event === "approve" ? <p className="mb-4 text-sm">Approve the construction documents as reviewed for code compliance in cycle {view.application.cycle}?</p> : null}
      {event === "resubmit" ? <p className="mb-4 text-sm">Send your responses and revised documents to the plans examiner? You cannot change them after resubmitting.</p> : null}
      <div className="flex justify-end gap-2">
        <Button type="button" variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit" disabled={busy || (event === "accept" && !allChecked)}>
          {view.actions.find((a) => a.event === event)?.label}
        </Button>
      </div>
    </form>
  );
}
