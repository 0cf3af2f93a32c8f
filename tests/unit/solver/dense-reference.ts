import { Matrix, solve as denseSolve } from "ml-matrix";

// An independent reference for the tests only: the textbook plane frame / truss element
// stiffness (e.g. McGuire, Gallagher & Ziemian, Matrix Structural Analysis, 2nd ed., ch. 4 and 5,
// from memory), assembled densely and solved with ml-matrix. Node loads only, no releases.

export interface RefNode {
  x: number;
  y: number;
  /** held dofs */
  fix?: ("x" | "y" | "rz")[];
  load?: { Fx?: number; Fy?: number; M?: number };
}

export interface RefMember {
  a: string;
  b: string;
  E: number;
  A: number;
  /** omitted for a truss bar */
  I?: number;
}

export function denseReference(
  nodes: Record<string, RefNode>,
  members: RefMember[],
  truss: boolean,
): Map<string, { x: number; y: number; rz: number }> {
  const ids = Object.keys(nodes);
  const nd = truss ? 2 : 3;
  const n = ids.length * nd;
  const K = Matrix.zeros(n, n);
  const F = Matrix.zeros(n, 1);
  const index = new Map(ids.map((id, i) => [id, i]));
  for (const m of members) {
    const na = nodes[m.a];
    const nb = nodes[m.b];
    if (!na || !nb) throw new Error("bad member");
    const dx = nb.x - na.x;
    const dy = nb.y - na.y;
    const L = Math.hypot(dx, dy);
    const c = dx / L;
    const s = dy / L;
    const EA = (m.E * m.A) / L;
    const EI = m.I ? m.E * m.I : 0;
    // local stiffness in (u1, v1, θ1, u2, v2, θ2)
    const k = Matrix.zeros(6, 6);
    const put = (i: number, j: number, v: number): void => {
      k.set(i, j, v);
    };
    put(0, 0, EA);
    put(0, 3, -EA);
    put(3, 0, -EA);
    put(3, 3, EA);
    if (!truss) {
      const a = (12 * EI) / L ** 3;
      const b = (6 * EI) / L ** 2;
      const cc = (4 * EI) / L;
      const d = (2 * EI) / L;
      const rows = [
        [1, 1, a], [1, 2, b], [1, 4, -a], [1, 5, b],
        [2, 1, b], [2, 2, cc], [2, 4, -b], [2, 5, d],
        [4, 1, -a], [4, 2, -b], [4, 4, a], [4, 5, -b],
        [5, 1, b], [5, 2, d], [5, 4, -b], [5, 5, cc],
      ] as const;
      for (const [i, j, v] of rows) put(i, j, v);
    }
    const T = Matrix.zeros(6, 6);
    for (const o of [0, 3]) {
      T.set(o, o, c);
      T.set(o, o + 1, s);
      T.set(o + 1, o, -s);
      T.set(o + 1, o + 1, c);
      T.set(o + 2, o + 2, 1);
    }
    const kg = T.transpose().mmul(k).mmul(T);
    const dofs: number[] = [];
    for (const id of [m.a, m.b]) {
      const base = (index.get(id) ?? 0) * nd;
      dofs.push(base, base + 1, truss ? -1 : base + 2);
    }
    for (let i = 0; i < 6; i++) {
      for (let j = 0; j < 6; j++) {
        const gi = dofs[i] ?? -1;
        const gj = dofs[j] ?? -1;
        if (gi >= 0 && gj >= 0) K.set(gi, gj, K.get(gi, gj) + kg.get(i, j));
      }
    }
  }
  const free: number[] = [];
  ids.forEach((id, i) => {
    const node = nodes[id] as RefNode;
    const names = truss ? (["x", "y"] as const) : (["x", "y", "rz"] as const);
    names.forEach((d, k) => {
      const dof = i * nd + k;
      const load = d === "x" ? node.load?.Fx : d === "y" ? node.load?.Fy : node.load?.M;
      F.set(dof, 0, load ?? 0);
      if (!node.fix?.includes(d)) free.push(dof);
    });
  });
  const Kff = Matrix.zeros(free.length, free.length);
  const Ff = Matrix.zeros(free.length, 1);
  free.forEach((gi, i) => {
    Ff.set(i, 0, F.get(gi, 0));
    free.forEach((gj, j) => Kff.set(i, j, K.get(gi, gj)));
  });
  const u = denseSolve(Kff, Ff);
  const full = new Float64Array(n);
  free.forEach((g, i) => (full[g] = u.get(i, 0)));
  const out = new Map<string, { x: number; y: number; rz: number }>();
  ids.forEach((id, i) => out.set(id, { x: full[i * nd] ?? 0, y: full[i * nd + 1] ?? 0, rz: truss ? 0 : (full[i * nd + 2] ?? 0) }));
  return out;
}
