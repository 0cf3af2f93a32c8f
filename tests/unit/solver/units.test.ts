import { describe, expect, it } from "vitest";

import { displacementUnitFor, parseQuantity, type QuantityKind } from "@/lib/solver/units";
import { expectClose } from "@/tests/unit/solver/helpers";

// Exact factors follow from the defined inch (0.0254 m) and pound (NIST SP 811, 2008 ed.,
// Appendix B: lbf = 4.4482216152605 N; psi = 6.894757 E+03 Pa; psf = 4.788026 E+01 Pa;
// lbf/ft = 1.459390 E+01 N/m; lbf·ft = 1.355818 E+00 N·m).
const inch = 0.0254;
const ft = 0.3048;
const lbf = 4.4482216152605;

function si(text: string, kind: QuantityKind): number {
  const r = parseQuantity(text, kind);
  if (!r.ok) throw new Error(r.message);
  return r.si;
}

describe("units (mathjs with trade units registered)", () => {
  const exact: [string, QuantityKind, number][] = [
    ["16 ft", "length", 16 * ft],
    ["6 in", "length", 6 * inch],
    ["250 mm", "length", 0.25],
    ["1.5 kip", "force", 1500 * lbf],
    ["1 kipf", "force", 1000 * lbf],
    ["12 kN", "force", 12e3],
    ["1600 ksi", "modulus", (1.6e6 * lbf) / inch ** 2],
    ["29000 ksi", "modulus", (2.9e7 * lbf) / inch ** 2],
    ["200 GPa", "modulus", 200e9],
    ["1 psi", "modulus", lbf / inch ** 2],
    ["40 psf", "modulus", (40 * lbf) / ft ** 2],
    ["2 ksf", "modulus", (2000 * lbf) / ft ** 2],
    ["178 in^4", "inertia", 178 * inch ** 4],
    ["16.9 in^2", "area", 16.9 * inch ** 2],
    ["-40 lbf/ft", "lineLoad", (-40 * lbf) / ft],
    ["-40 plf", "lineLoad", (-40 * lbf) / ft],
    ["1.2 klf", "lineLoad", (1200 * lbf) / ft],
    ["0.45 kip/ft", "lineLoad", (450 * lbf) / ft],
    ["3 kN/m", "lineLoad", 3e3],
    ["5 kip*ft", "moment", 5000 * lbf * ft],
    ["5 kip ft", "moment", 5000 * lbf * ft],
    ["8 kN*m", "moment", 8e3],
    // a temperature change, not a reading: 40 degF of change is 40 × 5/9 K
    ["40 degF", "temperatureChange", (40 * 5) / 9],
    ["30 degC", "temperatureChange", 30],
    ["30 K", "temperatureChange", 30],
    ["6.5e-6 1/degF", "expansion", 6.5e-6 * 1.8],
    ["1.2e-5 1/K", "expansion", 1.2e-5],
  ];
  for (const [text, kind, value] of exact) {
    it(`${text} → ${value} SI`, () => expectClose(si(text, kind), value, 1e-13, text));
  }

  it("NIST SP 811 rounded factors agree", () => {
    expectClose(si("1 psi", "modulus"), 6.894757e3, 1e-7);
    expectClose(si("1 psf", "modulus"), 4.788026e1, 1e-7);
    expectClose(si("1 lbf/ft", "lineLoad"), 1.45939e1, 1e-6);
    expectClose(si("1 lbf*ft", "moment"), 1.355818, 1e-6);
  });

  it("refuses quantities of the wrong kind with the kind named", () => {
    expect(parseQuantity("178 in^3", "inertia")).toEqual({ ok: false, message: 'unit "in^3" is not a second moment of area' });
    expect(parseQuantity("3 kN", "lineLoad")).toEqual({ ok: false, message: 'unit "kN" is not a force per length' });
    expect(parseQuantity("40 degF", "expansion")).toEqual({ ok: false, message: 'unit "degF" is not a coefficient of thermal expansion (1/temperature)' });
    expect(parseQuantity("12", "length")).toEqual({ ok: false, message: '"12" has no unit' });
    expect(parseQuantity("ft", "length")).toEqual({ ok: false, message: '"ft" is not a number with a unit' });
  });

  it("echoes displacements in in for US lengths and mm for metric ones", () => {
    expect(displacementUnitFor("ft")).toBe("in");
    expect(displacementUnitFor("in")).toBe("in");
    expect(displacementUnitFor("m")).toBe("mm");
    expect(displacementUnitFor("mm")).toBe("mm");
  });
});
