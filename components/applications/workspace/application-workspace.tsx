"use client";

import Link from "next/link";
import { useState } from "react";
import { ApplicationChecks } from "@/components/checks/application-checks";
import { SheetViewer } from "@/components/sheets/sheet-viewer";
import { StateBadge } from "@/components/applications/state-badge";
import { ApplicationInvoices } from "@/components/fees/application-invoices";
import { ClockSummary } from "@/components/review-clock/clock-summary";
import { ActionBar } from "./action-bar";
import { CommentsPanel, type DraftPin } from "./comments-panel";
import { DocumentsPanel } from "./documents-panel";
import { Timeline } from "./timeline";
import type { View } from "./types";
import { useApplication } from "./use-application";

const money = (cents: number) => (cents / 100).toLocaleString("en-US", { style: "currency", currency: "USD", maximumFractionDigits: 0 });

export function ApplicationWorkspace({ initial }: { initial: View }) {
  const { data: view } = useApplication(initial.application.id, initial);
  const app = view.application;
  const [pin, setPin] = useState<DraftPin | null>(null);
  const [selected, setSelected] = useState<number | null>(null);
  const pdfs = view.documents.filter((d) => d.kind !== "member_model");
  const pins = view.comments
    .filter((c) => c.sheetId && c.pinX !== null && c.pinY !== null)
    .map((c) => ({ id: c.id, number: c.number, sheetId: c.sheetId!, x: c.pinX!, y: c.pinY!, status: c.status, summary: c.body.slice(0, 80) }));
  if (pin) pins.push({ id: -1, number: view.comments.length + 1, sheetId: pin.sheetId, x: pin.x, y: pin.y, status: "draft", summary: "New comment" });

  return (
    <div>
      <header className="mb-5 border-b border-rule pb-4">
        <div className="flex flex-wrap items-start justify-between gap-4">
          <div>
            <p className="num text-sm text-ink-soft">{app.number}</p>
            <h1 className="text-2xl font-semibold">{app.siteAddress}</h1>
            <p className="mt-1 max-w-3xl text-sm text-ink-soft">{app.workDescription}</p>
            <div className="mt-2 flex flex-wrap items-center gap-3 text-sm">
              <StateBadge state={app.state} />
              {app.cycle > 0 ? <span>Review cycle <span className="num">{app.cycle}</span></span> : null}
              <span>Plans examiner: {app.examinerName ?? "not yet assigned"}</span>
              <span className="text-ink-soft">{app.holder === "applicant" ? "With the applicant" : app.holder === "department" ? "With the department" : "Closed"}</span>
            </div>
          </div>
          <ActionBar view={view} />
        </div>
        {view.cycles.length ? (
          <div className="mt-3">
            <ClockSummary cycles={view.cycles} state={app.state} holidays={view.holidays} />
          </div>
        ) : null}
        {app.state === "returned_incomplete" && app.returnReasons.length ? (
          <div className="mt-3 border-l-4 border-warn bg-warn-wash px-3 py-2 text-sm" role="status">
            <p className="font-medium">Returned as incomplete. Add what is missing, then submit again:</p>
            <ul className="ml-5 list-disc">{app.returnReasons.map((r) => <li key={r}>{r}</li>)}</ul>
          </div>
        ) : null}
        {app.conditions.length ? (
          <div className="mt-3 border-l-4 border-ok bg-ok-wash px-3 py-2 text-sm">
            <p className="font-medium">Conditions of approval</p>
            <ol className="ml-5 list-decimal">{app.conditions.map((c) => <li key={c}>{c}</li>)}</ol>
          </div>
        ) : null}
        {view.comments.some((c) => c.status !== "draft") ? (
          <p className="mt-2 text-sm">
            <Link href={`/applications/${app.id}/letter`} className="text-accent underline-offset-2 hover:underline">
              Correction letter (printable)
            </Link>
          </p>
        ) : null}
      </header>

      <ApplicationInvoices view={view} />
      <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_26rem]">
        <section aria-label="Sheets" className="min-w-0">
          {pdfs.length ? (
            <SheetViewer
              documents={pdfs.map((d) => ({ id: d.id, name: d.originalName, url: d.url, pageCount: d.pageCount, cycle: d.cycle }))}
              sheets={view.sheets}
              pins={pins}
              canPlacePins={view.permissions.comment}
              onPlacePin={(p) => setPin(p)}
              selectedPinId={selected}
              onSelectPin={(id) => {
                setSelected(id);
                document.getElementById(`comment-${id}`)?.scrollIntoView({ behavior: "smooth", block: "nearest" });
              }}
            />
          ) : (
            <p className="border border-dashed border-rule-strong bg-sheet p-8 text-center text-sm text-ink-soft">No sheets yet: upload the drawing set below.</p>
          )}
        </section>
        <aside className="min-w-0">
          <CommentsPanel view={view} pin={pin} onClearPin={() => setPin(null)} selectedId={selected} onSelect={setSelected} />
        </aside>
      </div>

      <div className="mt-8 grid gap-8 lg:grid-cols-2">
        <DocumentsPanel view={view} />
        <section aria-labelledby="details-title">
          <h2 id="details-title" className="mb-3 text-lg font-semibold">Application details</h2>
          <dl className="grid grid-cols-[10rem_1fr] gap-x-4 gap-y-1 text-sm">
            <dt className="text-ink-soft">Parcel</dt><dd className="num">{app.parcelNumber}</dd>
            <dt className="text-ink-soft">Occupancy group</dt><dd>{app.occupancyGroup}</dd>
            <dt className="text-ink-soft">Construction type</dt><dd>Type {app.constructionType}</dd>
            <dt className="text-ink-soft">Valuation</dt><dd className="num">{money(app.valuationCents)}</dd>
            <dt className="text-ink-soft">Design professional</dt><dd>{app.dporName}, licence <span className="num">{app.dporLicence}</span></dd>
            <dt className="text-ink-soft">Applicant</dt><dd>{app.applicantName}{app.firmName ? `, ${app.firmName}` : ""}</dd>
          </dl>
          {view.cycles.length ? (
            <>
              <h3 className="mb-1 mt-5 text-sm font-semibold">Review cycles</h3>
              <table className="w-full text-sm">
                <caption className="sr-only">Review cycles</caption>
                <thead><tr className="border-b border-rule text-left text-ink-soft"><th className="py-1 font-medium">Cycle</th><th className="font-medium">Received</th><th className="font-medium">Decided</th><th className="font-medium">Outcome</th></tr></thead>
                <tbody>
                  {view.cycles.map((c) => (
                    <tr key={c.number} className="border-b border-rule last:border-b-0">
                      <td className="num py-1">{c.number}</td>
                      <td className="num text-xs">{new Date(c.receivedAt).toLocaleDateString("en-US")}</td>
                      <td className="num text-xs">{c.decidedAt ? new Date(c.decidedAt).toLocaleDateString("en-US") : "—"}</td>
                      <td>{c.outcome ? c.outcome.replaceAll("_", " ") : "in progress"}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </>
          ) : null}
        </section>
      </div>
      <ApplicationChecks view={view} />
      <Timeline events={view.timeline} exportUrl={view.viewer.role === "applicant" ? undefined : `/api/applications/${app.id}/audit`} />
    </div>
  );
}
