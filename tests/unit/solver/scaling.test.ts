import { describe, expect, it } from "vitest";

import { parseModel } from "@/lib/solver";
import { buildStatics } from "@/lib/solver/equilibrium";
import { prattPanelsFor, prattTrussModel } from "@/lib/solver/pratt-truss";
import { denseReference, type RefNode } from "@/tests/unit/solver/dense-reference";
import { expectClose, run } from "@/tests/unit/solver/helpers";

// The engine must stay banded: the elimination's work grows linearly with the members. Work
// is counted (row operations, widest row), not timed; timings are in npm run bench:engine.

describe("generated Pratt trusses", () => {
  it("a 97-member Pratt truss matches a dense stiffness solve (ml-matrix)", () => {
    const model = prattTrussModel(25, { findCount: 6 });
    const r = run(model);
    expect(r.method.degree_of_indeterminacy).toBe(0);
    const parsed = parseModel(model).model;
    const nodes: Record<string, RefNode> = {};
    for (const n of parsed.nodes) nodes[n.id] = { x: n.x, y: n.y };
    for (const s of parsed.supports) (nodes[s.node] as RefNode).fix = [...(s.x ? ["x" as const] : []), ...(s.y ? ["y" as const] : [])];
    for (const l of parsed.loads) if (l.type === "node") (nodes[l.node] as RefNode).load = { Fy: l.Fy };
    const ref = denseReference(
      nodes,
      parsed.members.map((m) => ({ a: m.start, b: m.end, E: m.E, A: m.A ?? 0 })),
      true,
    );
    for (const f of r.find) expectClose(f.value_si, ref.get(f.label)?.y ?? Number.NaN, 1e-8, f.label);
  });

  it("elimination work grows linearly: 10× the members, about 10× the row operations, same band", () => {
    const stats = [100, 1000].map((m) => {
      const st = buildStatics(parseModel(prattTrussModel(prattPanelsFor(m))).model);
      return { ops: st.lu.operations, rows: st.nRows, band: st.lu.widestRow };
    });
    const [small, large] = stats as [(typeof stats)[0], (typeof stats)[0]];
    expect(large.ops / small.ops).toBeLessThan(1.1 * (large.rows / small.rows));
    expect(large.band).toBe(small.band);
    expect(large.band).toBeLessThan(20);
  });
});
