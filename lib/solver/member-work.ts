import { memberHasBending, type Statics } from "@/lib/solver/equilibrium";
import { gaussOnSegment, GAUSS_POINTS } from "@/lib/solver/integrate";
import type { Particular } from "@/lib/solver/member-loads";
import type { ParsedMember } from "@/lib/solver/types";

/**
 * A statically admissible force state: the unknowns (by column) plus, per member, the
 * simple-span part of its own loads, and per member an initial axial strain (thermal and
 * misfit). Real states, unit-redundant states and virtual unit-load states all look alike.
 */
export interface ForceState {
  cols: Float64Array;
  part: (Particular | undefined)[] | null;
  /** initial axial strain per member (α·ΔT + δ/L), dimensionless */
  eps0: Float64Array | null;
}

/** Per-member constants: breakpoints, Gauss points and flexibilities. */
export interface MemberGeometry {
  member: ParsedMember;
  bending: boolean;
  xs: readonly number[];
  /** Gauss points (m from the first end), their segment and weights (m) */
  gx: Float64Array;
  gseg: Int32Array;
  gh: Float64Array;
  gw: Float64Array;
  /** 1/EI (1/(N·m²)), 1/EA (1/N, 0 if axially rigid), 1/(G·Av) (1/N, 0 if shear is ignored) */
  fM: number;
  fN: number;
  fV: number;
  colN: number;
  colMa: number;
  colMb: number;
}

// Shared (never written) empty arrays: thousands of truss bars need no Gauss points.
const NO_GAUSS = { gx: new Float64Array(0), gseg: new Int32Array(0), gh: new Float64Array(0), gw: new Float64Array(0) };

export function buildGeometry(st: Statics, j: number, xs: readonly number[]): MemberGeometry {
  const m = st.model.members[j] as ParsedMember;
  const bending = memberHasBending(st.model, m);
  const nSeg = xs.length - 1;
  // Axial-only members have constant N and are integrated in closed form: no Gauss points.
  const n = bending ? nSeg * GAUSS_POINTS : 0;
  const g = n === 0 ? NO_GAUSS : { gx: new Float64Array(n), gseg: new Int32Array(n), gh: new Float64Array(n), gw: new Float64Array(n) };
  for (let k = 0; k < (bending ? nSeg : 0); k++) {
    const x0 = xs[k] ?? 0;
    const rule = gaussOnSegment((xs[k + 1] ?? 0) - x0);
    for (let i = 0; i < GAUSS_POINTS; i++) {
      const t = k * GAUSS_POINTS + i;
      g.gh[t] = rule.h[i] ?? 0;
      g.gx[t] = x0 + (rule.h[i] ?? 0);
      g.gw[t] = rule.w[i] ?? 0;
      g.gseg[t] = k;
    }
  }
  return {
    member: m,
    bending,
    xs,
    ...g,
    fM: bending && m.I ? 1 / (m.E * m.I) : 0,
    fN: m.A ? 1 / (m.E * m.A) : 0,
    fV: bending && m.shear ? 1 / (m.shear.G * m.shear.Av) : 0,
    colN: st.memberCol[3 * j] ?? -1,
    colMa: st.memberCol[3 * j + 1] ?? -1,
    colMb: st.memberCol[3 * j + 2] ?? -1,
  };
}

export interface EndUnknowns {
  Na: number;
  Ma: number;
  Mb: number;
}

export function endUnknowns(g: MemberGeometry, s: ForceState): EndUnknowns {
  return {
    Na: g.colN >= 0 ? (s.cols[g.colN] ?? 0) : 0,
    Ma: g.colMa >= 0 ? (s.cols[g.colMa] ?? 0) : 0,
    Mb: g.colMb >= 0 ? (s.cols[g.colMb] ?? 0) : 0,
  };
}

/** N, V, M (N, N, N·m) of a state at every Gauss point of the member. */
export function fieldsAtGauss(g: MemberGeometry, s: ForceState, j: number): { N: Float64Array; V: Float64Array; M: Float64Array } {
  const n = g.gx.length;
  const N = new Float64Array(n);
  const V = new Float64Array(n);
  const M = new Float64Array(n);
  const { Na, Ma, Mb } = endUnknowns(g, s);
  const L = g.member.length;
  const p = s.part?.[j];
  const Vend = (Mb - Ma) / L;
  for (let t = 0; t < n; t++) {
    const xi = (g.gx[t] ?? 0) / L;
    let nn = Na;
    let vv = Vend;
    let mm = Ma * (1 - xi) + Mb * xi;
    if (p) {
      const k = g.gseg[t] ?? 0;
      const h = g.gh[t] ?? 0;
      const qy = p.qy[k] ?? 0;
      const ky = p.ky[k] ?? 0;
      const v0 = p.V0[k] ?? 0;
      nn += (p.N0[k] ?? 0) - (p.qx[k] ?? 0) * h - ((p.kx[k] ?? 0) * h * h) / 2;
      vv += v0 + qy * h + (ky * h * h) / 2;
      mm += (p.M0[k] ?? 0) + v0 * h + (qy * h * h) / 2 + (ky * h * h * h) / 6;
    }
    N[t] = nn;
    V[t] = vv;
    M[t] = mm;
  }
  return { N, V, M };
}

/** Elastic virtual-work terms of state v on the strains of state r for one member (m or rad). */
export interface WorkTerms {
  bending: number;
  axial: number;
  shear: number;
  /** ∫ N_v dx (N·m), which multiplies an initial strain */
  axialIntegral: number;
}

/** `out`, when given, is filled and returned (hot loops reuse one object). */
export function memberWork(g: MemberGeometry, j: number, v: ForceState, r: ForceState, out?: WorkTerms): WorkTerms {
  const L = g.member.length;
  const pv = v.part?.[j];
  const pr = r.part?.[j];
  const res = out ?? { bending: 0, axial: 0, shear: 0, axialIntegral: 0 };
  if (!pv && !pr) {
    // No member loads in either state: N and V constant, M linear, so the integrals are closed.
    const vNa = g.colN >= 0 ? (v.cols[g.colN] ?? 0) : 0;
    const rNa = g.colN >= 0 ? (r.cols[g.colN] ?? 0) : 0;
    res.axial = g.fN * vNa * rNa * L;
    res.axialIntegral = vNa * L;
    res.bending = 0;
    res.shear = 0;
    if (g.bending) {
      const a = endUnknowns(g, v);
      const b = endUnknowns(g, r);
      res.bending = ((g.fM * L) / 6) * (2 * a.Ma * b.Ma + a.Ma * b.Mb + a.Mb * b.Ma + 2 * a.Mb * b.Mb);
      res.shear = g.fV ? (g.fV * (a.Mb - a.Ma) * (b.Mb - b.Ma)) / L : 0;
    }
    return res;
  }
  const fv = fieldsAtGauss(g, v, j);
  const fr = pv === pr && v === r ? fv : fieldsAtGauss(g, r, j);
  let bending = 0;
  let axial = 0;
  let shear = 0;
  let axialIntegral = 0;
  for (let t = 0; t < g.gw.length; t++) {
    const w = g.gw[t] ?? 0;
    bending += w * (fv.M[t] ?? 0) * (fr.M[t] ?? 0);
    axial += w * (fv.N[t] ?? 0) * (fr.N[t] ?? 0);
    shear += w * (fv.V[t] ?? 0) * (fr.V[t] ?? 0);
    axialIntegral += w * (fv.N[t] ?? 0);
  }
  res.bending = g.bending ? bending * g.fM : 0;
  res.axial = axial * g.fN;
  res.shear = shear * g.fV;
  res.axialIntegral = axialIntegral;
  return res;
}

/**
 * Generalized deformations of a member conjugate to its unknowns, for the strains of state r:
 * elongation ∫ε dx for N, ∫(1−ξ)κ dx − ∫γ dx/L for Ma, ∫ξκ dx + ∫γ dx/L for Mb (m, rad, rad).
 */
export function memberDeformations(g: MemberGeometry, j: number, r: ForceState): { eN: number; eMa: number; eMb: number } {
  const L = g.member.length;
  const e0 = r.eps0?.[j] ?? 0;
  const u = endUnknowns(g, r);
  const p = r.part?.[j];
  if (!p) {
    const gamma = g.fV * ((u.Mb - u.Ma) / L);
    return {
      eN: L * (g.fN * u.Na + e0),
      eMa: ((g.fM * L) / 6) * (2 * u.Ma + u.Mb) - gamma,
      eMb: ((g.fM * L) / 6) * (u.Ma + 2 * u.Mb) + gamma,
    };
  }
  const f = fieldsAtGauss(g, r, j);
  let eN = 0;
  let eMa = 0;
  let eMb = 0;
  for (let t = 0; t < g.gw.length; t++) {
    const w = g.gw[t] ?? 0;
    const xi = (g.gx[t] ?? 0) / L;
    const kappa = g.fM * (f.M[t] ?? 0);
    const gamma = g.fV * (f.V[t] ?? 0);
    eN += w * (g.fN * (f.N[t] ?? 0) + e0);
    eMa += w * ((1 - xi) * kappa - gamma / L);
    eMb += w * (xi * kappa + gamma / L);
  }
  return { eN, eMa, eMb };
}
