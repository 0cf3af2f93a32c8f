import { describe, expect, it } from "vitest";

import { expectClose, expectCrossCheckAgrees, findValue, member, reaction, run } from "@/tests/unit/solver/helpers";

// A hand-checkable determinate truss (two 4 m panels, 3 m high, so diagonals are 5 m long):
//   D (4, 3)
//   A (0, 0) pin — B (4, 0) — C (8, 0) roller; members AB, BC, AD, DC, BD.
// Method of joints under P down at B (by hand): R_A = R_C = P/2; joint A: N_AD·3/5 + P/2 = 0 so
// N_AD = −5P/6, N_AB = −N_AD·4/5 = 2P/3; joint B: N_BD = P. The unit-load method then gives
//   Δ_B = Σ n·N·L/EA = P/EA·[2·(2/3)²·4 + 2·(5/6)²·5 + 1²·3] = 13.5 P/EA (m when L is in m),
//   Δ_D (unit at D: n_BD = 0)            = P/EA·[2·(2/3)²·4 + 2·(5/6)²·5]       = 10.5 P/EA,
//   Δ_C,x (unit at C in x: n = 1 in AB, BC) = 2·(2/3)·P·4/EA                     = 16/3 P/EA.
const P = 100e3;
const E = 200e9;
const A = 2e-3;
const EA = E * A;

function truss(loads: Record<string, unknown>[]): Record<string, unknown> {
  const bar = { E: `${E} Pa`, A: `${A} m^2` };
  return {
    kind: "truss",
    nodes: { A: ["0 m", "0 m"], B: ["4 m", "0 m"], C: ["8 m", "0 m"], D: ["4 m", "3 m"] },
    members: {
      AB: { ends: ["A", "B"], ...bar },
      BC: { ends: ["B", "C"], ...bar },
      AD: { ends: ["A", "D"], ...bar },
      DC: { ends: ["D", "C"], ...bar },
      BD: { ends: ["B", "D"], ...bar },
    },
    supports: { A: "pin", C: "roller" },
    loads,
    find: [
      { node: "B", dof: "y" },
      { node: "D", dof: "y" },
      { node: "C", dof: "x" },
    ],
  };
}

describe("determinate truss by the method of joints (hand calculation above)", () => {
  const r = run(truss([{ node: "B", Fy: `${-P} N` }]));

  it("member forces: AB = BC = 2P/3, AD = DC = −5P/6, BD = P", () => {
    const expected: Record<string, number> = { AB: (2 * P) / 3, BC: (2 * P) / 3, AD: (-5 * P) / 6, DC: (-5 * P) / 6, BD: P };
    for (const [id, N] of Object.entries(expected)) {
      expectClose(member(r, id).end_forces.start.N_N, N, 1e-12, id);
      expectClose(member(r, id).end_forces.end.N_N, N, 1e-12, id);
    }
    expectClose(reaction(r, "A").Fy, P / 2, 1e-12, "R_A");
    expectClose(reaction(r, "C").Fy, P / 2, 1e-12, "R_C");
  });

  it("unit-load deflections: Δ_B = 13.5 P/EA, Δ_D = 10.5 P/EA, Δ_C,x = 16/3 P/EA", () => {
    expectClose(findValue(r, "B"), (-13.5 * P) / EA, 1e-12, "Δ_B");
    expectClose(findValue(r, "D"), (-10.5 * P) / EA, 1e-12, "Δ_D");
    expectClose(findValue(r, "C", "x"), ((16 / 3) * P) / EA, 1e-12, "Δ_C,x");
    const terms = r.find[0]?.terms ?? [];
    expect(terms.map((t) => t.member).sort()).toEqual(["AB", "AD", "BC", "BD", "DC"]);
    // the table of ΣnNL/AE: BD contributes 1·P·3/EA
    expectClose(terms.find((t) => t.member === "BD")?.axial ?? 0, (-3 * P) / EA, 1e-12, "BD term");
    expectCrossCheckAgrees(r);
  });

  it("a point inside a bar moves on its chord: mid-point of AB drops Δ_B/2", () => {
    const t = run({ ...truss([{ node: "B", Fy: `${-P} N` }]), find: [{ node: "mid:AB", dof: "y" }] });
    expectClose(findValue(t, "mid:AB"), (-13.5 * P) / EA / 2, 1e-12, "mid AB");
    expectCrossCheckAgrees(t);
  });

  it("strain energy ΣN²L/2EA equals ½·P·Δ_B (Clapeyron)", () => {
    expectClose(r.energy.strain_energy_J, (0.5 * P * 13.5 * P) / EA, 1e-12, "U");
    expectClose(r.energy.external_work_J, r.energy.strain_energy_J, 1e-12, "W = U");
  });

  it("temperature change of the bottom chord: Δ_B = Σ n·α·ΔT·L = 16/3 α·ΔT down, Δ_C,x = 8 α·ΔT", () => {
    // α = 6.5e-6 1/degF and ΔT = 45 degF: α·ΔT = 6.5e-6 × 45 (1/degF × degF), no conversion needed
    const alphaDT = 6.5e-6 * 45;
    const t = run(
      truss([
        { member: "AB", dT: "45 degF", alpha: "6.5e-6 1/degF" },
        { member: "BC", dT: "45 degF", alpha: "6.5e-6 1/degF" },
      ]),
    );
    expectClose(findValue(t, "B"), (-16 / 3) * alphaDT, 1e-12, "Δ_B");
    expectClose(findValue(t, "C", "x"), 8 * alphaDT, 1e-12, "Δ_C,x");
    expectClose(t.find[0]?.terms.find((x) => x.member === "AB")?.thermal ?? 0, (-8 / 3) * alphaDT, 1e-12, "AB thermal term");
    // free thermal movement of a determinate truss: no force, no strain energy
    expect(Math.abs(t.energy.strain_energy_J)).toBeLessThan(1e-20);
    expect(t.energy.applies).toBe(false);
    expectCrossCheckAgrees(t);
  });

  it("fabrication misfit: BD made 3 mm too long pushes B down by n·δ = 3 mm", () => {
    const t = run(truss([{ member: "BD", misfit: "3 mm" }]));
    expectClose(findValue(t, "B"), -0.003, 1e-12, "Δ_B");
    expectClose(t.find[0]?.terms.find((x) => x.member === "BD")?.misfit ?? 0, -0.003, 1e-12, "BD misfit term");
    expectCrossCheckAgrees(t);
  });

  it("support settlement: C settles 10 mm, so B drops −Σ r·s = 5 mm (rigid rotation about A)", () => {
    const t = run(truss([{ node: "C", settle: ["0 mm", "-10 mm"] }]));
    expectClose(findValue(t, "B"), -0.005, 1e-12, "Δ_B");
    expect(t.find[0]?.support_terms).toEqual([{ node: "C", settlement: expect.any(Number) }]);
    expectClose(t.find[0]?.support_terms[0]?.settlement ?? 0, -0.005, 1e-12, "−r·s at C");
    expectCrossCheckAgrees(t);
  });
});
