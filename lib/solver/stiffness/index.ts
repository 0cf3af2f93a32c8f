/**
 * Independent direct stiffness cross-check for plane beams, trusses and frames.
 *
 * Shares nothing with the virtual-work checker except the parsed model type. All input and
 * output in SI: m, rad, N, N·m, Pa.
 *
 * Sign conventions
 * - Global axes: x right, y up, rz counter-clockwise. Node displacements, reactions and the
 *   ux, uy of stations are global. Reactions are the forces the supports exert on the
 *   structure (Fx, Fy in N, M in N·m counter-clockwise).
 * - Member local axes: x from the first end to the second, y = x turned 90° counter-clockwise.
 * - N: axial force, tension positive.
 * - M: bending moment, positive when it puts the fibre on the member's local −y side in
 *   tension ("sagging" for a member drawn left to right, whose local +y is up). On the cut
 *   face of the part nearer the first end it acts counter-clockwise.
 * - V = dM/dx along the local x axis; so dV/dx = q (transverse load, local +y positive) and a
 *   member running left to right under gravity load has V > 0 near its left support. On the
 *   cut face of the part nearer the first end V acts in local −y.
 * - rz of a station is the rotation of the member's own cross-section (at a hinge it differs
 *   from the node's). With shear deformation, dv/dx = rz − V/(G·Av).
 * - At a concentrated load or couple V and M are the values just before it (x⁻).
 * - Node rz is NaN where the node has no rotational dof: every node of a truss, and a node at
 *   which every attached member is hinged (unless a support holds it, then 0).
 *
 * Method: exact member stiffness (Euler–Bernoulli, or Timoshenko with φ = 12EI/(G·Av·L²)),
 * hinges condensed statically, exact fixed-end forces and interior fields from integrating
 * the beam equations with the member's own loads (see member.ts). Dofs are numbered node by
 * node in reverse Cuthill–McKee order and the stiffness is factored once (envelope Cholesky);
 * each load set is then one forward and back substitution. Beam members given without A are
 * axially rigid: their zero elongation (or α·ΔT·L + misfit) is imposed exactly as a
 * constraint, solved by augmented-Lagrangian iterative refinement on the same factor; the
 * multiplier is the member's axial force.
 */

import type { Dof, ParsedLoad, ParsedLocation, ParsedModel } from "@/lib/solver/types";
import { type PreparedModel, numberDofs, prepareModel } from "@/lib/solver/stiffness/assemble";
import { EnvelopeMatrix, solveFactored } from "@/lib/solver/stiffness/envelope-cholesky";
import { StiffnessInputError, StiffnessSingularError } from "@/lib/solver/stiffness/errors";
import {
  type LocalMemberLoads,
  type MemberState,
  emptyLoads,
  endForces,
  fieldAt,
  loadIntegrals,
  memberState,
  toLocal,
} from "@/lib/solver/stiffness/member";

export { StiffnessInputError, StiffnessSingularError } from "@/lib/solver/stiffness/errors";

/** m, m (global), m (global), rad, N (tension +), N, N·m */
export interface StiffnessStation {
  x: number;
  ux: number;
  uy: number;
  rz: number;
  N: number;
  V: number;
  M: number;
}

export interface StiffnessCaseResult {
  /** global, m, m, rad */
  nodes: Map<string, { x: number; y: number; rz: number }>;
  /** N, N, N·m at supported nodes, global, acting on the structure */
  reactions: Map<string, { Fx: number; Fy: number; M: number }>;
  /** global dof; exact inside members too */
  displacementAt(at: ParsedLocation, dof: Dof): number;
  /** xs in m from the member's first end */
  stations(memberId: string, xs: number[]): StiffnessStation[];
}

/** Size of the factored system, for benchmarks and for checking the ordering. */
export function stiffnessBandwidth(model: ParsedModel): { dofs: number; halfBandwidth: number; envelope: number } {
  const { firstCol, nFree } = numberDofs(model);
  let hb = 0;
  let env = 0;
  for (let i = 0; i < nFree; i++) {
    hb = Math.max(hb, i - firstCol[i]!);
    env += i - firstCol[i]! + 1;
  }
  return { dofs: nFree, halfBandwidth: hb, envelope: env };
}

/** Assemble and factor once, then solve every load set (multiple right-hand sides). */
export function solveStiffness(model: ParsedModel, loadSets: ParsedLoad[][]): StiffnessCaseResult[] {
  const prep = prepareModel(model);
  return loadSets.map((set) => solveLoadSet(prep, set));
}

const POSITION_TOL = 1e-9;

function positionOnMember(prep: PreparedModel, member: number, a: number, what: string): number {
  const L = prep.sections[member]!.L;
  const id = prep.sections[member]!.id;
  if (!Number.isFinite(a) || a < -POSITION_TOL * L || a > L * (1 + POSITION_TOL))
    throw new StiffnessInputError(`member ${id}: ${what} at ${a} m is outside the member (length ${L} m)`);
  return Math.min(Math.max(a, 0), L);
}

function memberOf(prep: PreparedModel, id: string, what: string): number {
  const k = prep.memberIndex.get(id);
  if (k === undefined) throw new StiffnessInputError(`${what}: unknown member ${id}`);
  return k;
}

function nodeOf(prep: PreparedModel, id: string, what: string): number {
  const n = prep.nodeIndex.get(id);
  if (n === undefined) throw new StiffnessInputError(`${what}: unknown node ${id}`);
  return n;
}

function loadsFor(map: Map<number, LocalMemberLoads>, k: number): LocalMemberLoads {
  let l = map.get(k);
  if (!l) {
    l = emptyLoads();
    map.set(k, l);
  }
  return l;
}

function maxAbs(a: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i]!));
  return m;
}

function solveLoadSet(prep: PreparedModel, set: ParsedLoad[]): StiffnessCaseResult {
  const { model, sections, ends, free, held, nFree, nHeld, bar } = prep;
  const nNodes = model.nodes.length;
  const nodeLoads = new Float64Array(3 * nNodes);
  const memberLoads = new Map<number, LocalMemberLoads>();
  const prescribed = new Float64Array(nHeld);

  for (const load of set) {
    switch (load.type) {
      case "node": {
        const n = nodeOf(prep, load.node, "node load");
        if (load.M !== 0 && held[3 * n + 2]! < 0 && (bar || !prep.exists[3 * n + 2])) {
          throw new StiffnessSingularError(
            load.node,
            "rz",
            bar ? "a truss joint cannot take the applied moment" : "every member is hinged here, so the applied moment has nothing to resist it",
          );
        }
        nodeLoads[3 * n]! += load.Fx;
        nodeLoads[3 * n + 1]! += load.Fy;
        if (!bar) nodeLoads[3 * n + 2]! += load.M;
        break;
      }
      case "line":
      case "point":
      case "moment": {
        const k = memberOf(prep, load.member, `${load.type} load`);
        const sec = sections[k]!;
        if (sec.bar)
          throw new StiffnessInputError(
            `member ${sec.id}: a truss member is pin-ended and takes no ${load.type} load; apply it at the joints`,
          );
        const l = loadsFor(memberLoads, k);
        const c = load.type === "moment" || load.dir === "local" ? 1 : sec.cos;
        const s = load.type === "moment" || load.dir === "local" ? 0 : sec.sin;
        if (load.type === "line") {
          const a = positionOnMember(prep, k, load.a, "line load start");
          const b = positionOnMember(prep, k, load.b, "line load end");
          if (b < a) throw new StiffnessInputError(`member ${sec.id}: line load ends (${b} m) before it starts (${a} m)`);
          if (b === a) break;
          l.lines.push({ a, b, qa: load.wa * c, qb: load.wb * c, pa: load.wa * s, pb: load.wb * s });
        } else if (load.type === "point") {
          const a = positionOnMember(prep, k, load.a, "point load");
          l.points.push({ a, Py: load.P * c, Px: load.P * s });
        } else {
          const a = positionOnMember(prep, k, load.a, "couple");
          l.couples.push({ a, C: load.M });
        }
        break;
      }
      case "thermal": {
        const k = memberOf(prep, load.member, "temperature load");
        loadsFor(memberLoads, k).eps0 += load.alpha * load.dT;
        break;
      }
      case "misfit": {
        const k = memberOf(prep, load.member, "misfit");
        loadsFor(memberLoads, k).eps0 += load.delta / sections[k]!.L;
        break;
      }
      case "settlement": {
        const n = nodeOf(prep, load.node, "settlement");
        const parts: [number, number][] = [
          [0, load.dx],
          [1, load.dy],
        ];
        for (const [d, value] of parts) {
          if (value === 0) continue;
          const h = held[3 * n + d]!;
          if (h < 0)
            throw new StiffnessInputError(
              `settlement at node ${load.node}: ${d === 0 ? "x" : "y"} is not held by a support`,
            );
          prescribed[h]! += value;
        }
        break;
      }
    }
  }

  // Right-hand side: node loads less the fixed-end forces of member loads.
  const f = new Float64Array(nFree);
  for (let i = 0; i < 3 * nNodes; i++) {
    const p = free[i]!;
    if (p >= 0) f[p] = nodeLoads[i]!;
  }
  const fixedGlobal = new Map<number, Float64Array>();
  const rigidFixedN0 = new Map<number, number>();
  const zero = [0, 0, 0, 0, 0, 0] as const;
  for (const [k, l] of memberLoads) {
    const sec = sections[k]!;
    let n0 = 0;
    if (sec.EA === null) {
      // The split of axial load between the ends of a rigid bar is arbitrary; take the
      // uniform-EA split, the multiplier carries the rest.
      n0 = loadIntegrals(l, sec.L, true).Uq / sec.L;
      rigidFixedN0.set(k, n0);
    }
    const fl = endForces(memberState(sec, l, zero, n0));
    const c = sec.cos;
    const s = sec.sin;
    const fg = new Float64Array([
      c * fl[0] - s * fl[1],
      s * fl[0] + c * fl[1],
      fl[2],
      c * fl[3] - s * fl[4],
      s * fl[3] + c * fl[4],
      fl[5],
    ]);
    fixedGlobal.set(k, fg);
    const a = ends[2 * k]!;
    const b = ends[2 * k + 1]!;
    for (let j = 0; j < 6; j++) {
      const node = j < 3 ? a : b;
      const p = free[3 * node + (j % 3)]!;
      if (p >= 0) f[p]! -= fg[j]!;
    }
  }

  // Prescribed support movements.
  const hasSettlement = prescribed.some((v) => v !== 0);
  if (hasSettlement) {
    for (let k = 0; k < sections.length; k++) {
      const a = ends[2 * k]!;
      const b = ends[2 * k + 1]!;
      const dofs = [3 * a, 3 * a + 1, 3 * a + 2, 3 * b, 3 * b + 1, 3 * b + 2];
      const dp = dofs.map((i) => {
        const h = held[i]!;
        return h >= 0 ? prescribed[h]! : 0;
      });
      if (dp.every((v) => v === 0)) continue;
      const kg = prep.kGlobal[k]!;
      for (let p = 0; p < 6; p++) {
        const ip = free[dofs[p]!]!;
        if (ip < 0) continue;
        let s = 0;
        for (let q = 0; q < 6; q++) s += kg[p * 6 + q]! * dp[q]!;
        f[ip]! -= s;
      }
    }
  }

  // Rigid-member constraints: e·(d_end − d_start) = elongation.
  const elongation = (k: number): number => {
    const l = memberLoads.get(k);
    return l ? l.eps0 * sections[k]!.L : 0;
  };
  for (const k of prep.rigidLocked) {
    const sec = sections[k]!;
    const a = ends[2 * k]!;
    const b = ends[2 * k + 1]!;
    const get = (i: number): number => {
      const h = held[i]!;
      return h >= 0 ? prescribed[h]! : 0;
    };
    const stretch = sec.cos * (get(3 * b) - get(3 * a)) + sec.sin * (get(3 * b + 1) - get(3 * a + 1));
    if (Math.abs(stretch - elongation(k)) > 1e-12 * sec.L)
      throw new StiffnessInputError(
        `member ${sec.id} is axially rigid (no A) and held at both ends: it cannot take its change of length; give A`,
      );
  }

  const x = new Float64Array(f);
  const lambda = new Float64Array(prep.rigid.length);
  if (prep.rigid.length === 0) {
    solveFactored(prep.factor, x);
  } else {
    const target = prep.rigid.map((rc) => {
      let c = elongation(rc.member);
      for (let j = 0; j < rc.heldIdx.length; j++) c -= rc.heldCoef[j]! * prescribed[rc.heldIdx[j]!]!;
      return c;
    });
    solveConstrained(prep, prep.soft, f, target, x, lambda);
  }

  // Full displacement vector, zeros where a dof does not exist.
  const D = new Float64Array(3 * nNodes);
  for (let i = 0; i < 3 * nNodes; i++) {
    const p = free[i]!;
    const h = held[i]!;
    if (p >= 0) D[i] = x[p]!;
    else if (h >= 0) D[i] = prescribed[h]!;
  }
  const rigidN0 = new Map<number, number>();
  prep.rigid.forEach((rc, j) => rigidN0.set(rc.member, lambda[j]! + (rigidFixedN0.get(rc.member) ?? 0)));
  for (const k of prep.rigidLocked) rigidN0.set(k, rigidFixedN0.get(k) ?? 0);

  const nodes = new Map<string, { x: number; y: number; rz: number }>();
  model.nodes.forEach((node, n) => {
    const hasRz = !bar && (prep.exists[3 * n + 2] === 1 || held[3 * n + 2]! >= 0);
    nodes.set(node.id, { x: D[3 * n]!, y: D[3 * n + 1]!, rz: hasRz ? D[3 * n + 2]! : NaN });
  });

  const memberEndGlobal = (k: number): Float64Array => {
    const a = ends[2 * k]!;
    const b = ends[2 * k + 1]!;
    const d = [D[3 * a]!, D[3 * a + 1]!, D[3 * a + 2]!, D[3 * b]!, D[3 * b + 1]!, D[3 * b + 2]!];
    const kg = prep.kGlobal[k]!;
    const out = new Float64Array(6);
    for (let p = 0; p < 6; p++) {
      let s = 0;
      for (let q = 0; q < 6; q++) s += kg[p * 6 + q]! * d[q]!;
      out[p] = s;
    }
    const fg = fixedGlobal.get(k);
    if (fg) for (let p = 0; p < 6; p++) out[p]! += fg[p]!;
    const sec = sections[k]!;
    if (sec.EA === null) {
      // Rigid bar force beyond its fixed-end share: the multiplier.
      const lam = (rigidN0.get(k) ?? 0) - (rigidFixedN0.get(k) ?? 0);
      out[0]! -= lam * sec.cos;
      out[1]! -= lam * sec.sin;
      out[3]! += lam * sec.cos;
      out[4]! += lam * sec.sin;
    }
    return out;
  };

  const reactions = new Map<string, { Fx: number; Fy: number; M: number }>();
  for (const s of model.supports) {
    const n = prep.nodeIndex.get(s.node)!;
    const r = [0, 0, 0];
    for (const k of prep.membersAtNode[n]!) {
      const fe = memberEndGlobal(k);
      const o = ends[2 * k] === n ? 0 : 3;
      for (let d = 0; d < 3; d++) r[d]! += fe[o + d]!;
    }
    const out = { Fx: 0, Fy: 0, M: 0 };
    if (held[3 * n]! >= 0) out.Fx = r[0]! - nodeLoads[3 * n]!;
    if (held[3 * n + 1]! >= 0) out.Fy = r[1]! - nodeLoads[3 * n + 1]!;
    if (held[3 * n + 2]! >= 0) out.M = r[2]! - nodeLoads[3 * n + 2]!;
    // Two support entries on one node still give one reaction.
    if (!reactions.has(s.node)) reactions.set(s.node, out);
  }

  const states = new Map<number, MemberState>();
  const stateOf = (k: number): MemberState => {
    let st = states.get(k);
    if (st) return st;
    const sec = sections[k]!;
    const a = ends[2 * k]!;
    const b = ends[2 * k + 1]!;
    const dl = toLocal([D[3 * a]!, D[3 * a + 1]!, D[3 * a + 2]!, D[3 * b]!, D[3 * b + 1]!, D[3 * b + 2]!], sec.cos, sec.sin);
    st = memberState(sec, memberLoads.get(k) ?? emptyLoads(), dl, rigidN0.get(k) ?? 0);
    states.set(k, st);
    return st;
  };

  const stationAt = (k: number, xAlong: number): StiffnessStation => {
    const sec = sections[k]!;
    const x = positionOnMember(prep, k, xAlong, "station");
    const fl = fieldAt(stateOf(k), x);
    return {
      x: xAlong,
      ux: sec.cos * fl.u - sec.sin * fl.v,
      uy: sec.sin * fl.u + sec.cos * fl.v,
      rz: fl.theta,
      N: fl.N,
      V: fl.V,
      M: fl.M,
    };
  };

  return {
    nodes,
    reactions,
    displacementAt(at: ParsedLocation, dof: Dof): number {
      if ("node" in at) {
        const v = nodes.get(at.node);
        if (!v) throw new StiffnessInputError(`displacement asked at unknown node ${at.node}`);
        return v[dof];
      }
      const k = memberOf(prep, at.member, "displacement asked");
      const st = stationAt(k, at.x);
      return dof === "x" ? st.ux : dof === "y" ? st.uy : st.rz;
    },
    stations(memberId: string, xs: number[]): StiffnessStation[] {
      const k = memberOf(prep, memberId, "stations asked");
      return xs.map((xv) => stationAt(k, xv));
    },
  };
}

/**
 * K·d + G·λ = f with Gᵀ·d = c, by iterative refinement on the factor of K + β·G·Gᵀ: each
 * pass solves the augmented system for the current residuals with one Uzawa step, so the
 * equilibrium residual is computed with the unpenalised K and the final accuracy does not
 * depend on β.
 */
function solveConstrained(
  prep: PreparedModel,
  K: EnvelopeMatrix,
  f: Float64Array,
  c: number[],
  x: Float64Array,
  lambda: Float64Array,
): void {
  const { rigid, beta, nFree } = prep;
  x.fill(0);
  lambda.fill(0);
  const r = new Float64Array(nFree);
  const rc = new Float64Array(rigid.length);
  const Kx = new Float64Array(nFree);
  const dx = new Float64Array(nFree);
  const scaleF = Math.max(maxAbs(f), beta * maxAbs(c), Number.MIN_VALUE);
  let prevStep = Infinity;
  const MAX_PASSES = 60;
  for (let pass = 0; pass < MAX_PASSES; pass++) {
    K.multiply(x, Kx);
    for (let i = 0; i < nFree; i++) r[i] = f[i]! - Kx[i]!;
    rigid.forEach((g, j) => {
      let gx = 0;
      for (let t = 0; t < g.freeIdx.length; t++) {
        r[g.freeIdx[t]!]! -= g.freeCoef[t]! * lambda[j]!;
        gx += g.freeCoef[t]! * x[g.freeIdx[t]!]!;
      }
      rc[j] = c[j]! - gx;
    });
    dx.set(r);
    rigid.forEach((g, j) => {
      for (let t = 0; t < g.freeIdx.length; t++) dx[g.freeIdx[t]!]! += g.freeCoef[t]! * beta * rc[j]!;
    });
    solveFactored(prep.factor, dx);
    let stepLam = 0;
    rigid.forEach((g, j) => {
      let gdx = 0;
      for (let t = 0; t < g.freeIdx.length; t++) gdx += g.freeCoef[t]! * dx[g.freeIdx[t]!]!;
      const dl = beta * (gdx - rc[j]!);
      lambda[j]! += dl;
      stepLam = Math.max(stepLam, Math.abs(dl));
    });
    for (let i = 0; i < nFree; i++) x[i]! += dx[i]!;
    const step = Math.max(maxAbs(dx) / Math.max(maxAbs(x), Number.MIN_VALUE), stepLam / Math.max(maxAbs(lambda), scaleF));
    if (step <= 1e-15) return;
    // Past the contraction phase the corrections are rounding noise: stop when they stall.
    if (pass >= 3 && step > 0.5 * prevStep) break;
    prevStep = step;
  }
  // Not converging: the constraints contradict each other (e.g. a closed ring of rigid bars
  // asked to change length). Say which members.
  let worst = 0;
  rigid.forEach((g, j) => {
    let gx = 0;
    for (let t = 0; t < g.freeIdx.length; t++) gx += g.freeCoef[t]! * x[g.freeIdx[t]!]!;
    worst = Math.max(worst, Math.abs(c[j]! - gx) / prep.sections[g.member]!.L);
  });
  if (worst > 1e-10) {
    throw new StiffnessInputError(
      `axially rigid members (no A) ${rigid.map((g) => prep.sections[g.member]!.id).join(", ")} cannot all keep their lengths; give A`,
    );
  }
}
