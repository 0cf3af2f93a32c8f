"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useRef, useState } from "react";
import { FormProvider, useForm, type FieldValues, type Path, type UseFormReturn } from "react-hook-form";
import { BeamFormFields } from "@/components/checks/beam-form-fields";
import { ErrorText, Fieldset, QuantityField, SelectBox, TextBox } from "@/components/checks/form-bits";
import { MemberModelsPanel } from "@/components/checks/member-models-panel";
import { ModelJsonEditor } from "@/components/checks/model-json-editor";
import { ResultView } from "@/components/checks/result-view";
import { SchedulePanel } from "@/components/checks/schedule-panel";
import { SuggestionsPanel } from "@/components/checks/suggestions-panel";
import { TableEditor } from "@/components/checks/table-editor";
import type { TributaryPreset } from "@/components/checks/tributary-helper";
import { VerdictBadge } from "@/components/checks/verdict-badge";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import { ApiError, fetchJson } from "@/lib/client/fetch-json";
import { DEFAULT_BEAM, beamFormSchema, type BeamFormInput } from "@/lib/checks/beam-form";
import { CREEP_LABELS } from "@/lib/checks/claims";
import { DEFAULT_MATERIAL } from "@/lib/checks/materials";
import { convert } from "@/lib/checks/quantities";
import { checkIdentitySchema, type CheckIdentityInput, type RunSource } from "@/lib/checks/schemas";
import { DEFAULT_SECTION } from "@/lib/checks/sections";
import type { Found } from "@/lib/checks/suggestions";
import { DEFAULT_TABLE, modelToTable, tableFormSchema, type TableFormInput } from "@/lib/checks/table-form";
import type { CheckVerdict } from "@/lib/checks/verdict";
import { CREEP_INTERPRETATIONS, type CreepInterpretation, type SolveResult } from "@/lib/solver";

export interface WorkbenchView {
  application: { id: number; number: string | null; siteAddress: string; state: string; cycle: number };
  purpose: "review" | "precheck";
  sheets: { id: number; label: string; cycle: number }[];
  calcs: { id: number; name: string; cycle: number; pageCount: number }[];
  permissions: { save: boolean; uploadModels: boolean };
}

export interface InitialModel {
  model: unknown;
  memberMark?: string;
  title?: string;
  calcDocumentId?: number | null;
  calcPage?: number | null;
  sheetId?: number | null;
  from: string;
}

type Mode = "beam" | "table" | "json" | "models" | "schedule";

const MODES: { id: Mode; label: string }[] = [
  { id: "beam", label: "Beam" },
  { id: "table", label: "Truss or frame (tables)" },
  { id: "json", label: "Model file" },
  { id: "models", label: "Member models" },
  { id: "schedule", label: "CSV schedule" },
];

interface RunResponse {
  model: unknown;
  result: SolveResult;
  verdict: CheckVerdict;
  summary: string;
}

/** The server's field messages onto the form: zod paths come as "source.input.spans.0.length", the solver's already as form paths. */
function setServerErrors<T extends FieldValues>(form: UseFormReturn<T>, fields: Record<string, string>) {
  for (const [k, message] of Object.entries(fields)) {
    if (k === "memberMark" || k.startsWith("source.mark") || k.startsWith("source.title")) continue;
    form.setError(k.replace(/^source\.input\./, "") as Path<T>, { type: "server", message });
  }
}

function openTables(model: unknown, table: UseFormReturn<TableFormInput>): string[] {
  const t = modelToTable(model);
  table.reset(t.input);
  return t.unsupported;
}

export function CheckWorkbench({ ctx, initial }: { ctx: WorkbenchView; initial?: InitialModel }) {
  const router = useRouter();
  const appId = ctx.application.id;
  const precheck = ctx.purpose === "precheck";
  const startTable = initial ? modelToTable(initial.model) : null;
  const [mode, setMode] = useState<Mode>(initial ? (startTable && startTable.unsupported.length === 0 ? "table" : "json") : "beam");
  const [creep, setCreep] = useState<CreepInterpretation>("ibc-footnote-d");
  const [jsonText, setJsonText] = useState(initial ? JSON.stringify(initial.model, null, 2) : "");
  const [jsonIssues, setJsonIssues] = useState<Record<string, string>>({});
  const [outcome, setOutcome] = useState<{ run: RunResponse; source: RunSource; key: string } | null>(null);
  const [message, setMessage] = useState<{ kind: "error" | "info" | "ok"; text: string } | null>(null);
  const [busy, setBusy] = useState<"run" | "save" | null>(null);
  const [dropped, setDropped] = useState<string | null>(null);
  const [trib, setTrib] = useState<TributaryPreset | undefined>(undefined);
  const nonce = useRef(0);

  const identity = useForm<CheckIdentityInput>({
    resolver: zodResolver(checkIdentitySchema),
    mode: "onTouched",
    defaultValues: {
      memberMark: initial?.memberMark ?? "",
      title: initial?.title ?? "",
      sheetId: initial?.sheetId ? String(initial.sheetId) : "",
      calcDocumentId: initial?.calcDocumentId ? String(initial.calcDocumentId) : ctx.calcs[0] ? String(ctx.calcs[0].id) : "",
      calcPage: initial?.calcPage ? String(initial.calcPage) : "",
    },
  });
  const beam = useForm<BeamFormInput>({ resolver: zodResolver(beamFormSchema), mode: "onTouched", defaultValues: DEFAULT_BEAM });
  const table = useForm<TableFormInput>({ resolver: zodResolver(tableFormSchema), mode: "onTouched", defaultValues: startTable?.input ?? DEFAULT_TABLE });
  const [unsupported, setUnsupported] = useState<string[]>(startTable?.unsupported ?? []);

  /** The source of the active mode, validated by the same schemas the server applies; null when a field needs attention. */
  async function currentSource(): Promise<RunSource | null> {
    const idOk = await identity.trigger(mode === "beam" ? ["memberMark", "title"] : ["title"]);
    const id = identity.getValues();
    if (mode === "beam") {
      let out: RunSource | null = null;
      await beam.handleSubmit((input) => {
        out = { form: "beam", title: id.title || id.memberMark, mark: id.memberMark, input };
      })();
      return idOk ? out : null;
    }
    if (mode === "table") {
      let out: RunSource | null = null;
      await table.handleSubmit((input) => {
        out = { form: "table", title: id.title || id.memberMark || "Structure", input };
      })();
      return idOk ? out : null;
    }
    try {
      return { form: "model", model: JSON.parse(jsonText) as unknown };
    } catch (e) {
      setMessage({ kind: "error", text: `The model file is not valid JSON: ${e instanceof Error ? e.message : ""}` });
      return null;
    }
  }

  function showError(e: unknown, source: RunSource | null) {
    if (e instanceof ApiError) {
      setMessage({ kind: "error", text: e.message });
      const fields = e.fields ?? {};
      if (fields.memberMark) identity.setError("memberMark", { type: "server", message: fields.memberMark });
      if (fields["source.mark"]) identity.setError("memberMark", { type: "server", message: fields["source.mark"] });
      if (source?.form === "beam") setServerErrors(beam, fields);
      else if (source?.form === "table") setServerErrors(table, fields);
      else setJsonIssues(fields);
    } else setMessage({ kind: "error", text: "The check could not be run. Try again." });
  }

  async function runWith(source: RunSource) {
    setBusy("run");
    setMessage(null);
    setJsonIssues({});
    try {
      const run = await fetchJson<RunResponse>("/api/checks/run", { method: "POST", json: { source, options: { creep } } });
      setOutcome({ run, source, key: JSON.stringify({ source, creep }) });
      setTimeout(() => document.getElementById("check-result-heading")?.scrollIntoView({ behavior: "smooth", block: "start" }), 50);
    } catch (e) {
      setOutcome(null);
      showError(e, source);
    } finally {
      setBusy(null);
    }
  }

  async function run() {
    const source = await currentSource();
    if (!source) {
      setMessage({ kind: "error", text: "Some fields need attention: see the messages beside them." });
      return;
    }
    await runWith(source);
  }

  async function save() {
    if (!outcome) return;
    const ok = await identity.trigger();
    if (!ok) {
      setMessage({ kind: "error", text: "Give the member mark (and check the calc page) before saving." });
      return;
    }
    const id = identity.getValues();
    setBusy("save");
    setMessage(null);
    try {
      const r = await fetchJson<{ check: { id: number } }>(`/api/applications/${appId}/checks`, {
        method: "POST",
        json: {
          source: outcome.source,
          options: { creep },
          purpose: ctx.purpose,
          memberMark: id.memberMark,
          sheetId: id.sheetId ? Number(id.sheetId) : null,
          calcDocumentId: id.calcDocumentId ? Number(id.calcDocumentId) : null,
          calcPage: id.calcPage ? Number(id.calcPage) : null,
        },
      });
      router.push(`/applications/${appId}/checks/${r.check.id}`);
    } catch (e) {
      showError(e, outcome.source);
      setBusy(null);
    }
  }

  function openModel(model: unknown, how: "run" | "tables" | "json", name: string) {
    setJsonText(JSON.stringify(model, null, 2));
    const m = model as { title?: unknown; checks?: { id?: unknown; member?: unknown }[] };
    if (!identity.getValues("memberMark")) {
      const mark = m.checks?.[0]?.id ?? m.checks?.[0]?.member;
      if (typeof mark === "string") identity.setValue("memberMark", mark.slice(0, 40), { shouldValidate: true });
    }
    if (!identity.getValues("title") && typeof m.title === "string") identity.setValue("title", m.title.slice(0, 160));
    if (how === "run") {
      setMode("json");
      void runWith({ form: "model", model });
      return;
    }
    const missing = openTables(model, table);
    setUnsupported(missing);
    setMode(missing.length ? "json" : "table");
    setMessage({ kind: "info", text: missing.length ? `${name} uses entries the tables cannot hold; it is open as a model file.` : `${name} is open in the tables.` });
  }

  // ---- suggestions: dropped in only on click

  const canUse = (s: Found) => mode === "beam" || (mode === "table" && s.kind === "deflection");

  function use(s: Found, documentId: number) {
    const id = identity.getValues();
    if (!id.memberMark && s.mark) identity.setValue("memberMark", s.mark, { shouldValidate: true });
    if (!id.calcPage) identity.setValue("calcPage", String(s.page));
    if (!id.calcDocumentId) identity.setValue("calcDocumentId", String(documentId));
    if (mode === "table" && s.kind === "deflection") {
      const rows = table.getValues("checks");
      if (rows.length === 0) return;
      const text = rows[0]?.claims ?? "";
      table.setValue("checks.0.claims", `${text ? `${text}; ` : ""}${s.value.combo ?? "L"} ${s.value.delta} ${s.value.unit}`, { shouldValidate: true });
      setDropped(`${s.label} → check 1 claims`);
      return;
    }
    const opts = { shouldValidate: true, shouldDirty: true };
    const u = beam.getValues("lengthUnit");
    const toU = (v: number, from: string) => String(Number(convert(v, from, u, "length").toPrecision(8)));
    switch (s.kind) {
      case "span": {
        const spans = beam.getValues("spans");
        const i = Math.max(0, spans.findIndex((x) => x.length === ""));
        if (spans.length === 0) beam.setValue("spans", [{ length: toU(s.value.length, s.value.unit) }], opts);
        else beam.setValue(`spans.${i}.length`, toU(s.value.length, s.value.unit), opts);
        setDropped(`${s.label} → span ${i + 1}`);
        break;
      }
      case "trib":
        setTrib({ nonce: ++nonce.current, width: { value: s.value.length, unit: s.value.unit } });
        setDropped(`${s.label} → tributary helper`);
        break;
      case "area-load":
        setTrib({ nonce: ++nonce.current, q: { value: s.value.q, unit: s.value.unit, case: s.value.case } });
        setDropped(`${s.label} → tributary helper`);
        break;
      case "line-load":
        beam.setValue("loads", [...beam.getValues("loads"), { case: s.value.case ?? "D", type: "uniform", on: "all", w: String(s.value.w), unit: s.value.unit === "kN/m" ? "kN/m" : s.value.unit, wEnd: "", at: "", from: "", to: "", note: `calc page ${s.page}: ${s.text}` }], opts);
        setDropped(`${s.label} → loads`);
        break;
      case "point-load":
        beam.setValue("loads", [...beam.getValues("loads"), { case: s.value.case ?? "L", type: "point", on: "all", w: String(s.value.P), unit: s.value.unit, wEnd: "", at: "", from: "", to: "", note: `calc page ${s.page}: ${s.text} (enter its position)` }], opts);
        setDropped(`${s.label} → loads (enter its position)`);
        break;
      case "section": {
        const v = s.value;
        const base = { ...DEFAULT_SECTION, ...beam.getValues("section") };
        if (v.source === "sawn") beam.setValue("section", { ...base, source: "sawn", nominal: v.nominal, plies: String(v.plies) }, opts);
        else if (v.source === "wshape") beam.setValue("section", { ...base, source: "wshape", designation: v.designation }, opts);
        else beam.setValue("section", { ...base, source: "rect", b: String(v.b), d: String(v.d), dimUnit: v.unit }, opts);
        setDropped(`${s.label} → section`);
        break;
      }
      case "material": {
        const v = s.value;
        const base = { ...DEFAULT_MATERIAL, ...beam.getValues("material") };
        if (v.source === "glulam") {
          beam.setValue("material", { ...base, source: "glulam", stressClass: v.stressClass }, opts);
          beam.setValue("creepMaterial", "glulam", opts);
        } else {
          beam.setValue("material", { ...base, source: "lumber", lumber: v.lumber }, opts);
          beam.setValue("creepMaterial", "sawn-dry", opts);
        }
        setDropped(`${s.label} → material`);
        break;
      }
      case "E":
        beam.setValue("material", { ...DEFAULT_MATERIAL, ...beam.getValues("material"), source: "direct", E: String(s.value.E), eUnit: s.value.unit }, opts);
        setDropped(`${s.label} → material`);
        break;
      case "I":
        beam.setValue("section", { ...DEFAULT_SECTION, ...beam.getValues("section"), source: "direct", I: String(s.value.I), iUnit: s.value.unit }, opts);
        setDropped(`${s.label} → section`);
        break;
      case "deflection": {
        const segs = beam.getValues("spans").length ? "S1" : beam.getValues("overhangRight") ? "OR" : "OL";
        beam.setValue("claims", [...beam.getValues("claims"), { segment: segs, combo: s.value.combo ?? "L", delta: String(s.value.delta), unit: s.value.unit, location: `calc page ${s.page}` }], opts);
        setDropped(`${s.label} → claims`);
        break;
      }
    }
  }

  const stale = outcome && JSON.stringify({ source: outcome.source, creep }) !== outcome.key;
  const showSuggestions = ctx.calcs.length > 0 && (mode === "beam" || mode === "table" || mode === "json");
  const markValue = identity.watch("memberMark");

  return (
    <div>
      <header className="mb-4 border-b border-rule pb-3">
        <p className="text-sm">
          <Link href={`/applications/${appId}`} className="text-accent underline-offset-2 hover:underline">
            ← {ctx.application.number} {ctx.application.siteAddress}
          </Link>
        </p>
        <h1 className="mt-1 text-2xl font-semibold">{precheck ? "Deflection pre-check" : "New deflection check"}</h1>
        <p className="mt-1 max-w-3xl text-sm text-ink-soft">
          {precheck
            ? "Run your members through the same checker the plans examiner uses, before you submit. Pre-checks are kept with your application; the examiner still checks independently."
            : "Re-run a claimed member by the unit-load method (virtual work), cross-checked by an independent stiffness solution, against IBC 2021 Table 1604.3."}
          {initial ? ` Started from ${initial.from}.` : ""}
        </p>
      </header>

      <FormProvider {...identity}>
        <Fieldset legend="Member">
          <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-5">
            <TextBox label="Member mark" name="memberMark" placeholder="FB-3" />
            <TextBox label="Title (optional)" name="title" placeholder="Second floor beam" />
            <SelectBox label="Sheet it appears on" name="sheetId" options={[{ value: "", label: "— not given —" }, ...ctx.sheets.map((s) => ({ value: String(s.id), label: `${s.label} (cycle ${s.cycle})` }))]} />
            <SelectBox label="Calculation package" name="calcDocumentId" options={[{ value: "", label: "— not given —" }, ...ctx.calcs.map((c) => ({ value: String(c.id), label: `${c.name} (cycle ${c.cycle})` }))]} />
            <QuantityField label="Calc page" name="calcPage" placeholder="2" />
          </div>
          <div className="mt-3 max-w-xl">
            <label htmlFor="creep" className="block text-xs font-medium text-ink-soft">
              Creep in the D + L check
            </label>
            <select id="creep" value={creep} onChange={(e) => setCreep(e.target.value as CreepInterpretation)} className="mt-0.5 w-full rounded-sm border border-rule-strong bg-sheet px-1.5 py-1 text-sm">
              {CREEP_INTERPRETATIONS.map((c) => (
                <option key={c} value={c}>
                  {CREEP_LABELS[c]}
                </option>
              ))}
            </select>
          </div>
          <ErrorText name="root" />
        </Fieldset>
      </FormProvider>

      <div role="tablist" aria-label="How to describe the member" className="mb-3 flex flex-wrap gap-1 border-b border-rule">
        {MODES.map((m) => (
          <button
            key={m.id}
            type="button"
            role="tab"
            aria-selected={mode === m.id}
            onClick={() => setMode(m.id)}
            className={`-mb-px border px-3 py-1.5 text-sm ${mode === m.id ? "border-rule border-b-sheet bg-sheet font-semibold" : "border-transparent text-ink-soft hover:text-ink"}`}
          >
            {m.label}
          </button>
        ))}
      </div>

      <div className={showSuggestions ? "grid gap-5 xl:grid-cols-[minmax(0,1fr)_22rem]" : ""}>
        <div className="min-w-0" role="tabpanel" aria-label={MODES.find((m) => m.id === mode)?.label}>
          {mode === "beam" ? (
            <FormProvider {...beam}>
              <BeamFormFields tribPreset={trib} />
            </FormProvider>
          ) : null}
          {mode === "table" ? (
            <FormProvider {...table}>
              {unsupported.length ? (
                <FormMessage kind="info">
                  Left out of the tables: {unsupported.join("; ")}. The model file tab keeps the whole file.
                </FormMessage>
              ) : null}
              <TableEditor />
            </FormProvider>
          ) : null}
          {mode === "json" ? <ModelJsonEditor text={jsonText} onChange={setJsonText} serverIssues={jsonIssues} /> : null}
          {mode === "models" ? <MemberModelsPanel applicationId={appId} canUpload={ctx.permissions.uploadModels} onOpen={openModel} /> : null}
          {mode === "schedule" ? <SchedulePanel creep={creep} /> : null}

          {mode !== "models" && mode !== "schedule" ? (
            <div className="sticky bottom-0 z-10 mt-4 flex flex-wrap items-center gap-3 border-t border-rule bg-paper/95 py-3">
              <Button type="button" onClick={run} disabled={busy !== null}>
                {busy === "run" ? "Running…" : "Run check"}
              </Button>
              <Button type="button" variant="secondary" onClick={save} disabled={busy !== null || !outcome || !ctx.permissions.save || Boolean(stale)}>
                {busy === "save" ? "Saving…" : precheck ? "Save pre-check" : "Save check"}
              </Button>
              {!ctx.permissions.save ? <span className="text-xs text-ink-soft">Checks are saved while the application is in review; you can still run them.</span> : null}
              {stale ? <span className="text-xs text-warn">The inputs changed since the run: run again before saving.</span> : null}
              {dropped ? <span className="text-xs text-ink-soft" role="status">Dropped in: {dropped}</span> : null}
            </div>
          ) : null}
          {message ? <FormMessage kind={message.kind}>{message.text.split("\n").map((l, i) => <span key={i} className="block">{l}</span>)}</FormMessage> : null}
        </div>
        {showSuggestions ? (
          <aside className="min-w-0">
            <SuggestionsPanel applicationId={appId} mark={markValue} onUse={use} canUse={canUse} />
          </aside>
        ) : null}
      </div>

      {outcome ? (
        <section className="mt-8 border-t-2 border-ink pt-4" aria-labelledby="check-result-heading">
          <div className="mb-3 flex flex-wrap items-center gap-3">
            <h2 id="check-result-heading" className="text-xl font-semibold">
              Result
            </h2>
            <VerdictBadge verdict={outcome.run.verdict} />
            <span className="text-sm text-ink-soft">not saved yet · {outcome.run.result.solver_version}</span>
          </div>
          <ResultView result={outcome.run.result} model={outcome.run.model} />
        </section>
      ) : null}
    </div>
  );
}
