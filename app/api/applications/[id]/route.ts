import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, readJson, route } from "@/lib/api/handler";
import { updateApplication } from "@/lib/applications/service";
import { applicationView } from "@/lib/applications/view";
import { clientIp } from "@/lib/auth/request-ip";
import { requireUser } from "@/lib/auth/session";
import { applicationSchema } from "@/lib/validations/application";
import { z } from "zod";

export const GET = route<{ id: string }>(async (_req, p) => {
  const user = await requireUser();
  return NextResponse.json(await applicationView(db(), user, pathId(p.id, "That application")));
});

export const PATCH = route<{ id: string }>(async (req, p) => {
  const user = await requireUser();
  const body = await readJson(req, applicationSchema.extend({ version: z.number().int().positive() }));
  await updateApplication(db(), user, pathId(p.id, "That application"), body.version, body, clientIp(req.headers));
  return NextResponse.json({ ok: true });
});
