import { describe, expect, it } from "vitest";
import { buildSheetSets, cycleLabel, normalizeSheetNumber, orderPins, pinName, sheetDescription, sheetLabel } from "@/components/sheets/sheet-model";
import type { ViewerDocument, ViewerSheet } from "@/components/sheets/viewer-types";

// Sheet identifiers in the U.S. National CAD Standard's Uniform Drawing System form: discipline
// letter, sheet type digit, sequence (S-101 = structural plan 01) (NCS v6, from memory).
// A revised sheet keeps its number; the revision shows in the title block and with a cloud and
// delta on the sheet (common practice, no source).

let nextId = 1;
function sheet(documentId: number, page: number, sheetNumber: string | null, cycle: number, title = "Framing plan"): ViewerSheet {
  return { id: nextId++, documentId, page, sheetNumber, title, cycle };
}
const doc = (id: number, cycle: number, pageCount = 10): ViewerDocument => ({ id, name: `set-${id}.pdf`, url: `/d/${id}`, pageCount, cycle });

describe("the current set across review cycles", () => {
  // Cycle 1: a full set. Cycle 2: only the sheets revised in answer to corrections.
  const docs = [doc(1, 1), doc(2, 2)];
  const c1 = [sheet(1, 1, "G-001", 1), sheet(1, 2, "S-101", 1), sheet(1, 3, "S-201", 1), sheet(1, 4, "S-301", 1)];
  const c2 = [sheet(2, 1, "S-201", 2), sheet(2, 2, "S-501", 2)];
  const sets = buildSheetSets(docs, [...c2, ...c1]);

  it("holds every sheet once, the revised ones in their latest version", () => {
    expect(sets.current.map((e) => [e.sheet.sheetNumber, e.sheet.cycle])).toEqual([
      ["G-001", 1],
      ["S-101", 1],
      ["S-201", 2], // replaced in place, not moved to the end
      ["S-301", 1],
      ["S-501", 2], // new in cycle 2: added after the sheets already there
    ]);
  });

  it("knows the earlier version a revised sheet replaces", () => {
    const s201 = sets.current.find((e) => e.sheet.sheetNumber === "S-201");
    expect(s201?.earlier.map((s) => s.id)).toEqual([c1[2]?.id]);
    const s101 = sets.current.find((e) => e.sheet.sheetNumber === "S-101");
    expect(s101?.earlier).toEqual([]);
    const s501 = sets.current.find((e) => e.sheet.sheetNumber === "S-501");
    expect(s501?.earlier).toEqual([]);
  });

  it("keeps each cycle as submitted", () => {
    expect(sets.cycles).toEqual([1, 2]);
    expect(sets.latestCycle).toBe(2);
    expect(sets.byCycle.get(1)?.map((e) => e.sheet.id)).toEqual(c1.map((s) => s.id));
    expect(sets.byCycle.get(2)?.map((e) => e.sheet.sheetNumber)).toEqual(["S-201", "S-501"]);
  });

  it("with three cycles lists earlier versions most recent first", () => {
    const a = sheet(1, 1, "S-101", 1);
    const b = sheet(2, 1, "S-101", 2);
    const c = sheet(3, 1, "S-101", 3);
    const three = buildSheetSets([doc(1, 1), doc(2, 2), doc(3, 3)], [c, a, b]);
    expect(three.current).toHaveLength(1);
    expect(three.current[0]?.sheet.id).toBe(c.id);
    expect(three.current[0]?.earlier.map((s) => s.cycle)).toEqual([2, 1]);
    // Viewed in cycle 2, that version's history is cycle 1 only.
    expect(three.byCycle.get(2)?.[0]?.earlier.map((s) => s.cycle)).toEqual([1]);
  });
});

describe("sheet identity", () => {
  it("ignores case and spaces in a sheet number but not its punctuation", () => {
    expect(normalizeSheetNumber(" s-101 ")).toBe(normalizeSheetNumber("S-101"));
    expect(normalizeSheetNumber("S - 101")).toBe(normalizeSheetNumber("S-101"));
    // "A1.01" and "A-101" are different numbering schemes, not the same sheet.
    expect(normalizeSheetNumber("A1.01")).not.toBe(normalizeSheetNumber("A-101"));
    expect(normalizeSheetNumber("   ")).toBeNull();
    expect(normalizeSheetNumber(null)).toBeNull();
  });

  it("matches a revision whose number differs only in case or spacing", () => {
    const sets = buildSheetSets([doc(1, 1), doc(2, 2)], [sheet(1, 1, "S-101", 1), sheet(2, 1, "s-101 ", 2)]);
    expect(sets.current).toHaveLength(1);
    expect(sets.current[0]?.earlier).toHaveLength(1);
  });

  it("never merges sheets without a number, even on the same page of two cycles", () => {
    const sets = buildSheetSets([doc(1, 1), doc(2, 2)], [sheet(1, 1, null, 1, "page 1"), sheet(2, 1, null, 2, "page 1")]);
    expect(sets.current).toHaveLength(2);
    expect(sets.current.every((e) => e.earlier.length === 0)).toBe(true);
  });

  it("keeps both pages when one cycle repeats a number (a misread title block)", () => {
    const first = sheet(1, 1, "S-101", 1);
    const repeat = sheet(1, 2, "S-101", 1);
    const sets = buildSheetSets([doc(1, 1)], [first, repeat]);
    expect(sets.current.map((e) => e.sheet.id)).toEqual([first.id, repeat.id]);
  });

  it("orders a cycle by the documents' order as given, then by page", () => {
    const calc = sheet(7, 1, "C-1", 1);
    const drawings = [sheet(3, 2, "S-102", 1), sheet(3, 1, "S-101", 1)];
    const sets = buildSheetSets([doc(3, 1), doc(7, 1)], [calc, ...drawings]);
    expect(sets.current.map((e) => e.sheet.sheetNumber)).toEqual(["S-101", "S-102", "C-1"]);
  });

  it("an empty submittal has no cycles", () => {
    const sets = buildSheetSets([], []);
    expect(sets.current).toEqual([]);
    expect(sets.cycles).toEqual([]);
  });
});

describe("words on screen", () => {
  it("marks the latest cycle as current", () => {
    expect(cycleLabel(2, 2)).toBe("Cycle 2 (current)");
    expect(cycleLabel(1, 2)).toBe("Cycle 1");
  });

  it("names a sheet by number and title, or by title alone", () => {
    const s = sheet(1, 3, "S-101", 2, "Foundation plan");
    expect(sheetLabel(s)).toBe("S-101 — Foundation plan");
    expect(sheetDescription(s)).toBe("Sheet S-101, Foundation plan, cycle 2");
    const bare = sheet(1, 3, null, 1, "page 3");
    expect(sheetLabel(bare)).toBe("page 3");
    expect(sheetDescription(bare)).toContain("page 3");
  });

  it("names a pin by number and status in words, so status never rests on colour", () => {
    expect(pinName({ number: 3, status: "open" })).toBe("Comment 3, open");
    expect(pinName({ number: 12, status: "resolved" })).toBe("Comment 12, resolved");
    expect(pinName({ number: 1, status: "draft" })).toBe("Comment 1, draft");
  });

  it("puts pins in comment-number order for reading and tabbing", () => {
    const pins = [
      { id: 5, number: 10 },
      { id: 9, number: 2 },
      { id: 1, number: 2 },
    ];
    expect(orderPins(pins).map((p) => p.id)).toEqual([1, 9, 5]);
  });
});
