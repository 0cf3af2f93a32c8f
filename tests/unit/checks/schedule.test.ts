import { describe, expect, it } from "vitest";
import { EXAMPLE_SCHEDULE_CSV, formatRowError, parseSchedule, SCHEDULE_HEADER } from "@/lib/checks/schedule";
import { solve } from "@/lib/solver";

const HEADER = "mark,span,supports,loads,section,E,claimed,limit";
const row = (cells: Partial<Record<string, string>>) =>
  [cells.mark ?? "B-1", cells.span ?? "16 ft", cells.supports ?? "simple", cells.loads ?? "D 72 plf; L 240 plf", cells.section ?? "5.125x12 in", cells.E ?? "1800 ksi", cells.claimed ?? "", cells.limit ?? "floor"].join(",");

function rowErrors(...lines: string[]) {
  const r = parseSchedule([HEADER, ...lines].join("\n"));
  if (!r.ok) throw new Error(r.message);
  return r.errors.map(formatRowError);
}

describe("CSV member schedule", () => {
  it("documents one exact header", () => {
    expect(SCHEDULE_HEADER).toBe(HEADER);
  });

  it("reads the downloadable example without a single refusal", () => {
    const r = parseSchedule(EXAMPLE_SCHEDULE_CSV);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.errors).toEqual([]);
    expect(r.rows.map((x) => x.mark)).toEqual(["FB-3", "J-1", "B-7", "C-2"]);
  });

  it("a schedule row solves like the hand formula: 5wl⁴/384EI (AISC Table 3-23, case 1)", () => {
    const r = parseSchedule([HEADER, row({ loads: "L 240 plf", section: "I=738 in^4", E: "1800 ksi" })].join("\n"));
    if (!r.ok) throw new Error(r.message);
    const res = solve(r.rows[0]!.built.model);
    const delta = res.checks[0]!.combos.find((c) => c.name === "L")!.verdict.delta_m / 0.0254;
    expect(delta).toBeCloseTo((5 * 20 * 192 ** 4) / (384 * 1.8e6 * 738), 9);
  });

  it("reads 15'-6\" spans and point loads at a distance", () => {
    const r = parseSchedule([HEADER, row({ span: "15'-6\"", loads: "L 1.5 kip @ 7'-9\"" })].join("\n"));
    if (!r.ok) throw new Error(r.message);
    const input = r.rows[0]!.input;
    expect(input.spans[0]!.length).toBe("15.5");
    expect(input.loads[0]).toMatchObject({ type: "point", w: "1.5", unit: "kip", at: "7.75" });
  });

  it("refuses a file with a wrong header, naming the columns", () => {
    expect(parseSchedule("")).toEqual({ ok: false, message: `The schedule is empty: the first line must be the header ${HEADER}.` });
    expect(parseSchedule("mark,span,supports,loads,section,E,claimed\nA,1 ft,simple,L 1 plf,2x8,1600 ksi,")).toEqual({
      ok: false,
      message: `Missing column "limit". The header must be ${HEADER} (material optional).`,
    });
    expect(parseSchedule(`${HEADER},deflection\n`)).toEqual({ ok: false, message: `Unknown column "deflection". The header must be ${HEADER} (material optional).` });
    expect(parseSchedule(`${HEADER}\n`)).toEqual({ ok: false, message: "The schedule has a header but no members." });
  });

  it("reports a bad row on its line with the column and the reason; the other rows still run", () => {
    const r = parseSchedule([HEADER, row({ mark: "OK-1" }), row({ mark: "B-2", span: "16 feet" })].join("\n"));
    if (!r.ok) throw new Error(r.message);
    expect(r.rows.map((x) => x.mark)).toEqual(["OK-1"]);
    expect(r.errors.map(formatRowError)).toEqual([`Line 3 (B-2), span: "16 feet" is not a length with a unit such as "16 ft", "4.88 m" or 16'-0"`]);
  });

  it.each([
    [{ supports: "propped" }, 'Line 2 (B-1), supports: "propped" must be one of simple, cantilever, fixed-pinned, fixed-fixed'],
    [{ loads: "L 240" }, 'Line 2 (B-1), loads: "L 240": write the case, the value and its unit, e.g. "L 240 plf" or "L 1.5 kip @ 6 ft"'],
    [{ loads: "Q 240 plf" }, 'Line 2 (B-1), loads: "Q 240 plf": the load case must be one of D, L, Lr, S, W'],
    [{ loads: "L 2 kip" }, 'Line 2 (B-1), loads: "L 2 kip": a uniform load needs a line-load unit (plf, klf, N/m, kN/m); a point load needs "@" and its position'],
    [{ loads: "L 2 kip @ 20 ft" }, 'Line 2 (B-1), loads: "L 2 kip @ 20 ft": the position is beyond the span (16 ft)'],
    [{ section: "W12x27" }, 'Line 2 (B-1), section: "W12x27" is not in the wide-flange list (W8x10 … W24x55); give I instead, e.g. "I=204 in^4"'],
    [{ section: "big" }, 'Line 2 (B-1), section: "big" is not a section: use 2x12, 2-2x12, W12x26, 5.125x12 in or I=738 in^4'],
    [{ E: "1800" }, 'Line 2 (B-1), E: "1800" is not a modulus with a unit (psi, ksi, MPa, GPa)'],
    [{ claimed: "TL 0.3 in" }, 'Line 2 (B-1), claimed: "TL 0.3 in": the combination must be one of L, Lr, S, W, D+L, D+Lr'],
    [{ claimed: "L 0.3" }, 'Line 2 (B-1), claimed: "L 0.3": "0.3" is not a deflection with a unit (in or mm)'],
    [{ limit: "floors" }, 'Line 2 (B-1), limit: "floors" is not a row of Table 1604.3; use one of roof-plaster-ceiling, roof-nonplaster-ceiling, roof-no-ceiling, floor, exterior-wall-plaster, exterior-wall-brittle, exterior-wall-flexible, partition-plaster, partition-brittle, partition-flexible, farm, greenhouse, formed-metal-roofing, secondary-roof-metal, secondary-wall-metal'],
    [{ mark: "" }, "Line 2, mark: give the member mark"],
  ])("row error %j", (cells, message) => {
    expect(rowErrors(row(cells))).toEqual([message]);
  });

  it("refuses a mark given twice and a line with extra fields", () => {
    expect(rowErrors(row({}), row({}))).toEqual(['Line 3 (B-1), mark: "B-1" is already on line 2']);
    expect(rowErrors(`${row({})},extra`)).toEqual(["Line 2 (B-1): line 2 has more fields than the header"]);
  });
});
