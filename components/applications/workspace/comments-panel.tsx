"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import { ApiError, fetchJson } from "@/lib/client/fetch-json";
import { DISCIPLINES } from "@/lib/validations/application";
import type { CommentView, View } from "./types";
import { useAppMutation } from "./use-application";

export interface DraftPin {
  sheetId: number;
  x: number;
  y: number;
}

const STATUS = {
  draft: { label: "Draft — not yet issued", cls: "border-dashed border-rule-strong text-ink-soft" },
  open: { label: "Open", cls: "border-bad text-bad" },
  resolved: { label: "Resolved", cls: "border-ok text-ok" },
} as const;

const control = "mt-1 block w-full rounded-sm border border-rule-strong bg-sheet px-2 py-1.5 text-sm";

function sheetLabel(view: View, sheetId: number | null) {
  const s = view.sheets.find((x) => x.id === sheetId);
  return s ? `${s.sheetNumber ?? `Page ${s.page}`} — ${s.title}` : null;
}

export function CommentsPanel({
  view,
  pin,
  onClearPin,
  selectedId,
  onSelect,
}: {
  view: View;
  pin: DraftPin | null;
  onClearPin: () => void;
  selectedId: number | null;
  onSelect: (id: number) => void;
}) {
  const comments = view.comments;
  const open = comments.filter((c) => c.status === "open").length;
  return (
    <section aria-labelledby="comments-title">
      <div className="mb-3 flex items-baseline justify-between">
        <h2 id="comments-title" className="text-lg font-semibold">
          Correction comments
        </h2>
        <span className="text-xs text-ink-soft">
          <span className="num">{open}</span> open · <span className="num">{comments.length}</span> in all
        </span>
      </div>
      {view.permissions.comment ? <NewComment view={view} pin={pin} onClearPin={onClearPin} /> : null}
      {comments.length === 0 ? <p className="text-sm text-ink-soft">No correction comments.</p> : null}
      <ol className="space-y-3">
        {comments.map((c) => (
          <CommentCard key={c.id} view={view} c={c} selected={c.id === selectedId} onSelect={() => onSelect(c.id)} />
        ))}
      </ol>
    </section>
  );
}

function NewComment({ view, pin, onClearPin }: { view: View; pin: DraftPin | null; onClearPin: () => void }) {
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const add = useAppMutation(view.application.id, (body: unknown) => fetchJson(`/api/applications/${view.application.id}/comments`, { method: "POST", json: body }));

  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const f = new FormData(form);
    setErrors({});
    setMessage(null);
    try {
      await add.mutateAsync({
        discipline: f.get("discipline"),
        codeSection: f.get("codeSection"),
        codeEdition: f.get("codeEdition"),
        body: f.get("body"),
        sheetId: pin?.sheetId ?? null,
        pinX: pin?.x ?? null,
        pinY: pin?.y ?? null,
      });
      form.reset();
      onClearPin();
    } catch (err) {
      if (err instanceof ApiError) {
        setErrors(err.fields ?? {});
        setMessage(err.message);
      }
    }
  }

  return (
    <form onSubmit={submit} className="mb-5 border border-rule bg-sheet p-3" aria-label="New correction comment" noValidate>
      {message ? <FormMessage kind="error">{message}</FormMessage> : null}
      <p className="mb-2 text-xs text-ink-soft">
        {pin ? (
          <>
            Pinned on <strong>{sheetLabel(view, pin.sheetId)}</strong>{" "}
            <button type="button" onClick={onClearPin} className="text-accent underline">
              remove pin
            </button>
          </>
        ) : (
          "Place a pin on the sheet to tie the comment to a spot, or write a general comment."
        )}
      </p>
      <div className="grid gap-3 sm:grid-cols-2">
        <label className="text-sm">
          <span className="font-medium">Discipline</span>
          <select name="discipline" defaultValue="Structural" className={control}>
            {DISCIPLINES.map((d) => (
              <option key={d}>{d}</option>
            ))}
          </select>
        </label>
        <label className="text-sm">
          <span className="font-medium">Code section</span>
          <input name="codeSection" placeholder="IBC 1604.3" aria-invalid={errors.codeSection ? true : undefined} className={control} />
          {errors.codeSection ? <span role="alert" className="text-xs text-bad">{errors.codeSection}</span> : null}
        </label>
      </div>
      <label className="mt-2 block text-sm">
        <span className="font-medium">Edition</span>
        <input name="codeEdition" defaultValue="2021 IBC" className={control} />
      </label>
      <label className="mt-2 block text-sm">
        <span className="font-medium">Comment</span>
        <textarea name="body" rows={3} aria-invalid={errors.body ? true : undefined} className={control} placeholder="What is wrong, where, and what the revised documents must show." />
        {errors.body ? <span role="alert" className="text-xs text-bad">{errors.body}</span> : null}
      </label>
      <div className="mt-3 flex justify-end">
        <Button type="submit" disabled={add.isPending}>
          Add comment
        </Button>
      </div>
    </form>
  );
}

function CommentCard({ view, c, selected, onSelect }: { view: View; c: CommentView; selected: boolean; onSelect: () => void }) {
  const appId = view.application.id;
  const [message, setMessage] = useState<string | null>(null);
  const respond = useAppMutation(appId, (body: unknown) => fetchJson(`/api/applications/${appId}/comments/${c.id}/response`, { method: "PUT", json: body }));
  const judge = useAppMutation(appId, (verdict: string) => fetchJson(`/api/applications/${appId}/comments/${c.id}/verdict`, { method: "POST", json: { verdict } }));
  const remove = useAppMutation(appId, () => fetchJson(`/api/applications/${appId}/comments/${c.id}`, { method: "DELETE" }));
  const current = c.responses.find((r) => r.cycle === view.application.cycle);
  const s = STATUS[c.status];
  const where = sheetLabel(view, c.sheetId);

  async function submitResponse(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    setMessage(null);
    try {
      await respond.mutateAsync({ body: f.get("body"), changeReference: f.get("changeReference") ?? "" });
    } catch (err) {
      setMessage(err instanceof Error ? err.message : "Not saved.");
    }
  }

  return (
    <li id={`comment-${c.id}`} className={`border bg-sheet p-3 ${selected ? "border-accent ring-1 ring-accent" : "border-rule"}`} aria-label={`Comment ${c.number}`}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <button type="button" onClick={onSelect} className="text-left">
          <span className="num mr-2 font-semibold">{c.number}.</span>
          <span className="font-medium">{c.discipline}</span>
          <span className="ml-2 text-xs text-ink-soft">
            {c.codeSection} ({c.codeEdition})
          </span>
        </button>
        <span className={`rounded-sm border px-1.5 py-0.5 text-xs ${s.cls}`}>{s.label}</span>
      </div>
      {where ? <p className="mt-1 text-xs text-ink-soft">Sheet {where}</p> : null}
      <p className="mt-2 whitespace-pre-wrap text-sm">{c.body}</p>
      <p className="mt-1 text-xs text-ink-faint">
        {c.authorName} · cycle <span className="num">{c.cycle}</span>
      </p>
      {c.responses.map((r) => (
        <div key={r.id} className="mt-2 border-l-2 border-rule-strong pl-3 text-sm">
          <p className="text-xs font-medium text-ink-soft">
            Response, cycle <span className="num">{r.cycle}</span>
            {r.changeReference ? ` — see ${r.changeReference}` : ""}
            {r.verdict !== "pending" ? ` · ${r.verdict === "resolved" ? "accepted" : "not resolved"}` : ""}
          </p>
          <p className="whitespace-pre-wrap">{r.body}</p>
        </div>
      ))}
      {message ? <FormMessage kind="error">{message}</FormMessage> : null}
      {view.permissions.respond && c.status === "open" ? (
        <form onSubmit={submitResponse} className="mt-3 space-y-2" aria-label={`Response to comment ${c.number}`}>
          <label className="block text-sm">
            <span className="font-medium">{current ? "Change your response" : "Your response"}</span>
            <textarea name="body" rows={2} defaultValue={current?.body} required className={control} />
          </label>
          <label className="block text-sm">
            <span className="font-medium">Where the change is</span>
            <input name="changeReference" defaultValue={current?.changeReference} placeholder="Sheet S-201 rev 1, calc page 7" className={control} />
          </label>
          <Button type="submit" variant="secondary" disabled={respond.isPending}>
            Save response
          </Button>
        </form>
      ) : null}
      {view.permissions.resolve && c.status === "open" ? (
        <div className="mt-3 flex gap-2">
          <Button variant="secondary" disabled={judge.isPending} onClick={() => judge.mutate("resolved")}>
            Mark resolved
          </Button>
          <Button variant="quiet" disabled={judge.isPending} onClick={() => judge.mutate("not_resolved")}>
            Not resolved
          </Button>
        </div>
      ) : null}
      {view.permissions.comment && c.status === "draft" ? (
        <div className="mt-2">
          <Button variant="quiet" disabled={remove.isPending} onClick={() => remove.mutate(undefined)}>
            Remove draft
          </Button>
        </div>
      ) : null}
    </li>
  );
}
