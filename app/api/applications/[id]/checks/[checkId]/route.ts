import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, route } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { getCheck } from "@/lib/checks/service";

// The stored check exactly as saved: never re-computed on the way out.
export const GET = route<{ id: string; checkId: string }>(async (_req, p) => {
  const user = await requireUser();
  return NextResponse.json(await getCheck(db(), user, pathId(p.id, "That application"), pathId(p.checkId, "That check")));
});
