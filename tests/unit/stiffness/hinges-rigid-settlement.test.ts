import { describe, expect, it } from "vitest";
import { StiffnessInputError, StiffnessSingularError, solveStiffness } from "@/lib/solver/stiffness";
import { buildModel, relErr } from "@/tests/unit/stiffness/model-builder";

const E = 200e9;
const I = 5.0e-5;
const A = 4.0e-3;
const EI = E * I;
const EA = E * A;
const REL = 1e-10;

describe("hinges (member end releases)", () => {
  it("cantilever with a suspended span: statics, Table 3-23 cantilever and simple-span terms", () => {
    // A fixed, AB cantilever 3 m, hinge at B, BC suspended span 5 m on a roller at C.
    const a = 3;
    const l = 5;
    const P = 20e3;
    const m = buildModel(
      "beam",
      { A: [0, 0], B: [a, 0], C: [a + l, 0] },
      { AB: { ends: ["A", "B"], E, I, A, release: ["end"] }, BC: { ends: ["B", "C"], E, I, A, release: ["start"] } },
      { A: "fixed", C: "roller" },
    );
    const [r] = solveStiffness(m, [[{ type: "point", case: "L", member: "BC", a: l / 2, P: -P, dir: "global" }]]);
    // Statics: the suspended span puts P/2 on the cantilever tip.
    expect(relErr(r!.reactions.get("C")!.Fy, P / 2)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("A")!.Fy, P / 2)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("A")!.M, (P / 2) * a)).toBeLessThan(REL);
    // Tip of the cantilever: (P/2)a³/3EI (Table 3-23 case 22).
    const vB = (-(P / 2) * a ** 3) / (3 * EI);
    expect(relErr(r!.nodes.get("B")!.y, vB)).toBeLessThan(REL);
    // Every member is hinged at B: the node has no rotation of its own.
    expect(r!.nodes.get("B")!.rz).toBeNaN();
    // Centre of the suspended span: half the tip drop plus Pl³/48EI (case 7), superposed.
    expect(relErr(r!.displacementAt({ member: "BC", x: l / 2 }, "y"), vB / 2 - (P * l ** 3) / (48 * EI))).toBeLessThan(REL);
    // The two sides of the hinge rotate differently: cantilever tip slope (P/2)a²/2EI.
    expect(relErr(r!.displacementAt({ member: "AB", x: a }, "rz"), (-(P / 2) * a * a) / (2 * EI))).toBeLessThan(REL);
    expect(Math.abs(r!.stations("BC", [0])[0]!.M)).toBeLessThan(1e-6);
  });

  it("a fixed support under a hinged member end takes no moment (propped cantilever, case 12)", () => {
    const l = 6;
    const w = 9e3;
    const m = buildModel("beam", { A: [0, 0], B: [l, 0] }, { AB: { ends: ["A", "B"], E, I, A, release: ["start"] } }, { A: "fixed", B: "fixed" });
    const [r] = solveStiffness(m, [[{ type: "line", case: "D", member: "AB", a: 0, b: l, wa: -w, wb: -w, dir: "global" }]]);
    expect(relErr(r!.reactions.get("A")!.Fy, (3 * w * l) / 8)).toBeLessThan(REL);
    expect(r!.reactions.get("A")!.M).toBeCloseTo(0, 9);
    expect(relErr(r!.reactions.get("B")!.M, (-w * l * l) / 8)).toBeLessThan(REL);
    expect(r!.nodes.get("A")!.rz).toBe(0);
  });

  it("a couple applied where every member is hinged is unresisted", () => {
    const m = buildModel(
      "beam",
      { A: [0, 0], B: [3, 0], C: [6, 0] },
      { AB: { ends: ["A", "B"], E, I, release: ["end"] }, BC: { ends: ["B", "C"], E, I, release: ["start"] } },
      { A: "fixed", C: "fixed" },
    );
    let caught: unknown;
    try {
      solveStiffness(m, [[{ type: "node", case: "D", node: "B", Fx: 0, Fy: 0, M: 1e3 }]]);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(StiffnessSingularError);
    expect((caught as StiffnessSingularError).node).toBe("B");
    expect((caught as StiffnessSingularError).dof).toBe("rz");
  });
});

describe("axially rigid beam members (no A)", () => {
  it("inclined simply supported rafter: bending as a span of its own length, axial force by statics", () => {
    // Pin at the foot, vertical roller at the head, gravity load per metre of member.
    const run = 4.8;
    const rise = 3.6;
    const l = Math.hypot(run, rise);
    const c = run / l;
    const s = rise / l;
    const w = 5e3;
    const m = buildModel("beam", { A: [0, 0], B: [run, rise] }, { AB: { ends: ["A", "B"], E, I } }, { A: "pin", B: "roller" });
    const [r] = solveStiffness(m, [[{ type: "line", case: "D", member: "AB", a: 0, b: l, wa: -w, wb: -w, dir: "global" }]]);
    // The head cannot slide: rigid length and fixed foot, roller holding y.
    expect(Math.abs(r!.nodes.get("B")!.x)).toBeLessThan(1e-15);
    // Transverse part w·cosθ over span l: Table 3-23 case 1, 5(w cosθ)l⁴/384EI, normal to the member.
    const vMid = (-5 * w * c * l ** 4) / (384 * EI);
    const st = r!.stations("AB", [l / 2])[0]!;
    expect(relErr(st.ux, -s * vMid)).toBeLessThan(1e-12);
    expect(relErr(st.uy, c * vMid)).toBeLessThan(1e-12);
    // Statics: roller reaction W/2 vertical; along the member it is (W/2)·sinθ in tension at
    // the head, falling by the axial load component w·sinθ per metre towards the foot.
    const W = w * l;
    expect(relErr(r!.reactions.get("B")!.Fy, W / 2)).toBeLessThan(REL);
    expect(relErr(r!.stations("AB", [l])[0]!.N, (W / 2) * s)).toBeLessThan(REL);
    expect(relErr(r!.stations("AB", [0])[0]!.N, (-W / 2) * s)).toBeLessThan(REL);
  });

  it("gable frame without A is the limit of the same frame as EA grows", () => {
    // Axial flexibility changes the answer by the members' shortening N·L/EA; with A scaled up
    // 10⁶ times that is ~1e-10 m here, still above the rounding such a huge A brings in.
    const gable = (area?: number) =>
      buildModel(
        "frame",
        { A: [0, 0], B: [0, 4], C: [5, 6], D: [10, 4], E: [10, 0] },
        {
          AB: { ends: ["A", "B"], E, I, A: area },
          BC: { ends: ["B", "C"], E, I: 2 * I, A: area },
          CD: { ends: ["C", "D"], E, I: 2 * I, A: area },
          DE: { ends: ["D", "E"], E, I, A: area },
        },
        { A: "fixed", E: "pin" },
      );
    const loads = [
      { type: "node" as const, case: "W", node: "B", Fx: 6e3, Fy: -2e3, M: 1.5e3 },
      { type: "line" as const, case: "S", member: "BC", a: 0.8, b: 4.1, wa: -3e3, wb: -9e3, dir: "global" as const },
      { type: "thermal" as const, case: "T", member: "CD", dT: 30, alpha: 1.2e-5 },
    ];
    const [rigid] = solveStiffness(gable(), [loads]);
    const [stiff] = solveStiffness(gable(A * 1e6), [loads]);
    const scale = Math.max(...[...rigid!.nodes.values()].flatMap((d) => [Math.abs(d.x), Math.abs(d.y)]));
    for (const id of ["B", "C", "D"]) {
      const a = rigid!.nodes.get(id)!;
      const b = stiff!.nodes.get(id)!;
      expect(relErr(a.x, b.x, scale)).toBeLessThan(1e-6);
      expect(relErr(a.y, b.y, scale)).toBeLessThan(1e-6);
    }
    expect(relErr(rigid!.stations("BC", [2])[0]!.N, stiff!.stations("BC", [2])[0]!.N)).toBeLessThan(1e-6);
    // The rigid members keep their lengths exactly; the heated one grows by α·ΔT·L.
    const len = (m: string, a: string, b: string, r: typeof rigid) => {
      const mm = gable().members.find((x) => x.id === m)!;
      const pa = r!.nodes.get(a)!;
      const pb = r!.nodes.get(b)!;
      return mm.cos * (pb.x - pa.x) + mm.sin * (pb.y - pa.y);
    };
    expect(Math.abs(len("BC", "B", "C", rigid))).toBeLessThan(1e-16);
    expect(relErr(len("CD", "C", "D", rigid), 30 * 1.2e-5 * Math.hypot(5, 2))).toBeLessThan(1e-12);
  });

  it("continuous beam on rollers only has no horizontal restraint", () => {
    const m = buildModel("beam", { A: [0, 0], B: [5, 0], C: [10, 0] }, { AB: { ends: ["A", "B"], E, I }, BC: { ends: ["B", "C"], E, I } }, {
      A: "roller",
      B: "roller",
      C: "roller",
    });
    let caught: unknown;
    try {
      solveStiffness(m, [[]]);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(StiffnessSingularError);
    expect((caught as StiffnessSingularError).dof).toBe("x");
  });

  it("a rigid member between two held ends cannot change length", () => {
    const m = buildModel("beam", { A: [0, 0], B: [5, 0] }, { AB: { ends: ["A", "B"], E, I } }, { A: "pin", B: "pin" });
    expect(() => solveStiffness(m, [[{ type: "thermal", case: "T", member: "AB", dT: 20, alpha: 1.2e-5 }]])).toThrow(StiffnessInputError);
    // Without a change of length it is fine, and heating with one end free just moves that end.
    const free = buildModel("beam", { A: [0, 0], B: [5, 0] }, { AB: { ends: ["A", "B"], E, I } }, { A: "pin", B: "roller" });
    const [r] = solveStiffness(free, [[{ type: "thermal", case: "T", member: "AB", dT: 20, alpha: 1.2e-5 }]]);
    expect(relErr(r!.nodes.get("B")!.x, 5 * 20 * 1.2e-5)).toBeLessThan(REL);
    expect(Math.abs(r!.stations("AB", [2])[0]!.N)).toBeLessThan(1e-6);
  });
});

describe("temperature, misfit and support settlement, hand formulas", () => {
  it("fixed-fixed member heated: no displacement, N = −EA·α·ΔT, no bending", () => {
    const alpha = 1.17e-5;
    const dT = 45;
    const m = buildModel("frame", { A: [0, 0], B: [6, 0] }, { AB: { ends: ["A", "B"], E, I, A } }, { A: "fixed", B: "fixed" });
    const [r] = solveStiffness(m, [[{ type: "thermal", case: "T", member: "AB", dT, alpha }]]);
    for (const st of r!.stations("AB", [0, 1.3, 3, 6])) {
      expect(relErr(st.N, -EA * alpha * dT)).toBeLessThan(REL);
      expect(Math.abs(st.ux)).toBeLessThan(1e-15);
      expect(Math.abs(st.M)).toBeLessThan(1e-6);
    }
    // The support at the first end pushes the compressed member towards +x.
    expect(relErr(r!.reactions.get("A")!.Fx, EA * alpha * dT)).toBeLessThan(REL);
  });

  it("fixed-fixed member too long by δ: N = −EA·δ/L", () => {
    const delta = 0.002;
    const m = buildModel("frame", { A: [0, 0], B: [0, 4] }, { AB: { ends: ["A", "B"], E, I, A } }, { A: "fixed", B: "fixed" });
    const [r] = solveStiffness(m, [[{ type: "misfit", case: "F", member: "AB", delta }]]);
    expect(relErr(r!.stations("AB", [2])[0]!.N, (-EA * delta) / 4)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("B")!.Fy, (-EA * delta) / 4)).toBeLessThan(REL);
  });

  it("propped cantilever, prop settles δ: reaction 3EIδ/L³, fixed-end moment 3EIδ/L²", () => {
    // Slope-deflection results for a support movement (standard, from memory).
    const l = 7;
    const delta = 0.015;
    const m = buildModel("beam", { A: [0, 0], B: [l, 0] }, { AB: { ends: ["A", "B"], E, I, A } }, { A: "fixed", B: "roller" });
    const [r] = solveStiffness(m, [[{ type: "settlement", case: "S", node: "B", dx: 0, dy: -delta }]]);
    expect(relErr(r!.reactions.get("B")!.Fy, (-3 * EI * delta) / l ** 3)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("A")!.Fy, (3 * EI * delta) / l ** 3)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("A")!.M, (3 * EI * delta) / l ** 2)).toBeLessThan(REL);
    expect(relErr(r!.nodes.get("B")!.y, -delta)).toBeLessThan(REL);
    // Shape: the end-loaded cantilever of Table 3-23 case 22 with P = 3EIδ/l³.
    const x = 2.9;
    const xf = l - x;
    expect(relErr(r!.displacementAt({ member: "AB", x }, "y"), -(3 * delta * (2 * l ** 3 - 3 * l * l * xf + xf ** 3)) / (6 * l ** 3))).toBeLessThan(REL);
  });

  it("fixed-fixed, one end settles δ: end moments 6EIδ/L², shears 12EIδ/L³", () => {
    // Slope-deflection fixed-end actions for relative end movement (standard, from memory).
    const l = 5.5;
    const delta = 0.01;
    const m = buildModel("beam", { A: [0, 0], B: [l, 0] }, { AB: { ends: ["A", "B"], E, I, A } }, { A: "fixed", B: "fixed" });
    const [r] = solveStiffness(m, [[{ type: "settlement", case: "S", node: "B", dx: 0, dy: -delta }]]);
    expect(relErr(r!.reactions.get("A")!.M, (6 * EI * delta) / l ** 2)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("B")!.M, (6 * EI * delta) / l ** 2)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("B")!.Fy, (-12 * EI * delta) / l ** 3)).toBeLessThan(REL);
  });

  it("two equal spans, centre support settles δ: it lets go of P with P(2l)³/48EI = δ", () => {
    // Table 3-23 case 7 over the whole length 2l (worked by hand).
    const l = 6;
    const delta = 0.008;
    const w = 10e3;
    const m = buildModel(
      "beam",
      { A: [0, 0], B: [l, 0], C: [2 * l, 0] },
      { AB: { ends: ["A", "B"], E, I, A }, BC: { ends: ["B", "C"], E, I, A } },
      { A: "pin", B: "roller", C: "roller" },
    );
    const span = (member: string) => ({ type: "line" as const, case: "D", member, a: 0, b: l, wa: -w, wb: -w, dir: "global" as const });
    const [settled, loaded, both] = solveStiffness(m, [
      [{ type: "settlement", case: "S", node: "B", dx: 0, dy: -delta }],
      [span("AB"), span("BC")],
      [span("AB"), span("BC"), { type: "settlement", case: "S", node: "B", dx: 0, dy: -delta }],
    ]);
    const Pd = (48 * EI * delta) / (2 * l) ** 3;
    expect(relErr(settled!.reactions.get("B")!.Fy, -Pd)).toBeLessThan(REL);
    expect(relErr(settled!.reactions.get("A")!.Fy, Pd / 2)).toBeLessThan(REL);
    // With the load too: case 29 centre reaction 1.25wl less the settlement's share.
    expect(relErr(both!.reactions.get("B")!.Fy, 1.25 * w * l - Pd)).toBeLessThan(REL);
    expect(relErr(loaded!.reactions.get("B")!.Fy, 1.25 * w * l)).toBeLessThan(REL);
  });

  it("settlement of a rigid-axial (no A) continuous beam gives the same reactions", () => {
    const l = 6;
    const delta = 0.008;
    const m = buildModel(
      "beam",
      { A: [0, 0], B: [l, 0], C: [2 * l, 0] },
      { AB: { ends: ["A", "B"], E, I }, BC: { ends: ["B", "C"], E, I } },
      { A: "pin", B: "pin", C: "roller" },
    );
    const [r] = solveStiffness(m, [[{ type: "settlement", case: "S", node: "B", dx: 0, dy: -delta }]]);
    expect(relErr(r!.reactions.get("B")!.Fy, (-48 * EI * delta) / (2 * l) ** 3)).toBeLessThan(REL);
    expect(Math.abs(r!.reactions.get("B")!.Fx)).toBeLessThan(1e-6);
  });
});
