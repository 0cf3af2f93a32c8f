import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, route } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { readMemberModel } from "@/lib/checks/service";

// The model file as uploaded, parsed, for the check forms to start from.
export const GET = route<{ id: string; documentId: string }>(async (_req, p) => {
  const user = await requireUser();
  return NextResponse.json(await readMemberModel(db(), user, pathId(p.id, "That application"), pathId(p.documentId, "That member model")));
});
