import "server-only";
import type { Tx } from "@/db/client";
import { recordAudit } from "@/db/queries/audit";
import { markChecksReverify } from "@/db/queries/checks";

// Kept apart from service.ts so the upload path can call it without importing the whole service.
/**
 * Called when a resubmittal brings a new calculation package: the application's checks made
 * in earlier cycles from an earlier package become "re-verify". Runs inside the caller's
 * transaction; returns how many were marked.
 */
export async function markChecksForReverify(tx: Tx, applicationId: number, newCycle: number): Promise<number> {
  const ids = await markChecksReverify(tx, applicationId, newCycle);
  if (ids.length) {
    await recordAudit(tx, {
      actor: null,
      action: "check.reverify",
      entityType: "application",
      entityId: applicationId,
      applicationId,
      summary: `${ids.length} deflection check${ids.length === 1 ? "" : "s"} marked re-verify: the calculation package was replaced for cycle ${newCycle}.`,
      detail: { checkIds: ids },
    });
  }
  return ids.length;
}
