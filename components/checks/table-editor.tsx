"use client";

import { useDeferredValue, useMemo, type ReactNode } from "react";
import { useFieldArray, useFormContext, useWatch, type FieldValues } from "react-hook-form";
import { StructureDrawing } from "@/components/checks/diagrams";
import { ErrorText, Fieldset, SelectBox, inputCls, selectCls, useFieldError } from "@/components/checks/form-bits";
import { Button } from "@/components/ui/button";
import { fieldForPath } from "@/lib/checks/beam-form";
import { LIMIT_ROWS, LOAD_CASES } from "@/lib/checks/claims";
import { modelGeometry } from "@/lib/checks/geometry";
import { CREEP_MATERIAL_LABELS } from "@/lib/checks/materials";
import { AREA_UNITS, FORCE_UNITS, INERTIA_UNITS, LENGTH_UNITS, LINE_LOAD_UNITS, MODULUS_UNITS, unitLabel } from "@/lib/checks/quantities";
import { EMPTY_LOAD, RELEASES, TABLE_KINDS, TABLE_LOAD_TYPES, TABLE_SUPPORTS, buildTableModel, type TableFormInput } from "@/lib/checks/table-form";
import { parseModel, SolverInputError } from "@/lib/solver";
import { MATERIALS } from "@/lib/solver/model-schema";

// The truss and frame editor: one table per part of the model, a live drawing above them,
// and every problem on the row that causes it — the schema's as you type, and the solver's
// own parser's (unknown node, wrong unit, coincident nodes…) before anything is sent.

function Cell({ name, label, wide = false, placeholder }: { name: string; label: string; wide?: boolean; placeholder?: string }) {
  const { register } = useFormContext<FieldValues>();
  const error = useFieldError(name);
  return (
    <td className="px-1 py-0.5 align-top">
      <input aria-label={label} placeholder={placeholder} aria-invalid={error ? true : undefined} className={`${inputCls} num ${wide ? "min-w-[7rem]" : "min-w-[4.5rem]"}`} {...register(name)} />
      <ErrorText name={name} />
    </td>
  );
}

function SelectCell({ name, label, options }: { name: string; label: string; options: readonly { value: string; label: string }[] }) {
  const { register } = useFormContext<FieldValues>();
  return (
    <td className="px-1 py-0.5 align-top">
      <select aria-label={label} className={`${selectCls} w-full`} {...register(name)}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      <ErrorText name={name} />
    </td>
  );
}

function RowIssues({ issues, span }: { issues: string[]; span: number }) {
  if (!issues.length) return null;
  return (
    <tr>
      <td colSpan={span} className="px-1 pb-1">
        {issues.map((m) => (
          <p key={m} role="alert" className="text-xs font-medium text-bad">
            {m}
          </p>
        ))}
      </td>
    </tr>
  );
}

function Table({ caption, head, children, onAdd, addLabel }: { caption: string; head: string[]; children: ReactNode; onAdd: () => void; addLabel: string }) {
  return (
    <div className="mb-4 overflow-x-auto">
      <table className="w-full border-collapse text-sm" aria-label={caption}>
        <caption className="mb-1 text-left text-sm font-medium">{caption}</caption>
        <thead>
          <tr className="border-b border-rule-strong">
            {head.map((h) => (
              <th key={h} className="px-1 py-1 text-left text-xs font-medium text-ink-soft">
                {h}
              </th>
            ))}
            <th className="w-8">
              <span className="sr-only">Remove</span>
            </th>
          </tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
      <Button type="button" variant="quiet" onClick={onAdd}>
        + {addLabel}
      </Button>
    </div>
  );
}

function RemoveCell({ onClick, label }: { onClick: () => void; label: string }) {
  return (
    <td className="px-1 py-0.5 align-top">
      <button type="button" onClick={onClick} aria-label={label} className="px-1 text-ink-soft hover:text-bad">
        ×
      </button>
    </td>
  );
}

/** Problems the solver's parser finds in the tables as they stand, keyed by the row field they belong to. */
function useLiveIssues(values: TableFormInput): Record<string, string[]> {
  const deferred = useDeferredValue(values);
  return useMemo(() => {
    const out: Record<string, string[]> = {};
    let built;
    try {
      built = buildTableModel(deferred, { title: "live" });
    } catch {
      return out;
    }
    try {
      parseModel(built.model);
    } catch (e) {
      if (!(e instanceof SolverInputError)) return out;
      for (const i of e.issues) {
        const field = fieldForPath(built.origin, i.path) ?? "general";
        const row = /^(\w+)\.(\d+)/.exec(field);
        const key = row ? `${row[1]}.${row[2]}` : "general";
        (out[key] ??= []).push(`${i.path}: ${i.message}`);
      }
    }
    return out;
  }, [deferred]);
}

export function TableEditor() {
  const { control } = useFormContext<TableFormInput>();
  const values = useWatch({ control }) as TableFormInput;
  const nodes = useFieldArray({ control, name: "nodes" });
  const members = useFieldArray({ control, name: "members" });
  const supports = useFieldArray({ control, name: "supports" });
  const loads = useFieldArray({ control, name: "loads" });
  const checks = useFieldArray({ control, name: "checks" });
  const find = useFieldArray({ control, name: "find" });
  const issues = useLiveIssues(values);
  const u = values.units ?? { length: "ft", modulus: "ksi", inertia: "in^4", area: "in^2", force: "kip", lineLoad: "plf" };
  const truss = values.kind === "truss";
  const geometry = useMemo(() => {
    try {
      return modelGeometry(buildTableModel(values, { title: "live" }).model);
    } catch {
      return null;
    }
  }, [values]);
  const rowIssues = (table: string, i: number) => issues[`${table}.${i}`] ?? [];

  return (
    <div>
      {geometry ? <StructureDrawing g={geometry} us={u.length === "ft" || u.length === "in"} title="Structure as entered (live)" /> : null}
      {issues.general?.length ? (
        <div role="alert" className="mb-3 border-l-4 border-bad bg-bad-wash px-3 py-2 text-sm text-bad">
          {issues.general.map((m) => (
            <p key={m}>{m}</p>
          ))}
        </div>
      ) : null}
      <Fieldset legend="Kind and units">
        <div className="grid gap-2 sm:grid-cols-7">
          <SelectBox label="Kind" name="kind" options={TABLE_KINDS.map((k) => ({ value: k, label: k === "truss" ? "Truss (pin-jointed)" : k === "frame" ? "Frame" : "Beam" }))} />
          <SelectBox label="Lengths" name="units.length" options={LENGTH_UNITS.map((v) => ({ value: v, label: v }))} />
          <SelectBox label="E" name="units.modulus" options={MODULUS_UNITS.map((v) => ({ value: v, label: v }))} />
          <SelectBox label="I" name="units.inertia" options={INERTIA_UNITS.map((v) => ({ value: v, label: unitLabel(v) }))} />
          <SelectBox label="A" name="units.area" options={AREA_UNITS.map((v) => ({ value: v, label: unitLabel(v) }))} />
          <SelectBox label="Forces" name="units.force" options={FORCE_UNITS.map((v) => ({ value: v, label: unitLabel(v) }))} />
          <SelectBox label="Line loads" name="units.lineLoad" options={LINE_LOAD_UNITS.map((v) => ({ value: v, label: v }))} />
        </div>
        <p className="mt-1 text-xs text-ink-faint">y is up. Node loads and line loads follow the axes: a downward load is negative.</p>
      </Fieldset>

      <Fieldset legend="Geometry">
        <ErrorText name="nodes" />
        <Table caption="Nodes" head={["Node", `x (${u.length})`, `y (${u.length})`]} onAdd={() => nodes.append({ id: `N${nodes.fields.length + 1}`, x: "", y: "0" })} addLabel="Node">
          {nodes.fields.map((f, i) => (
            <FragmentRows key={f.id}>
              <tr aria-label={`Node row ${i + 1}`}>
                <Cell name={`nodes.${i}.id`} label={`Node ${i + 1} id`} />
                <Cell name={`nodes.${i}.x`} label={`Node ${i + 1} x`} />
                <Cell name={`nodes.${i}.y`} label={`Node ${i + 1} y`} />
                <RemoveCell onClick={() => nodes.remove(i)} label={`Remove node ${i + 1}`} />
              </tr>
              <RowIssues issues={rowIssues("nodes", i)} span={4} />
            </FragmentRows>
          ))}
        </Table>
        <ErrorText name="members" />
        <Table
          caption="Members"
          head={["Member", "Start node", "End node", `E (${u.modulus})`, ...(truss ? [] : [`I (${unitLabel(u.inertia)})`]), `A (${unitLabel(u.area)})${truss ? "" : ", optional"}`, ...(truss ? [] : ["Hinge"])]}
          onAdd={() => {
            const last = values.members?.[values.members.length - 1];
            members.append({ id: `M${members.fields.length + 1}`, start: "", end: "", E: last?.E ?? "", I: last?.I ?? "", A: last?.A ?? "", release: "none" });
          }}
          addLabel="Member"
        >
          {members.fields.map((f, i) => (
            <FragmentRows key={f.id}>
              <tr aria-label={`Member row ${i + 1}`}>
                <Cell name={`members.${i}.id`} label={`Member ${i + 1} id`} />
                <Cell name={`members.${i}.start`} label={`Member ${i + 1} start node`} />
                <Cell name={`members.${i}.end`} label={`Member ${i + 1} end node`} />
                <Cell name={`members.${i}.E`} label={`Member ${i + 1} E`} />
                {truss ? null : <Cell name={`members.${i}.I`} label={`Member ${i + 1} I`} />}
                <Cell name={`members.${i}.A`} label={`Member ${i + 1} A`} />
                {truss ? null : (
                  <SelectCell name={`members.${i}.release`} label={`Member ${i + 1} hinge`} options={RELEASES.map((r) => ({ value: r, label: r === "none" ? "none" : r === "both" ? "both ends" : `${r} end` }))} />
                )}
                <RemoveCell onClick={() => members.remove(i)} label={`Remove member ${i + 1}`} />
              </tr>
              <RowIssues issues={rowIssues("members", i)} span={9} />
            </FragmentRows>
          ))}
        </Table>
        <ErrorText name="supports" />
        <Table caption="Supports" head={["Node", "Support"]} onAdd={() => supports.append({ node: "", type: "pin" })} addLabel="Support">
          {supports.fields.map((f, i) => (
            <FragmentRows key={f.id}>
              <tr aria-label={`Support row ${i + 1}`}>
                <Cell name={`supports.${i}.node`} label={`Support ${i + 1} node`} />
                <SelectCell name={`supports.${i}.type`} label={`Support ${i + 1} type`} options={TABLE_SUPPORTS.map((t) => ({ value: t, label: t === "roller" ? "roller (holds y)" : t === "roller-x" ? "roller (holds x)" : t === "pin" ? "pin (x, y)" : "fixed (x, y, rotation)" }))} />
                <RemoveCell onClick={() => supports.remove(i)} label={`Remove support ${i + 1}`} />
              </tr>
              <RowIssues issues={rowIssues("supports", i)} span={3} />
            </FragmentRows>
          ))}
        </Table>
      </Fieldset>

      <Fieldset legend="Loads">
        <Table
          caption="Loads"
          head={["Type", "On", "Case", `Fx / — (${unitLabel(u.force)})`, `Fy / P (${unitLabel(u.force)})`, `w (${u.lineLoad})`, `w end`, `from / at (${u.length})`, `to (${u.length})`, "Direction"]}
          onAdd={() => loads.append({ ...EMPTY_LOAD, type: truss ? "node" : "line" })}
          addLabel="Load"
        >
          {loads.fields.map((f, i) => {
            const l = values.loads?.[i];
            const type = l?.type ?? "node";
            return (
              <FragmentRows key={f.id}>
                <tr aria-label={`Load row ${i + 1}`}>
                  <SelectCell name={`loads.${i}.type`} label={`Load ${i + 1} type`} options={TABLE_LOAD_TYPES.map((t) => ({ value: t, label: t === "node" ? "node load" : t === "line" ? "line load" : "point on member" }))} />
                  <Cell name={`loads.${i}.target`} label={`Load ${i + 1} node or member`} />
                  <SelectCell name={`loads.${i}.case`} label={`Load ${i + 1} case`} options={LOAD_CASES.map((c) => ({ value: c, label: c }))} />
                  {type === "node" ? <Cell name={`loads.${i}.fx`} label={`Load ${i + 1} Fx`} /> : <td />}
                  {type === "node" ? <Cell name={`loads.${i}.fy`} label={`Load ${i + 1} Fy`} /> : type === "point" ? <Cell name={`loads.${i}.P`} label={`Load ${i + 1} P`} /> : <td />}
                  {type === "line" ? <Cell name={`loads.${i}.w`} label={`Load ${i + 1} w`} /> : <td />}
                  {type === "line" ? <Cell name={`loads.${i}.wEnd`} label={`Load ${i + 1} w at end`} placeholder="uniform" /> : <td />}
                  {type === "line" ? <Cell name={`loads.${i}.from`} label={`Load ${i + 1} from`} placeholder="0" /> : type === "point" ? <Cell name={`loads.${i}.at`} label={`Load ${i + 1} at`} /> : <td />}
                  {type === "line" ? <Cell name={`loads.${i}.to`} label={`Load ${i + 1} to`} placeholder="end" /> : <td />}
                  {type === "node" ? <td /> : <SelectCell name={`loads.${i}.dir`} label={`Load ${i + 1} direction`} options={[{ value: "global", label: "global y" }, { value: "local", label: "member's local y" }]} />}
                  <RemoveCell onClick={() => loads.remove(i)} label={`Remove load ${i + 1}`} />
                </tr>
                <RowIssues issues={rowIssues("loads", i)} span={11} />
              </FragmentRows>
            );
          })}
        </Table>
      </Fieldset>

      <Fieldset legend="Deflection checks and claims">
        <Table
          caption="Checks"
          head={["By", "Member(s) or point", "dof", "Table 1604.3 row", "Material class", "Cantilever", `Span (${u.length})`, "Claims (e.g. L 0.42 in; D+L 0.6 in)"]}
          onAdd={() => checks.append({ by: "members", target: "", dof: "y", row: "floor", material: "other", cantilever: false, span: "", claims: "" })}
          addLabel="Check"
        >
          {checks.fields.map((f, i) => (
            <FragmentRows key={f.id}>
              <tr aria-label={`Check row ${i + 1}`}>
                <SelectCell name={`checks.${i}.by`} label={`Check ${i + 1} by`} options={[{ value: "members", label: "largest along members" }, { value: "point", label: "at a point" }]} />
                <Cell name={`checks.${i}.target`} label={`Check ${i + 1} members or point`} wide placeholder="AB, BC or L3 or mid:AB" />
                <SelectCell name={`checks.${i}.dof`} label={`Check ${i + 1} dof`} options={[{ value: "y", label: "y" }, { value: "x", label: "x" }]} />
                <SelectCell name={`checks.${i}.row`} label={`Check ${i + 1} row`} options={LIMIT_ROWS.map((r) => ({ value: r.id, label: r.label }))} />
                <SelectCell name={`checks.${i}.material`} label={`Check ${i + 1} material`} options={MATERIALS.map((m) => ({ value: m, label: CREEP_MATERIAL_LABELS[m] }))} />
                <td className="px-1 py-0.5 text-center align-top">
                  <CheckboxCell name={`checks.${i}.cantilever`} label={`Check ${i + 1} cantilever`} />
                </td>
                <Cell name={`checks.${i}.span`} label={`Check ${i + 1} span`} placeholder="members' length" />
                <Cell name={`checks.${i}.claims`} label={`Check ${i + 1} claims`} wide />
                <RemoveCell onClick={() => checks.remove(i)} label={`Remove check ${i + 1}`} />
              </tr>
              <RowIssues issues={rowIssues("checks", i)} span={9} />
            </FragmentRows>
          ))}
        </Table>
        <Table caption="Displacements to find by the unit-load method" head={["Point (node, mid:AB, at:AB:6 ft)", "dof"]} onAdd={() => find.append({ node: "", dof: "y" })} addLabel="Point">
          {find.fields.map((f, i) => (
            <FragmentRows key={f.id}>
              <tr aria-label={`Find row ${i + 1}`}>
                <Cell name={`find.${i}.node`} label={`Find ${i + 1} point`} wide />
                <SelectCell name={`find.${i}.dof`} label={`Find ${i + 1} dof`} options={[{ value: "y", label: "y" }, { value: "x", label: "x" }, { value: "rz", label: "rotation" }]} />
                <RemoveCell onClick={() => find.remove(i)} label={`Remove point ${i + 1}`} />
              </tr>
              <RowIssues issues={rowIssues("find", i)} span={3} />
            </FragmentRows>
          ))}
        </Table>
      </Fieldset>
    </div>
  );
}

function CheckboxCell({ name, label }: { name: string; label: string }) {
  const { register } = useFormContext<FieldValues>();
  return <input type="checkbox" aria-label={label} className="mt-1.5 h-4 w-4 accent-accent" {...register(name)} />;
}

function FragmentRows({ children }: { children: ReactNode }) {
  return <>{children}</>;
}
