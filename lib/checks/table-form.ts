import { z } from "zod";
import type { BuiltModel } from "@/lib/checks/beam-form";
import { LIMIT_ROW_IDS, LOAD_CASES, checkMaterialSchema } from "@/lib/checks/claims";
import { claimsToText, parseClaimsText } from "@/lib/checks/claims-text";
import {
  AREA_UNITS,
  FORCE_UNITS,
  INERTIA_UNITS,
  LENGTH_UNITS,
  LINE_LOAD_UNITS,
  MODULUS_UNITS,
  isBlank,
  numberText,
  optionalNumberText,
  q,
  siPerUnit,
  tidy,
} from "@/lib/checks/quantities";
import type { ModelFile } from "@/lib/solver/model-schema";
import type { QuantityKind } from "@/lib/solver/units";

// The truss and frame editor: tables of nodes, members, supports, loads and checks, one unit
// per column (chosen above the table). Each row becomes one entry of the model file, so a
// message from the solver about an entry lands on its row.

export const TABLE_KINDS = ["beam", "truss", "frame"] as const;
export const TABLE_SUPPORTS = ["pin", "roller", "roller-x", "fixed"] as const;
export const TABLE_LOAD_TYPES = ["node", "line", "point"] as const;
export const RELEASES = ["none", "start", "end", "both"] as const;

const ID = /^[A-Za-z0-9_-]{1,12}$/;
const idText = (what: string) =>
  z
    .string({ error: `Enter the ${what}.` })
    .trim()
    .min(1, { error: `Enter the ${what}.` })
    .regex(ID, { error: "Letters, digits, - and _ only (at most 12)." });

const nodeRow = z.object({ id: idText("node id"), x: numberText("x"), y: numberText("y") });
const memberRow = z.object({
  id: idText("member id"),
  start: idText("start node"),
  end: idText("end node"),
  E: numberText("E"),
  I: optionalNumberText("I"),
  A: optionalNumberText("A"),
  release: z.enum(RELEASES),
});
const supportRow = z.object({ node: idText("node"), type: z.enum(TABLE_SUPPORTS, { error: "Choose the support." }) });
const loadRow = z.object({
  type: z.enum(TABLE_LOAD_TYPES, { error: "Choose the load type." }),
  target: idText("node or member"),
  case: z.enum(LOAD_CASES, { error: "Choose the load case." }),
  /** node loads: Fx, Fy; line loads: w (and wEnd); point loads: P. Signs as the axes: y up. */
  fx: optionalNumberText("Fx"),
  fy: optionalNumberText("Fy"),
  w: optionalNumberText("w"),
  wEnd: optionalNumberText("w at the end"),
  from: optionalNumberText("from"),
  to: optionalNumberText("to"),
  P: optionalNumberText("P"),
  at: optionalNumberText("at"),
  dir: z.enum(["global", "local"]),
  per: z.enum(["member", "horizontal"]),
});
const checkRow = z.object({
  by: z.enum(["members", "point"]),
  /** member ids separated by commas, or a point: node id, mid:AB, at:AB:6 ft */
  target: z.string().trim().min(1, { error: "Name the member(s) or the point." }),
  dof: z.enum(["x", "y"]),
  row: z.enum(LIMIT_ROW_IDS, { error: "Choose the Table 1604.3 row." }),
  material: checkMaterialSchema,
  cantilever: z.boolean(),
  span: optionalNumberText("span"),
  claims: z.string().max(200),
});
const findRow = z.object({ node: z.string().trim().min(1, { error: "Name the point." }), dof: z.enum(["x", "y", "rz"]) });

export const tableFormSchema = z
  .object({
    kind: z.enum(TABLE_KINDS),
    units: z.object({
      length: z.enum(LENGTH_UNITS),
      modulus: z.enum(MODULUS_UNITS),
      inertia: z.enum(INERTIA_UNITS),
      area: z.enum(AREA_UNITS),
      force: z.enum(FORCE_UNITS),
      lineLoad: z.enum(LINE_LOAD_UNITS),
    }),
    nodes: z.array(nodeRow).min(2, { error: "A structure needs at least two nodes." }).max(200),
    members: z.array(memberRow).min(1, { error: "Add at least one member." }).max(400),
    supports: z.array(supportRow).min(1, { error: "Add at least one support." }).max(200),
    loads: z.array(loadRow).max(400),
    checks: z.array(checkRow).max(40),
    find: z.array(findRow).max(40),
  })
  .superRefine((t, ctx) => {
    const issue = (path: (string | number)[], message: string) => ctx.addIssue({ code: "custom", path, message });
    const nodeIds = new Set<string>();
    t.nodes.forEach((n, i) => {
      if (nodeIds.has(n.id)) issue(["nodes", i, "id"], `Node ${n.id} is listed twice.`);
      nodeIds.add(n.id);
    });
    const memberIds = new Set<string>();
    t.members.forEach((m, i) => {
      if (memberIds.has(m.id)) issue(["members", i, "id"], `Member ${m.id} is listed twice.`);
      memberIds.add(m.id);
      if (!nodeIds.has(m.start)) issue(["members", i, "start"], `No node ${m.start}.`);
      if (!nodeIds.has(m.end)) issue(["members", i, "end"], `No node ${m.end}.`);
      if (m.start === m.end) issue(["members", i, "end"], "Both ends are the same node.");
      if (t.kind === "truss" && isBlank(m.A)) issue(["members", i, "A"], "A truss member needs its area A.");
      if (t.kind !== "truss" && isBlank(m.I)) issue(["members", i, "I"], "A beam or frame member needs I.");
      if (t.kind === "truss" && m.release !== "none") issue(["members", i, "release"], "Truss members are pin-ended already.");
    });
    const supported = new Set<string>();
    t.supports.forEach((s, i) => {
      if (!nodeIds.has(s.node)) issue(["supports", i, "node"], `No node ${s.node}.`);
      if (supported.has(s.node)) issue(["supports", i, "node"], `Node ${s.node} already has a support.`);
      if (t.kind === "truss" && s.type === "fixed") issue(["supports", i, "type"], "A truss node has no rotation to hold: use pin or roller.");
      supported.add(s.node);
    });
    t.loads.forEach((l, i) => {
      const need = (key: "fy" | "w" | "P" | "at", what: string) => isBlank(l[key]) && issue(["loads", i, key], `Enter ${what}.`);
      if (l.type === "node") {
        if (!nodeIds.has(l.target)) issue(["loads", i, "target"], `No node ${l.target}.`);
        if (isBlank(l.fx) && isBlank(l.fy)) issue(["loads", i, "fy"], "Enter Fx, Fy or both.");
      } else {
        if (!memberIds.has(l.target)) issue(["loads", i, "target"], `No member ${l.target}.`);
        if (t.kind === "truss") issue(["loads", i, "type"], "Truss loads act at the nodes: use a node load.");
        if (l.type === "line") need("w", "the intensity w");
        else {
          need("P", "the force P");
          need("at", "where the load is, from the member's first end");
        }
      }
    });
    t.checks.forEach((c, i) => {
      if (c.by === "members") {
        for (const id of splitIds(c.target)) if (!memberIds.has(id)) issue(["checks", i, "target"], `No member ${id}.`);
      } else if (isBlank(c.span)) issue(["checks", i, "span"], "A check at a point needs the span.");
      const claims = parseClaimsText(c.claims);
      if (!claims.ok) issue(["checks", i, "claims"], claims.message);
    });
  });

export type TableFormInput = z.infer<typeof tableFormSchema>;
export type TableLoadRow = TableFormInput["loads"][number];

export const splitIds = (text: string): string[] =>
  text
    .split(/[,\s]+/)
    .map((s) => s.trim())
    .filter((s) => s !== "");

export const EMPTY_LOAD: TableLoadRow = { type: "node", target: "", case: "D", fx: "", fy: "", w: "", wEnd: "", from: "", to: "", P: "", at: "", dir: "global", per: "member" };

export const DEFAULT_TABLE: TableFormInput = {
  kind: "truss",
  units: { length: "ft", modulus: "ksi", inertia: "in^4", area: "in^2", force: "kip", lineLoad: "plf" },
  nodes: [
    { id: "L0", x: "0", y: "0" },
    { id: "L1", x: "12", y: "0" },
    { id: "L2", x: "24", y: "0" },
    { id: "U1", x: "12", y: "6" },
  ],
  members: [
    { id: "B1", start: "L0", end: "L1", E: "29000", I: "", A: "2", release: "none" },
    { id: "B2", start: "L1", end: "L2", E: "29000", I: "", A: "2", release: "none" },
    { id: "T1", start: "L0", end: "U1", E: "29000", I: "", A: "2", release: "none" },
    { id: "T2", start: "U1", end: "L2", E: "29000", I: "", A: "2", release: "none" },
    { id: "V1", start: "L1", end: "U1", E: "29000", I: "", A: "1", release: "none" },
  ],
  supports: [
    { node: "L0", type: "pin" },
    { node: "L2", type: "roller" },
  ],
  loads: [{ ...EMPTY_LOAD, target: "U1", fy: "-4" }],
  checks: [{ by: "point", target: "L1", dof: "y", row: "roof-no-ceiling", material: "steel", cantilever: false, span: "24", claims: "" }],
  find: [{ node: "L1", dof: "y" }],
};

/** The model file for a valid table form (run `tableFormSchema` first). */
export function buildTableModel(t: TableFormInput, meta: { title: string; description?: string }): BuiltModel {
  const u = t.units;
  const origin: Record<string, string> = { nodes: "nodes", members: "members", supports: "supports", loads: "loads", checks: "checks", find: "find" };
  const nodes: ModelFile["nodes"] = {};
  t.nodes.forEach((n, i) => {
    nodes[n.id] = [q(n.x, u.length), q(n.y, u.length)];
    origin[`nodes.${n.id}`] = `nodes.${i}.id`;
    origin[`nodes.${n.id}[0]`] = `nodes.${i}.x`;
    origin[`nodes.${n.id}[1]`] = `nodes.${i}.y`;
  });
  const members: ModelFile["members"] = {};
  t.members.forEach((m, i) => {
    const row: ModelFile["members"][string] = { ends: [m.start, m.end], E: q(m.E, u.modulus) };
    if (!isBlank(m.I) && t.kind !== "truss") row.I = q(m.I ?? "", u.inertia);
    if (!isBlank(m.A)) row.A = q(m.A ?? "", u.area);
    if (m.release !== "none" && t.kind !== "truss") row.release = m.release === "both" ? ["start", "end"] : [m.release];
    members[m.id] = row;
    origin[`members.${m.id}`] = `members.${i}.id`;
    for (const k of ["E", "I", "A", "release"] as const) origin[`members.${m.id}.${k}`] = `members.${i}.${k}`;
    origin[`members.${m.id}.ends`] = `members.${i}.start`;
    origin[`members.${m.id}.ends[0]`] = `members.${i}.start`;
    origin[`members.${m.id}.ends[1]`] = `members.${i}.end`;
  });
  const supports: ModelFile["supports"] = {};
  t.supports.forEach((s, i) => {
    supports[s.node] = s.type;
    origin[`supports.${s.node}`] = `supports.${i}.type`;
  });
  const loads: Record<string, unknown>[] = t.loads.map((l, i) => {
    const p = `loads[${i}]`;
    origin[p] = `loads.${i}.target`;
    const base = { case: l.case };
    if (l.type === "node") {
      for (const [k, f] of [["Fx", "fx"], ["Fy", "fy"], ["node", "target"]] as const) origin[`${p}.${k}`] = `loads.${i}.${f}`;
      return {
        node: l.target,
        ...(isBlank(l.fx) ? {} : { Fx: q(l.fx ?? "", u.force) }),
        ...(isBlank(l.fy) ? {} : { Fy: q(l.fy ?? "", u.force) }),
        ...base,
      };
    }
    origin[`${p}.member`] = `loads.${i}.target`;
    const dir = l.dir === "local" ? { dir: "local" } : {};
    if (l.type === "point") {
      origin[`${p}.P`] = `loads.${i}.P`;
      origin[`${p}.at`] = `loads.${i}.at`;
      return { member: l.target, P: q(l.P ?? "", u.force), at: q(l.at ?? "", u.length), ...dir, ...base };
    }
    for (const k of ["w", "from", "to"] as const) origin[`${p}.${k}`] = `loads.${i}.${k}`;
    const w = isBlank(l.wEnd) ? q(l.w ?? "", u.lineLoad) : [q(l.w ?? "", u.lineLoad), q(l.wEnd ?? "", u.lineLoad)];
    return {
      member: l.target,
      w,
      ...(isBlank(l.from) ? {} : { from: q(l.from ?? "", u.length) }),
      ...(isBlank(l.to) ? {} : { to: q(l.to ?? "", u.length) }),
      ...dir,
      ...(l.per === "horizontal" ? { per: "horizontal" } : {}),
      ...base,
    };
  });
  const checks: NonNullable<ModelFile["checks"]> = t.checks.map((c, i) => {
    const p = `checks[${i}]`;
    origin[p] = `checks.${i}.target`;
    for (const k of ["member", "members", "at"]) origin[`${p}.${k}`] = `checks.${i}.target`;
    origin[`${p}.row`] = `checks.${i}.row`;
    origin[`${p}.span`] = `checks.${i}.span`;
    origin[`${p}.claimed`] = `checks.${i}.claims`;
    const parsed = parseClaimsText(c.claims);
    const claimed = parsed.ok ? parsed.claims : [];
    const ids = splitIds(c.target);
    const where = c.by === "point" ? { at: { node: c.target, dof: c.dof } } : ids.length === 1 ? { member: ids[0] ?? "" } : { members: ids };
    return {
      id: c.by === "point" ? `${c.target} ${c.dof}` : ids.join("+"),
      ...where,
      row: c.row,
      material: c.material,
      ...(c.cantilever ? { cantilever: true } : {}),
      ...(isBlank(c.span) ? {} : { span: q(c.span ?? "", u.length) }),
      ...(claimed.length ? { claimed } : {}),
    };
  });
  const find = t.find.map((f, i) => {
    origin[`find[${i}]`] = `find.${i}.node`;
    return { node: f.node, dof: f.dof };
  });
  return {
    model: { title: meta.title, ...(meta.description ? { description: meta.description } : {}), kind: t.kind, nodes, members, supports, loads, find, checks },
    origin,
  };
}

// ---- a model file back into the tables, so an applicant's model need not be re-typed

const NUMBER_UNIT = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/;

function splitQuantity(text: unknown): { value: string; unit: string } | null {
  if (typeof text !== "string") return null;
  const m = NUMBER_UNIT.exec(text);
  if (!m?.[1] || !m[2]) return null;
  return { value: m[1], unit: m[2] };
}

/** Most frequent unit among the strings, or the fallback. */
function commonUnit(texts: unknown[], allowed: readonly string[], fallback: string): string {
  const counts = new Map<string, number>();
  for (const t of texts) {
    const s = splitQuantity(t);
    if (s && allowed.includes(s.unit)) counts.set(s.unit, (counts.get(s.unit) ?? 0) + 1);
  }
  let best = fallback;
  let n = 0;
  for (const [u, c] of counts) if (c > n) [best, n] = [u, c];
  return best;
}

export interface TableFromModel {
  input: TableFormInput;
  title: string;
  /** what the tables cannot hold (the JSON mode keeps the whole file) */
  unsupported: string[];
}

type Loose = Record<string, unknown>;

/**
 * Puts a model file into the tables. Values in the column's unit are kept as written;
 * others are converted exactly through SI. Entries the tables have no column for are listed.
 */
export function modelToTable(file: unknown): TableFromModel {
  const f = (file ?? {}) as Loose;
  const unsupported: string[] = [];
  const nodesIn = (f.nodes ?? {}) as Record<string, unknown[]>;
  const membersIn = (f.members ?? {}) as Record<string, Loose>;
  const supportsIn = (f.supports ?? {}) as Record<string, unknown>;
  const loadsIn = (Array.isArray(f.loads) ? f.loads : []) as Loose[];
  const checksIn = (Array.isArray(f.checks) ? f.checks : []) as Loose[];
  const findIn = (Array.isArray(f.find) ? f.find : []) as Loose[];
  const kind = (TABLE_KINDS as readonly string[]).includes(String(f.kind)) ? (f.kind as TableFormInput["kind"]) : "frame";
  const mvals = Object.values(membersIn);
  const units: TableFormInput["units"] = {
    length: commonUnit(Object.values(nodesIn).flat(), LENGTH_UNITS, "ft") as TableFormInput["units"]["length"],
    modulus: commonUnit(mvals.map((m) => m.E), MODULUS_UNITS, "ksi") as TableFormInput["units"]["modulus"],
    inertia: commonUnit(mvals.map((m) => m.I), INERTIA_UNITS, "in^4") as TableFormInput["units"]["inertia"],
    area: commonUnit(mvals.map((m) => m.A), AREA_UNITS, "in^2") as TableFormInput["units"]["area"],
    force: commonUnit(loadsIn.flatMap((l) => [l.Fx, l.Fy, l.P]), FORCE_UNITS, "kip") as TableFormInput["units"]["force"],
    lineLoad: commonUnit(loadsIn.flatMap((l) => (Array.isArray(l.w) ? l.w : [l.w])), LINE_LOAD_UNITS, "plf") as TableFormInput["units"]["lineLoad"],
  };
  const inUnit = (text: unknown, unit: string, kind: QuantityKind, where: string): string => {
    if (text === undefined) return "";
    const s = splitQuantity(text);
    if (!s) {
      unsupported.push(`${where}: "${String(text)}" is not a number with a unit`);
      return "";
    }
    if (s.unit === unit) return s.value;
    try {
      return tidy((Number(s.value) * siPerUnit(s.unit, kind)) / siPerUnit(unit, kind));
    } catch {
      unsupported.push(`${where}: unit "${s.unit}" is not known`);
      return "";
    }
  };
  const nodes = Object.entries(nodesIn).map(([id, xy]) => ({
    id,
    x: inUnit(xy?.[0], units.length, "length", `nodes.${id}[0]`),
    y: inUnit(xy?.[1], units.length, "length", `nodes.${id}[1]`),
  }));
  const members = Object.entries(membersIn).map(([id, m]) => {
    const ends = (Array.isArray(m.ends) ? m.ends : []) as string[];
    const rel = Array.isArray(m.release) ? (m.release as string[]) : [];
    if (m.shear) unsupported.push(`members.${id}.shear: the tables have no shear columns`);
    return {
      id,
      start: String(ends[0] ?? ""),
      end: String(ends[1] ?? ""),
      E: inUnit(m.E, units.modulus, "modulus", `members.${id}.E`),
      I: inUnit(m.I, units.inertia, "inertia", `members.${id}.I`),
      A: inUnit(m.A, units.area, "area", `members.${id}.A`),
      release: (rel.includes("start") && rel.includes("end") ? "both" : rel.includes("start") ? "start" : rel.includes("end") ? "end" : "none") as TableFormInput["members"][number]["release"],
    };
  });
  const supports: TableFormInput["supports"] = [];
  for (const [node, type] of Object.entries(supportsIn)) {
    if (typeof type === "string" && (TABLE_SUPPORTS as readonly string[]).includes(type)) supports.push({ node, type: type as (typeof TABLE_SUPPORTS)[number] });
    else unsupported.push(`supports.${node}: ${JSON.stringify(type)} has no row type; use the model file`);
  }
  const loads: TableLoadRow[] = [];
  loadsIn.forEach((l, i) => {
    const where = `loads[${i}]`;
    const kase = (LOAD_CASES as readonly string[]).includes(String(l.case ?? "D")) ? (String(l.case ?? "D") as TableLoadRow["case"]) : null;
    if (!kase) {
      unsupported.push(`${where}: load case "${String(l.case)}" has no column`);
      return;
    }
    const row: TableLoadRow = { ...EMPTY_LOAD, case: kase, dir: l.dir === "local" ? "local" : "global", per: l.per === "horizontal" ? "horizontal" : "member" };
    if (typeof l.node === "string" && !("settle" in l) && l.M === undefined) {
      loads.push({ ...row, type: "node", target: l.node, fx: inUnit(l.Fx, units.force, "force", `${where}.Fx`), fy: inUnit(l.Fy, units.force, "force", `${where}.Fy`) });
    } else if (typeof l.member === "string" && l.w !== undefined) {
      const [wa, wb] = Array.isArray(l.w) ? l.w : [l.w, undefined];
      loads.push({
        ...row,
        type: "line",
        target: l.member,
        w: inUnit(wa, units.lineLoad, "lineLoad", `${where}.w`),
        wEnd: wb === undefined ? "" : inUnit(wb, units.lineLoad, "lineLoad", `${where}.w`),
        from: inUnit(l.from, units.length, "length", `${where}.from`),
        to: inUnit(l.to, units.length, "length", `${where}.to`),
      });
    } else if (typeof l.member === "string" && l.P !== undefined) {
      loads.push({ ...row, type: "point", target: l.member, P: inUnit(l.P, units.force, "force", `${where}.P`), at: inUnit(l.at, units.length, "length", `${where}.at`) });
    } else {
      unsupported.push(`${where}: this kind of load (moment, temperature, misfit or settlement) has no row; use the model file`);
    }
  });
  const checks: TableFormInput["checks"] = checksIn.map((c) => {
    const at = c.at as Loose | undefined;
    const claimed = (Array.isArray(c.claimed) ? c.claimed : []) as { combo: string; delta: string }[];
    return {
      by: at ? "point" : "members",
      target: at ? String(at.node ?? "") : typeof c.member === "string" ? c.member : ((c.members as string[] | undefined) ?? []).join(", "),
      dof: at?.dof === "x" ? "x" : "y",
      row: (LIMIT_ROW_IDS as readonly string[]).includes(String(c.row)) ? (String(c.row) as TableFormInput["checks"][number]["row"]) : "floor",
      material: (typeof c.material === "string" ? c.material : "other") as TableFormInput["checks"][number]["material"],
      cantilever: c.cantilever === true,
      span: inUnit(c.span, units.length, "length", "checks.span"),
      claims: claimsToText(claimed),
    };
  });
  const find = findIn.map((x) => ({ node: String(x.node ?? ""), dof: (x.dof === "x" || x.dof === "rz" ? x.dof : "y") as "x" | "y" | "rz" }));
  return { input: { kind, units, nodes, members, supports, loads, checks, find }, title: typeof f.title === "string" ? f.title : "", unsupported };
}
