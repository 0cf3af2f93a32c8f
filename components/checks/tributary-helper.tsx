"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect } from "react";
import { FormProvider, useForm, useWatch } from "react-hook-form";
import { z } from "zod";
import { QuantityField } from "@/components/checks/form-bits";
import { Button } from "@/components/ui/button";
import { LOAD_CASES, LOAD_CASE_LABELS, type LoadCase } from "@/lib/checks/claims";
import { AREA_LOAD_UNITS, LENGTH_UNITS, LINE_LOAD_UNITS } from "@/lib/checks/quantities";
import { tributaryFromInput, tributarySchema, type TributaryInput } from "@/lib/checks/tributary";

export interface TributaryPreset {
  nonce: number;
  q?: { value: number; unit: "psf" | "kPa"; case: LoadCase | null };
  width?: { value: number; unit: (typeof LENGTH_UNITS)[number] };
}

/** w = q × tributary width (+ self weight), with the arithmetic written out; adds the line load on click. */
export function TributaryHelper({ onAdd, preset }: { onAdd: (load: { case: LoadCase; w: string; unit: string; note: string }) => void; preset?: TributaryPreset }) {
  // the load case rides along in the form; the schema (which strips it) judges the numbers
  const form = useForm<TributaryInput & { case: LoadCase }>({
    resolver: zodResolver(tributarySchema.extend({ case: z.enum(LOAD_CASES) })),
    mode: "onChange",
    defaultValues: { q: "", qUnit: "psf", width: "", widthUnit: "ft", selfWeight: "", outUnit: "plf", case: "L" },
  });
  const values = useWatch({ control: form.control });
  const kase = values.case ?? "L";
  const parsed = tributarySchema.safeParse(values);
  const r = parsed.success ? tributaryFromInput(parsed.data) : null;

  useEffect(() => {
    if (!preset) return;
    if (preset.q) {
      form.setValue("q", String(preset.q.value), { shouldValidate: true });
      form.setValue("qUnit", preset.q.unit, { shouldValidate: true });
      if (preset.q.case) form.setValue("case", preset.q.case);
    }
    if (preset.width) {
      form.setValue("width", String(preset.width.value), { shouldValidate: true });
      form.setValue("widthUnit", preset.width.unit, { shouldValidate: true });
    }
  }, [preset, form]);

  return (
    <FormProvider {...form}>
      <div className="border border-dashed border-rule-strong bg-paper p-3" role="group" aria-label="Tributary-width helper">
        <p className="mb-2 text-sm font-medium">Tributary width: area load → line load</p>
        <div className="grid gap-2 sm:grid-cols-4">
          <div>
            <label htmlFor="trib-case" className="block text-xs font-medium text-ink-soft">
              Load case
            </label>
            <select id="trib-case" {...form.register("case")} className="mt-0.5 w-full rounded-sm border border-rule-strong bg-sheet px-1.5 py-1 text-sm">
              {LOAD_CASES.map((c) => (
                <option key={c} value={c}>
                  {LOAD_CASE_LABELS[c]}
                </option>
              ))}
            </select>
          </div>
          <QuantityField label="Area load q" name="q" unitName="qUnit" units={AREA_LOAD_UNITS} placeholder="40" />
          <QuantityField label="Tributary width" name="width" unitName="widthUnit" units={LENGTH_UNITS} placeholder="6" />
          <QuantityField label="Self weight (optional)" name="selfWeight" unitName="outUnit" units={LINE_LOAD_UNITS} placeholder="0" />
        </div>
        <div className="mt-2 flex flex-wrap items-center justify-between gap-2">
          <p className="num text-sm" data-testid="tributary-arithmetic" aria-live="polite">
            {r ? `w = ${r.text}` : "w = q × tributary width (+ self weight)"}
          </p>
          <Button
            type="button"
            variant="secondary"
            disabled={!r}
            onClick={() => {
              if (!r) return;
              onAdd({ case: kase, w: String(Number(r.w.toPrecision(6))), unit: r.unit, note: r.text });
            }}
          >
            Add as uniform {kase} load
          </Button>
        </div>
      </div>
    </FormProvider>
  );
}
