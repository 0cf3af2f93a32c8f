import "server-only";
import { and, asc, desc, eq, inArray, isNull, lt, or, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/mysql-core";
import type { Db, Tx } from "../client";
import { comments, deflectionChecks, documents, sheets, users } from "../schema";

export type CheckRow = typeof deflectionChecks.$inferSelect;
export type NewCheckRow = typeof deflectionChecks.$inferInsert;

export async function insertCheck(tx: Tx | Db, values: NewCheckRow): Promise<number> {
  const [row] = await tx.insert(deflectionChecks).values(values).$returningId();
  if (!row) throw new Error("internal: the check row was not inserted");
  return row.id;
}

const author = alias(users, "check_author");

/** One check of an application, with its author's name; null when it is not this application's. */
export async function getCheckForApplication(database: Db | Tx, { applicationId, checkId }: { applicationId: number; checkId: number }) {
  const [row] = await database
    .select({ check: deflectionChecks, createdByName: author.name, createdByRole: author.role })
    .from(deflectionChecks)
    .innerJoin(author, eq(author.id, deflectionChecks.createdBy))
    .where(and(eq(deflectionChecks.id, checkId), eq(deflectionChecks.applicationId, applicationId)))
    .limit(1);
  return row ?? null;
}

/** The list view: everything but the stored model and result. */
export async function listChecksForApplication(database: Db, applicationId: number) {
  return database
    .select({
      id: deflectionChecks.id,
      cycle: deflectionChecks.cycle,
      purpose: deflectionChecks.purpose,
      memberMark: deflectionChecks.memberMark,
      sheetId: deflectionChecks.sheetId,
      calcDocumentId: deflectionChecks.calcDocumentId,
      calcPage: deflectionChecks.calcPage,
      solverVersion: deflectionChecks.solverVersion,
      verdict: deflectionChecks.verdict,
      summary: deflectionChecks.summary,
      status: deflectionChecks.status,
      createdAt: deflectionChecks.createdAt,
      createdBy: deflectionChecks.createdBy,
      createdByName: author.name,
    })
    .from(deflectionChecks)
    .innerJoin(author, eq(author.id, deflectionChecks.createdBy))
    .where(eq(deflectionChecks.applicationId, applicationId))
    .orderBy(desc(deflectionChecks.cycle), desc(deflectionChecks.createdAt), desc(deflectionChecks.id));
}

/** Comments made from checks of this application (check id → comment). */
export async function listCheckComments(database: Db | Tx, applicationId: number) {
  return database
    .select({ id: comments.id, number: comments.number, status: comments.status, checkId: comments.checkId })
    .from(comments)
    .where(and(eq(comments.applicationId, applicationId), sql`${comments.checkId} IS NOT NULL`))
    .orderBy(asc(comments.number));
}

export async function getCommentForCheck(database: Db | Tx, { applicationId, checkId }: { applicationId: number; checkId: number }) {
  const [c] = await database
    .select({ id: comments.id, number: comments.number, status: comments.status })
    .from(comments)
    .where(and(eq(comments.applicationId, applicationId), eq(comments.checkId, checkId)))
    .limit(1);
  return c ?? null;
}

/**
 * Checks made before `newCycle` from a calculation package of an earlier cycle (or from no
 * named package) become "re-verify": the package they rest on has been replaced.
 */
export async function markChecksReverify(tx: Tx, applicationId: number, newCycle: number): Promise<number[]> {
  const calc = alias(documents, "calc");
  const stale = await tx
    .select({ id: deflectionChecks.id })
    .from(deflectionChecks)
    .leftJoin(calc, eq(calc.id, deflectionChecks.calcDocumentId))
    .where(
      and(
        eq(deflectionChecks.applicationId, applicationId),
        eq(deflectionChecks.status, "current"),
        lt(deflectionChecks.cycle, newCycle),
        or(isNull(deflectionChecks.calcDocumentId), lt(calc.cycle, newCycle)),
      ),
    );
  const ids = stale.map((s) => s.id);
  if (ids.length === 0) return [];
  await tx
    .update(deflectionChecks)
    .set({ status: "reverify", version: sql`${deflectionChecks.version} + 1` })
    .where(and(eq(deflectionChecks.applicationId, applicationId), eq(deflectionChecks.status, "current"), inArray(deflectionChecks.id, ids)));
  return ids;
}

export async function listDocumentsOfKind(database: Db | Tx, applicationId: number, kind: "calculations" | "member_model") {
  return database
    .select({
      id: documents.id,
      cycle: documents.cycle,
      originalName: documents.originalName,
      byteSize: documents.byteSize,
      pageCount: documents.pageCount,
      storageKey: documents.storageKey,
      uploadedAt: documents.uploadedAt,
      uploadedByName: users.name,
    })
    .from(documents)
    .innerJoin(users, eq(users.id, documents.uploadedBy))
    .where(and(eq(documents.applicationId, applicationId), eq(documents.kind, kind)))
    .orderBy(desc(documents.cycle), desc(documents.id));
}

export async function getDocumentOfApplication(database: Db | Tx, { applicationId, documentId }: { applicationId: number; documentId: number }) {
  const [d] = await database
    .select()
    .from(documents)
    .where(and(eq(documents.id, documentId), eq(documents.applicationId, applicationId)))
    .limit(1);
  return d ?? null;
}

export async function findDocumentBySha(database: Db | Tx, { applicationId, sha256 }: { applicationId: number; sha256: string }) {
  const [d] = await database
    .select({ name: documents.originalName, cycle: documents.cycle })
    .from(documents)
    .where(and(eq(documents.applicationId, applicationId), eq(documents.sha256, sha256)))
    .limit(1);
  return d ?? null;
}

export async function getSheetOfApplication(database: Db | Tx, { applicationId, sheetId }: { applicationId: number; sheetId: number }) {
  const [s] = await database
    .select({ id: sheets.id, sheetNumber: sheets.sheetNumber, page: sheets.page, title: sheets.title })
    .from(sheets)
    .where(and(eq(sheets.id, sheetId), eq(sheets.applicationId, applicationId)))
    .limit(1);
  return s ?? null;
}

export async function listSheetsOfApplication(database: Db, applicationId: number) {
  return database
    .select({ id: sheets.id, sheetNumber: sheets.sheetNumber, page: sheets.page, title: sheets.title, documentId: sheets.documentId, cycle: documents.cycle })
    .from(sheets)
    .innerJoin(documents, eq(documents.id, sheets.documentId))
    .where(and(eq(sheets.applicationId, applicationId), eq(documents.kind, "drawings")))
    .orderBy(desc(documents.cycle), asc(sheets.documentId), asc(sheets.page));
}
