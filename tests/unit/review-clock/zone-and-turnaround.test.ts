import { describe, expect, it } from "vitest";
import {
  dayInZone,
  DEFAULT_REVIEW_TARGETS,
  endOfDayInZone,
  formatDay,
  formatDayLong,
  makeCalendar,
  median,
  startOfDayInZone,
  turnaround,
  type DecidedCycle,
} from "@/lib/review-clock";

const CHICAGO = "America/Chicago";

describe("department days in America/Chicago", () => {
  // US Central: UTC−6 in standard time, UTC−5 in daylight time; daylight time runs from the
  // second Sunday of March (2026-03-08) to the first Sunday of November (2026-11-01)
  // (Energy Policy Act of 2005 rule; from memory).
  it("names the local date of an instant", () => {
    expect(dayInZone(new Date("2026-12-02T05:30:00Z"), CHICAGO)).toBe("2026-12-01"); // 23:30 CST Dec 1
    expect(dayInZone(new Date("2026-12-02T06:00:00Z"), CHICAGO)).toBe("2026-12-02"); // 00:00 CST
    expect(dayInZone(new Date("2026-07-16T04:59:00Z"), CHICAGO)).toBe("2026-07-15"); // 23:59 CDT
  });

  it("ends a due day at local midnight, standard and daylight time", () => {
    expect(endOfDayInZone("2026-12-15", CHICAGO).toISOString()).toBe("2026-12-16T05:59:59.999Z");
    expect(endOfDayInZone("2026-07-15", CHICAGO).toISOString()).toBe("2026-07-16T04:59:59.999Z");
  });

  it("handles the 23-hour and 25-hour days", () => {
    expect(startOfDayInZone("2026-03-08", CHICAGO).toISOString()).toBe("2026-03-08T06:00:00.000Z");
    expect(startOfDayInZone("2026-03-09", CHICAGO).toISOString()).toBe("2026-03-09T05:00:00.000Z");
    expect(endOfDayInZone("2026-03-08", CHICAGO).toISOString()).toBe("2026-03-09T04:59:59.999Z");
    expect(startOfDayInZone("2026-11-01", CHICAGO).toISOString()).toBe("2026-11-01T05:00:00.000Z");
    expect(startOfDayInZone("2026-11-02", CHICAGO).toISOString()).toBe("2026-11-02T06:00:00.000Z");
  });

  it("agrees with Intl at every quarter hour of 14 months, across both clock changes (more instants than one period's cache)", () => {
    // The reference: the platform's own formatter, asked directly for each instant.
    const ref = new Intl.DateTimeFormat("en-CA", { timeZone: "America/Chicago", year: "numeric", month: "2-digit", day: "2-digit" });
    const from = Date.UTC(2025, 10, 1, 0, 7); // 7 minutes past, so no instant sits on a bucket edge
    const n = 14 * 30 * 96; // ≈ 40,000 quarter hours
    const wrong: string[] = [];
    for (let k = 0; k < n; k++) {
      const at = new Date(from + k * 15 * 60_000);
      if (dayInZone(at) !== ref.format(at)) wrong.push(at.toISOString());
    }
    expect(wrong.slice(0, 5)).toEqual([]);
  });

  it("formats a date without any zone shifting it", () => {
    expect(formatDay("2026-12-15")).toBe("Dec 15, 2026");
    expect(formatDayLong("2026-12-25")).toBe("Friday, December 25, 2026");
  });
});

describe("median", () => {
  it("takes the middle value, or the mean of the two middle values", () => {
    expect(median([7, 1, 3])).toBe(3);
    expect(median([8, 7, 10, 4])).toBe(7.5);
    expect(median([])).toBeNull();
  });
});

describe("department turnaround over a period", () => {
  // Hand-worked on the November–December 2026 calendar, federal holidays 11-11, 11-26, 12-25:
  //   A cycle 1: received Mon Nov 2, due Tue Nov 17, corrections Fri Nov 13 → 8 days, on time
  //   A cycle 2: received Mon Nov 30, due Mon Dec 7, approved Wed Dec 9  → 7 days, late
  //   B cycle 1: received Tue Dec 1, due Tue Dec 15, approved Tue Dec 15  → 10 days, on time
  //   C cycle 1: received Mon Nov 16, due Tue Dec 1, corrections Fri Nov 20 → 4 days (17–20), on time
  //   D cycle 1: withdrawn Fri Dec 4 → not a decision, left out
  // Times are 09:00 CST (15:00Z), well inside the local day.
  const at = (day: string) => new Date(`${day}T15:00:00Z`);
  const cal = makeCalendar(["2026-11-11", "2026-11-26", "2026-12-25"]);
  const cycles: DecidedCycle[] = [
    { applicationId: 1, number: 1, receivedAt: at("2026-11-02"), dueAt: at("2026-11-17"), decidedAt: at("2026-11-13"), outcome: "corrections_issued" },
    { applicationId: 1, number: 2, receivedAt: at("2026-11-30"), dueAt: at("2026-12-07"), decidedAt: at("2026-12-09"), outcome: "approved" },
    { applicationId: 2, number: 1, receivedAt: at("2026-12-01"), dueAt: at("2026-12-15"), decidedAt: at("2026-12-15"), outcome: "approved_with_conditions" },
    { applicationId: 3, number: 1, receivedAt: at("2026-11-16"), dueAt: at("2026-12-01"), decidedAt: at("2026-11-20"), outcome: "corrections_issued" },
    { applicationId: 4, number: 1, receivedAt: at("2026-11-30"), dueAt: at("2026-12-14"), decidedAt: at("2026-12-04"), outcome: "withdrawn" },
  ];
  const approvals = [
    { applicationId: 1, cycles: 2, decidedAt: at("2026-12-09") },
    { applicationId: 2, cycles: 1, decidedAt: at("2026-12-15") },
  ];

  it("reports medians per cycle, on-time share and cycles per approval", () => {
    const t = turnaround({ from: "2026-11-01", to: "2026-12-31", cycles, approvals }, cal, DEFAULT_REVIEW_TARGETS, CHICAGO);
    expect(t.decidedCycles).toBe(4);
    expect(t.medianDays).toBe(7.5); // 4, 7, 8, 10
    expect(t.byCycle).toEqual([
      { group: "1", label: "First review", count: 3, medianDays: 8, targetDays: 10 }, // 4, 8, 10
      { group: "2", label: "Second cycle", count: 1, medianDays: 7, targetDays: 5 },
      { group: "3+", label: "Third cycle and later", count: 0, medianDays: null, targetDays: 5 },
    ]);
    expect(t.onTime).toEqual({ counted: 4, onTime: 3, share: 0.75 });
    expect(t.approvals).toEqual({
      count: 2,
      firstCycleShare: 0.5,
      meanCycles: 1.5,
      distribution: [
        { cycles: "1", count: 1 },
        { cycles: "2", count: 1 },
        { cycles: "3", count: 0 },
        { cycles: "4+", count: 0 },
      ],
    });
    expect(t.byMonth).toEqual([
      { month: "2026-11", decided: 2, onTimeShare: 1, medianDays: 6 }, // 8 and 4
      { month: "2026-12", decided: 2, onTimeShare: 0.5, medianDays: 8.5 }, // 7 and 10
    ]);
  });

  it("keeps only what was decided inside the period", () => {
    const t = turnaround({ from: "2026-12-01", to: "2026-12-31", cycles, approvals }, cal, DEFAULT_REVIEW_TARGETS, CHICAGO);
    expect(t.decidedCycles).toBe(2);
    expect(t.onTime.share).toBe(0.5);
    const empty = turnaround({ from: "2027-02-01", to: "2027-02-28", cycles, approvals }, cal, DEFAULT_REVIEW_TARGETS, CHICAGO);
    expect(empty).toMatchObject({ decidedCycles: 0, medianDays: null, onTime: { share: null }, approvals: { count: 0, firstCycleShare: null, meanCycles: null } });
  });
});
