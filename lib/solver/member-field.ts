import type { Engine } from "@/lib/solver/force-method";
import { segmentOf } from "@/lib/solver/member-loads";
import { endUnknowns, type ForceState, type MemberGeometry } from "@/lib/solver/member-work";
import { evalPoly } from "@/lib/solver/polynomial";

/**
 * Everything along one member for one real state, as polynomials per segment (local axes):
 * N, V, M from statics; displacements by integrating the strains between the end
 * displacements that the unit-load method gave for the nodes:
 *   v(x) = v_a + (v_b − v_a)ξ + W(x) − ξ·W(L) − S(x) + ξ·S(L),  W'' = κ = M/EI,  S' = γ = V/(G·Av)
 *   θ(x) = v'(x) + γ(x) (rotation of the section),  u(x) = u_a + ∫ε dx.
 * With V = dM/dx the shear strain that does work with V is γ = θ − v' (work per length
 * M·θ' + V·(θ − v')), hence the minus sign on S.
 * These need no end rotations, so they hold at released (hinged) ends as well.
 */
export interface MemberField {
  g: MemberGeometry;
  nSeg: number;
  /**
   * Coefficient runs, per segment k, in c starting at o (n = nSeg):
   * N at o + 3k (3), V at o + 3n + 3k (3), M at o + 6n + 4k (4), u at o + 10n + 4k (4),
   * v at o + 14n + 6k (6), θ at o + 20n + 5k (5); 25·n numbers in all.
   */
  c: Float64Array;
  o: number;
}

export const FIELD_SIZE_PER_SEGMENT = 25;

/** Offset of the transverse-displacement run of segment k. */
export function vOffset(f: MemberField, k: number): number {
  return f.o + 14 * f.nSeg + 6 * k;
}

export interface FieldValue {
  /** m from the first end */
  x: number;
  /** local displacements (m), section rotation (rad) */
  u: number;
  v: number;
  theta: number;
  /** global displacements, m */
  ux: number;
  uy: number;
  /** N (tension +), V, M (beam convention, sagging +), N / N·m */
  N: number;
  V: number;
  M: number;
}

/** `into`, when given, is a buffer with room for 25·nSeg numbers from `at` (one pool per load set). */
export function buildMemberField(
  engine: Engine,
  j: number,
  state: ForceState,
  d: Float64Array,
  into?: { c: Float64Array; at: number },
): MemberField {
  const g = engine.geo[j] as MemberGeometry;
  const m = g.member;
  const st = engine.st;
  const L = m.length;
  const nSeg = g.xs.length - 1;
  const a = st.nodeIndex.get(m.start) ?? 0;
  const b = st.nodeIndex.get(m.end) ?? 0;
  const dax = d[st.row(a, "x")] ?? 0;
  const day = d[st.row(a, "y")] ?? 0;
  const dbx = d[st.row(b, "x")] ?? 0;
  const dby = d[st.row(b, "y")] ?? 0;
  const ua = dax * m.cos + day * m.sin;
  const va = -dax * m.sin + day * m.cos;
  const vb = -dbx * m.sin + dby * m.cos;
  const { Na, Ma, Mb } = endUnknowns(g, state);
  const p = state.part?.[j];
  const e0 = state.eps0?.[j] ?? 0;
  const c = into?.c ?? new Float64Array(nSeg * FIELD_SIZE_PER_SEGMENT);
  const o = into?.at ?? 0;
  const f: MemberField = { g, nSeg, c, o };
  const oN = o;
  const oV = o + 3 * nSeg;
  const oM = o + 6 * nSeg;
  const oU = o + 10 * nSeg;
  const oVd = o + 14 * nSeg;
  const oT = o + 20 * nSeg;
  // running integrals from the first end: Θ = ∫κ, W = ∫Θ, S = ∫γ, U = ∫ε
  let Theta = 0;
  let W = 0;
  let S = 0;
  let Ucum = 0;
  const { fM, fV, fN } = g;
  for (let k = 0; k < nSeg; k++) {
    const x0 = g.xs[k] ?? 0;
    const h = (g.xs[k + 1] ?? 0) - x0;
    const V0 = (Mb - Ma) / L + (p ? (p.V0[k] ?? 0) : 0);
    const qy = p ? (p.qy[k] ?? 0) : 0;
    const ky = p ? (p.ky[k] ?? 0) : 0;
    const m0 = Ma * (1 - x0 / L) + Mb * (x0 / L) + (p ? (p.M0[k] ?? 0) : 0);
    const n0 = Na + (p ? (p.N0[k] ?? 0) : 0);
    const n1 = p ? -(p.qx[k] ?? 0) : 0;
    const n2 = p ? -(p.kx[k] ?? 0) / 2 : 0;
    c[oM + k * 4] = m0;
    c[oM + k * 4 + 1] = V0;
    c[oM + k * 4 + 2] = qy / 2;
    c[oM + k * 4 + 3] = ky / 6;
    c[oV + k * 3] = V0;
    c[oV + k * 3 + 1] = qy;
    c[oV + k * 3 + 2] = ky / 2;
    c[oN + k * 3] = n0;
    c[oN + k * 3 + 1] = n1;
    c[oN + k * 3 + 2] = n2;
    // κ = M/EI and γ = V/(G·Av) coefficients of this segment
    const k0 = fM * m0;
    const k1 = fM * V0;
    const k2 = (fM * qy) / 2;
    const k3 = (fM * ky) / 6;
    const g0 = fV * V0;
    const g1 = fV * qy;
    const g2 = (fV * ky) / 2;
    const th = Theta;
    const Wk = W;
    const Sk = S;
    const h2 = h * h;
    const h3 = h2 * h;
    Theta = th + k0 * h + (k1 * h2) / 2 + (k2 * h3) / 3 + (k3 * h3 * h) / 4;
    W = Wk + th * h + (k0 * h2) / 2 + (k1 * h3) / 6 + (k2 * h3 * h) / 12 + (k3 * h3 * h2) / 20;
    S = Sk + g0 * h + (g1 * h2) / 2 + (g2 * h3) / 3;
    const e0c = fN * n0 + e0;
    const e1c = fN * n1;
    const e2c = fN * n2;
    c[oU + k * 4] = ua + Ucum;
    c[oU + k * 4 + 1] = e0c;
    c[oU + k * 4 + 2] = e1c / 2;
    c[oU + k * 4 + 3] = e2c / 3;
    Ucum += e0c * h + (e1c * h2) / 2 + (e2c * h3) / 3;
    // v and θ coefficients except the chord terms, added below once W(L), S(L) are known
    c[oVd + k * 6] = Wk - Sk;
    c[oVd + k * 6 + 1] = th - g0;
    c[oVd + k * 6 + 2] = k0 / 2 - g1 / 2;
    c[oVd + k * 6 + 3] = k1 / 6 - g2 / 3;
    c[oVd + k * 6 + 4] = k2 / 12;
    c[oVd + k * 6 + 5] = k3 / 20;
    c[oT + k * 5] = th;
    c[oT + k * 5 + 1] = k0;
    c[oT + k * 5 + 2] = k1 / 2;
    c[oT + k * 5 + 3] = k2 / 3;
    c[oT + k * 5 + 4] = k3 / 4;
  }
  const chord = (vb - va) / L - (W - S) / L;
  for (let k = 0; k < nSeg; k++) {
    const x0 = g.xs[k] ?? 0;
    c[oVd + k * 6] = (c[oVd + k * 6] ?? 0) + va + chord * x0;
    c[oVd + k * 6 + 1] = (c[oVd + k * 6 + 1] ?? 0) + chord;
    c[oT + k * 5] = (c[oT + k * 5] ?? 0) + chord;
  }
  return f;
}

/** Values at x (m); at a breakpoint `side` picks the limit from the left or the right. */
export function fieldAt(f: MemberField, x: number, side: "left" | "right" = "right"): FieldValue {
  let k = segmentOf(f.g.xs, x);
  if (side === "left" && k > 0 && x <= (f.g.xs[k] ?? 0)) k -= 1;
  const h = x - (f.g.xs[k] ?? 0);
  const n = f.nSeg;
  const u = evalPoly(f.c, f.o + 10 * n + 4 * k, 4, h);
  const v = evalPoly(f.c, f.o + 14 * n + 6 * k, 6, h);
  const { cos: c, sin: s } = f.g.member;
  return {
    x,
    u,
    v,
    theta: evalPoly(f.c, f.o + 20 * n + 5 * k, 5, h),
    ux: u * c - v * s,
    uy: u * s + v * c,
    N: evalPoly(f.c, f.o + 3 * k, 3, h),
    V: evalPoly(f.c, f.o + 3 * n + 3 * k, 3, h),
    M: evalPoly(f.c, f.o + 6 * n + 4 * k, 4, h),
  };
}
