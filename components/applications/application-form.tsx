"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { FormMessage, SelectField, TextArea, TextField } from "@/components/ui/field";
import { ApiError, fetchJson } from "@/lib/client/fetch-json";
import { applicationSchema, CONSTRUCTION_TYPES, OCCUPANCY_GROUPS } from "@/lib/validations/application";

type In = z.input<typeof applicationSchema>;
type Out = z.output<typeof applicationSchema>;

/** The same zod schema runs here (errors on the field before submit) and on the server. */
export function ApplicationForm() {
  const router = useRouter();
  const [serverError, setServerError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<In, unknown, Out>({
    resolver: zodResolver(applicationSchema),
    mode: "onBlur",
    defaultValues: { occupancyGroup: undefined, constructionType: undefined },
  });
  const e = formState.errors;

  async function onSubmit(_values: Out, ev?: React.BaseSyntheticEvent) {
    setServerError(null);
    const raw = Object.fromEntries(new FormData(ev?.target as HTMLFormElement));
    try {
      const r = await fetchJson<{ application: { id: number } }>("/api/applications", { method: "POST", json: raw });
      router.push(`/applications/${r.application.id}`);
    } catch (err) {
      if (err instanceof ApiError) {
        for (const [k, v] of Object.entries(err.fields ?? {})) setError(k as keyof In, { message: v });
        setServerError(err.message);
      } else setServerError("The application could not be saved. Try again.");
    }
  }

  return (
    <form onSubmit={handleSubmit(onSubmit)} noValidate className="max-w-2xl">
      {serverError ? <FormMessage kind="error">{serverError}</FormMessage> : null}
      <fieldset className="mb-6 border-t border-rule pt-4">
        <legend className="pr-2 text-sm font-semibold uppercase tracking-wide text-ink-soft">Project</legend>
        <TextArea label="Description of work" rows={3} error={e.workDescription?.message} hint="What will be built or altered, e.g. “Two-story wood-frame addition, 1,200 sq ft, with new roof framing.”" {...register("workDescription")} />
        <TextField label="Site address" error={e.siteAddress?.message} {...register("siteAddress")} />
        <TextField label="Parcel number" error={e.parcelNumber?.message} hint="As shown on the county assessor's map." {...register("parcelNumber")} />
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField label="Occupancy group" error={e.occupancyGroup?.message} hint="IBC chapter 3" {...register("occupancyGroup")}>
            <option value="">Choose…</option>
            {OCCUPANCY_GROUPS.map((g) => (
              <option key={g} value={g}>{g}</option>
            ))}
          </SelectField>
          <SelectField label="Construction type" error={e.constructionType?.message} hint="IBC Table 601" {...register("constructionType")}>
            <option value="">Choose…</option>
            {CONSTRUCTION_TYPES.map((t) => (
              <option key={t} value={t}>{`Type ${t}`}</option>
            ))}
          </SelectField>
        </div>
        <TextField label="Valuation (US dollars)" inputMode="decimal" error={e.valuation?.message} hint="Total value of the work; the permit fee follows it." {...register("valuation")} />
      </fieldset>
      <fieldset className="mb-6 border-t border-rule pt-4">
        <legend className="pr-2 text-sm font-semibold uppercase tracking-wide text-ink-soft">Design professional of record</legend>
        <TextField label="Name" error={e.dporName?.message} hint="The registered design professional in responsible charge (IBC 107.3.4)." {...register("dporName")} />
        <TextField label="Licence number" error={e.dporLicence?.message} {...register("dporLicence")} />
      </fieldset>
      <Button type="submit" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Saving…" : "Save draft and add documents"}
      </Button>
    </form>
  );
}
