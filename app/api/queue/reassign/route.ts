import { NextResponse } from "next/server";
import { z } from "zod";
import { db } from "@/db/client";
import { getApplicationRow } from "@/db/queries/applications";
import { getUserById } from "@/db/queries/users";
import { readJson, route } from "@/lib/api/handler";
import { fireEvent } from "@/lib/applications/service";
import { clientIp } from "@/lib/auth/request-ip";
import { requireRole } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { WorkflowError } from "@/lib/workflow";

const body = z.object({
  applicationIds: z
    .array(z.number().int().positive())
    .min(1, "Choose at least one review.")
    .max(100, "Reassign at most 100 reviews at once.")
    .refine((ids) => new Set(ids).size === ids.length, "Each review once."),
  examinerId: z.number({ error: "Choose a plans examiner." }).int().positive(),
  reason: z.string().trim().min(3, "Give the reason (kept internal, never shown to the applicant).").max(500),
});

export type ReassignOutcome =
  | { applicationId: number; number: string | null; ok: true }
  | { applicationId: number; number: string | null; ok: false; code: string; message: string };

// One or many reviews to one examiner. Each goes through fireEvent in its own transaction,
// so one stale or closed file does not hold back the others; the answer lists each outcome.
export const POST = route(async (req) => {
  const actor = await requireRole("supervisor");
  const input = await readJson(req, body);
  const target = await getUserById(db(), input.examinerId);
  if (!target || target.status !== "active" || (target.role !== "examiner" && target.role !== "supervisor")) {
    throw new AppError("invalid_input", "Choose an active plans examiner.", { examinerId: "Not an active plans examiner." });
  }
  const ip = clientIp(req.headers);
  const results: ReassignOutcome[] = [];
  for (const applicationId of input.applicationIds) {
    const row = await getApplicationRow(db(), applicationId);
    const number = row?.number ?? null;
    if (!row || row.state === "draft") {
      results.push({ applicationId, number: null, ok: false, code: "not_found", message: "That application was not found." });
      continue;
    }
    if (row.assignedExaminerId === target.id) {
      results.push({ applicationId, number, ok: false, code: "unchanged", message: `Already with ${target.name}.` });
      continue;
    }
    try {
      await fireEvent(db(), actor, applicationId, "reassign", row.version, { examinerId: target.id, reason: input.reason }, { ip });
      results.push({ applicationId, number, ok: true });
    } catch (e) {
      if (e instanceof AppError || e instanceof WorkflowError) results.push({ applicationId, number, ok: false, code: e.code, message: e.message });
      else {
        // The others still go through; this one is reported, the cause logged, never shown.
        console.error("[api] reassign failed", applicationId, e);
        results.push({ applicationId, number, ok: false, code: "internal", message: "Something went wrong on our side. Try again." });
      }
    }
  }
  return NextResponse.json({ examiner: { id: target.id, name: target.name }, results, reassigned: results.filter((r) => r.ok).length });
});
