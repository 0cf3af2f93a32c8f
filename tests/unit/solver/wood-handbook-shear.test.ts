import { describe, expect, it } from "vitest";

import { beamModel, expectClose, expectCrossCheckAgrees, findValue, run } from "@/tests/unit/solver/helpers";

// USDA Forest Products Laboratory, Wood Handbook (GTR-190, 2010), ch. 9, Table 9-1 (from memory):
// δ = k_b·W·L³/(E·I) + k_s·W·L/(A′·G), W the total load, A′ = 5A/6 for a rectangle.
// A 5-1/8 × 18 in glulam in SI: b = 0.130175 m, d = 0.4572 m; E = 12.4 GPa, G = E/16.
const b = 0.130175;
const d = 0.4572;
const A = b * d;
const I = (b * d ** 3) / 12;
const E = 12.4e9;
const G = E / 16;
const Av = (5 * A) / 6;
const L = 7.3;

const cases = [
  {
    name: "simple span, uniform load: k_b = 5/384, k_s = 1/8",
    kb: 5 / 384,
    ks: 1 / 8,
    W: 4.2e3 * L,
    model: (W: number) =>
      beamModel({ xs: [0, L], E, I, A, shear: { G, Av }, supports: { N0: "pin", N1: "roller" }, loads: [{ member: "M1", w: `${-W / L} N/m` }], find: [{ node: "mid:M1", dof: "y" }] }),
    label: "mid:M1",
  },
  {
    name: "simple span, mid-span point load: k_b = 1/48, k_s = 1/4",
    kb: 1 / 48,
    ks: 1 / 4,
    W: 25e3,
    model: (W: number) =>
      beamModel({ xs: [0, L], E, I, A, shear: { G, Av }, supports: { N0: "pin", N1: "roller" }, loads: [{ member: "M1", P: `${-W} N`, at: `${L / 2} m` }], find: [{ node: "mid:M1", dof: "y" }] }),
    label: "mid:M1",
  },
  {
    name: "cantilever, end load: k_b = 1/3, k_s = 1",
    kb: 1 / 3,
    ks: 1,
    W: 8e3,
    model: (W: number) => beamModel({ xs: [0, L], E, I, A, shear: { G, Av }, supports: { N0: "fixed" }, loads: [{ node: "N1", Fy: `${-W} N` }], find: [{ node: "N1", dof: "y" }] }),
    label: "N1",
  },
];

describe("USDA Wood Handbook Table 9-1: bending plus shear deflection", () => {
  for (const c of cases) {
    it(c.name, () => {
      const r = run(c.model(c.W));
      const bending = (c.kb * c.W * L ** 3) / (E * I);
      const shear = (c.ks * c.W * L) / (Av * G);
      expectClose(findValue(r, c.label), -(bending + shear), 1e-9, "total");
      const f = r.find.find((x) => x.label === c.label);
      const term = f?.terms.find((t) => t.member === "M1");
      expect(term).toBeDefined();
      expectClose(term?.bending ?? 0, -bending, 1e-9, "bending term ∫Mm/EI");
      expectClose(term?.shear ?? 0, -shear, 1e-9, "shear term ∫Vv/GAv");
      expect(r.energy.balanced).toBe(true);
      expectCrossCheckAgrees(r);
    });
  }
});
