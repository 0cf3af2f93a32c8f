"use client";

import { useFieldArray, useFormContext, useWatch } from "react-hook-form";
import { StructureDrawing } from "@/components/checks/diagrams";
import { CheckBox, ErrorText, Fieldset, QuantityField, SelectBox, inputCls, selectCls } from "@/components/checks/form-bits";
import { MaterialPicker, SectionPicker } from "@/components/checks/section-material";
import { TributaryHelper, type TributaryPreset } from "@/components/checks/tributary-helper";
import { Button } from "@/components/ui/button";
import { BEAM_LOAD_TYPES, BEAM_SUPPORTS, MAX_SPANS, SUPPORT_LABELS, beamFormSchema, beamSegments, beamSupportNodes, buildBeamModel, type BeamFormInput } from "@/lib/checks/beam-form";
import { CLAIM_COMBOS, LIMIT_ROWS, LOAD_CASES, rowLimits } from "@/lib/checks/claims";
import { modelGeometry } from "@/lib/checks/geometry";
import { DEFLECTION_UNITS, FORCE_UNITS, LENGTH_UNITS, LINE_LOAD_UNITS, unitLabel } from "@/lib/checks/quantities";

const TYPE_LABELS: Record<(typeof BEAM_LOAD_TYPES)[number], string> = { uniform: "Uniform", point: "Point", partial: "Partial / varying" };

function Geometry() {
  const { control, register, getValues, setValue } = useFormContext<BeamFormInput>();
  const spans = useFieldArray({ control, name: "spans" });
  const values = useWatch({ control });
  const u = values.lengthUnit ?? "ft";
  const supports = beamSupportNodes({ spans: (values.spans ?? []).map((x) => ({ length: x.length ?? "" })), overhangLeft: values.overhangLeft, overhangRight: values.overhangRight });
  const hasOverhang = Number(values.overhangLeft || 0) > 0 || Number(values.overhangRight || 0) > 0;

  function addSpan() {
    if (spans.fields.length >= MAX_SPANS) return;
    spans.append({ length: "" });
    setValue("supports", [...getValues("supports"), "roller"], { shouldValidate: true });
  }
  function removeSpan(i: number) {
    spans.remove(i);
    const s = [...getValues("supports")];
    if (spans.fields.length === 1) setValue("supports", ["fixed"], { shouldValidate: true });
    else {
      s.splice(i + 1, 1);
      setValue("supports", s, { shouldValidate: true });
    }
  }

  return (
    <Fieldset legend="Spans and supports">
      <div className="mb-3 grid gap-3 sm:grid-cols-4">
        <SelectBox label="Length unit" name="lengthUnit" options={LENGTH_UNITS.map((v) => ({ value: v, label: v }))} hint="for spans, overhangs and load positions" />
        <QuantityField label={`Left overhang (${u})`} name="overhangLeft" placeholder="none" />
        <QuantityField label={`Right overhang (${u})`} name="overhangRight" placeholder="none" />
      </div>
      <ErrorText name="spans" />
      <ol className="space-y-2">
        {spans.fields.map((f, i) => (
          <li key={f.id} className="flex items-end gap-2">
            <div className="w-48">
              <QuantityField label={`Span ${i + 1} (${u})`} name={`spans.${i}.length`} placeholder="16" />
            </div>
            {spans.fields.length > 1 || hasOverhang ? (
              <Button type="button" variant="quiet" onClick={() => removeSpan(i)} aria-label={`Remove span ${i + 1}`}>
                Remove
              </Button>
            ) : null}
          </li>
        ))}
      </ol>
      <Button type="button" variant="quiet" onClick={addSpan} disabled={spans.fields.length >= MAX_SPANS}>
        + Add span (continuous beam)
      </Button>
      <div className="mt-3 grid gap-2 sm:grid-cols-3">
        {supports.map((s, i) => (
          <div key={`${s.node}-${i}`}>
            <label htmlFor={`supports-${i}`} className="block text-xs font-medium text-ink-soft">
              Support at {s.node} ({s.x} {u})
            </label>
            <select id={`supports-${i}`} className={`${selectCls} mt-0.5 w-full`} {...register(`supports.${i}`)}>
              {BEAM_SUPPORTS.map((k) => (
                <option key={k} value={k}>
                  {SUPPORT_LABELS[k]}
                </option>
              ))}
            </select>
            <ErrorText name={`supports.${i}`} />
          </div>
        ))}
      </div>
      <ErrorText name="supports" />
      <ErrorText name="includeShear" />
    </Fieldset>
  );
}

function Loads({ tribPreset }: { tribPreset?: TributaryPreset }) {
  const { control, register, setValue } = useFormContext<BeamFormInput>();
  const loads = useFieldArray({ control, name: "loads" });
  const values = useWatch({ control });
  const segs = beamSegments({ spans: (values.spans ?? []).map((x) => ({ length: x.length ?? "" })), overhangLeft: values.overhangLeft, overhangRight: values.overhangRight });
  const u = values.lengthUnit ?? "ft";
  return (
    <Fieldset legend="Loads by case">
      <p className="mb-2 text-xs text-ink-soft">
        Gravity loads act downward (enter uplift as a negative value). Positions are measured from the beam&apos;s left end, in {u}.
      </p>
      <TributaryHelper preset={tribPreset} onAdd={(l) => loads.append({ case: l.case, type: "uniform", on: "all", w: l.w, unit: l.unit, note: l.note, wEnd: "", at: "", from: "", to: "" })} />
      <ErrorText name="loads" />
      <ol className="mt-3 space-y-2" aria-label="Loads">
        {loads.fields.map((f, i) => {
          const l = values.loads?.[i];
          const type = l?.type ?? "uniform";
          const units = type === "point" ? FORCE_UNITS : LINE_LOAD_UNITS;
          return (
            <li key={f.id} className="border-b border-rule pb-2" aria-label={`Load ${i + 1}`}>
              <div className="grid items-start gap-2 sm:grid-cols-[5rem_9rem_minmax(9rem,1fr)_minmax(10rem,1.3fr)_auto]">
                <div>
                  <label htmlFor={`loads-${i}-case`} className="block text-xs font-medium text-ink-soft">
                    Case
                  </label>
                  <select id={`loads-${i}-case`} className={`${selectCls} mt-0.5 w-full`} {...register(`loads.${i}.case`)}>
                    {LOAD_CASES.map((c) => (
                      <option key={c} value={c}>
                        {c}
                      </option>
                    ))}
                  </select>
                </div>
                <div>
                  <label htmlFor={`loads-${i}-type`} className="block text-xs font-medium text-ink-soft">
                    Type
                  </label>
                  <select id={`loads-${i}-type`} className={`${selectCls} mt-0.5 w-full`} {...register(`loads.${i}.type`, { onChange: (e: { target: { value: string } }) => setValue(`loads.${i}.unit`, e.target.value === "point" ? "kip" : "plf") })}>
                    {BEAM_LOAD_TYPES.map((t) => (
                      <option key={t} value={t}>
                        {TYPE_LABELS[t]}
                      </option>
                    ))}
                  </select>
                </div>
                <div>
                  <label htmlFor={`loads-${i}-w`} className="block text-xs font-medium text-ink-soft">
                    {type === "point" ? "Force P" : type === "partial" ? "w at start" : "Intensity w"}
                  </label>
                  <div className="mt-0.5 flex gap-1">
                    <input id={`loads-${i}-w`} inputMode="decimal" className={`${inputCls} num`} {...register(`loads.${i}.w`)} />
                    <select aria-label={`Load ${i + 1} unit`} className={selectCls} {...register(`loads.${i}.unit`)}>
                      {units.map((x) => (
                        <option key={x} value={x}>
                          {unitLabel(x)}
                        </option>
                      ))}
                    </select>
                  </div>
                  <ErrorText name={`loads.${i}.w`} />
                  <ErrorText name={`loads.${i}.unit`} />
                </div>
                <div className="grid grid-cols-2 gap-1">
                  {type === "uniform" ? (
                    <div className="col-span-2">
                      <label htmlFor={`loads-${i}-on`} className="block text-xs font-medium text-ink-soft">
                        On
                      </label>
                      <select id={`loads-${i}-on`} className={`${selectCls} mt-0.5 w-full`} {...register(`loads.${i}.on`)}>
                        <option value="all">the whole beam</option>
                        {segs.map((s) => (
                          <option key={s.key} value={s.key}>
                            {s.label}
                          </option>
                        ))}
                      </select>
                      <ErrorText name={`loads.${i}.on`} />
                    </div>
                  ) : null}
                  {type === "point" ? (
                    <div className="col-span-2">
                      <QuantityField label={`At (${u} from left end)`} name={`loads.${i}.at`} />
                    </div>
                  ) : null}
                  {type === "partial" ? (
                    <>
                      <QuantityField label={`From (${u})`} name={`loads.${i}.from`} />
                      <QuantityField label={`To (${u})`} name={`loads.${i}.to`} />
                      <div className="col-span-2">
                        <QuantityField label="w at end (blank: uniform)" name={`loads.${i}.wEnd`} />
                      </div>
                    </>
                  ) : null}
                </div>
                <Button type="button" variant="quiet" className="mt-4" onClick={() => loads.remove(i)} aria-label={`Remove load ${i + 1}`}>
                  Remove
                </Button>
              </div>
              {l?.note ? <p className="mt-1 text-xs text-ink-faint">{l.note}</p> : null}
              <ErrorText name={`loads.${i}`} />
            </li>
          );
        })}
      </ol>
      <div className="mt-2 flex gap-2">
        <Button type="button" variant="secondary" onClick={() => loads.append({ case: "D", type: "uniform", on: "all", w: "", unit: "plf", wEnd: "", at: "", from: "", to: "", note: "" })}>
          + Uniform load
        </Button>
        <Button type="button" variant="secondary" onClick={() => loads.append({ case: "L", type: "point", on: "all", w: "", unit: "kip", wEnd: "", at: "", from: "", to: "", note: "" })}>
          + Point load
        </Button>
        <Button type="button" variant="secondary" onClick={() => loads.append({ case: "D", type: "partial", on: "all", w: "", unit: "plf", wEnd: "", at: "", from: "", to: "", note: "" })}>
          + Partial load
        </Button>
      </div>
    </Fieldset>
  );
}

function Claims() {
  const { control, register } = useFormContext<BeamFormInput>();
  const claims = useFieldArray({ control, name: "claims" });
  const values = useWatch({ control });
  const segs = beamSegments({ spans: (values.spans ?? []).map((x) => ({ length: x.length ?? "" })), overhangLeft: values.overhangLeft, overhangRight: values.overhangRight });
  return (
    <Fieldset legend="Limits and claims">
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectBox
          label="IBC 2021 Table 1604.3 row"
          name="row"
          options={LIMIT_ROWS.map((r) => ({ value: r.id, label: `${r.label} — ${rowLimits(r.id)}` }))}
          hint="The adopted local code governs; l = span, cantilevers l = 2 × length (footnote i)."
        />
      </div>
      <p className="mb-1 mt-3 text-sm font-medium">Claimed deflections (from the calc)</p>
      <ErrorText name="claims" />
      <ol className="space-y-2" aria-label="Claimed deflections">
        {claims.fields.map((f, i) => (
          <li key={f.id} className="grid items-start gap-2 sm:grid-cols-[minmax(8rem,1fr)_7rem_minmax(9rem,1fr)_minmax(8rem,1fr)_auto]" aria-label={`Claim ${i + 1}`}>
            <div>
              <label htmlFor={`claims-${i}-segment`} className="block text-xs font-medium text-ink-soft">
                For
              </label>
              <select id={`claims-${i}-segment`} className={`${selectCls} mt-0.5 w-full`} {...register(`claims.${i}.segment`)}>
                {segs.map((s) => (
                  <option key={s.key} value={s.key}>
                    {s.label}
                  </option>
                ))}
              </select>
              <ErrorText name={`claims.${i}.segment`} />
            </div>
            <div>
              <label htmlFor={`claims-${i}-combo`} className="block text-xs font-medium text-ink-soft">
                Combination
              </label>
              <select id={`claims-${i}-combo`} className={`${selectCls} mt-0.5 w-full`} {...register(`claims.${i}.combo`)}>
                {CLAIM_COMBOS.map((c) => (
                  <option key={c} value={c}>
                    {c}
                  </option>
                ))}
              </select>
              <ErrorText name={`claims.${i}.combo`} />
            </div>
            <QuantityField label="Claimed Δ" name={`claims.${i}.delta`} unitName={`claims.${i}.unit`} units={DEFLECTION_UNITS} />
            <div>
              <label htmlFor={`claims-${i}-location`} className="block text-xs font-medium text-ink-soft">
                Location (as the calc says)
              </label>
              <input id={`claims-${i}-location`} className={`${inputCls} mt-0.5`} placeholder="midspan" {...register(`claims.${i}.location`)} />
            </div>
            <Button type="button" variant="quiet" className="mt-4" onClick={() => claims.remove(i)} aria-label={`Remove claim ${i + 1}`}>
              Remove
            </Button>
          </li>
        ))}
      </ol>
      <Button type="button" variant="quiet" onClick={() => claims.append({ segment: segs.find((s) => !s.cantilever)?.key ?? segs[0]?.key ?? "S1", combo: "L", delta: "", unit: "in", location: "" })}>
        + Claimed deflection
      </Button>
    </Fieldset>
  );
}

function LiveDrawing() {
  const { control } = useFormContext<BeamFormInput>();
  const values = useWatch({ control });
  const parsed = beamFormSchema.safeParse(values);
  if (!parsed.success) return <p className="border border-dashed border-rule-strong p-4 text-sm text-ink-soft">The drawing appears when spans, supports, section and material are complete.</p>;
  const { model } = buildBeamModel(parsed.data, { title: "beam", mark: "beam" });
  return <StructureDrawing g={modelGeometry(model)} us={parsed.data.lengthUnit === "ft" || parsed.data.lengthUnit === "in"} title="Beam as entered" />;
}

/** The beam form's fields; the form itself (useForm + zodResolver) belongs to the workbench. */
export function BeamFormFields({ tribPreset }: { tribPreset?: TributaryPreset }) {
  return (
    <div>
      <LiveDrawing />
      <Geometry />
      <Fieldset legend="Section">
        <SectionPicker />
        <ErrorText name="section" />
        <div className="mt-3">
          <CheckBox
            label="Include shear deformation"
            name="includeShear"
            hint="Tabulated wood E is apparent E and already includes shear; with shear modelled the shear-free E is used (1.03 E sawn, 1.05 E glulam)."
          />
        </div>
      </Fieldset>
      <Fieldset legend="Material">
        <MaterialPicker />
        <ErrorText name="material" />
      </Fieldset>
      <Loads tribPreset={tribPreset} />
      <Claims />
    </div>
  );
}
