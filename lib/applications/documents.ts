import "server-only";
import { and, eq } from "drizzle-orm";
import type { Readable } from "node:stream";
import { type Db, withTransaction } from "@/db/client";
import { recordAudit } from "@/db/queries/audit";
import { documents, sheets, DOCUMENT_KINDS } from "@/db/schema";
import { env } from "@/lib/env";
import { AppError, notFound } from "@/lib/errors";
import { checkUploadName, DEFAULT_PDF_LIMITS, inspectPdf } from "@/lib/pdf/inspect";
import { storageFromEnv } from "@/lib/storage/from-env";
import { StorageError, type ObjectStorage, type StorageBody } from "@/lib/storage/storage";
import { STATE_INFO } from "@/lib/workflow";
import { markChecksForReverify } from "@/lib/checks/reverify";
import { authorize } from "./service";
import type { SessionUser } from "@/db/queries/users";

type Actor = Pick<SessionUser, "id" | "role" | "name" | "firmId">;
export type DocumentKind = (typeof DOCUMENT_KINDS)[number];

// Shown on the upload screen before anything is sent (ASVS 5.1.1: documented limits).
export const UPLOAD_LIMITS = { maxBytes: 60 * 1024 * 1024, maxFilesPerDrop: 20, maxPages: 400 } as const;

export const KIND_LABELS: Record<DocumentKind, string> = {
  drawings: "Drawing set",
  calculations: "Calculation package",
  response_letter: "Response letter",
  member_model: "Structural member model",
};

const g = globalThis as unknown as { __spanproofStorage?: ObjectStorage };
export function storage(): ObjectStorage {
  g.__spanproofStorage ??= storageFromEnv(env());
  return g.__spanproofStorage;
}

/** The cycle an upload belongs to: while corrections are out, revised sheets are for the next one. */
export function uploadCycle(state: keyof typeof STATE_INFO, cycle: number): number {
  return state === "corrections_issued" ? cycle + 1 : Math.max(cycle, 1);
}

async function readAll(stream: Readable): Promise<Uint8Array> {
  const chunks: Buffer[] = [];
  for await (const c of stream) chunks.push(c as Buffer);
  return Buffer.concat(chunks);
}

export interface UploadResult {
  id: number;
  pageCount: number;
  sheets: { page: number; sheetNumber: string | null; title: string }[];
}

/**
 * Streams the body to storage (size limit enforced on the way), then checks it is a real,
 * readable, unencrypted PDF without scripts. A refused file leaves no row and no bytes.
 */
export async function uploadDocument(
  database: Db,
  actor: Actor,
  applicationId: number,
  kind: DocumentKind,
  fileName: string,
  body: StorageBody,
  ip?: string,
): Promise<UploadResult> {
  const app = await authorize(database, actor, applicationId, "document.upload");
  if (kind === "member_model") throw new AppError("invalid_input", "Member models are uploaded from the deflection check screen.");
  const name = checkUploadName(fileName);
  if (!name.ok) throw new AppError("invalid_input", name.message, { file: name.message });

  let stored;
  try {
    stored = await storage().put(body, { maxBytes: UPLOAD_LIMITS.maxBytes });
  } catch (e) {
    if (e instanceof StorageError && e.code === "too_large") throw new AppError("invalid_input", e.message, { file: e.message });
    if (e instanceof StorageError && e.code === "aborted") throw new AppError("invalid_input", "The upload was interrupted. Try again.");
    throw e;
  }
  const discard = () => storage().delete(stored.key).catch(() => false);
  try {
    const bytes = await readAll(await storage().get(stored.key));
    const inspection = await inspectPdf(bytes, { ...DEFAULT_PDF_LIMITS, maxBytes: UPLOAD_LIMITS.maxBytes, maxPages: UPLOAD_LIMITS.maxPages, textCharsPerPage: 0 });
    if (!inspection.ok) throw new AppError("invalid_input", inspection.message, { file: inspection.message });

    const cycle = uploadCycle(app.state, app.cycle);
    return await withTransaction(database, async (tx) => {
      const [dup] = await tx
        .select({ name: documents.originalName, cycle: documents.cycle })
        .from(documents)
        .where(and(eq(documents.applicationId, applicationId), eq(documents.sha256, stored.sha256)))
        .limit(1);
      if (dup) {
        throw new AppError("conflict", `This exact file is already in the application, as “${dup.name}” (cycle ${dup.cycle}). Nothing was added.`, {
          file: "Duplicate of an uploaded file.",
        });
      }
      const [doc] = await tx
        .insert(documents)
        .values({
          applicationId,
          cycle,
          kind,
          originalName: name.displayName,
          contentType: "application/pdf",
          byteSize: stored.size,
          sha256: stored.sha256,
          pageCount: inspection.pageCount,
          storageKey: stored.key,
          uploadedBy: actor.id,
        })
        .$returningId();
      if (!doc) throw new AppError("internal", "The document could not be saved.");
      if (inspection.sheets.length) {
        await tx.insert(sheets).values(
          inspection.sheets.map((s) => ({ documentId: doc.id, applicationId, page: s.page, sheetNumber: s.sheetNumber, title: s.title.slice(0, 200) })),
        );
      }
      // A new calculation package in a later cycle puts the checks made from earlier ones on "re-verify".
      if (kind === "calculations") await markChecksForReverify(tx, applicationId, cycle);
      await recordAudit(tx, {
        actor,
        action: "document.uploaded",
        entityType: "document",
        entityId: doc.id,
        applicationId,
        summary: `${KIND_LABELS[kind]} uploaded for cycle ${cycle}: ${name.displayName} (${inspection.pageCount} pages).`,
        detail: { sha256: stored.sha256, bytes: stored.size },
        ip,
      });
      return { id: doc.id, pageCount: inspection.pageCount, sheets: inspection.sheets };
    });
  } catch (e) {
    await discard();
    throw e;
  }
}

/** One document after the per-request check that the reader may see it; `open` streams its bytes. */
export async function readableDocument(database: Db, actor: Actor, documentId: number) {
  const [doc] = await database.select().from(documents).where(eq(documents.id, documentId)).limit(1);
  if (!doc) throw notFound("That document");
  try {
    await authorize(database, actor, doc.applicationId, "document.download");
  } catch (e) {
    // Not yours looks like not there, whatever the reason.
    if (e instanceof AppError && (e.code === "forbidden" || e.code === "not_found")) throw notFound("That document");
    throw e;
  }
  return { doc, open: (range?: { start: number; end: number }) => storage().get(doc.storageKey, range) };
}
