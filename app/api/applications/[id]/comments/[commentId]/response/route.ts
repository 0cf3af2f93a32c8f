import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, readJson, route } from "@/lib/api/handler";
import { respondToComment } from "@/lib/applications/service";
import { clientIp } from "@/lib/auth/request-ip";
import { requireUser } from "@/lib/auth/session";
import { responseSchema } from "@/lib/validations/application";

export const PUT = route<{ id: string; commentId: string }>(async (req, p) => {
  const user = await requireUser();
  const body = await readJson(req, responseSchema);
  await respondToComment(db(), user, pathId(p.id, "That application"), pathId(p.commentId, "That comment"), body, clientIp(req.headers));
  return NextResponse.json({ ok: true });
});
