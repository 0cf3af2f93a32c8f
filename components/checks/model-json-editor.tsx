"use client";

import { useDeferredValue, useMemo } from "react";
import { StructureDrawing } from "@/components/checks/diagrams";
import { modelGeometry } from "@/lib/checks/geometry";
import { parseModel, SolverInputError } from "@/lib/solver";

/** The model file itself, for anything the forms have no field for (settlement, temperature, shear terms). */
export function ModelJsonEditor({ text, onChange, serverIssues }: { text: string; onChange: (t: string) => void; serverIssues: Record<string, string> }) {
  const deferred = useDeferredValue(text);
  const state = useMemo(() => {
    if (deferred.trim() === "") return { model: null as unknown, error: null as string | null, issues: [] as string[] };
    let model: unknown;
    try {
      model = JSON.parse(deferred);
    } catch (e) {
      return { model: null as unknown, error: `Not valid JSON: ${e instanceof Error ? e.message : "unreadable"}`, issues: [] as string[] };
    }
    try {
      parseModel(model);
      return { model, error: null as string | null, issues: [] as string[] };
    } catch (e) {
      if (e instanceof SolverInputError) return { model, error: null, issues: e.issues.map((i) => `${i.path}: ${i.message}`) };
      return { model, error: String(e), issues: [] as string[] };
    }
  }, [deferred]);
  const server = Object.values(serverIssues);
  return (
    <div>
      {state.model ? <StructureDrawing g={modelGeometry(state.model)} title="Model as written (live)" /> : null}
      <label className="block text-sm">
        <span className="font-medium">Model file (JSON)</span>
        <span className="ml-2 text-xs text-ink-soft">every quantity is a string with its unit, e.g. &quot;16 ft&quot;, &quot;1800 ksi&quot;</span>
        <textarea
          value={text}
          onChange={(e) => onChange(e.target.value)}
          rows={22}
          spellCheck={false}
          aria-label="Model file (JSON)"
          aria-invalid={state.error || state.issues.length ? true : undefined}
          className="num mt-1 block w-full rounded-sm border border-rule-strong bg-sheet px-2 py-1 text-xs aria-[invalid=true]:border-bad"
        />
      </label>
      {state.error ? (
        <p role="alert" className="mt-1 text-xs font-medium text-bad">
          {state.error}
        </p>
      ) : null}
      {[...state.issues, ...server.filter((s) => !state.issues.includes(s))].map((m) => (
        <p key={m} role="alert" className="mt-1 text-xs font-medium text-bad">
          {m}
        </p>
      ))}
    </div>
  );
}
