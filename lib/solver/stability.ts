import { SolverInputError } from "@/lib/solver/errors";
import type { Statics } from "@/lib/solver/equilibrium";
import type { Dof } from "@/lib/solver/types";

/**
 * Refuses a mechanism before anything is solved. A dependent row of the equilibrium matrix
 * means some load cannot be carried; the left null vector y (yᵀB = 0) is the mechanism's
 * motion, since Bᵀ is the compatibility matrix: members keep their length and held dofs stay.
 * The message names the node and dof that move most (rotations weighted by the mean member
 * length so that they compare with translations).
 */
export function assertStable(st: Statics): void {
  const first = st.lu.dependentRows[0];
  if (first === undefined) return;
  const y = st.lu.leftNullVector(first);
  const Lc = st.model.members.reduce((s, m) => s + m.length, 0) / Math.max(1, st.model.members.length);
  let best = -1;
  let bestNode = st.model.nodes[0]?.id ?? "?";
  let bestDof: Dof = "x";
  st.model.nodes.forEach((n, i) => {
    for (const d of st.dofs) {
      const r = st.row(i, d);
      // y lives in the scaled row space; the physical rotation is y/Lc, weighted back by Lc.
      const size = Math.abs((y[r] ?? 0) * (st.rowScale[r] ?? 1)) * (d === "rz" ? Lc : 1);
      if (size > best * (1 + 1e-9)) {
        best = size;
        bestNode = n.id;
        bestDof = d;
      }
    }
  });
  throw new SolverInputError([
    { path: "supports", message: `the structure is a mechanism — node ${bestNode} can move in ${bestDof}` },
  ]);
}
