// A year of backdated activity in the invented City of Larkspur Falls, so the supervisor's desk
// and its charts look like a working department on first start. The workflow stamps "now" on
// every event, so the rows are written directly — the same rows, audit lines and cycle dates
// the workflow would have written on those days (a decision clears the application's due date;
// the cycle keeps its own). Runs once (a settings marker); the holiday
// calendar and default targets are added whenever missing.
import { eq } from "drizzle-orm";
import { seededRandom } from "@/lib/seeded-random";
import { type Db, type Tx, withTransaction } from "./client";
import { getReviewTargets, getSetting, insertHolidaysIfMissing, putSetting } from "./queries/settings";
import { applications, assignments, auditEvents, comments, remindersSent, responses, reviewCycles, settings, users } from "./schema";
import { applicationNumber } from "@/lib/applications/service";
import {
  addBusinessDays,
  businessDaysBetween,
  dayInZone,
  dueDayFor,
  endOfDayInZone,
  isBusinessDay,
  makeCalendar,
  previousBusinessDay,
  REVIEW_TARGETS_KEY,
  DEFAULT_REVIEW_TARGETS,
  shiftDays,
  startOfDayInZone,
  US_FEDERAL_HOLIDAYS,
  type BusinessCalendar,
  type Day,
  type ReviewTargets,
} from "@/lib/review-clock";

const MARKER = "demo_history";
const APPLICATIONS = 340;


const STREETS = [
  "Alder Street", "Millrace Avenue", "Heron Bend", "Lantern Way", "Kiln Road", "Quarry Lane", "Tamarack Drive",
  "Sorrel Court", "Larkspur Boulevard", "Cinder Hill Road", "Foundry Row", "Willow Ford Lane", "Brickyard Way",
  "Osprey Point", "Juniper Terrace", "Old Mill Road", "Riverbend Parkway", "Cooper's Hollow", "Granary Street", "Flint Ridge Drive",
];

// Written out as rows: description, occupancy group, construction type, valuation range (dollars).
const WORK_ROWS: [string, string, string, number, number][] = [
  ["Single-family residence, two stories, wood frame", "R-3", "VB", 380_000, 720_000],
  ["Second-story addition over the existing garage, glulam floor beams", "R-3", "VB", 90_000, 210_000],
  ["Covered rear deck with cantilevered joists and a glulam beam", "R-3", "VB", 18_000, 55_000],
  ["Detached garage with bonus room, engineered roof trusses", "U", "VB", 60_000, 140_000],
  ["Accessory dwelling unit over a slab on grade", "R-3", "VB", 140_000, 260_000],
  ["Kitchen remodel removing a bearing wall, new LVL header", "R-3", "VB", 25_000, 80_000],
  ["Two-story wood-frame duplex", "R-2", "VA", 520_000, 900_000],
  ["Three-story apartment building, 12 units, podium slab", "R-2", "IIIA", 2_400_000, 4_800_000],
  ["Tenant improvement with new mezzanine framing, steel W-beams", "B", "IIB", 160_000, 420_000],
  ["Retail shell, steel joists and metal deck roof", "M", "IIB", 900_000, 1_800_000],
  ["Warehouse addition, tilt-up concrete walls", "S-1", "IIIB", 1_200_000, 2_600_000],
  ["Restaurant conversion with new rooftop unit supports", "A-2", "IIB", 180_000, 380_000],
  ["Church fellowship hall, glulam arches", "A-3", "VA", 700_000, 1_300_000],
  ["Clinic interior alteration, new roof openings", "B", "IIB", 120_000, 260_000],
  ["Foundation repair and underpinning at the north wall", "R-3", "VB", 30_000, 90_000],
  ["Solar array on an existing roof, structural review of rafters", "R-3", "VB", 15_000, 45_000],
];

const COMMENTS: [string, string][] = [
  ["IBC 1604.3", "Provide the D+L deflection check against L/240 (Table 1604.3, floor members), including creep."],
  ["IBC 1607.1", "The live load for this use is higher than the 40 psf shown; revise per Table 1607.1."],
  ["IBC 1603.1.1", "Show the floor live loads on the construction documents."],
  ["IBC 1603.1.2", "Show the roof live load and ground snow load on the construction documents."],
  ["IBC 2308.4.1", "Header over the widened opening is not sized; provide calculations or a prescriptive size."],
  ["ASCE 7-16 12.11", "Provide the out-of-plane wall anchorage to the roof diaphragm."],
  ["IBC 1810.3.1", "Footing size at the new point load from the glulam post is not justified; provide bearing calculations."],
  ["IBC 1705.1.1", "List the special inspections required for the structural steel connections."],
  ["ASCE 7-16 7.7", "Drift surcharge at the roof step is not included in the snow loads."],
  ["IBC 2304.10.1", "Fastening schedule: show the sheathing nailing at panel edges and in the field."],
];

const CONDITIONS = [
  "Deferred submittal: truss design drawings, stamped, before framing inspection.",
  "Deferred submittal: post base connector data before foundation inspection.",
  "Special inspection of the field welds per IBC 1705.2 before cover.",
  "Geotechnical observation of footing excavations before the foundation pour.",
];

const REASONS = [
  "Balancing the queue: the first examiner has several first reviews due this week.",
  "Examiner on leave; moved to keep the review on time.",
  "Needs steel-framing experience.",
  "Conflict of interest declared by the first examiner.",
];

interface Person {
  id: number;
  role: "applicant" | "technician" | "examiner" | "supervisor" | "admin";
  name: string;
  firmId: number | null;
}

interface Built {
  app: typeof applications.$inferInsert;
  cycles: Omit<typeof reviewCycles.$inferInsert, "applicationId">[];
  assignments: Omit<typeof assignments.$inferInsert, "applicationId">[];
  audit: Omit<typeof auditEvents.$inferInsert, "applicationId" | "entityId">[];
  comments: { row: Omit<typeof comments.$inferInsert, "applicationId">; response: Omit<typeof responses.$inferInsert, "commentId"> | null }[];
  reminders: Omit<typeof remindersSent.$inferInsert, "applicationId">[];
}

async function person(database: Db | Tx, email: string): Promise<Person> {
  const [u] = await database.select().from(users).where(eq(users.email, email)).limit(1);
  if (!u) throw new Error(`demo user ${email} missing: seed the accounts first`);
  return { id: u.id, role: u.role, name: u.name, firmId: u.firmId };
}

/** Adds the demo year; returns how many applications it added (0 when already there). */
export async function seedHistory(database: Db, now: Date = new Date()): Promise<number> {
  await insertHolidaysIfMissing(database, US_FEDERAL_HOLIDAYS);
  if ((await getSetting(database, REVIEW_TARGETS_KEY)) === undefined) await putSetting(database, REVIEW_TARGETS_KEY, DEFAULT_REVIEW_TARGETS, null);
  if ((await getSetting(database, MARKER)) !== undefined) return 0;

  const people = {
    owen: await person(database, "owen@corbelfinch.example"),
    lena: await person(database, "lena@tamarackbuilders.example"),
    tech: await person(database, "tech@larkspurfalls.example"),
    henrik: await person(database, "examiner@larkspurfalls.example"),
    priya: await person(database, "examiner2@larkspurfalls.example"),
    gwen: await person(database, "supervisor@larkspurfalls.example"),
  };
  const cal = makeCalendar(US_FEDERAL_HOLIDAYS.map((h) => h.day));
  const targets = await getReviewTargets(database);
  const today = dayInZone(now);
  // Deterministic per seed day: the same start gives the same department.
  const rnd = seededRandom(Number(today.replaceAll("-", "")));
  const built = plan(people, cal, targets, now, rnd);

  await withTransaction(database, async (tx) => {
    const [marker] = await tx.select({ key: settings.key }).from(settings).where(eq(settings.key, MARKER)).for("update");
    if (marker) return;
    for (const b of built) {
      const [row] = await tx.insert(applications).values(b.app).$returningId();
      if (!row) throw new Error("application insert returned no id");
      const id = row.id;
      await tx.update(applications).set({ number: applicationNumber(id, (b.app.createdAt as Date).getUTCFullYear()) }).where(eq(applications.id, id));
      if (b.cycles.length) await tx.insert(reviewCycles).values(b.cycles.map((c) => ({ ...c, applicationId: id })));
      if (b.assignments.length) await tx.insert(assignments).values(b.assignments.map((a) => ({ ...a, applicationId: id })));
      if (b.audit.length) await tx.insert(auditEvents).values(b.audit.map((e) => ({ ...e, applicationId: id, entityId: String(id) })));
      for (const c of b.comments) {
        const [cm] = await tx.insert(comments).values({ ...c.row, applicationId: id }).$returningId();
        if (cm && c.response) await tx.insert(responses).values({ ...c.response, commentId: cm.id });
      }
      if (b.reminders.length) await tx.insert(remindersSent).values(b.reminders.map((r) => ({ ...r, applicationId: id })));
    }
    await putSetting(tx, MARKER, { seededAt: now.toISOString(), applications: built.length }, null);
  });
  return built.length;
}

// ---- the simulation: each application walks the workflow until its next event would be after `now`

function plan(p: Record<"owen" | "lena" | "tech" | "henrik" | "priya" | "gwen", Person>, cal: BusinessCalendar, targets: ReviewTargets, now: Date, rnd: () => number): Built[] {
  const int = (lo: number, hi: number) => lo + Math.floor(rnd() * (hi - lo + 1));
  const pick = <T,>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)] as T;
  const chance = (x: number) => rnd() < x;
  const today = dayInZone(now);

  // A working-hours instant on a business day, strictly after `after`.
  const at = (day: Day, after?: Date): Date => {
    const t = new Date(startOfDayInZone(day).getTime() + (8 * 60 + int(0, 8 * 60 + 30)) * 60_000);
    return after && t <= after ? new Date(after.getTime() + int(20, 150) * 60_000) : t;
  };
  const later = (t: Date, businessDays: number): Date => at(businessDays === 0 ? dayInZone(t) : addBusinessDays(dayInZone(t), businessDays, cal), t);

  const examinerPool = [p.henrik, p.henrik, p.henrik, p.henrik, p.henrik, p.priya, p.priya, p.priya, p.priya, p.priya, p.gwen];
  const days: Day[] = [];
  for (let d = shiftDays(today, -365); d < today; d = shiftDays(d, 1)) if (isBusinessDay(d, cal)) days.push(d);

  // Fixed cases relative to today, so the desk always shows overdue and due-soon reviews:
  // [business days since receipt, cycle, examiner]. First review target 10, resubmittal 5 (defaults).
  const fixed: { ago: number; cycle: number; examiner: Person }[] = [
    { ago: 19, cycle: 1, examiner: p.henrik },
    { ago: 16, cycle: 1, examiner: p.priya },
    { ago: 14, cycle: 1, examiner: p.henrik },
    { ago: 8, cycle: 2, examiner: p.priya },
    { ago: 9, cycle: 1, examiner: p.henrik },
    { ago: 10, cycle: 1, examiner: p.priya },
  ];

  const plans: { created: Day; fixed?: (typeof fixed)[number] }[] = [];
  for (let i = 0; i < APPLICATIONS - fixed.length; i++) plans.push({ created: pick(days.slice(0, -2)) });
  for (const f of fixed) {
    let received = today;
    for (let k = 0; k < f.ago; k++) received = previousBusinessDay(received, cal);
    // Start early enough that intake and any earlier cycles fit before the receipt.
    let created = received;
    for (let k = 0; k < (f.cycle === 1 ? 3 : 35); k++) created = previousBusinessDay(created, cal);
    plans.push({ created, fixed: f });
  }
  plans.sort((a, b) => (a.created < b.created ? -1 : a.created > b.created ? 1 : 0));

  return plans.map(({ created, fixed: f }) => {
    const applicant = chance(0.55) ? p.owen : p.lena;
    const [work, occupancy, ctype, lo, hi] = pick(WORK_ROWS);
    const b: Built = {
      app: {
        applicantId: applicant.id,
        firmId: applicant.firmId,
        state: "draft",
        cycle: 0,
        workDescription: work,
        siteAddress: `${int(10, 2990)} ${pick(STREETS)}`,
        parcelNumber: `${int(101, 139)}-${String(int(1, 420)).padStart(3, "0")}-${String(int(1, 60)).padStart(2, "0")}`,
        occupancyGroup: occupancy,
        constructionType: ctype,
        valuationCents: int(lo, hi) * 100,
        dporName: applicant === p.owen ? "Owen Corbel, PE" : pick(["Ines Varga, SE", "Tomas Whitcombe, PE"]),
        dporLicence: applicant === p.owen ? "PE-40211" : pick(["SE-31877", "PE-52610"]),
      },
      cycles: [],
      assignments: [],
      audit: [],
      comments: [],
      reminders: [],
    };
    let version = 1;
    let t = at(created);
    b.app.createdAt = t;
    b.app.updatedAt = t;
    const log = (when: Date, actor: Person, action: string, summary: string, detail?: Record<string, unknown>) => {
      b.audit.push({ at: when, actorId: actor.id, actorRole: actor.role, action, entityType: "application", summary, detail: detail ?? null });
    };
    const step = (when: Date, patch: Partial<typeof applications.$inferInsert>) => {
      version++;
      Object.assign(b.app, patch, { version, updatedAt: when });
      t = when;
    };
    const due = (when: Date) => (when > now ? null : when);
    log(t, applicant, "application.created", "Draft started.");

    // Submit, perhaps returned once as incomplete, then accepted.
    const submitted = due(later(t, chance(0.5) ? 0 : 1));
    if (!submitted) return b;
    step(submitted, { state: "submitted", submittedAt: submitted });
    log(submitted, applicant, "application.submitted", "Submitted for intake.", { from: "draft", to: "submitted", input: {} });
    if (!f && chance(0.12)) {
      const back = due(later(t, int(1, 2)));
      if (!back) return b;
      const reasons = ["Structural calculation package not included"];
      step(back, { state: "returned_incomplete", returnReasons: reasons });
      log(back, p.tech, "application.returned_incomplete", `Returned as incomplete: ${reasons.join("; ")}`, { from: "submitted", to: "returned_incomplete", input: { reasons } });
      const again = due(later(t, int(2, 6)));
      if (!again) return b;
      step(again, { state: "submitted", submittedAt: again });
      log(again, applicant, "application.submitted", "Submitted again for intake after being returned as incomplete.", { from: "returned_incomplete", to: "submitted", input: {} });
    }
    let examiner = f?.examiner ?? pick(examinerPool);
    const accepted = due(f && f.cycle === 1 ? at(backBusinessDays(today, f.ago, cal), t) : later(t, int(1, 3)));
    if (!accepted) return b;

    let commentNo = 0;
    let openComments: typeof b.comments = [];
    let received = accepted;
    for (let cycle = 1; cycle <= 4; cycle++) {
      const target = dueDayFor(dayInZone(received), cycle, targets, cal);
      const dueAt = endOfDayInZone(target);
      const cycleRow: Built["cycles"][number] = { number: cycle, examinerId: examiner.id, receivedAt: received, dueAt, decidedAt: null, outcome: null, version: 1 };
      b.cycles.push(cycleRow);
      if (cycle === 1) {
        step(received, { state: "in_review", cycle, acceptedAt: received, assignedExaminerId: examiner.id, receivedAt: received, dueAt });
        log(received, p.tech, "application.accepted", `Accepted for plan review and assigned to ${examiner.name}; review cycle 1 started.`, { from: "submitted", to: "in_review", input: { examinerId: examiner.id } });
        b.assignments.push({ examinerId: examiner.id, assignedBy: p.tech.id, reason: "Assigned at intake", assignedAt: received });
      } else {
        step(received, { state: "resubmitted", cycle, receivedAt: received, dueAt });
        log(received, applicant, "application.resubmitted", `Resubmitted with responses to ${openComments.length} comment${openComments.length === 1 ? "" : "s"}; review cycle ${cycle} started.`, { from: "corrections_issued", to: "resubmitted", input: {} });
        const begun = due(later(received, int(0, 1)));
        if (!begun) {
          remindersFor(b, cycle, target, null, today, cal);
          break;
        }
        step(begun, { state: "in_review" });
        log(begun, examiner, "review.begun", `Review of cycle ${cycle} begun.`, { from: "resubmitted", to: "in_review", input: {} });
      }

      // How long the examiner takes, in business days from receipt.
      const onTarget = cycle === 1 ? targets.firstReviewDays : targets.resubmittalDays;
      let took = chance(0.13) ? onTarget + int(1, 5) : int(Math.max(1, Math.round(onTarget * 0.3)), onTarget);
      const recentlyReceived = businessDaysBetween(dayInZone(received), today, cal) <= onTarget + 12;
      if ((f && f.cycle === cycle) || (!f && recentlyReceived && chance(0.06))) took = onTarget + 25; // stalled: still open today

      // A few files move to another examiner mid-cycle.
      if (!f && took >= 3 && chance(0.06)) {
        const movedAt = due(later(received, Math.min(took - 1, int(1, 3))));
        if (movedAt && movedAt > t) {
          const to = examiner.id === p.henrik.id ? p.priya : p.henrik;
          const reason = pick(REASONS);
          b.assignments.at(-1)!.endedAt = movedAt;
          b.assignments.push({ examinerId: to.id, assignedBy: p.gwen.id, reason, assignedAt: movedAt });
          step(movedAt, { assignedExaminerId: to.id });
          log(movedAt, p.gwen, "review.reassigned", `Review reassigned from ${examiner.name} to ${to.name}.`, { from: b.app.state, to: b.app.state, input: { examinerId: to.id, reason } });
          examiner = to;
          cycleRow.examinerId = to.id;
        }
      }

      const decidedRaw = due(later(received, took));
      const decided = decidedRaw && decidedRaw <= t ? new Date(t.getTime() + 3_600_000) : decidedRaw;
      remindersFor(b, cycle, target, decided ? dayInZone(decided) : null, today, cal);
      if (!decided) break;
      // Earlier comments answered and resolved as this cycle is decided.
      for (const c of openComments) {
        c.row.status = "resolved";
        c.row.resolvedAt = new Date(decided.getTime() - 60 * 60_000);
        c.row.resolvedBy = examiner.id;
        if (c.response) Object.assign(c.response, { verdict: "resolved", reviewedBy: examiner.id, reviewedAt: c.row.resolvedAt });
      }
      openComments = [];
      // A fixed case still owes its later cycle: no approval or withdrawal before it.
      const mustContinue = f !== undefined && f.cycle > cycle;
      const approve = !mustContinue && (cycle === 4 || chance(cycle === 1 ? 0.3 : cycle === 2 ? 0.72 : 0.9));
      const withdraw = !mustContinue && !approve && cycle === 1 && chance(0.03);
      if (withdraw) {
        cycleRow.decidedAt = decided;
        cycleRow.outcome = "withdrawn";
        step(decided, { state: "withdrawn", dueAt: null });
        log(decided, applicant, "application.withdrawn", `Withdrawn by the applicant from "In plan review": project on hold.`, { from: "in_review", to: "withdrawn", input: { reason: "project on hold" } });
        break;
      }
      if (approve) {
        const withConditions = chance(0.3);
        cycleRow.decidedAt = decided;
        cycleRow.outcome = withConditions ? "approved_with_conditions" : "approved";
        if (withConditions) {
          const conditions = [pick(CONDITIONS)];
          step(decided, { state: "approved_with_conditions", decidedAt: decided, conditions, dueAt: null });
          log(decided, examiner, "review.approved_with_conditions", `Approved with 1 condition in review cycle ${cycle}: ${conditions[0]}`, { from: "in_review", to: "approved_with_conditions", input: { conditions: conditions.map((text) => ({ text, carriesCommentId: null })) } });
        } else {
          step(decided, { state: "approved", decidedAt: decided, dueAt: null });
          log(decided, examiner, "review.approved", `Approved in review cycle ${cycle}.`, { from: "in_review", to: "approved", input: {} });
        }
        break;
      }
      // Corrections: one to three comments, issued with the list.
      const n = int(1, 3);
      for (let k = 0; k < n; k++) {
        const [section, body] = pick(COMMENTS);
        commentNo++;
        const c = {
          row: {
            number: commentNo,
            cycle,
            discipline: "Structural",
            codeSection: section,
            codeEdition: section.startsWith("ASCE") ? "ASCE 7-16" : "2021 IBC",
            body,
            status: "open" as const,
            createdBy: examiner.id,
            createdAt: new Date(decided.getTime() - int(60, 300) * 60_000),
            version: 2,
          } as Built["comments"][number]["row"],
          response: null as Built["comments"][number]["response"],
        };
        b.comments.push(c);
        openComments.push(c);
      }
      cycleRow.decidedAt = decided;
      cycleRow.outcome = "corrections_issued";
      step(decided, { state: "corrections_issued", dueAt: null });
      log(decided, examiner, "review.corrections_issued", `Corrections issued in review cycle ${cycle}: ${n} open comment${n === 1 ? "" : "s"}.`, { from: "in_review", to: "corrections_issued", input: {} });

      // With the applicant: answers, then the resubmittal.
      const fixedNext = f && f.cycle === cycle + 1;
      const back = fixedNext ? at(backBusinessDays(today, f.ago, cal), t) : later(t, int(4, 22));
      const answeredAt = new Date(back.getTime() - int(30, 240) * 60_000);
      if (answeredAt <= now && answeredAt > t) {
        for (const c of openComments) {
          c.response = { cycle, body: "Revised as requested; see the clouded change.", changeReference: `Sheet S-${pick(["101", "201", "202", "301"])}, calc p. ${int(2, 14)}`, verdict: "pending", createdBy: applicant.id, createdAt: answeredAt, version: 1 };
        }
      }
      if (back > now) break;
      received = back;
    }
    return b;
  });
}

function backBusinessDays(from: Day, n: number, cal: BusinessCalendar): Day {
  let d = from;
  for (let k = 0; k < n; k++) d = previousBusinessDay(d, cal);
  return d;
}

/**
 * Reminders the job would already have sent (the cycle was still open on that day, and that
 * day is before today): recorded, so the job does not send them again on first start.
 */
function remindersFor(b: Built, cycle: number, dueDay: Day, decidedDay: Day | null, today: Day, cal: BusinessCalendar) {
  const morning = (d: Day) => new Date(startOfDayInZone(d).getTime() + 7 * 3_600_000);
  const dayBefore = previousBusinessDay(dueDay, cal);
  if (dayBefore < today && (decidedDay === null || decidedDay > dayBefore)) b.reminders.push({ cycle, kind: "due_tomorrow", sentAt: morning(dayBefore) });
  const overdueFrom = shiftDays(dueDay, 1);
  if (overdueFrom < today && (decidedDay === null || decidedDay >= overdueFrom)) b.reminders.push({ cycle, kind: "overdue", sentAt: morning(overdueFrom) });
}
