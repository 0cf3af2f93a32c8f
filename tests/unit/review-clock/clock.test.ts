import { describe, expect, it } from "vitest";
import {
  clockStatus,
  clockTotals,
  clockWords,
  DEFAULT_REVIEW_TARGETS,
  dueDayFor,
  makeCalendar,
  parseReviewTargets,
  remindersOwed,
  targetDays,
} from "@/lib/review-clock";

// Calendars as in business-days.test.ts (November 2026 – January 2027), counted by hand:
//     November 2026            December 2026
//  Mo Tu We Th Fr Sa Su     Mo Tu We Th Fr Sa Su
//                     1         1  2  3  4  5  6
//   2  3  4  5  6  7  8      7  8  9 10 11 12 13
//   9 10 11 12 13 14 15     14 15 16 17 18 19 20
//  16 17 18 19 20 21 22     21 22 23 24 25 26 27
//  23 24 25 26 27 28 29     28 29 30 31
//  30
// Holidays (US federal, observed; from memory): 2026-11-11, 2026-11-26, 2026-12-25, 2027-01-01.
const federal = makeCalendar(["2026-11-11", "2026-11-26", "2026-12-25", "2027-01-01"]);

describe("targets per cycle type", () => {
  it("uses the first-review target for cycle 1 and the resubmittal target after", () => {
    // Defaults: 10 and 5 business days (published targets run 10–15 and 5–10; domain notes, seen at several departments)
    expect(DEFAULT_REVIEW_TARGETS).toEqual({ firstReviewDays: 10, resubmittalDays: 5 });
    expect(targetDays(1, DEFAULT_REVIEW_TARGETS)).toBe(10);
    expect(targetDays(2, DEFAULT_REVIEW_TARGETS)).toBe(5);
    expect(targetDays(4, DEFAULT_REVIEW_TARGETS)).toBe(5);
  });

  it("falls back to the defaults field by field when the stored value is unusable", () => {
    expect(parseReviewTargets({ firstReviewDays: 15, resubmittalDays: "x" })).toEqual({ firstReviewDays: 15, resubmittalDays: 5 });
    expect(parseReviewTargets(null)).toEqual({ firstReviewDays: 10, resubmittalDays: 5 });
    expect(parseReviewTargets({ firstReviewDays: 0, resubmittalDays: 7 })).toEqual({ firstReviewDays: 10, resubmittalDays: 7 });
  });

  it("dates a first review received Mon Nov 2 to Tue Nov 17 (Veterans Day skipped)", () => {
    // Nov 3, 4, 5, 6 (4) · 9, 10 (6) · 11 holiday · 12, 13 (8) · 16, 17 (10)
    expect(dueDayFor("2026-11-02", 1, DEFAULT_REVIEW_TARGETS, federal)).toBe("2026-11-17");
    // resubmittal received Mon Nov 30: Dec 1, 2, 3, 4, 7
    expect(dueDayFor("2026-11-30", 2, DEFAULT_REVIEW_TARGETS, federal)).toBe("2026-12-07");
  });
});

describe("where a running clock stands", () => {
  const due = "2026-12-15"; // Tue

  it("counts business days left, the due date counted and today not", () => {
    expect(clockStatus(due, "2026-12-01", federal)).toEqual({ kind: "on_track", dueDay: due, businessDaysLeft: 10, businessDaysOverdue: null });
    expect(clockStatus(due, "2026-12-12", federal)).toMatchObject({ kind: "on_track", businessDaysLeft: 2 }); // Sat: Mon 14, Tue 15
    expect(clockStatus(due, "2026-12-14", federal)).toMatchObject({ kind: "due_soon", businessDaysLeft: 1 });
    expect(clockStatus(due, "2026-12-15", federal)).toMatchObject({ kind: "due_today", businessDaysLeft: 0 });
  });

  it("counts business days overdue from the day after the due date", () => {
    expect(clockStatus(due, "2026-12-16", federal)).toMatchObject({ kind: "overdue", businessDaysOverdue: 1 });
    expect(clockStatus(due, "2026-12-19", federal)).toMatchObject({ kind: "overdue", businessDaysOverdue: 3 }); // Sat: 16, 17, 18
    // 16, 17, 18, 21, 22, 23, 24, (25 holiday), 28
    expect(clockStatus(due, "2026-12-28", federal)).toMatchObject({ kind: "overdue", businessDaysOverdue: 8 });
    // Due Fri Dec 11, looked at on Sat Dec 12: past the date, no business day lost yet
    expect(clockStatus("2026-12-11", "2026-12-12", federal)).toMatchObject({ kind: "overdue", businessDaysOverdue: 0 });
  });

  it("says it in words", () => {
    expect(clockWords(clockStatus(due, "2026-12-01", federal))).toBe("10 business days left");
    expect(clockWords(clockStatus(due, "2026-12-14", federal))).toBe("1 business day left");
    expect(clockWords(clockStatus(due, "2026-12-15", federal))).toBe("Due today");
    expect(clockWords(clockStatus(due, "2026-12-16", federal))).toBe("Overdue by 1 business day");
    expect(clockWords(clockStatus("2026-12-11", "2026-12-12", federal))).toBe("Overdue");
    expect(clockWords(clockStatus(null, "2026-12-12", federal))).toBe("No due date set");
  });
});

describe("the clock stops while corrections are with the applicant", () => {
  // Cycle 1: received Mon Nov 2, due Tue Nov 17, corrections issued Fri Nov 13.
  //   With the department: Nov 3, 4, 5, 6, 9, 10, (11 holiday), 12, 13 = 8 business days; on time.
  // With the applicant: Nov 13 → resubmitted Mon Nov 30:
  //   16–20 (5), 23, 24, 25 (8), (26 holiday), 27 (9), 30 (10) = 10 business days.
  // Cycle 2: received Mon Nov 30, due Mon Dec 7, approved Wed Dec 9.
  //   With the department: Dec 1, 2, 3, 4, 7, 8, 9 = 7 business days; late (Dec 9 after Dec 7).
  const cycle1 = { number: 1, receivedDay: "2026-11-02", dueDay: "2026-11-17", decidedDay: "2026-11-13" };
  const cycle2 = { number: 2, receivedDay: "2026-11-30", dueDay: "2026-12-07", decidedDay: "2026-12-09" };

  it("splits a finished file into days with the department and days with the applicant", () => {
    const t = clockTotals([cycle2, cycle1], "2026-12-20", federal, false);
    expect(t.departmentDays).toBe(15);
    expect(t.applicantDays).toBe(10);
    expect(t.cycles).toEqual([
      { number: 1, departmentDays: 8, applicantDaysAfter: 10, running: false, onTime: true },
      { number: 2, departmentDays: 7, applicantDaysAfter: 0, running: false, onTime: false },
    ]);
  });

  it("keeps counting the applicant's days while corrections are still out", () => {
    // Nov 13 → Tue Dec 1: the 10 days above plus Dec 1
    const t = clockTotals([cycle1], "2026-12-01", federal, true);
    expect(t).toMatchObject({ departmentDays: 8, applicantDays: 11 });
  });

  it("counts a running resubmittal review up to today", () => {
    const running = { ...cycle2, decidedDay: null };
    // Cycle 2 from Nov 30 to Tue Dec 1 = 1 business day; total 8 + 1
    const t = clockTotals([cycle1, running], "2026-12-01", federal, false);
    expect(t).toMatchObject({ departmentDays: 9, applicantDays: 10 });
    expect(t.cycles[1]).toMatchObject({ running: true, onTime: null });
  });
});

describe("reminders owed", () => {
  it("owes the examiner a reminder on the business day before the due date", () => {
    const due = "2026-12-07"; // Mon; the business day before is Fri Dec 4
    expect(remindersOwed(due, "2026-12-03", federal)).toEqual([]);
    expect(remindersOwed(due, "2026-12-04", federal)).toEqual(["due_tomorrow"]);
    expect(remindersOwed(due, "2026-12-05", federal)).toEqual(["due_tomorrow"]); // a job that missed Friday catches up
    expect(remindersOwed(due, "2026-12-07", federal)).toEqual([]);
  });

  it("looks past a holiday for the business day before", () => {
    // Due Mon Dec 28: Fri Dec 25 is Christmas, so the reminder comes Thu Dec 24
    expect(remindersOwed("2026-12-28", "2026-12-23", federal)).toEqual([]);
    expect(remindersOwed("2026-12-28", "2026-12-24", federal)).toEqual(["due_tomorrow"]);
  });

  it("owes the supervisors a notice once the due date has passed", () => {
    expect(remindersOwed("2026-12-07", "2026-12-08", federal)).toEqual(["overdue"]);
    expect(remindersOwed(null, "2026-12-08", federal)).toEqual([]);
  });
});
