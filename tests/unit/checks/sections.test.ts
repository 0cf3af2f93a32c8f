import { describe, expect, it } from "vitest";
import { dressedOf, dressedSize, findWShape, iShape, rectangle, resolveSection, SAWN_SIZES, W_SHAPES } from "@/lib/checks/sections";
import { DEFAULT_SECTION } from "@/lib/checks/sections";

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe("sawn lumber: dressed sizes and section properties", () => {
  // PS 20 American Softwood Lumber Standard, minimum dressed dry sizes (from memory):
  // 2 → 1½, 3 → 2½, 4 → 3½, 6 → 5½, 8 → 7¼, 10 → 9¼, 12 → 11¼ in; timbers 5 in and larger: nominal − ½ in.
  it.each([
    [2, false, 1.5],
    [3, false, 2.5],
    [4, false, 3.5],
    [6, false, 5.5],
    [8, false, 7.25],
    [10, false, 9.25],
    [12, false, 11.25],
    [14, false, 13.25],
    [6, true, 5.5],
    [8, true, 7.5],
    [12, true, 11.5],
  ])("nominal %i in (timber: %s) dresses to %f in (PS 20, from memory)", (nominal, timber, dressed) => {
    expect(dressedSize(nominal, timber)).toBe(dressed);
  });

  it("2x12 is 1.5 × 11.25 in and 6x10 a timber of 5.5 × 9.5 in (NDS 2018 Supplement Table 1B, from memory)", () => {
    expect(dressedOf("2x12")).toEqual({ b: 1.5, d: 11.25 });
    expect(dressedOf("6x10")).toEqual({ b: 5.5, d: 9.5 });
    expect(dressedOf("4x12")).toEqual({ b: 3.5, d: 11.25 });
  });

  // The printed Table 1B values round b·d³/12 and b·d to four significant figures, so each
  // tabulated value must match the recomputation to within that rounding.
  it.each(SAWN_SIZES.map((s) => [s.nominal, s] as const))("%s: tabulated Ixx and A agree with b·d³/12 and b·d (NDS Supplement Table 1B, from memory)", (_n, s) => {
    expect(rel(s.tableI, (s.b * s.d ** 3) / 12)).toBeLessThan(6e-4);
    expect(rel(s.tableA, s.b * s.d)).toBeLessThan(6e-4);
  });

  it("2x12: I = 177.98 in⁴ and 2x10: I = 98.93 in⁴ (NDS Supplement Table 1B, from memory)", () => {
    expect(rectangle(1.5, 11.25).I).toBeCloseTo(177.98, 2);
    expect(rectangle(1.5, 9.25).I).toBeCloseTo(98.93, 2);
  });

  it("a two-ply 2x12 has twice the single ply's I (b doubles, I = b·d³/12)", () => {
    const one = resolveSection({ ...DEFAULT_SECTION, source: "sawn", nominal: "2x12", plies: "1" });
    const two = resolveSection({ ...DEFAULT_SECTION, source: "sawn", nominal: "2x12", plies: "2" });
    expect(parseFloat(two.I)).toBeCloseTo(2 * parseFloat(one.I), 9);
    expect(one.I).toBe("177.978515625 in^4");
    expect(one.source).toContain("NDS 2018 Supplement Table 1B");
  });
});

describe("rectangle and I-shape from dimensions", () => {
  it("a 5-1/8 × 12 in glulam: I = 738 in⁴ exactly (b·d³/12)", () => {
    expect(rectangle(5.125, 12).I).toBe(738);
    // form factor 6/5 for a rectangle: Av = 5A/6 (USDA Wood Handbook ch. 9, from memory)
    expect(rectangle(5.125, 12).Av).toBeCloseTo((5 * 61.5) / 6, 12);
  });

  it("the I-shape formula equals flanges and web summed by the parallel-axis theorem", () => {
    const d = 12.22;
    const bf = 6.49;
    const tf = 0.38;
    const tw = 0.23;
    const hw = d - 2 * tf;
    const flange = (bf * tf ** 3) / 12 + bf * tf * ((d - tf) / 2) ** 2;
    const web = (tw * hw ** 3) / 12;
    expect(rel(iShape(d, bf, tf, tw).I, 2 * flange + web)).toBeLessThan(1e-12);
  });
});

describe("wide-flange shapes (AISC Steel Construction Manual 15th ed., Table 1-1, from memory)", () => {
  // Rolled shapes carry web-to-flange fillets that plates from d, bf, tf, tw leave out, so the
  // plate recomputation is a little below the tabulated value: 0–3.5 % for Ix, 0–3 % for A.
  it.each(W_SHAPES.map((w) => [w.designation, w] as const))("%s: Ix and A from plates sit just below the tabulated values", (_n, w) => {
    const p = iShape(w.d, w.bf, w.tf, w.tw);
    expect(p.I).toBeLessThanOrEqual(w.Ix);
    expect(rel(p.I, w.Ix)).toBeLessThan(0.035);
    expect(p.A).toBeLessThanOrEqual(w.A);
    expect(rel(p.A, w.A)).toBeLessThan(0.03);
  });

  // Steel weighs 490 lb/ft³ (AISC Manual, from memory): a shape of A in² weighs 490·A/144 = 3.40·A lb/ft,
  // and the nominal weight in the designation (W12x26 → 26 lb/ft) must agree within 1.5 %.
  it.each(W_SHAPES.map((w) => [w.designation, w] as const))("%s: the weight in the name is 490/144 × A lb/ft", (name, w) => {
    const nominal = Number(name.split("x")[1]);
    expect(rel((490 / 144) * w.A, nominal)).toBeLessThan(0.015);
  });

  it("finds shapes however the designation is written", () => {
    expect(findWShape("w12 x 26")?.Ix).toBe(204);
    expect(findWShape("W12×26")?.A).toBe(7.65);
    expect(findWShape("W99x1")).toBeUndefined();
  });
});
