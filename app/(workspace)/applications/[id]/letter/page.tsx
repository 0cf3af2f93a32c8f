import { notFound } from "next/navigation";
import { PrintButton } from "@/components/ui/print-button";
import { db } from "@/db/client";
import { applicationView } from "@/lib/applications/view";
import { requirePageUser } from "@/lib/auth/session";
import { DEPARTMENT } from "@/lib/department";
import { AppError } from "@/lib/errors";

export const metadata = { title: "Correction letter" };

export default async function LetterPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageUser("applicant", "technician", "examiner", "supervisor");
  const { id } = await params;
  if (!/^\d{1,15}$/.test(id)) notFound();
  let view;
  try {
    view = await applicationView(db(), user, Number(id));
  } catch (e) {
    if (e instanceof AppError && e.code === "not_found") notFound();
    throw e;
  }
  const app = view.application;
  const issued = view.comments.filter((c) => c.status !== "draft");
  const open = issued.filter((c) => c.status === "open");
  const sheetOf = (sheetId: number | null) => {
    const s = view.sheets.find((x) => x.id === sheetId);
    return s ? (s.sheetNumber ?? `page ${s.page}`) : "—";
  };
  return (
    <article className="letter mx-auto max-w-[7.5in] bg-white p-8 text-[11pt] leading-snug text-ink print:p-0">
      <style>{`@page { size: letter; margin: 0.75in; @bottom-right { content: "Page " counter(page) " of " counter(pages); font-size: 9pt; } }`}</style>
      <div className="no-print mb-6 flex justify-end">
        <PrintButton />
      </div>
      <header className="mb-6 border-b-2 border-ink pb-3">
        <p className="text-lg font-semibold">{DEPARTMENT.city}</p>
        <p>{DEPARTMENT.division} · {DEPARTMENT.address} · {DEPARTMENT.phone}</p>
      </header>
      <h1 className="mb-1 text-xl font-semibold">Plan review correction list</h1>
      <table className="mb-5 text-sm">
        <tbody>
          <tr><th className="pr-4 text-left font-medium">Application</th><td className="num">{app.number}</td></tr>
          <tr><th className="pr-4 text-left font-medium">Site</th><td>{app.siteAddress}</td></tr>
          <tr><th className="pr-4 text-left font-medium">Work</th><td>{app.workDescription}</td></tr>
          <tr><th className="pr-4 text-left font-medium">Review cycle</th><td className="num">{app.cycle}</td></tr>
          <tr><th className="pr-4 text-left font-medium">Plans examiner</th><td>{app.examinerName ?? "—"}</td></tr>
          <tr><th className="pr-4 text-left font-medium">Design professional</th><td>{app.dporName}, licence {app.dporLicence}</td></tr>
          <tr><th className="pr-4 text-left font-medium">Date</th><td>{new Date().toLocaleDateString("en-US", { dateStyle: "long" })}</td></tr>
        </tbody>
      </table>
      <p className="mb-4">
        The construction documents were reviewed for compliance with the adopted codes ({DEPARTMENT.codeEditions}). {open.length} item
        {open.length === 1 ? " needs" : "s need"} correction before approval. Answer each comment by number in a response letter, state where the change is
        (sheet or calculation page), cloud the changes on revised sheets, and resubmit.
      </p>
      <table className="w-full border-collapse text-sm">
        <thead>
          <tr className="border-b border-ink text-left">
            <th className="py-1 pr-2">No.</th>
            <th className="pr-2">Sheet</th>
            <th className="pr-2">Code section</th>
            <th>Comment</th>
          </tr>
        </thead>
        <tbody>
          {issued.map((c) => (
            <tr key={c.id} className="break-inside-avoid border-b border-rule align-top">
              <td className="num py-2 pr-2 font-semibold">{c.number}</td>
              <td className="num pr-2">{sheetOf(c.sheetId)}</td>
              <td className="pr-2">{c.codeSection}<br /><span className="text-xs text-ink-soft">{c.codeEdition}</span></td>
              <td className="py-2">
                <span className="text-xs font-medium uppercase text-ink-soft">{c.discipline}{c.status === "resolved" ? " · resolved" : ""}</span>
                <p className="whitespace-pre-wrap">{c.body}</p>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <footer className="mt-8 border-t border-rule pt-3 text-xs text-ink-soft">
        This review is for compliance with the adopted codes and local amendments, which govern; it does not relieve the design professional of record of
        responsibility for the design. Calculations checked with Spanproof support, and never replace, the judgment of the engineer of record and the
        licensed plans examiner.
      </footer>
    </article>
  );
}
