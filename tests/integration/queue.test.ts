import { eq, inArray } from "drizzle-orm";
import { NextRequest } from "next/server";
import { beforeEach, describe, expect, it, vi } from "vitest";
import { db, pool } from "@/db/client";
import { countQueue, listQueuePage, queuePageSql, type QueuePageQuery, type QueueSort, type SortDir } from "@/db/queries/queue";
import { applications, assignments, auditEvents, holidays, outbox, reviewCycles } from "@/db/schema";
import { addHoliday, dueDateFor, saveReviewTargets } from "@/lib/review-clock/server";
import { generateQueue } from "@/scripts/generate-queue";
import { insertOpenReview, makeUser, resetDb } from "./db-helpers";

// The route handlers run for real; only the session cookie is replaced by "who is signed in".
const session = vi.hoisted(() => ({ uid: 0 }));
vi.mock("@/lib/auth/config", () => ({ auth: async () => (session.uid ? { uid: session.uid, sv: 1 } : null) }));

const { GET: getQueue } = await import("@/app/api/queue/route");
const { POST: postReassign } = await import("@/app/api/queue/reassign/route");

const base = process.env.APP_URL ?? "http://127.0.0.1:3100";
const ctx = { params: Promise.resolve({}) };
const getJson = async (url: string) => {
  const res = await getQueue(new NextRequest(`${base}${url}`), ctx);
  return { status: res.status, body: (await res.json()) as Record<string, unknown> };
};
const reassign = async (body: unknown) => {
  const res = await postReassign(new NextRequest(`${base}/api/queue/reassign`, { method: "POST", headers: { origin: base, "content-type": "application/json" }, body: JSON.stringify(body) }), ctx);
  return { status: res.status, body: (await res.json()) as Record<string, unknown> };
};

const insertReview = (f: Omit<Parameters<typeof insertOpenReview>[0], "numberPrefix">) => insertOpenReview({ numberPrefix: "LFB-QT", ...f });

beforeEach(async () => {
  await resetDb();
  session.uid = 0;
});

// Due dates are the last millisecond of a day in US Central time (UTC−6 in December):
// the end of Mon Nov 30 is 2026-12-01T05:59:59.999Z, and so on.
const endOf = (isoDay: string) => new Date(new Date(`${isoDay}T06:00:00Z`).getTime() + 86_400_000 - 1);
// "Now" for the filters: Wed Dec 2, 2026, 12:00 CST. The week ends Sun Dec 6 (calendar, Mon–Sun).
const NOW = new Date("2026-12-02T18:00:00Z");
const WEEK_ENDS = endOf("2026-12-06");

describe("queue filters", () => {
  it("filters by examiner, state, overdue and due this week", async () => {
    const applicant = await makeUser("applicant");
    const henrik = await makeUser("examiner");
    const priya = await makeUser("examiner");
    const ids = {
      overdueH: await insertReview({ applicantId: applicant.id, examinerId: henrik.id, dueAt: endOf("2026-11-30") }),
      overdueP: await insertReview({ applicantId: applicant.id, examinerId: priya.id, dueAt: endOf("2026-12-01"), state: "resubmitted" }),
      todayH: await insertReview({ applicantId: applicant.id, examinerId: henrik.id, dueAt: endOf("2026-12-02") }),
      fridayP: await insertReview({ applicantId: applicant.id, examinerId: priya.id, dueAt: endOf("2026-12-04") }),
      nextWeekH: await insertReview({ applicantId: applicant.id, examinerId: henrik.id, dueAt: endOf("2026-12-08"), state: "resubmitted" }),
      noDateP: await insertReview({ applicantId: applicant.id, examinerId: priya.id, dueAt: null }),
      // Not open reviews: never in the queue, however late.
      withApplicant: await insertReview({ applicantId: applicant.id, examinerId: henrik.id, dueAt: endOf("2026-11-20"), state: "corrections_issued" }),
      closed: await insertReview({ applicantId: applicant.id, examinerId: henrik.id, dueAt: endOf("2026-11-20"), state: "approved" }),
    };
    const q = (over: Partial<QueuePageQuery>): QueuePageQuery => ({ states: ["in_review", "resubmitted"], now: NOW, weekEndsAt: WEEK_ENDS, sort: "due", dir: "asc", limit: 50, ...over });
    const idsOf = async (over: Partial<QueuePageQuery>) => (await listQueuePage(db(), q(over))).rows.map((r) => r.id);

    // Ascending by due date; the review without a date sorts first (MariaDB: NULL first ascending).
    expect(await idsOf({})).toEqual([ids.noDateP, ids.overdueH, ids.overdueP, ids.todayH, ids.fridayP, ids.nextWeekH]);
    expect(await idsOf({ examinerId: henrik.id })).toEqual([ids.overdueH, ids.todayH, ids.nextWeekH]);
    expect(await idsOf({ states: ["resubmitted"] })).toEqual([ids.overdueP, ids.nextWeekH]);
    expect(await idsOf({ due: "overdue" })).toEqual([ids.overdueH, ids.overdueP]);
    expect(await idsOf({ due: "this_week" })).toEqual([ids.todayH, ids.fridayP]);
    expect(await idsOf({ due: "overdue", examinerId: priya.id })).toEqual([ids.overdueP]);
    expect(await countQueue(db(), q({}))).toEqual({ n: 6, capped: false });
    expect(await countQueue(db(), q({ due: "overdue" }))).toEqual({ n: 2, capped: false });
    // Counting stops at the cap, so a huge queue costs no more to count than a small one.
    expect(await countQueue(db(), q({}), 4)).toEqual({ n: 4, capped: true });
    expect(await countQueue(db(), q({}), 6)).toEqual({ n: 6, capped: false });
  });
});

describe("keyset pages", () => {
  it("walks every sort and direction in pages without duplicates or gaps, ties and missing dates included", async () => {
    const applicant = await makeUser("applicant");
    const e1 = await makeUser("examiner");
    const e2 = await makeUser("examiner");
    // 9 distinct due instants and some without a date, so many rows tie on the sort key.
    const dues = [null, ...Array.from({ length: 9 }, (_, i) => endOf(`2026-11-${String(16 + i).padStart(2, "0")}`))];
    const fixture: { id: number; examinerId: number; due: Date | null; received: Date }[] = [];
    for (let i = 0; i < 83; i++) {
      const due = dues[(i * 7) % dues.length] ?? null;
      const received = new Date(Date.UTC(2026, 10, 1 + ((i * 5) % 13), 15));
      const examinerId = i % 3 === 0 ? e2.id : e1.id;
      const id = await insertReview({ applicantId: applicant.id, examinerId, dueAt: due, receivedAt: received, state: i % 4 === 0 ? "resubmitted" : "in_review" });
      fixture.push({ id, examinerId, due, received });
    }

    // The order promised: key ascending with NULL first (or the reverse), then id in the same direction.
    const expected = (sort: QueueSort, dir: SortDir, rows = fixture) =>
      [...rows]
        .sort((a, b) => {
          const ka = sort === "number" ? a.id : sort === "due" ? a.due?.getTime() ?? null : a.received.getTime();
          const kb = sort === "number" ? b.id : sort === "due" ? b.due?.getTime() ?? null : b.received.getTime();
          const c = ka === kb ? 0 : ka === null ? -1 : kb === null ? 1 : ka - kb;
          return (dir === "asc" ? 1 : -1) * (c || a.id - b.id);
        })
        .map((r) => r.id);

    for (const sort of ["due", "received", "number"] as const) {
      for (const dir of ["asc", "desc"] as const) {
        for (const examinerId of [undefined, e1.id]) {
          const seen: number[] = [];
          let after: QueuePageQuery["after"];
          for (let guard = 0; guard < 50; guard++) {
            const page = await listQueuePage(db(), { states: ["in_review", "resubmitted"], examinerId, now: NOW, weekEndsAt: WEEK_ENDS, sort, dir, after, limit: 10 });
            seen.push(...page.rows.map((r) => r.id));
            if (!page.hasMore) break;
            const last = page.rows.at(-1)!;
            const key = sort === "number" ? String(last.id) : sort === "due" ? (last.dueAt?.toISOString() ?? null) : (last.receivedAt?.toISOString() ?? null);
            after = { key, id: last.id };
          }
          const want = expected(sort, dir, examinerId ? fixture.filter((f) => f.examinerId === examinerId) : fixture);
          expect(new Set(seen).size, `${sort} ${dir} ${examinerId ?? "all"}: duplicates`).toBe(seen.length);
          expect(seen, `${sort} ${dir} ${examinerId ?? "all"}`).toEqual(want);
        }
      }
    }
  });

  it("hands out a cursor through the API that gives the next page, and refuses a cursor of another sort", async () => {
    const supervisor = await makeUser("supervisor");
    const applicant = await makeUser("applicant");
    const examiner = await makeUser("examiner");
    const made: number[] = [];
    for (let i = 0; i < 25; i++) made.push(await insertReview({ applicantId: applicant.id, examinerId: examiner.id, dueAt: endOf(`2026-12-${String(1 + (i % 20)).padStart(2, "0")}`) }));
    session.uid = supervisor.id;
    const first = await getJson("/api/queue?limit=10");
    expect(first.status).toBe(200);
    expect(first.body.total).toEqual({ n: 25, capped: false });
    const rows1 = first.body.rows as { id: number; dueDay: string; examiner: { name: string } }[];
    expect(rows1).toHaveLength(10);
    expect(rows1[0]).toMatchObject({ dueDay: "2026-12-01", examiner: { name: examiner.name } });
    const second = await getJson(`/api/queue?limit=10&cursor=${first.body.nextCursor as string}`);
    const third = await getJson(`/api/queue?limit=10&cursor=${second.body.nextCursor as string}`);
    expect(third.body.nextCursor).toBeNull();
    const all = [...rows1, ...(second.body.rows as { id: number }[]), ...(third.body.rows as { id: number }[])].map((r) => r.id);
    expect(new Set(all)).toEqual(new Set(made));
    expect(all).toHaveLength(25);
    const wrong = await getJson(`/api/queue?limit=10&sort=number&cursor=${first.body.nextCursor as string}`);
    expect(wrong.status).toBe(422);
  });

  it("answers 401 signed out and 403 to anyone but a supervising examiner", async () => {
    expect((await getJson("/api/queue")).status).toBe(401);
    for (const role of ["examiner", "applicant", "technician", "admin"] as const) {
      session.uid = (await makeUser(role)).id;
      expect((await getJson("/api/queue")).status, role).toBe(403);
    }
  });
});

describe("the queue at scale uses its indexes", () => {
  it("reads the first page, a deep page and a filtered page off an index, without a filesort", async () => {
    await makeUser("applicant");
    const examiners = [await makeUser("examiner"), await makeUser("examiner"), await makeUser("supervisor")];
    const r = await generateQueue(db(), 20_000, { now: NOW });
    expect(r.inserted).toBe(20_000);

    // ANALYZE runs the statement and reports the plan actually used, with the rows read (r_rows).
    const analyze = async (q: QueuePageQuery) => {
      const { sql, params } = queuePageSql(db(), q);
      const [rows] = await pool().query(`ANALYZE ${sql}`, params);
      return rows as { select_type: string; table: string; key: string | null; r_rows: number | null; Extra: string | null }[];
    };
    const base: QueuePageQuery = { states: ["in_review", "resubmitted"], now: NOW, weekEndsAt: WEEK_ENDS, sort: "due", dir: "asc", limit: 50 };
    const deep = await listQueuePage(db(), { ...base, limit: 100 });
    const cursorRow = deep.rows.at(-1)!;
    const cursor = { key: cursorRow.dueAt?.toISOString() ?? null, id: cursorRow.id };
    const cases: [string, QueuePageQuery, string][] = [
      ["first page", base, "applications_queue_due_idx"],
      ["deep page", { ...base, after: cursor }, "applications_queue_due_idx"],
      ["descending", { ...base, dir: "desc" }, "applications_queue_due_idx"],
      ["overdue", { ...base, due: "overdue" }, "applications_queue_due_idx"],
      ["resubmitted only", { ...base, states: ["resubmitted"] }, "applications_queue_due_idx"],
      ["one examiner", { ...base, examinerId: examiners[0]!.id }, "applications_examiner_due_idx"],
      ["one examiner, overdue, deep", { ...base, examinerId: examiners[1]!.id, due: "overdue", after: cursor }, "applications_examiner_due_idx"],
    ];
    for (const [name, q, index] of cases) {
      const plan = await analyze(q);
      const reads = plan.filter((p) => p.table === "applications");
      expect(reads, `${name}: one read per state`).toHaveLength(q.states.length);
      for (const p of reads) {
        expect(p.key, `${name}: ${JSON.stringify(plan)}`).toBe(index);
        // Stops after the page (limit + 1 rows), however many thousands match.
        expect(Number(p.r_rows), `${name}: rows read`).toBeLessThanOrEqual(q.limit + 1);
      }
      for (const p of plan) expect(p.Extra ?? "", `${name} ${p.select_type} ${p.table}`).not.toMatch(/filesort|temporary/i);
    }
  });
});

describe("reassigning from the queue", () => {
  async function scene() {
    const supervisor = await makeUser("supervisor");
    const applicant = await makeUser("applicant");
    const from = await makeUser("examiner");
    const to = await makeUser("examiner");
    const a = await insertReview({ applicantId: applicant.id, examinerId: from.id, dueAt: endOf("2026-11-30") });
    const b = await insertReview({ applicantId: applicant.id, examinerId: from.id, dueAt: endOf("2026-12-01"), state: "resubmitted" });
    const closed = await insertReview({ applicantId: applicant.id, examinerId: from.id, state: "approved" });
    return { supervisor, applicant, from, to, a, b, closed };
  }

  it("moves two reviews with a reason: audit with the reason kept internal, e-mail to old and new examiner", async () => {
    const s = await scene();
    session.uid = s.supervisor.id;
    const reason = "Balancing the queue: Henrik is out Thursday and Friday.";
    const r = await reassign({ applicationIds: [s.a, s.b, s.closed], examinerId: s.to.id, reason });
    expect(r.status).toBe(200);
    expect(r.body.reassigned).toBe(2);
    const results = r.body.results as { applicationId: number; ok: boolean; code?: string }[];
    expect(results.map((x) => [x.applicationId, x.ok])).toEqual([[s.a, true], [s.b, true], [s.closed, false]]);
    expect(results[2]?.code).toBe("invalid_transition");

    const rows = await db().select().from(applications).where(inArray(applications.id, [s.a, s.b]));
    for (const row of rows) expect(row).toMatchObject({ assignedExaminerId: s.to.id, version: 2 });
    const cycles = await db().select().from(reviewCycles).where(inArray(reviewCycles.applicationId, [s.a, s.b]));
    for (const c of cycles) expect(c.examinerId).toBe(s.to.id);
    const open = await db().select().from(assignments).where(inArray(assignments.applicationId, [s.a, s.b]));
    expect(open.filter((x) => x.endedAt === null).map((x) => [x.examinerId, x.reason])).toEqual([[s.to.id, reason], [s.to.id, reason]]);

    const audit = await db().select().from(auditEvents).where(eq(auditEvents.action, "review.reassigned"));
    expect(audit).toHaveLength(2);
    for (const e of audit) {
      expect(e.actorId).toBe(s.supervisor.id);
      expect(e.summary).toBe(`Review reassigned from ${s.from.name} to ${s.to.name}.`);
      expect(e.summary).not.toContain("Balancing");
      expect((e.detail as { input: { reason: string } }).input.reason).toBe(reason);
    }
    const mail = await db().select().from(outbox);
    const to = (addr: string) => mail.filter((m) => m.toAddress === addr).map((m) => m.template).sort();
    expect(to(s.to.email)).toEqual(["review.assigned", "review.assigned"]);
    expect(to(s.from.email)).toEqual(["review.reassigned_away", "review.reassigned_away"]);
    expect(mail.some((m) => m.textBody.includes("Balancing"))).toBe(false);
  });

  it("reports a review already with that examiner as unchanged and sends nothing for it", async () => {
    const s = await scene();
    session.uid = s.supervisor.id;
    const r = await reassign({ applicationIds: [s.a], examinerId: s.from.id, reason: "Back to the first examiner." });
    expect((r.body.results as { code: string }[])[0]?.code).toBe("unchanged");
    expect(await db().select().from(outbox)).toHaveLength(0);
  });

  it("answers 403 to an examiner or an applicant and changes nothing", async () => {
    const s = await scene();
    for (const who of [s.from, s.applicant]) {
      session.uid = who.id;
      const r = await reassign({ applicationIds: [s.a], examinerId: s.to.id, reason: "I would rather not." });
      expect(r.status).toBe(403);
      expect((r.body.error as { code: string }).code).toBe("forbidden");
    }
    const [row] = await db().select().from(applications).where(eq(applications.id, s.a));
    expect(row?.assignedExaminerId).toBe(s.from.id);
    expect(await db().select().from(outbox)).toHaveLength(0);
  });

  it("refuses an examiner who is not an active plans examiner, and a missing reason", async () => {
    const s = await scene();
    session.uid = s.supervisor.id;
    const notExaminer = await reassign({ applicationIds: [s.a], examinerId: s.applicant.id, reason: "Wrong person." });
    expect(notExaminer.status).toBe(422);
    const noReason = await reassign({ applicationIds: [s.a], examinerId: s.to.id, reason: " " });
    expect(noReason.status).toBe(422);
    expect((noReason.body.error as { fields: Record<string, string> }).fields.reason).toMatch(/reason/);
  });
});

describe("the review clock's settings", () => {
  it("dates a cycle from the saved targets and the holiday calendar, in the department's days", async () => {
    // US federal holidays (observed, from memory): Thanksgiving Thu 2026-11-26, Christmas Fri 2026-12-25, New Year's Day Fri 2027-01-01.
    await db().insert(holidays).values([
      { day: "2026-11-26", name: "Thanksgiving Day" },
      { day: "2026-12-25", name: "Christmas Day" },
      { day: "2027-01-01", name: "New Year's Day" },
    ]);
    // No saved targets: 10 and 5 business days. Resubmittal received Mon Nov 23, 09:00 CST:
    // Tue 24, Wed 25, (Thu 26 holiday), Fri 27, Mon 30, Tue Dec 1 → due by the end of Tue Dec 1 (CST = UTC−6).
    expect((await dueDateFor(db(), new Date("2026-11-23T15:00:00Z"), 2)).toISOString()).toBe("2026-12-02T05:59:59.999Z");
    const admin = await makeUser("admin");
    await saveReviewTargets(db(), admin, { firstReviewDays: 15, resubmittalDays: 7 });
    // First review received Fri Dec 18 at 21:00 CST (03:00Z on the 19th: still the 18th in Larkspur Falls).
    // Dec 21–24 (4), (25), 28–31 (8), (Jan 1), Jan 4–8 (13), 11, 12 (15) → Tue Jan 12, 2027.
    expect((await dueDateFor(db(), new Date("2026-12-19T03:00:00Z"), 1)).toISOString()).toBe("2027-01-13T05:59:59.999Z");
    const audit = await db().select().from(auditEvents).where(eq(auditEvents.action, "settings.review_targets"));
    expect(audit[0]?.summary).toBe("Review targets set to 15 business days for a first review and 7 for a resubmittal.");
  });

  it("moves an open review's due date off a newly declared closure day, and leaves the rest", async () => {
    const admin = await makeUser("admin");
    const applicant = await makeUser("applicant");
    const examiner = await makeUser("examiner");
    const open = await insertReview({ applicantId: applicant.id, examinerId: examiner.id, dueAt: endOf("2026-12-11") });
    const withApplicant = await insertReview({ applicantId: applicant.id, examinerId: examiner.id, dueAt: endOf("2026-12-11"), state: "corrections_issued" });
    const otherDay = await insertReview({ applicantId: applicant.id, examinerId: examiner.id, dueAt: endOf("2026-12-10") });
    const r = await addHoliday(db(), admin, "2026-12-11", "Office closed: ice storm");
    expect(r).toEqual({ created: true, moved: 1 });
    const due = async (id: number) => (await db().select().from(applications).where(eq(applications.id, id)))[0]?.dueAt?.toISOString();
    expect(await due(open)).toBe(endOf("2026-12-14").toISOString()); // Fri closed → Mon
    expect(await due(withApplicant)).toBe(endOf("2026-12-11").toISOString());
    expect(await due(otherDay)).toBe(endOf("2026-12-10").toISOString());
    const [cycle] = await db().select().from(reviewCycles).where(eq(reviewCycles.applicationId, open));
    expect(cycle?.dueAt?.toISOString()).toBe(endOf("2026-12-14").toISOString());
    const [moved] = await db().select().from(auditEvents).where(eq(auditEvents.action, "review.due_date_moved"));
    expect(moved?.summary).toBe("Due date of review cycle 1 moved from 2026-12-11 to 2026-12-14: the department is closed on 2026-12-11 (Office closed: ice storm).");
    await expect(addHoliday(db(), await makeUser("supervisor"), "2026-12-24", "Christmas Eve")).rejects.toMatchObject({ code: "forbidden" });
  });
});
