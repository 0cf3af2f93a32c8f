import { EnvelopeLU, type SparseColumns } from "@/lib/solver/envelope-lu";
import { reverseCuthillMcKee } from "@/lib/solver/ordering";
import type { Dof, ParsedMember, ParsedModel } from "@/lib/solver/types";

/**
 * The statics of the structure as one matrix: B s = p, one row per free-body equation
 * (node × dof) and one column per unknown force: for each member its axial force at the
 * first end N (tension +) and, unless released, its end bending moments Ma, Mb (beam
 * convention, sagging +); for each held support dof its reaction.
 *
 * Member end forces (node on member, local axes) in terms of the unknowns:
 *   at the first end  (−N, (Mb − Ma)/L + Fay⁰, −Ma)
 *   at the second end (N + Fbx⁰, −(Mb − Ma)/L + Fby⁰, Mb)
 * where the ⁰ terms are the simple-span reactions of the member's own loads. Node
 * equilibrium: Σ(member on node) + applied + reaction = 0, so B holds −∂F/∂s and +1 for a
 * reaction, and p = −(applied node loads) + Σ F⁰.
 */

export type ColumnKind = "N" | "Ma" | "Mb" | "R";

export interface Column {
  kind: ColumnKind;
  /** member index (N, Ma, Mb) or node index (R), file order */
  index: number;
  /** held dof of a reaction */
  dof?: Dof;
}

export interface Statics {
  model: ParsedModel;
  dofs: readonly Dof[];
  nodeIndex: Map<string, number>;
  memberIndex: Map<string, number>;
  /** row of (node, dof) or −1 */
  row: (node: number, dof: Dof) => number;
  nRows: number;
  columns: Column[];
  /** column of N, Ma, Mb of member j at 3j, 3j+1, 3j+2 (−1 when absent) */
  memberCol: Int32Array;
  /** column of the reaction at node i, dof k at i·dofs + k (−1 when not held) */
  reactionCol: Int32Array;
  /** unscaled B, compressed by column */
  B: SparseColumns;
  /** B̃ = R·B·C, the scaling that makes force and moment equations comparable */
  rowScale: Float64Array;
  colScale: Float64Array;
  lu: EnvelopeLU;
}

export function memberHasBending(model: ParsedModel, m: ParsedMember): boolean {
  return model.kind !== "truss" && m.I !== undefined;
}

export function buildStatics(model: ParsedModel): Statics {
  const dofs: readonly Dof[] = model.kind === "truss" ? ["x", "y"] : ["x", "y", "rz"];
  const nd = dofs.length;
  const nodeIndex = new Map(model.nodes.map((n, i) => [n.id, i]));
  const memberIndex = new Map(model.members.map((m, i) => [m.id, i]));
  const nNodes = model.nodes.length;

  const adjacency: number[][] = Array.from({ length: nNodes }, () => []);
  for (const m of model.members) {
    const a = nodeIndex.get(m.start) ?? 0;
    const b = nodeIndex.get(m.end) ?? 0;
    adjacency[a]?.push(b);
    adjacency[b]?.push(a);
  }
  const order = reverseCuthillMcKee(adjacency);
  const position = new Int32Array(nNodes);
  order.forEach((node, pos) => (position[node] = pos));
  const row = (node: number, dof: Dof): number => (position[node] ?? 0) * nd + dofs.indexOf(dof);

  // Characteristic length (m) that scales moments to forces: mean member length.
  const Lc = model.members.reduce((s, m) => s + m.length, 0) / Math.max(1, model.members.length);

  // Columns are collected unsorted into flat arrays, then ordered by the node positions they
  // touch (so the matrix is banded) and stored compressed by column.
  const cols: Column[] = [];
  const key0: number[] = [];
  const key1: number[] = [];
  const start: number[] = [];
  const tmpRows: number[] = [];
  const tmpVals: number[] = [];
  const entry = (node: number, d: Dof, v: number): void => {
    if (v === 0) return;
    tmpRows.push(row(node, d));
    tmpVals.push(v);
  };
  const open = (col: Column, k0: number, k1: number): void => {
    cols.push(col);
    key0.push(k0);
    key1.push(k1);
    start.push(tmpRows.length);
  };
  const supportByNode = new Map(model.supports.map((s) => [s.node, s]));
  model.nodes.forEach((n, i) => {
    const s = supportByNode.get(n.id);
    if (!s) return;
    const p = position[i] ?? 0;
    for (const d of dofs) {
      if (!s[d]) continue;
      open({ kind: "R", index: i, dof: d }, p, p);
      entry(i, d, 1);
    }
  });
  model.members.forEach((m, j) => {
    const a = nodeIndex.get(m.start) ?? 0;
    const b = nodeIndex.get(m.end) ?? 0;
    const pa = position[a] ?? 0;
    const pb = position[b] ?? 0;
    const k0 = Math.min(pa, pb);
    const k1 = Math.max(pa, pb);
    const { cos: c, sin: s, length: L } = m;
    open({ kind: "N", index: j }, k0, k1);
    entry(a, "x", c);
    entry(a, "y", s);
    entry(b, "x", -c);
    entry(b, "y", -s);
    if (!memberHasBending(model, m)) return;
    if (!m.releaseStart) {
      open({ kind: "Ma", index: j }, k0, k1);
      entry(a, "x", -s / L);
      entry(a, "y", c / L);
      entry(a, "rz", 1);
      entry(b, "x", s / L);
      entry(b, "y", -c / L);
    }
    if (!m.releaseEnd) {
      open({ kind: "Mb", index: j }, k0, k1);
      entry(a, "x", s / L);
      entry(a, "y", -c / L);
      entry(b, "x", -s / L);
      entry(b, "y", c / L);
      entry(b, "rz", -1);
    }
  });
  start.push(tmpRows.length);
  const nCols = cols.length;
  const colOrder = Array.from({ length: nCols }, (_, k) => k).sort(
    (x, y) => (key0[x] ?? 0) - (key0[y] ?? 0) || (key1[x] ?? 0) - (key1[y] ?? 0) || x - y,
  );

  const nRows = nNodes * nd;
  const rowScale = new Float64Array(nRows).fill(1);
  if (nd === 3) for (let i = 0; i < nNodes; i++) rowScale[i * 3 + 2] = 1 / Lc;
  const columns: Column[] = new Array(nCols);
  const ptr = new Int32Array(nCols + 1);
  const rows = new Int32Array(tmpRows.length);
  const vals = new Float64Array(tmpRows.length);
  const scaled = new Float64Array(tmpRows.length);
  const colScale = new Float64Array(nCols);
  const memberCol = new Int32Array(model.members.length * 3).fill(-1);
  const reactionCol = new Int32Array(nNodes * nd).fill(-1);
  let fill = 0;
  colOrder.forEach((from, k) => {
    const col = cols[from] as Column;
    columns[k] = col;
    const moment = col.kind === "Ma" || col.kind === "Mb" || (col.kind === "R" && col.dof === "rz");
    colScale[k] = moment ? Lc : 1;
    ptr[k] = fill;
    for (let t = start[from] ?? 0; t < (start[from + 1] ?? 0); t++) {
      const r = tmpRows[t] ?? 0;
      rows[fill] = r;
      vals[fill] = tmpVals[t] ?? 0;
      scaled[fill] = (tmpVals[t] ?? 0) * (rowScale[r] ?? 1) * (colScale[k] ?? 1);
      fill++;
    }
    if (col.kind === "R") reactionCol[col.index * nd + dofs.indexOf(col.dof ?? "x")] = k;
    else memberCol[col.index * 3 + (col.kind === "N" ? 0 : col.kind === "Ma" ? 1 : 2)] = k;
  });
  ptr[nCols] = fill;
  const lu = new EnvelopeLU({ nRows, ptr, rows, vals: scaled });
  return { model, dofs, nodeIndex, memberIndex, row, nRows, columns, memberCol, reactionCol, B: { nRows, ptr, rows, vals }, rowScale, colScale, lu };
}

/** s (unscaled, by column) for B s = p, with the dependent columns' values preset in `s`. */
export function solveStatics(st: Statics, p: Float64Array, s: Float64Array): Float64Array {
  const b = new Float64Array(st.nRows);
  for (let i = 0; i < st.nRows; i++) b[i] = (p[i] ?? 0) * (st.rowScale[i] ?? 1);
  const x = new Float64Array(st.columns.length);
  for (let j = 0; j < x.length; j++) x[j] = (s[j] ?? 0) / (st.colScale[j] ?? 1);
  st.lu.solve(b, x);
  for (let j = 0; j < x.length; j++) s[j] = (x[j] ?? 0) * (st.colScale[j] ?? 1);
  return s;
}

/** d (by row) for B_bᵀ d = g, B_b the independent columns; g is indexed by column. */
export function solveStaticsTransposed(st: Statics, g: Float64Array): Float64Array {
  const h = new Float64Array(g.length);
  for (let j = 0; j < g.length; j++) h[j] = (g[j] ?? 0) * (st.colScale[j] ?? 1);
  const z = st.lu.solveTransposed(h);
  for (let i = 0; i < z.length; i++) z[i] = (z[i] ?? 0) * (st.rowScale[i] ?? 1);
  return z;
}

/** Bᵀ d for one column (unscaled): the generalized deformation that d imposes on it. */
export function columnDot(st: Statics, col: number, d: Float64Array): number {
  const { ptr, rows, vals } = st.B;
  let sum = 0;
  for (let t = ptr[col] ?? 0; t < (ptr[col + 1] ?? 0); t++) sum += (vals[t] ?? 0) * (d[rows[t] ?? 0] ?? 0);
  return sum;
}
