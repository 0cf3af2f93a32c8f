import "server-only";
import { and, count, desc, eq, inArray, isNull, ne, sql } from "drizzle-orm";
import type { Db, Tx } from "../client";
import { applications, comments, deflectionChecks, firms, invoices, paymentEvents, reviewCycles, users } from "../schema";

export type InvoiceRow = typeof invoices.$inferSelect;
export type InvoiceStatus = InvoiceRow["status"];
export type InvoiceLine = InvoiceRow["lineItems"][number];

/** Department invoice number, e.g. INV-26-00042 (two-digit year, then the row id). */
export function invoiceNumber(id: number, year: number): string {
  return `INV-${String(year % 100).padStart(2, "0")}-${String(id).padStart(5, "0")}`;
}

/**
 * Writes a new invoice and its number, or nothing when the application already has one for
 * that purpose and cycle (the unique index decides). Returns the id either way.
 */
export async function insertInvoiceOnce(
  tx: Tx,
  values: Pick<typeof invoices.$inferInsert, "applicationId" | "purpose" | "cycle" | "totalCents" | "currency" | "lineItems" | "scheduleVersion">,
  now: Date,
): Promise<{ id: number; created: boolean }> {
  const [existing] = await tx
    .select({ id: invoices.id })
    .from(invoices)
    .where(and(eq(invoices.applicationId, values.applicationId), eq(invoices.purpose, values.purpose), eq(invoices.cycle, values.cycle)))
    .limit(1);
  if (existing) return { id: existing.id, created: false };
  const [row] = await tx.insert(invoices).values({ ...values, status: "open", createdAt: now }).$returningId();
  if (!row) throw new Error("invoice insert returned no id");
  await tx.update(invoices).set({ number: invoiceNumber(row.id, now.getUTCFullYear()) }).where(eq(invoices.id, row.id));
  return { id: row.id, created: true };
}

export async function getInvoice(database: Db | Tx, id: number): Promise<InvoiceRow | undefined> {
  const [row] = await database.select().from(invoices).where(eq(invoices.id, id)).limit(1);
  return row;
}

/** Reads and row-locks the invoice until the transaction ends (webhook and withdrawal take turns). */
export async function lockInvoice(tx: Tx, id: number): Promise<InvoiceRow | undefined> {
  const [row] = await tx.select().from(invoices).where(eq(invoices.id, id)).limit(1).for("update");
  return row;
}

/** Locks the application row first: every path that touches both locks application, then invoice. */
export async function lockApplicationRow(tx: Tx, id: number) {
  const [row] = await tx.select().from(applications).where(eq(applications.id, id)).limit(1).for("update");
  return row;
}

export async function findInvoiceIdBySession(database: Db | Tx, sessionId: string): Promise<number | undefined> {
  const [row] = await database.select({ id: invoices.id }).from(invoices).where(eq(invoices.providerSessionId, sessionId)).limit(1);
  return row?.id;
}

export async function findInvoiceIdByPayment(database: Db | Tx, paymentId: string): Promise<number | undefined> {
  const [row] = await database.select({ id: invoices.id }).from(invoices).where(eq(invoices.providerPaymentId, paymentId)).limit(1);
  return row?.id;
}

export async function listInvoicesForApplication(database: Db | Tx, applicationId: number): Promise<InvoiceRow[]> {
  return database.select().from(invoices).where(eq(invoices.applicationId, applicationId)).orderBy(invoices.cycle, invoices.id);
}

/** Open and paid invoices of an application, locked: the ones a withdrawal voids or refunds. */
export async function lockLiveInvoicesForApplication(tx: Tx, applicationId: number): Promise<InvoiceRow[]> {
  return tx
    .select()
    .from(invoices)
    .where(and(eq(invoices.applicationId, applicationId), inArray(invoices.status, ["open", "paid"])))
    .orderBy(invoices.id)
    .for("update");
}

/** Invoices with their application, for the lists; `applicantId` narrows to one applicant's own. */
export async function listInvoices(database: Db, opts: { applicantId?: number; status?: InvoiceStatus; limit?: number } = {}) {
  const where = and(opts.applicantId ? eq(applications.applicantId, opts.applicantId) : undefined, opts.status ? eq(invoices.status, opts.status) : undefined);
  return database
    .select({
      id: invoices.id,
      number: invoices.number,
      purpose: invoices.purpose,
      cycle: invoices.cycle,
      status: invoices.status,
      totalCents: invoices.totalCents,
      currency: invoices.currency,
      createdAt: invoices.createdAt,
      paidAt: invoices.paidAt,
      closedAt: invoices.closedAt,
      applicationId: applications.id,
      applicationNumber: applications.number,
      siteAddress: applications.siteAddress,
      applicantName: users.name,
      firmName: firms.name,
    })
    .from(invoices)
    .innerJoin(applications, eq(applications.id, invoices.applicationId))
    .innerJoin(users, eq(users.id, applications.applicantId))
    .leftJoin(firms, eq(firms.id, applications.firmId))
    .where(where)
    .orderBy(desc(invoices.createdAt), desc(invoices.id))
    .limit(opts.limit ?? 200);
}

/** Conditional on the version read: a concurrent change makes this a no-op (false). */
export async function updateInvoiceIfVersion(
  tx: Tx,
  id: number,
  version: number,
  patch: Partial<Pick<InvoiceRow, "status" | "providerSessionId" | "providerPaymentId" | "paidAt" | "closedAt" | "counterPayment">>,
): Promise<boolean> {
  const r = await tx
    .update(invoices)
    .set({ ...patch, version: version + 1 })
    .where(and(eq(invoices.id, id), eq(invoices.version, version)));
  return r[0].affectedRows === 1;
}

/**
 * Stores a provider event once. The provider's event id is the idempotency key: a replay or a
 * second delivery finds its row and reports "duplicate" without changing anything.
 */
export async function recordPaymentEventOnce(
  tx: Tx,
  e: { providerEventId: string; type: string; invoiceId: number | null; payload: unknown },
): Promise<"new" | "duplicate"> {
  try {
    await tx.insert(paymentEvents).values(e);
    return "new";
  } catch (err) {
    // A concurrent delivery of the same event waits on the unique index, then lands here.
    const code = (err as { code?: string; cause?: { code?: string } }).cause?.code ?? (err as { code?: string }).code;
    if (code === "ER_DUP_ENTRY") return "duplicate";
    throw err;
  }
}

export async function listPaymentEventsForInvoice(database: Db | Tx, invoiceId: number) {
  return database
    .select({ id: paymentEvents.id, providerEventId: paymentEvents.providerEventId, type: paymentEvents.type, payload: paymentEvents.payload, receivedAt: paymentEvents.receivedAt })
    .from(paymentEvents)
    .where(eq(paymentEvents.invoiceId, invoiceId))
    .orderBy(paymentEvents.receivedAt, paymentEvents.id);
}

/** An earlier event of this type about this payment (e.g. a refund delivered before the payment itself). */
export async function findEventAboutPayment(database: Db | Tx, type: string, paymentId: string): Promise<{ id: number; providerEventId: string } | undefined> {
  const [row] = await database
    .select({ id: paymentEvents.id, providerEventId: paymentEvents.providerEventId })
    .from(paymentEvents)
    .where(and(eq(paymentEvents.type, type), sql`JSON_UNQUOTE(JSON_EXTRACT(${paymentEvents.payload}, '$.data.object.payment_intent')) = ${paymentId}`))
    .limit(1);
  return row;
}

/** Attaches an event stored before its invoice was known. */
export async function linkPaymentEvent(tx: Tx, eventRowId: number, invoiceId: number): Promise<void> {
  await tx.update(paymentEvents).set({ invoiceId }).where(and(eq(paymentEvents.id, eventRowId), isNull(paymentEvents.invoiceId)));
}

/**
 * Whether an examiner has begun on review cycle `cycle`: a comment written in it (draft
 * included), a deflection check run in it, or a decision on it (a withdrawal is no decision).
 */
export async function reviewWorkExists(database: Db | Tx, applicationId: number, cycle: number): Promise<boolean> {
  const [c] = await database.select({ n: count() }).from(comments).where(and(eq(comments.applicationId, applicationId), eq(comments.cycle, cycle)));
  if ((c?.n ?? 0) > 0) return true;
  const [k] = await database
    .select({ n: count() })
    .from(deflectionChecks)
    .where(and(eq(deflectionChecks.applicationId, applicationId), eq(deflectionChecks.cycle, cycle)));
  if ((k?.n ?? 0) > 0) return true;
  const [d] = await database
    .select({ n: count() })
    .from(reviewCycles)
    .where(and(eq(reviewCycles.applicationId, applicationId), eq(reviewCycles.number, cycle), sql`${reviewCycles.decidedAt} IS NOT NULL`, ne(reviewCycles.outcome, "withdrawn")));
  return (d?.n ?? 0) > 0;
}

/** The review cycle row, for the clock. */
export async function getReviewCycle(database: Db | Tx, applicationId: number, cycle: number) {
  const [row] = await database
    .select()
    .from(reviewCycles)
    .where(and(eq(reviewCycles.applicationId, applicationId), eq(reviewCycles.number, cycle)))
    .limit(1);
  return row;
}

/** Starts a held review clock: the cycle counts as received at payment and gets its due date. */
export async function startCycleClock(tx: Tx, applicationId: number, cycle: number, receivedAt: Date, dueAt: Date): Promise<boolean> {
  const r = await tx
    .update(reviewCycles)
    .set({ receivedAt, dueAt, version: sql`${reviewCycles.version} + 1` })
    .where(and(eq(reviewCycles.applicationId, applicationId), eq(reviewCycles.number, cycle), isNull(reviewCycles.decidedAt), isNull(reviewCycles.dueAt)));
  if (r[0].affectedRows !== 1) return false;
  await tx
    .update(applications)
    .set({ receivedAt, dueAt })
    .where(and(eq(applications.id, applicationId), eq(applications.cycle, cycle), inArray(applications.state, ["in_review", "resubmitted"])));
  return true;
}

export async function getUserContact(database: Db | Tx, id: number) {
  const [u] = await database.select({ id: users.id, email: users.email, name: users.name, status: users.status }).from(users).where(eq(users.id, id)).limit(1);
  return u;
}
