import { IssueList, SolverInputError } from "@/lib/solver/errors";
import { modelFileSchema, zodIssues, type ModelFile } from "@/lib/solver/model-schema";
import { parseChecks, type ParsedCheck } from "@/lib/solver/parse-checks";
import { parseFind, parseLoads } from "@/lib/solver/parse-loads";
import type { ParsedMember, ParsedModel, ParsedNode, ParsedSupport } from "@/lib/solver/types";
import { parseQuantity, type QuantityKind } from "@/lib/solver/units";

/** Everything `solve` needs from a model file: the shared parsed model plus the deflection checks. */
export interface ParsedInput {
  model: ParsedModel;
  checks: ParsedCheck[];
}

/** Reads one quantity into SI, recording a path-named issue on failure. */
function readQuantity(
  issues: IssueList,
  path: string,
  text: string | undefined,
  kind: QuantityKind,
): number | undefined {
  if (text === undefined) return undefined;
  const r = parseQuantity(text, kind);
  if (!r.ok) {
    issues.add(path, r.message);
    return undefined;
  }
  return r.si;
}

function positive(issues: IssueList, path: string, value: number | undefined): number | undefined {
  if (value === undefined) return undefined;
  if (!(value > 0)) {
    issues.add(path, "must be greater than zero");
    return undefined;
  }
  return value;
}

function parseNodes(file: ModelFile, issues: IssueList): { nodes: ParsedNode[]; lengthUnit: string } {
  const nodes: ParsedNode[] = [];
  let lengthUnit = "m";
  let first = true;
  for (const [id, [xs, ys]] of Object.entries(file.nodes)) {
    const x = readQuantity(issues, `nodes.${id}[0]`, xs, "length");
    const y = readQuantity(issues, `nodes.${id}[1]`, ys, "length");
    if (first) {
      const r = parseQuantity(xs, "length");
      if (r.ok) lengthUnit = r.unit;
      first = false;
    }
    if (x !== undefined && y !== undefined) nodes.push({ id, x, y });
  }
  if (Object.keys(file.nodes).length === 0) issues.add("nodes", "must hold at least two nodes");
  // Coincidence within 1e-9 of the model's extent (m): sort by x and sweep, O(n log n).
  let extent = 0;
  for (const n of nodes) extent = Math.max(extent, Math.abs(n.x), Math.abs(n.y));
  const tol = Math.max(extent, 1) * 1e-9;
  const order = nodes.map((_, i) => i).sort((a, b) => (nodes[a]?.x ?? 0) - (nodes[b]?.x ?? 0));
  const fileIndex = new Map(nodes.map((n, i) => [n.id, i]));
  const reported = new Set<string>();
  for (let i = 0; i < order.length; i++) {
    const a = nodes[order[i] ?? 0];
    if (!a) continue;
    for (let j = i + 1; j < order.length; j++) {
      const b = nodes[order[j] ?? 0];
      if (!b || b.x - a.x > tol) break;
      if (Math.abs(b.y - a.y) <= tol) {
        const [early, late] = (fileIndex.get(a.id) ?? 0) < (fileIndex.get(b.id) ?? 0) ? [a, b] : [b, a];
        if (!reported.has(late.id)) issues.add(`nodes.${late.id}`, `coincides with node ${early.id}`);
        reported.add(late.id);
      }
    }
  }
  return { nodes, lengthUnit };
}

function parseMembers(file: ModelFile, nodes: Map<string, ParsedNode>, issues: IssueList): ParsedMember[] {
  const members: ParsedMember[] = [];
  const truss = file.kind === "truss";
  for (const [id, m] of Object.entries(file.members)) {
    const p = `members.${id}`;
    const [s, e] = m.ends;
    const a = nodes.get(s);
    const b = nodes.get(e);
    let endsOk = true;
    for (const [k, end] of m.ends.entries()) {
      if (!(end in file.nodes)) {
        issues.add(`${p}.ends[${k}]`, `unknown node "${end}"`);
        endsOk = false;
      }
    }
    if (endsOk && s === e) {
      issues.add(`${p}.ends`, `both ends are node ${s}`);
      endsOk = false;
    }
    const E = positive(issues, `${p}.E`, readQuantity(issues, `${p}.E`, m.E, "modulus"));
    const A = positive(issues, `${p}.A`, readQuantity(issues, `${p}.A`, m.A, "area"));
    let I: number | undefined;
    if (truss) {
      if (m.A === undefined) issues.add(`${p}.A`, "is required for a truss member");
      if (m.release !== undefined) issues.add(`${p}.release`, "truss members are pin-ended already; remove it");
      if (m.shear !== undefined) issues.add(`${p}.shear`, "truss members carry axial force only; remove it");
    } else {
      if (m.I === undefined) issues.add(`${p}.I`, "is required for a beam or frame member");
      I = positive(issues, `${p}.I`, readQuantity(issues, `${p}.I`, m.I, "inertia"));
    }
    let shear: ParsedMember["shear"];
    if (m.shear && !truss) {
      const G = positive(issues, `${p}.shear.G`, readQuantity(issues, `${p}.shear.G`, m.shear.G, "modulus"));
      const Av = positive(issues, `${p}.shear.Av`, readQuantity(issues, `${p}.shear.Av`, m.shear.Av, "area"));
      if (G !== undefined && Av !== undefined) shear = { G, Av };
    }
    if (!endsOk || !a || !b || E === undefined) continue;
    const dx = b.x - a.x;
    const dy = b.y - a.y;
    const length = Math.hypot(dx, dy);
    if (!(length > 0)) continue; // reported as coincident nodes
    const member: ParsedMember = {
      id,
      start: s,
      end: e,
      E,
      releaseStart: m.release?.includes("start") ?? false,
      releaseEnd: m.release?.includes("end") ?? false,
      length,
      cos: dx / length,
      sin: dy / length,
    };
    if (I !== undefined) member.I = I;
    if (A !== undefined) member.A = A;
    if (shear) member.shear = shear;
    members.push(member);
  }
  if (Object.keys(file.members).length === 0) issues.add("members", "must hold at least one member");
  return members;
}

const NAMED_SUPPORTS: Record<string, { x: boolean; y: boolean; rz: boolean }> = {
  pin: { x: true, y: true, rz: false },
  roller: { x: false, y: true, rz: false },
  "roller-x": { x: true, y: false, rz: false },
  fixed: { x: true, y: true, rz: true },
};

function parseSupports(file: ModelFile, issues: IssueList): ParsedSupport[] {
  const supports: ParsedSupport[] = [];
  for (const [node, spec] of Object.entries(file.supports)) {
    const p = `supports.${node}`;
    if (!(node in file.nodes)) {
      issues.add(p, `unknown node "${node}"`);
      continue;
    }
    const held = typeof spec === "string" ? NAMED_SUPPORTS[spec] : undefined;
    const s = held ?? { x: false, y: false, rz: false };
    if (typeof spec !== "string") for (const d of spec) s[d] = true;
    if (file.kind === "truss" && s.rz) {
      issues.add(p, 'a truss node has no rotation to hold; use "pin", "roller" or ["x", "y"]');
      continue;
    }
    supports.push({ node, ...s });
  }
  return supports;
}

/**
 * Validates a model file and converts it to SI. Throws SolverInputError listing every
 * problem found, each with the field's path. Stability is checked later, when the
 * equilibrium matrix is factored (see stability.ts).
 */
export function parseModel(input: unknown): ParsedInput {
  const shape = modelFileSchema.safeParse(input);
  if (!shape.success) throw new SolverInputError(zodIssues(shape.error));
  const file = shape.data;
  const issues = new IssueList();
  const { nodes, lengthUnit } = parseNodes(file, issues);
  const nodeMap = new Map(nodes.map((n) => [n.id, n]));
  const members = parseMembers(file, nodeMap, issues);
  const connected = new Set<string>();
  for (const m of Object.values(file.members)) for (const e of m.ends) connected.add(e);
  for (const id of Object.keys(file.nodes)) if (!connected.has(id)) issues.add(`nodes.${id}`, "is not connected to any member");
  const supports = parseSupports(file, issues);
  if (supports.length === 0 && Object.keys(file.supports).length === 0) {
    issues.add("supports", "must hold at least one support");
  }
  const memberMap = new Map(members.map((m) => [m.id, m]));
  const ctx = { kind: file.kind, nodes: nodeMap, members: memberMap, supports, fileMembers: file.members, issues };
  const loads = parseLoads(file.loads ?? [], ctx);
  const find = parseFind(file.find ?? [], ctx);
  const checks = parseChecks(file.checks ?? [], ctx);
  issues.throwIfAny();
  return {
    model: {
      title: file.title ?? "",
      kind: file.kind,
      nodes,
      members,
      supports,
      loads,
      find,
      displayLengthUnit: lengthUnit,
    },
    checks,
  };
}
