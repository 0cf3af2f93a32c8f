import { describe, expect, it } from "vitest";
import { linesOf, scanCalcText, scanLine } from "@/lib/checks/suggestions";

// An invented calc package for the Larkspur Falls demo (Corbel & Finch Structural). The
// notation is the trade's, read by common practice (no source).
const CALC = [
  ["DESIGN CRITERIA", "Floor live load 40 psf (IBC Table 1607.1), dead 12 psf", "Roof snow 25 psf, roof dead 15 psf"],
  ["FB-3  Second floor beam", "Span L = 16'-0\"  trib 6'-0\"", "wD = 72 plf  wL = 240 plf", "Use 5-1/8 x 12 24F-1.8E glulam", "ΔL = 0.27 in < L/360 = 0.53 in  OK"],
  ["J-1  Floor joists 2x12 DF-L No.2 @ 16\" o.c.", "Span 15'-6\"", "ΔTL = 0.30 in < L/240"],
  ["B-7 W12x26, E = 29,000 ksi, Ix = 204 in^4", "P_L = 4 kips at midspan", "(2)2x10 header"],
];

const found = scanCalcText(CALC.map((lines, i) => ({ page: i + 1, lines })));
const on = (page: number) => found.filter((f) => f.page === page).map((f) => ({ kind: f.kind, mark: f.mark, value: f.value }));

describe("calc text → suggestions", () => {
  it("design criteria: area loads with the case named before them", () => {
    expect(on(1)).toEqual([
      { kind: "area-load", mark: null, value: { case: "L", q: 40, unit: "psf" } },
      { kind: "area-load", mark: null, value: { case: "D", q: 12, unit: "psf" } },
      { kind: "area-load", mark: null, value: { case: "S", q: 25, unit: "psf" } },
      { kind: "area-load", mark: null, value: { case: "D", q: 15, unit: "psf" } },
    ]);
  });

  it("a beam's page: span in feet-inches, tributary width, line loads by case, glulam size and class, the claim with its limit", () => {
    expect(on(2)).toEqual([
      { kind: "span", mark: "FB-3", value: { length: 16, unit: "ft" } },
      { kind: "trib", mark: "FB-3", value: { length: 6, unit: "ft" } },
      { kind: "line-load", mark: "FB-3", value: { case: "D", w: 72, unit: "plf" } },
      { kind: "line-load", mark: "FB-3", value: { case: "L", w: 240, unit: "plf" } },
      { kind: "section", mark: "FB-3", value: { source: "rect", b: 5.125, d: 12, unit: "in" } },
      { kind: "material", mark: "FB-3", value: { source: "glulam", stressClass: "24F-1.8E" } },
      { kind: "deflection", mark: "FB-3", value: { combo: "L", delta: 0.27, unit: "in", limit: 360 } },
    ]);
  });

  it("joists: sawn size, species and grade, spacing as tributary width, a total-load claim", () => {
    expect(on(3)).toEqual([
      { kind: "section", mark: "J-1", value: { source: "sawn", nominal: "2x12", plies: 1 } },
      { kind: "material", mark: "J-1", value: { source: "lumber", lumber: "dfl-2" } },
      { kind: "trib", mark: "J-1", value: { length: 16, unit: "in" } },
      { kind: "span", mark: "J-1", value: { length: 15.5, unit: "ft" } },
      { kind: "deflection", mark: "J-1", value: { combo: "D+L", delta: 0.3, unit: "in", limit: 240 } },
    ]);
  });

  it("steel: a W shape, E with thousands separators, Ix, a point load in kips; built-up plies", () => {
    expect(on(4)).toEqual([
      { kind: "section", mark: "B-7", value: { source: "wshape", designation: "W12x26" } },
      { kind: "E", mark: "B-7", value: { E: 29000, unit: "ksi" } },
      { kind: "I", mark: "B-7", value: { I: 204, unit: "in^4" } },
      { kind: "point-load", mark: "B-7", value: { case: "L", P: 4, unit: "kip" } },
      { kind: "section", mark: "B-7", value: { source: "sawn", nominal: "2x10", plies: 2 } },
    ]);
  });

  it("does not read a limit ratio or a bare L as a span", () => {
    expect(scanLine("L/360 = 0.53 in").filter((s) => s.suggestion.kind === "span")).toEqual([]);
    expect(scanLine("case L 16 ft").filter((s) => s.suggestion.kind === "span")).toEqual([]);
  });

  it("joins a page's text items into lines, left to right on one baseline", () => {
    const lines = linesOf({
      page: 1,
      width: 612,
      height: 792,
      items: [
        { str: "wL = 240 plf", x: 200, y: 100, width: 50, fontSize: 10 },
        { str: "wD = 72 plf", x: 54, y: 100.4, width: 50, fontSize: 10 },
        { str: "FB-3", x: 54, y: 86, width: 20, fontSize: 10 },
      ],
    });
    expect(lines).toEqual(["FB-3", "wD = 72 plf wL = 240 plf"]);
  });
});
