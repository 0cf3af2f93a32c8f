import "server-only";
import { and, desc, eq, isNull, sql } from "drizzle-orm";
import { type Db, type Tx, withTransaction } from "@/db/client";
import { getApplicationRow, loadFacts, nextCommentNumber, toResource } from "@/db/queries/applications";
import { recordAudit } from "@/db/queries/audit";
import { enqueueMail, type OutgoingMail } from "@/db/queries/outbox";
import type { SessionUser } from "@/db/queries/users";
import { applications, assignments, comments, documents, responses, reviewCycles, sheets, users } from "@/db/schema";
import { DEPARTMENT } from "@/lib/department";
import { env } from "@/lib/env";
import { AppError, notFound, staleVersion } from "@/lib/errors";
import { createResubmittalInvoiceAtResubmit, createReviewInvoice, resubmittalFeeFor, voidOrRefundOnWithdraw } from "@/lib/fees/service";
import { renderNotice } from "@/lib/mail/notices";
import { tagRefusal } from "@/lib/security/refusal-audit";
import { dueDateFor } from "@/lib/review-clock/server";
import type { ApplicationInput } from "@/lib/validations/application";
import {
  checkAccess,
  transition,
  type Action,
  type EventInputs,
  type Notice,
  type TransitionResult,
  type WorkflowEvent,
} from "@/lib/workflow";

type Actor = Pick<SessionUser, "id" | "role" | "name" | "firmId">;

export function applicationNumber(id: number, year: number): string {
  return `${DEPARTMENT.numberPrefix}-${String(year % 100).padStart(2, "0")}-${String(id).padStart(5, "0")}`;
}

/** Throws 404 when the actor may not see the application at all, 403 when they may see but not do this. */
export async function authorize(database: Db | Tx, actor: Actor, applicationId: number, action: Action) {
  const row = await getApplicationRow(database, applicationId);
  if (!row) throw notFound("That application");
  const verdict = checkAccess(actor, action, toResource(row));
  // Tagged so the route handler audits the refusal after this transaction has rolled back.
  if (verdict === "not_found") throw tagRefusal(notFound("That application"), "not_visible");
  if (verdict === "forbidden") throw tagRefusal(new AppError("forbidden", "You cannot do that on this application now."), "forbidden");
  return row;
}

export async function createApplication(database: Db, actor: Actor, input: ApplicationInput, ip?: string) {
  if (actor.role !== "applicant") throw new AppError("forbidden", "Only applicants file applications.");
  return withTransaction(database, async (tx) => {
    const [created] = await tx
      .insert(applications)
      .values({ ...fields(input), applicantId: actor.id, firmId: actor.firmId })
      .$returningId();
    if (!created) throw new AppError("internal", "The application could not be saved.");
    const number = applicationNumber(created.id, new Date().getUTCFullYear());
    await tx.update(applications).set({ number }).where(eq(applications.id, created.id));
    await recordAudit(tx, { actor, action: "application.created", entityType: "application", entityId: created.id, applicationId: created.id, summary: `Draft ${number} started.`, ip });
    return { id: created.id, number };
  });
}

function fields(input: ApplicationInput) {
  return {
    workDescription: input.workDescription,
    siteAddress: input.siteAddress,
    parcelNumber: input.parcelNumber,
    occupancyGroup: input.occupancyGroup,
    constructionType: input.constructionType,
    valuationCents: input.valuation,
    dporName: input.dporName,
    dporLicence: input.dporLicence,
  };
}

export async function updateApplication(database: Db, actor: Actor, id: number, version: number, input: ApplicationInput, ip?: string) {
  await withTransaction(database, async (tx) => {
    const row = await authorize(tx, actor, id, "application.edit_draft");
    const r = await tx
      .update(applications)
      .set({ ...fields(input), version: row.version + 1, updatedAt: new Date() })
      .where(and(eq(applications.id, id), eq(applications.version, version)));
    if (r[0].affectedRows !== 1) throw staleVersion();
    await recordAudit(tx, { actor, action: "application.edited", entityType: "application", entityId: id, applicationId: id, summary: "Application details edited.", ip });
  });
}

async function examinerName(tx: Tx, id: number | null): Promise<string | null> {
  if (!id) return null;
  const [u] = await tx.select({ name: users.name }).from(users).where(eq(users.id, id)).limit(1);
  return u?.name ?? null;
}

/** The one road for every workflow event: decide, write state + cycle + audit + outbox, all or nothing. */
export async function fireEvent<E extends WorkflowEvent>(
  database: Db,
  actor: Actor,
  applicationId: number,
  event: E,
  expectedVersion: number,
  input?: EventInputs[E],
  extra?: { checklist?: Record<string, boolean>; ip?: string; failAfterStateWrite?: boolean },
): Promise<{ state: string; version: number }> {
  return withTransaction(database, async (tx) => {
    const row = await getApplicationRow(tx, applicationId);
    if (!row) throw notFound("That application");
    if (checkAccess(actor, "application.view", toResource(row)) === "not_found") throw notFound("That application");
    if (row.version !== expectedVersion) throw staleVersion();
    const facts = await loadFacts(tx, row, { feeBeforeReview: env().PAYMENT_REQUIRED_BEFORE_REVIEW });
    const result: TransitionResult<E> = transition(actor, facts, event, input);
    await checkEventPreconditions(tx, row, result);

    const now = new Date();
    const effects = result.effects;
    const examinerId = effects.assignment ? effects.assignment.examinerId : row.assignedExaminerId;
    const cycle = effects.cycle ? effects.cycle.start : row.cycle;
    const patch: Partial<typeof applications.$inferInsert> = {
      state: result.to,
      version: row.version + 1,
      updatedAt: now,
      cycle,
      assignedExaminerId: examinerId,
    };
    if (event === "submit") patch.submittedAt = now;
    if (event === "accept") patch.acceptedAt = now;
    if (event === "return_incomplete") patch.returnReasons = (result.input as { reasons: string[] }).reasons;
    if (event === "approve" || event === "approve_with_conditions") patch.decidedAt = now;
    // The review clock: a new cycle gets its due date; a decision or withdrawal clears it.
    // A resubmittal beyond the cycles the plan-review fee covers owes the schedule's fixed fee.
    const resubmittalFee = event === "resubmit" ? await resubmittalFeeFor(tx, cycle) : null;
    // Where payment is required before review, a cycle with a fee to pay (cycle 1's plan-review
    // fee, a later cycle's resubmittal fee) starts its clock when it is paid (lib/payments/settle.ts).
    const clockHeldForFee = env().PAYMENT_REQUIRED_BEFORE_REVIEW && (event === "accept" || resubmittalFee !== null);
    const dueAt = effects.cycle && !clockHeldForFee ? await dueDateFor(tx, now, cycle) : null;
    if (effects.cycle) {
      patch.dueAt = dueAt;
      patch.receivedAt = now;
    }
    if (["issue_corrections", "approve", "approve_with_conditions", "withdraw"].includes(event)) patch.dueAt = null;
    if (event === "approve_with_conditions") {
      patch.conditions = (result.input as { conditions: { text: string }[] }).conditions.map((c) => c.text);
    }
    const w = await tx
      .update(applications)
      .set(patch)
      .where(and(eq(applications.id, row.id), eq(applications.version, row.version), eq(applications.state, row.state)));
    if (w[0].affectedRows !== 1) throw staleVersion();
    if (extra?.failAfterStateWrite) throw new Error("injected failure after the state write");

    await applyCycleEffects(tx, row, result, cycle, examinerId, now, dueAt);
    if (effects.assignment) {
      await tx.update(assignments).set({ endedAt: now }).where(and(eq(assignments.applicationId, row.id), isNull(assignments.endedAt)));
      await tx.insert(assignments).values({
        applicationId: row.id,
        examinerId: effects.assignment.examinerId,
        assignedBy: actor.id,
        reason: event === "reassign" ? (result.input as { reason: string }).reason : "Assigned at intake",
      });
    }

    const names = new Map<number, string>();
    for (const id of [effects.assignment?.examinerId, effects.assignment?.previousExaminerId]) {
      if (id) names.set(id, (await examinerName(tx, id)) ?? `#${id}`);
    }
    const summary = effects.audit.summary.replace(/plans examiner #(\d+)/g, (m, id) => names.get(Number(id)) ?? m);
    await recordAudit(tx, {
      actor,
      action: effects.audit.type,
      entityType: "application",
      entityId: row.id,
      applicationId: row.id,
      summary,
      // The reassignment reason is internal: kept in detail, never in the summary applicants see.
      detail: { from: result.from, to: result.to, input: result.input, ...(extra?.checklist ? { checklist: extra.checklist } : {}) },
      ip: extra?.ip,
    });
    // Fees (lib/fees/service.ts): the invoice at acceptance and at a charged resubmittal; void or
    // refund on withdrawal before review.
    if (event === "accept") await createReviewInvoice(tx, row, now);
    if (resubmittalFee) await createResubmittalInvoiceAtResubmit(tx, row, cycle, resubmittalFee, now);
    if (event === "withdraw") await voidOrRefundOnWithdraw(tx, row);
    await enqueueMail(tx, await noticeMails(tx, { ...row, ...patch } as typeof row, result, effects.notices, cycle, examinerId));
    return { state: result.to, version: row.version + 1 };
  });
}

async function checkEventPreconditions(tx: Tx, row: typeof applications.$inferSelect, result: TransitionResult<WorkflowEvent>) {
  if (result.event === "submit") {
    const kinds = await tx
      .select({ kind: documents.kind })
      .from(documents)
      .where(eq(documents.applicationId, row.id));
    if (!kinds.some((k) => k.kind === "drawings")) {
      throw new AppError("unprocessable", "Upload the drawing set (PDF) before submitting.");
    }
  }
  if (result.effects.assignment) {
    const [u] = await tx.select().from(users).where(eq(users.id, result.effects.assignment.examinerId)).limit(1);
    if (!u || u.status !== "active" || (u.role !== "examiner" && u.role !== "supervisor")) {
      throw new AppError("invalid_input", "Choose an active plans examiner.", { examinerId: "Not an active plans examiner." });
    }
  }
}

async function applyCycleEffects(
  tx: Tx,
  row: typeof applications.$inferSelect,
  result: TransitionResult<WorkflowEvent>,
  cycle: number,
  examinerId: number | null,
  now: Date,
  dueAt: Date | null,
) {
  if (result.effects.cycle) {
    await tx.insert(reviewCycles).values({ applicationId: row.id, number: cycle, examinerId, receivedAt: now, dueAt });
  }
  if (result.event === "reassign") {
    await tx.update(reviewCycles).set({ examinerId }).where(and(eq(reviewCycles.applicationId, row.id), eq(reviewCycles.number, row.cycle)));
  }
  const outcome =
    result.event === "issue_corrections"
      ? "corrections_issued"
      : result.event === "approve"
        ? "approved"
        : result.event === "approve_with_conditions"
          ? "approved_with_conditions"
          : result.event === "withdraw" && row.cycle > 0
            ? "withdrawn"
            : null;
  if (outcome) {
    await tx
      .update(reviewCycles)
      .set({ decidedAt: now, outcome, version: sql`${reviewCycles.version} + 1` })
      .where(and(eq(reviewCycles.applicationId, row.id), eq(reviewCycles.number, row.cycle), isNull(reviewCycles.decidedAt)));
  }
  if (result.event === "issue_corrections") {
    // Draft comments become the issued correction list the applicant sees.
    await tx
      .update(comments)
      .set({ status: "open", version: sql`${comments.version} + 1` })
      .where(and(eq(comments.applicationId, row.id), eq(comments.status, "draft")));
  }
}

async function noticeMails(
  tx: Tx,
  row: typeof applications.$inferSelect,
  result: TransitionResult<WorkflowEvent>,
  notices: readonly Notice[],
  cycle: number,
  examinerId: number | null,
): Promise<OutgoingMail[]> {
  const link = `${env().APP_URL}/applications/${row.id}`;
  const examiner = await examinerName(tx, examinerId);
  const input = result.input as { reasons?: string[]; conditions?: { text: string }[]; reason?: string | null };
  const openComments = (await loadFacts(tx, row, { feeBeforeReview: false })).openComments.length;
  const mails: OutgoingMail[] = [];
  for (const n of notices) {
    const people =
      n.userId !== null
        ? await tx.select({ id: users.id, email: users.email, name: users.name }).from(users).where(and(eq(users.id, n.userId), eq(users.status, "active")))
        : await tx
            .select({ id: users.id, email: users.email, name: users.name })
            .from(users)
            .where(and(eq(users.role, n.to === "technicians" ? "technician" : "supervisor"), eq(users.status, "active")));
    for (const p of people) {
      const m = renderNotice(n.template, {
        number: row.number ?? `#${row.id}`,
        siteAddress: row.siteAddress,
        workDescription: row.workDescription,
        recipientName: p.name,
        link,
        cycle,
        examinerName: examiner,
        reasons: input.reasons,
        conditions: input.conditions?.map((c) => c.text),
        openComments,
        reason: result.event === "withdraw" ? (input.reason ?? null) : null,
        clockWaitsForFee: result.event === "accept" && env().PAYMENT_REQUIRED_BEFORE_REVIEW,
      });
      mails.push({
        dedupeKey: `app:${row.id}:v${row.version}:${n.template}:${p.id}`,
        template: n.template,
        to: { address: p.email, name: p.name },
        applicationId: row.id,
        ...m,
      });
    }
  }
  return mails;
}

// ---- comments and responses ----------------------------------------------------------

export interface CommentInput {
  discipline: string;
  sheetId?: number | null;
  pinX?: number | null;
  pinY?: number | null;
  codeSection: string;
  codeEdition: string;
  body: string;
  checkId?: number | null;
}

async function assertSheetOfApplication(tx: Tx, applicationId: number, sheetId: number | null | undefined) {
  if (!sheetId) return;
  const [s] = await tx.select({ id: sheets.id }).from(sheets).where(and(eq(sheets.id, sheetId), eq(sheets.applicationId, applicationId))).limit(1);
  if (!s) throw new AppError("invalid_input", "That sheet is not part of this application.", { sheetId: "Not a sheet of this application." });
}

/** A correction comment starts as a draft; issuing the correction list makes it visible to the applicant. */
export async function addComment(database: Db, actor: Actor, applicationId: number, input: CommentInput, ip?: string) {
  for (let attempt = 0; attempt < 3; attempt++) {
    try {
      return await withTransaction(database, async (tx) => {
        const row = await authorize(tx, actor, applicationId, "comment.create");
        await assertSheetOfApplication(tx, applicationId, input.sheetId);
        const number = await nextCommentNumber(tx, applicationId);
        const [c] = await tx
          .insert(comments)
          .values({
            applicationId,
            number,
            cycle: row.cycle,
            discipline: input.discipline,
            sheetId: input.sheetId ?? null,
            pinX: input.pinX ?? null,
            pinY: input.pinY ?? null,
            codeSection: input.codeSection,
            codeEdition: input.codeEdition,
            body: input.body,
            checkId: input.checkId ?? null,
            createdBy: actor.id,
          })
          .$returningId();
        await recordAudit(tx, { actor, action: "comment.added", entityType: "comment", entityId: c!.id, applicationId, summary: `Correction comment ${number} drafted (${input.codeSection}).`, ip });
        return { id: c!.id, number };
      });
    } catch (e) {
      // Two examiners numbering at once: the unique (application, number) index makes one retry.
      if ((e as { cause?: { code?: string } }).cause?.code !== "ER_DUP_ENTRY" && (e as { code?: string }).code !== "ER_DUP_ENTRY") throw e;
    }
  }
  throw new AppError("conflict", "Comments were being numbered at the same time. Try again.");
}

export async function editComment(database: Db, actor: Actor, applicationId: number, commentId: number, version: number, input: Partial<CommentInput>, ip?: string) {
  await withTransaction(database, async (tx) => {
    await authorize(tx, actor, applicationId, "comment.create");
    await assertSheetOfApplication(tx, applicationId, input.sheetId);
    const r = await tx
      .update(comments)
      .set({ ...input, version: version + 1 })
      .where(and(eq(comments.id, commentId), eq(comments.applicationId, applicationId), eq(comments.version, version), eq(comments.status, "draft")));
    if (r[0].affectedRows !== 1) throw new AppError("conflict", "That comment was issued or changed meanwhile; only draft comments can be edited. Reload.");
    await recordAudit(tx, { actor, action: "comment.edited", entityType: "comment", entityId: commentId, applicationId, summary: "Draft correction comment edited.", ip });
  });
}

export async function deleteDraftComment(database: Db, actor: Actor, applicationId: number, commentId: number, ip?: string) {
  await withTransaction(database, async (tx) => {
    await authorize(tx, actor, applicationId, "comment.create");
    const r = await tx.delete(comments).where(and(eq(comments.id, commentId), eq(comments.applicationId, applicationId), eq(comments.status, "draft")));
    if (r[0].affectedRows !== 1) throw new AppError("conflict", "Only draft comments can be removed; issued comments stay on the record.");
    await recordAudit(tx, { actor, action: "comment.removed", entityType: "comment", entityId: commentId, applicationId, summary: "Draft correction comment removed before issue.", ip });
  });
}

/** The applicant's answer to one comment in the current cycle; answering again replaces it until resubmittal. */
export async function respondToComment(
  database: Db,
  actor: Actor,
  applicationId: number,
  commentId: number,
  input: { body: string; changeReference: string; documentId?: number | null },
  ip?: string,
) {
  await withTransaction(database, async (tx) => {
    const row = await authorize(tx, actor, applicationId, "comment.respond");
    const [c] = await tx.select().from(comments).where(and(eq(comments.id, commentId), eq(comments.applicationId, applicationId))).limit(1);
    if (!c || c.status !== "open") throw new AppError("invalid_input", "Only open correction comments take a response.");
    if (input.documentId) {
      const [d] = await tx.select({ id: documents.id }).from(documents).where(and(eq(documents.id, input.documentId), eq(documents.applicationId, applicationId))).limit(1);
      if (!d) throw new AppError("invalid_input", "That document is not part of this application.", { documentId: "Not a document of this application." });
    }
    await tx
      .insert(responses)
      .values({ commentId, cycle: row.cycle, body: input.body, changeReference: input.changeReference, documentId: input.documentId ?? null, createdBy: actor.id })
      .onDuplicateKeyUpdate({ set: { body: input.body, changeReference: input.changeReference, documentId: input.documentId ?? null, version: sql`${responses.version} + 1` } });
    await recordAudit(tx, { actor, action: "comment.responded", entityType: "comment", entityId: commentId, applicationId, summary: `Response to comment ${c.number}${input.changeReference ? ` (see ${input.changeReference})` : ""}.`, ip });
  });
}

/** The examiner's verdict on a response: resolved closes the comment, not resolved carries it into the next cycle. */
export async function judgeResponse(
  database: Db,
  actor: Actor,
  applicationId: number,
  commentId: number,
  verdict: "resolved" | "not_resolved",
  ip?: string,
) {
  await withTransaction(database, async (tx) => {
    await authorize(tx, actor, applicationId, "comment.resolve");
    const [c] = await tx.select().from(comments).where(and(eq(comments.id, commentId), eq(comments.applicationId, applicationId))).limit(1);
    if (!c || c.status !== "open") throw new AppError("invalid_input", "Only open correction comments can be resolved.");
    const now = new Date();
    const [latest] = await tx
      .select({ id: responses.id })
      .from(responses)
      .where(eq(responses.commentId, commentId))
      .orderBy(desc(responses.cycle))
      .limit(1);
    if (latest) {
      await tx
        .update(responses)
        .set({ verdict, reviewedBy: actor.id, reviewedAt: now, version: sql`${responses.version} + 1` })
        .where(eq(responses.id, latest.id));
    }
    if (verdict === "resolved") {
      const r = await tx
        .update(comments)
        .set({ status: "resolved", resolvedAt: now, resolvedBy: actor.id, version: c.version + 1 })
        .where(and(eq(comments.id, commentId), eq(comments.version, c.version)));
      if (r[0].affectedRows !== 1) throw new AppError("conflict", "That comment changed meanwhile. Reload.");
    }
    await recordAudit(tx, {
      actor,
      action: verdict === "resolved" ? "comment.resolved" : "comment.not_resolved",
      entityType: "comment",
      entityId: commentId,
      applicationId,
      summary: verdict === "resolved" ? `Comment ${c.number} resolved.` : `Comment ${c.number} not resolved; it carries into the next cycle.`,
      ip,
    });
  });
}
