// Case numbers of AISC Manual Table 3-23 are those of the 13th–15th editions, from memory;
// the formulas themselves are also in the American Wood Council's Design Aid No. 6.
import { describe, expect, it } from "vitest";
import { solveStiffness } from "@/lib/solver/stiffness";
import type { ParsedLoad } from "@/lib/solver/types";
import { buildModel, relErr } from "@/tests/unit/stiffness/model-builder";

// Steel-like section, SI: E in Pa, I in m^4, A in m^2.
const E = 200e9;
const I = 8.0e-5;
const A = 6.0e-3;
const EI = E * I;
const L = 7.5; // m
const w = 14.0e3; // N/m, magnitude; applied downward
const P = 36.0e3; // N, magnitude; applied downward
const REL = 1e-10;

const udl = (member: string, length: number): ParsedLoad => ({
  type: "line",
  case: "D",
  member,
  a: 0,
  b: length,
  wa: -w,
  wb: -w,
  dir: "global",
});
const point = (member: string, a: number): ParsedLoad => ({ type: "point", case: "L", member, a, P: -P, dir: "global" });

const simpleBeam = (withArea = true) =>
  buildModel("beam", { A: [0, 0], B: [L, 0] }, { AB: { ends: ["A", "B"], E, I, A: withArea ? A : undefined } }, { A: "pin", B: "roller" });

const cantilever = () =>
  buildModel("beam", { A: [0, 0], B: [L, 0] }, { AB: { ends: ["A", "B"], E, I, A } }, { A: "fixed" });

describe("simple span, AISC Manual 15th ed. Table 3-23", () => {
  it("uniform load: centre deflection 5wl⁴/384EI and the deflected shape (case 1)", () => {
    for (const withArea of [true, false]) {
      const [r] = solveStiffness(simpleBeam(withArea), [[udl("AB", L)]]);
      // Table 3-23 case 1: Δmax = 5wl⁴/384EI at the centre.
      expect(relErr(r!.displacementAt({ member: "AB", x: L / 2 }, "y"), (-5 * w * L ** 4) / (384 * EI))).toBeLessThan(REL);
      for (const x of [0.37, 1.9, 3.1, 5.55, 7.2]) {
        // Table 3-23 case 1: Δx = wx(l³ − 2lx² + x³)/24EI.
        const expected = -(w * x * (L ** 3 - 2 * L * x * x + x ** 3)) / (24 * EI);
        expect(relErr(r!.displacementAt({ member: "AB", x }, "y"), expected)).toBeLessThan(REL);
        const [st] = r!.stations("AB", [x]);
        // Statics of a simple beam: M = wx(l − x)/2 (sagging), V = dM/dx = w(l/2 − x).
        expect(relErr(st!.M, (w * x * (L - x)) / 2)).toBeLessThan(REL);
        expect(relErr(st!.V, w * (L / 2 - x), w * L)).toBeLessThan(REL);
        // Case 1 slope, differentiated by hand: θ = −w(l³ − 6lx² + 4x³)/24EI.
        expect(relErr(st!.rz, (-w * (L ** 3 - 6 * L * x * x + 4 * x ** 3)) / (24 * EI), (w * L ** 3) / (24 * EI))).toBeLessThan(REL);
      }
      // Case 1: R = wl/2 each end.
      expect(relErr(r!.reactions.get("A")!.Fy, (w * L) / 2)).toBeLessThan(REL);
      expect(relErr(r!.reactions.get("B")!.Fy, (w * L) / 2)).toBeLessThan(REL);
    }
  });

  it("centre point load: Pl³/48EI (case 7)", () => {
    const [r] = solveStiffness(simpleBeam(), [[point("AB", L / 2)]]);
    expect(relErr(r!.displacementAt({ member: "AB", x: L / 2 }, "y"), (-P * L ** 3) / (48 * EI))).toBeLessThan(REL);
    // Case 7: Mmax = Pl/4 at the load.
    expect(relErr(r!.stations("AB", [L / 2])[0]!.M, (P * L) / 4)).toBeLessThan(REL);
  });

  it("point load at a: Pa²b²/3EIl at the load and the shape either side (case 8)", () => {
    const a = 2.6;
    const b = L - a;
    const [r] = solveStiffness(simpleBeam(), [[point("AB", a)]]);
    // Case 8: Δa = Pa²b²/3EIl at the point of load.
    expect(relErr(r!.displacementAt({ member: "AB", x: a }, "y"), (-P * a * a * b * b) / (3 * EI * L))).toBeLessThan(REL);
    for (const x of [0.8, 1.7, 2.59]) {
      // Case 8, x < a: Δx = Pbx(l² − b² − x²)/6EIl.
      const expected = -(P * b * x * (L * L - b * b - x * x)) / (6 * EI * L);
      expect(relErr(r!.displacementAt({ member: "AB", x }, "y"), expected)).toBeLessThan(REL);
    }
    for (const x of [2.61, 4.4, 7.0]) {
      // Case 8, x > a: Δx = Pa(l − x)(2lx − x² − a²)/6EIl.
      const expected = -(P * a * (L - x) * (2 * L * x - x * x - a * a)) / (6 * EI * L);
      expect(relErr(r!.displacementAt({ member: "AB", x }, "y"), expected)).toBeLessThan(REL);
    }
    // Case 8: R1 = Pb/l, R2 = Pa/l; at the load V is the value just before it.
    expect(relErr(r!.reactions.get("A")!.Fy, (P * b) / L)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("B")!.Fy, (P * a) / L)).toBeLessThan(REL);
    expect(relErr(r!.stations("AB", [a])[0]!.V, (P * b) / L)).toBeLessThan(REL);
  });

  it("load increasing uniformly to one end (case 2)", () => {
    const wMax = 22e3;
    const W = (wMax * L) / 2;
    const [r] = solveStiffness(simpleBeam(), [
      [{ type: "line", case: "D", member: "AB", a: 0, b: L, wa: 0, wb: -wMax, dir: "global" }],
    ]);
    for (const x of [0.5, 2.2, 4.33, 6.9]) {
      // Case 2: Δx = Wx(3x⁴ − 10l²x² + 7l⁴)/180EIl², W the total load.
      const expected = -(W * x * (3 * x ** 4 - 10 * L * L * x * x + 7 * L ** 4)) / (180 * EI * L * L);
      expect(relErr(r!.displacementAt({ member: "AB", x }, "y"), expected)).toBeLessThan(REL);
    }
    // Case 2: R1 = W/3, R2 = 2W/3.
    expect(relErr(r!.reactions.get("A")!.Fy, W / 3)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("B")!.Fy, (2 * W) / 3)).toBeLessThan(REL);
  });

  it("partial trapezoidal load equals case 8 integrated over the loaded length", () => {
    // Superposition of the case 8 point-load shape over the load: for a fixed x the case 8
    // expression is a cubic in the load position on either side of x, times a linear
    // intensity, so 5-point Gauss–Legendre on each side is exact (degree ≤ 9).
    const a0 = 1.2;
    const b0 = 5.3;
    const wa = -9e3;
    const wb = -27e3;
    const [r] = solveStiffness(simpleBeam(), [[{ type: "line", case: "D", member: "AB", a: a0, b: b0, wa, wb, dir: "global" }]]);
    const gx = [-0.906179845938664, -0.5384693101056831, 0, 0.5384693101056831, 0.906179845938664];
    const gw = [0.2369268850561891, 0.4786286704993665, 0.5688888888888889, 0.4786286704993665, 0.2369268850561891];
    const case8 = (x: number, a: number): number => {
      const b = L - a;
      return x <= a ? (b * x * (L * L - b * b - x * x)) / (6 * EI * L) : (a * (L - x) * (2 * L * x - x * x - a * a)) / (6 * EI * L);
    };
    const integrate = (x: number, lo: number, hi: number): number => {
      if (hi <= lo) return 0;
      let s = 0;
      for (let k = 0; k < 5; k++) {
        const xi = (lo + hi) / 2 + ((hi - lo) / 2) * gx[k]!;
        const q = wa + ((wb - wa) * (xi - a0)) / (b0 - a0);
        s += ((hi - lo) / 2) * gw[k]! * q * case8(x, xi);
      }
      return s;
    };
    for (const x of [0.6, 1.2, 2.9, 4.05, 5.3, 6.8]) {
      const expected = integrate(x, a0, Math.min(x, b0)) + integrate(x, Math.max(x, a0), b0);
      expect(relErr(r!.displacementAt({ member: "AB", x }, "y"), expected)).toBeLessThan(REL);
    }
  });

  it("couple at an interior point, Macaulay's method worked by hand", () => {
    // Simple beam, couple C (counter-clockwise) at a: R_A = C/l up, R_B = −C/l;
    // EI·v = Cx³/6l − C⟨x − a⟩²/2 + Cx[(l − a)²/2l − l/6] (v up).
    const C = 48e3; // N·m
    const a = 4.9;
    const [r] = solveStiffness(simpleBeam(), [[{ type: "moment", case: "D", member: "AB", a, M: C }]]);
    for (const x of [1.1, 3.3, 4.9, 6.4]) {
      const mac = x > a ? (x - a) ** 2 : 0;
      const expected = ((C * x ** 3) / (6 * L) - (C * mac) / 2 + C * x * ((L - a) ** 2 / (2 * L) - L / 6)) / EI;
      expect(relErr(r!.displacementAt({ member: "AB", x }, "y"), expected, Math.abs(C * L * L) / EI)).toBeLessThan(REL);
    }
    expect(relErr(r!.reactions.get("A")!.Fy, C / L)).toBeLessThan(REL);
    // Sagging moment just before and after the couple: Ca/l and Ca/l − C.
    const [before, after] = r!.stations("AB", [a, a + 1e-9]);
    expect(relErr(before!.M, (C * a) / L)).toBeLessThan(REL);
    expect(relErr(after!.M, (C * a) / L - C, C)).toBeLessThan(1e-8);
  });
});

describe("cantilever and fixed beams, AISC Manual 15th ed. Table 3-23", () => {
  it("cantilever end load: Pl³/3EI, slope Pl²/2EI and the shape (case 22)", () => {
    const [r] = solveStiffness(cantilever(), [[{ type: "node", case: "D", node: "B", Fx: 0, Fy: -P, M: 0 }]]);
    expect(relErr(r!.nodes.get("B")!.y, (-P * L ** 3) / (3 * EI))).toBeLessThan(REL);
    // Slope at the free end of an end-loaded cantilever: Pl²/2EI (standard result, from memory).
    expect(relErr(r!.nodes.get("B")!.rz, (-P * L * L) / (2 * EI))).toBeLessThan(REL);
    for (const xFromFree of [0.9, 3.7, 6.2]) {
      // Case 22: Δx = P(2l³ − 3l²x + x³)/6EI, x from the free end.
      const expected = -(P * (2 * L ** 3 - 3 * L * L * xFromFree + xFromFree ** 3)) / (6 * EI);
      expect(relErr(r!.displacementAt({ member: "AB", x: L - xFromFree }, "y"), expected)).toBeLessThan(REL);
    }
    // Case 22: Mmax = Pl at the fixed end (hogging); reaction moment counter-clockwise +Pl.
    expect(relErr(r!.reactions.get("A")!.M, P * L)).toBeLessThan(REL);
    expect(relErr(r!.stations("AB", [0])[0]!.M, -P * L)).toBeLessThan(REL);
  });

  it("cantilever uniform load: wl⁴/8EI and the shape (case 19)", () => {
    const [r] = solveStiffness(cantilever(), [[udl("AB", L)]]);
    expect(relErr(r!.nodes.get("B")!.y, (-w * L ** 4) / (8 * EI))).toBeLessThan(REL);
    for (const xFromFree of [1.4, 4.0, 7.1]) {
      // Case 19: Δx = w(x⁴ − 4l³x + 3l⁴)/24EI, x from the free end.
      const expected = -(w * (xFromFree ** 4 - 4 * L ** 3 * xFromFree + 3 * L ** 4)) / (24 * EI);
      expect(relErr(r!.displacementAt({ member: "AB", x: L - xFromFree }, "y"), expected)).toBeLessThan(REL);
    }
    // Case 19: Mmax = wl²/2 at the fixed end.
    expect(relErr(r!.reactions.get("A")!.M, (w * L * L) / 2)).toBeLessThan(REL);
  });

  it("fixed at both ends, uniform load: wl⁴/384EI, end moments wl²/12 (case 15)", () => {
    const m = buildModel("beam", { A: [0, 0], B: [L, 0] }, { AB: { ends: ["A", "B"], E, I, A } }, { A: "fixed", B: "fixed" });
    const [r] = solveStiffness(m, [[udl("AB", L)]]);
    expect(relErr(r!.displacementAt({ member: "AB", x: L / 2 }, "y"), (-w * L ** 4) / (384 * EI))).toBeLessThan(REL);
    for (const x of [0.7, 2.5, 5.9]) {
      // Case 15: Δx = wx²(l − x)²/24EI.
      expect(relErr(r!.displacementAt({ member: "AB", x }, "y"), -(w * x * x * (L - x) ** 2) / (24 * EI))).toBeLessThan(REL);
    }
    expect(relErr(r!.reactions.get("A")!.M, (w * L * L) / 12)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("B")!.M, (-w * L * L) / 12)).toBeLessThan(REL);
    // Case 15: M at centre = wl²/24 (sagging).
    expect(relErr(r!.stations("AB", [L / 2])[0]!.M, (w * L * L) / 24)).toBeLessThan(REL);
  });

  it("propped cantilever, uniform load: R = 3wl/8, Δmax ≈ wl⁴/184.6EI at 0.4215 l (case 12)", () => {
    // Pin end first so that x runs from the simply supported end as in the table.
    const m = buildModel("beam", { A: [0, 0], B: [L, 0] }, { AB: { ends: ["A", "B"], E, I, A } }, { A: "pin", B: "fixed" });
    const [r] = solveStiffness(m, [[udl("AB", L)]]);
    expect(relErr(r!.reactions.get("A")!.Fy, (3 * w * L) / 8)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("B")!.Fy, (5 * w * L) / 8)).toBeLessThan(REL);
    expect(relErr(r!.reactions.get("B")!.M, (-w * L * L) / 8)).toBeLessThan(REL);
    for (const x of [1.0, 3.16, 6.0]) {
      // Case 12: Δx = wx(l³ − 3lx² + 2x³)/48EI, x from the pinned end.
      expect(relErr(r!.displacementAt({ member: "AB", x }, "y"), -(w * x * (L ** 3 - 3 * L * x * x + 2 * x ** 3)) / (48 * EI))).toBeLessThan(REL);
    }
    // The tabulated coefficient is rounded: 1/184.6 to about 1e-4.
    const dMax = r!.displacementAt({ member: "AB", x: 0.4215 * L }, "y");
    expect(relErr(dMax, (-w * L ** 4) / (184.6 * EI))).toBeLessThan(2e-4);
  });
});

describe("continuous beams, AISC Manual 15th ed. Table 3-23", () => {
  it("two equal spans, uniform load: centre reaction 1.25 wl, ends 0.375 wl (case 29)", () => {
    for (const withArea of [true, false]) {
      const m = buildModel(
        "beam",
        { A: [0, 0], B: [L, 0], C: [2 * L, 0] },
        { AB: { ends: ["A", "B"], E, I, A: withArea ? A : undefined }, BC: { ends: ["B", "C"], E, I, A: withArea ? A : undefined } },
        { A: "pin", B: "roller", C: "roller" },
      );
      const [r] = solveStiffness(m, [[udl("AB", L), udl("BC", L)]]);
      expect(relErr(r!.reactions.get("B")!.Fy, 1.25 * w * L)).toBeLessThan(REL);
      expect(relErr(r!.reactions.get("A")!.Fy, 0.375 * w * L)).toBeLessThan(REL);
      expect(relErr(r!.reactions.get("C")!.Fy, 0.375 * w * L)).toBeLessThan(REL);
      // Case 29: Mmax = wl²/8 over the centre support (hogging).
      expect(relErr(r!.stations("AB", [L])[0]!.M, (-w * L * L) / 8)).toBeLessThan(REL);
    }
  });

  it("three equal spans, uniform load: reactions 0.4, 1.1, 1.1, 0.4 wl", () => {
    const m = buildModel(
      "beam",
      { A: [0, 0], B: [L, 0], C: [2 * L, 0], D: [3 * L, 0] },
      { AB: { ends: ["A", "B"], E, I }, BC: { ends: ["B", "C"], E, I }, CD: { ends: ["C", "D"], E, I } },
      { A: "pin", B: "roller", C: "roller", D: "roller" },
    );
    const [r] = solveStiffness(m, [[udl("AB", L), udl("BC", L), udl("CD", L)]]);
    const expected = { A: 0.4, B: 1.1, C: 1.1, D: 0.4 };
    for (const [node, k] of Object.entries(expected)) {
      expect(relErr(r!.reactions.get(node)!.Fy, k * w * L)).toBeLessThan(REL);
    }
    // Design Aid No. 6 / Table 3-23 three-span coefficient 0.0069 wl⁴/EI at 0.446 l (rounded).
    expect(relErr(r!.displacementAt({ member: "AB", x: 0.446 * L }, "y"), (-0.0069 * w * L ** 4) / EI)).toBeLessThan(5e-3);
  });

  it("several load sets share one factorization and stay independent", () => {
    const [rw, rp, rBoth] = solveStiffness(simpleBeam(), [[udl("AB", L)], [point("AB", L / 2)], [udl("AB", L), point("AB", L / 2)]]);
    const at = { member: "AB", x: 2.2 };
    // Linearity: the combined set is the sum of the two.
    expect(relErr(rBoth!.displacementAt(at, "y"), rw!.displacementAt(at, "y") + rp!.displacementAt(at, "y"))).toBeLessThan(1e-13);
    expect(relErr(rp!.displacementAt({ member: "AB", x: L / 2 }, "y"), (-P * L ** 3) / (48 * EI))).toBeLessThan(REL);
  });
});
