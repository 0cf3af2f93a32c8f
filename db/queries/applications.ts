import "server-only";
import { and, asc, desc, eq, inArray, like, ne, or, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/mysql-core";
import type { ApplicationFacts, ApplicationResource } from "@/lib/workflow";
import type { SessionUser } from "./users";
import type { Db, Tx } from "../client";
import { applications, comments, documents, firms, invoices, responses, reviewCycles, sheets, users } from "../schema";

const examiner = alias(users, "examiner");
const applicant = alias(users, "applicant");

/** The row a workflow decision needs, plus its version for the conditional write. */
export async function getApplicationRow(database: Db | Tx, id: number) {
  const [row] = await database.select().from(applications).where(eq(applications.id, id)).limit(1);
  return row;
}

export function toResource(row: { state: ApplicationFacts["state"]; applicantId: number; assignedExaminerId: number | null }): ApplicationResource {
  return { state: row.state, applicantId: row.applicantId, assignedExaminerId: row.assignedExaminerId };
}

/**
 * Unresolved comments (draft or issued) with whether the applicant answered them this cycle, and,
 * where the department reviews only after payment (`feeBeforeReview`), the oldest unpaid fee.
 */
export async function loadFacts(database: Db | Tx, row: typeof applications.$inferSelect, { feeBeforeReview }: { feeBeforeReview: boolean }): Promise<ApplicationFacts> {
  const open = await database
    .select({ id: comments.id, number: comments.number, answered: sql<number>`(${responses.id} IS NOT NULL)` })
    .from(comments)
    .leftJoin(responses, and(eq(responses.commentId, comments.id), eq(responses.cycle, row.cycle)))
    .where(and(eq(comments.applicationId, row.id), inArray(comments.status, ["draft", "open"])))
    .orderBy(asc(comments.number));
  return {
    state: row.state,
    applicantId: row.applicantId,
    assignedExaminerId: row.assignedExaminerId,
    cycle: row.cycle,
    openComments: open.map((c) => ({ id: c.id, number: c.number, answered: Boolean(Number(c.answered)) })),
    unpaidFee: feeBeforeReview ? await oldestUnpaidFee(database, row.id) : null,
  };
}

async function oldestUnpaidFee(database: Db | Tx, applicationId: number): Promise<ApplicationFacts["unpaidFee"]> {
  const [inv] = await database
    .select({ id: invoices.id, number: invoices.number, totalCents: invoices.totalCents })
    .from(invoices)
    .where(and(eq(invoices.applicationId, applicationId), eq(invoices.status, "open")))
    .orderBy(asc(invoices.cycle), asc(invoices.id))
    .limit(1);
  return inv ? { invoiceNumber: inv.number ?? `#${inv.id}`, totalCents: inv.totalCents } : null;
}

export type ListScope = "mine" | "intake" | "reviews" | "all";

export interface ListQuery {
  scope: ListScope;
  q?: string;
  state?: string;
  sort: "number" | "updated" | "submitted" | "address" | "state";
  dir: "asc" | "desc";
  page: number;
  pageSize: number;
}

/** Who sees which rows: applicants their own, examiners their assignments, other staff everything filed. */
function visibility(user: SessionUser, scope: ListScope): SQL | undefined {
  switch (user.role) {
    case "applicant":
      return eq(applications.applicantId, user.id);
    case "examiner":
      return eq(applications.assignedExaminerId, user.id);
    case "technician":
    case "supervisor":
      if (scope === "reviews") return and(eq(applications.assignedExaminerId, user.id), ne(applications.state, "draft"));
      return ne(applications.state, "draft");
    default:
      return sql`FALSE`;
  }
}

const SORTS = {
  number: applications.id,
  updated: applications.updatedAt,
  submitted: applications.submittedAt,
  address: applications.siteAddress,
  state: applications.state,
} as const;

export async function listApplications(database: Db, user: SessionUser, query: ListQuery) {
  const filters: (SQL | undefined)[] = [visibility(user, query.scope)];
  if (query.scope === "intake") filters.push(eq(applications.state, "submitted"));
  if (query.scope === "reviews") filters.push(inArray(applications.state, ["in_review", "resubmitted"]));
  if (query.state) filters.push(sql`${applications.state} = ${query.state}`);
  if (query.q) {
    const pattern = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    filters.push(or(like(applications.number, pattern), like(applications.siteAddress, pattern), like(applications.workDescription, pattern), like(applications.parcelNumber, pattern)));
  }
  const where = and(...filters);
  const order = query.dir === "asc" ? asc(SORTS[query.sort]) : desc(SORTS[query.sort]);
  const rows = await database
    .select({
      id: applications.id,
      number: applications.number,
      state: applications.state,
      cycle: applications.cycle,
      siteAddress: applications.siteAddress,
      workDescription: applications.workDescription,
      submittedAt: applications.submittedAt,
      updatedAt: applications.updatedAt,
      applicantName: applicant.name,
      firmName: firms.name,
      examinerName: examiner.name,
    })
    .from(applications)
    .innerJoin(applicant, eq(applicant.id, applications.applicantId))
    .leftJoin(firms, eq(firms.id, applications.firmId))
    .leftJoin(examiner, eq(examiner.id, applications.assignedExaminerId))
    .where(where)
    .orderBy(order, desc(applications.id))
    .limit(query.pageSize + 1)
    .offset((query.page - 1) * query.pageSize);
  const [total] = await database.select({ n: sql<number>`COUNT(*)` }).from(applications).where(where);
  return { rows: rows.slice(0, query.pageSize), hasMore: rows.length > query.pageSize, total: Number(total?.n ?? 0) };
}

/** Everything the application page shows, in one read. The caller has authorized the view. */
export async function getApplicationDetail(database: Db, id: number) {
  const [app] = await database
    .select({
      row: applications,
      applicantName: applicant.name,
      applicantEmail: applicant.email,
      firmName: firms.name,
      examinerName: examiner.name,
    })
    .from(applications)
    .innerJoin(applicant, eq(applicant.id, applications.applicantId))
    .leftJoin(firms, eq(firms.id, applications.firmId))
    .leftJoin(examiner, eq(examiner.id, applications.assignedExaminerId))
    .where(eq(applications.id, id))
    .limit(1);
  if (!app) return null;
  const docs = await database
    .select({
      id: documents.id,
      cycle: documents.cycle,
      kind: documents.kind,
      originalName: documents.originalName,
      byteSize: documents.byteSize,
      sha256: documents.sha256,
      pageCount: documents.pageCount,
      uploadedAt: documents.uploadedAt,
      uploadedBy: users.name,
    })
    .from(documents)
    .innerJoin(users, eq(users.id, documents.uploadedBy))
    .where(eq(documents.applicationId, id))
    .orderBy(asc(documents.cycle), asc(documents.id));
  const sheetRows = await database
    .select({ id: sheets.id, documentId: sheets.documentId, page: sheets.page, sheetNumber: sheets.sheetNumber, title: sheets.title, cycle: documents.cycle })
    .from(sheets)
    .innerJoin(documents, eq(documents.id, sheets.documentId))
    .where(eq(sheets.applicationId, id))
    .orderBy(asc(documents.cycle), asc(sheets.documentId), asc(sheets.page));
  const author = alias(users, "author");
  const commentRows = await database
    .select({
      id: comments.id,
      number: comments.number,
      cycle: comments.cycle,
      discipline: comments.discipline,
      sheetId: comments.sheetId,
      pinX: comments.pinX,
      pinY: comments.pinY,
      codeSection: comments.codeSection,
      codeEdition: comments.codeEdition,
      body: comments.body,
      status: comments.status,
      checkId: comments.checkId,
      createdAt: comments.createdAt,
      resolvedAt: comments.resolvedAt,
      version: comments.version,
      authorName: author.name,
    })
    .from(comments)
    .innerJoin(author, eq(author.id, comments.createdBy))
    .where(eq(comments.applicationId, id))
    .orderBy(asc(comments.number));
  const responseRows = commentRows.length
    ? await database
        .select({
          id: responses.id,
          commentId: responses.commentId,
          cycle: responses.cycle,
          body: responses.body,
          changeReference: responses.changeReference,
          documentId: responses.documentId,
          verdict: responses.verdict,
          createdAt: responses.createdAt,
          reviewedAt: responses.reviewedAt,
          version: responses.version,
        })
        .from(responses)
        .where(inArray(responses.commentId, commentRows.map((c) => c.id)))
        .orderBy(asc(responses.cycle))
    : [];
  const cycles = await database
    .select({ number: reviewCycles.number, receivedAt: reviewCycles.receivedAt, dueAt: reviewCycles.dueAt, decidedAt: reviewCycles.decidedAt, outcome: reviewCycles.outcome, examinerName: users.name })
    .from(reviewCycles)
    .leftJoin(users, eq(users.id, reviewCycles.examinerId))
    .where(eq(reviewCycles.applicationId, id))
    .orderBy(asc(reviewCycles.number));
  return { ...app, documents: docs, sheets: sheetRows, comments: commentRows, responses: responseRows, cycles };
}

export async function nextCommentNumber(tx: Tx, applicationId: number): Promise<number> {
  const [r] = await tx
    .select({ n: sql<number>`COALESCE(MAX(${comments.number}), 0) + 1` })
    .from(comments)
    .where(eq(comments.applicationId, applicationId));
  return Number(r?.n ?? 1);
}

export async function listActiveExaminers(database: Db | Tx) {
  const open = sql<number>`(SELECT COUNT(*) FROM ${applications} a WHERE a.assigned_examiner_id = ${users.id} AND a.state IN ('in_review','resubmitted'))`;
  return database
    .select({ id: users.id, name: users.name, role: users.role, openReviews: open })
    .from(users)
    .where(and(inArray(users.role, ["examiner", "supervisor"]), eq(users.status, "active")))
    .orderBy(asc(users.name));
}
