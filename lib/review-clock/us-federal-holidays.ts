import type { Day } from "./calendar";

// The invented city closes on the US federal holidays (5 U.S.C. 6103), observed dates: a
// holiday on a Saturday is observed the Friday before, on a Sunday the Monday after. Listed
// from memory (rules and dates); weekdays checked against a printed calendar. 2025 is included
// because the demo's year of history reaches back into it.
export const US_FEDERAL_HOLIDAYS: readonly { day: Day; name: string }[] = [
  { day: "2025-01-01", name: "New Year's Day" },
  { day: "2025-01-20", name: "Birthday of Martin Luther King, Jr." },
  { day: "2025-02-17", name: "Washington's Birthday" },
  { day: "2025-05-26", name: "Memorial Day" },
  { day: "2025-06-19", name: "Juneteenth National Independence Day" },
  { day: "2025-07-04", name: "Independence Day" },
  { day: "2025-09-01", name: "Labor Day" },
  { day: "2025-10-13", name: "Columbus Day" },
  { day: "2025-11-11", name: "Veterans Day" },
  { day: "2025-11-27", name: "Thanksgiving Day" },
  { day: "2025-12-25", name: "Christmas Day" },
  { day: "2026-01-01", name: "New Year's Day" },
  { day: "2026-01-19", name: "Birthday of Martin Luther King, Jr." },
  { day: "2026-02-16", name: "Washington's Birthday" },
  { day: "2026-05-25", name: "Memorial Day" },
  { day: "2026-06-19", name: "Juneteenth National Independence Day" },
  { day: "2026-07-03", name: "Independence Day (observed)" },
  { day: "2026-09-07", name: "Labor Day" },
  { day: "2026-10-12", name: "Columbus Day" },
  { day: "2026-11-11", name: "Veterans Day" },
  { day: "2026-11-26", name: "Thanksgiving Day" },
  { day: "2026-12-25", name: "Christmas Day" },
  { day: "2027-01-01", name: "New Year's Day" },
  { day: "2027-01-18", name: "Birthday of Martin Luther King, Jr." },
  { day: "2027-02-15", name: "Washington's Birthday" },
  { day: "2027-05-31", name: "Memorial Day" },
  { day: "2027-06-18", name: "Juneteenth National Independence Day (observed)" },
  { day: "2027-07-05", name: "Independence Day (observed)" },
  { day: "2027-09-06", name: "Labor Day" },
  { day: "2027-10-11", name: "Columbus Day" },
  { day: "2027-11-11", name: "Veterans Day" },
  { day: "2027-11-25", name: "Thanksgiving Day" },
  { day: "2027-12-24", name: "Christmas Day (observed)" },
  { day: "2027-12-31", name: "New Year's Day 2028 (observed)" },
];
