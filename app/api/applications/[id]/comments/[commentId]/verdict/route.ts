import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, readJson, route } from "@/lib/api/handler";
import { judgeResponse } from "@/lib/applications/service";
import { clientIp } from "@/lib/auth/request-ip";
import { requireUser } from "@/lib/auth/session";
import { verdictSchema } from "@/lib/validations/application";

export const POST = route<{ id: string; commentId: string }>(async (req, p) => {
  const user = await requireUser();
  const body = await readJson(req, verdictSchema);
  await judgeResponse(db(), user, pathId(p.id, "That application"), pathId(p.commentId, "That comment"), body.verdict, clientIp(req.headers));
  return NextResponse.json({ ok: true });
});
