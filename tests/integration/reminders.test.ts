import { eq } from "drizzle-orm";
import { beforeEach, describe, expect, it } from "vitest";
import { closeDb, db } from "@/db/client";
import { applications, holidays, outbox, remindersSent, reviewCycles, users } from "@/db/schema";
import { runReminders } from "@/lib/review-clock/reminders";
import { insertOpenReview, makeUser, resetDb } from "./db-helpers";

const insertReview = (f: Omit<Parameters<typeof insertOpenReview>[0], "numberPrefix">) => insertOpenReview({ numberPrefix: "LFB-RM", ...f });

// Due dates are the last millisecond of a day in US Central time (UTC−6 in December).
const endOf = (isoDay: string) => new Date(new Date(`${isoDay}T06:00:00Z`).getTime() + 86_400_000 - 1);
// Fri Dec 4, 2026, 09:00 CST. Calendar: Mon Dec 7 is the next business day; Tue Dec 1 was three business days ago (Dec 2, 3, 4).
const FRIDAY_MORNING = new Date("2026-12-04T15:00:00Z");

beforeEach(resetDb);

async function scene() {
  const applicant = await makeUser("applicant");
  const examiner = await makeUser("examiner", undefined, "Henrik Alvarado");
  const gwen = await makeUser("supervisor", undefined, "Gwen Tanaka");
  const ines = await makeUser("supervisor", undefined, "Ines Oduya");
  const gone = await makeUser("supervisor", undefined, "Former Supervisor");
  await db().update(users).set({ status: "deactivated" }).where(eq(users.id, gone.id));
  const dueMonday = await insertReview({ applicantId: applicant.id, examinerId: examiner.id, dueAt: endOf("2026-12-07") });
  const overdue = await insertReview({ applicantId: applicant.id, examinerId: examiner.id, dueAt: endOf("2026-12-01"), state: "resubmitted", cycle: 2 });
  const later = await insertReview({ applicantId: applicant.id, examinerId: examiner.id, dueAt: endOf("2026-12-11") });
  // With the applicant: the clock is stopped, so no reminder however old the date.
  const stopped = await insertReview({ applicantId: applicant.id, examinerId: examiner.id, dueAt: endOf("2026-11-20"), state: "corrections_issued" });
  return { applicant, examiner, gwen, ines, gone, dueMonday, overdue, later, stopped };
}

describe("reminders", () => {
  it("run twice over the same day: one e-mail per review and recipient", async () => {
    const s = await scene();
    const first = await runReminders(db(), FRIDAY_MORNING);
    expect(first).toEqual({ dueTomorrow: 1, overdue: 1, alreadySent: 0 });
    const second = await runReminders(db(), new Date(FRIDAY_MORNING.getTime() + 6 * 3_600_000));
    expect(second).toEqual({ dueTomorrow: 0, overdue: 0, alreadySent: 0 });

    const mail = await db().select().from(outbox);
    expect(mail.map((m) => [m.template, m.toAddress, m.applicationId]).sort()).toEqual(
      [
        ["reminder.due_tomorrow", s.examiner.email, s.dueMonday],
        ["reminder.overdue", s.gwen.email, s.overdue],
        ["reminder.overdue", s.ines.email, s.overdue],
      ].sort(),
    );
    const sent = await db().select().from(remindersSent);
    expect(sent.map((r) => [r.applicationId, r.cycle, r.kind]).sort()).toEqual([[s.dueMonday, 1, "due_tomorrow"], [s.overdue, 2, "overdue"]].sort());
  });

  it("writes in the department's voice, with the dates and what to do", async () => {
    const s = await scene();
    await runReminders(db(), FRIDAY_MORNING);
    const [toExaminer] = await db().select().from(outbox).where(eq(outbox.template, "reminder.due_tomorrow"));
    const [app] = await db().select().from(applications).where(eq(applications.id, s.dueMonday));
    expect(toExaminer?.subject).toBe(`Due Monday, December 7, 2026: ${app?.number} — ${app?.siteAddress}`);
    expect(toExaminer?.textBody).toContain("Dear Henrik Alvarado,");
    expect(toExaminer?.textBody).toContain("is due by the end of Monday, December 7, 2026, the next business day");
    expect(toExaminer?.textBody).toContain(`/applications/${s.dueMonday}`);
    const [toGwen] = await db().select().from(outbox).where(eq(outbox.toAddress, s.gwen.email));
    expect(toGwen?.subject).toMatch(/^Overdue: LFB-RM-\d{5} — due Tuesday, December 1, 2026, with Henrik Alvarado$/);
    expect(toGwen?.textBody).toContain("resubmittal review (cycle 2)");
    expect(toGwen?.textBody).toContain("3 business days past it"); // Dec 2, 3, 4
    expect(toGwen?.textBody).toContain("/queue?due=overdue");
  });

  it("sends nothing again after a restart, and nothing twice when two workers run at once", async () => {
    await scene();
    await Promise.all([runReminders(db(), FRIDAY_MORNING), runReminders(db(), FRIDAY_MORNING)]);
    expect(await db().select().from(outbox)).toHaveLength(3);
    await closeDb(); // a restart: new pool, no memory of the last run
    const after = await runReminders(db(), new Date(FRIDAY_MORNING.getTime() + 3_600_000));
    expect(after).toEqual({ dueTomorrow: 0, overdue: 0, alreadySent: 0 });
    expect(await db().select().from(outbox)).toHaveLength(3);
  });

  it("reminds again for a new cycle, which has its own due date", async () => {
    const s = await scene();
    await runReminders(db(), FRIDAY_MORNING);
    // The overdue file was decided and resubmitted: cycle 3, due Thu Dec 10; on Wed Dec 9 its examiner hears.
    await db().update(applications).set({ cycle: 3, dueAt: endOf("2026-12-10") }).where(eq(applications.id, s.overdue));
    await db().insert(reviewCycles).values({ applicationId: s.overdue, number: 3, examinerId: s.examiner.id, receivedAt: new Date("2026-12-03T15:00:00Z"), dueAt: endOf("2026-12-10") });
    const wednesday = await runReminders(db(), new Date("2026-12-09T15:00:00Z"));
    // Dec 9: cycle 3 of the overdue file is due tomorrow; the Monday file is now overdue; the Dec 11 file is due in two days.
    expect(wednesday).toEqual({ dueTomorrow: 1, overdue: 1, alreadySent: 0 });
  });

  it("looks past a holiday for the business day before", async () => {
    const applicant = await makeUser("applicant");
    const examiner = await makeUser("examiner");
    await db().insert(holidays).values({ day: "2026-12-25", name: "Christmas Day" }); // US federal, Fri 2026 (from memory)
    await insertReview({ applicantId: applicant.id, examinerId: examiner.id, dueAt: endOf("2026-12-28") });
    // Wed Dec 23: two business days ahead (24, 28): nothing yet. Thu Dec 24: Christmas makes Monday the next business day.
    expect(await runReminders(db(), new Date("2026-12-23T15:00:00Z"))).toMatchObject({ dueTomorrow: 0 });
    expect(await runReminders(db(), new Date("2026-12-24T15:00:00Z"))).toMatchObject({ dueTomorrow: 1 });
  });
});
