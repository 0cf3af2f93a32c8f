import { readFileSync } from "node:fs";

import { describe, expect, it } from "vitest";

import { parseModel, solve } from "@/lib/solver";
import { buildEngine } from "@/lib/solver/force-method";
import { denseReference, type RefNode } from "@/tests/unit/solver/dense-reference";
import { beamModel, expectClose, expectCrossCheckAgrees, findValue, member, reaction, run } from "@/tests/unit/solver/helpers";

const example = (name: string): Record<string, unknown> =>
  JSON.parse(readFileSync(`lib/solver/examples/${name}.model.json`, "utf8")) as Record<string, unknown>;

// A steel portal in SI: fixed bases A, D; columns 4 m, beam 6 m (HEA-like sections).
const E = 210e9;
const col = { E: `${E} Pa`, I: "8.3e-5 m^4", A: "7.7e-3 m^2" };
const bm = { E: `${E} Pa`, I: "1.2e-4 m^4", A: "6.5e-3 m^2" };
function portal(loads: Record<string, unknown>[], find: { node: string; dof: string }[], splitBeam = false): Record<string, unknown> {
  const nodes: Record<string, [string, string]> = { A: ["0 m", "0 m"], B: ["0 m", "4 m"], C: ["6 m", "4 m"], D: ["6 m", "0 m"] };
  const members: Record<string, unknown> = { AB: { ends: ["A", "B"], ...col }, CD: { ends: ["C", "D"], ...col } };
  if (splitBeam) {
    nodes.M = ["3 m", "4 m"];
    members.BM = { ends: ["B", "M"], ...bm };
    members.MC = { ends: ["M", "C"], ...bm };
  } else members.BC = { ends: ["B", "C"], ...bm };
  return { kind: "frame", nodes, members, supports: { A: "fixed", D: "fixed" }, loads, find };
}

describe("invariants of the virtual-work solution", () => {
  it("Maxwell–Betti: Δ at C (y) from a unit force at B (x) equals Δ at B (x) from a unit force at C (y)", () => {
    const a = run(portal([{ node: "B", Fx: "1 N" }], [{ node: "C", dof: "y" }]));
    const b = run(portal([{ node: "C", Fy: "1 N" }], [{ node: "B", dof: "x" }]));
    expectClose(findValue(a, "C", "y"), findValue(b, "B", "x"), 1e-9, "δ_CB = δ_BC");
    // and a rotation against a displacement: θ_B from a unit force at C (y) = Δ_C (y) from a unit couple at B
    const c = run(portal([{ node: "C", Fy: "1 N" }], [{ node: "B", dof: "rz" }]));
    const d = run(portal([{ node: "B", M: "1 N*m" }], [{ node: "C", dof: "y" }]));
    expectClose(findValue(c, "B", "rz"), findValue(d, "C", "y"), 1e-9, "θ_B,C = Δ_C,B");
  });

  it("Maxwell–Betti of the flexibility matrix is asserted and reported (portal: 3 redundants)", () => {
    const r = run(portal([{ node: "B", Fx: "10 kN" }], []));
    expect(r.method.degree_of_indeterminacy).toBe(3);
    expect(r.method.reciprocity.asymmetry).toBeLessThanOrEqual(1e-9);
    expect(r.method.reciprocity.path_difference).toBeLessThanOrEqual(1e-9);
    const engine = buildEngine(parseModel(portal([], [])).model, new Map());
    const n = engine.redundants.length;
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) expect(engine.F[i * n + j]).toBe(engine.F[j * n + i]);
  });

  it("superposition: all loads together = D alone + L alone (glulam example, every find item)", () => {
    const file = example("glulam-beam-gb1");
    const loads = file.loads as { case: string }[];
    const all = run(file);
    const dead = run({ ...file, loads: loads.filter((l) => l.case === "D"), checks: [] });
    const live = run({ ...file, loads: loads.filter((l) => l.case === "L"), checks: [] });
    all.find.forEach((f, i) => expectClose(f.value_si, (dead.find[i]?.value_si ?? 0) + (live.find[i]?.value_si ?? 0), 1e-12, f.label));
  });

  it("equilibrium of reactions: ΣFx, ΣFy and ΣM about the origin vanish with the applied loads", () => {
    // beam load −20 kN/m over 6 m at y = 4 m; column AB local load −5 kN/m (pushes +x) over 4 m at x = 0;
    // node B: Fx = 15 kN, M = 8 kN·m
    const r = run(
      portal(
        [
          { member: "BC", w: "-20 kN/m" },
          { member: "AB", w: "-5 kN/m", dir: "local" },
          { node: "B", Fx: "15 kN", M: "8 kN*m" },
        ],
        [],
      ),
    );
    const Fx = 5e3 * 4 + 15e3;
    const Fy = -20e3 * 6;
    // moments about (0, 0), counter-clockwise: beam load at x = 3 m; column load at y = 2 m acting in +x
    const Mo = Fy * 3 - 5e3 * 4 * 2 - 15e3 * 4 + 8e3;
    const ra = reaction(r, "A");
    const rd = reaction(r, "D");
    expectClose(ra.Fx + rd.Fx, -Fx, 1e-12, "ΣFx");
    expectClose(ra.Fy + rd.Fy, -Fy, 1e-12, "ΣFy");
    expectClose(ra.M + rd.M + rd.Fy * 6, -Mo, 1e-12, "ΣM");
    expectCrossCheckAgrees(r);
  });

  it("work–energy balance ½ΣPΔ + ½∫w·v dx = U for every example", () => {
    for (const name of ["floor-joist-j1", "glulam-beam-gb1", "steel-girder-cantilever", "continuous-beam", "roof-truss", "portal-frame"]) {
      const r = run(example(name));
      expect(r.energy.applies, name).toBe(true);
      expect(r.energy.balanced, name).toBe(true);
      expectClose(r.energy.external_work_J, r.energy.strain_energy_J, 1e-9, name);
    }
  });

  it("with settlement and temperature the plain balance need not hold, the generalized one does", () => {
    const r = run(
      beamModel({
        xs: [0, 5, 10],
        A: 5e-3,
        supports: { N0: "pin", N1: "roller", N2: "roller" },
        loads: [{ member: "M1", w: "-10 kN/m" }, { node: "N1", settle: ["0 mm", "-6 mm"] }, { member: "M2", dT: "30 K", alpha: "1.2e-5 1/K" }],
      }),
    );
    expect(r.energy.applies).toBe(false);
    expect(r.energy.note).toMatch(/need not equal/);
    expect(Math.abs(r.energy.external_work_J - r.energy.strain_energy_J)).toBeGreaterThan(1e-3 * r.energy.strain_energy_J);
    expectClose(r.energy.generalized.predicted_strain_energy_J, r.energy.strain_energy_J, 1e-9, "2U = ΣPΔ + ΣRs − ∫Nε₀");
    expectCrossCheckAgrees(r);
  });

  it("splitting a member at its mid-point changes nothing (beam and portal)", () => {
    const loads = [{ member: "M1", w: "-12 kN/m" }];
    const one = run(beamModel({ xs: [0, 6], supports: { N0: "pin", N1: "roller" }, loads, find: [{ node: "mid:M1", dof: "y" }, { node: "N1", dof: "rz" }] }));
    const two = run(
      beamModel({
        xs: [0, 3, 6],
        supports: { N0: "pin", N2: "roller" },
        loads: [{ member: "M1", w: "-12 kN/m" }, { member: "M2", w: "-12 kN/m" }],
        find: [{ node: "N1", dof: "y" }, { node: "N2", dof: "rz" }],
      }),
    );
    expectClose(findValue(two, "N1"), findValue(one, "mid:M1"), 1e-12, "mid-span");
    expectClose(findValue(two, "N2", "rz"), findValue(one, "N1", "rz"), 1e-12, "end rotation");
    expectClose(reaction(two, "N0").Fy, reaction(one, "N0").Fy, 1e-12, "reaction");

    const f = [{ node: "B", dof: "x" }, { node: "C", dof: "rz" }];
    const p1 = run(portal([{ member: "BC", w: "-20 kN/m" }, { node: "B", Fx: "10 kN" }], [...f, { node: "mid:BC", dof: "y" }]));
    const p2 = run(portal([{ member: "BM", w: "-20 kN/m" }, { member: "MC", w: "-20 kN/m" }, { node: "B", Fx: "10 kN" }], [...f, { node: "M", dof: "y" }], true));
    expectClose(findValue(p2, "B", "x"), findValue(p1, "B", "x"), 1e-10, "sway");
    expectClose(findValue(p2, "C", "rz"), findValue(p1, "C", "rz"), 1e-10, "joint rotation");
    expectClose(findValue(p2, "M", "y"), findValue(p1, "mid:BC", "y"), 1e-10, "beam mid-span");
    expectClose(reaction(p2, "A").M, reaction(p1, "A").M, 1e-10, "base moment");
  });

  it("the same model in US and SI units gives the same SI answer (NIST SP 811 factors)", () => {
    const us = example("floor-joist-j1");
    const ft = 0.3048;
    const inch = 0.0254;
    const lbf = 4.4482216152605;
    const siModel = {
      ...us,
      nodes: { A: ["0 m", "0 m"], B: [`${14 * ft} m`, "0 m"] },
      members: { J1: { ends: ["A", "B"], E: `${(1600e3 * lbf) / inch ** 2} Pa`, I: `${98.93 * inch ** 4} m^4`, A: `${13.875 * inch ** 2} m^2` } },
      loads: [
        { member: "J1", w: `${(-13.33 * lbf) / ft} N/m`, case: "D" },
        { member: "J1", w: `${(-53.33 * lbf) / ft} N/m`, case: "L" },
      ],
      checks: [],
    };
    const a = run(us);
    const b = run(siModel);
    a.find.forEach((f, i) => expectClose(b.find[i]?.value_si ?? 0, f.value_si, 1e-12, f.label));
    expectClose(reaction(b, "A").Fy, reaction(a, "A").Fy, 1e-12, "reaction");
    expect(a.find[0]?.unit_display).toBe("in");
    expect(b.find[0]?.unit_display).toBe("mm");
  });

  it("a unit load at a node gives the same displacement as the all-nodes adjoint solve behind the stations", () => {
    const r = solve(portal([{ member: "BC", w: "-20 kN/m" }, { node: "B", Fx: "10 kN" }], [{ node: "B", dof: "x" }, { node: "C", dof: "y" }, { node: "C", dof: "rz" }]), { stations: 4 });
    const first = member(r, "BC").stations[0];
    const last = member(r, "BC").stations.at(-1);
    expectClose(first?.ux_m ?? 0, findValue(r, "B", "x"), 1e-12, "B x");
    expectClose(last?.uy_m ?? 0, findValue(r, "C", "y"), 1e-12, "C y");
    expectClose(last?.rz_rad ?? 0, findValue(r, "C", "rz"), 1e-12, "C rz (rigid joint)");
  });

  it("members without A are axially rigid: the same as A → very large", () => {
    const rigid = (m: Record<string, unknown>): Record<string, unknown> => {
      const members = structuredClone(m.members) as Record<string, Record<string, unknown>>;
      for (const v of Object.values(members)) delete v.A;
      return { ...m, members };
    };
    const stiff = (m: Record<string, unknown>): Record<string, unknown> => {
      const members = structuredClone(m.members) as Record<string, Record<string, unknown>>;
      for (const v of Object.values(members)) v.A = "1e4 m^2";
      return { ...m, members };
    };
    const model = portal([{ member: "BC", w: "-20 kN/m" }, { node: "B", Fx: "10 kN" }], [{ node: "B", dof: "x" }, { node: "mid:BC", dof: "y" }, { node: "C", dof: "rz" }]);
    const a = run(rigid(model));
    const b = run(stiff(model));
    a.find.forEach((f, i) => expectClose(f.value_si, b.find[i]?.value_si ?? 0, 1e-5, f.label));
    expectCrossCheckAgrees(a);
  });

  it("a hinge (member release): Gerber beam, fixed at A, hinge at B, roller at C, load P at mid BC", () => {
    // by statics: BC is a simple span on the hinge and C, so the cantilever AB carries P/2 at its tip:
    // Δ_B = (P/2)·a³/3EI; mid BC moves Δ_B/2 + P·b³/48EI (AISC Table 3-23 cases 21 and 7 superposed)
    const P = 40e3;
    const EI = 200e9 * 1.2e-4;
    const model = beamModel({ xs: [0, 4, 8], supports: { N0: "fixed", N2: "roller" }, loads: [{ member: "M2", P: `${-P} N`, at: "2 m" }], find: [{ node: "N1", dof: "y" }, { node: "mid:M2", dof: "y" }] });
    const m1 = (model.members as Record<string, Record<string, unknown>>).M1;
    if (m1) m1.release = ["end"];
    const r = run(model);
    const dB = ((P / 2) * 4 ** 3) / (3 * EI);
    expectClose(findValue(r, "N1"), -dB, 1e-12, "hinge");
    expectClose(findValue(r, "mid:M2"), -(dB / 2 + (P * 4 ** 3) / (48 * EI)), 1e-12, "mid BC");
    expectClose(reaction(r, "N2").Fy, P / 2, 1e-12, "R_C");
    expectCrossCheckAgrees(r);
  });
});

describe("the cross-check", () => {
  it("flags every value whose relative difference exceeds the tolerance", () => {
    const model = example("floor-joist-j1");
    const strict = run(model, { crossCheckTolerance: 0 });
    const nonzero = strict.find.filter((f) => (f.rel_diff ?? 0) > 0);
    expect(nonzero.length).toBeGreaterThan(0);
    for (const f of nonzero) expect(f.disagreement).toBe(true);
    expect(strict.cross_check.disagreements.length).toBeGreaterThanOrEqual(nonzero.length);
    const off = run(model, { crossCheck: false });
    expect(off.cross_check.available).toBe(false);
    expect(off.find[0]?.stiffness_si).toBeNull();
  });
});

describe("load forms", () => {
  const EI = 200e9 * 1.2e-4;

  it("a partial load: uniform load on [0, a] plus on [a, l] equals the full uniform load (superposition)", () => {
    const find = [{ node: "at:M1:2.2 m", dof: "y" }, { node: "N1", dof: "rz" }];
    const full = run(beamModel({ xs: [0, 6], supports: { N0: "pin", N1: "roller" }, loads: [{ member: "M1", w: "-9 kN/m" }], find }));
    const parts = run(
      beamModel({
        xs: [0, 6],
        supports: { N0: "pin", N1: "roller" },
        loads: [{ member: "M1", w: "-9 kN/m", to: "2.2 m" }, { member: "M1", w: "-9 kN/m", from: "2.2 m" }],
        find,
      }),
    );
    full.find.forEach((f, i) => expectClose(parts.find[i]?.value_si ?? 0, f.value_si, 1e-12, f.label));
  });

  it("a couple at the tip of a cantilever: θ = ML/EI, Δ = ML²/2EI (standard result, from memory), as a node or a member load", () => {
    const M = 15e3;
    const asNode = run(beamModel({ xs: [0, 4], supports: { N0: "fixed" }, loads: [{ node: "N1", M: `${M} N*m` }], find: [{ node: "N1", dof: "y" }, { node: "N1", dof: "rz" }] }));
    const asMember = run(beamModel({ xs: [0, 4], supports: { N0: "fixed" }, loads: [{ member: "M1", M: `${M} N*m`, at: "4 m" }], find: [{ node: "N1", dof: "y" }, { node: "N1", dof: "rz" }] }));
    for (const r of [asNode, asMember]) {
      expectClose(findValue(r, "N1", "rz"), (M * 4) / EI, 1e-12, "θ");
      expectClose(findValue(r, "N1"), (M * 16) / (2 * EI), 1e-12, "Δ");
      expectCrossCheckAgrees(r);
    }
  });

  it("an inclined rafter with a load per horizontal projection: transverse load w·cos²θ, R = w·l_h/2", () => {
    // 3-4-5 rafter: horizontal run 4 m, rise 3 m, length 5 m, cos θ = 0.8; axially rigid, pin at the
    // eave and a roller (y held) at the ridge, so the chord cannot move; mid-span transverse
    // deflection 5·q·L⁴/384EI (AISC Table 3-23 case 1) with q = w·cos²θ, seen vertically × cos θ.
    const r = run({
      kind: "beam",
      nodes: { A: ["0 m", "0 m"], B: ["4 m", "3 m"] },
      members: { AB: { ends: ["A", "B"], E: "200 GPa", I: "1.2e-4 m^4" } },
      supports: { A: "pin", B: "roller" },
      loads: [{ member: "AB", w: "-2 kN/m", per: "horizontal" }],
      find: [{ node: "mid:AB", dof: "y" }, { node: "mid:AB", dof: "x" }],
    });
    const q = 2e3 * 0.8 ** 2;
    const v = (5 * q * 5 ** 4) / (384 * EI);
    expectClose(findValue(r, "mid:AB"), -v * 0.8, 1e-12, "vertical");
    expectClose(findValue(r, "mid:AB", "x"), v * 0.6, 1e-12, "horizontal");
    expectClose(reaction(r, "A").Fy, 4e3, 1e-12, "R_A");
    expectClose(reaction(r, "B").Fy, 4e3, 1e-12, "R_B");
    expectCrossCheckAgrees(r);
  });
});

describe("independent dense reference (ml-matrix, tests only)", () => {
  it("portal frame under node loads: node displacements match a dense stiffness solve", () => {
    const loads = { B: { Fx: 25e3, M: -6e3 }, C: { Fy: -60e3 } };
    const r = run(
      portal(
        [{ node: "B", Fx: "25 kN", M: "-6 kN*m" }, { node: "C", Fy: "-60 kN" }],
        ["B", "C"].flatMap((n) => ["x", "y", "rz"].map((dof) => ({ node: n, dof }))),
      ),
    );
    const nodes: Record<string, RefNode> = {
      A: { x: 0, y: 0, fix: ["x", "y", "rz"] },
      B: { x: 0, y: 4, load: loads.B },
      C: { x: 6, y: 4, load: loads.C },
      D: { x: 6, y: 0, fix: ["x", "y", "rz"] },
    };
    const ref = denseReference(
      nodes,
      [
        { a: "A", b: "B", E, I: 8.3e-5, A: 7.7e-3 },
        { a: "B", b: "C", E, I: 1.2e-4, A: 6.5e-3 },
        { a: "C", b: "D", E, I: 8.3e-5, A: 7.7e-3 },
      ],
      false,
    );
    for (const f of r.find) {
      const d = ref.get(f.label);
      expectClose(f.value_si, (d?.[f.dof] ?? Number.NaN) as number, 1e-9, `${f.label} ${f.dof}`);
    }
  });

  it("statically indeterminate truss (one redundant diagonal) matches a dense stiffness solve", () => {
    const bar = { E: "200 GPa", A: "1.5e-3 m^2" };
    const model = {
      kind: "truss",
      nodes: { A: ["0 m", "0 m"], B: ["3 m", "0 m"], C: ["3 m", "3 m"], D: ["0 m", "3 m"] },
      members: {
        AB: { ends: ["A", "B"], ...bar },
        BC: { ends: ["B", "C"], ...bar },
        CD: { ends: ["C", "D"], ...bar },
        DA: { ends: ["D", "A"], ...bar },
        AC: { ends: ["A", "C"], ...bar },
        BD: { ends: ["B", "D"], ...bar },
      },
      supports: { A: "pin", B: "roller" },
      loads: [{ node: "C", Fx: "30 kN", Fy: "-10 kN" }, { node: "D", Fy: "-20 kN" }],
      find: [{ node: "C", dof: "x" }, { node: "C", dof: "y" }, { node: "D", dof: "x" }, { node: "B", dof: "x" }],
    };
    const r = run(model);
    expect(r.method.degree_of_indeterminacy).toBe(1);
    const ref = denseReference(
      {
        A: { x: 0, y: 0, fix: ["x", "y"] },
        B: { x: 3, y: 0, fix: ["y"] },
        C: { x: 3, y: 3, load: { Fx: 30e3, Fy: -10e3 } },
        D: { x: 0, y: 3, load: { Fy: -20e3 } },
      },
      [["A", "B"], ["B", "C"], ["C", "D"], ["D", "A"], ["A", "C"], ["B", "D"]].map(([a, b]) => ({ a: a ?? "", b: b ?? "", E: 200e9, A: 1.5e-3 })),
      true,
    );
    for (const f of r.find) expectClose(f.value_si, ref.get(f.label)?.[f.dof as "x" | "y"] ?? Number.NaN, 1e-9, `${f.label} ${f.dof}`);
    expectCrossCheckAgrees(r);
  });
});
