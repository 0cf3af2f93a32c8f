// Dof numbering, assembly and the one factorization per model.

import type { Dof, ParsedModel } from "@/lib/solver/types";
import { EnvelopeMatrix, ZeroPivotError, factorEnvelope } from "@/lib/solver/stiffness/envelope-cholesky";
import { StiffnessInputError, StiffnessSingularError } from "@/lib/solver/stiffness/errors";
import { type MemberSection, localStiffness, sectionOf, toGlobal } from "@/lib/solver/stiffness/member";
import { reverseCuthillMcKee } from "@/lib/solver/stiffness/node-order";

export const DOF_NAMES: readonly Dof[] = ["x", "y", "rz"];

/** An axially rigid member as the constraint e·(d_end − d_start) = elongation on free dofs. */
export interface RigidConstraint {
  member: number;
  /** free dof indices and coefficients (direction cosines, signed) */
  freeIdx: number[];
  freeCoef: number[];
  heldIdx: number[];
  heldCoef: number[];
}

export interface PreparedModel {
  model: ParsedModel;
  bar: boolean;
  nodeIndex: Map<string, number>;
  memberIndex: Map<string, number>;
  sections: MemberSection[];
  /** start and end node index per member */
  ends: Int32Array;
  kGlobal: Float64Array[];
  /** per node × 3: free dof index or −1 */
  free: Int32Array;
  /** per node × 3: held (prescribed) dof index or −1 */
  held: Int32Array;
  /** per node × 3: the dof exists in the model (rz needs a rigidly attached bending member) */
  exists: Uint8Array;
  nFree: number;
  nHeld: number;
  freeNode: Int32Array;
  freeDof: Int8Array;
  membersAtNode: number[][];
  /** assembled stiffness without the constraint penalties (needed for the residuals) */
  soft: EnvelopeMatrix;
  /** factor of soft + Σ β·g·gᵀ */
  factor: EnvelopeMatrix;
  rigid: RigidConstraint[];
  /** members whose rigid constraint touches held dofs only */
  rigidLocked: number[];
  /** penalty stiffness of the constraints, N/m */
  beta: number;
}

/** Validates sections and connectivity and numbers the dofs; no matrix work. */
export function numberDofs(model: ParsedModel): Omit<PreparedModel, "kGlobal" | "soft" | "factor" | "rigid" | "rigidLocked" | "beta"> & {
  firstCol: Int32Array;
} {
  const bar = model.kind === "truss";
  const nodeIndex = new Map<string, number>();
  model.nodes.forEach((n, i) => {
    if (nodeIndex.has(n.id)) throw new StiffnessInputError(`node ${n.id}: listed twice`);
    nodeIndex.set(n.id, i);
  });
  const nNodes = model.nodes.length;
  const memberIndex = new Map<string, number>();
  const ends = new Int32Array(2 * model.members.length);
  const sections: MemberSection[] = [];
  const membersAtNode: number[][] = Array.from({ length: nNodes }, () => []);
  const exists = new Uint8Array(3 * nNodes);
  for (let i = 0; i < nNodes; i++) {
    exists[3 * i] = 1;
    exists[3 * i + 1] = 1;
  }
  model.members.forEach((m, k) => {
    if (memberIndex.has(m.id)) throw new StiffnessInputError(`member ${m.id}: listed twice`);
    memberIndex.set(m.id, k);
    const a = nodeIndex.get(m.start);
    const b = nodeIndex.get(m.end);
    if (a === undefined) throw new StiffnessInputError(`member ${m.id}: unknown node ${m.start}`);
    if (b === undefined) throw new StiffnessInputError(`member ${m.id}: unknown node ${m.end}`);
    if (a === b) throw new StiffnessInputError(`member ${m.id}: both ends at node ${m.start}`);
    if (!(m.length > 0)) throw new StiffnessInputError(`member ${m.id}: length must be positive`);
    if (!(m.E > 0)) throw new StiffnessInputError(`member ${m.id}: E must be positive`);
    if (bar && !(m.A !== undefined && m.A > 0))
      throw new StiffnessInputError(`member ${m.id}: a truss member needs a positive area A`);
    if (m.A !== undefined && !(m.A > 0)) throw new StiffnessInputError(`member ${m.id}: A must be positive`);
    if (!bar && !(m.I !== undefined && m.I > 0))
      throw new StiffnessInputError(`member ${m.id}: a ${model.kind} member needs a positive I`);
    if (!bar && m.shear && !(m.shear.G > 0 && m.shear.Av > 0))
      throw new StiffnessInputError(`member ${m.id}: shear G and Av must be positive`);
    ends[2 * k] = a;
    ends[2 * k + 1] = b;
    const sec = sectionOf(m, bar);
    sections.push(sec);
    membersAtNode[a]!.push(k);
    membersAtNode[b]!.push(k);
    if (!sec.releaseStart) exists[3 * a + 2] = 1;
    if (!sec.releaseEnd) exists[3 * b + 2] = 1;
  });

  const isHeld = new Uint8Array(3 * nNodes);
  for (const s of model.supports) {
    const n = nodeIndex.get(s.node);
    if (n === undefined) throw new StiffnessInputError(`support at unknown node ${s.node}`);
    if (s.x) isHeld[3 * n] = 1;
    if (s.y) isHeld[3 * n + 1] = 1;
    // A truss has no rotational dofs; a hinged-all-round node has none either, but its
    // restraint is kept so that a couple applied there goes straight into the support.
    if (s.rz && !bar) isHeld[3 * n + 2] = 1;
  }

  const adjacency: number[][] = Array.from({ length: nNodes }, () => []);
  for (let k = 0; k < model.members.length; k++) {
    const a = ends[2 * k]!;
    const b = ends[2 * k + 1]!;
    adjacency[a]!.push(b);
    adjacency[b]!.push(a);
  }
  const order = reverseCuthillMcKee(adjacency);

  const free = new Int32Array(3 * nNodes).fill(-1);
  const held = new Int32Array(3 * nNodes).fill(-1);
  let nFree = 0;
  let nHeld = 0;
  for (const n of order) {
    for (let d = 0; d < 3; d++) {
      const i = 3 * n + d;
      if (isHeld[i]) held[i] = nHeld++;
      else if (exists[i]) free[i] = nFree++;
    }
  }
  const freeNode = new Int32Array(nFree);
  const freeDof = new Int8Array(nFree);
  for (let i = 0; i < 3 * nNodes; i++) {
    const f = free[i]!;
    if (f >= 0) {
      freeNode[f] = Math.floor(i / 3);
      freeDof[f] = i % 3;
    }
  }

  const firstCol = new Int32Array(nFree);
  for (let i = 0; i < nFree; i++) firstCol[i] = i;
  const idx: number[] = [];
  for (let k = 0; k < model.members.length; k++) {
    memberFreeDofs(sections[k]!, ends[2 * k]!, ends[2 * k + 1]!, free, idx);
    let lo = Infinity;
    for (const i of idx) if (i >= 0 && i < lo) lo = i;
    for (const i of idx) if (i >= 0 && lo < firstCol[i]!) firstCol[i] = lo;
  }

  return {
    model,
    bar,
    nodeIndex,
    memberIndex,
    sections,
    ends,
    free,
    held,
    exists,
    nFree,
    nHeld,
    freeNode,
    freeDof,
    membersAtNode,
    firstCol,
  };
}

/** Free dof index (or −1) for the member's six global end dofs that it actually stiffens. */
function memberFreeDofs(sec: MemberSection, a: number, b: number, free: Int32Array, out: number[]): void {
  out.length = 6;
  out[0] = free[3 * a]!;
  out[1] = free[3 * a + 1]!;
  out[2] = sec.releaseStart ? -1 : free[3 * a + 2]!;
  out[3] = free[3 * b]!;
  out[4] = free[3 * b + 1]!;
  out[5] = sec.releaseEnd ? -1 : free[3 * b + 2]!;
}

export function prepareModel(model: ParsedModel): PreparedModel {
  const numbered = numberDofs(model);
  const { sections, ends, free, held, firstCol, nFree } = numbered;
  const soft = new EnvelopeMatrix(firstCol);
  const kGlobal: Float64Array[] = [];
  const idx: number[] = [];
  for (let k = 0; k < sections.length; k++) {
    const sec = sections[k]!;
    const kg = toGlobal(localStiffness(sec), sec.cos, sec.sin);
    kGlobal.push(kg);
    memberFreeDofs(sec, ends[2 * k]!, ends[2 * k + 1]!, free, idx);
    for (let p = 0; p < 6; p++) {
      const ip = idx[p]!;
      if (ip < 0) continue;
      for (let q = 0; q <= p; q++) {
        const iq = idx[q]!;
        if (iq < 0) continue;
        soft.add(ip, iq, kg[p * 6 + q]!);
      }
    }
  }

  const softDiag = soft.diagonal();
  let maxTrans = 0;
  for (let i = 0; i < nFree; i++) {
    if (numbered.freeDof[i] !== 2) maxTrans = Math.max(maxTrans, softDiag[i]!);
  }
  // Large enough that each constraint correction contracts the error by ~1e-4, small enough
  // that the penalised matrix keeps its soft pivots well clear of the zero-pivot test.
  const beta = 1e4 * (maxTrans > 0 ? maxTrans : 1);

  const rigid: RigidConstraint[] = [];
  const rigidLocked: number[] = [];
  for (let k = 0; k < sections.length; k++) {
    const sec = sections[k]!;
    if (sec.EA !== null) continue;
    const a = ends[2 * k]!;
    const b = ends[2 * k + 1]!;
    const dofs = [3 * a, 3 * a + 1, 3 * b, 3 * b + 1];
    const coef = [-sec.cos, -sec.sin, sec.cos, sec.sin];
    const rc: RigidConstraint = { member: k, freeIdx: [], freeCoef: [], heldIdx: [], heldCoef: [] };
    for (let j = 0; j < 4; j++) {
      const c = coef[j]!;
      if (c === 0) continue;
      const f = free[dofs[j]!]!;
      const h = held[dofs[j]!]!;
      if (f >= 0) {
        rc.freeIdx.push(f);
        rc.freeCoef.push(c);
      } else if (h >= 0) {
        rc.heldIdx.push(h);
        rc.heldCoef.push(c);
      }
    }
    if (rc.freeIdx.length === 0) rigidLocked.push(k);
    else rigid.push(rc);
  }

  const penalised = soft.clone();
  for (const rc of rigid) {
    for (let p = 0; p < rc.freeIdx.length; p++) {
      for (let q = 0; q <= p; q++) {
        penalised.add(rc.freeIdx[p]!, rc.freeIdx[q]!, beta * rc.freeCoef[p]! * rc.freeCoef[q]!);
      }
    }
  }
  try {
    factorEnvelope(penalised, softDiag);
  } catch (e) {
    if (e instanceof ZeroPivotError) {
      const node = model.nodes[numbered.freeNode[e.row]!]!.id;
      throw new StiffnessSingularError(node, DOF_NAMES[numbered.freeDof[e.row]!]!);
    }
    throw e;
  }

  return { ...numbered, kGlobal, soft, factor: penalised, rigid, rigidLocked, beta };
}
