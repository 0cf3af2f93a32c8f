import "server-only";
import type { Readable } from "node:stream";
import type { z } from "zod";
import { type Db, type Tx, withTransaction } from "@/db/client";
import { getApplicationRow, toResource } from "@/db/queries/applications";
import { recordAudit } from "@/db/queries/audit";
import {
  findDocumentBySha,
  getCheckForApplication,
  getCommentForCheck,
  getDocumentOfApplication,
  getSheetOfApplication,
  insertCheck,
  listCheckComments,
  listChecksForApplication,
  listDocumentsOfKind,
  listSheetsOfApplication,
} from "@/db/queries/checks";
import type { SessionUser } from "@/db/queries/users";
import { documents } from "@/db/schema";
import { storage, uploadCycle } from "@/lib/applications/documents";
import { addComment } from "@/lib/applications/service";
import { buildBeamModel, fieldForPath, type BuiltModel } from "@/lib/checks/beam-form";
import { DEFAULT_OPTIONS, LIMITS_SOURCE, type CheckOptions } from "@/lib/checks/claims";
import { parseSchedule, formatRowError } from "@/lib/checks/schedule";
import { type RunSource, type saveRequestSchema } from "@/lib/checks/schemas";
import { linesOf, scanCalcText, type Found } from "@/lib/checks/suggestions";
import { buildTableModel } from "@/lib/checks/table-form";
import { commentBody, overallVerdict, summarize, type CheckVerdict } from "@/lib/checks/verdict";
import { env } from "@/lib/env";
import { AppError, notFound } from "@/lib/errors";
import { readPdf } from "@/lib/pdf/parse";
import { StorageError, readAll } from "@/lib/storage/storage";
import { checkUploadName } from "@/lib/pdf/upload-name";
import { parseModel, solve, SolverInputError, SOLVER_VERSION, type SolveResult } from "@/lib/solver";
import { checkAccess, type Action } from "@/lib/workflow";

// The examiner's deflection check and the applicant's pre-check: run a member through the
// checker, keep the run on record (model verbatim, options, solver version, result), re-run
// it, turn it into a correction comment, and mark it "re-verify" when its calc is replaced.

type Actor = Pick<SessionUser, "id" | "role" | "name" | "firmId">;
type SaveRequest = z.output<typeof saveRequestSchema>;

/** Largest model file accepted, bytes of JSON (a few hundred members fit in far less). */
export const MAX_MODEL_BYTES = 1_000_000;
const RUN_ROLES: readonly Actor["role"][] = ["applicant", "technician", "examiner", "supervisor"];

export function assertMayRun(actor: Actor): void {
  if (!RUN_ROLES.includes(actor.role)) throw new AppError("forbidden", "Deflection checks are for plan-review staff and applicants.");
}

type Need = "view" | "run" | "save";

const STAFF_ACTION: Record<Need, Action> = { view: "application.view", run: "check.run", save: "check.save" };

/**
 * Who may do what with checks on one application. Staff follow the workflow's permissions
 * table (check.run: assigned examiner, supervisors on filed files; check.save: the same, in
 * review). The table has no pre-check action: applicants pre-check their own applications in
 * any state, and see only their pre-checks and the review checks behind issued comments.
 */
async function access(database: Db | Tx, actor: Actor, applicationId: number, need: Need) {
  const row = await getApplicationRow(database, applicationId);
  if (!row) throw notFound("That application");
  if (actor.role === "applicant") {
    if (row.applicantId !== actor.id) throw notFound("That application");
    return { row, purpose: "precheck" as const };
  }
  const verdict = checkAccess(actor, STAFF_ACTION[need], toResource(row));
  if (verdict === "not_found") throw notFound("That application");
  if (verdict === "forbidden") {
    throw new AppError(
      "forbidden",
      need === "save" ? "Checks are saved by the assigned plans examiner while the application is in review." : "Only the assigned plans examiner or a supervisor checks members on this application.",
    );
  }
  return { row, purpose: "review" as const };
}

async function may(database: Db | Tx, actor: Actor, applicationId: number, need: Need): Promise<boolean> {
  try {
    await access(database, actor, applicationId, need);
    return true;
  } catch (e) {
    if (e instanceof AppError && (e.code === "forbidden" || e.code === "not_found")) return false;
    throw e;
  }
}

// ---- running

export interface RunOutcome {
  model: unknown;
  result: SolveResult;
  verdict: CheckVerdict;
  summary: string;
}

function build(source: RunSource): BuiltModel | { model: unknown; origin: Record<string, string> } {
  if (source.form === "beam") return buildBeamModel(source.input, { title: source.title || source.mark, mark: source.mark });
  if (source.form === "table") return buildTableModel(source.input, { title: source.title || "Structure" });
  return { model: source.model, origin: {} };
}

/** The solver's refusal as a 422: every message names its field; the form's own field path rides along in `fields`. */
function inputError(e: SolverInputError, origin: Record<string, string>): AppError {
  const fields: Record<string, string> = {};
  for (const issue of e.issues) {
    const key = fieldForPath(origin, issue.path) ?? issue.path;
    fields[key] ??= `${issue.path}: ${issue.message}`;
  }
  return new AppError("invalid_input", e.message, fields);
}

/** Plot stations per member for the diagrams; stored with each check so a re-run asks for the same. */
export const PLOT_STATIONS = 24;

function solveOptions(options: CheckOptions & { stations?: number | false }) {
  // Only one limits table ships (IBC 2021); the option records which one the check used.
  return { creep: options.creep, ...(options.stations !== undefined ? { stations: options.stations } : {}) };
}

/** Builds the model from the form (or takes the file), validates and solves it. Nothing is stored. */
export function runSource(source: RunSource, options: CheckOptions = DEFAULT_OPTIONS): RunOutcome {
  const built = build(source);
  if (JSON.stringify(built.model ?? null).length > MAX_MODEL_BYTES) {
    throw new AppError("invalid_input", `The model is larger than ${MAX_MODEL_BYTES / 1_000_000} MB.`, { model: "Too large." });
  }
  let result: SolveResult;
  try {
    result = solve(built.model, solveOptions({ ...options, stations: PLOT_STATIONS }));
  } catch (e) {
    if (e instanceof SolverInputError) throw inputError(e, built.origin);
    throw e;
  }
  return { model: built.model, result, verdict: overallVerdict(result), summary: summarize(result) };
}

export function runCheck(actor: Actor, source: RunSource, options: CheckOptions): RunOutcome {
  assertMayRun(actor);
  return runSource(source, options);
}

// ---- saving and reading

export async function saveCheck(database: Db, actor: Actor, applicationId: number, req: SaveRequest, ip?: string): Promise<{ id: number; verdict: CheckVerdict }> {
  assertMayRun(actor);
  const { row, purpose } = await access(database, actor, applicationId, "save");
  if (req.purpose !== purpose) {
    throw new AppError("forbidden", purpose === "precheck" ? "Applicants save pre-checks; review checks are the plans examiner's." : "Staff save review checks, not pre-checks.");
  }
  if (req.sheetId && !(await getSheetOfApplication(database, { applicationId, sheetId: req.sheetId }))) {
    throw new AppError("invalid_input", "That sheet is not part of this application.", { sheetId: "Not a sheet of this application." });
  }
  if (req.calcDocumentId) {
    const doc = await getDocumentOfApplication(database, { applicationId, documentId: req.calcDocumentId });
    if (!doc || (doc.kind !== "calculations" && doc.kind !== "member_model")) {
      throw new AppError("invalid_input", "That calculation package is not part of this application.", { calcDocumentId: "Not a calculation package of this application." });
    }
    if (req.calcPage && doc.kind === "calculations" && req.calcPage > doc.pageCount) {
      throw new AppError("invalid_input", `The calculation package has ${doc.pageCount} pages.`, { calcPage: `At most ${doc.pageCount}.` });
    }
  }
  // The server solves again: what is stored is its own result, never the browser's.
  const out = runSource(req.source, req.options);
  const cycle = purpose === "review" ? row.cycle : uploadCycle(row.state, row.cycle);
  return withTransaction(database, async (tx) => {
    const id = await insertCheck(tx, {
      applicationId,
      cycle,
      purpose,
      memberMark: req.memberMark,
      sheetId: req.sheetId ?? null,
      calcDocumentId: req.calcDocumentId ?? null,
      calcPage: req.calcPage ?? null,
      model: out.model,
      options: { creep: req.options.creep, limits: LIMITS_SOURCE, stations: PLOT_STATIONS },
      solverVersion: out.result.solver_version,
      result: out.result,
      verdict: out.verdict,
      summary: out.summary,
      createdBy: actor.id,
    });
    await recordAudit(tx, {
      actor,
      action: purpose === "review" ? "check.saved" : "precheck.saved",
      entityType: "deflection_check",
      entityId: id,
      applicationId,
      summary: `${purpose === "review" ? "Deflection check" : "Pre-check"} of ${req.memberMark} saved (cycle ${cycle}): ${out.verdict.replace("_", " ")}.`,
      ip,
    });
    return { id, verdict: out.verdict };
  });
}

/** Applicants see their pre-checks and the review checks behind comments already issued to them. */
function visibleTo(actor: Actor, check: { purpose: string; id: number }, issuedCheckIds: Set<number>): boolean {
  if (actor.role !== "applicant") return true;
  return check.purpose === "precheck" || issuedCheckIds.has(check.id);
}

export async function listChecks(database: Db, actor: Actor, applicationId: number) {
  const { row } = await access(database, actor, applicationId, "view");
  const [rows, linked] = await Promise.all([listChecksForApplication(database, applicationId), listCheckComments(database, applicationId)]);
  const issued = new Set(linked.filter((c) => c.status !== "draft" && c.checkId !== null).map((c) => c.checkId as number));
  const commentOf = new Map(linked.map((c) => [c.checkId, { id: c.id, number: c.number, status: c.status }]));
  const checks = rows
    .filter((c) => visibleTo(actor, c, issued))
    .map((c) => ({ ...c, comment: actor.role === "applicant" && commentOf.get(c.id)?.status === "draft" ? null : (commentOf.get(c.id) ?? null) }));
  return {
    application: { id: row.id, number: row.number, cycle: row.cycle, state: row.state },
    checks,
    permissions: {
      run: await may(database, actor, applicationId, "run"),
      save: await may(database, actor, applicationId, "save"),
      precheck: actor.role === "applicant",
      uploadModels: actor.role === "applicant" && checkAccess(actor, "document.upload", toResource(row)) === "allowed",
    },
  };
}

export async function getCheck(database: Db, actor: Actor, applicationId: number, checkId: number) {
  const { row } = await access(database, actor, applicationId, "view");
  const found = await getCheckForApplication(database, { applicationId, checkId });
  if (!found) throw notFound("That check");
  const comment = await getCommentForCheck(database, { applicationId, checkId });
  const c = found.check;
  if (actor.role === "applicant" && c.purpose === "review" && (!comment || comment.status === "draft")) throw notFound("That check");
  const sheet = c.sheetId ? await getSheetOfApplication(database, { applicationId, sheetId: c.sheetId }) : null;
  const calc = c.calcDocumentId ? await getDocumentOfApplication(database, { applicationId, documentId: c.calcDocumentId }) : null;
  const canComment = checkAccess(actor, "comment.create", toResource(row)) === "allowed";
  return {
    application: { id: row.id, number: row.number, siteAddress: row.siteAddress, workDescription: row.workDescription, state: row.state, cycle: row.cycle, dporName: row.dporName, dporLicence: row.dporLicence },
    check: {
      id: c.id,
      cycle: c.cycle,
      purpose: c.purpose,
      memberMark: c.memberMark,
      sheet: sheet ? { id: sheet.id, sheetNumber: sheet.sheetNumber, title: sheet.title } : null,
      calcDocument: calc ? { id: calc.id, originalName: calc.originalName, cycle: calc.cycle, kind: calc.kind } : null,
      calcPage: c.calcPage,
      model: c.model,
      options: c.options as CheckOptions,
      solverVersion: c.solverVersion,
      result: c.result as SolveResult,
      verdict: c.verdict,
      summary: c.summary,
      status: c.status,
      createdAt: c.createdAt,
      createdByName: found.createdByName,
      createdByRole: found.createdByRole,
    },
    comment: actor.role === "applicant" && comment?.status === "draft" ? null : comment,
    permissions: {
      comment: canComment && !comment && (c.verdict === "fail" || c.verdict === "disputed" || c.verdict === "near_limit"),
      rerun: true,
      recheck: await may(database, actor, applicationId, "run"),
    },
    currentSolverVersion: SOLVER_VERSION,
  };
}

export type CheckView = Awaited<ReturnType<typeof getCheck>>;

/** Where two JSON values differ, as paths ("checks[0].combos[1].verdict.delta_m"); at most `limit`. */
export function jsonDifferences(a: unknown, b: unknown, limit = 20, path = "result"): string[] {
  const out: string[] = [];
  const walk = (x: unknown, y: unknown, p: string) => {
    if (out.length >= limit) return;
    if (Array.isArray(x) && Array.isArray(y)) {
      if (x.length !== y.length) out.push(`${p}: ${x.length} entries then, ${y.length} now`);
      for (let i = 0; i < Math.min(x.length, y.length); i++) walk(x[i], y[i], `${p}[${i}]`);
      return;
    }
    if (x && y && typeof x === "object" && typeof y === "object" && !Array.isArray(x) && !Array.isArray(y)) {
      const keys = new Set([...Object.keys(x), ...Object.keys(y)]);
      for (const k of keys) walk((x as Record<string, unknown>)[k], (y as Record<string, unknown>)[k], `${p}.${k}`);
      return;
    }
    if (!Object.is(x, y)) out.push(`${p}: ${JSON.stringify(x)} then, ${JSON.stringify(y)} now`);
  };
  walk(a, b, path);
  return out;
}

/**
 * Solves the stored model again with the stored options and compares every number with the
 * stored result. Nothing is written: the saved result stays what it was.
 */
export async function rerunCheck(database: Db, actor: Actor, applicationId: number, checkId: number) {
  assertMayRun(actor);
  const view = await getCheck(database, actor, applicationId, checkId);
  const options = { ...DEFAULT_OPTIONS, ...(view.check.options as CheckOptions & { stations?: number }) };
  let fresh: SolveResult;
  try {
    fresh = solve(view.check.model, solveOptions(options));
  } catch (e) {
    if (e instanceof SolverInputError) {
      throw new AppError("unprocessable", `The solver now refuses the stored model: ${e.message}`);
    }
    throw e;
  }
  // Compare as stored: JSON keeps no Infinity (l/Δ of a zero deflection), so round-trip first.
  const now = JSON.parse(JSON.stringify(fresh)) as SolveResult;
  const differences = jsonDifferences(view.check.result, now);
  return {
    identical: differences.length === 0,
    differences,
    storedSolverVersion: view.check.solverVersion,
    solverVersion: fresh.solver_version,
    result: now,
    verdict: overallVerdict(fresh),
  };
}

export async function commentFromCheck(database: Db, actor: Actor, applicationId: number, checkId: number, ip?: string) {
  const view = await getCheck(database, actor, applicationId, checkId);
  const existing = await getCommentForCheck(database, { applicationId, checkId });
  if (existing) throw new AppError("conflict", `Comment ${existing.number} was already made from this check.`);
  const c = view.check;
  if (c.verdict !== "fail" && c.verdict !== "disputed" && c.verdict !== "near_limit") {
    throw new AppError("unprocessable", "This check is within its limits and its claims hold: there is nothing to correct.");
  }
  const body = commentBody(c.result, c.verdict, {
    checkId: c.id,
    memberMark: c.memberMark,
    sheetNumber: c.sheet?.sheetNumber ?? null,
    calcPage: c.calcPage,
    cycle: c.cycle,
    url: `${env().APP_URL}/applications/${applicationId}/checks/${c.id}`,
    edition: "IBC 2021",
  });
  const comment = await addComment(
    database,
    actor,
    applicationId,
    { discipline: "Structural", codeSection: "IBC 1604.3", codeEdition: "2021 IBC", body: body.length > 4000 ? `${body.slice(0, 3990)}…` : body, sheetId: c.sheet?.id ?? null, checkId: c.id },
    ip,
  );
  return comment;
}

export { markChecksForReverify } from "./reverify";

// ---- the batch schedule

export interface ScheduleResultRow {
  line: number;
  mark: string;
  verdict: CheckVerdict | null;
  summary: string;
  error: string | null;
  combos: { name: string; delta_m: number; allowable_m: number; limit: string; span_over_delta: number | null; pass: boolean; near_limit: boolean; claim: { claimed_m: number; difference: number; verdict: string } | null }[];
  model: unknown;
}

export function runSchedule(actor: Actor, csv: string, options: CheckOptions = DEFAULT_OPTIONS): { rows: ScheduleResultRow[]; checked: number; refused: number } {
  assertMayRun(actor);
  const parsed = parseSchedule(csv);
  if (!parsed.ok) throw new AppError("invalid_input", parsed.message, { csv: parsed.message });
  const rows: ScheduleResultRow[] = parsed.errors.map((e) => ({ line: e.line, mark: e.mark, verdict: null, summary: "", error: formatRowError(e), combos: [], model: null }));
  for (const r of parsed.rows) {
    try {
      const result = solve(r.built.model, solveOptions({ ...options, stations: false }));
      rows.push({
        line: r.line,
        mark: r.mark,
        verdict: overallVerdict(result),
        summary: summarize(result),
        error: null,
        combos: result.checks.flatMap((c) =>
          c.combos.map((k) => ({
            name: k.name,
            delta_m: k.verdict.delta_m,
            allowable_m: k.verdict.allowable_m,
            limit: k.verdict.limit,
            span_over_delta: Number.isFinite(k.verdict.span_over_delta) ? k.verdict.span_over_delta : null,
            pass: k.verdict.pass,
            near_limit: k.verdict.near_limit,
            claim: k.claim ? { claimed_m: k.claim.claimed_m, difference: k.claim.difference, verdict: k.claim.verdict } : null,
          })),
        ),
        model: r.built.model,
      });
    } catch (e) {
      if (!(e instanceof SolverInputError)) throw e;
      rows.push({ line: r.line, mark: r.mark, verdict: null, summary: "", error: `Line ${r.line} (${r.mark}): ${e.message.replace(/\n/g, "; ")}`, combos: [], model: r.built.model });
    }
  }
  rows.sort((a, b) => a.line - b.line);
  return { rows, checked: rows.filter((r) => r.verdict).length, refused: rows.filter((r) => r.error).length };
}

// ---- member models (structured model files uploaded beside the calc PDF)

export const MAX_MEMBER_MODEL_BYTES = 1_000_000;

function modelSummary(model: unknown): { title: string; kind: string; marks: string[] } {
  const m = (model ?? {}) as { title?: unknown; kind?: unknown; checks?: unknown };
  const checks = Array.isArray(m.checks) ? (m.checks as { id?: unknown; member?: unknown }[]) : [];
  return {
    title: typeof m.title === "string" ? m.title : "",
    kind: typeof m.kind === "string" ? m.kind : "",
    marks: checks.map((c) => String(c.id ?? c.member ?? "")).filter((s) => s !== ""),
  };
}

async function readStoredJson(key: string): Promise<unknown> {
  const bytes = await readAll(await storage().get(key), MAX_MEMBER_MODEL_BYTES);
  return JSON.parse(Buffer.from(bytes).toString("utf8")) as unknown;
}

export async function uploadMemberModel(database: Db, actor: Actor, applicationId: number, fileName: string, body: Uint8Array, ip?: string) {
  const row = await getApplicationRow(database, applicationId);
  if (!row) throw notFound("That application");
  const verdict = checkAccess(actor, "document.upload", toResource(row));
  if (verdict === "not_found") throw notFound("That application");
  if (verdict === "forbidden") throw new AppError("forbidden", "Member models are uploaded by the applicant while the file is with them.");
  const name = checkUploadName(fileName);
  if (!name.ok && name.code !== "name_not_pdf") throw new AppError("invalid_input", name.message, { file: name.message });
  const display = fileName.trim();
  if (!/\.json$/i.test(display) || display.length <= 5) {
    throw new AppError("invalid_input", "A member model is a .json model file.", { file: "The file name must end in .json." });
  }
  if (body.byteLength === 0) throw new AppError("invalid_input", "The file is empty.", { file: "The file is empty." });
  if (body.byteLength > MAX_MEMBER_MODEL_BYTES) throw new AppError("invalid_input", "The model file is larger than 1 MB.", { file: "Larger than 1 MB." });
  let json: unknown;
  try {
    json = JSON.parse(Buffer.from(body).toString("utf8"));
  } catch (e) {
    const message = `The file is not valid JSON (${e instanceof Error ? e.message : "unreadable"}).`;
    throw new AppError("invalid_input", message, { file: message });
  }
  try {
    parseModel(json);
  } catch (e) {
    if (e instanceof SolverInputError) {
      const fields: Record<string, string> = {};
      for (const i of e.issues) fields[i.path] ??= i.message;
      throw new AppError("invalid_input", `The model file is not valid:\n${e.message}`, fields);
    }
    throw e;
  }
  const stored = await storage().put(body, { maxBytes: MAX_MEMBER_MODEL_BYTES });
  const discard = () => storage().delete(stored.key).catch(() => false);
  try {
    const cycle = uploadCycle(row.state, row.cycle);
    return await withTransaction(database, async (tx) => {
      const dup = await findDocumentBySha(tx, { applicationId, sha256: stored.sha256 });
      if (dup) throw new AppError("conflict", `This exact file is already in the application, as “${dup.name}” (cycle ${dup.cycle}). Nothing was added.`, { file: "Duplicate of an uploaded file." });
      const [doc] = await tx
        .insert(documents)
        .values({
          applicationId,
          cycle,
          kind: "member_model",
          originalName: display.slice(0, 255),
          contentType: "application/json",
          byteSize: stored.size,
          sha256: stored.sha256,
          pageCount: 0,
          storageKey: stored.key,
          uploadedBy: actor.id,
        })
        .$returningId();
      if (!doc) throw new AppError("internal", "The model could not be saved.");
      const s = modelSummary(json);
      await recordAudit(tx, {
        actor,
        action: "document.uploaded",
        entityType: "document",
        entityId: doc.id,
        applicationId,
        summary: `Structural member model uploaded for cycle ${cycle}: ${display}${s.title ? ` (${s.title})` : ""}.`,
        detail: { sha256: stored.sha256, bytes: stored.size },
        ip,
      });
      return { id: doc.id, cycle, ...s };
    });
  } catch (e) {
    await discard();
    throw e;
  }
}

export async function listMemberModels(database: Db, actor: Actor, applicationId: number) {
  await access(database, actor, applicationId, "view");
  const docs = await listDocumentsOfKind(database, applicationId, "member_model");
  const models = [];
  for (const d of docs.slice(0, 100)) {
    let summary = { title: "", kind: "", marks: [] as string[] };
    let readable = true;
    try {
      summary = modelSummary(await readStoredJson(d.storageKey));
    } catch {
      readable = false;
    }
    models.push({ id: d.id, name: d.originalName, cycle: d.cycle, uploadedAt: d.uploadedAt, uploadedByName: d.uploadedByName, byteSize: d.byteSize, readable, ...summary });
  }
  return { models };
}

export async function readMemberModel(database: Db, actor: Actor, applicationId: number, documentId: number) {
  await access(database, actor, applicationId, "view");
  const doc = await getDocumentOfApplication(database, { applicationId, documentId });
  if (!doc || doc.kind !== "member_model") throw notFound("That member model");
  try {
    return { id: doc.id, name: doc.originalName, cycle: doc.cycle, model: await readStoredJson(doc.storageKey) };
  } catch (e) {
    if (e instanceof StorageError || e instanceof SyntaxError) throw new AppError("unprocessable", "The stored model file cannot be read.");
    throw e;
  }
}

// ---- suggestions from the calculation package's text layer

const suggestionCache = new Map<number, { pageCount: number; suggestions: Found[] }>();

async function readPdfBytes(stream: Readable): Promise<Uint8Array> {
  return readAll(stream, 80 * 1024 * 1024);
}

export async function calcSuggestions(database: Db, actor: Actor, applicationId: number, documentId?: number) {
  await access(database, actor, applicationId, "run");
  const calcs = await listDocumentsOfKind(database, applicationId, "calculations");
  const documentsList = calcs.map((c) => ({ id: c.id, name: c.originalName, cycle: c.cycle, pageCount: c.pageCount }));
  const chosen = documentId ? calcs.find((c) => c.id === documentId) : calcs[0];
  if (documentId && !chosen) throw notFound("That calculation package");
  if (!chosen) return { documents: documentsList, documentId: null, pageCount: 0, suggestions: [] as Found[], message: "No calculation package has been uploaded." };
  let hit = suggestionCache.get(chosen.id);
  if (!hit) {
    const bytes = await readPdfBytes(await storage().get(chosen.storageKey));
    const read = await readPdf(bytes, { maxPages: 400, timeoutMs: 20_000 });
    if (!read.ok) return { documents: documentsList, documentId: chosen.id, pageCount: chosen.pageCount, suggestions: [] as Found[], message: `The text of this package could not be read (${read.code}).` };
    hit = { pageCount: read.pageCount, suggestions: scanCalcText(read.pages.map((p) => ({ page: p.page, lines: linesOf(p) }))) };
    if (suggestionCache.size > 50) suggestionCache.clear();
    suggestionCache.set(chosen.id, hit);
  }
  return {
    documents: documentsList,
    documentId: chosen.id,
    pageCount: hit.pageCount,
    suggestions: hit.suggestions,
    message: hit.suggestions.length ? null : "Nothing suggestible was found in the text layer (a scanned package has none).",
  };
}

// ---- what the new-check page needs

export async function checkWorkbench(database: Db, actor: Actor, applicationId: number) {
  const { row, purpose } = await access(database, actor, applicationId, "run");
  const [sheetRows, calcs] = await Promise.all([listSheetsOfApplication(database, applicationId), listDocumentsOfKind(database, applicationId, "calculations")]);
  return {
    application: { id: row.id, number: row.number, siteAddress: row.siteAddress, state: row.state, cycle: row.cycle },
    purpose,
    sheets: sheetRows.map((s) => ({ id: s.id, label: `${s.sheetNumber ?? `Page ${s.page}`} — ${s.title}`, cycle: s.cycle })),
    calcs: calcs.map((c) => ({ id: c.id, name: c.originalName, cycle: c.cycle, pageCount: c.pageCount })),
    permissions: {
      save: await may(database, actor, applicationId, "save"),
      uploadModels: actor.role === "applicant" && checkAccess(actor, "document.upload", toResource(row)) === "allowed",
    },
  };
}

export type WorkbenchContext = Awaited<ReturnType<typeof checkWorkbench>>;
