import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { ClockSummary, type ClockCycle } from "@/components/review-clock/clock-summary";

// The hand-worked file of clock.test.ts, on the November–December 2026 calendar with the
// federal holidays 11-11, 11-26, 12-25 (from memory):
//   cycle 1 received Mon Nov 2, due Tue Nov 17, corrections issued Fri Nov 13 (8 business days)
//   with the applicant until the resubmittal Mon Nov 30 (10 business days)
//   cycle 2 received Mon Nov 30, due Mon Dec 7 (Dec 1, 2, 3, 4, 7)
// Instants are 09:00 US Central (15:00Z); due dates the end of the day (05:59:59.999Z next day).
const holidays = ["2026-11-11", "2026-11-26", "2026-12-25"];
const cycle1: ClockCycle = { number: 1, receivedAt: "2026-11-02T15:00:00.000Z", dueAt: "2026-11-18T05:59:59.999Z", decidedAt: "2026-11-13T15:00:00.000Z" };
const cycle2: ClockCycle = { number: 2, receivedAt: "2026-11-30T15:00:00.000Z", dueAt: "2026-12-08T05:59:59.999Z", decidedAt: null };

const text = (html: string) => html.replace(/<[^>]+>/g, " ").replace(/&#x27;/g, "'").replace(/\s+/g, " ");
const render = (props: Parameters<typeof ClockSummary>[0]) => renderToStaticMarkup(createElement(ClockSummary, props));

describe("ClockSummary", () => {
  it("shows the due date, business days left, and the days on each side", () => {
    const html = render({ cycles: [cycle1, cycle2], state: "in_review", today: "2026-12-01", holidays });
    const t = text(html);
    expect(t).toContain("Cycle 2 due Mon, Dec 7 , 2026");
    expect(t).toContain("4 business days left"); // Dec 2, 3, 4, 7
    expect(html).toContain('data-clock="on_track"');
    expect(html).toMatch(/data-testid="days-with-department">9 business days</); // 8 + Dec 1
    expect(html).toMatch(/data-testid="days-with-applicant">10 business days</);
  });

  it("says overdue in words, with its glyph and colour", () => {
    const html = render({ cycles: [cycle1, cycle2], state: "in_review", today: "2026-12-09", holidays });
    expect(text(html)).toContain("Overdue by 2 business days"); // Dec 8, 9
    expect(html).toContain('data-clock="overdue"');
    expect(html).toContain("text-bad");
    expect(html).toContain("▲");
  });

  it("stops the clock while the corrections are with the applicant", () => {
    const html = render({ cycles: [cycle1], state: "corrections_issued", today: "2026-12-01", holidays });
    expect(text(html)).toContain("Clock stopped");
    expect(text(html)).toContain("Corrections with the applicant since Nov 13, 2026");
    expect(html).toMatch(/data-testid="days-with-department">8 business days</);
    expect(html).toMatch(/data-testid="days-with-applicant">11 business days</); // the 10 to Nov 30, and Dec 1
  });

  it("has not started at intake", () => {
    const html = render({ cycles: [], state: "submitted", today: "2026-12-01" });
    expect(text(html)).toContain("Clock not started");
    expect(text(html)).toContain("The clock starts when intake accepts the file for plan review.");
  });

  it("reports a decided file as decided, on time or not", () => {
    const approved = { ...cycle2, decidedAt: "2026-12-09T15:00:00.000Z" }; // after Mon Dec 7
    const t = text(render({ cycles: [cycle1, approved], state: "approved", today: "2026-12-20", holidays }));
    expect(t).toContain("Decided");
    expect(t).toContain("Cycle 2 decided Dec 9, 2026 , after its due date");
  });
});
