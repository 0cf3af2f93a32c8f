import { describe, expect, it } from "vitest";
import {
  bracketJumps,
  DEMO_FEE_SCHEDULE,
  FeeInputError,
  findBracket,
  permitFee,
  quoteResubmittalFee,
  quoteReviewFee,
  roundHalfUp,
  shareOf,
  type FeeSchedule,
} from "@/lib/fees";

const $ = (dollars: string) => {
  // Test amounts written as dollars ("993.75"), converted through the digits, never a float.
  const [w = "0", f = ""] = dollars.replace(/,/g, "").split(".");
  return Number(w) * 100 + Number(f.padEnd(2, "0"));
};

// UBC 1997 Table 1-A "Building permit fees" and §108.3 "plan review fee 65 % of the building
// permit fee" (from memory). Only rows whose stated "for the first $X" base agrees with the
// previous row's arithmetic are asserted at their edges.
const UBC_1997: FeeSchedule = {
  version: "UBC-1997-T1A",
  revision: 1,
  label: "UBC 1997 Table 1-A (test data)",
  currency: "usd",
  brackets: [
    { upToCents: $("500"), baseCents: $("23.50"), stepCents: 0, perStepCents: 0 }, // $1 to $500: $23.50
    { upToCents: $("2,000"), baseCents: $("23.50"), stepCents: $("100"), perStepCents: $("3.05") }, // + $3.05 per $100 or fraction
    { upToCents: $("25,000"), baseCents: $("69.25"), stepCents: $("1,000"), perStepCents: $("14.00") },
    { upToCents: $("50,000"), baseCents: $("391.75"), stepCents: $("1,000"), perStepCents: $("10.10") },
    { upToCents: $("100,000"), baseCents: $("643.75"), stepCents: $("1,000"), perStepCents: $("7.00") },
    { upToCents: $("500,000"), baseCents: $("993.75"), stepCents: $("1,000"), perStepCents: $("5.60") },
    { upToCents: $("1,000,000"), baseCents: $("3,233.75"), stepCents: $("1,000"), perStepCents: $("4.75") },
    { upToCents: null, baseCents: $("5,608.75"), stepCents: $("1,000"), perStepCents: $("3.15") },
  ],
  planReviewBasisPoints: 6_500,
  fixedFees: [],
  resubmittal: { includedCycles: 3, feeCents: 0 },
};

describe("permit fee at bracket edges, UBC 1997 Table 1-A (from memory)", () => {
  it.each([
    ["1.00", "23.50"], // row 1, flat
    ["500.00", "23.50"], // row 1 includes its upper limit
    ["500.01", "26.55"], // row 2: $23.50 + 1 × $3.05 (a fraction of $100 counts as a whole step)
    ["600.00", "26.55"], // exactly one additional $100
    ["600.01", "29.60"], // $23.50 + 2 × $3.05
    ["2,000.00", "69.25"], // $23.50 + 15 × $3.05 = $69.25, the base the table states for row 3
    ["2,000.01", "83.25"], // $69.25 + 1 × $14.00
    ["100,000.00", "993.75"], // $643.75 + 50 × $7.00 = $993.75, the base the table states for row 6
    ["100,000.01", "999.35"], // $993.75 + 1 × $5.60
    ["500,000.00", "3,233.75"], // $993.75 + 400 × $5.60, row 7's stated base
    ["1,000,000.00", "5,608.75"], // $3,233.75 + 500 × $4.75, row 8's stated base
    ["1,000,000.01", "5,611.90"], // $5,608.75 + 1 × $3.15
  ])("valuation $%s → permit fee $%s", (valuation, fee) => {
    expect(permitFee(UBC_1997, $(valuation)).cents).toBe($(fee));
  });

  it("plan-review fee is 65 % of the permit fee, rounded half up to the cent (UBC 1997 §108.3, from memory)", () => {
    // $993.75 × 0.65 = $645.9375 → $645.94 (hand arithmetic)
    const q = quoteReviewFee(UBC_1997, $("100,000"));
    expect(q.lineItems).toHaveLength(1);
    expect(q.lineItems[0]).toMatchObject({ code: "plan_review", amountCents: $("645.94") });
    expect(q.totalCents).toBe($("645.94"));
    expect(q.lineItems[0]!.basis).toContain("$643.75 for the first $50,000.00 plus 50 × $7.00 for each additional $1,000.00 or fraction = $993.75");
    expect(q.lineItems[0]!.basis).toContain("65% × $993.75 = $645.9375, rounded half up to $645.94");
    // $23.50 × 0.65 = $15.275 exactly → $15.28 (a true half cent rounds up)
    expect(quoteReviewFee(UBC_1997, $("100")).totalCents).toBe($("15.28"));
  });
});

describe("integer cents: no float drift", () => {
  const flat = (cents: number): FeeSchedule => ({ ...UBC_1997, brackets: [{ upToCents: null, baseCents: cents, stepCents: 0, perStepCents: 0 }] });

  it.each([
    // permit fee, 65 % exactly (hand arithmetic), rounded half up
    ["0.70", "0.46"], // 0.455 → 0.46
    ["1.90", "1.24"], // 1.235 → 1.24
    ["24.90", "16.19"], // 16.185 → 16.19
    ["42.30", "27.50"], // 27.495 → 27.50
  ])("65 percent of $%s is $%s", (permit, expected) => {
    expect(quoteReviewFee(flat($(permit)), 100).totalCents).toBe($(expected));
  });

  it("the same sums done in binary floating point land on the wrong cent (why the code never does that)", () => {
    // IEEE 754 doubles: 24.90 × 0.65 = 16.184999…; rounding that to cents gives 16.18, not 16.19.
    expect(Math.round(24.9 * 0.65 * 100)).toBe(1618);
    expect(shareOf($("24.90"), 6_500).cents).toBe(1619);
  });

  it("rounds half up, and only at the very end", () => {
    expect(roundHalfUp(5n, 10n)).toBe(1n); // 0.5 → 1
    expect(roundHalfUp(14n, 10n)).toBe(1n); // 1.4 → 1
    expect(roundHalfUp(15n, 10n)).toBe(2n); // 1.5 → 2
    expect(roundHalfUp(-15n, 10n)).toBe(-2n); // symmetric for negatives
    expect(shareOf(100, 3_333)).toMatchObject({ cents: 33, rounded: true, exact: "$0.3333" }); // 33.33 % of $1.00
    expect(shareOf(300, 5_000)).toMatchObject({ cents: 150, rounded: false }); // 50 % of $3.00
  });

  it("a large valuation stays exact to the cent", () => {
    // $98,765,432.10 in the last UBC row: ⌈(98,765,432.10 − 1,000,000) / 1,000⌉ = 97,766 steps;
    // $5,608.75 + 97,766 × $3.15 = $5,608.75 + $307,962.90 = $313,571.65 (hand arithmetic)
    expect(permitFee(UBC_1997, $("98,765,432.10")).cents).toBe($("313,571.65"));
  });
});

describe("the invented demo schedule", () => {
  it("never jumps at a bracket edge", () => {
    expect(bracketJumps(DEMO_FEE_SCHEDULE)).toEqual([]);
  });

  it.each([
    ["2,000.00", "60.00"], // flat first bracket
    ["2,000.01", "72.50"], // $60.00 + 1 × $12.50
    ["25,000.00", "347.50"], // $60.00 + 23 × $12.50
    ["25,000.01", "356.50"], // $347.50 + 1 × $9.00
    ["100,000.00", "1,022.50"], // $347.50 + 75 × $9.00
    ["500,000.00", "3,522.50"], // $1,022.50 + 400 × $6.25
    ["1,000,000.00", "6,022.50"], // $3,522.50 + 500 × $5.00
    ["1,000,000.01", "6,026.00"], // $6,022.50 + 1 × $3.50
  ])("valuation $%s → permit fee $%s (hand arithmetic from the schedule's rows)", (valuation, fee) => {
    expect(permitFee(DEMO_FEE_SCHEDULE, $(valuation)).cents).toBe($(fee));
  });

  it("is never lower for a higher valuation, one cent either side of every edge", () => {
    const probes: number[] = [1];
    for (const b of DEMO_FEE_SCHEDULE.brackets) if (b.upToCents) probes.push(b.upToCents - 1, b.upToCents, b.upToCents + 1);
    probes.push(5_000_000_000);
    const fees = probes.map((v) => permitFee(DEMO_FEE_SCHEDULE, v).cents);
    for (let i = 1; i < fees.length; i++) expect(fees[i]!).toBeGreaterThanOrEqual(fees[i - 1]!);
  });

  it("charges the plan-review fee and the fixed fees at intake; the lines add up to the total", () => {
    const q = quoteReviewFee(DEMO_FEE_SCHEDULE, $("185,000"));
    expect(q.scheduleVersion).toBe(DEMO_FEE_SCHEDULE.version);
    expect(q.lineItems.map((l) => l.code)).toEqual(["plan_review", "records_fee"]);
    // $1,022.50 + 85 × $6.25 = $1,553.75; 65 % = $1,009.9375 → $1,009.94; + $12.00 records fee
    expect(q.permitFeeCents).toBe($("1,553.75"));
    expect(q.lineItems[0]!.amountCents).toBe($("1,009.94"));
    expect(q.totalCents).toBe($("1,021.94"));
    expect(q.lineItems.reduce((s, l) => s + l.amountCents, 0)).toBe(q.totalCents);
  });
});

describe("resubmittal fees beyond the included cycles", () => {
  it("charges nothing for the cycles the plan-review fee covers, then a fixed fee per cycle", () => {
    expect([1, 2, 3].map((c) => quoteResubmittalFee(DEMO_FEE_SCHEDULE, c))).toEqual([null, null, null]);
    const q4 = quoteResubmittalFee(DEMO_FEE_SCHEDULE, 4)!;
    expect(q4.totalCents).toBe(DEMO_FEE_SCHEDULE.resubmittal.feeCents);
    expect(q4.lineItems[0]!.basis).toContain("after the first 3");
    expect(quoteResubmittalFee({ ...DEMO_FEE_SCHEDULE, resubmittal: { includedCycles: 2, feeCents: 0 } }, 5)).toBeNull();
  });
});

describe("exact messages for bad input", () => {
  it("refuses a valuation that is not a positive whole number of cents", () => {
    expect(() => permitFee(DEMO_FEE_SCHEDULE, 0)).toThrow(new FeeInputError("The valuation must be a whole number of cents greater than zero; got 0."));
    expect(() => permitFee(DEMO_FEE_SCHEDULE, 12.5)).toThrow("got 12.5.");
    expect(() => quoteResubmittalFee(DEMO_FEE_SCHEDULE, 0)).toThrow("A review cycle is a whole number from 1; got 0.");
  });

  it("names the gap when a schedule has no open-ended last bracket", () => {
    const capped = { brackets: [{ upToCents: 100_000, baseCents: 1_000, stepCents: 0, perStepCents: 0 }] };
    expect(findBracket(capped, 100_000)).toEqual({ index: 0, lowerCents: 0 });
    expect(() => findBracket(capped, 100_001)).toThrow("The valuation $1,000.01 is above the last bracket of the schedule, which has an upper limit of $1,000.00.");
  });

  it("reports where a schedule's fee jumps at an edge", () => {
    const s = { brackets: [{ upToCents: 100_000, baseCents: 5_000, stepCents: 0, perStepCents: 0 }, { upToCents: null, baseCents: 6_000, stepCents: 100_000, perStepCents: 100 }] };
    expect(bracketJumps(s)).toEqual(["Bracket 1 ends at $50.00 (valuation $1,000.00); bracket 2 starts from a base of $60.00."]);
  });
});
