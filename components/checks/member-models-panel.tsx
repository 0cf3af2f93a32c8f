"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import { ApiError, fetchJson } from "@/lib/client/fetch-json";

interface ModelRow {
  id: number;
  name: string;
  cycle: number;
  uploadedAt: string;
  uploadedByName: string;
  byteSize: number;
  readable: boolean;
  title: string;
  kind: string;
  marks: string[];
}

/** Structured member models (model files) uploaded with the calc PDF: the applicant adds them, anyone on the file starts a check from one. */
export function MemberModelsPanel({
  applicationId,
  canUpload,
  onOpen,
}: {
  applicationId: number;
  canUpload: boolean;
  onOpen: (model: unknown, how: "run" | "tables" | "json", name: string, documentId: number) => void;
}) {
  const qc = useQueryClient();
  const key = ["member-models", applicationId];
  const q = useQuery({ queryKey: key, queryFn: () => fetchJson<{ models: ModelRow[] }>(`/api/applications/${applicationId}/member-models`) });
  const [message, setMessage] = useState<{ kind: "error" | "ok"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function upload(files: FileList | null) {
    if (!files?.length) return;
    setBusy(true);
    setMessage(null);
    const done: string[] = [];
    try {
      for (const f of Array.from(files)) {
        const res = await fetch(`/api/applications/${applicationId}/member-models`, {
          method: "POST",
          headers: { "content-type": "application/json", "x-file-name": encodeURIComponent(f.name) },
          body: await f.arrayBuffer(),
        });
        const body = (await res.json().catch(() => ({}))) as { error?: { message: string } };
        if (!res.ok) {
          setMessage({ kind: "error", text: `${f.name}: ${body.error?.message ?? `refused (${res.status})`}` });
          break;
        }
        done.push(f.name);
      }
      if (done.length) setMessage((m) => m ?? { kind: "ok", text: `Uploaded ${done.join(", ")}.` });
    } finally {
      setBusy(false);
      await qc.invalidateQueries({ queryKey: key });
    }
  }

  async function open(m: ModelRow, how: "run" | "tables" | "json") {
    setMessage(null);
    try {
      const r = await fetchJson<{ model: unknown }>(`/api/applications/${applicationId}/member-models/${m.id}`);
      onOpen(r.model, how, m.name, m.id);
    } catch (e) {
      setMessage({ kind: "error", text: e instanceof ApiError ? e.message : "The model could not be opened." });
    }
  }

  const models = q.data?.models ?? [];
  return (
    <div>
      <p className="mb-2 text-sm text-ink-soft">
        A member model is the checker&apos;s model file (JSON: nodes, members, supports, loads by case and the claimed deflections), uploaded beside the sealed calculation package so the
        examiner starts from the designer&apos;s inputs instead of re-typing them.
      </p>
      {canUpload ? (
        <label className="mb-3 block text-sm">
          <span className="font-medium">Upload member models (.json)</span>
          <input type="file" accept=".json,application/json" multiple disabled={busy} aria-label="Choose member model files" className="mt-1 block text-sm" onChange={(e) => void upload(e.target.files)} />
        </label>
      ) : null}
      {message ? <FormMessage kind={message.kind}>{message.text}</FormMessage> : null}
      {q.isLoading ? <p className="text-sm text-ink-soft">Loading…</p> : null}
      {!q.isLoading && models.length === 0 ? <p className="text-sm text-ink-soft">No member models have been uploaded.</p> : null}
      <ul className="space-y-2" aria-label="Member models">
        {models.map((m) => (
          <li key={m.id} className="flex flex-wrap items-center justify-between gap-2 border border-rule bg-sheet px-3 py-2">
            <div className="min-w-0 text-sm">
              <p className="font-medium">{m.title || m.name}</p>
              <p className="text-xs text-ink-soft">
                {m.name} · {m.kind || "?"} · cycle <span className="num">{m.cycle}</span> · {m.uploadedByName}
                {m.marks.length ? ` · checks ${m.marks.join(", ")}` : ""}
              </p>
            </div>
            <div className="flex gap-2">
              <Button type="button" onClick={() => void open(m, "run")} disabled={!m.readable} aria-label={`Run ${m.name}`}>
                Run
              </Button>
              <Button type="button" variant="secondary" onClick={() => void open(m, "tables")} disabled={!m.readable} aria-label={`Open ${m.name} in the tables`}>
                Open in the tables
              </Button>
            </div>
          </li>
        ))}
      </ul>
    </div>
  );
}
