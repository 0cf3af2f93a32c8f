import { eq, sql } from "drizzle-orm";
import { beforeEach, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { getApplicationRow } from "@/db/queries/applications";
import { auditEvents, comments, deflectionChecks, documents, sheets } from "@/db/schema";
import { errorResponse } from "@/lib/api/handler";
import { uploadDocument } from "@/lib/applications/documents";
import { createApplication, fireEvent, respondToComment } from "@/lib/applications/service";
import { DEFAULT_BEAM, type BeamFormInput } from "@/lib/checks/beam-form";
import { DEFAULT_OPTIONS } from "@/lib/checks/claims";
import { DEFAULT_MATERIAL } from "@/lib/checks/materials";
import { saveRequestSchema } from "@/lib/checks/schemas";
import { DEFAULT_SECTION } from "@/lib/checks/sections";
import {
  commentFromCheck,
  getCheck,
  listChecks,
  markChecksForReverify,
  rerunCheck,
  runCheck,
  runSchedule,
  saveCheck,
  uploadMemberModel,
} from "@/lib/checks/service";
import { AppError } from "@/lib/errors";
import { makeCalcPackage, makeDrawingSet } from "../fixtures/pdf/make";
import { makeUser, resetDb } from "./db-helpers";
import { FB3_MODEL } from "@/tests/fixtures/fb3-model";

const input = {
  workDescription: "Second-floor addition with a glulam floor beam FB-3",
  siteAddress: "77 Millwright Court, Larkspur Falls",
  parcelNumber: "119-402-18",
  occupancyGroup: "R-3" as const,
  constructionType: "VB" as const,
  valuation: 18_500_000,
  dporName: "Owen Corbel, PE",
  dporLicence: "PE-40211",
};

// FB-3 of an invented Corbel & Finch calc: 5-1/8 × 12 in 24F-1.8E glulam, 16 ft, D 72 plf, L 240 plf,
// claimed Δ_L = 0.21 in. By 5wl⁴/384EI (AISC Table 3-23, case 1) Δ_L = 0.2664 in: the claim is 21 % low.
const FB3: BeamFormInput = {
  ...DEFAULT_BEAM,
  spans: [{ length: "16" }],
  section: { ...DEFAULT_SECTION, source: "rect", b: "5.125", d: "12", dimUnit: "in" },
  material: { ...DEFAULT_MATERIAL, source: "glulam", stressClass: "24F-1.8E" },
  creepMaterial: "glulam",
  loads: [
    { case: "D", type: "uniform", on: "all", w: "72", unit: "plf", wEnd: "", at: "", from: "", to: "", note: "" },
    { case: "L", type: "uniform", on: "all", w: "240", unit: "plf", wEnd: "", at: "", from: "", to: "", note: "" },
  ],
  claims: [{ segment: "S1", combo: "L", delta: "0.21", unit: "in", location: "midspan" }],
};

const goodModel = FB3_MODEL;

async function people() {
  const applicant = { ...(await makeUser("applicant")), firmId: null };
  const tech = { ...(await makeUser("technician")), firmId: null };
  const examiner = { ...(await makeUser("examiner")), firmId: null };
  const other = { ...(await makeUser("examiner")), firmId: null };
  return { applicant, tech, examiner, other };
}

const version = async (id: number) => (await getApplicationRow(db(), id))!.version;

async function inReview(p: Awaited<ReturnType<typeof people>>) {
  const app = await createApplication(db(), p.applicant, input);
  await uploadDocument(db(), p.applicant, app.id, "drawings", "structural.pdf", await makeDrawingSet({ sheets: [{ number: "S-201", title: "SECOND FLOOR FRAMING PLAN" }] }));
  const calc = await uploadDocument(db(), p.applicant, app.id, "calculations", "calcs.pdf", await makeCalcPackage({ pages: [["FB-3  Span L = 16'-0\"", "wD = 72 plf  wL = 240 plf", "DL = 0.21 in < L/360"]] }));
  await fireEvent(db(), p.applicant, app.id, "submit", await version(app.id));
  await fireEvent(db(), p.tech, app.id, "accept", await version(app.id), { examinerId: p.examiner.id });
  const [sheet] = await db().select().from(sheets).where(eq(sheets.applicationId, app.id));
  return { ...app, calcId: calc.id, sheetId: sheet!.id };
}

const request = (source: unknown, extra: Record<string, unknown> = {}) =>
  saveRequestSchema.parse({ source, options: {}, purpose: "review", memberMark: "FB-3", ...extra });

const checkCount = async () => Number((await db().select({ n: sql<number>`count(*)` }).from(deflectionChecks))[0]!.n);

async function refusal(promise: Promise<unknown>) {
  const e = await promise.then(
    () => null,
    (err: unknown) => err,
  );
  expect(e).toBeInstanceOf(AppError);
  const res = errorResponse(e);
  return { error: e as AppError, status: res.status, body: (await res.json()) as { error: { code: string; message: string; fields?: Record<string, string> } } };
}

beforeEach(resetDb);

describe("deflection checks: refused models answer 422 with the field named, and nothing is saved", () => {
  it("a malformed model", async () => {
    const p = await people();
    const app = await inReview(p);
    const bad = { ...goodModel, nodes: { A: ["0 ft"], B: ["16 ft", "0 ft"] } };
    const r = await refusal(saveCheck(db(), p.examiner, app.id, request({ form: "model", model: bad })));
    expect(r.status).toBe(422);
    expect(r.body.error.message).toBe('nodes.A: must be two coordinates, e.g. ["0 ft", "0 ft"]');
    expect(r.body.error.fields).toEqual({ "nodes.A": 'nodes.A: must be two coordinates, e.g. ["0 ft", "0 ft"]' });
    expect(await checkCount()).toBe(0);
  });

  it("a unit mistake", async () => {
    const p = await people();
    const app = await inReview(p);
    const bad = { ...goodModel, members: { AB: { ends: ["A", "B"], E: "1800 ksi", I: "738 in^3" } } };
    const r = await refusal(saveCheck(db(), p.examiner, app.id, request({ form: "model", model: bad })));
    expect(r.status).toBe(422);
    expect(r.body.error.message).toBe('members.AB.I: unit "in^3" is not a second moment of area');
    expect(await checkCount()).toBe(0);
    // the run endpoint's service refuses it the same way
    const run = await refusal(Promise.resolve().then(() => runCheck(p.examiner, { form: "model", model: bad }, DEFAULT_OPTIONS)));
    expect(run.body.error.message).toBe('members.AB.I: unit "in^3" is not a second moment of area');
  });

  it("a mechanism", async () => {
    const p = await people();
    const app = await inReview(p);
    const bad = { ...goodModel, supports: { A: "roller", B: "roller" } };
    const r = await refusal(saveCheck(db(), p.examiner, app.id, request({ form: "model", model: bad })));
    expect(r.status).toBe(422);
    expect(r.body.error.message).toMatch(/^supports: the structure is a mechanism — node [AB] can move in x$/);
    expect(await checkCount()).toBe(0);
  });

  it("the beam form's own field errors come back on the form's field", async () => {
    const p = await people();
    const app = await inReview(p);
    const r = await refusal(saveCheck(db(), p.examiner, app.id, request({ form: "beam", title: "FB-3", mark: "FB-3", input: { ...FB3, claims: [{ segment: "S1", combo: "Lr", delta: "0.2", unit: "in" }] } })));
    expect(r.status).toBe(422);
    expect(r.body.error.fields?.["claims.0.combo"]).toBe('checks[0].claimed[0].combo: "Lr" is not a combination of this check (L, D+L)');
    expect(await checkCount()).toBe(0);
  });
});

describe("a saved check", () => {
  it("keeps the model verbatim, the options, the solver version and the result; a re-run gives identical numbers", async () => {
    const p = await people();
    const app = await inReview(p);
    const saved = await saveCheck(db(), p.examiner, app.id, request({ form: "beam", title: "FB-3 floor beam", mark: "FB-3", input: FB3 }, { sheetId: app.sheetId, calcDocumentId: app.calcId, calcPage: 1 }));
    expect(saved.verdict).toBe("disputed");
    const [row] = await db().select().from(deflectionChecks).where(eq(deflectionChecks.id, saved.id));
    expect(row).toMatchObject({ applicationId: app.id, cycle: 1, purpose: "review", memberMark: "FB-3", createdBy: p.examiner.id, status: "current", options: { creep: "ibc-footnote-d", limits: "IBC 2021 Table 1604.3 Deflection Limits" } });
    expect(row!.solverVersion).toMatch(/^spanproof-solver /);
    const stored = row!.result as { checks: { combos: { name: string; verdict: { delta_m: number } }[] }[] };
    // 5wl⁴/384EI, w = 20 lbf/in, l = 192 in, E = 1.8e6 psi, I = 738 in⁴ (AISC Table 3-23, case 1)
    expect(stored.checks[0]!.combos.find((c) => c.name === "L")!.verdict.delta_m / 0.0254).toBeCloseTo((5 * 20 * 192 ** 4) / (384 * 1.8e6 * 738), 9);

    const again = await rerunCheck(db(), p.examiner, app.id, saved.id);
    expect(again.differences).toEqual([]);
    expect(again.identical).toBe(true);
    const audit = await db().select().from(auditEvents).where(eq(auditEvents.action, "check.saved"));
    expect(audit).toHaveLength(1);
  });

  it("opening it shows what was stored, never a fresh computation; a re-run names what differs", async () => {
    const p = await people();
    const app = await inReview(p);
    const saved = await saveCheck(db(), p.examiner, app.id, request({ form: "model", model: goodModel }));
    // Pretend an older engine wrote a slightly different number.
    const [row] = await db().select().from(deflectionChecks).where(eq(deflectionChecks.id, saved.id));
    const old = structuredClone(row!.result) as { solver_version: string; checks: { combos: { verdict: { delta_m: number } }[] }[] };
    old.solver_version = "spanproof-solver 0.9.0";
    old.checks[0]!.combos[0]!.verdict.delta_m = 0.00123;
    await db().update(deflectionChecks).set({ result: old, solverVersion: "spanproof-solver 0.9.0" }).where(eq(deflectionChecks.id, saved.id));

    const view = await getCheck(db(), p.examiner, app.id, saved.id);
    expect(view.check.solverVersion).toBe("spanproof-solver 0.9.0");
    expect(view.check.result.checks[0]!.combos[0]!.verdict.delta_m).toBe(0.00123);
    const again = await rerunCheck(db(), p.examiner, app.id, saved.id);
    expect(again.identical).toBe(false);
    expect(again.differences).toEqual(expect.arrayContaining([expect.stringMatching(/^result\.solver_version: /), expect.stringMatching(/^result\.checks\[0\]\.combos\[0\]\.verdict\.delta_m: 0\.00123 then, /)]));
    // the stored row is untouched by the re-run
    const [after] = await db().select().from(deflectionChecks).where(eq(deflectionChecks.id, saved.id));
    expect((after!.result as typeof old).checks[0]!.combos[0]!.verdict.delta_m).toBe(0.00123);
  });

  it("becomes a correction comment in one step, once, with the numbers, IBC 1604.3 and the link", async () => {
    const p = await people();
    const app = await inReview(p);
    const saved = await saveCheck(db(), p.examiner, app.id, request({ form: "beam", title: "FB-3", mark: "FB-3", input: FB3 }, { sheetId: app.sheetId, calcDocumentId: app.calcId, calcPage: 1 }));
    const c = await commentFromCheck(db(), p.examiner, app.id, saved.id);
    const [row] = await db().select().from(comments).where(eq(comments.id, c.id));
    expect(row).toMatchObject({ checkId: saved.id, codeSection: "IBC 1604.3", codeEdition: "2021 IBC", status: "draft", cycle: 1, sheetId: app.sheetId, discipline: "Structural" });
    expect(row!.body).toContain("0.266 in (6.77 mm)");
    expect(row!.body).toContain(`/applications/${app.id}/checks/${saved.id}`);
    const twice = await refusal(commentFromCheck(db(), p.examiner, app.id, saved.id));
    expect(twice.status).toBe(409);
  });

  it("is marked re-verify when a resubmittal brings a new calculation package", async () => {
    const p = await people();
    const app = await inReview(p);
    const saved = await saveCheck(db(), p.examiner, app.id, request({ form: "beam", title: "FB-3", mark: "FB-3", input: FB3 }, { calcDocumentId: app.calcId, calcPage: 1 }));
    const c = await commentFromCheck(db(), p.examiner, app.id, saved.id);
    await fireEvent(db(), p.examiner, app.id, "issue_corrections", await version(app.id));
    await respondToComment(db(), p.applicant, app.id, c.id, { body: "FB-3 deflection recalculated.", changeReference: "Calc page 1 rev 1" });
    const revised = await uploadDocument(db(), p.applicant, app.id, "calculations", "calcs-rev1.pdf", await makeCalcPackage({ pages: [["FB-3 rev 1"]] }));
    const [doc] = await db().select().from(documents).where(eq(documents.id, revised.id));
    expect(doc!.cycle).toBe(2);
    // The upload of the new calculation package marked it, in the upload's own transaction.
    const [row] = await db().select().from(deflectionChecks).where(eq(deflectionChecks.id, saved.id));
    expect(row).toMatchObject({ status: "reverify", version: 2 });
    expect((await db().select().from(auditEvents).where(eq(auditEvents.action, "check.reverify"))).map((a) => a.summary)).toEqual([
      "1 deflection check marked re-verify: the calculation package was replaced for cycle 2.",
    ]);
    // a second call finds nothing left to mark
    expect(await db().transaction((tx) => markChecksForReverify(tx, app.id, 2))).toBe(0);
  });
});

describe("who may check", () => {
  it("another examiner's application is not found; an applicant saves pre-checks only, in any state", async () => {
    const p = await people();
    const app = await inReview(p);
    const stranger = await refusal(saveCheck(db(), p.other, app.id, request({ form: "model", model: goodModel })));
    expect(stranger.status).toBe(404);
    const wrongPurpose = await refusal(saveCheck(db(), p.applicant, app.id, request({ form: "model", model: goodModel })));
    expect(wrongPurpose.status).toBe(403);
    const pre = await saveCheck(db(), p.applicant, app.id, request({ form: "model", model: goodModel }, { purpose: "precheck" }));
    const review = await saveCheck(db(), p.examiner, app.id, request({ form: "model", model: goodModel }));
    // the applicant sees the pre-check, not the examiner's check until a comment from it is issued
    expect((await listChecks(db(), p.applicant, app.id)).checks.map((c) => c.id)).toEqual([pre.id]);
    expect((await refusal(getCheck(db(), p.applicant, app.id, review.id))).status).toBe(404);
    expect((await listChecks(db(), p.examiner, app.id)).checks.map((c) => c.id).sort()).toEqual([pre.id, review.id].sort());
    // technicians read, but do not run checks on the file
    expect((await listChecks(db(), p.tech, app.id)).permissions).toMatchObject({ run: false, save: false });
  });

  it("member models: the applicant uploads model files checked by the solver's parser", async () => {
    const p = await people();
    const draft = await createApplication(db(), p.applicant, input);
    const json = (v: unknown) => new TextEncoder().encode(JSON.stringify(v));
    const notJson = await refusal(uploadMemberModel(db(), p.applicant, draft.id, "fb3.model.json", new TextEncoder().encode("{ nodes: ")));
    expect(notJson.status).toBe(422);
    expect(notJson.body.error.message).toMatch(/^The file is not valid JSON/);
    const unit = await refusal(uploadMemberModel(db(), p.applicant, draft.id, "fb3.model.json", json({ ...goodModel, members: { AB: { ends: ["A", "B"], E: "1800 ksi", I: "738 in" } } })));
    expect(unit.status).toBe(422);
    expect(unit.body.error.fields).toEqual({ "members.AB.I": 'unit "in" is not a second moment of area' });
    const notModel = await refusal(uploadMemberModel(db(), p.applicant, draft.id, "fb3.pdf", json(goodModel)));
    expect(notModel.body.error.message).toBe("A member model is a .json model file.");
    const ok = await uploadMemberModel(db(), p.applicant, draft.id, "fb3.model.json", json(goodModel));
    expect(ok).toMatchObject({ title: "FB-3", kind: "beam", marks: ["FB-3"] });
    const [doc] = await db().select().from(documents).where(eq(documents.id, ok.id));
    expect(doc).toMatchObject({ kind: "member_model", contentType: "application/json", cycle: 1 });
    const dup = await refusal(uploadMemberModel(db(), p.applicant, draft.id, "copy.model.json", json(goodModel)));
    expect(dup.status).toBe(409);
    const staff = await refusal(uploadMemberModel(db(), p.examiner, draft.id, "x.model.json", json(goodModel)));
    expect(staff.status).toBe(404);
  });

  it("a schedule with a wrong header is refused whole; good rows come back with verdicts", async () => {
    const p = await people();
    const r = await refusal(Promise.resolve().then(() => runSchedule(p.applicant, "mark,span\nA,1 ft")));
    expect(r.status).toBe(422);
    expect(r.body.error.message).toMatch(/^Missing columns "supports", "loads", "section", "E", "claimed", "limit"\./);
    const ok = runSchedule(p.examiner, "mark,span,supports,loads,section,E,claimed,limit\nFB-3,16 ft,simple,L 240 plf,5.125x12 in,1800 ksi,L 0.21 in,floor\nX-1,16 ft,simple,L 240,2x12,1600 ksi,,floor");
    expect(ok.rows.map((x) => [x.mark, x.verdict])).toEqual([
      ["FB-3", "disputed"],
      ["X-1", null],
    ]);
    expect(ok.rows[1]!.error).toBe('Line 3 (X-1), loads: "L 240": write the case, the value and its unit, e.g. "L 240 plf" or "L 1.5 kip @ 6 ft"');
    const admin = { ...(await makeUser("admin")), firmId: null };
    expect((await refusal(Promise.resolve().then(() => runSchedule(admin, "")))).status).toBe(403);
  });
});
