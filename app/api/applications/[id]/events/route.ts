import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, readJson, route } from "@/lib/api/handler";
import { fireEvent } from "@/lib/applications/service";
import { clientIp } from "@/lib/auth/request-ip";
import { requireUser } from "@/lib/auth/session";
import { eventSchema } from "@/lib/validations/application";
import type { EventInputs, WorkflowEvent } from "@/lib/workflow";

// Every workflow event: submit, return_incomplete, accept, issue_corrections, resubmit,
// begin_review, approve, approve_with_conditions, withdraw, reassign.
export const POST = route<{ id: string }>(async (req, p) => {
  const user = await requireUser();
  const body = await readJson(req, eventSchema);
  const r = await fireEvent(db(), user, pathId(p.id, "That application"), body.event as WorkflowEvent, body.version, body.input as EventInputs[WorkflowEvent], {
    checklist: body.checklist,
    ip: clientIp(req.headers),
  });
  return NextResponse.json(r);
});
