import { describe, expect, it } from "vitest";
import {
  addBusinessDays,
  businessDaysBetween,
  isBusinessDay,
  isDay,
  makeCalendar,
  nextBusinessDay,
  previousBusinessDay,
  rollForward,
  weekEnd,
  weekStart,
} from "@/lib/review-clock";

// Every expected date below was counted by hand on these printed calendars (Gregorian; the
// weekdays agree with any wall calendar for these months):
//
//     November 2026            December 2026            January 2027
//  Mo Tu We Th Fr Sa Su     Mo Tu We Th Fr Sa Su     Mo Tu We Th Fr Sa Su
//                     1         1  2  3  4  5  6                  1  2  3
//   2  3  4  5  6  7  8      7  8  9 10 11 12 13      4  5  6  7  8  9 10
//   9 10 11 12 13 14 15     14 15 16 17 18 19 20     11 12 13 14 15 16 17
//  16 17 18 19 20 21 22     21 22 23 24 25 26 27     18 19 20 21 22 23 24
//  23 24 25 26 27 28 29     28 29 30 31              25 26 27 28 29 30 31
//  30
//
// Holidays used (US federal, observed; from memory): Veterans Day Wed 2026-11-11,
// Thanksgiving Thu 2026-11-26, Christmas Fri 2026-12-25, New Year's Day Fri 2027-01-01.

const none = makeCalendar();
const federal = makeCalendar(["2026-11-11", "2026-11-26", "2026-12-25", "2027-01-01"]);

describe("weekends only (no holidays)", () => {
  it("counts from the day after receipt: received Tue Dec 1 + 10 business days = Tue Dec 15", () => {
    // Dec 2, 3, 4 (3) · 7, 8, 9, 10, 11 (8) · 14, 15 (10)
    expect(addBusinessDays("2026-12-01", 10, none)).toBe("2026-12-15");
  });

  it("skips the weekend: received Fri Dec 4 + 5 = Fri Dec 11; + 1 = Mon Dec 7", () => {
    expect(addBusinessDays("2026-12-04", 5, none)).toBe("2026-12-11");
    expect(addBusinessDays("2026-12-04", 1, none)).toBe("2026-12-07");
  });

  it("a receipt on a weekend starts counting on Monday", () => {
    expect(addBusinessDays("2026-12-05", 1, none)).toBe("2026-12-07"); // Sat → Mon
    expect(addBusinessDays("2026-12-06", 5, none)).toBe("2026-12-11"); // Sun → Mon..Fri
  });

  it("a target of 0 days is the receipt day, or the next business day after a weekend receipt", () => {
    expect(addBusinessDays("2026-12-03", 0, none)).toBe("2026-12-03");
    expect(addBusinessDays("2026-12-05", 0, none)).toBe("2026-12-07");
  });

  it("counts business days between two dates, start excluded, end included", () => {
    expect(businessDaysBetween("2026-12-01", "2026-12-15", none)).toBe(10);
    expect(businessDaysBetween("2026-12-05", "2026-12-06", none)).toBe(0); // Sat → Sun
    expect(businessDaysBetween("2026-12-04", "2026-12-07", none)).toBe(1); // Fri → Mon
    expect(businessDaysBetween("2026-12-09", "2026-12-09", none)).toBe(0);
    expect(businessDaysBetween("2026-12-15", "2026-12-01", none)).toBe(-10);
    // Nov 2 → Dec 31, by hand: Nov 3–30 has 20 weekdays, Dec 1–31 has 23
    expect(businessDaysBetween("2026-11-02", "2026-12-31", none)).toBe(43);
  });

  it("names the week Monday to Sunday", () => {
    expect(weekStart("2026-12-03")).toBe("2026-11-30");
    expect(weekEnd("2026-12-03")).toBe("2026-12-06");
    expect(weekStart("2026-12-06")).toBe("2026-11-30"); // a Sunday belongs to the week before
    expect(weekEnd("2026-11-30")).toBe("2026-12-06");
  });
});

describe("holidays", () => {
  it("Thanksgiving is skipped: received Mon Nov 23 + 5 = Tue Dec 1", () => {
    // Tue 24 (1), Wed 25 (2), Thu 26 holiday, Fri 27 (3), Mon 30 (4), Tue Dec 1 (5)
    expect(addBusinessDays("2026-11-23", 5, federal)).toBe("2026-12-01");
    expect(addBusinessDays("2026-11-23", 5, none)).toBe("2026-11-30");
  });

  it("Christmas and New Year's Day are skipped: received Fri Dec 18 + 10 = Tue Jan 5", () => {
    // Dec 21, 22, 23, 24 (4) · 25 holiday · 28, 29, 30, 31 (8) · Jan 1 holiday · Jan 4 (9), 5 (10)
    expect(addBusinessDays("2026-12-18", 10, federal)).toBe("2027-01-05");
    expect(businessDaysBetween("2026-12-18", "2027-01-05", federal)).toBe(10);
    expect(businessDaysBetween("2026-12-18", "2027-01-05", none)).toBe(12);
  });

  it("a mid-week holiday: received Mon Nov 9 + 10 = Tue Nov 24 (Veterans Day skipped)", () => {
    // Nov 10 (1) · 11 holiday · 12, 13 (3) · 16–20 (8) · 23 (9), 24 (10)
    expect(addBusinessDays("2026-11-09", 10, federal)).toBe("2026-11-24");
  });

  it("a holiday that falls on a weekend changes nothing", () => {
    const satHoliday = makeCalendar(["2026-12-05"]);
    expect(businessDaysBetween("2026-12-01", "2026-12-15", satHoliday)).toBe(10);
    expect(addBusinessDays("2026-12-01", 10, satHoliday)).toBe("2026-12-15");
  });

  it("knows the business day before and after a holiday weekend", () => {
    expect(isBusinessDay("2026-12-25", federal)).toBe(false);
    expect(isBusinessDay("2026-12-24", federal)).toBe(true);
    expect(nextBusinessDay("2026-12-24", federal)).toBe("2026-12-28");
    expect(previousBusinessDay("2026-12-28", federal)).toBe("2026-12-24");
    expect(previousBusinessDay("2027-01-04", federal)).toBe("2026-12-31");
  });
});

describe("a due date landing on a holiday moves to the next business day", () => {
  it("counting 5 days from Fri Dec 18 would land on Christmas; the due date is Mon Dec 28", () => {
    // Mon 21 (1), Tue 22 (2), Wed 23 (3), Thu 24 (4); Fri 25 is the fifth weekday but a holiday
    expect(addBusinessDays("2026-12-18", 4, none)).toBe("2026-12-24");
    expect(addBusinessDays("2026-12-18", 5, none)).toBe("2026-12-25");
    expect(addBusinessDays("2026-12-18", 5, federal)).toBe("2026-12-28");
  });

  it("counting 5 days from Thu Nov 19 would land on Thanksgiving; the due date is Fri Nov 27", () => {
    expect(addBusinessDays("2026-11-19", 5, none)).toBe("2026-11-26");
    expect(addBusinessDays("2026-11-19", 5, federal)).toBe("2026-11-27");
  });

  it("a closure declared after the date was set rolls an existing due date forward", () => {
    const snowDay = makeCalendar(["2026-12-11"]);
    expect(rollForward("2026-12-11", snowDay)).toBe("2026-12-14"); // Fri closed → Mon
    expect(rollForward("2026-12-10", snowDay)).toBe("2026-12-10");
    expect(rollForward("2027-01-01", federal)).toBe("2027-01-04"); // Fri holiday → Mon
  });
});

describe("input checks", () => {
  it("refuses what is not a calendar date, with a message naming it", () => {
    expect(isDay("2026-02-29")).toBe(false); // 2026 is not a leap year
    expect(isDay("2028-02-29")).toBe(true);
    expect(isDay("2026-1-5")).toBe(false);
    expect(() => makeCalendar(["2026-13-01"])).toThrow('A holiday must be a calendar date YYYY-MM-DD, got "2026-13-01".');
    expect(() => addBusinessDays("2026-12-01", -1, none)).toThrow("The number of business days must be a whole number ≥ 0, got -1.");
    expect(() => businessDaysBetween("12/01/2026", "2026-12-15", none)).toThrow('The start date must be a calendar date YYYY-MM-DD, got "12/01/2026".');
  });
});
