import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { listUsers } from "@/db/queries/users";
import { readJson, route } from "@/lib/api/handler";
import { clientIp } from "@/lib/auth/request-ip";
import { requireRole } from "@/lib/auth/session";
import { inviteUser } from "@/lib/users/service";
import { inviteSchema } from "@/lib/validations/auth";

export const GET = route(async () => {
  await requireRole("admin");
  return NextResponse.json({ users: await listUsers(db()) });
});

export const POST = route(async (req) => {
  const actor = await requireRole("admin");
  const body = await readJson(req, inviteSchema);
  const created = await inviteUser(db(), actor, body, clientIp(req.headers));
  return NextResponse.json({ user: created }, { status: 201 });
});
