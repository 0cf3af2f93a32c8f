import type { Engine, RealSolution } from "@/lib/solver/force-method";
import { gaussOnSegment } from "@/lib/solver/integrate";
import { buildMemberField, fieldAt, type MemberField } from "@/lib/solver/member-field";
import { memberWork, type MemberGeometry } from "@/lib/solver/member-work";

/**
 * Clapeyron's theorem: for loads on an unstrained structure with fixed supports the work of
 * the loads, ½ΣPΔ + ½∫w·v dx, equals the strain energy ½∫(M²/EI + N²/EA + V²/GAv) dx.
 * With initial strains (temperature, misfit) or support movement it does not: the structure
 * is strained before any load acts, and the reactions work through the movement. The
 * balance that holds then is 2U = ΣPΔ + ΣR·s − Σ∫N·ε₀ dx, reported beside.
 */
export interface EnergyCheck {
  external_work_J: number;
  strain_energy_J: number;
  rel_diff: number;
  /** true when only forces act, so the two must agree */
  applies: boolean;
  balanced: boolean;
  note: string;
  generalized: {
    load_work_J: number;
    support_work_J: number;
    initial_strain_work_J: number;
    /** ½(ΣPΔ + ΣR·s − ∫N·ε₀) (J), which equals the strain energy in every case */
    predicted_strain_energy_J: number;
    rel_diff: number;
  };
}

export const ENERGY_TOLERANCE = 1e-9;

function rel(a: number, b: number): number {
  const scale = Math.max(Math.abs(a), Math.abs(b));
  return scale === 0 ? 0 : Math.abs(a - b) / scale;
}

export function energyCheck(engine: Engine, sol: RealSolution, fields?: (MemberField | undefined)[]): EnergyCheck {
  const { st, geo } = engine;
  const { state, d, compiled } = sol;
  let U2 = 0;
  let initial = 0;
  const scratch = { bending: 0, axial: 0, shear: 0, axialIntegral: 0 };
  geo.forEach((g, j) => {
    const w = memberWork(g, j, state, state, scratch);
    U2 += w.bending + w.axial + w.shear;
    const e0 = compiled.eps0?.[j] ?? 0;
    if (e0 !== 0) initial += e0 * w.axialIntegral;
  });
  let loadWork = 0;
  for (const load of compiled.loads) {
    if (load.type !== "node") continue;
    const i = st.nodeIndex.get(load.node) ?? 0;
    loadWork += load.Fx * (d[st.row(i, "x")] ?? 0) + load.Fy * (d[st.row(i, "y")] ?? 0);
    if (st.dofs.length === 3) loadWork += load.M * (d[st.row(i, "rz")] ?? 0);
  }
  compiled.local.forEach((l, j) => {
    if (!l) return;
    const f = fields?.[j] ?? buildMemberField(engine, j, state, d);
    for (const p of l.points) {
      const v = fieldAt(f, p.a);
      loadWork += p.px * v.u + p.py * v.v;
    }
    for (const c of l.couples) loadWork += c.C * fieldAt(f, c.a).theta;
    const g = geo[j] as MemberGeometry;
    for (const line of l.lines) {
      for (let k = 0; k + 1 < g.xs.length; k++) {
        const x0 = g.xs[k] ?? 0;
        const x1 = g.xs[k + 1] ?? 0;
        const tol = 1e-10 * g.member.length;
        if (x0 < line.a - tol || x1 > line.b + tol) continue;
        const rule = gaussOnSegment(x1 - x0);
        for (let t = 0; t < rule.h.length; t++) {
          const x = x0 + (rule.h[t] ?? 0);
          const xi = (x - line.a) / (line.b - line.a);
          const v = fieldAt(f, x);
          const qx = line.qxa + (line.qxb - line.qxa) * xi;
          const qy = line.qya + (line.qyb - line.qya) * xi;
          loadWork += (rule.w[t] ?? 0) * (qx * v.u + qy * v.v);
        }
      }
    }
  });
  let supportWork = 0;
  if (compiled.settle) {
    for (let c = 0; c < st.columns.length; c++) supportWork += (state.cols[c] ?? 0) * (compiled.settle[c] ?? 0);
  }
  const applies = !compiled.settle && !compiled.eps0;
  const W = loadWork / 2;
  const U = U2 / 2;
  const predicted = (loadWork + supportWork - initial) / 2;
  const r = rel(W, U);
  const balanced = applies ? r <= ENERGY_TOLERANCE : rel(predicted, U) <= ENERGY_TOLERANCE;
  const note = applies
    ? "Only forces act: the work of the loads must equal the strain energy."
    : "A temperature change, misfit or support settlement acts: the structure is strained before the loads do work, and the reactions work through the support movement, so ½ΣPΔ need not equal the strain energy; the generalized balance 2U = ΣPΔ + ΣR·s − Σ∫N·ε₀ dx is checked instead.";
  return {
    external_work_J: W,
    strain_energy_J: U,
    rel_diff: r,
    applies,
    balanced,
    note,
    generalized: {
      load_work_J: loadWork,
      support_work_J: supportWork,
      initial_strain_work_J: initial,
      predicted_strain_energy_J: predicted,
      rel_diff: rel(predicted, U),
    },
  };
}
