import "server-only";
import type { Db } from "@/db/client";
import { getApplicationDetail, loadFacts } from "@/db/queries/applications";
import { listAuditForApplication } from "@/db/queries/audit";
import { listHolidays } from "@/db/queries/settings";
import { env } from "@/lib/env";
import { notFound } from "@/lib/errors";
import { availableActions, can, checkAccess, STATE_INFO, stateLabel, type Actor } from "@/lib/workflow";
import { UPLOAD_LIMITS } from "./documents";

/**
 * The application as this reader may see it: applicants never see draft comments or
 * internal notes; everyone gets the buttons the workflow allows them.
 */
export async function applicationView(database: Db, actor: Actor, id: number) {
  const d = await getApplicationDetail(database, id);
  if (!d) throw notFound("That application");
  const resource = { state: d.row.state, applicantId: d.row.applicantId, assignedExaminerId: d.row.assignedExaminerId };
  if (checkAccess(actor, "application.view", resource) === "not_found") throw notFound("That application");
  const isApplicant = actor.role === "applicant";
  const facts = await loadFacts(database, d.row, { feeBeforeReview: env().PAYMENT_REQUIRED_BEFORE_REVIEW });
  const comments = d.comments
    .filter((c) => !isApplicant || c.status !== "draft")
    .map((c) => ({
      ...c,
      responses: d.responses.filter((r) => r.commentId === c.id),
    }));
  const timeline = (await listAuditForApplication(database, id))
    // Applicants see the department's draft work (comments, checks) only once it is issued to them.
    .filter((e) => !isApplicant || e.actorRole === "applicant" || !(e.action.startsWith("comment.") || e.action.startsWith("check.")))
    .map((e) => ({ id: e.id, at: e.at, action: e.action, summary: e.summary, actorName: e.actorName, actorRole: e.actorRole }));
  const r = d.row;
  return {
    application: {
      id: r.id,
      number: r.number,
      state: r.state,
      stateLabel: stateLabel(r.state),
      holder: STATE_INFO[r.state].holder,
      cycle: r.cycle,
      version: r.version,
      workDescription: r.workDescription,
      siteAddress: r.siteAddress,
      parcelNumber: r.parcelNumber,
      occupancyGroup: r.occupancyGroup,
      constructionType: r.constructionType,
      valuationCents: r.valuationCents,
      dporName: r.dporName,
      dporLicence: r.dporLicence,
      conditions: r.conditions ?? [],
      returnReasons: r.returnReasons ?? [],
      submittedAt: r.submittedAt,
      acceptedAt: r.acceptedAt,
      decidedAt: r.decidedAt,
      applicantName: d.applicantName,
      firmName: d.firmName,
      examinerName: d.examinerName,
      assignedExaminerId: r.assignedExaminerId,
    },
    documents: d.documents.map((doc) => ({ ...doc, url: `/api/documents/${doc.id}/file` })),
    sheets: d.sheets,
    comments,
    cycles: d.cycles,
    // For business-day arithmetic on the page (a few dozen days).
    holidays: (await listHolidays(database)).map((h) => h.day),
    timeline,
    actions: availableActions(actor, facts),
    permissions: {
      upload: can(actor, "document.upload", resource),
      edit: can(actor, "application.edit_draft", resource),
      comment: can(actor, "comment.create", resource),
      respond: can(actor, "comment.respond", resource),
      resolve: can(actor, "comment.resolve", resource),
    },
    uploadLimits: UPLOAD_LIMITS,
    viewer: { role: actor.role },
  };
}

export type ApplicationView = Awaited<ReturnType<typeof applicationView>>;
