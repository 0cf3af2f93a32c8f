import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, readJson, route } from "@/lib/api/handler";
import { addComment } from "@/lib/applications/service";
import { clientIp } from "@/lib/auth/request-ip";
import { requireUser } from "@/lib/auth/session";
import { commentSchema } from "@/lib/validations/application";

export const POST = route<{ id: string }>(async (req, p) => {
  const user = await requireUser();
  const body = await readJson(req, commentSchema);
  const c = await addComment(db(), user, pathId(p.id, "That application"), body, clientIp(req.headers));
  return NextResponse.json({ comment: c }, { status: 201 });
});
