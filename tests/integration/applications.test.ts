import { readdir } from "node:fs/promises";
import path from "node:path";
import { eq } from "drizzle-orm";
import { beforeEach, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { getApplicationRow } from "@/db/queries/applications";
import { listAuditForApplication } from "@/db/queries/audit";
import { applications, auditEvents, comments, documents, outbox, reviewCycles, sheets } from "@/db/schema";
import { uploadDocument } from "@/lib/applications/documents";
import { addComment, createApplication, fireEvent, judgeResponse, respondToComment } from "@/lib/applications/service";
import { applicationView } from "@/lib/applications/view";
import { AppError } from "@/lib/errors";
import { WorkflowError } from "@/lib/workflow";
import {
  makeCalcPackage,
  makeDrawingSet,
  makeEmptyFile,
  makeEncryptedPdf,
  makeRenamedPng,
  makeTruncatedPdf,
} from "../fixtures/pdf/make";
import { makeUser, resetDb } from "./db-helpers";

const input = {
  workDescription: "Two-story wood-frame addition with a glulam ridge beam",
  siteAddress: "1250 Alder Street, Larkspur Falls",
  parcelNumber: "114-220-07",
  occupancyGroup: "R-3" as const,
  constructionType: "VB" as const,
  valuation: 48_000_000,
  dporName: "Owen Corbel, PE",
  dporLicence: "PE-40211",
};

async function people() {
  const applicant = { ...(await makeUser("applicant")), firmId: null };
  const other = { ...(await makeUser("applicant")), firmId: null };
  const tech = { ...(await makeUser("technician")), firmId: null };
  const examiner = { ...(await makeUser("examiner")), firmId: null };
  const examiner2 = { ...(await makeUser("examiner")), firmId: null };
  return { applicant, other, tech, examiner, examiner2 };
}

async function withDrawings(p: Awaited<ReturnType<typeof people>>) {
  const app = await createApplication(db(), p.applicant, input);
  const pdf = await makeDrawingSet({ sheets: [{ number: "S-101", title: "FOUNDATION PLAN" }, { number: "S-201", title: "SECOND FLOOR FRAMING PLAN" }] });
  await uploadDocument(db(), p.applicant, app.id, "drawings", "structural-set.pdf", pdf);
  return app;
}

const version = async (id: number) => (await getApplicationRow(db(), id))!.version;

beforeEach(resetDb);

describe("applications through the workflow", () => {
  it("numbers a new application and keeps it from other applicants (404)", async () => {
    const p = await people();
    const app = await createApplication(db(), p.applicant, input);
    expect(app.number).toMatch(/^LFB-\d{2}-\d{5}$/);
    await expect(applicationView(db(), p.other, app.id)).rejects.toMatchObject({ code: "not_found" });
    await expect(applicationView(db(), p.tech, app.id)).rejects.toMatchObject({ code: "not_found" }); // drafts are not filed yet
    const view = await applicationView(db(), p.applicant, app.id);
    expect(view.actions.map((a) => a.event)).toEqual(["submit", "withdraw"]);
  });

  it("runs the whole road: submit, return, resubmit, accept, corrections, response, approval with conditions", async () => {
    const p = await people();
    const app = await withDrawings(p);
    await fireEvent(db(), p.applicant, app.id, "submit", await version(app.id));
    await fireEvent(db(), p.tech, app.id, "return_incomplete", await version(app.id), { reasons: ["Calculation package missing"] });
    await fireEvent(db(), p.applicant, app.id, "submit", await version(app.id));
    await fireEvent(db(), p.tech, app.id, "accept", await version(app.id), { examinerId: p.examiner.id });
    let row = (await getApplicationRow(db(), app.id))!;
    expect(row).toMatchObject({ state: "in_review", cycle: 1, assignedExaminerId: p.examiner.id });
    // First review: 10 business days by default (at least 14 calendar days later, at most 18 with holidays).
    const days = (row.dueAt!.getTime() - row.acceptedAt!.getTime()) / 86_400_000;
    expect(days).toBeGreaterThan(13);
    expect(days).toBeLessThan(19);

    const sheetRows = await db().select().from(sheets).where(eq(sheets.applicationId, app.id));
    const c = await addComment(db(), p.examiner, app.id, {
      discipline: "Structural",
      sheetId: sheetRows[1]!.id,
      pinX: 0.4,
      pinY: 0.55,
      codeSection: "IBC 1604.3",
      codeEdition: "2021 IBC",
      body: "Floor beam FB-3: show the live-load deflection check against L/360.",
    });
    expect(c.number).toBe(1);
    // The applicant does not see a draft comment, nor its trace in the history.
    const before = await applicationView(db(), p.applicant, app.id);
    expect(before.comments).toHaveLength(0);
    expect(before.timeline.map((e) => e.action)).not.toContain("comment.added");
    expect((await applicationView(db(), p.examiner, app.id)).timeline.map((e) => e.action)).toContain("comment.added");
    await fireEvent(db(), p.examiner, app.id, "issue_corrections", await version(app.id));
    expect((await applicationView(db(), p.applicant, app.id)).comments[0]).toMatchObject({ number: 1, status: "open" });
    expect((await getApplicationRow(db(), app.id))!.dueAt).toBeNull(); // the clock stops while corrections are out

    await expect(fireEvent(db(), p.applicant, app.id, "resubmit", await version(app.id))).rejects.toMatchObject({ code: "guard_failed" });
    await respondToComment(db(), p.applicant, app.id, c.id, { body: "Deflection check added on calc page 7.", changeReference: "Calc p. 7, sheet S-201 rev 1" });
    await uploadDocument(db(), p.applicant, app.id, "calculations", "calcs-rev1.pdf", await makeCalcPackage({ pages: [["FB-3 deflection check"]] }));
    await fireEvent(db(), p.applicant, app.id, "resubmit", await version(app.id));
    row = (await getApplicationRow(db(), app.id))!;
    expect(row).toMatchObject({ state: "resubmitted", cycle: 2 });
    const docs = await db().select().from(documents).where(eq(documents.applicationId, app.id));
    expect(docs.map((d) => [d.kind, d.cycle])).toEqual([["drawings", 1], ["calculations", 2]]);

    await fireEvent(db(), p.examiner, app.id, "begin_review", await version(app.id));
    await judgeResponse(db(), p.examiner, app.id, c.id, "resolved");
    await fireEvent(db(), p.examiner, app.id, "approve_with_conditions", await version(app.id), {
      conditions: [{ text: "Deferred submittal: roof truss shop drawings before framing inspection." }],
    });
    row = (await getApplicationRow(db(), app.id))!;
    expect(row.state).toBe("approved_with_conditions");
    expect(row.conditions).toEqual(["Deferred submittal: roof truss shop drawings before framing inspection."]);

    const cycles = await db().select().from(reviewCycles).where(eq(reviewCycles.applicationId, app.id));
    expect(cycles.map((x) => [x.number, x.outcome])).toEqual([[1, "corrections_issued"], [2, "approved_with_conditions"]]);
    const timeline = (await listAuditForApplication(db(), app.id)).map((e) => e.action);
    expect(timeline).toEqual(
      expect.arrayContaining(["application.submitted", "application.returned_incomplete", "application.accepted", "review.corrections_issued", "application.resubmitted", "review.approved_with_conditions"]),
    );
    const mails = await db().select().from(outbox).where(eq(outbox.applicationId, app.id));
    const byTemplate = (t: string) => mails.filter((m) => m.template === t).map((m) => m.toAddress);
    expect(byTemplate("intake.returned_incomplete")).toEqual([p.applicant.email]);
    expect(byTemplate("review.assigned")).toEqual([p.examiner.email]);
    expect(byTemplate("review.corrections_issued")).toEqual([p.applicant.email]);
    expect(byTemplate("review.resubmitted")).toEqual([p.examiner.email]);
    expect(byTemplate("intake.new_submission")).toEqual([p.tech.email, p.tech.email]);
    expect(mails.find((m) => m.template === "review.approved_with_conditions")?.textBody).toContain("roof truss shop drawings");
  });

  it("two people acting at once: exactly one wins, the other gets a 409 to reload", async () => {
    const p = await people();
    const app = await withDrawings(p);
    await fireEvent(db(), p.applicant, app.id, "submit", await version(app.id));
    const v = await version(app.id);
    const techB = { ...(await makeUser("technician")), firmId: null };
    const results = await Promise.allSettled([
      fireEvent(db(), p.tech, app.id, "accept", v, { examinerId: p.examiner.id }),
      fireEvent(db(), techB, app.id, "return_incomplete", v, { reasons: ["Seal missing on S-101"] }),
    ]);
    const won = results.filter((r) => r.status === "fulfilled");
    const lost = results.filter((r) => r.status === "rejected") as PromiseRejectedResult[];
    expect(won).toHaveLength(1);
    expect(lost).toHaveLength(1);
    expect(lost[0]!.reason).toBeInstanceOf(AppError);
    expect((lost[0]!.reason as AppError).status).toBe(409);
    expect((lost[0]!.reason as AppError).message).toMatch(/changed .* Reload/);
    const audits = await db().select().from(auditEvents).where(eq(auditEvents.applicationId, app.id));
    expect(audits.filter((a) => a.action === "application.accepted" || a.action === "application.returned_incomplete")).toHaveLength(1);
  });

  it("a failure in the middle of a transition leaves nothing half-written", async () => {
    const p = await people();
    const app = await withDrawings(p);
    const before = await getApplicationRow(db(), app.id);
    const auditsBefore = (await db().select().from(auditEvents)).length;
    await expect(fireEvent(db(), p.applicant, app.id, "submit", before!.version, undefined, { failAfterStateWrite: true })).rejects.toThrow(/injected failure/);
    expect(await getApplicationRow(db(), app.id)).toEqual(before);
    expect((await db().select().from(auditEvents)).length).toBe(auditsBefore);
    expect(await db().select().from(outbox)).toHaveLength(0);
  });

  it("refuses what the workflow refuses, with its coded error", async () => {
    const p = await people();
    const app = await withDrawings(p);
    await expect(fireEvent(db(), p.applicant, app.id, "approve", await version(app.id))).rejects.toBeInstanceOf(WorkflowError);
    await expect(fireEvent(db(), p.other, app.id, "submit", await version(app.id))).rejects.toMatchObject({ code: "not_found" });
    await fireEvent(db(), p.applicant, app.id, "submit", await version(app.id));
    await expect(fireEvent(db(), p.tech, app.id, "accept", await version(app.id), { examinerId: p.other.id })).rejects.toMatchObject({ code: "invalid_input" });
    await fireEvent(db(), p.tech, app.id, "accept", await version(app.id), { examinerId: p.examiner.id });
    await expect(fireEvent(db(), p.examiner2, app.id, "issue_corrections", await version(app.id))).rejects.toMatchObject({ code: "not_found" });
    await expect(fireEvent(db(), p.examiner, app.id, "issue_corrections", await version(app.id))).rejects.toMatchObject({ code: "guard_failed" });
  });

  it("an application cannot be submitted without a drawing set", async () => {
    const p = await people();
    const app = await createApplication(db(), p.applicant, input);
    await expect(fireEvent(db(), p.applicant, app.id, "submit", await version(app.id))).rejects.toThrow(/Upload the drawing set/);
    expect((await getApplicationRow(db(), app.id))!.state).toBe("draft");
  });
});

describe("uploads", () => {
  const storageDir = () => path.resolve(process.env.STORAGE_DIR!);
  async function storedFiles(): Promise<string[]> {
    const out: string[] = [];
    async function walk(d: string) {
      for (const e of await readdir(d, { withFileTypes: true }).catch(() => [])) {
        if (e.isDirectory()) await walk(path.join(d, e.name));
        else out.push(path.join(d, e.name));
      }
    }
    await walk(storageDir());
    return out.sort();
  }

  it("stores a valid PDF with its page count and sheet numbers read from the text layer", async () => {
    const p = await people();
    const app = await createApplication(db(), p.applicant, input);
    const pdf = await makeDrawingSet({ sheets: [{ number: "S-001", title: "GENERAL NOTES" }, { number: "S-101", title: "FOUNDATION PLAN" }, { title: "UNNUMBERED DETAIL PAGE" }] });
    const r = await uploadDocument(db(), p.applicant, app.id, "drawings", "set.pdf", pdf);
    expect(r.pageCount).toBe(3);
    const rows = await db().select().from(sheets).where(eq(sheets.documentId, r.id));
    expect(rows.map((s) => s.sheetNumber)).toEqual(["S-001", "S-101", null]);
    expect(rows[1]!.title).toBe("FOUNDATION PLAN");
  });

  it.each([
    ["a renamed PNG", () => makeRenamedPng(), /not a PDF/],
    ["a truncated PDF", () => makeTruncatedPdf(), /incomplete/],
    ["an encrypted PDF", () => makeEncryptedPdf(), /password-protected or encrypted/],
    ["an empty file", () => makeEmptyFile(), /empty/],
  ])("refuses %s with its own message and leaves no row and no file", async (_name, make, message) => {
    const p = await people();
    const app = await createApplication(db(), p.applicant, input);
    const filesBefore = await storedFiles();
    const bytes = await make();
    const err = await uploadDocument(db(), p.applicant, app.id, "drawings", "upload.pdf", bytes).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(AppError);
    expect((err as AppError).message).toMatch(message);
    expect(await db().select().from(documents)).toHaveLength(0);
    expect(await storedFiles()).toEqual(filesBefore);
  });

  it("refuses an over-size file while streaming, leaving nothing behind", async () => {
    const p = await people();
    const app = await createApplication(db(), p.applicant, input);
    const filesBefore = await storedFiles();
    async function* huge() {
      const chunk = new Uint8Array(1024 * 1024);
      for (let i = 0; i < 70; i++) yield chunk;
    }
    await expect(uploadDocument(db(), p.applicant, app.id, "drawings", "huge.pdf", huge())).rejects.toThrow(/larger than the/);
    expect(await db().select().from(documents)).toHaveLength(0);
    expect(await storedFiles()).toEqual(filesBefore);
  });

  it("detects the same file twice in one application", async () => {
    const p = await people();
    const app = await createApplication(db(), p.applicant, input);
    const pdf = await makeDrawingSet({ sheets: [{ number: "A-101", title: "FLOOR PLAN" }] });
    await uploadDocument(db(), p.applicant, app.id, "drawings", "a.pdf", pdf);
    const filesBefore = await storedFiles();
    await expect(uploadDocument(db(), p.applicant, app.id, "drawings", "copy-of-a.pdf", pdf)).rejects.toThrow(/already in the application, as “a.pdf”/);
    expect(await db().select().from(documents)).toHaveLength(1);
    expect(await storedFiles()).toEqual(filesBefore);
  });

  it("refuses a file name with a path in it", async () => {
    const p = await people();
    const app = await createApplication(db(), p.applicant, input);
    await expect(uploadDocument(db(), p.applicant, app.id, "drawings", "../../etc/passwd.pdf", await makeDrawingSet({ sheets: [{ title: "X" }] }))).rejects.toBeInstanceOf(AppError);
    expect(await db().select().from(applications).where(eq(applications.id, app.id))).toHaveLength(1);
    expect(await db().select().from(comments)).toHaveLength(0);
  });
});
