// Makes N applications (default 100,000) for the queue benchmark, in multi-row INSERTs, into the
// database named by DATABASE_URL:  npx tsx --conditions=react-server scripts/generate-queue.ts 100000
// Rows are the shape the workflow leaves (state, cycle, examiner, current cycle with its
// received and due dates), without documents, comments or audit lines.
import { and, eq, inArray, sql } from "drizzle-orm";
import { randomInt, seededRandom } from "@/lib/seeded-random";
import type { Db } from "@/db/client";
import { applications, reviewCycles, users } from "@/db/schema";
import { applicationNumber } from "@/lib/applications/service";
import { addBusinessDays, dayInZone, endOfDayInZone, makeCalendar, shiftDays, startOfDayInZone, US_FEDERAL_HOLIDAYS } from "@/lib/review-clock";

type State = (typeof applications.$inferInsert)["state"];

// Share of each state among generated files: half of them open reviews, so deep pages are deep.
const MIX: [NonNullable<State>, number][] = [
  ["in_review", 0.4],
  ["resubmitted", 0.1],
  ["corrections_issued", 0.1],
  ["submitted", 0.03],
  ["approved", 0.27],
  ["approved_with_conditions", 0.07],
  ["withdrawn", 0.02],
  ["draft", 0.01],
];

const CHUNK = 2_000;

export interface GenerateResult {
  inserted: number;
  firstId: number;
  lastId: number;
  ms: number;
}

export async function generateQueue(database: Db, n: number, opts: { seed?: number; now?: Date } = {}): Promise<GenerateResult> {
  const started = performance.now();
  const now = opts.now ?? new Date();
  const rnd = seededRandom(opts.seed ?? 20_261_201);
  const int = (lo: number, hi: number) => randomInt(rnd, lo, hi);
  const cal = makeCalendar(US_FEDERAL_HOLIDAYS.map((h) => h.day));
  const today = dayInZone(now);

  const examiners = await database
    .select({ id: users.id })
    .from(users)
    .where(and(inArray(users.role, ["examiner", "supervisor"]), eq(users.status, "active")));
  if (examiners.length === 0) throw new Error("no active plans examiner to assign: seed the demo accounts first");
  let [applicant] = await database.select({ id: users.id, firmId: users.firmId }).from(users).where(eq(users.role, "applicant")).limit(1);
  if (!applicant) {
    const [u] = await database.insert(users).values({ email: "queue-generator@generator.example", name: "Queue generator applicant", role: "applicant", status: "deactivated" }).$returningId();
    applicant = { id: u!.id, firmId: null };
  }
  const [maxRow] = await database.select({ max: sql<number>`COALESCE(MAX(${applications.id}), 0)` }).from(applications);
  const firstId = Number(maxRow?.max ?? 0) + 1;

  const pickState = (): NonNullable<State> => {
    let r = rnd();
    for (const [s, w] of MIX) {
      if (r < w) return s;
      r -= w;
    }
    return "approved";
  };

  for (let start = 0; start < n; start += CHUNK) {
    const apps: (typeof applications.$inferInsert)[] = [];
    const cycles: (typeof reviewCycles.$inferInsert)[] = [];
    for (let i = start; i < Math.min(n, start + CHUNK); i++) {
      const id = firstId + i;
      const state = pickState();
      const open = state === "in_review" || state === "resubmitted";
      const cycle = state === "draft" || state === "submitted" ? 0 : state === "resubmitted" ? int(2, 3) : state === "in_review" ? (rnd() < 0.7 ? 1 : 2) : int(1, 3);
      // Open reviews received within the last 30 business days: about 40% of them past due.
      const receivedDay = open ? shiftDays(today, -int(0, 42)) : shiftDays(today, -int(30, 700));
      const received = new Date(startOfDayInZone(receivedDay).getTime() + int(8 * 60, 16 * 60) * 60_000);
      const dueAt = cycle ? endOfDayInZone(addBusinessDays(receivedDay, cycle === 1 ? 10 : 5, cal)) : null;
      const decided = !open && cycle && state !== "corrections_issued" ? new Date(received.getTime() + int(2, 14) * 86_400_000) : null;
      const created = new Date(received.getTime() - int(3, 40) * 86_400_000);
      apps.push({
        id,
        number: applicationNumber(id, created.getUTCFullYear()),
        applicantId: applicant.id,
        firmId: applicant.firmId,
        state,
        cycle,
        workDescription: `Generated application ${id}: wood-frame addition`,
        siteAddress: `${int(1, 9999)} Generated Avenue`,
        parcelNumber: `${int(100, 999)}-${int(100, 999)}-${int(10, 99)}`,
        occupancyGroup: "R-3",
        constructionType: "VB",
        valuationCents: int(10_000, 900_000) * 100,
        dporName: "Generated Design Professional",
        dporLicence: "PE-00000",
        assignedExaminerId: cycle ? (examiners[int(0, examiners.length - 1)] as { id: number }).id : null,
        submittedAt: state === "draft" ? null : created,
        acceptedAt: cycle ? received : null,
        // As fireEvent leaves it: the due date of a running cycle; a decided one keeps it on the cycle only.
        receivedAt: cycle ? received : null,
        dueAt: open ? dueAt : null,
        decidedAt: state === "approved" || state === "approved_with_conditions" ? decided : null,
        createdAt: created,
        updatedAt: decided ?? received,
      });
      if (cycle) {
        cycles.push({
          applicationId: id,
          number: cycle,
          examinerId: apps.at(-1)!.assignedExaminerId ?? null,
          receivedAt: received,
          dueAt,
          decidedAt: decided ?? (state === "corrections_issued" ? new Date(received.getTime() + int(2, 14) * 86_400_000) : null),
          outcome: state === "corrections_issued" ? "corrections_issued" : state === "withdrawn" ? "withdrawn" : state === "approved" || state === "approved_with_conditions" ? state : null,
        });
      }
    }
    await database.transaction(async (tx) => {
      await tx.insert(applications).values(apps);
      if (cycles.length) await tx.insert(reviewCycles).values(cycles);
    });
  }
  // Fresh statistics so the optimizer plans with the new row counts.
  await database.execute(sql`ANALYZE TABLE applications, review_cycles`);
  return { inserted: n, firstId, lastId: firstId + n - 1, ms: Math.round(performance.now() - started) };
}

const isMain = process.argv[1]?.endsWith("generate-queue.ts");
if (isMain) {
  const n = Number(process.argv[2] ?? 100_000);
  if (!Number.isInteger(n) || n <= 0) {
    console.error("usage: generate-queue.ts N   (N applications, e.g. 100000)");
    process.exit(2);
  }
  const { db, closeDb } = await import("@/db/client");
  try {
    const r = await generateQueue(db(), n);
    console.log(`[generate-queue] ${r.inserted} applications (ids ${r.firstId}–${r.lastId}) in ${(r.ms / 1000).toFixed(1)} s`);
  } catch (e) {
    console.error("[generate-queue] failed:", e instanceof Error ? e.message : e);
    process.exitCode = 1;
  } finally {
    await closeDb();
  }
}
