import { describe, expect, it } from "vitest";
import { tributaryLineLoad } from "@/lib/checks/tributary";

describe("tributary width: w = q × width", () => {
  it("40 psf × 6 ft = 240 plf, written out as the calc does (common practice, no source)", () => {
    const r = tributaryLineLoad(40, "psf", 6, "ft", "plf");
    expect(r.w).toBeCloseTo(240, 10);
    expect(r.text).toBe("40 psf × 6 ft = 240 plf");
    // NIST SP 811: 1 plf = 14.5939029 N/m, so 240 plf = 3502.54 N/m
    expect(r.si).toBeCloseTo(240 * 14.5939029, 4);
  });

  it("joists at 16 in o.c.: 40 psf × 16 in = 53.33 plf, the width also shown in feet", () => {
    const r = tributaryLineLoad(40, "psf", 16, "in", "plf");
    expect(r.w).toBeCloseTo((40 * 16) / 12, 10);
    expect(r.text).toBe("40 psf × 16 in (1.333 ft) = 53.33 plf");
  });

  it("SI: 2.4 kPa × 3 m = 7.2 kN/m", () => {
    const r = tributaryLineLoad(2.4, "kPa", 3, "m", "kN/m");
    expect(r.w).toBeCloseTo(7.2, 12);
    expect(r.text).toBe("2.4 kPa × 3 m = 7.2 kN/m");
  });

  it("mixed systems convert exactly: 1 psf × 1 m in N/m is 47.88025898 N/m (NIST SP 811)", () => {
    expect(tributaryLineLoad(1, "psf", 1, "m", "N/m").w).toBeCloseTo(47.88025898, 6);
  });

  it("adds the self weight in the output unit", () => {
    const r = tributaryLineLoad(12, "psf", 6, "ft", "plf", 15);
    expect(r.w).toBeCloseTo(87, 10);
    expect(r.text).toBe("12 psf × 6 ft = 72 plf + 15 plf self weight = 87 plf");
  });
});
