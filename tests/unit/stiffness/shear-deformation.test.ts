import { describe, expect, it } from "vitest";
import { solveStiffness } from "@/lib/solver/stiffness";
import type { ParsedLoad } from "@/lib/solver/types";
import { buildModel, relErr } from "@/tests/unit/stiffness/model-builder";

// A short, deep glulam-like beam so that the shear term is a visible part of the total.
// E = 1.8e6 psi = 12.41 GPa; G ≈ E/16 for wood (USDA FPL Wood Handbook GTR-190, from memory).
const E = 1.8e6 * 6894.757293;
const G = E / 16;
const b = 0.13; // m
const d = 0.6; // m
const A = b * d;
const I = (b * d ** 3) / 12;
// A′ = 5A/6 for a rectangle (Wood Handbook Table 9-1 note, from memory).
const Av = (5 * A) / 6;
const EI = E * I;
const L = 3.2; // m
const REL = 1e-10;

const member = { ends: ["A", "B"] as [string, string], E, I, A, shear: { G, Av } };
const simple = () => buildModel("beam", { A: [0, 0], B: [L, 0] }, { AB: member }, { A: "pin", B: "roller" });

describe("shear deflection, USDA FPL Wood Handbook (GTR-190) Table 9-1: δ = k_b·W·L³/EI + k_s·W·L/(A′G)", () => {
  it("simple span, uniform load: k_b = 5/384, k_s = 1/8", () => {
    const w = 40e3; // N/m down
    const W = w * L;
    const [r] = solveStiffness(simple(), [[{ type: "line", case: "D", member: "AB", a: 0, b: L, wa: -w, wb: -w, dir: "global" }]]);
    const expected = -((5 / 384) * W * L ** 3) / EI - ((1 / 8) * W * L) / (Av * G);
    expect(relErr(r!.displacementAt({ member: "AB", x: L / 2 }, "y"), expected)).toBeLessThan(REL);
    // The shear part is not negligible here, so the check does discriminate.
    expect(((1 / 8) * W * L) / (Av * G) / Math.abs(expected)).toBeGreaterThan(0.1);
    for (const x of [0.3, 1.1, 2.45]) {
      // Bending: Table 3-23 case 1 shape; shear: v_s = −M/(A′G) with M = wx(l − x)/2, since
      // dv_s/dx = −V/(A′G) and v_s(0) = 0 (worked by hand).
      const bend = -(w * x * (L ** 3 - 2 * L * x * x + x ** 3)) / (24 * EI);
      const shear = -(w * x * (L - x)) / 2 / (Av * G);
      expect(relErr(r!.displacementAt({ member: "AB", x }, "y"), bend + shear)).toBeLessThan(REL);
    }
  });

  it("simple span, midspan point load: k_b = 1/48, k_s = 1/4", () => {
    const W = 150e3;
    const [r] = solveStiffness(simple(), [[{ type: "point", case: "L", member: "AB", a: L / 2, P: -W, dir: "global" }]]);
    const expected = -(W * L ** 3) / (48 * EI) - (W * L) / (4 * Av * G);
    expect(relErr(r!.displacementAt({ member: "AB", x: L / 2 }, "y"), expected)).toBeLessThan(REL);
  });

  it("cantilever, end load: k_b = 1/3, k_s = 1", () => {
    const W = 90e3;
    const m = buildModel("beam", { A: [0, 0], B: [L, 0] }, { AB: member }, { A: "fixed" });
    const [nodeLoad, memberLoad] = solveStiffness(m, [
      [{ type: "node", case: "D", node: "B", Fx: 0, Fy: -W, M: 0 }],
      [{ type: "point", case: "D", member: "AB", a: L, P: -W, dir: "global" }],
    ]);
    const expected = -(W * L ** 3) / (3 * EI) - (W * L) / (Av * G);
    expect(relErr(nodeLoad!.nodes.get("B")!.y, expected)).toBeLessThan(REL);
    // The same load given on the member at its end must reach the node the same way.
    expect(relErr(memberLoad!.nodes.get("B")!.y, expected)).toBeLessThan(REL);
    // Shear does not change the end rotation of a cantilever: Pl²/2EI (from memory).
    expect(relErr(nodeLoad!.nodes.get("B")!.rz, (-W * L * L) / (2 * EI))).toBeLessThan(REL);
  });

  it("fixed at both ends, uniform load: wl⁴/384EI + wl²/(8A′G)", () => {
    // Symmetry keeps the end moments at wl²/12 whatever the shear stiffness (θ = 0 at ends
    // and centre involves bending only), and V is the simple-span shear, so the shear part
    // at the centre is the simple-span wl²/8A′G (worked by hand from Table 3-23 case 15).
    const w = 55e3;
    const m = buildModel("beam", { A: [0, 0], B: [L, 0] }, { AB: member }, { A: "fixed", B: "fixed" });
    const [r] = solveStiffness(m, [[{ type: "line", case: "D", member: "AB", a: 0, b: L, wa: -w, wb: -w, dir: "global" }]]);
    const expected = -(w * L ** 4) / (384 * EI) - (w * L * L) / (8 * Av * G);
    expect(relErr(r!.displacementAt({ member: "AB", x: L / 2 }, "y"), expected)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("A")!.M, (w * L * L) / 12)).toBeLessThan(REL);
  });

  it("shear-deformable fixed-end forces agree with splitting the member at the load", () => {
    // Off-centre point load on a fixed-fixed Timoshenko beam: once as a member load (fixed-end
    // forces from integration), once as a node load on two members (exact element stiffness
    // only). The two routes share no code for the load.
    const a = 1.1;
    const Pv = -120e3;
    const one = buildModel("beam", { A: [0, 0], B: [L, 0] }, { AB: member }, { A: "fixed", B: "fixed" });
    const two = buildModel(
      "beam",
      { A: [0, 0], C: [a, 0], B: [L, 0] },
      { AC: { ...member, ends: ["A", "C"] }, CB: { ...member, ends: ["C", "B"] } },
      { A: "fixed", B: "fixed" },
    );
    const [r1] = solveStiffness(one, [[{ type: "point", case: "D", member: "AB", a, P: Pv, dir: "global" }]]);
    const [r2] = solveStiffness(two, [[{ type: "node", case: "D", node: "C", Fx: 0, Fy: Pv, M: 0 }]]);
    expect(relErr(r1!.displacementAt({ member: "AB", x: a }, "y"), r2!.nodes.get("C")!.y)).toBeLessThan(REL);
    expect(relErr(r1!.displacementAt({ member: "AB", x: a }, "rz"), r2!.nodes.get("C")!.rz)).toBeLessThan(REL);
    expect(relErr(r1!.reactions.get("A")!.M, r2!.reactions.get("A")!.M)).toBeLessThan(REL);
    expect(relErr(r1!.reactions.get("B")!.Fy, r2!.reactions.get("B")!.Fy)).toBeLessThan(REL);
    // Euler–Bernoulli limit for scale: Table 3-23 case 18 end moment Pab²/l² (from memory);
    // shear makes the fixed-end moments tend towards the simple statics, so they differ.
    const ebMoment = (-Pv * a * (L - a) ** 2) / (L * L);
    expect(relErr(r1!.reactions.get("A")!.M, ebMoment)).toBeGreaterThan(1e-3);
    const ms = buildModel("beam", { A: [0, 0], B: [L, 0] }, { AB: { ...member, shear: undefined } }, { A: "fixed", B: "fixed" });
    const [rEB] = solveStiffness(ms, [[{ type: "point", case: "D", member: "AB", a, P: Pv, dir: "global" }]]);
    expect(relErr(rEB!.reactions.get("A")!.M, ebMoment)).toBeLessThan(REL);
  });

  it("partial triangular load with shear: interior values by superposing the point-load case", () => {
    // Timoshenko simple beam, point load Q at s: bending part is Table 3-23 case 8; shear part
    // is v_s = −M_Q(x)/(A′G) with M_Q the statics moment (worked by hand). Integrating over a
    // linear load with 5-point Gauss on each side of x is exact.
    const a0 = 0.4;
    const b0 = 2.5;
    const w0 = -30e3;
    const w1 = 0;
    const load: ParsedLoad = { type: "line", case: "D", member: "AB", a: a0, b: b0, wa: w0, wb: w1, dir: "global" };
    const [r] = solveStiffness(simple(), [[load]]);
    const gx = [-0.906179845938664, -0.5384693101056831, 0, 0.5384693101056831, 0.906179845938664];
    const gw = [0.2369268850561891, 0.4786286704993665, 0.5688888888888889, 0.4786286704993665, 0.2369268850561891];
    const unit = (x: number, s: number): number => {
      const t = L - s;
      const bend = x <= s ? (t * x * (L * L - t * t - x * x)) / (6 * EI * L) : (s * (L - x) * (2 * L * x - x * x - s * s)) / (6 * EI * L);
      const mQ = x <= s ? (t * x) / L : (s * (L - x)) / L;
      return bend + mQ / (Av * G);
    };
    const integrate = (x: number, lo: number, hi: number): number => {
      if (hi <= lo) return 0;
      let sum = 0;
      for (let k = 0; k < 5; k++) {
        const s = (lo + hi) / 2 + ((hi - lo) / 2) * gx[k]!;
        sum += ((hi - lo) / 2) * gw[k]! * (w0 + ((w1 - w0) * (s - a0)) / (b0 - a0)) * unit(x, s);
      }
      return sum;
    };
    for (const x of [0.2, 0.9, 1.6, 2.5, 3.0]) {
      const expected = integrate(x, a0, Math.min(x, b0)) + integrate(x, Math.max(x, a0), b0);
      expect(relErr(r!.displacementAt({ member: "AB", x }, "y"), expected)).toBeLessThan(REL);
    }
  });
});
