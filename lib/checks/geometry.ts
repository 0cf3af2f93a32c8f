import { toSi } from "@/lib/checks/quantities";

// The geometry of a model file for drawing it (SI: m, N). Tolerant: an entry that does not
// parse is left out of the drawing, never an error; the solver is the one that judges inputs.

export interface DrawNode {
  id: string;
  x: number;
  y: number;
}

export interface DrawMember {
  id: string;
  a: DrawNode;
  b: DrawNode;
  length: number;
  releases: ("start" | "end")[];
}

export type DrawSupport = { node: DrawNode; kind: "pin" | "roller" | "roller-x" | "fixed" | "custom"; dofs: string[] };

export type DrawLoad =
  | { type: "node"; node: DrawNode; fx: number; fy: number; case: string }
  | { type: "point"; member: DrawMember; at: number; p: number; local: boolean; case: string }
  | { type: "line"; member: DrawMember; a: number; b: number; wa: number; wb: number; local: boolean; case: string };

export interface Geometry {
  kind: string;
  nodes: DrawNode[];
  members: DrawMember[];
  supports: DrawSupport[];
  loads: DrawLoad[];
  /** bounding box of the nodes, m */
  box: { minX: number; maxX: number; minY: number; maxY: number };
}

type Loose = Record<string, unknown>;

const str = (v: unknown): string | null => (typeof v === "string" ? v : null);

export function modelGeometry(file: unknown): Geometry {
  const f = (file ?? {}) as Loose;
  const nodes: DrawNode[] = [];
  for (const [id, xy] of Object.entries((f.nodes ?? {}) as Record<string, unknown>)) {
    if (!Array.isArray(xy)) continue;
    const x = toSi(str(xy[0]) ?? "", "length");
    const y = toSi(str(xy[1]) ?? "", "length");
    if (x !== null && y !== null) nodes.push({ id, x, y });
  }
  const byId = new Map(nodes.map((n) => [n.id, n]));
  const members: DrawMember[] = [];
  for (const [id, raw] of Object.entries((f.members ?? {}) as Record<string, Loose>)) {
    const ends = Array.isArray(raw?.ends) ? raw.ends : [];
    const a = byId.get(String(ends[0]));
    const b = byId.get(String(ends[1]));
    if (!a || !b || a === b) continue;
    const rel = Array.isArray(raw.release) ? (raw.release.filter((r) => r === "start" || r === "end") as ("start" | "end")[]) : [];
    members.push({ id, a, b, length: Math.hypot(b.x - a.x, b.y - a.y), releases: rel });
  }
  const memberById = new Map(members.map((m) => [m.id, m]));
  const supports: DrawSupport[] = [];
  for (const [id, spec] of Object.entries((f.supports ?? {}) as Record<string, unknown>)) {
    const node = byId.get(id);
    if (!node) continue;
    if (spec === "pin" || spec === "roller" || spec === "roller-x" || spec === "fixed") supports.push({ node, kind: spec, dofs: [] });
    else if (Array.isArray(spec)) supports.push({ node, kind: "custom", dofs: spec.map(String) });
  }
  const loads: DrawLoad[] = [];
  for (const raw of Array.isArray(f.loads) ? (f.loads as Loose[]) : []) {
    const kase = str(raw?.case) ?? "D";
    const local = raw?.dir === "local";
    if (typeof raw?.node === "string" && !("settle" in raw)) {
      const node = byId.get(raw.node);
      const fx = raw.Fx === undefined ? 0 : toSi(str(raw.Fx) ?? "", "force");
      const fy = raw.Fy === undefined ? 0 : toSi(str(raw.Fy) ?? "", "force");
      if (node && fx !== null && fy !== null && (fx !== 0 || fy !== 0)) loads.push({ type: "node", node, fx, fy, case: kase });
      continue;
    }
    const member = typeof raw?.member === "string" ? memberById.get(raw.member) : undefined;
    if (!member) continue;
    if (raw.P !== undefined) {
      const p = toSi(str(raw.P) ?? "", "force");
      const at = toSi(str(raw.at) ?? "", "length");
      if (p !== null && at !== null) loads.push({ type: "point", member, at, p, local, case: kase });
    } else if (raw.w !== undefined) {
      const [wa, wb] = Array.isArray(raw.w) ? [toSi(str(raw.w[0]) ?? "", "lineLoad"), toSi(str(raw.w[1]) ?? "", "lineLoad")] : [toSi(str(raw.w) ?? "", "lineLoad"), toSi(str(raw.w) ?? "", "lineLoad")];
      const a = raw.from === undefined ? 0 : toSi(str(raw.from) ?? "", "length");
      const b = raw.to === undefined ? member.length : toSi(str(raw.to) ?? "", "length");
      if (wa !== null && wb !== null && a !== null && b !== null) loads.push({ type: "line", member, a, b, wa, wb, local, case: kase });
    }
  }
  const xs = nodes.map((n) => n.x);
  const ys = nodes.map((n) => n.y);
  const box = nodes.length
    ? { minX: Math.min(...xs), maxX: Math.max(...xs), minY: Math.min(...ys), maxY: Math.max(...ys) }
    : { minX: 0, maxX: 1, minY: 0, maxY: 0 };
  return { kind: str(f.kind) ?? "beam", nodes, members, supports, loads, box };
}
