import type { ReactNode } from "react";
import { ResultDiagrams } from "@/components/checks/diagrams";
import { ClaimBadge, TONE_CLASS } from "@/components/checks/verdict-badge";
import { modelGeometry } from "@/lib/checks/geometry";
import { bothForces, bothLengths, bothMoments, bothSpans, fmt } from "@/lib/checks/quantities";
import { COMBO_STATUS, comboStatus } from "@/lib/checks/verdict";
import type { CheckComboResult, CheckResult, SolveResult } from "@/lib/solver";

// The checker's result as the examiner reads it: a verdict per combination, claims against
// the recomputed values, the virtual-work terms, the independent cross-check, the energy
// balance, the diagrams and, on the same screen, what the check assumes and leaves out.
// Plain components (no hooks), shared by the check page and the printable report.

export const CAUTIONS = [
  "This check supports the plans examiner's review. It is not a design, a certification or a substitute for licensed judgment.",
  "The engineer of record remains responsible for the design and its calculations.",
  "The adopted local code edition and its amendments govern; the limits used are stated above each verdict.",
];

const th = "px-2 py-1 text-left text-xs font-medium text-ink-soft";
const td = "px-2 py-1 align-top";

function Section({ title, children, id }: { title: string; children: ReactNode; id?: string }) {
  return (
    <section className="mb-6 break-inside-avoid-page" aria-labelledby={id}>
      <h3 id={id} className="mb-2 border-b border-rule pb-1 text-base font-semibold">
        {title}
      </h3>
      {children}
    </section>
  );
}

const pct = (v: number) => (Number.isFinite(v) ? `${v > 0 ? "+" : v < 0 ? "−" : ""}${Math.abs(100 * v).toFixed(1)} %` : "—");
const ratio = (v: number | null) => (v === null || !Number.isFinite(v) ? "—" : `l/${Math.round(v).toLocaleString("en-US")}`);

function ComboBanner({ c, check, primary }: { c: CheckComboResult; check: CheckResult; primary: "in" | "mm" }) {
  const s = COMBO_STATUS[comboStatus(c)];
  const v = c.verdict;
  return (
    <div className={`mb-2 border-l-4 px-3 py-2 ${TONE_CLASS[s.tone]}`} role="status" data-testid="combo-verdict" aria-label={`${check.id} ${c.name}: ${s.label}`}>
      <div className="flex flex-wrap items-baseline gap-x-3">
        <span className="text-lg font-semibold" aria-hidden="true">
          {s.glyph}
        </span>
        <span className="font-semibold">{s.label}</span>
        <span className="text-sm text-ink">
          {c.name} <span className="text-ink-soft">({c.basis})</span>
        </span>
      </div>
      <dl className="mt-1 grid gap-x-6 gap-y-0.5 text-sm text-ink sm:grid-cols-[auto_1fr]">
        <dt className="text-ink-soft">Computed Δ</dt>
        <dd className="num">{bothLengths(v.delta_m, primary)}</dd>
        <dt className="text-ink-soft">Span / Δ</dt>
        <dd className="num">{ratio(v.span_over_delta)}</dd>
        <dt className="text-ink-soft">Limit</dt>
        <dd className="num">
          {v.limit} = {bothLengths(v.allowable_m, primary)}
          <span className="text-ink-soft"> (l = {bothSpans(v.limit_span_m, primary === "in" ? "ft" : "m")})</span>
        </dd>
        {c.where ? (
          <>
            <dt className="text-ink-soft">Where</dt>
            <dd className="num">
              {c.where.member}, {bothSpans(c.where.x_m, primary === "in" ? "ft" : "m")} from its first end
            </dd>
          </>
        ) : null}
        <dt className="text-ink-soft">Stiffness cross-check</dt>
        <dd className="num">
          {c.stiffness_si === null ? "not available" : `${bothLengths(Math.abs(c.stiffness_si), primary)}, relative difference ${c.rel_diff === null ? "—" : c.rel_diff.toExponential(1)}`}
          {c.disagreement ? <strong className="ml-2 text-bad">the two methods disagree</strong> : null}
        </dd>
        {c.claim ? (
          <>
            <dt className="text-ink-soft">Claimed</dt>
            <dd className="num">
              {bothLengths(c.claim.claimed_m, primary)}, {pct(c.claim.difference)} against the computed value <ClaimBadge verdict={c.claim.verdict} />{" "}
              <span className="text-ink-soft">({c.claim.reason})</span>
            </dd>
          </>
        ) : null}
      </dl>
      {v.near_limit ? <p className="mt-1 text-xs">Within 2 % of the limit: small differences in span, E or load decide this one. Look closer.</p> : null}
    </div>
  );
}

function Verdicts({ result, primary }: { result: SolveResult; primary: "in" | "mm" }) {
  if (result.checks.length === 0) {
    return <p className="border-l-4 border-info bg-info-wash px-3 py-2 text-sm">The model asks for no deflection check; the displacements below are all it gives.</p>;
  }
  return (
    <div>
      {result.checks.map((c) => (
        <div key={c.id} className="mb-4">
          <h4 className="mb-1 text-sm font-semibold">
            {c.id} — {c.row_label}
            <span className="ml-2 font-normal text-ink-soft">
              span {bothSpans(c.span_m, primary === "in" ? "ft" : "m")}
              {c.cantilever ? " (cantilever: l = 2 × length, footnote i)" : ""}; material class {c.material}
            </span>
          </h4>
          {c.combos.length === 0 ? <p className="text-sm text-ink-soft">No combination of this row applies to the model&apos;s load cases.</p> : null}
          {c.combos.map((k) => (
            <ComboBanner key={k.name} c={k} check={c} primary={primary} />
          ))}
        </div>
      ))}
    </div>
  );
}

function Claims({ result, primary }: { result: SolveResult; primary: "in" | "mm" }) {
  const rows = result.checks.flatMap((c) => c.combos.filter((k) => k.claim).map((k) => ({ c, k })));
  if (rows.length === 0) return <p className="text-sm text-ink-soft">No claimed deflection was entered.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Claimed against computed deflections</caption>
        <thead>
          <tr className="border-b border-rule-strong">
            <th className={th}>Check</th>
            <th className={th}>Combination</th>
            <th className={th}>Claimed</th>
            <th className={th}>Computed</th>
            <th className={th}>Difference</th>
            <th className={th}>Claim vs limit</th>
            <th className={th}>Verdict</th>
          </tr>
        </thead>
        <tbody>
          {rows.map(({ c, k }) => (
            <tr key={`${c.id}-${k.name}`} className="border-b border-rule">
              <td className={td}>{c.id}</td>
              <td className={td}>{k.name}</td>
              <td className={`${td} num`}>{bothLengths(k.claim!.claimed_m, primary)}</td>
              <td className={`${td} num`}>{bothLengths(k.claim!.computed_m, primary)}</td>
              <td className={`${td} num`}>{pct(k.claim!.difference)}</td>
              <td className={td}>{k.claim!.flipped ? "pass/fail flips" : k.claim!.claimed_passes ? "both pass" : "both fail"}</td>
              <td className={td}>
                <ClaimBadge verdict={k.claim!.verdict} />
                <div className="text-xs text-ink-soft">{k.claim!.reason}</div>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-1 text-xs text-ink-faint">
        Thresholds (common practice, no code sets one): within ±5 % agrees; 5–15 % ask for the assumptions; beyond 15 % or a flipped pass/fail is a correction. Judge against the limit, not the claim.
      </p>
    </div>
  );
}

function displayValue(v: number, dof: string, primary: "in" | "mm"): string {
  if (dof === "rz") return `${fmt(v, 4)} rad`;
  const [a, b] = bothLengths(Math.abs(v), primary).split(" (");
  const sign = v < 0 ? "−" : "";
  return `${sign}${a} (${sign}${b}`;
}

function VirtualWork({ result, primary }: { result: SolveResult; primary: "in" | "mm" }) {
  if (result.find.length === 0) return <p className="text-sm text-ink-soft">The model asks for no displacement by the unit-load method.</p>;
  return (
    <div className="space-y-4">
      {result.find.map((f) => (
        <div key={`${f.label}-${f.dof}`} className="overflow-x-auto">
          <p className="mb-1 text-sm">
            <span className="font-medium">
              {f.dof === "rz" ? "Rotation" : `Displacement ${f.dof}`} at {f.label}
            </span>{" "}
            — all loads: <span className="num">{displayValue(f.value_si, f.dof, primary)}</span>; stiffness method{" "}
            <span className="num">{f.stiffness_si === null ? "—" : displayValue(f.stiffness_si, f.dof, primary)}</span>
            {f.rel_diff !== null ? <span className="text-ink-soft"> (relative difference {f.rel_diff.toExponential(1)})</span> : null}
          </p>
          <table className="w-full border-collapse text-sm">
            <caption className="sr-only">Unit-load terms for {f.label}</caption>
            <thead>
              <tr className="border-b border-rule-strong">
                <th className={th}>Member</th>
                <th className={th}>∫Mm/EI dx</th>
                <th className={th}>ΣnNL/EA</th>
                <th className={th}>∫f·Vv/GA dx</th>
                <th className={th}>thermal</th>
                <th className={th}>misfit</th>
                <th className={th}>member total</th>
              </tr>
            </thead>
            <tbody>
              {f.terms.map((t) => {
                const total = t.bending + t.axial + t.shear + t.thermal + t.misfit;
                return (
                  <tr key={t.member} className="border-b border-rule">
                    <td className={td}>{t.member}</td>
                    {[t.bending, t.axial, t.shear, t.thermal, t.misfit].map((v, i) => (
                      <td key={i} className={`${td} num`}>
                        {v === 0 ? "0" : displayValue(v, f.dof, primary)}
                      </td>
                    ))}
                    <td className={`${td} num font-medium`}>{displayValue(total, f.dof, primary)}</td>
                  </tr>
                );
              })}
              {f.support_terms.map((s) => (
                <tr key={`s-${s.node}`} className="border-b border-rule">
                  <td className={td}>support {s.node} (−Σr·s)</td>
                  <td className={td} colSpan={5} />
                  <td className={`${td} num`}>{displayValue(s.settlement, f.dof, primary)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ))}
      {result.combinations.length ? (
        <div className="overflow-x-auto">
          <p className="mb-1 text-sm font-medium">By combination (the same unit loads, the combination&apos;s real loads)</p>
          <table className="w-full border-collapse text-sm">
            <thead>
              <tr className="border-b border-rule-strong">
                <th className={th}>Combination</th>
                {result.find.map((f) => (
                  <th key={`${f.label}-${f.dof}`} className={th}>
                    {f.label} {f.dof}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {result.combinations.map((c) => (
                <tr key={c.name} className="border-b border-rule">
                  <td className={td}>{c.name}</td>
                  {c.find.map((f) => (
                    <td key={`${f.label}-${f.dof}`} className={`${td} num`}>
                      {displayValue(f.value_si, f.dof, primary)}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
    </div>
  );
}

function CrossCheck({ result }: { result: SolveResult }) {
  const x = result.cross_check;
  const e = result.energy;
  return (
    <div className="grid gap-4 md:grid-cols-2">
      <div className={`border-l-4 px-3 py-2 text-sm ${x.available && x.disagreements.length === 0 ? TONE_CLASS.ok : TONE_CLASS.warn}`} data-testid="cross-check">
        <p className="font-semibold">
          <span aria-hidden="true">{x.available && x.disagreements.length === 0 ? "✓ " : "! "}</span>
          Stiffness cross-check: {x.available ? (x.disagreements.length === 0 ? "the two methods agree" : `${x.disagreements.length} value(s) disagree`) : "not available"}
        </p>
        <p className="text-ink">{x.method}</p>
        <p className="num text-ink">
          {x.compared} values compared; largest relative difference {x.max_rel_diff.toExponential(2)} (tolerance {x.tolerance.toExponential(0)})
        </p>
        {x.error ? <p className="text-ink">{x.error}</p> : null}
        {x.disagreements.length ? (
          <ul className="ml-5 list-disc text-ink">
            {x.disagreements.slice(0, 8).map((d) => (
              <li key={d}>{d}</li>
            ))}
          </ul>
        ) : null}
      </div>
      <div className={`border-l-4 px-3 py-2 text-sm ${!e.applies || e.balanced ? TONE_CLASS.ok : TONE_CLASS.warn}`} data-testid="energy-balance">
        <p className="font-semibold">
          <span aria-hidden="true">{!e.applies || e.balanced ? "✓ " : "! "}</span>
          Work–energy balance (Clapeyron): {e.applies ? (e.balanced ? "balanced" : "not balanced") : "does not apply directly"}
        </p>
        <p className="text-ink">
          external work ½ΣPΔ = <span className="num">{fmt(e.external_work_J, 6)} J</span>; strain energy U = <span className="num">{fmt(e.strain_energy_J, 6)} J</span>; relative difference{" "}
          <span className="num">{e.rel_diff.toExponential(2)}</span>
        </p>
        <p className="text-ink">{e.note}</p>
        {!e.applies ? (
          <p className="num text-ink">
            generalized: ½(ΣPΔ + ΣR·s − ∫N·ε₀) = {fmt(e.generalized.predicted_strain_energy_J, 6)} J (relative difference {e.generalized.rel_diff.toExponential(2)})
          </p>
        ) : null}
      </div>
    </div>
  );
}

function Reactions({ result }: { result: SolveResult }) {
  const us = result.units.display.displacement === "in";
  const p = us ? "kip" : "kN";
  return (
    <table className="w-full border-collapse text-sm">
      <caption className="sr-only">Reactions, all loads</caption>
      <thead>
        <tr className="border-b border-rule-strong">
          <th className={th}>Support</th>
          <th className={th}>Rx</th>
          <th className={th}>Ry</th>
          <th className={th}>M</th>
        </tr>
      </thead>
      <tbody>
        {result.reactions.map((r) => (
          <tr key={r.node} className="border-b border-rule">
            <td className={td}>{r.node}</td>
            <td className={`${td} num`}>{r.Fx_N === null ? "—" : bothForces(r.Fx_N, p)}</td>
            <td className={`${td} num`}>{r.Fy_N === null ? "—" : bothForces(r.Fy_N, p)}</td>
            <td className={`${td} num`}>{r.M_Nm === null ? "—" : bothMoments(r.M_Nm, p)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function Method({ result }: { result: SolveResult }) {
  const m = result.method;
  return (
    <dl className="grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[12rem_1fr]">
      <dt className="text-ink-soft">Method</dt>
      <dd>{m.name}</dd>
      <dt className="text-ink-soft">Virtual system</dt>
      <dd>{m.virtual_system}</dd>
      <dt className="text-ink-soft">Integration</dt>
      <dd>{m.integration}</dd>
      <dt className="text-ink-soft">Degree of indeterminacy</dt>
      <dd className="num">
        {m.degree_of_indeterminacy}
        {m.redundants.length ? ` (redundants: ${m.redundants.join("; ")})` : ""}
      </dd>
      <dt className="text-ink-soft">Maxwell–Betti reciprocity</dt>
      <dd className="num">
        asymmetry {m.reciprocity.asymmetry.toExponential(1)}, tolerance {m.reciprocity.tolerance.toExponential(0)}
      </dd>
      <dt className="text-ink-soft">Creep in D + L</dt>
      <dd>{result.creep.description}</dd>
      <dt className="text-ink-soft">Limits</dt>
      <dd>{result.limits.source}</dd>
      <dt className="text-ink-soft">Solver</dt>
      <dd className="num">{result.solver_version}</dd>
    </dl>
  );
}

export function Cautions({ result }: { result: SolveResult }) {
  return (
    <div className="border border-rule-strong bg-paper px-4 py-3 text-sm" data-testid="cautions">
      <p className="mb-1 font-semibold">Assumptions and cautions</p>
      <ul className="ml-5 list-disc space-y-0.5">
        {CAUTIONS.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
      <p className="mb-0.5 mt-2 font-medium">This check assumes</p>
      <ul className="ml-5 list-disc space-y-0.5">
        {result.assumptions.map((a) => (
          <li key={a}>{a}</li>
        ))}
        {result.limits.notes.map((n) => (
          <li key={n}>{n}</li>
        ))}
      </ul>
      <p className="mb-0.5 mt-2 font-medium">It does not cover</p>
      <p>{result.not_covered.join("; ")}.</p>
    </div>
  );
}

export function ResultView({ result, model, compact = false }: { result: SolveResult; model: unknown; compact?: boolean }) {
  const primary = result.units.display.displacement === "in" ? "in" : "mm";
  const g = modelGeometry(model);
  return (
    <div data-testid="check-result">
      <Section title="Verdict by combination" id="verdicts">
        <Verdicts result={result} primary={primary} />
      </Section>
      <Cautions result={result} />
      <div className="mt-6" />
      <Section title="Claimed against computed" id="claims">
        <Claims result={result} primary={primary} />
      </Section>
      <Section title="Diagrams" id="diagrams">
        <ResultDiagrams g={g} result={result} />
      </Section>
      <Section title="Virtual work: each member's contribution (unit-load method)" id="virtual-work">
        <VirtualWork result={result} primary={primary} />
      </Section>
      <Section title="Independent checks" id="independent">
        <CrossCheck result={result} />
      </Section>
      {!compact ? (
        <>
          <Section title="Reactions (all loads, unfactored)" id="reactions">
            <Reactions result={result} />
          </Section>
          <Section title="Method" id="method">
            <Method result={result} />
          </Section>
        </>
      ) : null}
    </div>
  );
}
