import { SolverInputError } from "@/lib/solver/errors";
import {
  buildStatics,
  columnDot,
  solveStatics,
  solveStaticsTransposed,
  type Column,
  type Statics,
} from "@/lib/solver/equilibrium";
import { addMemberLoad, buildParticular, emptyMemberLoads, memberBreakpoints, type LocalMemberLoads, type Particular } from "@/lib/solver/member-loads";
import { buildGeometry, memberDeformations, memberWork, type ForceState, type MemberGeometry } from "@/lib/solver/member-work";
import { solveSemidefinite } from "@/lib/solver/semidefinite";
import { assertStable } from "@/lib/solver/stability";
import type { ParsedLoad, ParsedModel } from "@/lib/solver/types";

/**
 * Force method on an automatically chosen primary structure. The elimination of the
 * locality-ordered equilibrium matrix keeps the first independent unknowns; each unknown
 * that depends on earlier ones is released and becomes a redundant X. The primary
 * (released) structure is then statically determinate and every state on it comes from one
 * banded solve. Flexibility coefficients f_ij = Σ∫(m_i m_j/EI + n_i n_j/EA + v_i v_j/GAv) dx.
 */
export interface Engine {
  model: ParsedModel;
  st: Statics;
  geo: MemberGeometry[];
  redundants: number[];
  unitStates: ForceState[];
  /** flexibility matrix, row-major r × r (m/N, rad/(N·m) …) */
  F: Float64Array;
  /** Maxwell–Betti: largest |f_ij − f_ji| and |f_ij(virtual work) − f_ij(compatibility)|, relative to max f_ii */
  reciprocity: { asymmetry: number; pathDifference: number; tolerance: number };
}

export const RECIPROCITY_TOLERANCE = 1e-9;

/** The loads of one load set, compiled against the statics. */
export interface CompiledLoads {
  loads: ParsedLoad[];
  /** right-hand side p of B s = p, by row */
  p: Float64Array;
  part: (Particular | undefined)[] | null;
  local: (LocalMemberLoads | undefined)[];
  eps0: Float64Array | null;
  /** the thermal (α·ΔT) and misfit (δ/L) parts of eps0, kept apart for the terms table */
  epsThermal: Float64Array | null;
  epsMisfit: Float64Array | null;
  /** prescribed support movement by reaction column (m), or null */
  settle: Float64Array | null;
}

export interface RealSolution {
  compiled: CompiledLoads;
  state: ForceState;
  /** redundant values (N, N·m) in the order of engine.redundants */
  X: Float64Array;
  /** nodal displacements by row of the statics (m, rad) */
  d: Float64Array;
}

export function describeColumn(model: ParsedModel, c: Column): string {
  if (c.kind === "R") return `reaction at node ${model.nodes[c.index]?.id} in ${c.dof}`;
  const id = model.members[c.index]?.id ?? "?";
  if (c.kind === "N") return `axial force in member ${id}`;
  return `bending moment at the ${c.kind === "Ma" ? "first" : "second"} end of member ${id}`;
}

export function buildEngine(model: ParsedModel, positions: Map<string, number[]>): Engine {
  const st = buildStatics(model);
  assertStable(st);
  const geo = model.members.map((m, j) => buildGeometry(st, j, memberBreakpoints(m, positions.get(m.id) ?? [])));
  const redundants = [...st.lu.dependentColumns];
  const nCols = st.columns.length;
  const zeroP = new Float64Array(st.nRows);
  const unitStates = redundants.map((c) => {
    const s = new Float64Array(nCols);
    s[c] = 1;
    solveStatics(st, zeroP, s);
    return { cols: s, part: null, eps0: null } satisfies ForceState;
  });
  const r = redundants.length;
  const F = new Float64Array(r * r);
  const scratch = { bending: 0, axial: 0, shear: 0, axialIntegral: 0 };
  for (let i = 0; i < r; i++) {
    for (let j = i; j < r; j++) {
      let f = 0;
      const a = unitStates[i] as ForceState;
      const b = unitStates[j] as ForceState;
      for (let k = 0; k < geo.length; k++) {
        const w = memberWork(geo[k] as MemberGeometry, k, a, b, scratch);
        f += w.bending + w.axial + w.shear;
      }
      F[i * r + j] = f;
      F[j * r + i] = f;
    }
  }
  const engine: Engine = {
    model,
    st,
    geo,
    redundants,
    unitStates,
    F,
    reciprocity: { asymmetry: 0, pathDifference: 0, tolerance: RECIPROCITY_TOLERANCE },
  };
  checkReciprocity(engine);
  return engine;
}

/** Generalized deformations of every column for a state (reactions: −prescribed movement). */
export function columnDeformations(engine: Engine, state: ForceState, settle: Float64Array | null): Float64Array {
  const e = new Float64Array(engine.st.columns.length);
  engine.geo.forEach((g, j) => {
    const d = memberDeformations(g, j, state);
    if (g.colN >= 0) e[g.colN] = d.eN;
    if (g.colMa >= 0) e[g.colMa] = d.eMa;
    if (g.colMb >= 0) e[g.colMb] = d.eMb;
  });
  if (settle) for (let c = 0; c < e.length; c++) if (settle[c]) e[c] = -(settle[c] ?? 0);
  return e;
}

/** Unit-load method for every nodal dof at once: d = −B_b⁻ᵀ e_b (the adjoint of B s = p). */
export function nodalDisplacements(engine: Engine, e: Float64Array): Float64Array {
  const d = solveStaticsTransposed(engine.st, Float64Array.from(e));
  for (let i = 0; i < d.length; i++) d[i] = -(d[i] ?? 0);
  return d;
}

/**
 * Maxwell–Betti, asserted: f_ij is also the gap at release i of the primary structure under
 * X_j = 1, found from compatibility (transposed solve) rather than from the work integral.
 */
function checkReciprocity(engine: Engine): void {
  const r = engine.redundants.length;
  if (r === 0) return;
  const kin = new Float64Array(r * r);
  for (let j = 0; j < r; j++) {
    const state = engine.unitStates[j] as ForceState;
    const e = columnDeformations(engine, state, null);
    const d = nodalDisplacements(engine, e);
    for (let i = 0; i < r; i++) {
      const c = engine.redundants[i] ?? 0;
      kin[i * r + j] = (e[c] ?? 0) + columnDot(engine.st, c, d);
    }
  }
  let maxDiag = 0;
  for (let i = 0; i < r; i++) maxDiag = Math.max(maxDiag, Math.abs(engine.F[i * r + i] ?? 0));
  let asym = 0;
  let path = 0;
  for (let i = 0; i < r; i++) {
    for (let j = 0; j < r; j++) {
      asym = Math.max(asym, Math.abs((kin[i * r + j] ?? 0) - (kin[j * r + i] ?? 0)));
      path = Math.max(path, Math.abs((kin[i * r + j] ?? 0) - (engine.F[i * r + j] ?? 0)));
    }
  }
  const scale = maxDiag > 0 ? maxDiag : 1;
  engine.reciprocity = { asymmetry: asym / scale, pathDifference: path / scale, tolerance: RECIPROCITY_TOLERANCE };
  if (asym > RECIPROCITY_TOLERANCE * scale || path > RECIPROCITY_TOLERANCE * scale) {
    throw new Error(
      `internal: Maxwell–Betti reciprocity fails (asymmetry ${asym / scale}, path difference ${path / scale})`,
    );
  }
}

export function compileLoads(engine: Engine, loads: ParsedLoad[]): CompiledLoads {
  const { st, model } = engine;
  const p = new Float64Array(st.nRows);
  const local: (LocalMemberLoads | undefined)[] = new Array(model.members.length);
  let epsThermal: Float64Array | null = null;
  let epsMisfit: Float64Array | null = null;
  let settle: Float64Array | null = null;
  const nd = st.dofs.length;
  for (const load of loads) {
    if (load.type === "node") {
      const i = st.nodeIndex.get(load.node) ?? 0;
      p[st.row(i, "x")] = (p[st.row(i, "x")] ?? 0) - load.Fx;
      p[st.row(i, "y")] = (p[st.row(i, "y")] ?? 0) - load.Fy;
      if (nd === 3) p[st.row(i, "rz")] = (p[st.row(i, "rz")] ?? 0) - load.M;
    } else if (load.type === "settlement") {
      const i = st.nodeIndex.get(load.node) ?? 0;
      settle ??= new Float64Array(st.columns.length);
      const cx = st.reactionCol[i * nd] ?? -1;
      const cy = st.reactionCol[i * nd + 1] ?? -1;
      if (cx >= 0) settle[cx] = (settle[cx] ?? 0) + load.dx;
      if (cy >= 0) settle[cy] = (settle[cy] ?? 0) + load.dy;
    } else {
      const j = st.memberIndex.get(load.member) ?? 0;
      const m = model.members[j];
      if (!m) continue;
      if (load.type === "thermal") {
        epsThermal ??= new Float64Array(model.members.length);
        epsThermal[j] = (epsThermal[j] ?? 0) + load.alpha * load.dT;
      } else if (load.type === "misfit") {
        // A member made too long by δ behaves as a uniform initial strain δ/L.
        epsMisfit ??= new Float64Array(model.members.length);
        epsMisfit[j] = (epsMisfit[j] ?? 0) + load.delta / m.length;
      } else {
        const l = (local[j] ??= emptyMemberLoads());
        addMemberLoad(l, m, load, 1);
      }
    }
  }
  const part = addParticulars(engine, local, p);
  let eps0: Float64Array | null = null;
  if (epsThermal || epsMisfit) {
    eps0 = new Float64Array(model.members.length);
    for (let j = 0; j < eps0.length; j++) eps0[j] = (epsThermal?.[j] ?? 0) + (epsMisfit?.[j] ?? 0);
  }
  return { loads, p, part, local, eps0, epsThermal, epsMisfit, settle };
}

/** Builds the simple-span parts of member loads and adds their reactions to p. */
export function addParticulars(
  engine: Engine,
  local: (LocalMemberLoads | undefined)[],
  p: Float64Array,
): (Particular | undefined)[] | null {
  let part: (Particular | undefined)[] | null = null;
  const { st, model } = engine;
  local.forEach((l, j) => {
    if (!l) return;
    const m = model.members[j];
    const g = engine.geo[j];
    if (!m || !g) return;
    const q = buildParticular(m, g.xs, l);
    part ??= new Array(model.members.length);
    part[j] = q;
    const a = st.nodeIndex.get(m.start) ?? 0;
    const b = st.nodeIndex.get(m.end) ?? 0;
    const { cos: c, sin: s } = m;
    // Node-on-member forces of the simple span, local → global.
    p[st.row(a, "x")] = (p[st.row(a, "x")] ?? 0) - s * q.Fay;
    p[st.row(a, "y")] = (p[st.row(a, "y")] ?? 0) + c * q.Fay;
    p[st.row(b, "x")] = (p[st.row(b, "x")] ?? 0) + c * q.Fbx - s * q.Fby;
    p[st.row(b, "y")] = (p[st.row(b, "y")] ?? 0) + s * q.Fbx + c * q.Fby;
  });
  return part;
}

/** The real internal forces and displacements of one load set. */
export function solveReal(engine: Engine, compiled: CompiledLoads): RealSolution {
  const { st, geo, redundants, unitStates } = engine;
  const nCols = st.columns.length;
  const cols = solveStatics(st, compiled.p, new Float64Array(nCols));
  const state0: ForceState = { cols, part: compiled.part, eps0: compiled.eps0 };
  const r = redundants.length;
  const X = new Float64Array(r);
  if (r > 0) {
    const delta = new Float64Array(r);
    const scratch = { bending: 0, axial: 0, shear: 0, axialIntegral: 0 };
    for (let i = 0; i < r; i++) {
      const u = unitStates[i] as ForceState;
      let sum = 0;
      for (let k = 0; k < geo.length; k++) {
        const w = memberWork(geo[k] as MemberGeometry, k, u, state0, scratch);
        sum += w.bending + w.axial + w.shear + (compiled.eps0?.[k] ?? 0) * w.axialIntegral;
      }
      if (compiled.settle) for (let c = 0; c < nCols; c++) sum -= (u.cols[c] ?? 0) * (compiled.settle[c] ?? 0);
      delta[i] = -sum;
    }
    const sol = solveSemidefinite(engine.F, delta, r);
    if (sol.inconsistent >= 0) throw axialRigidityError(engine, sol.inconsistent);
    X.set(sol.x);
    for (let i = 0; i < r; i++) {
      const u = unitStates[i] as ForceState;
      const xi = X[i] ?? 0;
      if (xi === 0) continue;
      for (let c = 0; c < nCols; c++) cols[c] = (cols[c] ?? 0) + xi * (u.cols[c] ?? 0);
    }
  }
  const state: ForceState = { cols, part: compiled.part, eps0: compiled.eps0 };
  const d = nodalDisplacements(engine, columnDeformations(engine, state, compiled.settle));
  return { compiled, state, X, d };
}

function axialRigidityError(engine: Engine, i: number): SolverInputError {
  const u = engine.unitStates[i] as ForceState;
  const g = engine.geo.find((q) => q.colN >= 0 && q.fN === 0 && Math.abs(u.cols[q.colN] ?? 0) > 1e-12);
  const id = g?.member.id ?? engine.model.members[0]?.id ?? "?";
  return new SolverInputError([
    {
      path: `members.${id}.A`,
      message:
        "is required: the member is restrained along its axis and a temperature change, misfit or settlement acts, so its axial stiffness decides the forces",
    },
  ]);
}
