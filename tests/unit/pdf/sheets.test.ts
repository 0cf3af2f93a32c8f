import { describe, expect, it } from "vitest";
import { identifySheet, pageTextLines, parseSheetNumber, type PageText, type PositionedText } from "@/lib/pdf/sheets";

// ARCH D landscape, 36 × 24 in at 72 pt/in; y measured down from the top edge.
const W = 36 * 72;
const H = 24 * 72;

function item(str: string, x: number, y: number, fontSize = 10, width = str.length * fontSize * 0.55): PositionedText {
  return { str, x, y, fontSize, width };
}

function page(items: PositionedText[], n = 1, size: [number, number] = [W, H]): PageText {
  return { page: n, width: size[0], height: size[1], items };
}

const notes = [
  item("GENERAL NOTES", 80, 90, 14),
  item("1. ALL WORK SHALL CONFORM TO THE 2021 IBC AS ADOPTED BY THE CITY OF LARKSPUR FALLS.", 80, 115),
  item("2. FLOOR LIVE LOAD 40 PSF (IBC TABLE 1607.1), ROOF LIVE LOAD 20 PSF.", 80, 131),
  item("3. FRAMING LUMBER DF-L NO.2 UNLESS NOTED. SEE 3/S-501.", 80, 147),
];

describe("parseSheetNumber: US National CAD Standard sheet identifiers (common practice, no source)", () => {
  it.each(["S-201", "A1.01", "S2.1", "G-001", "FP-101", "A-101A", "S201", "M-3"])("reads %s", (s) => {
    expect(parseSheetNumber(`  ${s} `)).toBe(s);
  });

  it("turns a typographic hyphen into '-' so revisions of one sheet compare equal", () => {
    expect(parseSheetNumber("S\u2011201")).toBe("S-201");
    expect(parseSheetNumber("S\u2013201")).toBe("S-201");
  });

  it.each([
    ["lumber size", "2x12"],
    ["grade", "No.2"],
    ["steel shape", "W12x26"],
    ["project number", "24-117"],
    ["date", "2025-03-14"],
    ["caption", "SHEET"],
    ["no digits", "S-"],
    ["K is not a discipline letter", "K-101"],
    ["three letters", "HDR-1"],
    ["too many digits", "S-20101"],
    ["lower case", "s-201"],
  ])("ignores a %s (%s)", (_label, s) => {
    expect(parseSheetNumber(s)).toBeNull();
  });
});

describe("identifySheet", () => {
  it("prefers the large number in the title-block corner over callouts and beam tags", () => {
    const p = page([
      ...notes,
      item("FB-3", 600, 1010),
      item("B-1", 1000, 1310),
      item("S-501", 1398, 877, 8),
      item("CORBEL & FINCH STRUCTURAL", 2070, 1520, 10),
      item("RIVERBEND COMMONS, 1250 Alder Street, Larkspur Falls", 2070, 1534, 8),
      item("SECOND FLOOR", 2070, 1600, 18),
      item("FRAMING PLAN", 2070, 1622, 18),
      item("S-201", 2430, 1642, 44),
    ]);
    expect(identifySheet(p)).toEqual({ page: 1, sheetNumber: "S-201", title: "SECOND FLOOR FRAMING PLAN" });
  });

  it("reads captioned fields in a right-edge strip", () => {
    const x = 2318;
    const p = page([
      ...notes,
      item("CORBEL & FINCH STRUCTURAL", x, 76, 14),
      item("PROJECT", x, 164, 7),
      item("RIVERBEND COMMONS", x, 182, 12),
      item("SCALE", x, 300, 7),
      item("AS NOTED", x, 312, 10),
      item("SHEET TITLE", x, 1478, 7),
      item("FOUNDATION PLAN", x, 1498, 16),
      item("SHEET", x, 1598, 7),
      item("S-101", x, 1648, 40),
    ]);
    expect(identifySheet(p)).toEqual({ page: 1, sheetNumber: "S-101", title: "FOUNDATION PLAN" });
  });

  it("joins a wrapped title, including a short last line, left-aligned or centred", () => {
    const left = page([
      item("SHEET TITLE", 2318, 1478, 7),
      item("SHEAR WALL ELEVATIONS", 2318, 1498, 16),
      item("2", 2318, 1518, 16),
      item("SHEET", 2318, 1598, 7),
      item("S-402", 2318, 1648, 40),
    ]);
    expect(identifySheet(left).title).toBe("SHEAR WALL ELEVATIONS 2");
    const centred = page([
      item("LEVEL 2", 2180, 1580, 18, 70),
      item("FLOOR FRAMING PLAN", 2130, 1602, 18, 170),
      item("S-202", 2430, 1642, 44),
    ]);
    expect(identifySheet(centred)).toEqual({ page: 1, sheetNumber: "S-202", title: "LEVEL 2 FLOOR FRAMING PLAN" });
  });

  it("reads 'SHEET NO. S-301' and 'SHEET TITLE: ...' written as one string", () => {
    const p = page([...notes, item("SHEET TITLE: ROOF FRAMING PLAN", 2100, 1600, 9), item("SHEET NO. S-301", 2100, 1630, 9)]);
    expect(identifySheet(p)).toEqual({ page: 1, sheetNumber: "S-301", title: "ROOF FRAMING PLAN" });
  });

  it("finds a number captioned SHEET even outside the corner and at body size", () => {
    const p = page([...notes, item("SHEET", 100, 1500, 7), item("A1.01", 100, 1520, 10)]);
    expect(identifySheet(p).sheetNumber).toBe("A1.01");
  });

  it("scales with the page: a half-size 17 × 11 in print of the same corner block", () => {
    const p = page(
      [
        item("GENERAL NOTES", 40, 45, 7),
        item("1. ALL WORK SHALL CONFORM TO THE 2021 IBC.", 40, 58, 5),
        item("SEE 3/S-501", 300, 400, 5),
        item("CORBEL & FINCH STRUCTURAL", 935, 700, 5),
        item("SHEAR WALL ELEVATIONS", 935, 745, 9),
        item("S-0.1", 1115, 755, 22),
      ],
      1,
      [17 * 72, 11 * 72],
    );
    expect(identifySheet(p)).toEqual({ page: 1, sheetNumber: "S-0.1", title: "SHEAR WALL ELEVATIONS" });
  });

  it("does not take a member mark on a calculation page for a sheet number", () => {
    const p = page(
      [
        item("CORBEL & FINCH STRUCTURAL", 54, 42, 9),
        item("FB-3", 54, 96, 10),
        item("W = 160 plf  L = 16'-0\"  2x12 DF-L No.2", 90, 96, 10),
        item("FB-4", 54, 110, 10),
        item("W = 210 plf  L = 12'-0\"  4x10 DF-L No.2", 90, 110, 10),
      ],
      7,
      [612, 792],
    );
    expect(identifySheet(p)).toEqual({ page: 7, sheetNumber: null, title: "Page 7" });
  });

  it("falls back to null and 'Page n' on a page without a title block", () => {
    expect(identifySheet(page(notes, 12))).toEqual({ page: 12, sheetNumber: null, title: "Page 12" });
    expect(identifySheet(page([], 3))).toEqual({ page: 3, sheetNumber: null, title: "Page 3" });
  });

  it("does not return a field value (scale, date) as the title", () => {
    const p = page([item("SCALE: 1/4\" = 1'-0\"", 2200, 1580, 9), item("2025-03-14", 2200, 1600, 9), item("S-401", 2400, 1640, 40)]);
    expect(identifySheet(p)).toEqual({ page: 1, sheetNumber: "S-401", title: "Page 1" });
  });
});

describe("pageTextLines", () => {
  it("orders lines top to bottom and joins runs by the gap between them", () => {
    const lines = pageTextLines(
      page(
        [
          item("second", 72, 120),
          item("Δ", 72, 100, 10, 6.1),
          item("_L = 0.42 in", 78.1, 100, 10, 55),
          item("< L/360", 136, 100, 10, 30),
          item("Calc page 3 of 9", 480, 100, 10, 70),
        ],
        1,
        [612, 792],
      ),
    );
    expect(lines).toEqual(["Δ_L = 0.42 in < L/360\tCalc page 3 of 9", "second"]);
  });
});
