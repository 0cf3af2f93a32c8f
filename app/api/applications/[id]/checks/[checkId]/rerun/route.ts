import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, route } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { rerunCheck } from "@/lib/checks/service";

// Solves the stored model again and says whether every number is identical; stores nothing.
export const POST = route<{ id: string; checkId: string }>(async (_req, p) => {
  const user = await requireUser();
  return NextResponse.json(await rerunCheck(db(), user, pathId(p.id, "That application"), pathId(p.checkId, "That check")));
});
