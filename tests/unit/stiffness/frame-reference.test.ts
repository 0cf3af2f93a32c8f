import { Matrix, solve } from "ml-matrix";
import { describe, expect, it } from "vitest";
import { solveStiffness } from "@/lib/solver/stiffness";
import { prepareModel } from "@/lib/solver/stiffness/assemble";
import { emptyLoads, endForces, localStiffness, memberState, sectionOf, toGlobal } from "@/lib/solver/stiffness/member";
import type { ParsedLoad, ParsedModel } from "@/lib/solver/types";
import { buildModel, relErr } from "@/tests/unit/stiffness/model-builder";

const E = 200e9;
const col = { E, I: 1.2e-4, A: 8.0e-3 };
const beam = { E, I: 2.6e-4, A: 9.5e-3 };

/**
 * Independent dense reference: textbook 2D Euler–Bernoulli frame element (McGuire, Gallagher
 * & Ziemian, Matrix Structural Analysis, 2nd ed., eq. 4.34 — from memory), assembled into a
 * full matrix and solved with ml-matrix. Member loads enter as the standard consistent nodal
 * loads of a uniform load over the whole member (qL/2, qL²/12; pL/2 axially) and of a uniform
 * temperature change (±EA·α·ΔT).
 */
function denseReference(
  model: ParsedModel,
  nodeLoads: Record<string, [number, number, number]>,
  memberLoads: Record<string, { q?: number; p?: number; thermal?: number }>,
) {
  const n = model.nodes.length;
  const at = new Map(model.nodes.map((nd, i) => [nd.id, i]));
  const K = Matrix.zeros(3 * n, 3 * n);
  const F = Matrix.zeros(3 * n, 1);
  for (const [id, [fx, fy, mz]] of Object.entries(nodeLoads)) {
    const i = at.get(id)!;
    F.set(3 * i, 0, F.get(3 * i, 0) + fx);
    F.set(3 * i + 1, 0, F.get(3 * i + 1, 0) + fy);
    F.set(3 * i + 2, 0, F.get(3 * i + 2, 0) + mz);
  }
  for (const m of model.members) {
    const L = m.length;
    const EA = m.E * m.A!;
    const EI = m.E * m.I!;
    const a = EA / L;
    const b = (12 * EI) / L ** 3;
    const c = (6 * EI) / L ** 2;
    const d = (4 * EI) / L;
    const e = (2 * EI) / L;
    const kl = new Matrix([
      [a, 0, 0, -a, 0, 0],
      [0, b, c, 0, -b, c],
      [0, c, d, 0, -c, e],
      [-a, 0, 0, a, 0, 0],
      [0, -b, -c, 0, b, -c],
      [0, c, e, 0, -c, d],
    ]);
    const cs = m.cos;
    const sn = m.sin;
    const T = new Matrix([
      [cs, sn, 0, 0, 0, 0],
      [-sn, cs, 0, 0, 0, 0],
      [0, 0, 1, 0, 0, 0],
      [0, 0, 0, cs, sn, 0],
      [0, 0, 0, -sn, cs, 0],
      [0, 0, 0, 0, 0, 1],
    ]);
    const kg = T.transpose().mmul(kl).mmul(T);
    const ml = memberLoads[m.id];
    const q = ml?.q ?? 0;
    const p = ml?.p ?? 0;
    const th = ml?.thermal ?? 0;
    const feq = new Matrix([
      [(p * L) / 2 - EA * th],
      [(q * L) / 2],
      [(q * L * L) / 12],
      [(p * L) / 2 + EA * th],
      [(q * L) / 2],
      [(-q * L * L) / 12],
    ]);
    const fg = T.transpose().mmul(feq);
    const dofs = [at.get(m.start)!, at.get(m.end)!].flatMap((i) => [3 * i, 3 * i + 1, 3 * i + 2]);
    dofs.forEach((r, ri) => {
      F.set(r, 0, F.get(r, 0) + fg.get(ri, 0));
      dofs.forEach((s, si) => K.set(r, s, K.get(r, s) + kg.get(ri, si)));
    });
  }
  const heldSet = new Set<number>();
  for (const s of model.supports) {
    const i = at.get(s.node)!;
    if (s.x) heldSet.add(3 * i);
    if (s.y) heldSet.add(3 * i + 1);
    if (s.rz) heldSet.add(3 * i + 2);
  }
  const freeDofs = [...Array(3 * n).keys()].filter((i) => !heldSet.has(i));
  const Kff = new Matrix(freeDofs.map((r) => freeDofs.map((s) => K.get(r, s))));
  const Ff = new Matrix(freeDofs.map((r) => [F.get(r, 0)]));
  const df = solve(Kff, Ff);
  const D = Matrix.zeros(3 * n, 1);
  freeDofs.forEach((r, k) => D.set(r, 0, df.get(k, 0)));
  const R = K.mmul(D).sub(F);
  return { D, R, K, at };
}

const portal = () =>
  buildModel(
    "frame",
    { A: [0, 0], B: [0, 4.5], C: [7, 4.5], D: [7, 0] },
    { AB: { ends: ["A", "B"], ...col }, BC: { ends: ["B", "C"], ...beam }, CD: { ends: ["C", "D"], ...col } },
    { A: "fixed", D: "pin" },
  );

const gable = () =>
  buildModel(
    "frame",
    { A: [0, 0], B: [0, 4], C: [5, 6], D: [10, 4], E: [10, 0] },
    {
      AB: { ends: ["A", "B"], ...col },
      BC: { ends: ["B", "C"], ...beam },
      CD: { ends: ["C", "D"], ...beam },
      DE: { ends: ["D", "E"], ...col },
    },
    { A: "fixed", E: "pin" },
  );

describe("frames against an independent dense assembly (ml-matrix)", () => {
  it("portal: sway load, beam load, joint couple and a heated beam", () => {
    const m = portal();
    const alpha = 12e-6;
    const dT = 30;
    const loads: ParsedLoad[] = [
      { type: "node", case: "W", node: "B", Fx: 25e3, Fy: 0, M: 0 },
      { type: "node", case: "D", node: "C", Fx: 0, Fy: -10e3, M: 8e3 },
      { type: "line", case: "D", member: "BC", a: 0, b: 7, wa: -18e3, wb: -18e3, dir: "global" },
      { type: "thermal", case: "T", member: "BC", dT, alpha },
    ];
    const [r] = solveStiffness(m, [loads]);
    const ref = denseReference(m, { B: [25e3, 0, 0], C: [0, -10e3, 8e3] }, { BC: { q: -18e3, thermal: alpha * dT } });
    const scale = Math.max(...ref.D.to1DArray().map(Math.abs));
    for (const nd of m.nodes) {
      const i = ref.at.get(nd.id)!;
      const got = r!.nodes.get(nd.id)!;
      expect(relErr(got.x, ref.D.get(3 * i, 0), scale)).toBeLessThan(1e-10);
      expect(relErr(got.y, ref.D.get(3 * i + 1, 0), scale)).toBeLessThan(1e-10);
      expect(relErr(got.rz, ref.D.get(3 * i + 2, 0), scale)).toBeLessThan(1e-9);
    }
    for (const id of ["A", "D"]) {
      const i = ref.at.get(id)!;
      const got = r!.reactions.get(id)!;
      expect(relErr(got.Fx, ref.R.get(3 * i, 0), 1e5)).toBeLessThan(1e-10);
      expect(relErr(got.Fy, ref.R.get(3 * i + 1, 0), 1e5)).toBeLessThan(1e-10);
      if (id === "A") expect(relErr(got.M, ref.R.get(3 * i + 2, 0), 1e5)).toBeLessThan(1e-10);
    }
    expect(r!.reactions.get("D")!.M).toBe(0);
  });

  it("assembled stiffness equals the dense one entry by entry, hence symmetric", () => {
    const m = gable();
    const prep = prepareModel(m);
    const ref = denseReference(m, {}, {});
    const globalOf: number[] = [];
    prep.free.forEach((f, g) => {
      if (f >= 0) globalOf[f] = g;
    });
    let maxK = 0;
    for (let i = 0; i < prep.nFree; i++) maxK = Math.max(maxK, Math.abs(prep.soft.get(i, i)));
    for (let i = 0; i < prep.nFree; i++) {
      for (let j = 0; j < prep.nFree; j++) {
        const gi = globalOf[i]!;
        const gj = globalOf[j]!;
        expect(Math.abs(prep.soft.get(i, j) - ref.K.get(gi, gj))).toBeLessThan(1e-13 * maxK);
        // The dense reference is symmetric too (a check on the reference itself).
        expect(Math.abs(ref.K.get(gi, gj) - ref.K.get(gj, gi))).toBeLessThan(1e-13 * maxK);
      }
    }
  });

  it("gable: rafter loads in global y (per member length) and local y", () => {
    const m = gable();
    const w = -7e3;
    const q = -4.5e3;
    const loads: ParsedLoad[] = [
      { type: "line", case: "S", member: "BC", a: 0, b: m.members[1]!.length, wa: w, wb: w, dir: "global" },
      { type: "line", case: "W", member: "CD", a: 0, b: m.members[2]!.length, wa: q, wb: q, dir: "local" },
      { type: "node", case: "W", node: "B", Fx: 6e3, Fy: 0, M: 0 },
    ];
    const [r] = solveStiffness(m, [loads]);
    const bc = m.members[1]!;
    // A global-y intensity w on a member at angle θ: local y part w·cosθ, local x part w·sinθ.
    const ref = denseReference(m, { B: [6e3, 0, 0] }, { BC: { q: w * bc.cos, p: w * bc.sin }, CD: { q } });
    const scale = Math.max(...ref.D.to1DArray().map(Math.abs));
    for (const nd of m.nodes) {
      const i = ref.at.get(nd.id)!;
      const got = r!.nodes.get(nd.id)!;
      expect(relErr(got.x, ref.D.get(3 * i, 0), scale)).toBeLessThan(1e-10);
      expect(relErr(got.y, ref.D.get(3 * i + 1, 0), scale)).toBeLessThan(1e-10);
    }
    const iA = ref.at.get("A")!;
    expect(relErr(r!.reactions.get("A")!.M, ref.R.get(3 * iA + 2, 0))).toBeLessThan(1e-10);
  });
});

describe("invariants", () => {
  const loadedGable = (): { model: ParsedModel; loads: ParsedLoad[] } => {
    const model = gable();
    // Hinge at the ridge on one rafter and a shear-deformable column, to exercise both.
    model.members[1]!.releaseEnd = true;
    model.members[0]!.shear = { G: 77e9, Av: 3.2e-3 };
    const loads: ParsedLoad[] = [
      { type: "node", case: "W", node: "B", Fx: 6e3, Fy: -2e3, M: 1.5e3 },
      { type: "line", case: "S", member: "BC", a: 0.8, b: 4.1, wa: -3e3, wb: -9e3, dir: "global" },
      { type: "line", case: "W", member: "CD", a: 1.0, b: 5.0, wa: 2e3, wb: 1e3, dir: "local" },
      { type: "line", case: "W", member: "AB", a: 0, b: 4, wa: 1.2e3, wb: 0.4e3, dir: "local" },
      { type: "point", case: "L", member: "CD", a: 2.2, P: -11e3, dir: "global" },
      { type: "point", case: "L", member: "BC", a: 3.0, P: 4e3, dir: "local" },
      { type: "moment", case: "D", member: "DE", a: 1.5, M: -6e3 },
    ];
    return { model, loads };
  };

  it("reactions balance the applied loads (forces and moment about the origin)", () => {
    const { model, loads } = loadedGable();
    const [r] = solveStiffness(model, [loads]);
    const mem = new Map(model.members.map((m) => [m.id, m]));
    const pos = new Map(model.nodes.map((n) => [n.id, n]));
    let Fx = 0;
    let Fy = 0;
    let Mz = 0;
    const addForce = (x: number, y: number, fx: number, fy: number) => {
      Fx += fx;
      Fy += fy;
      Mz += x * fy - y * fx;
    };
    for (const l of loads) {
      if (l.type === "node") {
        const n = pos.get(l.node)!;
        addForce(n.x, n.y, l.Fx, l.Fy);
        Mz += l.M;
      } else if (l.type === "line" || l.type === "point" || l.type === "moment") {
        const m = mem.get(l.member)!;
        const s = pos.get(m.start)!;
        const dir = l.type !== "moment" && l.dir === "local" ? [-m.sin, m.cos] : [0, 1];
        if (l.type === "line") {
          // Trapezoid: resultant (wa + wb)/2·(b − a) at a + (b − a)(wa + 2wb)/(3(wa + wb)).
          const R = ((l.wa + l.wb) / 2) * (l.b - l.a);
          const xc = l.a + ((l.b - l.a) * (l.wa + 2 * l.wb)) / (3 * (l.wa + l.wb));
          addForce(s.x + xc * m.cos, s.y + xc * m.sin, R * dir[0]!, R * dir[1]!);
        } else if (l.type === "point") {
          addForce(s.x + l.a * m.cos, s.y + l.a * m.sin, l.P * dir[0]!, l.P * dir[1]!);
        } else {
          Mz += l.M;
        }
      }
    }
    for (const [id, rc] of r!.reactions) {
      const n = pos.get(id)!;
      addForce(n.x, n.y, rc.Fx, rc.Fy);
      Mz += rc.M;
    }
    expect(Math.abs(Fx)).toBeLessThan(1e-9 * 1e4);
    expect(Math.abs(Fy)).toBeLessThan(1e-9 * 1e4);
    expect(Math.abs(Mz)).toBeLessThan(1e-9 * 1e5);
    // The hinge carries no moment.
    expect(Math.abs(r!.stations("BC", [model.members[1]!.length])[0]!.M)).toBeLessThan(1e-6);
  });

  it("Maxwell–Betti: δ at j from a unit load at i equals δ at i from a unit load at j", () => {
    const { model } = loadedGable();
    const i = { member: "BC", x: 1.7 };
    const j = { member: "CD", x: 3.9 };
    const [ri, rj] = solveStiffness(model, [
      [{ type: "point", case: "D", member: i.member, a: i.x, P: 1, dir: "global" }],
      [{ type: "point", case: "D", member: j.member, a: j.x, P: 1, dir: "global" }],
    ]);
    const dji = ri!.displacementAt(j, "y");
    const dij = rj!.displacementAt(i, "y");
    expect(relErr(dji, dij)).toBeLessThan(1e-10);
    // And between a couple and a rotation: θ at i from a unit force at j = δ at j from a unit couple at i.
    const [rc] = solveStiffness(model, [[{ type: "moment", case: "D", member: i.member, a: i.x, M: 1 }]]);
    expect(relErr(rj!.displacementAt(i, "rz"), rc!.displacementAt(j, "y"))).toBeLessThan(1e-10);
  });

  it("member stiffness: symmetric, no force under rigid-body motion, equal to the integrated field", () => {
    const base = { id: "M", start: "a", end: "b", E, I: 3.1e-4, A: 7e-3, length: 5.3, cos: 0.6, sin: 0.8 };
    for (const shear of [undefined, { G: 80e9, Av: 1.5e-3 }]) {
      for (const [releaseStart, releaseEnd] of [
        [false, false],
        [true, false],
        [false, true],
        [true, true],
      ] as const) {
        const sec = sectionOf({ ...base, shear, releaseStart, releaseEnd }, false);
        const k = localStiffness(sec);
        const kg = toGlobal(k, sec.cos, sec.sin);
        for (let p = 0; p < 6; p++) {
          for (let q = 0; q < 6; q++) {
            expect(k[p * 6 + q]).toBe(k[q * 6 + p]);
            expect(kg[p * 6 + q]).toBe(kg[q * 6 + p]);
          }
        }
        // Rigid translation (1, 1) and rigid rotation about the first end, in local axes.
        const rot = [0, 0, 1, 0, sec.L, 1];
        const tr = [1, 1, 0, 1, 1, 0];
        for (const mode of [rot, tr]) {
          for (let p = 0; p < 6; p++) {
            let s = 0;
            for (let q = 0; q < 6; q++) s += k[p * 6 + q]! * mode[q]!;
            expect(Math.abs(s)).toBeLessThan(1e-6 * k[0]!);
          }
        }
        // Closed-form matrix against the initial-value integration of the same member.
        const d = [0.0011, -0.0023, 0.0007, -0.0004, 0.0019, -0.0013] as const;
        const f = endForces(memberState(sec, emptyLoads(), d));
        for (let p = 0; p < 6; p++) {
          let s = 0;
          for (let q = 0; q < 6; q++) s += k[p * 6 + q]! * d[q]!;
          expect(relErr(s, f[p]!, Math.abs(k[0]! * 0.001))).toBeLessThan(1e-12);
        }
      }
    }
  });
});
