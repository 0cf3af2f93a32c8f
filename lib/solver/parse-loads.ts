import type { IssueList } from "@/lib/solver/errors";
import { loadSchemas, zodIssues, type LoadShape } from "@/lib/solver/model-schema";
import type {
  Dof,
  ParsedFind,
  ParsedLoad,
  ParsedLocation,
  ParsedMember,
  ParsedNode,
  ParsedSupport,
  StructureKind,
} from "@/lib/solver/types";
import { formatNumber, metresPerUnit, parseQuantity, type QuantityKind } from "@/lib/solver/units";

export interface ParseContext {
  kind: StructureKind;
  nodes: Map<string, ParsedNode>;
  members: Map<string, ParsedMember>;
  supports: ParsedSupport[];
  /** ids as written in the file, so a member that failed its own checks is not "unknown" */
  fileMembers: Record<string, unknown>;
  issues: IssueList;
}

function read(ctx: ParseContext, path: string, text: string | undefined, kind: QuantityKind): number | undefined {
  if (text === undefined) return undefined;
  const r = parseQuantity(text, kind);
  if (!r.ok) {
    ctx.issues.add(path, r.message);
    return undefined;
  }
  return r.si;
}

/** The member a load or find names; undefined (with an issue if it is unknown) when unusable. */
function memberOf(ctx: ParseContext, path: string, id: string): ParsedMember | undefined {
  if (!(id in ctx.fileMembers)) {
    ctx.issues.add(path, `unknown member "${id}"`);
    return undefined;
  }
  return ctx.members.get(id);
}

/** A distance along a member (m), refused outside [0, L] with the length in the text's own unit. */
export function readPosition(ctx: ParseContext, path: string, text: string, member: ParsedMember): number | undefined {
  const r = parseQuantity(text, "length");
  if (!r.ok) {
    ctx.issues.add(path, r.message);
    return undefined;
  }
  const L = member.length;
  const tol = 1e-9 * L;
  if (r.si < -tol || r.si > L + tol) {
    const per = metresPerUnit(r.unit) ?? 1;
    ctx.issues.add(path, `"${text}" is outside member ${member.id} (length ${formatNumber(L / per)} ${r.unit})`);
    return undefined;
  }
  return Math.min(Math.max(r.si, 0), L);
}

function shapeOf(raw: Record<string, unknown>): LoadShape | undefined {
  if ("settle" in raw) return "settlement";
  if ("node" in raw) return "node";
  if (!("member" in raw)) return undefined;
  if ("w" in raw) return "line";
  if ("P" in raw) return "point";
  if ("M" in raw) return "moment";
  if ("dT" in raw) return "thermal";
  if ("misfit" in raw) return "misfit";
  return undefined;
}

function trussMemberLoad(ctx: ParseContext, path: string, m: ParsedMember): boolean {
  if (ctx.kind !== "truss") return false;
  ctx.issues.add(`${path}.member`, `${m.id} is a truss member (axial force only); apply the load at its nodes`);
  return true;
}

function parseOne(ctx: ParseContext, raw: unknown, index: number, out: ParsedLoad[]): void {
  const path = `loads[${index}]`;
  const obj = typeof raw === "object" && raw !== null && !Array.isArray(raw) ? (raw as Record<string, unknown>) : undefined;
  const shape = obj ? shapeOf(obj) : undefined;
  if (!obj || !shape) {
    ctx.issues.add(
      path,
      'must name a "node" (with Fx, Fy, M or settle) or a "member" (with w, P, M, dT or misfit)',
    );
    return;
  }
  const parsed = loadSchemas[shape].safeParse(obj);
  if (!parsed.success) {
    for (const issue of zodIssues(parsed.error, ["loads", index])) ctx.issues.add(issue.path, issue.message);
    return;
  }
  const d = parsed.data as Record<string, unknown> & { case?: string };
  const loadCase = d.case ?? "D";
  const s = (k: string): string | undefined => (typeof d[k] === "string" ? (d[k] as string) : undefined);

  if (shape === "node" || shape === "settlement") {
    const nodeId = s("node") ?? "";
    if (!ctx.nodes.has(nodeId)) {
      ctx.issues.add(`${path}.node`, `unknown node "${nodeId}"`);
      return;
    }
    if (shape === "node") {
      if (d.Fx === undefined && d.Fy === undefined && d.M === undefined) {
        ctx.issues.add(path, "a node load needs Fx, Fy or M");
        return;
      }
      if (ctx.kind === "truss" && d.M !== undefined) {
        ctx.issues.add(`${path}.M`, "a truss node has no rotation; a moment cannot be applied");
        return;
      }
      const Fx = read(ctx, `${path}.Fx`, s("Fx") ?? "0 N", "force");
      const Fy = read(ctx, `${path}.Fy`, s("Fy") ?? "0 N", "force");
      const M = read(ctx, `${path}.M`, s("M") ?? "0 N*m", "moment");
      if (Fx !== undefined && Fy !== undefined && M !== undefined) {
        out.push({ type: "node", case: loadCase, node: nodeId, Fx, Fy, M });
      }
      return;
    }
    const [sx, sy] = d.settle as [string, string];
    const dx = read(ctx, `${path}.settle[0]`, sx, "length");
    const dy = read(ctx, `${path}.settle[1]`, sy, "length");
    if (dx === undefined || dy === undefined) return;
    const support = ctx.supports.find((q) => q.node === nodeId);
    if (!support) {
      ctx.issues.add(`${path}.node`, `node ${nodeId} has no support, so it cannot settle`);
      return;
    }
    for (const [dof, v, held] of [["x", dx, support.x], ["y", dy, support.y]] as const) {
      if (v !== 0 && !held) ctx.issues.add(`${path}.settle`, `node ${nodeId} is not held in ${dof}, so it cannot settle in ${dof}`);
    }
    out.push({ type: "settlement", case: loadCase, node: nodeId, dx, dy });
    return;
  }

  const m = memberOf(ctx, `${path}.member`, s("member") ?? "");
  if (!m) return;
  const dir = (d.dir as "global" | "local" | undefined) ?? "global";
  if (shape === "line") {
    if (trussMemberLoad(ctx, path, m)) return;
    const w = d.w as string | [string, string];
    const [ta, tb] = typeof w === "string" ? [w, w] : w;
    let wa = read(ctx, typeof w === "string" ? `${path}.w` : `${path}.w[0]`, ta, "lineLoad");
    let wb = typeof w === "string" ? wa : read(ctx, `${path}.w[1]`, tb, "lineLoad");
    const a = s("from") === undefined ? 0 : readPosition(ctx, `${path}.from`, s("from") ?? "", m);
    const b = s("to") === undefined ? m.length : readPosition(ctx, `${path}.to`, s("to") ?? "", m);
    if (wa === undefined || wb === undefined || a === undefined || b === undefined) return;
    if (!(b > a)) {
      ctx.issues.add(path, '"from" must be less than "to"');
      return;
    }
    if (d.per === "horizontal") {
      // Intensity per horizontal projection: ds of member covers |cos| ds of plan, so scale by |cos|.
      if (Math.abs(m.cos) < 1e-12) {
        ctx.issues.add(`${path}.per`, `member ${m.id} is vertical, so it has no horizontal projection`);
        return;
      }
      wa *= Math.abs(m.cos);
      wb *= Math.abs(m.cos);
    }
    out.push({ type: "line", case: loadCase, member: m.id, a, b, wa, wb, dir });
    return;
  }
  if (shape === "point" || shape === "moment") {
    if (trussMemberLoad(ctx, path, m)) return;
    const at = readPosition(ctx, `${path}.at`, s("at") ?? "", m);
    if (shape === "point") {
      const P = read(ctx, `${path}.P`, s("P"), "force");
      if (at !== undefined && P !== undefined) out.push({ type: "point", case: loadCase, member: m.id, a: at, P, dir });
    } else {
      const M = read(ctx, `${path}.M`, s("M"), "moment");
      if (at !== undefined && M !== undefined) out.push({ type: "moment", case: loadCase, member: m.id, a: at, M });
    }
    return;
  }
  if (shape === "thermal") {
    const dT = read(ctx, `${path}.dT`, s("dT"), "temperatureChange");
    const alpha = read(ctx, `${path}.alpha`, s("alpha"), "expansion");
    if (alpha !== undefined && alpha < 0) ctx.issues.add(`${path}.alpha`, "must not be negative");
    if (dT !== undefined && alpha !== undefined && alpha >= 0) {
      out.push({ type: "thermal", case: loadCase, member: m.id, dT, alpha });
    }
    return;
  }
  const delta = read(ctx, `${path}.misfit`, s("misfit"), "length");
  if (delta !== undefined) out.push({ type: "misfit", case: loadCase, member: m.id, delta });
}

export function parseLoads(raw: unknown[], ctx: ParseContext): ParsedLoad[] {
  const out: ParsedLoad[] = [];
  raw.forEach((entry, i) => parseOne(ctx, entry, i, out));
  return out;
}

/** "B", "mid:AB" or "at:AB:6 ft" → a location; undefined (with an issue) when it is not one. */
export function parseLocation(ctx: ParseContext, path: string, text: string): ParsedLocation | undefined {
  if (text.startsWith("mid:")) {
    const m = memberOf(ctx, path, text.slice(4));
    return m ? { member: m.id, x: m.length / 2 } : undefined;
  }
  if (text.startsWith("at:")) {
    const rest = text.slice(3);
    const colon = rest.lastIndexOf(":");
    if (colon <= 0) {
      ctx.issues.add(path, `"${text}" must be "at:MEMBER:DISTANCE", e.g. "at:AB:6 ft"`);
      return undefined;
    }
    const m = memberOf(ctx, path, rest.slice(0, colon));
    if (!m) return undefined;
    const x = readPosition(ctx, path, rest.slice(colon + 1).trim(), m);
    return x === undefined ? undefined : { member: m.id, x };
  }
  if (!ctx.nodes.has(text)) {
    ctx.issues.add(path, `unknown node "${text}"`);
    return undefined;
  }
  return { node: text };
}

export function parseFind(raw: { node: string; dof: Dof }[], ctx: ParseContext): ParsedFind[] {
  const out: ParsedFind[] = [];
  raw.forEach((f, i) => {
    if (ctx.kind === "truss" && f.dof === "rz") {
      ctx.issues.add(`find[${i}].dof`, 'a truss has no rotations; use "x" or "y"');
      return;
    }
    const at = parseLocation(ctx, `find[${i}].node`, f.node);
    if (at) out.push({ label: f.node, at, dof: f.dof });
  });
  return out;
}
