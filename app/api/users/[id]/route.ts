import { NextResponse } from "next/server";
import { z } from "zod";
import { db } from "@/db/client";
import { readJson, route } from "@/lib/api/handler";
import { clientIp } from "@/lib/auth/request-ip";
import { requireRole } from "@/lib/auth/session";
import { notFound } from "@/lib/errors";
import { updateUser } from "@/lib/users/service";
import { updateUserSchema } from "@/lib/validations/auth";

const idParam = z.coerce.number().int().positive();

export const PATCH = route<{ id: string }>(async (req, params) => {
  const actor = await requireRole("admin");
  const id = idParam.safeParse(params.id);
  if (!id.success) throw notFound("That user");
  const body = await readJson(req, updateUserSchema);
  await updateUser(db(), actor, id.data, body, clientIp(req.headers));
  return NextResponse.json({ ok: true });
});
