"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { useDropzone } from "react-dropzone";
import { checkUploadName } from "@/lib/pdf/upload-name";
import type { View } from "./types";
import { appKey } from "./use-application";

type Kind = "drawings" | "calculations" | "response_letter";
const KINDS: { value: Kind; label: string }[] = [
  { value: "drawings", label: "Drawing set" },
  { value: "calculations", label: "Calculation package" },
  { value: "response_letter", label: "Response letter" },
];
const KIND_LABEL: Record<string, string> = { drawings: "Drawing set", calculations: "Calculation package", response_letter: "Response letter", member_model: "Member model" };

interface Upload {
  id: string;
  name: string;
  size: number;
  progress: number;
  status: "uploading" | "done" | "refused";
  message?: string;
}

const mb = (n: number) => `${(n / 1_048_576).toFixed(n < 10_485_760 ? 2 : 1)}`;

/** XHR rather than fetch: it reports upload progress. The body is the file itself, streamed. */
function send(appId: number, kind: Kind, file: File, onProgress: (p: number) => void): Promise<{ ok: boolean; message?: string }> {
  return new Promise((resolve) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", `/api/applications/${appId}/documents?kind=${kind}`);
    xhr.setRequestHeader("content-type", "application/pdf");
    xhr.setRequestHeader("x-file-name", encodeURIComponent(file.name));
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.onload = () => {
      let body: { error?: { message: string } } = {};
      try {
        body = JSON.parse(xhr.responseText);
      } catch {}
      resolve(xhr.status < 300 ? { ok: true } : { ok: false, message: body.error?.message ?? `Upload failed (${xhr.status}).` });
    };
    xhr.onerror = () => resolve({ ok: false, message: "The connection was lost during the upload. Try again." });
    xhr.send(file);
  });
}

export function DocumentsPanel({ view }: { view: View }) {
  const app = view.application;
  const qc = useQueryClient();
  const [kind, setKind] = useState<Kind>(app.cycle > 0 && app.state === "corrections_issued" ? "drawings" : "drawings");
  const [uploads, setUploads] = useState<Upload[]>([]);
  const limits = view.uploadLimits;
  const patch = (id: string, p: Partial<Upload>) => setUploads((u) => u.map((x) => (x.id === id ? { ...x, ...p } : x)));

  const dz = useDropzone({
    accept: { "application/pdf": [".pdf"] },
    maxSize: limits.maxBytes,
    maxFiles: limits.maxFilesPerDrop,
    disabled: !view.permissions.upload,
    onDrop: async (accepted, rejected) => {
      const refused: Upload[] = rejected.map((r, i) => ({
        id: `r${Date.now()}-${i}`,
        name: r.file.name,
        size: r.file.size,
        progress: 0,
        status: "refused",
        message: r.errors[0]?.code === "file-too-large" ? `Larger than the ${mb(limits.maxBytes)} MB limit.` : r.errors[0]?.code === "file-invalid-type" ? "Only PDF files are accepted." : (r.errors[0]?.message ?? "Refused."),
      }));
      const queued: (Upload & { file: File })[] = accepted.map((file, i) => {
        const nameCheck = checkUploadName(file.name);
        return { id: `u${Date.now()}-${i}`, name: file.name, size: file.size, progress: 0, status: nameCheck.ok ? "uploading" : "refused", message: nameCheck.ok ? undefined : nameCheck.message, file };
      });
      setUploads((u) => [...queued.map(({ file: _f, ...rest }) => rest), ...refused, ...u]);
      await Promise.all(
        queued
          .filter((q) => q.status === "uploading")
          .map(async (q) => {
            const r = await send(app.id, kind, q.file, (p) => patch(q.id, { progress: p }));
            patch(q.id, r.ok ? { status: "done", progress: 1 } : { status: "refused", message: r.message });
          }),
      );
      void qc.invalidateQueries({ queryKey: appKey(app.id) });
    },
  });

  const byCycle = new Map<number, View["documents"]>();
  for (const d of view.documents) byCycle.set(d.cycle, [...(byCycle.get(d.cycle) ?? []), d]);

  return (
    <section aria-labelledby="docs-title">
      <h2 id="docs-title" className="mb-3 text-lg font-semibold">
        Documents
      </h2>
      {view.permissions.upload ? (
        <div className="mb-5">
          <div className="mb-2 flex flex-wrap items-center gap-3 text-sm">
            <label>
              <span className="mr-2 font-medium">Uploading</span>
              <select value={kind} onChange={(e) => setKind(e.target.value as Kind)} className="rounded-sm border border-rule-strong bg-sheet px-2 py-1" aria-label="Document type">
                {KINDS.map((k) => (
                  <option key={k.value} value={k.value}>{k.label}</option>
                ))}
              </select>
            </label>
            <span className="text-xs text-ink-soft">
              PDF only · up to <span className="num">{mb(limits.maxBytes)}</span> MB and <span className="num">{limits.maxPages}</span> pages a file · <span className="num">{limits.maxFilesPerDrop}</span> files at a time · no passwords or scripts
            </span>
          </div>
          <div
            {...dz.getRootProps({
              className: `flex min-h-24 cursor-pointer flex-col items-center justify-center border border-dashed px-4 py-5 text-center text-sm ${dz.isDragActive ? "border-accent bg-accent-wash" : "border-rule-strong bg-sheet hover:border-accent"}`,
            })}
          >
            <input {...dz.getInputProps({ "aria-label": "Choose PDF files to upload" })} />
            <p className="font-medium">Drop PDF files here, or click to choose</p>
            <p className="text-xs text-ink-soft">
              {app.state === "corrections_issued" ? `Revised sheets and calculations go into cycle ${app.cycle + 1}.` : "Sheet numbers and titles are read from each page."}
            </p>
          </div>
          {uploads.length ? (
            <ul className="mt-3 space-y-2" aria-label="Uploads">
              {uploads.map((u) => (
                <li key={u.id} className="text-sm">
                  <div className="flex justify-between gap-3">
                    <span className="truncate">{u.name}</span>
                    <span className={`shrink-0 text-xs ${u.status === "refused" ? "text-bad" : u.status === "done" ? "text-ok" : "text-ink-soft"}`}>
                      {u.status === "uploading" ? `${Math.round(u.progress * 100)} %` : u.status === "done" ? "Uploaded" : "Refused"}
                    </span>
                  </div>
                  <progress className="h-1.5 w-full accent-[var(--color-accent)]" value={u.progress} max={1} aria-label={`Upload of ${u.name}`} />
                  {u.message ? <p role="alert" className="text-xs text-bad">{u.message}</p> : null}
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      ) : null}
      {view.documents.length === 0 ? (
        <p className="text-sm text-ink-soft">No documents yet.</p>
      ) : (
        [...byCycle.entries()].map(([cycle, docs]) => (
          <div key={cycle} className="mb-4">
            <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-soft">Cycle {cycle}</h3>
            <table className="w-full text-sm">
              <caption className="sr-only">Documents of cycle {cycle}</caption>
              <tbody>
                {docs.map((d) => (
                  <tr key={d.id} className="border-b border-rule last:border-b-0">
                    <td className="py-1.5 pr-3">{KIND_LABEL[d.kind]}</td>
                    <td className="py-1.5 pr-3">
                      <a href={`${d.url}?download=1`} className="text-accent underline-offset-2 hover:underline">{d.originalName}</a>
                    </td>
                    <td className="num py-1.5 pr-3 text-right text-xs">{d.pageCount} p</td>
                    <td className="num py-1.5 text-right text-xs">{mb(d.byteSize)}<span className="unit">MB</span></td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        ))
      )}
    </section>
  );
}
