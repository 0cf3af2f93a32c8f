import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, readJson, route } from "@/lib/api/handler";
import { clientIp } from "@/lib/auth/request-ip";
import { requireUser } from "@/lib/auth/session";
import { saveRequestSchema } from "@/lib/checks/schemas";
import { listChecks, saveCheck } from "@/lib/checks/service";

export const GET = route<{ id: string }>(async (_req, p) => {
  const user = await requireUser();
  return NextResponse.json(await listChecks(db(), user, pathId(p.id, "That application")));
});

export const POST = route<{ id: string }>(async (req, p) => {
  const user = await requireUser();
  const id = pathId(p.id, "That application");
  const body = await readJson(req, saveRequestSchema);
  const check = await saveCheck(db(), user, id, body, clientIp(req.headers));
  return NextResponse.json({ check }, { status: 201 });
});
