import { ResultView } from "@/components/checks/result-view";
import { ModelInputs } from "@/components/checks/model-inputs";
import { VerdictBadge } from "@/components/checks/verdict-badge";
import { PrintButton } from "@/components/ui/print-button";
import { CREEP_LABELS } from "@/lib/checks/claims";
import { DEPARTMENT } from "@/lib/department";
import { loadCheckForPage } from "../load-check";

export const metadata = { title: "Deflection check report" };

// The printable check report, fit to attach to a correction letter: the stored check only.
export default async function CheckReportPage({ params }: { params: Promise<{ id: string; checkId: string }> }) {
  const view = await loadCheckForPage(params);
  const { check: c, application: a } = view;
  const date = (d: Date) => d.toLocaleDateString("en-US", { dateStyle: "long" });
  return (
    <article className="check-report mx-auto max-w-[7.5in] bg-white p-8 text-[10pt] leading-snug text-ink print:max-w-none print:p-0">
      <style>{`@page { size: letter; margin: 0.6in 0.6in 0.75in; @bottom-left { content: "${DEPARTMENT.city} · ${a.number ?? ""} · check #${c.id}"; font-size: 8pt; } @bottom-right { content: "Page " counter(page) " of " counter(pages); font-size: 8pt; } } @media print { .check-report section { break-inside: auto; } .check-report figure, .check-report table { break-inside: avoid; } }`}</style>
      <div className="no-print mb-6 flex justify-end">
        <PrintButton label="Print report" />
      </div>
      <header className="mb-4 border-b-2 border-ink pb-3">
        <p className="text-lg font-semibold">{DEPARTMENT.city}</p>
        <p>
          {DEPARTMENT.division} · {DEPARTMENT.address} · {DEPARTMENT.phone}
        </p>
      </header>
      <h1 className="mb-1 text-xl font-semibold">
        Deflection check report — {c.memberMark} <VerdictBadge verdict={c.verdict} />
      </h1>
      <table className="mb-4 text-sm">
        <tbody>
          <tr><th className="pr-4 text-left font-medium">Application</th><td className="num">{a.number}</td></tr>
          <tr><th className="pr-4 text-left font-medium">Site</th><td>{a.siteAddress}</td></tr>
          <tr><th className="pr-4 text-left font-medium">Design professional</th><td>{a.dporName}, licence {a.dporLicence}</td></tr>
          <tr><th className="pr-4 text-left font-medium">Member</th><td>{c.memberMark}{c.sheet ? `, sheet ${c.sheet.sheetNumber ?? ""} (${c.sheet.title})` : ""}{c.calcPage ? `, calc page ${c.calcPage}` : ""}{c.calcDocument ? ` of ${c.calcDocument.originalName}` : ""}</td></tr>
          <tr><th className="pr-4 text-left font-medium">Check</th><td className="num">#{c.id}, {c.purpose === "precheck" ? "applicant pre-check" : "review check"}, review cycle {c.cycle}{c.status === "reverify" ? " — RE-VERIFY: the calculation package was replaced" : ""}</td></tr>
          <tr><th className="pr-4 text-left font-medium">{c.purpose === "precheck" ? "Run by" : "Plans examiner"}</th><td>{c.createdByName}</td></tr>
          <tr><th className="pr-4 text-left font-medium">Date of check</th><td>{date(c.createdAt)}</td></tr>
          <tr><th className="pr-4 text-left font-medium">Printed</th><td>{date(new Date())}</td></tr>
          <tr><th className="pr-4 text-left font-medium">Method</th><td>{c.result.method.name}; cross-checked by an independent direct stiffness solution; {c.solverVersion}</td></tr>
          <tr><th className="pr-4 text-left font-medium">Limits and creep</th><td>{c.options.limits}; {CREEP_LABELS[c.options.creep] ?? c.options.creep}</td></tr>
        </tbody>
      </table>
      <p className="mb-4 text-sm">{c.summary}</p>
      <section className="mb-5">
        <h2 className="mb-2 border-b border-rule pb-1 text-base font-semibold">Inputs (the model file as stored)</h2>
        <ModelInputs model={c.model} />
      </section>
      <h2 className="mb-2 border-b border-rule pb-1 text-base font-semibold">Results</h2>
      <ResultView result={c.result} model={c.model} />
      <footer className="mt-6 border-t border-rule pt-3 text-xs text-ink-soft">
        This report records an independent check made during plan review for compliance with the adopted codes ({DEPARTMENT.codeEditions}), which govern. It supports, and never
        replaces, the judgment of the engineer of record, who remains responsible for the design, and of the licensed plans examiner.
      </footer>
    </article>
  );
}
