import { describe, expect, it } from "vitest";
import { beamFormSchema, buildBeamModel, DEFAULT_BEAM, fieldForPath, type BeamFormInput } from "@/lib/checks/beam-form";
import { DEFAULT_MATERIAL } from "@/lib/checks/materials";
import { DEFAULT_SECTION } from "@/lib/checks/sections";
import { solve, SolverInputError, type SolveResult } from "@/lib/solver";

// Beam formulas of the AISC Steel Construction Manual, Table 3-23 (case numbers of the
// 13th–15th editions, from memory; the same formulas are in the American Wood Council's Design
// Aid No. 6). US units: E = 1,600,000 psi, I = 177.98 in⁴ (a 2x12), lengths in in, loads in lbf.
const E = 1_600_000;
const I = (1.5 * 11.25 ** 3) / 12;
const EI = E * I; // lbf·in²
const IN = 0.0254;

const base: BeamFormInput = {
  ...DEFAULT_BEAM,
  section: { ...DEFAULT_SECTION, source: "sawn", nominal: "2x12", plies: "1" },
  material: { ...DEFAULT_MATERIAL, source: "direct", E: "1600000", eUnit: "psi" },
  creepMaterial: "sawn-dry",
};
const load = (l: Partial<BeamFormInput["loads"][number]>): BeamFormInput["loads"][number] => ({ case: "L", type: "uniform", on: "all", w: "0", unit: "plf", wEnd: "", at: "", from: "", to: "", note: "", ...l });

function run(input: BeamFormInput): SolveResult {
  const parsed = beamFormSchema.parse(input);
  return solve(buildBeamModel(parsed, { title: "test", mark: "T-1" }).model);
}
const inches = (m: number) => m / IN;
const combo = (r: SolveResult, name: string, check = 0) => r.checks[check]?.combos.find((c) => c.name === name);

describe("beam form → model file → checker", () => {
  it("simple span, uniform load: Δ = 5wl⁴/384EI at mid-span (AISC Table 3-23, case 1)", () => {
    const r = run({ ...base, spans: [{ length: "16" }], loads: [load({ w: "240" })] });
    const w = 240 / 12; // lbf/in
    const l = 16 * 12;
    expect(inches(combo(r, "L")!.verdict.delta_m)).toBeCloseTo((5 * w * l ** 4) / (384 * EI), 9);
    expect(r.checks[0]?.combos.find((c) => c.name === "L")?.where?.x_m).toBeCloseTo((l / 2) * IN, 9);
  });

  it("simple span, point load at the centre: Δ = Pl³/48EI (AISC Table 3-23, case 7)", () => {
    const r = run({ ...base, spans: [{ length: "12" }], loads: [load({ type: "point", w: "1.5", unit: "kip", at: "6" })] });
    const l = 144;
    expect(inches(combo(r, "L")!.verdict.delta_m)).toBeCloseTo((1500 * l ** 3) / (48 * EI), 9);
  });

  it("partial load over the middle half: reactions carry w × length (statics)", () => {
    const r = run({ ...base, spans: [{ length: "20" }], loads: [load({ type: "partial", w: "300", from: "5", to: "15" })] });
    const total = r.reactions.reduce((s, x) => s + (x.Fy_N ?? 0), 0);
    // 300 plf × 10 ft = 3000 lbf (lbf = 4.4482216152605 N, NIST SP 811)
    expect(total).toBeCloseTo(3000 * 4.4482216152605, 6);
  });

  it("cantilever, load at the tip: Δ = Pl³/3EI; the limit uses l = 2 × length (AISC Table 3-23 case 22; IBC Table 1604.3 footnote i)", () => {
    const r = run({ ...base, spans: [], supports: ["fixed"], overhangRight: "6", loads: [load({ type: "point", w: "500", unit: "lbf", at: "6" })] });
    const l = 72;
    const v = combo(r, "L")!.verdict;
    expect(inches(v.delta_m)).toBeCloseTo((500 * l ** 3) / (3 * EI), 9);
    expect(v.limit_span_m).toBeCloseTo(2 * 72 * IN, 12);
  });

  it("overhang tip under load on the overhang only: Δ = wa³(4l + 3a)/24EI (AISC Table 3-23, case 24)", () => {
    const r = run({ ...base, spans: [{ length: "12" }], overhangRight: "4", loads: [load({ on: "OR", w: "120" })], claims: [] });
    const w = 10;
    const l = 144;
    const a = 48;
    const tip = r.find.find((f) => f.label === "C");
    expect(tip).toBeDefined();
    expect(inches(-tip!.value_si)).toBeCloseTo((w * a ** 3 * (4 * l + 3 * a)) / (24 * EI), 9);
  });

  it("two equal spans under uniform load: Δmax = wl⁴/185EI, reactions 3/8, 10/8, 3/8 wl (AISC Table 3-23, case 29, from memory)", () => {
    const r = run({ ...base, spans: [{ length: "14" }, { length: "14" }], supports: ["pin", "roller", "roller"], loads: [load({ w: "120" })] });
    const w = 10;
    const l = 168;
    // 185 is the rounded 1/0.005416; the printed coefficient is good to 0.1 %
    expect(inches(combo(r, "L")!.verdict.delta_m) / ((w * l ** 4) / (185 * EI))).toBeCloseTo(1, 2);
    const ry = r.reactions.map((x) => (x.Fy_N ?? 0) / 4.4482216152605);
    expect(ry[0]).toBeCloseTo((3 / 8) * 120 * 14, 6);
    expect(ry[1]).toBeCloseTo((10 / 8) * 120 * 14, 6);
  });

  it("D + L for dry lumber takes half the dead load (IBC 2021 Table 1604.3 footnote d)", () => {
    const r = run({ ...base, spans: [{ length: "16" }], loads: [load({ case: "D", w: "100" }), load({ case: "L", w: "200" })] });
    expect(combo(r, "D+L")!.verdict.delta_m / combo(r, "L")!.verdict.delta_m).toBeCloseTo((0.5 * 100 + 200) / 200, 9);
  });

  it("carries the claims to the right check and judges them against the recomputed value", () => {
    // 5wl⁴/384EI with w = 20 lbf/in, l = 192 in is 0.3996 in: a claim of 0.30 in is 25 % low
    const r = run({ ...base, spans: [{ length: "16" }], loads: [load({ w: "240" })], claims: [{ segment: "S1", combo: "L", delta: "0.30", unit: "in", location: "midspan" }] });
    const c = combo(r, "L")!.claim!;
    expect(c.claimed_m).toBeCloseTo(0.3 * IN, 12);
    expect(c.verdict).toBe("correction");
  });
});

describe("beam form validation (the schema the server applies)", () => {
  const issues = (input: unknown) => {
    const r = beamFormSchema.safeParse(input);
    return r.success ? [] : r.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
  };
  it("names the field and says what is wrong", () => {
    expect(issues({ ...base, spans: [{ length: "" }] })).toContain("spans.0.length: Enter the span length.");
    expect(issues({ ...base, spans: [{ length: "sixteen" }] })).toContain("spans.0.length: The span length must be a number, e.g. 16 or 0.25.");
    expect(issues({ ...base, spans: [{ length: "16" }], supports: ["pin"] })).toContain("supports: 1 span need 2 supports.");
    expect(issues({ ...base, spans: [{ length: "16" }], loads: [load({ type: "point", w: "1", unit: "kip", at: "20" })] })).toContain("loads.0.at: Must be between 0 and 16 ft (the beam's length).");
    expect(issues({ ...base, spans: [{ length: "16" }], loads: [load({ type: "point", w: "1", unit: "plf", at: "2" })] })).toContain("loads.0.unit: A point load is a force: lbf, kip, N or kN.");
    expect(issues({ ...base, spans: [], supports: ["pin"], overhangRight: "6" })).toContain("supports.0: A cantilever needs a fixed support.");
  });

  it("puts the solver's own messages on the form field they come from", () => {
    const input = beamFormSchema.parse({ ...base, spans: [{ length: "16" }], loads: [load({ w: "240" })], claims: [{ segment: "S1", combo: "Lr", delta: "0.3", unit: "in" }] });
    const built = buildBeamModel(input, { title: "t", mark: "T" });
    let error: SolverInputError | null = null;
    try {
      solve(built.model);
    } catch (e) {
      error = e as SolverInputError;
    }
    expect(error).toBeInstanceOf(SolverInputError);
    expect(error!.issues[0]?.path).toBe("checks[0].claimed[0].combo");
    expect(fieldForPath(built.origin, error!.issues[0]!.path)).toBe("claims.0.combo");
    expect(fieldForPath(built.origin, "members.AB.I")).toBe("section");
    expect(fieldForPath(built.origin, "supports")).toBe("supports");
  });
});
