import { solveStatics } from "@/lib/solver/equilibrium";
import { addParticulars, type Engine, type RealSolution } from "@/lib/solver/force-method";
import { emptyMemberLoads, type LocalMemberLoads } from "@/lib/solver/member-loads";
import { memberWork, type ForceState, type MemberGeometry } from "@/lib/solver/member-work";
import type { Dof, ParsedLocation } from "@/lib/solver/types";

/**
 * Unit-load (virtual work) method: a unit force or couple where the displacement is wanted,
 * carried by the primary structure (any equilibrium system will do when the real strains are
 * compatible — the reduction theorem), then
 *   1·Δ = Σ∫ M m/EI dx + Σ∫ N n/EA dx + Σ∫ V v/(G·Av) dx + Σ∫ n·α·ΔT dx + Σ n·δ − Σ r·s.
 */

export interface MemberTerm {
  member: string;
  /** each in m (or rad for a rotation) */
  bending: number;
  axial: number;
  shear: number;
  thermal: number;
  misfit: number;
}

export interface SupportTerm {
  node: string;
  /** −Σ r·s at this node, m or rad */
  settlement: number;
}

export interface UnitLoadResult {
  value: number;
  members: MemberTerm[];
  supports: SupportTerm[];
}

/** The virtual unit state for a location and dof, on the primary structure. */
export function virtualState(engine: Engine, at: ParsedLocation, dof: Dof): ForceState {
  const { st, model } = engine;
  const p = new Float64Array(st.nRows);
  const cols = new Float64Array(st.columns.length);
  const unitAtNode = (nodeId: string, share: number): void => {
    const i = st.nodeIndex.get(nodeId) ?? 0;
    const r = st.row(i, dof);
    p[r] = (p[r] ?? 0) - share; // B s = −(applied)
  };
  if ("node" in at) {
    unitAtNode(at.node, 1);
    return { cols: solveStatics(st, p, cols), part: null, eps0: null };
  }
  const j = st.memberIndex.get(at.member) ?? 0;
  const m = model.members[j];
  const g = engine.geo[j];
  if (!m || !g) throw new Error(`internal: member ${at.member} missing`);
  if (!g.bending) {
    // Pin-ended axial member: its points move on the chord, so share the unit by the lever rule.
    const xi = at.x / m.length;
    unitAtNode(m.start, 1 - xi);
    unitAtNode(m.end, xi);
    return { cols: solveStatics(st, p, cols), part: null, eps0: null };
  }
  const local: (LocalMemberLoads | undefined)[] = new Array(model.members.length);
  const l = emptyMemberLoads();
  if (dof === "rz") l.couples.push({ a: at.x, C: 1 });
  else if (dof === "x") l.points.push({ a: at.x, px: m.cos, py: -m.sin });
  else l.points.push({ a: at.x, px: m.sin, py: m.cos });
  local[j] = l;
  const part = addParticulars(engine, local, p);
  return { cols: solveStatics(st, p, cols), part, eps0: null };
}

/** Per-member virtual-work terms of a virtual state on a real solution. */
export function unitLoadTerms(engine: Engine, virtual: ForceState, real: RealSolution): UnitLoadResult {
  const members: MemberTerm[] = [];
  let value = 0;
  const { compiled, state } = real;
  const scratch = { bending: 0, axial: 0, shear: 0, axialIntegral: 0 };
  for (let j = 0; j < engine.geo.length; j++) {
    const g = engine.geo[j] as MemberGeometry;
    const w = memberWork(g, j, virtual, state, scratch);
    const thermal = (compiled.epsThermal?.[j] ?? 0) * w.axialIntegral;
    const misfit = (compiled.epsMisfit?.[j] ?? 0) * w.axialIntegral;
    const sum = w.bending + w.axial + w.shear + thermal + misfit;
    if (w.bending === 0 && w.axial === 0 && w.shear === 0 && thermal === 0 && misfit === 0) continue;
    value += sum;
    members.push({ member: g.member.id, bending: w.bending, axial: w.axial, shear: w.shear, thermal, misfit });
  }
  const supports: SupportTerm[] = [];
  if (compiled.settle) {
    const byNode = new Map<string, number>();
    engine.st.columns.forEach((c, k) => {
      const s = compiled.settle?.[k] ?? 0;
      if (c.kind !== "R" || s === 0) return;
      const id = engine.model.nodes[c.index]?.id ?? "?";
      byNode.set(id, (byNode.get(id) ?? 0) - (virtual.cols[k] ?? 0) * s);
    });
    for (const [node, settlement] of byNode) {
      supports.push({ node, settlement });
      value += settlement;
    }
  }
  return { value, members, supports };
}
