import type { ParsedLoad, ParsedMember } from "@/lib/solver/types";

/**
 * Loads on one member in its local axes (x along the member from its first end, y turned
 * 90° counter-clockwise): N, N·m, N/m, positions in m from the first end.
 */
export interface LocalMemberLoads {
  points: { a: number; px: number; py: number }[];
  couples: { a: number; C: number }[];
  lines: { a: number; b: number; qxa: number; qxb: number; qya: number; qyb: number }[];
}

export function emptyMemberLoads(): LocalMemberLoads {
  return { points: [], couples: [], lines: [] };
}

/** Adds a member load of a load set (scaled by `factor`) in local components. */
export function addMemberLoad(out: LocalMemberLoads, m: ParsedMember, load: ParsedLoad, factor: number): void {
  // A global-y intensity w has local components (w·sin, w·cos); a local one is (0, w).
  const gx = load.type !== "moment" && "dir" in load && load.dir === "global" ? m.sin : 0;
  const gy = load.type !== "moment" && "dir" in load && load.dir === "global" ? m.cos : 1;
  if (load.type === "point") out.points.push({ a: load.a, px: factor * load.P * gx, py: factor * load.P * gy });
  else if (load.type === "moment") out.couples.push({ a: load.a, C: factor * load.M });
  else if (load.type === "line") {
    out.lines.push({
      a: load.a,
      b: load.b,
      qxa: factor * load.wa * gx,
      qxb: factor * load.wb * gx,
      qya: factor * load.wa * gy,
      qyb: factor * load.wb * gy,
    });
  }
}

/** Sorted distinct breakpoints (m) of a member: its ends and every given position. */
export function memberBreakpoints(m: ParsedMember, positions: readonly number[]): readonly number[] {
  if (positions.length === 0) return [0, m.length];
  const tol = 1e-10 * m.length;
  const xs = [0, m.length, ...positions.filter((x) => x > tol && x < m.length - tol)].sort((p, q) => p - q);
  const out: number[] = [];
  for (const x of xs) if (out.length === 0 || x - (out[out.length - 1] ?? 0) > tol) out.push(x);
  out[out.length - 1] = m.length;
  return out;
}

/** Index of the breakpoint at x (within 1e-10 L), or −1. */
export function breakpointIndex(xs: readonly number[], x: number, L: number): number {
  let lo = 0;
  let hi = xs.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const v = xs[mid] ?? 0;
    if (Math.abs(v - x) <= 1e-10 * L) return mid;
    if (v < x) lo = mid + 1;
    else hi = mid - 1;
  }
  return -1;
}

/** Segment k with xs[k] ≤ x ≤ xs[k+1] (the last segment at x = L). */
export function segmentOf(xs: readonly number[], x: number): number {
  let lo = 0;
  let hi = xs.length - 2;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if ((xs[mid] ?? 0) <= x) lo = mid;
    else hi = mid - 1;
  }
  return Math.max(0, lo);
}

/**
 * The member's own loads carried as a simple span (end moments and first-end axial force
 * zero): the node-on-member reactions and, per segment, N, V, M at its start plus the
 * intensities there, so that on segment k at offset h
 *   N = N0 − qx·h − kx·h²/2,  V = V0 + qy·h + ky·h²/2,  M = M0 + V0·h + qy·h²/2 + ky·h³/6.
 * Sign convention as in equilibrium.ts (dM/dx = V, dV/dx = qy, dN/dx = −qx).
 */
export interface Particular {
  /** node-on-member local forces at the first end (y) and second end (x, y), N */
  Fay: number;
  Fbx: number;
  Fby: number;
  N0: Float64Array;
  V0: Float64Array;
  M0: Float64Array;
  qx: Float64Array;
  kx: Float64Array;
  qy: Float64Array;
  ky: Float64Array;
}

export function buildParticular(m: ParsedMember, xs: readonly number[], loads: LocalMemberLoads): Particular {
  const L = m.length;
  const nSeg = xs.length - 1;
  let sumPx = 0;
  let sumPy = 0;
  let momentAboutB = 0; // Σ (x − L)·py + Σ C, N·m
  for (const p of loads.points) {
    sumPx += p.px;
    sumPy += p.py;
    momentAboutB += (p.a - L) * p.py;
  }
  for (const c of loads.couples) momentAboutB += c.C;
  for (const l of loads.lines) {
    const len = l.b - l.a;
    const Qx = ((l.qxa + l.qxb) / 2) * len;
    const Qy = ((l.qya + l.qyb) / 2) * len;
    const firstMoment = (len / 6) * (l.qya * (2 * l.a + l.b) + l.qyb * (l.a + 2 * l.b)); // ∫ x·qy dx
    sumPx += Qx;
    sumPy += Qy;
    momentAboutB += firstMoment - L * Qy;
  }
  const Fay = momentAboutB / L;
  const part: Particular = {
    Fay,
    Fbx: -sumPx,
    Fby: -Fay - sumPy,
    N0: new Float64Array(nSeg),
    V0: new Float64Array(nSeg),
    M0: new Float64Array(nSeg),
    qx: new Float64Array(nSeg),
    kx: new Float64Array(nSeg),
    qy: new Float64Array(nSeg),
    ky: new Float64Array(nSeg),
  };
  // Jumps at breakpoints from concentrated loads (a point load at x applies just right of x).
  const dN = new Float64Array(xs.length);
  const dV = new Float64Array(xs.length);
  const dM = new Float64Array(xs.length);
  for (const p of loads.points) {
    const k = breakpointIndex(xs, p.a, L);
    if (k < 0) throw new Error(`internal: point load at ${p.a} m is not a breakpoint of ${m.id}`);
    dN[k] = (dN[k] ?? 0) - p.px;
    dV[k] = (dV[k] ?? 0) + p.py;
  }
  for (const c of loads.couples) {
    const k = breakpointIndex(xs, c.a, L);
    if (k < 0) throw new Error(`internal: couple at ${c.a} m is not a breakpoint of ${m.id}`);
    dM[k] = (dM[k] ?? 0) - c.C;
  }
  let N = 0;
  let V = Fay;
  let M = 0;
  for (let k = 0; k < nSeg; k++) {
    const x0 = xs[k] ?? 0;
    const x1 = xs[k + 1] ?? 0;
    N += dN[k] ?? 0;
    V += dV[k] ?? 0;
    M += dM[k] ?? 0;
    let qx = 0;
    let kx = 0;
    let qy = 0;
    let ky = 0;
    const tol = 1e-10 * L;
    for (const l of loads.lines) {
      if (l.a > x0 + tol || l.b < x1 - tol) continue;
      const len = l.b - l.a;
      const t = (x0 - l.a) / len;
      qx += l.qxa + (l.qxb - l.qxa) * t;
      qy += l.qya + (l.qyb - l.qya) * t;
      kx += (l.qxb - l.qxa) / len;
      ky += (l.qyb - l.qya) / len;
    }
    part.N0[k] = N;
    part.V0[k] = V;
    part.M0[k] = M;
    part.qx[k] = qx;
    part.kx[k] = kx;
    part.qy[k] = qy;
    part.ky[k] = ky;
    const h = x1 - x0;
    M += V * h + (qy * h * h) / 2 + (ky * h * h * h) / 6;
    V += qy * h + (ky * h * h) / 2;
    N -= qx * h + (kx * h * h) / 2;
  }
  return part;
}
