"use client";

import { useFormContext, useWatch } from "react-hook-form";
import { QuantityField, SelectBox } from "@/components/checks/form-bits";
import type { BeamFormInput } from "@/lib/checks/beam-form";
import { CREEP_MATERIAL_LABELS, GLULAM_CLASSES, LUMBER, MATERIAL_SOURCE_LABELS, MATERIAL_SOURCES, materialSchema, resolveMaterial } from "@/lib/checks/materials";
import { AREA_UNITS, DIMENSION_UNITS, INERTIA_UNITS, MODULUS_UNITS } from "@/lib/checks/quantities";
import { SAWN_SIZES, SECTION_SOURCE_LABELS, SECTION_SOURCES, W_SHAPES, resolveSection, sectionSchema } from "@/lib/checks/sections";
import { MATERIALS } from "@/lib/solver/model-schema";

// Section and material pickers of the beam form: each shows what it resolves to and where
// the number comes from, so the examiner can cite it.

export function SectionPicker() {
  const { control } = useFormContext<BeamFormInput>();
  const s = useWatch({ control, name: "section" });
  const parsed = sectionSchema.safeParse(s);
  const resolved = parsed.success ? resolveSection(parsed.data) : null;
  return (
    <div>
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectBox label="Section from" name="section.source" options={SECTION_SOURCES.map((v) => ({ value: v, label: SECTION_SOURCE_LABELS[v] }))} />
        {s.source === "sawn" ? (
          <div className="grid grid-cols-2 gap-2">
            <SelectBox label="Nominal size" name="section.nominal" options={SAWN_SIZES.map((z) => ({ value: z.nominal, label: `${z.nominal} (${z.b} × ${z.d} in)` }))} />
            <SelectBox label="Plies" name="section.plies" options={["1", "2", "3", "4"].map((v) => ({ value: v, label: v }))} />
          </div>
        ) : null}
        {s.source === "wshape" ? <SelectBox label="Shape" name="section.designation" options={W_SHAPES.map((w) => ({ value: w.designation, label: `${w.designation} — Ix ${w.Ix} in⁴` }))} /> : null}
      </div>
      {s.source === "rect" ? (
        <div className="mt-2 grid gap-2 sm:grid-cols-3">
          <QuantityField label="Width b" name="section.b" unitName="section.dimUnit" units={DIMENSION_UNITS} placeholder="5.125" />
          <QuantityField label="Depth d" name="section.d" placeholder="12" />
        </div>
      ) : null}
      {s.source === "ishape" ? (
        <div className="mt-2 grid gap-2 sm:grid-cols-4">
          <QuantityField label="Depth d" name="section.d" unitName="section.dimUnit" units={DIMENSION_UNITS} />
          <QuantityField label="Flange width bf" name="section.bf" />
          <QuantityField label="Flange thickness tf" name="section.tf" />
          <QuantityField label="Web thickness tw" name="section.tw" />
        </div>
      ) : null}
      {s.source === "direct" ? (
        <div className="mt-2 grid gap-2 sm:grid-cols-2">
          <QuantityField label="Moment of inertia I" name="section.I" unitName="section.iUnit" units={INERTIA_UNITS} />
          <QuantityField label="Area A (optional)" name="section.A" unitName="section.aUnit" units={AREA_UNITS} />
        </div>
      ) : null}
      {resolved ? (
        <p className="mt-2 text-xs text-ink-soft" data-testid="section-arithmetic">
          <span className="font-medium text-ink">{resolved.label}</span>: {resolved.arithmetic}. <span className="italic">Source: {resolved.source}.</span>
        </p>
      ) : null}
    </div>
  );
}

export function MaterialPicker() {
  const { control, setValue, register } = useFormContext<BeamFormInput>();
  const m = useWatch({ control, name: "material" });
  const shear = useWatch({ control, name: "includeShear" });
  const parsed = materialSchema.safeParse(m);
  const resolved = parsed.success ? resolveMaterial(parsed.data, shear) : null;
  return (
    <div>
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectBox
          label="Material"
          name="material.source"
          options={MATERIAL_SOURCES.map((v) => ({ value: v, label: MATERIAL_SOURCE_LABELS[v] }))}
          selectProps={{
            onChange: (e) => {
              const v = e.target.value as (typeof MATERIAL_SOURCES)[number];
              const creep = v === "lumber" ? "sawn-dry" : v === "glulam" ? "glulam" : v === "direct" ? "other" : v;
              setValue("creepMaterial", creep as BeamFormInput["creepMaterial"], { shouldValidate: true });
            },
          }}
        />
        {m.source === "lumber" ? <SelectBox label="Species and grade" name="material.lumber" options={LUMBER.map((l) => ({ value: l.id, label: `${l.species} ${l.grade} — E ${l.E / 1e6} × 10⁶ psi` }))} /> : null}
        {m.source === "glulam" ? (
          <div>
            <label htmlFor="material-stressClass" className="block text-xs font-medium text-ink-soft">
              Stress class
            </label>
            <input id="material-stressClass" list="glulam-classes" className="mt-0.5 block w-full rounded-sm border border-rule-strong bg-sheet px-2 py-1 text-sm" {...register("material.stressClass")} />
            <datalist id="glulam-classes">
              {GLULAM_CLASSES.map((c) => (
                <option key={c} value={c} />
              ))}
            </datalist>
          </div>
        ) : null}
        {m.source === "concrete" ? <QuantityField label="Concrete strength f′c" name="material.fc" unitName="material.fcUnit" units={["psi", "MPa"]} /> : null}
        {m.source === "direct" ? (
          <div className="grid grid-cols-2 gap-2">
            <QuantityField label="E" name="material.E" unitName="material.eUnit" units={MODULUS_UNITS} />
            <QuantityField label="G (for shear, optional)" name="material.G" />
          </div>
        ) : null}
      </div>
      <div className="mt-2 grid gap-3 sm:grid-cols-2">
        <SelectBox
          label="Material class for creep (Table 1604.3 footnote d)"
          name="creepMaterial"
          options={MATERIALS.map((v) => ({ value: v, label: CREEP_MATERIAL_LABELS[v] }))}
        />
      </div>
      {resolved ? (
        <p className="mt-2 text-xs text-ink-soft" data-testid="material-arithmetic">
          <span className="font-medium text-ink">{resolved.label}</span>: {resolved.arithmetic}. <span className="italic">Source: {resolved.source}.</span>
        </p>
      ) : null}
    </div>
  );
}
