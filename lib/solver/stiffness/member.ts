// One member in its local axes: x along the member from its first end (m), y the x axis turned
// 90° counter-clockwise, rotations counter-clockwise (rad).
//
// Everything inside a member comes from integrating the beam equations exactly from the first
// end: dN/dx = −p, dV/dx = q, dM/dx = V, θ' = M/EI, v' = θ − V/(G·Av), u' = N/EA + ε₀, with
// p, q the axial and transverse load intensities (N/m). Loads are piecewise linear, so the
// repeated integrals are polynomials of degree ≤ 4 and 3-point Gauss–Legendre is exact on
// them. The four initial values (N₀, V₀, M₀, θ₀) follow from the end conditions (connected end:
// displacement and rotation match the node; released end: M = 0), which gives both the exact
// fixed-end forces (all end displacements zero) and the exact interior field for any end
// displacements: the Hermite/Timoshenko interpolation plus the fixed-fixed particular solution
// in one step.

import type { ParsedMember } from "@/lib/solver/types";

/** Loads on one member resolved into local components. */
export interface LocalMemberLoads {
  /** linear intensities on [a, b] (m): q transverse (local y), p axial (local x), N/m */
  lines: { a: number; b: number; qa: number; qb: number; pa: number; pb: number }[];
  /** concentrated forces at a (m): Py local y, Px local x, N */
  points: { a: number; Py: number; Px: number }[];
  /** concentrated couples at a (m), counter-clockwise, N·m */
  couples: { a: number; C: number }[];
  /** initial (stress-free) axial strain: α·ΔT + misfit/L, dimensionless */
  eps0: number;
}

export function emptyLoads(): LocalMemberLoads {
  return { lines: [], points: [], couples: [], eps0: 0 };
}

/** Section and geometry of one member as the stiffness method sees it. */
export interface MemberSection {
  id: string;
  /** m */
  L: number;
  cos: number;
  sin: number;
  /** N; null = axially rigid (a beam member given without A) */
  EA: number | null;
  /** N·m²; 0 for truss bars */
  EI: number;
  /** 1/(G·Av) in 1/N; 0 when shear deformation is ignored */
  shearFlex: number;
  releaseStart: boolean;
  releaseEnd: boolean;
  /** pin-ended bar: axial only, no bending dofs */
  bar: boolean;
}

export function sectionOf(m: ParsedMember, bar: boolean): MemberSection {
  return {
    id: m.id,
    L: m.length,
    cos: m.cos,
    sin: m.sin,
    EA: m.A === undefined ? null : m.E * m.A,
    EI: bar ? 0 : m.E * (m.I ?? 0),
    shearFlex: !bar && m.shear ? 1 / (m.shear.G * m.shear.Av) : 0,
    releaseStart: bar || m.releaseStart,
    releaseEnd: bar || m.releaseEnd,
    bar,
  };
}

/** 3-point Gauss–Legendre on [-1, 1]: exact for polynomials of degree ≤ 5. */
const GAUSS_X = [-Math.sqrt(3 / 5), 0, Math.sqrt(3 / 5)] as const;
const GAUSS_W = [5 / 9, 8 / 9, 5 / 9] as const;

/**
 * Repeated integrals of the member's own loads from 0 to x, with the fields started at zero:
 * Vq = ∫q + ΣPy, Mq = ∫Vq − ΣC, Tq = ∫Mq (= EI·θ), Wq = ∫Tq (= EI·v bending part),
 * Sq = ∫Vq (for the shear part of v), Nq = ∫p + ΣPx, Uq = ∫Nq.
 * A concentrated load at a counts for x > a, or for x ≥ a when `inclusive`.
 */
export interface LoadIntegrals {
  Vq: number;
  Mq: number;
  Tq: number;
  Wq: number;
  Sq: number;
  Nq: number;
  Uq: number;
}

export function loadIntegrals(loads: LocalMemberLoads, x: number, inclusive: boolean): LoadIntegrals {
  let i1 = 0;
  let i2 = 0;
  let i3 = 0;
  let i4 = 0;
  let j1 = 0;
  let j2 = 0;
  let mc = 0;
  let tc = 0;
  let wc = 0;
  for (const ln of loads.lines) {
    const m = Math.min(x, ln.b);
    if (m <= ln.a) continue;
    const half = (m - ln.a) / 2;
    const mid = (m + ln.a) / 2;
    const span = ln.b - ln.a;
    for (let k = 0; k < 3; k++) {
      const xi = mid + half * GAUSS_X[k]!;
      const w = half * GAUSS_W[k]!;
      const r = (xi - ln.a) / span;
      const q = w * (ln.qa + (ln.qb - ln.qa) * r);
      const p = w * (ln.pa + (ln.pb - ln.pa) * r);
      const t = x - xi;
      i1 += q;
      i2 += q * t;
      i3 += (q * t * t) / 2;
      i4 += (q * t * t * t) / 6;
      j1 += p;
      j2 += p * t;
    }
  }
  for (const pt of loads.points) {
    if (pt.a > x || (pt.a === x && !inclusive)) continue;
    const t = x - pt.a;
    i1 += pt.Py;
    i2 += pt.Py * t;
    i3 += (pt.Py * t * t) / 2;
    i4 += (pt.Py * t * t * t) / 6;
    j1 += pt.Px;
    j2 += pt.Px * t;
  }
  for (const cp of loads.couples) {
    if (cp.a > x || (cp.a === x && !inclusive)) continue;
    const t = x - cp.a;
    // Crossing a counter-clockwise couple the sagging moment drops by C.
    mc -= cp.C;
    tc -= cp.C * t;
    wc -= (cp.C * t * t) / 2;
  }
  return { Vq: i1, Mq: i2 + mc, Tq: i3 + tc, Wq: i4 + wc, Sq: i2, Nq: j1, Uq: j2 };
}

/** Local end displacements [u1, v1, θ1, u2, v2, θ2] (m, m, rad). θ at a released end is ignored. */
export type LocalEndDisplacements = readonly [number, number, number, number, number, number];

/**
 * Initial values at x = 0 that fix the whole member field.
 * N tension positive (N); V = dM/dx (N); M sagging positive seen from local +y (N·m);
 * θ0 the member's own end rotation (rad), which differs from the node's at a hinge.
 */
export interface MemberState {
  section: MemberSection;
  loads: LocalMemberLoads;
  u0: number;
  v0: number;
  u1: number;
  theta0: number;
  N0: number;
  V0: number;
  M0: number;
}

/**
 * @param rigidN0 axial force at the first end (N) for an axially rigid member, which the
 *   structure-level constraint solution supplies; ignored otherwise
 */
export function memberState(
  section: MemberSection,
  loads: LocalMemberLoads,
  d: LocalEndDisplacements,
  rigidN0 = 0,
): MemberState {
  const { L } = section;
  const [u1, v1, t1, u2, v2, t2] = d;
  const atL = loadIntegrals(loads, L, true);

  let N0: number;
  if (section.EA === null) N0 = rigidN0;
  else N0 = (section.EA * (u2 - u1 - loads.eps0 * L)) / L + atL.Uq / L;

  let theta0 = 0;
  let V0 = 0;
  let M0 = 0;
  if (section.bar) {
    theta0 = (v2 - v1) / L;
  } else {
    const f = 1 / section.EI;
    const g = section.shearFlex;
    const thq = f * atL.Tq;
    const vq = f * atL.Wq - g * atL.Sq;
    const cVv = (f * L * L * L) / 6 - g * L;
    if (!section.releaseStart && !section.releaseEnd) {
      theta0 = t1;
      // θ(L) = θ2 and v(L) = v2 in M0, V0.
      const a11 = f * L;
      const a12 = (f * L * L) / 2;
      const a21 = a12;
      const a22 = cVv;
      const r1 = t2 - t1 - thq;
      const r2 = v2 - v1 - t1 * L - vq;
      const det = a11 * a22 - a12 * a21;
      M0 = (r1 * a22 - a12 * r2) / det;
      V0 = (a11 * r2 - a21 * r1) / det;
    } else if (section.releaseStart && !section.releaseEnd) {
      // M0 = 0; θ(L) = θ2 and v(L) = v2 in θ0, V0.
      V0 = (v2 - v1 - vq - L * (t2 - thq)) / (cVv - (f * L * L * L) / 2);
      theta0 = t2 - thq - ((f * L * L) / 2) * V0;
    } else if (!section.releaseStart && section.releaseEnd) {
      // θ0 = θ1; M(L) = 0 gives M0 = −V0·L − Mq(L); then v(L) = v2.
      theta0 = t1;
      V0 = (v2 - v1 - t1 * L - vq + (f * atL.Mq * L * L) / 2) / (-(f * L * L * L) / 3 - g * L);
      M0 = -V0 * L - atL.Mq;
    } else {
      // Both ends hinged: statically determinate in bending, rotation from v(L) = v2.
      V0 = -atL.Mq / L;
      theta0 = (v2 - v1 - vq - cVv * V0) / L;
    }
  }
  return { section, loads, u0: u1, v0: v1, u1: u2, theta0, N0, V0, M0 };
}

/** Local field at x (m from the first end). At a concentrated load the value just before it. */
export interface LocalField {
  u: number;
  v: number;
  theta: number;
  N: number;
  V: number;
  M: number;
}

export function fieldAt(s: MemberState, x: number, inclusive = false): LocalField {
  const { section, loads } = s;
  const q = loadIntegrals(loads, x, inclusive);
  const N = s.N0 - q.Nq;
  let u: number;
  if (section.EA === null) u = s.u0 + ((s.u1 - s.u0) * x) / section.L;
  else u = s.u0 + (s.N0 * x - q.Uq) / section.EA + loads.eps0 * x;
  if (section.bar) {
    return { u, v: s.v0 + s.theta0 * x, theta: s.theta0, N, V: 0, M: 0 };
  }
  const f = 1 / section.EI;
  const V = s.V0 + q.Vq;
  const M = s.M0 + s.V0 * x + q.Mq;
  const theta = s.theta0 + f * (s.M0 * x + (s.V0 * x * x) / 2 + q.Tq);
  const v =
    s.v0 +
    s.theta0 * x +
    f * ((s.M0 * x * x) / 2 + (s.V0 * x * x * x) / 6 + q.Wq) -
    section.shearFlex * (s.V0 * x + q.Sq);
  return { u, v, theta, N, V, M };
}

/**
 * Forces the nodes exert on the member, local axes: [Fx1, Fy1, Mz1, Fx2, Fy2, Mz2] (N, N·m,
 * counter-clockwise). With all end displacements zero these are the fixed-end forces.
 */
export function endForces(s: MemberState): [number, number, number, number, number, number] {
  const end = fieldAt(s, s.section.L, true);
  return [-s.N0, s.V0, -s.M0, end.N, -end.V, end.M];
}

/**
 * Local 6×6 stiffness (row-major) for [u1, v1, θ1, u2, v2, θ2]: exact Timoshenko beam
 * (Euler–Bernoulli when shearFlex = 0), hinged ends statically condensed, the axial term
 * left out for an axially rigid member (the structure solve imposes it as a constraint).
 */
export function localStiffness(section: MemberSection): Float64Array {
  const k = new Float64Array(36);
  const { L } = section;
  if (section.EA !== null) {
    const ka = section.EA / L;
    k[0] = ka;
    k[3] = -ka;
    k[18] = -ka;
    k[21] = ka;
  }
  if (section.bar || (section.releaseStart && section.releaseEnd)) return k;

  const EI = section.EI;
  const phi = (12 * EI * section.shearFlex) / (L * L);
  const c = EI / (L * L * L * (1 + phi));
  // Bending block in [v1, θ1, v2, θ2].
  const b = [
    [12 * c, 6 * L * c, -12 * c, 6 * L * c],
    [6 * L * c, (4 + phi) * L * L * c, -6 * L * c, (2 - phi) * L * L * c],
    [-12 * c, -6 * L * c, 12 * c, -6 * L * c],
    [6 * L * c, (2 - phi) * L * L * c, -6 * L * c, (4 + phi) * L * L * c],
  ];
  const condense = (r: number): void => {
    const krr = b[r]![r]!;
    for (let i = 0; i < 4; i++) {
      for (let j = 0; j < 4; j++) {
        if (i === r || j === r) continue;
        b[i]![j]! -= (b[i]![r]! * b[r]![j]!) / krr;
      }
    }
    for (let i = 0; i < 4; i++) {
      b[i]![r] = 0;
      b[r]![i] = 0;
    }
  };
  if (section.releaseStart) condense(1);
  if (section.releaseEnd) condense(3);
  const map = [1, 2, 4, 5] as const;
  for (let i = 0; i < 4; i++) {
    for (let j = 0; j < 4; j++) k[map[i]! * 6 + map[j]!] = b[i]![j]!;
  }
  return k;
}

/** Tᵀ·k·T for T = block-diag(R, R), R = [[c, s, 0], [−s, c, 0], [0, 0, 1]] taking global (x, y, rz) to local. */
export function toGlobal(k: Float64Array, c: number, s: number): Float64Array {
  const g = new Float64Array(k);
  // Columns: g ← g·T, then rows: g ← Tᵀ·g; R only mixes the x and y dofs of each end.
  for (let i = 0; i < 6; i++) {
    for (const o of [0, 3]) {
      const a = g[i * 6 + o]!;
      const b = g[i * 6 + o + 1]!;
      g[i * 6 + o] = a * c - b * s;
      g[i * 6 + o + 1] = a * s + b * c;
    }
  }
  for (let j = 0; j < 6; j++) {
    for (const o of [0, 3]) {
      const a = g[o * 6 + j]!;
      const b = g[(o + 1) * 6 + j]!;
      g[o * 6 + j] = a * c - b * s;
      g[(o + 1) * 6 + j] = a * s + b * c;
    }
  }
  // Exact symmetry, whatever the rounding of the two passes.
  for (let i = 0; i < 6; i++) {
    for (let j = i + 1; j < 6; j++) {
      const v = (g[i * 6 + j]! + g[j * 6 + i]!) / 2;
      g[i * 6 + j] = v;
      g[j * 6 + i] = v;
    }
  }
  return g;
}

/** global (x, y, rz) at both ends → local [u, v, θ] at both ends */
export function toLocal(
  d: readonly [number, number, number, number, number, number],
  c: number,
  s: number,
): LocalEndDisplacements {
  return [
    c * d[0] + s * d[1],
    -s * d[0] + c * d[1],
    d[2],
    c * d[3] + s * d[4],
    -s * d[3] + c * d[4],
    d[5],
  ];
}
