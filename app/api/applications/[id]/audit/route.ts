import { db } from "@/db/client";
import { getApplicationRow, toResource } from "@/db/queries/applications";
import { listAuditForApplication } from "@/db/queries/audit";
import { pathId, route } from "@/lib/api/handler";
import { requireRole } from "@/lib/auth/session";
import { toCsv } from "@/lib/csv";
import { AppError, notFound } from "@/lib/errors";
import { checkAccess } from "@/lib/workflow";

// The application's whole audit trail as CSV, for department staff who may see the file.
export const GET = route<{ id: string }>(async (_req, p) => {
  const user = await requireRole("technician", "examiner", "supervisor");
  const id = pathId(p.id, "That application");
  const row = await getApplicationRow(db(), id);
  if (!row) throw notFound("That application");
  const access = checkAccess(user, "application.view", toResource(row));
  if (access === "not_found") throw notFound("That application");
  if (access !== "allowed") throw new AppError("forbidden", "You cannot export this application's history.");
  const events = await listAuditForApplication(db(), id);
  const csv = toCsv(
    ["when (UTC)", "action", "summary", "by", "role"],
    events.map((e) => [e.at, e.action, e.summary, e.actorName ?? "", e.actorRole ?? ""]),
  );
  return new Response(csv, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${row.number ?? `application-${id}`}-audit.csv"`,
      "x-content-type-options": "nosniff",
      "cache-control": "private, no-store",
    },
  });
});
