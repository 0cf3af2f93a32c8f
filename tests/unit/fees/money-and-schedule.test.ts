import { describe, expect, it } from "vitest";
import {
  centsToInput,
  DEMO_FEE_SCHEDULE,
  feeScheduleInputSchema,
  formatBasisPoints,
  formatCents,
  formatExactCents,
  parseDollarsToCents,
  parseFeeSchedule,
  parsePercentToBasisPoints,
} from "@/lib/fees";

describe("money in cents, as people read and type it", () => {
  it("formats whole cents with thousands separators (US style)", () => {
    expect(formatCents(0)).toBe("$0.00");
    expect(formatCents(5)).toBe("$0.05");
    expect(formatCents(-5)).toBe("-$0.05");
    expect(formatCents(123_456_789)).toBe("$1,234,567.89");
    expect(() => formatCents(1.5)).toThrow("An amount must be a whole number of cents; got 1.5.");
  });

  it("shows an unrounded product exactly, marking a repeating one", () => {
    expect(formatExactCents(2350n * 6500n, 10_000n)).toBe("$15.275"); // 65 % of $23.50
    expect(formatExactCents(1n, 3n)).toBe("$0.003333…"); // a third of a cent
    expect(formatExactCents(500n, 1n)).toBe("$5.00");
  });

  it("writes amounts into input fields in a form it reads back unchanged", () => {
    for (const c of [0, 5, 100_000, 102_250, 100_000_000_00]) expect(parseDollarsToCents(centsToInput(c))).toBe(c);
    expect(centsToInput(100_000_000)).toBe("1,000,000.00");
  });

  it("parses typed dollars through the digits (1.005 is refused, not rounded)", () => {
    expect(parseDollarsToCents("1,022.50")).toBe(102_250);
    expect(parseDollarsToCents("$60")).toBe(6_000);
    expect(parseDollarsToCents("0.1")).toBe(10);
    expect(parseDollarsToCents("1.005")).toBeNull();
    expect(parseDollarsToCents("-3")).toBeNull();
    expect(parseDollarsToCents("ten")).toBeNull();
  });

  it("parses and prints percentages as basis points", () => {
    expect(parsePercentToBasisPoints("65")).toBe(6_500);
    expect(parsePercentToBasisPoints("2.5 %")).toBe(250);
    expect(parsePercentToBasisPoints("0.75")).toBe(75);
    expect(parsePercentToBasisPoints("6.125")).toBeNull();
    expect(formatBasisPoints(6_500)).toBe("65%");
    expect(formatBasisPoints(250)).toBe("2.5%");
    expect(formatBasisPoints(75)).toBe("0.75%");
  });
});

describe("the schedule as data", () => {
  const { version: _v, revision: _r, ...input } = DEMO_FEE_SCHEDULE;

  it("accepts the demo schedule, which says it is invented", () => {
    expect(feeScheduleInputSchema.safeParse(input).success).toBe(true);
    expect(DEMO_FEE_SCHEDULE.label).toMatch(/^Invented demo schedule/);
  });

  it("names the bracket that breaks the rules", () => {
    const issues = (s: unknown) => {
      const r = feeScheduleInputSchema.safeParse(s);
      return r.success ? [] : r.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
    };
    const b = input.brackets;
    expect(issues({ ...input, brackets: [b[0], b[2], b[1], ...b.slice(3)] })).toEqual(["brackets.2.upToCents: Upper limits must increase from one bracket to the next."]);
    expect(issues({ ...input, brackets: b.slice(0, 2) })).toEqual(["brackets.1.upToCents: The last bracket must be open-ended (no upper limit), so every valuation has a fee."]);
    expect(issues({ ...input, brackets: [{ ...b[0], upToCents: null }, ...b.slice(1)] })).toContain("brackets.0.upToCents: Only the last bracket may be open-ended.");
    expect(issues({ ...input, brackets: [{ ...b[0], stepCents: 0, perStepCents: 500 }, ...b.slice(1)] })).toEqual(["brackets.0.stepCents: A fee per step needs a step size (e.g. $1,000.00)."]);
    expect(issues({ ...input, brackets: [{ ...b[0], baseCents: 12.5 }, ...b.slice(1)] })).toEqual(["brackets.0.baseCents: The base fee must be whole cents."]);
    expect(issues({ ...input, fixedFees: [input.fixedFees[0], input.fixedFees[0]] })).toEqual(["fixedFees.1.code: Each fee needs its own code."]);
  });

  it("falls back to the demo schedule when the stored row is unreadable", () => {
    expect(parseFeeSchedule(undefined)).toEqual(DEMO_FEE_SCHEDULE);
    expect(parseFeeSchedule({ brackets: "nonsense" })).toEqual(DEMO_FEE_SCHEDULE);
    const saved = { ...DEMO_FEE_SCHEDULE, version: "LF-FEES-r2", revision: 2, planReviewBasisPoints: 7_000 };
    expect(parseFeeSchedule(saved)).toEqual(saved);
  });
});
