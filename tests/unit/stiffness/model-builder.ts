// Builds parsed models for the stiffness tests the way the parser would: SI numbers, member
// length and direction cosines derived from the nodes.

import type { Dof, ParsedMember, ParsedModel, ParsedSupport, StructureKind } from "@/lib/solver/types";

export interface MemberSpec {
  ends: [string, string];
  E: number;
  I?: number;
  A?: number;
  shear?: { G: number; Av: number };
  release?: ("start" | "end")[];
}

export type SupportSpec = "pin" | "roller" | "roller-x" | "fixed" | Dof[];

export function buildModel(
  kind: StructureKind,
  nodes: Record<string, [number, number]>,
  members: Record<string, MemberSpec>,
  supports: Record<string, SupportSpec>,
): ParsedModel {
  const parsedNodes = Object.entries(nodes).map(([id, [x, y]]) => ({ id, x, y }));
  const parsedMembers: ParsedMember[] = Object.entries(members).map(([id, m]) => {
    const a = nodes[m.ends[0]];
    const b = nodes[m.ends[1]];
    if (!a || !b) throw new Error(`test model: member ${id} has an unknown end`);
    const dx = b[0] - a[0];
    const dy = b[1] - a[1];
    const length = Math.hypot(dx, dy);
    return {
      id,
      start: m.ends[0],
      end: m.ends[1],
      E: m.E,
      I: m.I,
      A: m.A,
      shear: m.shear,
      releaseStart: m.release?.includes("start") ?? false,
      releaseEnd: m.release?.includes("end") ?? false,
      length,
      cos: dx / length,
      sin: dy / length,
    };
  });
  const parsedSupports: ParsedSupport[] = Object.entries(supports).map(([node, s]) => {
    const held = (d: Dof): boolean =>
      Array.isArray(s)
        ? s.includes(d)
        : s === "fixed" ||
          (s === "pin" && d !== "rz") ||
          (s === "roller" && d === "y") ||
          (s === "roller-x" && d === "x");
    return { node, x: held("x"), y: held("y"), rz: held("rz") };
  });
  return {
    title: "Larkspur Falls test model",
    kind,
    nodes: parsedNodes,
    members: parsedMembers,
    supports: parsedSupports,
    loads: [],
    find: [],
    displayLengthUnit: "m",
  };
}

/** |actual − expected| ≤ tol·|expected| (or ≤ tol·scale when expected is ~0). */
export function relErr(actual: number, expected: number, scale = Math.abs(expected)): number {
  return Math.abs(actual - expected) / (scale === 0 ? 1 : scale);
}

/**
 * Pratt truss: bottom B0…Bn, top T0…Tn (height h, panel p), end verticals, diagonals sloping
 * down towards mid-span. 4n + 1 members. Pin at B0, roller at Bn.
 */
export function prattTruss(panels: number, p: number, h: number, E: number, A: number, shuffle = false): ParsedModel {
  const nodes: Record<string, [number, number]> = {};
  const members: Record<string, MemberSpec> = {};
  for (let i = 0; i <= panels; i++) {
    nodes[`B${i}`] = [i * p, 0];
    nodes[`T${i}`] = [i * p, h];
  }
  const bar = (a: string, b: string): MemberSpec => ({ ends: [a, b], E, A });
  for (let i = 0; i < panels; i++) {
    members[`b${i}`] = bar(`B${i}`, `B${i + 1}`);
    members[`t${i}`] = bar(`T${i}`, `T${i + 1}`);
    members[`d${i}`] = 2 * i < panels ? bar(`T${i}`, `B${i + 1}`) : bar(`B${i}`, `T${i + 1}`);
  }
  for (let i = 0; i <= panels; i++) members[`v${i}`] = bar(`B${i}`, `T${i}`);
  const model = buildModel("truss", nodes, members, { B0: "pin", [`B${panels}`]: "roller" });
  if (shuffle) {
    // Deterministic scramble so that input order says nothing about connectivity.
    const scramble = <T>(xs: T[]): T[] => {
      const out = xs.slice();
      let s = 12345;
      for (let i = out.length - 1; i > 0; i--) {
        s = (s * 1103515245 + 12345) % 2147483648;
        const j = s % (i + 1);
        const t = out[i]!;
        out[i] = out[j]!;
        out[j] = t;
      }
      return out;
    };
    model.nodes = scramble(model.nodes);
    model.members = scramble(model.members);
  }
  return model;
}
