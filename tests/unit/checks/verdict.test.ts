import { describe, expect, it } from "vitest";
import { beamFormSchema, buildBeamModel, DEFAULT_BEAM } from "@/lib/checks/beam-form";
import { parseClaimsText } from "@/lib/checks/claims-text";
import { DEFAULT_MATERIAL } from "@/lib/checks/materials";
import { parseFeetInches, parseMixedNumber } from "@/lib/checks/quantities";
import { DEFAULT_SECTION } from "@/lib/checks/sections";
import { commentBody, overallVerdict, summarize } from "@/lib/checks/verdict";
import { solve } from "@/lib/solver";

// A 5-1/8 × 12 glulam (I = 738 in⁴, E = 1.8e6 psi) over 16 ft, L = 240 plf:
// Δ_L = 5wl⁴/384EI = 0.2664 in (AISC Table 3-23, case 1), limit l/360 = 0.5333 in (IBC 2021 Table 1604.3, floors).
function beam(claim: string | null, w = "240") {
  const input = beamFormSchema.parse({
    ...DEFAULT_BEAM,
    spans: [{ length: "16" }],
    section: { ...DEFAULT_SECTION, source: "rect", b: "5.125", d: "12" },
    material: { ...DEFAULT_MATERIAL, source: "glulam", stressClass: "24F-1.8E" },
    creepMaterial: "glulam",
    loads: [{ case: "L", type: "uniform", on: "all", w, unit: "plf" }],
    claims: claim ? [{ segment: "S1", combo: "L", delta: claim, unit: "in" }] : [],
  });
  return solve(buildBeamModel(input, { title: "FB-3", mark: "FB-3" }).model);
}

describe("one verdict per check", () => {
  it("within the limit with an agreeing claim: pass (±5 %, common practice)", () => {
    expect(overallVerdict(beam("0.27"))).toBe("pass");
  });
  it("a claim 21 % below the recomputed value: disputed (beyond 15 %, common practice)", () => {
    expect(overallVerdict(beam("0.21"))).toBe("disputed");
  });
  it("over the limit: fail, whatever the claim says", () => {
    // twice the load: 0.533 in at 480 plf sits on the limit; 600 plf is 0.666 in > l/360
    expect(overallVerdict(beam("0.3", "600"))).toBe("fail");
  });
  it("within 2 % of the limit: near limit", () => {
    // 480 plf gives 2 × 0.2664 = 0.5328 in against 0.5333 in: 0.1 % under
    expect(overallVerdict(beam(null, "480"))).toBe("near_limit");
  });
  it("no check asked: no limit", () => {
    expect(overallVerdict({ checks: [] })).toBe("no_limit");
  });
});

describe("the correction comment a check becomes", () => {
  it("carries the numbers in both systems, the code section and the link to the check", () => {
    const r = beam("0.21");
    const body = commentBody(r, "disputed", { checkId: 12, memberMark: "FB-3", sheetNumber: "S-201", calcPage: 2, cycle: 1, url: "http://127.0.0.1:3000/applications/1/checks/12", edition: "IBC 2021" });
    expect(body).toContain("FB-3 (sheet S-201, calc page 2)");
    expect(body).toContain("0.266 in (6.77 mm) = l/721");
    expect(body).toContain("limit l/360 = 0.533 in (13.5 mm)");
    expect(body).toContain("claimed 0.21 in (5.33 mm), −21.2 %");
    expect(body).toContain("Check: http://127.0.0.1:3000/applications/1/checks/12");
    expect(summarize(r).length).toBeLessThanOrEqual(500);
  });
});

describe("the trade's ways of writing numbers (common practice, no source)", () => {
  it.each([
    ["16'-0\"", 16],
    ["15'-6\"", 15.5],
    ["15' 6\"", 15.5],
    ["12'-4 1/2\"", 12 + 4.5 / 12],
    ["9'", 9],
    ["16 ft", null],
    ["5'-13\"", null],
  ])("%s → %s ft", (text, feet) => {
    const v = parseFeetInches(text);
    if (feet === null) expect(v).toBeNull();
    else expect(v).toBeCloseTo(feet, 12);
  });
  it("fractions: 5-1/8 = 5.125, 3 1/2 = 3.5, 1/2 = 0.5", () => {
    expect(parseMixedNumber("5-1/8")).toBe(5.125);
    expect(parseMixedNumber("3 1/2")).toBe(3.5);
    expect(parseMixedNumber("1/2")).toBe(0.5);
  });
  it("claims in one cell: combination, then the deflection with its unit", () => {
    expect(parseClaimsText("L 0.42 in; D+L 0.61 in")).toEqual({ ok: true, claims: [{ combo: "L", delta: "0.42 in" }, { combo: "D+L", delta: "0.61 in" }] });
    expect(parseClaimsText("L 0")).toEqual({ ok: false, message: '"L 0": "0" is not a deflection with a unit (in or mm)' });
    expect(parseClaimsText("L -2 mm")).toEqual({ ok: false, message: '"L -2 mm": the deflection must be greater than zero' });
  });
});
