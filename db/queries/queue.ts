import "server-only";
import { and, asc, count, desc, eq, gt, gte, inArray, isNotNull, isNull, lt, lte, notExists, or, sql, type SQL } from "drizzle-orm";
import { alias, unionAll } from "drizzle-orm/mysql-core";
import type { Db, Tx } from "../client";
import { applications, invoices, remindersSent, reviewCycles, users } from "../schema";

// The supervisor's queue: every open review (the states where the review clock runs).
// Intake ("submitted") is the permit technician's queue and has no due date yet.
export const QUEUE_STATES = ["in_review", "resubmitted"] as const;
export type QueueState = (typeof QUEUE_STATES)[number];
export type QueueSort = "due" | "received" | "number";
export type SortDir = "asc" | "desc";

/** The last row of a page: its sort key (ISO instant, or null) and id. */
export interface QueueCursor {
  key: string | null;
  id: number;
}

export interface QueueFilter {
  states: readonly QueueState[];
  examinerId?: number;
  due?: "overdue" | "this_week";
  /** the instant "overdue" is measured against */
  now: Date;
  /** last instant of the department's current week (for "due this week") */
  weekEndsAt: Date;
}

export interface QueuePageQuery extends QueueFilter {
  sort: QueueSort;
  dir: SortDir;
  after?: QueueCursor;
  limit: number;
}

const examiner = alias(users, "examiner");

function filterSql(f: QueueFilter, state: QueueState): SQL {
  const parts: (SQL | undefined)[] = [eq(applications.state, state)];
  if (f.examinerId !== undefined) parts.push(eq(applications.assignedExaminerId, f.examinerId));
  if (f.due === "overdue") parts.push(lt(applications.dueAt, f.now));
  if (f.due === "this_week") parts.push(gte(applications.dueAt, f.now), lte(applications.dueAt, f.weekEndsAt));
  return and(...parts) as SQL;
}

/**
 * Keyset condition "after the cursor" for (key, id) in the given direction. MariaDB sorts NULL
 * first ascending and last descending; the condition follows that order so no row is skipped
 * or repeated across pages. Written as OR-ed ranges the optimizer can read off the index.
 */
function afterSql(sort: QueueSort, dir: SortDir, c: QueueCursor): SQL {
  const id = applications.id;
  if (sort === "number") return dir === "asc" ? gt(id, c.id) : lt(id, c.id);
  const col = sort === "due" ? applications.dueAt : applications.receivedAt;
  const k = c.key === null ? null : new Date(c.key);
  if (dir === "asc") {
    return k === null ? (or(and(isNull(col), gt(id, c.id)), isNotNull(col)) as SQL) : (or(gt(col, k), and(eq(col, k), gt(id, c.id))) as SQL);
  }
  return k === null ? (and(isNull(col), lt(id, c.id)) as SQL) : (or(lt(col, k), and(eq(col, k), lt(id, c.id)), isNull(col)) as SQL);
}

function orderSql(sort: QueueSort, dir: SortDir): SQL[] {
  const by = dir === "asc" ? asc : desc;
  if (sort === "number") return [by(applications.id)];
  return [by(sort === "due" ? applications.dueAt : applications.receivedAt), by(applications.id)];
}

const rowColumns = {
  id: applications.id,
  number: applications.number,
  siteAddress: applications.siteAddress,
  state: applications.state,
  cycle: applications.cycle,
  version: applications.version,
  examinerId: applications.assignedExaminerId,
  examinerName: examiner.name,
  receivedAt: applications.receivedAt,
  dueAt: applications.dueAt,
  // Evaluated for the page's rows only (after the LIMIT), off the invoices' application index.
  unpaidFee: sql<number>`EXISTS (SELECT 1 FROM ${invoices} WHERE ${invoices.applicationId} = ${applications.id} AND ${invoices.status} = 'open')`.mapWith(Number),
};

/** One state's slice of a page, read in index order (state [, examiner], key, id). */
function stateSlice(database: Db | Tx, q: QueuePageQuery, state: QueueState) {
  const where = [filterSql(q, state)];
  if (q.after) where.push(afterSql(q.sort, q.dir, q.after));
  return database
    .select(rowColumns)
    .from(applications)
    .leftJoin(examiner, eq(examiner.id, applications.assignedExaminerId))
    .where(and(...where))
    .orderBy(...orderSql(q.sort, q.dir))
    .limit(q.limit + 1);
}

export type QueueRow = Awaited<ReturnType<typeof stateSlice>>[number];

export function sortKeyOf(row: Pick<QueueRow, "id" | "dueAt" | "receivedAt">, sort: QueueSort): Date | null | number {
  return sort === "number" ? row.id : sort === "due" ? row.dueAt : row.receivedAt;
}

/** The same order as the SQL: NULL first ascending, then the key, then id. */
function compareRows(sort: QueueSort, dir: SortDir) {
  return (a: QueueRow, b: QueueRow): number => {
    const ka = sortKeyOf(a, sort);
    const kb = sortKeyOf(b, sort);
    let c = 0;
    if (sort !== "number") {
      if (ka === null && kb !== null) c = -1;
      else if (ka !== null && kb === null) c = 1;
      else if (ka !== null && kb !== null) c = (ka as Date).getTime() - (kb as Date).getTime();
    }
    if (c === 0) c = a.id - b.id;
    return dir === "asc" ? c : -c;
  };
}

/** One statement: a single state's slice, or the slices of several as UNION ALL of parenthesised parts. */
function pageQuery(database: Db | Tx, q: QueuePageQuery) {
  const [first, second, ...rest] = q.states.map((s) => stateSlice(database, q, s));
  if (!first) throw new Error("the queue needs at least one state");
  return second ? unionAll(first, second, ...rest) : first;
}

/**
 * A page of the queue with keyset pagination. Each state is read in index order (state
 * [, examiner], key, id) and stops after `limit` + 1 rows; the slices are merged here. An IN
 * over both states would make MariaDB sort the whole range (a filesort) instead.
 */
export async function listQueuePage(database: Db | Tx, q: QueuePageQuery): Promise<{ rows: QueueRow[]; hasMore: boolean }> {
  const rows: QueueRow[] = await pageQuery(database, q);
  const merged = rows.sort(compareRows(q.sort, q.dir));
  return { rows: merged.slice(0, q.limit), hasMore: merged.length > q.limit };
}

/**
 * The statement a page runs, for ANALYZE in tests. (MariaDB's plain EXPLAIN of a UNION shows
 * the plan before its ORDER BY … LIMIT optimisation; ANALYZE runs it and shows the plan used.)
 */
export function queuePageSql(database: Db | Tx, q: QueuePageQuery) {
  return pageQuery(database, q).toSQL();
}

/**
 * How many reviews match, counted up to `cap`: counting is the one part of a page whose cost
 * grows with the queue, so it stops at the cap (the screen says "more than …").
 */
export async function countQueue(database: Db | Tx, f: QueueFilter, cap = 1_000): Promise<{ n: number; capped: boolean }> {
  const [first, second, ...rest] = f.states.map((s, i) =>
    database
      .select({ n: count() })
      .from(database.select({ one: sql`1` }).from(applications).where(filterSql(f, s)).limit(cap + 1).as(`matching_${i}`)),
  );
  if (!first) return { n: 0, capped: false };
  const parts = second ? await unionAll(first, second, ...rest) : await first;
  const n = parts.reduce((a, p) => a + Number(p.n), 0);
  return n > cap ? { n: cap, capped: true } : { n, capped: false };
}

/** Open, overdue and due-this-week reviews per assigned examiner. */
export async function workloadByExaminer(database: Db | Tx, now: Date, weekEndsAt: Date) {
  const rows = await database
    .select({
      examinerId: applications.assignedExaminerId,
      open: sql<number>`COUNT(*)`,
      overdue: sql<number>`COALESCE(SUM(${applications.dueAt} < ${now}), 0)`,
      dueThisWeek: sql<number>`COALESCE(SUM(${applications.dueAt} >= ${now} AND ${applications.dueAt} <= ${weekEndsAt}), 0)`,
    })
    .from(applications)
    .where(inArray(applications.state, [...QUEUE_STATES]))
    .groupBy(applications.assignedExaminerId);
  return rows.map((r) => ({ examinerId: r.examinerId, open: Number(r.open), overdue: Number(r.overdue), dueThisWeek: Number(r.dueThisWeek) }));
}

/**
 * Cycles decided in [from, to] (instants). Read off review_cycles_decided_idx, which holds every
 * column selected here: a column added to the select belongs in that index too, or a year's
 * period goes back to a table scan.
 */
export async function listCyclesDecidedBetween(database: Db | Tx, from: Date, to: Date) {
  return database
    .select({
      applicationId: reviewCycles.applicationId,
      number: reviewCycles.number,
      receivedAt: reviewCycles.receivedAt,
      dueAt: reviewCycles.dueAt,
      decidedAt: reviewCycles.decidedAt,
      outcome: reviewCycles.outcome,
    })
    .from(reviewCycles)
    .where(and(isNotNull(reviewCycles.outcome), gte(reviewCycles.decidedAt, from), lte(reviewCycles.decidedAt, to)));
}

/** Approvals decided in [from, to] (instants), read off applications_decided_idx (covering, like the above). */
export async function listApprovalsBetween(database: Db | Tx, from: Date, to: Date) {
  return database
    .select({ applicationId: applications.id, cycles: applications.cycle, decidedAt: applications.decidedAt })
    .from(applications)
    .where(and(inArray(applications.state, ["approved", "approved_with_conditions"]), gte(applications.decidedAt, from), lte(applications.decidedAt, to)));
}

// ---- reminders

const notYetSent = (database: Db | Tx, kind: "due_tomorrow" | "overdue") =>
  notExists(
    database
      .select({ one: sql`1` })
      .from(remindersSent)
      .where(and(eq(remindersSent.applicationId, applications.id), eq(remindersSent.cycle, applications.cycle), eq(remindersSent.kind, kind))),
  );

const reminderColumns = {
  id: applications.id,
  number: applications.number,
  siteAddress: applications.siteAddress,
  workDescription: applications.workDescription,
  cycle: applications.cycle,
  dueAt: applications.dueAt,
  examinerId: applications.assignedExaminerId,
  examinerName: examiner.name,
  examinerEmail: examiner.email,
  examinerStatus: examiner.status,
};

/** Open reviews due in [from, to] whose examiner has not had the day-before reminder this cycle. */
export async function listDueSoonWithoutReminder(database: Db | Tx, from: Date, to: Date, limit: number) {
  return database
    .select(reminderColumns)
    .from(applications)
    .leftJoin(examiner, eq(examiner.id, applications.assignedExaminerId))
    .where(and(inArray(applications.state, [...QUEUE_STATES]), gte(applications.dueAt, from), lte(applications.dueAt, to), notYetSent(database, "due_tomorrow")))
    .orderBy(asc(applications.dueAt), asc(applications.id))
    .limit(limit);
}

/** Open reviews past due (before `now`) whose supervisors have not been told this cycle. */
export async function listOverdueWithoutNotice(database: Db | Tx, now: Date, limit: number) {
  return database
    .select(reminderColumns)
    .from(applications)
    .leftJoin(examiner, eq(examiner.id, applications.assignedExaminerId))
    .where(and(inArray(applications.state, [...QUEUE_STATES]), lt(applications.dueAt, now), notYetSent(database, "overdue")))
    .orderBy(asc(applications.dueAt), asc(applications.id))
    .limit(limit);
}

export async function markReminderSent(tx: Tx, applicationId: number, cycle: number, kind: "due_tomorrow" | "overdue", sentAt?: Date): Promise<void> {
  await tx.insert(remindersSent).values({ applicationId, cycle, kind, ...(sentAt ? { sentAt } : {}) });
}
