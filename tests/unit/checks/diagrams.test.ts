import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { DeflectedShape, ForceDiagram, StructureDrawing } from "@/components/checks/diagrams";
import { modelGeometry } from "@/lib/checks/geometry";
import { solve } from "@/lib/solver";

// Two bars from (0, 0) and (6 m, 0) to an apex at (3 m, 4 m), 60 kN down at the apex:
// by joint equilibrium each bar carries N = P/(2 sin θ) = 60/(2 × 0.8) = 37.5 kN in compression.
const truss = {
  kind: "truss",
  nodes: { A: ["0 m", "0 m"], B: ["6 m", "0 m"], C: ["3 m", "4 m"] },
  members: { AC: { ends: ["A", "C"], E: "200 GPa", A: "2000 mm^2" }, BC: { ends: ["B", "C"], E: "200 GPa", A: "2000 mm^2" } },
  supports: { A: "pin", B: "pin" },
  loads: [{ node: "C", Fy: "-60 kN", case: "D" }],
  find: [{ node: "C", dof: "y" }],
};

// A 16 ft simple span under 240 plf: M = wl²/8 = 7.68 kip·ft at mid-span (AISC Table 3-23, case 1).
const beam = {
  kind: "beam",
  nodes: { A: ["0 ft", "0 ft"], B: ["16 ft", "0 ft"] },
  members: { AB: { ends: ["A", "B"], E: "1800 ksi", I: "738 in^4" } },
  supports: { A: "pin", B: "roller" },
  loads: [{ member: "AB", w: "-240 plf", case: "L" }],
};

describe("drawings of the structure and its results", () => {
  it("labels each truss bar with its axial force and T or C", () => {
    const r = solve(truss, { stations: 4 });
    const svg = renderToStaticMarkup(createElement(ForceDiagram, { g: modelGeometry(truss), result: r, q: "N" }));
    expect(svg).toContain("AC 37.5 kN C");
    expect(svg).toContain("BC 37.5 kN C");
  });

  it("draws the supports as named and the loads with their case", () => {
    const svg = renderToStaticMarkup(createElement(StructureDrawing, { g: modelGeometry(truss), us: false }));
    expect(svg).toContain("pin support at A");
    expect(svg).toContain("D 60 kN");
  });

  it("puts the peak moment on the moment diagram in both unit systems", () => {
    const r = solve(beam, { stations: 8 });
    const svg = renderToStaticMarkup(createElement(ForceDiagram, { g: modelGeometry(beam), result: r, q: "M" }));
    expect(svg).toContain("7.68 kip·ft (10.4 kN·m)");
    expect(svg).toContain("roller support at B");
  });

  it("states the exaggeration of the deflected shape", () => {
    const r = solve(beam, { stations: 8 });
    const svg = renderToStaticMarkup(createElement(DeflectedShape, { g: modelGeometry(beam), result: r }));
    expect(svg).toMatch(/displacements drawn × [\d,]+ \(not to scale\)/);
    // 5wl⁴/384EI = 0.2664 in (AISC Table 3-23, case 1)
    expect(svg).toContain("Δmax 0.266 in (6.77 mm)");
  });
});
