import { describe, expect, it } from "vitest";
import { StiffnessInputError, StiffnessSingularError, solveStiffness, stiffnessBandwidth } from "@/lib/solver/stiffness";
import { buildModel, prattTruss, relErr } from "@/tests/unit/stiffness/model-builder";

const E = 200e9; // Pa
const A = 2.5e-3; // m^2
const EA = E * A;
const REL = 1e-10;

// A(0,0) pin, B(8,0) roller, apex C(4,3): legs 5 m, tie 8 m (3-4-5 triangles).
const triangle = () =>
  buildModel(
    "truss",
    { A: [0, 0], B: [8, 0], C: [4, 3] },
    { AB: { ends: ["A", "B"], E, A }, AC: { ends: ["A", "C"], E, A }, BC: { ends: ["B", "C"], E, A } },
    { A: "pin", B: "roller" },
  );

const axial = (r: ReturnType<typeof solveStiffness>[number], id: string): number => r.stations(id, [0])[0]!.N;

describe("triangle truss, method of joints worked by hand", () => {
  it("apex load: bar forces, apex and roller displacements", () => {
    const P = 60e3;
    const [r] = solveStiffness(triangle(), [[{ type: "node", case: "D", node: "C", Fx: 0, Fy: -P, M: 0 }]]);
    // Joint C: 2·N·(3/5) = −P → N_AC = N_BC = −5P/6; joint A: N_AB = −N_AC·4/5 = 2P/3.
    expect(relErr(axial(r!, "AC"), (-5 * P) / 6)).toBeLessThan(REL);
    expect(relErr(axial(r!, "BC"), (-5 * P) / 6)).toBeLessThan(REL);
    expect(relErr(axial(r!, "AB"), (2 * P) / 3)).toBeLessThan(REL);
    // Virtual work by hand with n = N/P: δ_C = Σ N·n·L/EA = (2·(25/36)·5 + (4/9)·8)·P/EA = 10.5 P/EA.
    expect(relErr(r!.nodes.get("C")!.y, (-10.5 * P) / EA)).toBeLessThan(REL);
    // Roller B moves by the tie's stretch N_AB·8/EA = 16P/3EA.
    expect(relErr(r!.nodes.get("B")!.x, (16 * P) / (3 * EA))).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("A")!.Fy, P / 2)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("B")!.Fy, P / 2)).toBeLessThan(REL);
    expect(Math.abs(r!.reactions.get("A")!.Fx)).toBeLessThan(1e-9 * P);
    // A truss joint has no rotation.
    expect(r!.nodes.get("C")!.rz).toBeNaN();
  });

  it("heated tie: no bar forces, roller slides α·ΔT·8, apex drops 2/3 of it", () => {
    const alpha = 11.7e-6; // 1/K, structural steel (common practice, no source)
    const dT = 35; // K
    const [r] = solveStiffness(triangle(), [[{ type: "thermal", case: "T", member: "AB", dT, alpha }]]);
    for (const id of ["AB", "AC", "BC"]) expect(Math.abs(axial(r!, id))).toBeLessThan(1e-6);
    const e = alpha * dT * 8;
    expect(relErr(r!.nodes.get("B")!.x, e)).toBeLessThan(REL);
    // Virtual work: δ_C(down) = Σ n·α·ΔT·L = (2/3)·e with n_AB = 2/3 for a unit load at C.
    expect(relErr(r!.nodes.get("C")!.y, (-2 * e) / 3)).toBeLessThan(REL);
    expect(relErr(r!.nodes.get("C")!.x, e / 2)).toBeLessThan(REL);
  });

  it("leg made too long: apex rises by the virtual-work sum Σ n·δ_fab", () => {
    const delta = 0.004; // m
    const [r] = solveStiffness(triangle(), [[{ type: "misfit", case: "F", member: "AC", delta }]]);
    // Unit load down at C: n_AC = −5/6; δ_C(down) = n·δ = −5δ/6, i.e. the apex rises 5δ/6.
    expect(relErr(r!.nodes.get("C")!.y, (5 * delta) / 6)).toBeLessThan(REL);
    expect(Math.abs(axial(r!, "AC"))).toBeLessThan(1e-6);
  });

  it("roller settles: rigid rotation about A, no forces", () => {
    const s = 0.012; // m down
    const [r] = solveStiffness(triangle(), [[{ type: "settlement", case: "S", node: "B", dx: 0, dy: -s }]]);
    // Rotation θ = −s/8 about A; point (4, 3) moves (−θ·3, θ·4).
    expect(relErr(r!.nodes.get("C")!.x, (3 * s) / 8)).toBeLessThan(REL);
    expect(relErr(r!.nodes.get("C")!.y, -s / 2)).toBeLessThan(REL);
    expect(relErr(r!.nodes.get("B")!.y, -s)).toBeLessThan(REL);
    for (const id of ["AB", "AC", "BC"]) expect(Math.abs(axial(r!, id))).toBeLessThan(1e-6);
    expect(Math.abs(r!.reactions.get("B")!.Fy)).toBeLessThan(1e-6);
  });

  it("bar between two pins heated: no displacement, N = −EA·α·ΔT", () => {
    const m = buildModel("truss", { A: [0, 0], B: [3, 4] }, { AB: { ends: ["A", "B"], E, A } }, { A: "pin", B: "pin" });
    const alpha = 12e-6;
    const dT = -20;
    const [r] = solveStiffness(m, [[{ type: "thermal", case: "T", member: "AB", dT, alpha }]]);
    // Fully restrained bar: the free thermal strain is suppressed (hand formula).
    const st = r!.stations("AB", [0, 2.5, 5]);
    for (const s of st) {
      expect(relErr(s.N, -EA * alpha * dT)).toBeLessThan(REL);
      expect(Math.abs(s.ux)).toBeLessThan(1e-15);
      expect(Math.abs(s.uy)).toBeLessThan(1e-15);
    }
    // Reaction at B pushes along B→A when the bar is in tension (cooled): −N·(3, 4)/5.
    const N = -EA * alpha * dT;
    expect(relErr(r!.reactions.get("B")!.Fx, (N * 3) / 5)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("B")!.Fy, (N * 4) / 5)).toBeLessThan(REL);
  });
});

describe("Pratt truss, method of sections and joints worked by hand", () => {
  it("four panels, equal loads at the lower interior joints", () => {
    const p = 3;
    const h = 2.5;
    const P = 40e3;
    const m = prattTruss(4, p, h, E, A);
    const loads = [1, 2, 3].map((i) => ({ type: "node" as const, case: "L", node: `B${i}`, Fx: 0, Fy: -P, M: 0 }));
    const [r] = solveStiffness(m, [loads]);
    const diag = Math.hypot(p, h);
    // Reactions 1.5P each; section through panel 2, moments about T1: N_b1 = R·p/h.
    expect(relErr(r!.reactions.get("B0")!.Fy, 1.5 * P)).toBeLessThan(REL);
    expect(relErr(axial(r!, "b1"), (1.5 * P * p) / h)).toBeLessThan(REL);
    // Moments about B2: N_t1 = −(R·2p − P·p)/h.
    expect(relErr(axial(r!, "t1"), -(2 * P * p) / h)).toBeLessThan(REL);
    // Joint B0: end vertical carries the reaction, first bottom chord is zero.
    expect(relErr(axial(r!, "v0"), -1.5 * P)).toBeLessThan(REL);
    expect(Math.abs(axial(r!, "b0"))).toBeLessThan(1e-6);
    // Joint T0: vertical equilibrium, N_d0·h/d = 1.5P (Pratt diagonal in tension).
    expect(relErr(axial(r!, "d0"), (1.5 * P * diag) / h)).toBeLessThan(REL);
    // Joint B1: N_v1 + N_d0·h/d − P = 0 → N_v1 = −P/2 (Pratt verticals in compression).
    expect(relErr(axial(r!, "v1"), -P / 2)).toBeLessThan(REL);
    // Joint T2 has only the two top chords and the centre vertical: a zero-force member.
    expect(Math.abs(axial(r!, "v2"))).toBeLessThan(1e-6);
  });

  it("dof numbering keeps the envelope narrow whatever the input order", () => {
    const panels = 300;
    const m = prattTruss(panels, 2, 2, E, A, true);
    const bw = stiffnessBandwidth(m);
    // 2 dofs per joint, less the 3 restrained.
    expect(bw.dofs).toBe(2 * 2 * (panels + 1) - 3);
    // Each joint's neighbours lie within two joints of it along the truss: half-bandwidth of a
    // few joints' dofs, independent of length (a scrambled order without reordering is ~dofs).
    expect(bw.halfBandwidth).toBeLessThanOrEqual(9);
    expect(bw.envelope).toBeLessThan(8 * bw.dofs);
    // Same answers as the natural order, to the rounding of a span/depth-300 truss.
    const [shuffled] = solveStiffness(m, [[{ type: "node", case: "D", node: "B150", Fx: 0, Fy: -1e5, M: 0 }]]);
    const [ordered] = solveStiffness(prattTruss(panels, 2, 2, E, A), [[{ type: "node", case: "D", node: "B150", Fx: 0, Fy: -1e5, M: 0 }]]);
    expect(relErr(shuffled!.nodes.get("B150")!.y, ordered!.nodes.get("B150")!.y)).toBeLessThan(1e-8);
  });
});

describe("instability and bad input", () => {
  it("names the node and dof of a joint held by one bar only", () => {
    const m = buildModel(
      "truss",
      { A: [0, 0], B: [8, 0], C: [4, 3], D: [12, 0] },
      {
        AB: { ends: ["A", "B"], E, A },
        AC: { ends: ["A", "C"], E, A },
        BC: { ends: ["B", "C"], E, A },
        BD: { ends: ["B", "D"], E, A },
      },
      { A: "pin", B: "roller" },
    );
    let caught: unknown;
    try {
      solveStiffness(m, [[]]);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(StiffnessSingularError);
    const err = caught as StiffnessSingularError;
    expect(err.node).toBe("D");
    expect(err.dof).toBe("y");
    expect(err.message).toBe("structure is unstable: node D is free to move in y");
  });

  it("a square panel without a diagonal is a mechanism", () => {
    const m = buildModel(
      "truss",
      { A: [0, 0], B: [4, 0], C: [4, 4], D: [0, 4] },
      { AB: { ends: ["A", "B"], E, A }, BC: { ends: ["B", "C"], E, A }, CD: { ends: ["C", "D"], E, A }, DA: { ends: ["D", "A"], E, A } },
      { A: "pin", B: "roller" },
    );
    expect(() => solveStiffness(m, [[]])).toThrow(StiffnessSingularError);
  });

  it("rejects loads a pin-ended bar cannot take and moments at truss joints", () => {
    expect(() =>
      solveStiffness(triangle(), [[{ type: "point", case: "D", member: "AC", a: 2, P: -1e3, dir: "global" }]]),
    ).toThrow(new StiffnessInputError("member AC: a truss member is pin-ended and takes no point load; apply it at the joints"));
    expect(() => solveStiffness(triangle(), [[{ type: "node", case: "D", node: "C", Fx: 0, Fy: 0, M: 5e3 }]])).toThrow(
      StiffnessSingularError,
    );
    expect(() => solveStiffness(triangle(), [[{ type: "settlement", case: "D", node: "B", dx: 0.01, dy: 0 }]])).toThrow(
      "settlement at node B: x is not held by a support",
    );
  });
});
