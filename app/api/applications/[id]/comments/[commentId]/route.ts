import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, readJson, route } from "@/lib/api/handler";
import { deleteDraftComment, editComment } from "@/lib/applications/service";
import { clientIp } from "@/lib/auth/request-ip";
import { requireUser } from "@/lib/auth/session";
import { commentUpdateSchema } from "@/lib/validations/application";

type P = { id: string; commentId: string };

export const PATCH = route<P>(async (req, p) => {
  const user = await requireUser();
  const { version, ...change } = await readJson(req, commentUpdateSchema);
  await editComment(db(), user, pathId(p.id, "That application"), pathId(p.commentId, "That comment"), version, change, clientIp(req.headers));
  return NextResponse.json({ ok: true });
});

export const DELETE = route<P>(async (req, p) => {
  const user = await requireUser();
  await deleteDraftComment(db(), user, pathId(p.id, "That application"), pathId(p.commentId, "That comment"), clientIp(req.headers));
  return NextResponse.json({ ok: true });
});
