import { describe, it } from "vitest";

import type { SolveResult } from "@/lib/solver";
import { beamModel, expectClose, expectCrossCheckAgrees, findValue, member, reaction, run } from "@/tests/unit/solver/helpers";

// Beam diagrams and formulas of the AISC Steel Construction Manual, 15th ed., Table 3-23
// (case numbers from memory; the same formulas are in the free American Wood Council
// Design Aid No. 6, "Beam Design Formulas with Shear and Moment Diagrams"). SI throughout:
// E = 200 GPa, I = 1.2e-4 m⁴, so EI = 2.4e7 N·m²; w = 12 kN/m, P = 30 kN, l = 6 m.
const E = 200e9;
const I = 1.2e-4;
const EI = E * I;
const w = 12e3;
const P = 30e3;
const l = 6;

interface Expectation {
  what: string;
  actual: (r: SolveResult) => number;
  expected: number;
  /** relative tolerance: 1e-9 where the handbook formula is exact, wider where it is rounded */
  tol?: number;
}

interface Case {
  name: string;
  model: Record<string, unknown>;
  expect: Expectation[];
}

const down = (v: number): number => -v;
const udl = (member: string, value = w): Record<string, unknown> => ({ member, w: `${-value} N/m` });

// Propped cantilever / two equal spans under full UDL: y = w·x(l³ − 3l·x² + 2x³)/48EI from the
// pin (Table 3-23 case 12); dy/dx = 0 at 8ξ³ − 9ξ² + 1 = 0, ξ = (1 + √33)/16 = 0.42154.
const xiProp = (1 + Math.sqrt(33)) / 16;
const propMax = (w * (xiProp * l) * (l ** 3 - 3 * l * (xiProp * l) ** 2 + 2 * (xiProp * l) ** 3)) / (48 * EI);

const a8 = 4;
const b8 = l - a8;

const cases: Case[] = [
  {
    name: "case 1, simple span, uniform load: Δmax = 5wl⁴/384EI at mid-span, θ = wl³/24EI, R = wl/2",
    model: beamModel({ xs: [0, l], E, I, supports: { N0: "pin", N1: "roller" }, loads: [udl("M1")], find: [{ node: "mid:M1", dof: "y" }, { node: "N0", dof: "rz" }] }),
    expect: [
      { what: "Δ at mid-span", actual: (r) => findValue(r, "mid:M1"), expected: down((5 * w * l ** 4) / (384 * EI)) },
      { what: "largest deflection", actual: (r) => member(r, "M1").extreme.deflection_m, expected: down((5 * w * l ** 4) / (384 * EI)) },
      { what: "where (x/l)", actual: (r) => member(r, "M1").extreme.x_over_length, expected: 0.5 },
      // end rotation wl³/24EI: standard result, from memory; clockwise at the left end
      { what: "θ at the left end", actual: (r) => findValue(r, "N0", "rz"), expected: down((w * l ** 3) / (24 * EI)) },
      { what: "left reaction", actual: (r) => reaction(r, "N0").Fy, expected: (w * l) / 2 },
    ],
  },
  {
    name: "case 2, simple span, load increasing uniformly to one end: Δx = Wx(3x⁴ − 10l²x² + 7l⁴)/180EIl², Δmax at x = l·√(1 − √(8/15))",
    model: beamModel({ xs: [0, l], E, I, supports: { N0: "pin", N1: "roller" }, loads: [{ member: "M1", w: ["0 N/m", `${-2 * w} N/m`] }], find: [{ node: "at:M1:2 m", dof: "y" }] }),
    expect: [
      // W = total load = (2w)·l/2 = w·l
      { what: "Δ at x = 2 m", actual: (r) => findValue(r, "at:M1:2 m"), expected: down((w * l * 2 * (3 * 2 ** 4 - 10 * l ** 2 * 2 ** 2 + 7 * l ** 4)) / (180 * EI * l ** 2)) },
      {
        what: "largest deflection",
        actual: (r) => member(r, "M1").extreme.deflection_m,
        expected: ((xm: number) => down((w * l * xm * (3 * xm ** 4 - 10 * l ** 2 * xm ** 2 + 7 * l ** 4)) / (180 * EI * l ** 2)))(l * Math.sqrt(1 - Math.sqrt(8 / 15))),
      },
      { what: "where (x/l)", actual: (r) => member(r, "M1").extreme.x_over_length, expected: Math.sqrt(1 - Math.sqrt(8 / 15)) },
      { what: "where (handbook 0.5193 l)", actual: (r) => member(r, "M1").extreme.x_over_length, expected: 0.5193, tol: 1e-4 },
      { what: "R at the light end W/3", actual: (r) => reaction(r, "N0").Fy, expected: (w * l) / 3 },
    ],
  },
  {
    name: "case 18, cantilever, load increasing uniformly to the fixed end: Δ tip = Wl³/15EI",
    model: beamModel({ xs: [0, l], E, I, supports: { N0: "fixed" }, loads: [{ member: "M1", w: [`${-2 * w} N/m`, "0 N/m"] }], find: [{ node: "N1", dof: "y" }] }),
    expect: [{ what: "Δ at the tip", actual: (r) => findValue(r, "N1"), expected: down((w * l * l ** 3) / (15 * EI)) }],
  },
  {
    name: "case 7, simple span, centre point load: Δmax = Pl³/48EI",
    model: beamModel({ xs: [0, l], E, I, supports: { N0: "pin", N1: "roller" }, loads: [{ member: "M1", P: `${-P} N`, at: `${l / 2} m` }], find: [{ node: "mid:M1", dof: "y" }] }),
    expect: [{ what: "Δ at the load", actual: (r) => findValue(r, "mid:M1"), expected: down((P * l ** 3) / (48 * EI)) }],
  },
  {
    name: "case 8, simple span, point load at a: Δ at load = Pa²b²/3EIl; Δmax = Pab(a+2b)√(3a(a+2b))/27EIl at x = √(a(a+2b)/3)",
    model: beamModel({ xs: [0, l], E, I, supports: { N0: "pin", N1: "roller" }, loads: [{ member: "M1", P: `${-P} N`, at: `${a8} m` }], find: [{ node: `at:M1:${a8} m`, dof: "y" }] }),
    expect: [
      { what: "Δ at the load", actual: (r) => findValue(r, `at:M1:${a8} m`), expected: down((P * a8 ** 2 * b8 ** 2) / (3 * EI * l)) },
      // a > b here, so the maximum lies between the left support and the load, x = √(a(a + 2b)/3) from that support
      {
        what: "largest deflection",
        actual: (r) => member(r, "M1").extreme.deflection_m,
        expected: down((P * a8 * b8 * (a8 + 2 * b8) * Math.sqrt(3 * a8 * (a8 + 2 * b8))) / (27 * EI * l)),
      },
      { what: "where (x from the left support, m)", actual: (r) => member(r, "M1").extreme.x_m, expected: Math.sqrt((a8 * (a8 + 2 * b8)) / 3) },
    ],
  },
  {
    name: "case 9, simple span, two equal loads a from each end: Δmax = Pa(3l² − 4a²)/24EI",
    model: beamModel({
      xs: [0, l],
      E,
      I,
      supports: { N0: "pin", N1: "roller" },
      loads: [
        { member: "M1", P: `${-P} N`, at: "1.5 m" },
        { member: "M1", P: `${-P} N`, at: "4.5 m" },
      ],
      find: [{ node: "mid:M1", dof: "y" }],
    }),
    expect: [{ what: "Δ at mid-span", actual: (r) => findValue(r, "mid:M1"), expected: down((P * 1.5 * (3 * l ** 2 - 4 * 1.5 ** 2)) / (24 * EI)) }],
  },
  {
    name: "case 19, cantilever, uniform load: Δ tip = wl⁴/8EI",
    model: beamModel({ xs: [0, l], E, I, supports: { N0: "fixed" }, loads: [udl("M1")], find: [{ node: "N1", dof: "y" }] }),
    expect: [
      { what: "Δ at the tip", actual: (r) => findValue(r, "N1"), expected: down((w * l ** 4) / (8 * EI)) },
      { what: "fixed-end moment wl²/2", actual: (r) => reaction(r, "N0").M, expected: (w * l ** 2) / 2 },
    ],
  },
  {
    name: "case 21, cantilever, load at the free end: Δ tip = Pl³/3EI, θ tip = Pl²/2EI",
    model: beamModel({ xs: [0, l], E, I, supports: { N0: "fixed" }, loads: [{ node: "N1", Fy: `${-P} N` }], find: [{ node: "N1", dof: "y" }, { node: "N1", dof: "rz" }] }),
    expect: [
      { what: "Δ at the tip", actual: (r) => findValue(r, "N1"), expected: down((P * l ** 3) / (3 * EI)) },
      { what: "θ at the tip", actual: (r) => findValue(r, "N1", "rz"), expected: down((P * l ** 2) / (2 * EI)) },
    ],
  },
  {
    name: "case 15, fixed at both ends, uniform load: Δmax = wl⁴/384EI, end moment wl²/12",
    model: beamModel({ xs: [0, l], E, I, supports: { N0: "fixed", N1: "fixed" }, loads: [udl("M1")], find: [{ node: "mid:M1", dof: "y" }] }),
    expect: [
      { what: "Δ at mid-span", actual: (r) => findValue(r, "mid:M1"), expected: down((w * l ** 4) / (384 * EI)) },
      { what: "end moment", actual: (r) => reaction(r, "N0").M, expected: (w * l ** 2) / 12 },
    ],
  },
  {
    name: "case 16, fixed at both ends, centre point load: Δmax = Pl³/192EI, end moment Pl/8",
    model: beamModel({ xs: [0, l], E, I, supports: { N0: "fixed", N1: "fixed" }, loads: [{ member: "M1", P: `${-P} N`, at: `${l / 2} m` }], find: [{ node: "mid:M1", dof: "y" }] }),
    expect: [
      { what: "Δ at mid-span", actual: (r) => findValue(r, "mid:M1"), expected: down((P * l ** 3) / (192 * EI)) },
      { what: "end moment", actual: (r) => reaction(r, "N1").M, expected: -(P * l) / 8 },
    ],
  },
  {
    name: "case 12, fixed at one end, pinned at the other, uniform load: Δmax = wl⁴/185EI at 0.4215 l from the pin (exactly 1/184.63 at (1 + √33)/16)",
    model: beamModel({ xs: [0, l], E, I, supports: { N0: "pin", N1: "fixed" }, loads: [udl("M1")] }),
    expect: [
      { what: "largest deflection (exact)", actual: (r) => member(r, "M1").extreme.deflection_m, expected: down(propMax) },
      { what: "where (exact, x/l)", actual: (r) => member(r, "M1").extreme.x_over_length, expected: xiProp },
      // the handbook's rounded coefficient and position
      { what: "largest deflection (handbook wl⁴/185EI)", actual: (r) => member(r, "M1").extreme.deflection_m, expected: down((w * l ** 4) / (185 * EI)), tol: 2.5e-3 },
      { what: "where (handbook 0.4215 l)", actual: (r) => member(r, "M1").extreme.x_over_length, expected: 0.4215, tol: 1e-4 },
      { what: "pin reaction 3wl/8", actual: (r) => reaction(r, "N0").Fy, expected: (3 * w * l) / 8 },
      { what: "fixed-end moment wl²/8 (hogging)", actual: (r) => reaction(r, "N1").M, expected: -(w * l ** 2) / 8 },
    ],
  },
  {
    name: "case 25, beam overhanging one support, uniform load on the overhang: Δ tip = wa³(4l + 3a)/24EI",
    model: beamModel({ xs: [0, l, l + 2], E, I, supports: { N0: "pin", N1: "roller" }, loads: [udl("M2")], find: [{ node: "N2", dof: "y" }] }),
    expect: [{ what: "Δ at the tip", actual: (r) => findValue(r, "N2"), expected: down((w * 2 ** 3 * (4 * l + 3 * 2)) / (24 * EI)) }],
  },
  {
    name: "case 32, continuous beam, two equal spans, uniform load on both: R = 3wl/8, 10wl/8, 3wl/8; Δmax = wl⁴/185EI at 0.4215 l",
    model: beamModel({ xs: [0, l, 2 * l], E, I, supports: { N0: "pin", N1: "roller", N2: "roller" }, loads: [udl("M1"), udl("M2")] }),
    expect: [
      { what: "end reaction", actual: (r) => reaction(r, "N0").Fy, expected: (3 * w * l) / 8 },
      { what: "centre reaction", actual: (r) => reaction(r, "N1").Fy, expected: (10 * w * l) / 8 },
      { what: "largest deflection (exact)", actual: (r) => member(r, "M1").extreme.deflection_m, expected: down(propMax) },
      { what: "where (exact, x/l)", actual: (r) => member(r, "M1").extreme.x_over_length, expected: xiProp },
    ],
  },
  {
    name: "case 29, continuous beam, two equal spans, uniform load on one span: R = 7wl/16, 10wl/16, −wl/16; Δmax ≈ 0.0092 wl⁴/EI at ≈ 0.472 l",
    model: beamModel({ xs: [0, l, 2 * l], E, I, supports: { N0: "pin", N1: "roller", N2: "roller" }, loads: [udl("M1")] }),
    expect: [
      { what: "R1", actual: (r) => reaction(r, "N0").Fy, expected: (7 * w * l) / 16 },
      { what: "R2", actual: (r) => reaction(r, "N1").Fy, expected: (10 * w * l) / 16 },
      { what: "R3", actual: (r) => reaction(r, "N2").Fy, expected: -(w * l) / 16 },
      // coefficients printed to two significant figures and three decimals
      { what: "largest deflection (rounded 0.0092)", actual: (r) => member(r, "M1").extreme.deflection_m, expected: down((0.0092 * w * l ** 4) / EI), tol: 6e-3 },
      { what: "where (rounded 0.472 l)", actual: (r) => member(r, "M1").extreme.x_over_length, expected: 0.472, tol: 1.1e-3 },
    ],
  },
  {
    name: "continuous beam, three equal spans, uniform load (AISC Manual continuous-beam coefficients, from memory): R = 0.4, 1.1, 1.1, 0.4 wl; Δmax ≈ 0.0069 wl⁴/EI at ≈ 0.446 l",
    model: beamModel({ xs: [0, l, 2 * l, 3 * l], E, I, supports: { N0: "pin", N1: "roller", N2: "roller", N3: "roller" }, loads: [udl("M1"), udl("M2"), udl("M3")] }),
    expect: [
      { what: "end reaction 0.4 wl", actual: (r) => reaction(r, "N0").Fy, expected: 0.4 * w * l },
      { what: "interior reaction 1.1 wl", actual: (r) => reaction(r, "N1").Fy, expected: 1.1 * w * l },
      { what: "interior reaction 1.1 wl", actual: (r) => reaction(r, "N2").Fy, expected: 1.1 * w * l },
      { what: "end reaction 0.4 wl", actual: (r) => reaction(r, "N3").Fy, expected: 0.4 * w * l },
      { what: "largest deflection (rounded 0.0069)", actual: (r) => member(r, "M1").extreme.deflection_m, expected: down((0.0069 * w * l ** 4) / EI), tol: 8e-3 },
      { what: "where (rounded 0.446 l)", actual: (r) => member(r, "M1").extreme.x_over_length, expected: 0.446, tol: 1.2e-3 },
    ],
  },
];

describe("AISC Manual 15th ed. Table 3-23 (= AWC Design Aid No. 6)", () => {
  for (const c of cases) {
    it(c.name, () => {
      const r = run(c.model);
      for (const e of c.expect) expectClose(e.actual(r), e.expected, e.tol ?? 1e-9, e.what);
      expectCrossCheckAgrees(r);
    });
  }
});
