import { z } from "zod";
import { CLAIM_COMBOS, LIMIT_ROW_IDS, LOAD_CASES, checkMaterialSchema } from "@/lib/checks/claims";
import { DEFAULT_MATERIAL, materialSchema, resolveMaterial } from "@/lib/checks/materials";
import {
  DEFLECTION_UNITS,
  FORCE_UNITS,
  LENGTH_UNITS,
  LINE_LOAD_UNITS,
  isBlank,
  numberText,
  optionalNumberText,
  positiveText,
  q,
  type LengthUnit,
} from "@/lib/checks/quantities";
import { DEFAULT_SECTION, resolveSection, sectionSchema } from "@/lib/checks/sections";
import type { ModelFile } from "@/lib/solver/model-schema";

// The beam form: spans between supports, overhangs, loads by case measured from the beam's
// left end (downward positive, as calcs write gravity loads), one section and material, the
// Table 1604.3 row and the claimed deflections. `buildBeamModel` turns it into a model file.

export const BEAM_SUPPORTS = ["pin", "roller", "fixed"] as const;
export const BEAM_LOAD_TYPES = ["uniform", "point", "partial"] as const;
export const MAX_SPANS = 6;

export const SUPPORT_LABELS: Record<(typeof BEAM_SUPPORTS)[number], string> = {
  pin: "Pin (holds x and y)",
  roller: "Roller (holds y)",
  fixed: "Fixed (holds x, y and rotation)",
};

const beamLoadSchema = z.object({
  case: z.enum(LOAD_CASES, { error: "Choose the load case." }),
  type: z.enum(BEAM_LOAD_TYPES, { error: "Choose point, uniform or partial." }),
  /** uniform loads: "all" or a segment key (S1, S2, OL, OR) */
  on: z.string(),
  w: numberText("load"),
  wEnd: optionalNumberText("end intensity"),
  unit: z.string(),
  at: optionalNumberText("position"),
  from: optionalNumberText("start of the load"),
  to: optionalNumberText("end of the load"),
  note: z.string().max(200, { error: "Keep the note under 200 characters." }).optional(),
});

const claimSchema = z.object({
  segment: z.string(),
  combo: z.enum(CLAIM_COMBOS, { error: "Choose the load combination of the claim." }),
  delta: positiveText("claimed deflection"),
  unit: z.enum(DEFLECTION_UNITS),
  location: z.string().max(120).optional(),
});

export const beamFormSchema = z
  .object({
    lengthUnit: z.enum(LENGTH_UNITS),
    spans: z.array(z.object({ length: positiveText("span length") })).max(MAX_SPANS, { error: `At most ${MAX_SPANS} spans.` }),
    overhangLeft: optionalNumberText("left overhang"),
    overhangRight: optionalNumberText("right overhang"),
    supports: z.array(z.enum(BEAM_SUPPORTS, { error: "Choose the support." })),
    section: sectionSchema,
    material: materialSchema,
    includeShear: z.boolean(),
    loads: z.array(beamLoadSchema).max(40, { error: "At most 40 loads." }),
    row: z.enum(LIMIT_ROW_IDS, { error: "Choose the Table 1604.3 row." }),
    creepMaterial: checkMaterialSchema,
    claims: z.array(claimSchema).max(12),
  })
  .superRefine((f, ctx) => {
    const issue = (path: (string | number)[], message: string) => ctx.addIssue({ code: "custom", path, message });
    const ohL = isBlank(f.overhangLeft) ? 0 : Number(f.overhangLeft);
    const ohR = isBlank(f.overhangRight) ? 0 : Number(f.overhangRight);
    if (ohL < 0) issue(["overhangLeft"], "The overhang must not be negative.");
    if (ohR < 0) issue(["overhangRight"], "The overhang must not be negative.");
    if (f.spans.length === 0) {
      if (ohL <= 0 && ohR <= 0) issue(["spans"], "Add a span, or an overhang off a fixed support for a cantilever.");
      else if (ohL > 0 && ohR > 0) issue(["overhangRight"], "A cantilever without spans has one overhang: clear the other.");
      if (f.supports.length !== 1) issue(["supports"], "A cantilever has one support.");
      else if (f.supports[0] !== "fixed") issue(["supports", 0], "A cantilever needs a fixed support.");
    } else if (f.supports.length !== f.spans.length + 1) {
      issue(["supports"], `${f.spans.length} span${f.spans.length === 1 ? "" : "s"} need ${f.spans.length + 1} supports.`);
    }
    const segs = beamSegments(f);
    const total = segs.length ? (segs[segs.length - 1]?.end ?? 0) : 0;
    const keys = new Set(segs.map((s) => s.key));
    f.loads.forEach((l, i) => {
      const within = (v: string | undefined, key: "at" | "from" | "to", what: string) => {
        if (isBlank(v)) {
          issue(["loads", i, key], `Enter the ${what}, measured from the left end.`);
          return;
        }
        const x = Number(v);
        if (x < 0 || x > total + 1e-9) issue(["loads", i, key], `Must be between 0 and ${total} ${f.lengthUnit} (the beam's length).`);
      };
      if (l.type === "point") {
        if (!(FORCE_UNITS as readonly string[]).includes(l.unit)) issue(["loads", i, "unit"], "A point load is a force: lbf, kip, N or kN.");
        within(l.at, "at", "position of the load");
      } else {
        if (!(LINE_LOAD_UNITS as readonly string[]).includes(l.unit)) issue(["loads", i, "unit"], "A line load is a force per length: plf, klf, N/m or kN/m.");
        if (l.type === "uniform" && l.on !== "all" && !keys.has(l.on)) issue(["loads", i, "on"], "Choose the span the load is on.");
        if (l.type === "partial") {
          within(l.from, "from", "start of the load");
          within(l.to, "to", "end of the load");
          if (!isBlank(l.from) && !isBlank(l.to) && !(Number(l.to) > Number(l.from))) issue(["loads", i, "to"], "The end must be past the start.");
        }
      }
    });
    f.claims.forEach((c, i) => {
      if (!keys.has(c.segment)) issue(["claims", i, "segment"], "Choose the span the claim is for.");
    });
  });

export type BeamFormInput = z.infer<typeof beamFormSchema>;
export type BeamLoadInput = BeamFormInput["loads"][number];

export const DEFAULT_BEAM: BeamFormInput = {
  lengthUnit: "ft",
  spans: [{ length: "" }],
  overhangLeft: "",
  overhangRight: "",
  supports: ["pin", "roller"],
  section: DEFAULT_SECTION,
  material: DEFAULT_MATERIAL,
  includeShear: false,
  loads: [],
  row: "floor",
  creepMaterial: "sawn-dry",
  claims: [],
};

export interface BeamSegment {
  /** OL (left overhang), S1…Sn (spans), OR (right overhang) */
  key: string;
  label: string;
  /** member id in the model and its end nodes */
  member: string;
  startNode: string;
  endNode: string;
  /** from the beam's left end, in the form's length unit */
  start: number;
  end: number;
  cantilever: boolean;
}

const letter = (i: number): string => (i < 26 ? String.fromCharCode(65 + i) : `N${i + 1}`);

/** The beam's pieces left to right; node letters A, B, C… in order along the beam. */
export function beamSegments(f: Pick<BeamFormInput, "spans" | "overhangLeft" | "overhangRight">): BeamSegment[] {
  const out: BeamSegment[] = [];
  let x = 0;
  let node = 0;
  const push = (key: string, length: number, label: string, cantilever: boolean) => {
    const a = letter(node);
    const b = letter(node + 1);
    out.push({ key, label: `${label} ${a}–${b}`, member: `${a}${b}`, startNode: a, endNode: b, start: x, end: x + length, cantilever });
    x += length;
    node += 1;
  };
  const ohL = isBlank(f.overhangLeft) ? 0 : Number(f.overhangLeft);
  const ohR = isBlank(f.overhangRight) ? 0 : Number(f.overhangRight);
  if (ohL > 0) push("OL", ohL, "left overhang", true);
  f.spans.forEach((s, i) => push(`S${i + 1}`, Number(s.length) || 0, f.spans.length > 1 ? `span ${i + 1}` : "span", false));
  if (ohR > 0) push("OR", ohR, "right overhang", true);
  return out;
}

/** Where each support sits: node id and x from the left end (form length unit). */
export function beamSupportNodes(f: Pick<BeamFormInput, "spans" | "overhangLeft" | "overhangRight">): { node: string; x: number }[] {
  const segs = beamSegments(f);
  const first = segs.findIndex((s) => !s.cantilever);
  if (first < 0) {
    // cantilever only: the support is the node away from the tip
    const s = segs[0];
    if (!s) return [];
    return s.key === "OL" ? [{ node: s.endNode, x: s.end }] : [{ node: s.startNode, x: s.start }];
  }
  const spans = segs.filter((s) => !s.cantilever);
  return [{ node: spans[0]!.startNode, x: spans[0]!.start }, ...spans.map((s) => ({ node: s.endNode, x: s.end }))];
}

export interface BuiltModel {
  model: ModelFile & { loads: unknown[] };
  /** model-file path prefix → form field path, for putting the solver's messages on the right field */
  origin: Record<string, string>;
}

const down = (v: string | number): number => -Number(v);

/** The model file for a valid beam form (run `beamFormSchema` first). */
export function buildBeamModel(f: BeamFormInput, meta: { title: string; mark: string; description?: string }): BuiltModel {
  const u: LengthUnit = f.lengthUnit;
  const segs = beamSegments(f);
  const origin: Record<string, string> = { nodes: "spans", supports: "supports", members: "section" };
  const section = resolveSection(f.section);
  const material = resolveMaterial(f.material, f.includeShear);

  const nodes: Record<string, [string, string]> = {};
  for (const s of segs) {
    nodes[s.startNode] ??= [q(s.start, u), q(0, u)];
    nodes[s.endNode] = [q(s.end, u), q(0, u)];
  }

  const members: ModelFile["members"] = {};
  for (const s of segs) {
    const m: ModelFile["members"][string] = { ends: [s.startNode, s.endNode], E: material.E, I: section.I };
    if (section.A) m.A = section.A;
    if (f.includeShear && material.G && section.Av) m.shear = { G: material.G, Av: section.Av };
    m.note = `${section.label}; ${material.label}`;
    members[s.member] = m;
    origin[`members.${s.member}.E`] = "material";
    origin[`members.${s.member}.I`] = "section";
    origin[`members.${s.member}.A`] = "section";
    origin[`members.${s.member}.shear`] = "includeShear";
  }

  const supports: ModelFile["supports"] = {};
  beamSupportNodes(f).forEach((s, i) => {
    const kind = f.supports[i] ?? "roller";
    supports[s.node] = kind;
    origin[`supports.${s.node}`] = `supports.${i}`;
  });

  const loads: Record<string, unknown>[] = [];
  const add = (formIndex: number, load: Record<string, unknown>) => {
    origin[`loads[${loads.length}]`] = `loads.${formIndex}`;
    loads.push(load);
  };
  const eps = 1e-9 * Math.max(1, segs[segs.length - 1]?.end ?? 1);
  f.loads.forEach((l, i) => {
    const base = { case: l.case, ...(l.note ? { note: l.note } : {}) };
    if (l.type === "point") {
      const x = Number(l.at);
      const s = segs.find((g) => x >= g.start - eps && x <= g.end + eps) ?? segs[segs.length - 1];
      if (!s) return;
      add(i, { member: s.member, P: q(down(l.w), l.unit), at: q(Math.min(Math.max(x - s.start, 0), s.end - s.start), u), ...base });
      return;
    }
    if (l.type === "uniform") {
      for (const s of segs) if (l.on === "all" || l.on === s.key) add(i, { member: s.member, w: q(down(l.w), l.unit), ...base });
      return;
    }
    const x1 = Number(l.from);
    const x2 = Number(l.to);
    const w1 = Number(l.w);
    const w2 = isBlank(l.wEnd) ? w1 : Number(l.wEnd);
    const at = (x: number) => w1 + ((w2 - w1) * (x - x1)) / (x2 - x1);
    for (const s of segs) {
      const a = Math.max(x1, s.start);
      const b = Math.min(x2, s.end);
      if (!(b - a > eps)) continue;
      const full = a - s.start <= eps && s.end - b <= eps;
      const wa = at(a);
      const wb = at(b);
      const w = w1 === w2 ? q(-w1, l.unit) : [q(-wa, l.unit), q(-wb, l.unit)];
      add(i, { member: s.member, w, ...(full ? {} : { from: q(a - s.start, u), to: q(b - s.start, u) }), ...base });
    }
  });

  const find = segs.map((s) => (s.cantilever ? { node: s.key === "OL" ? s.startNode : s.endNode, dof: "y" as const } : { node: `mid:${s.member}`, dof: "y" as const }));

  const checks: NonNullable<ModelFile["checks"]> = [];
  segs.forEach((s, j) => {
    const claimed: { combo: string; delta: string; note?: string }[] = [];
    f.claims.forEach((c, ci) => {
      if (c.segment !== s.key) return;
      origin[`checks[${j}].claimed[${claimed.length}].combo`] = `claims.${ci}.combo`;
      origin[`checks[${j}].claimed[${claimed.length}].delta`] = `claims.${ci}.delta`;
      origin[`checks[${j}].claimed[${claimed.length}]`] = `claims.${ci}`;
      claimed.push({ combo: c.combo, delta: q(c.delta, c.unit), ...(c.location ? { note: c.location } : {}) });
    });
    origin[`checks[${j}].row`] = "row";
    origin[`checks[${j}]`] = "claims";
    checks.push({
      id: segs.length === 1 ? meta.mark : `${meta.mark} ${s.label}`,
      member: s.member,
      row: f.row,
      material: f.creepMaterial,
      ...(s.cantilever ? { cantilever: true } : {}),
      ...(claimed.length ? { claimed } : {}),
    });
  });

  const model: BuiltModel["model"] = {
    title: meta.title,
    ...(meta.description ? { description: meta.description } : {}),
    kind: "beam",
    nodes,
    members,
    supports,
    loads,
    find,
    checks,
  };
  return { model, origin };
}

/** The form field a solver message belongs to: the longest origin prefix of its path. */
export function fieldForPath(origin: Record<string, string>, path: string): string | null {
  let best: string | null = null;
  let bestLength = -1;
  for (const [prefix, field] of Object.entries(origin)) {
    const boundary = path.length === prefix.length || path[prefix.length] === "." || path[prefix.length] === "[";
    if (path.startsWith(prefix) && boundary && prefix.length > bestLength) {
      best = field;
      bestLength = prefix.length;
    }
  }
  return best;
}
