import { NextResponse } from "next/server";
import { z } from "zod";
import { db } from "@/db/client";
import { listApplications } from "@/db/queries/applications";
import { readJson, route } from "@/lib/api/handler";
import { createApplication } from "@/lib/applications/service";
import { clientIp } from "@/lib/auth/request-ip";
import { requireUser } from "@/lib/auth/session";
import { forbidden } from "@/lib/errors";
import { applicationSchema } from "@/lib/validations/application";
import { STATES } from "@/lib/workflow";

const listQuery = z.object({
  scope: z.enum(["mine", "intake", "reviews", "all"]).default("all"),
  q: z.string().trim().max(100).optional(),
  state: z.enum(STATES).optional(),
  sort: z.enum(["number", "updated", "submitted", "address", "state"]).default("updated"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  pageSize: z.coerce.number().int().min(5).max(100).default(25),
});

export const GET = route(async (req) => {
  const user = await requireUser();
  if (user.role === "admin") throw forbidden();
  const query = listQuery.parse(Object.fromEntries(req.nextUrl.searchParams));
  return NextResponse.json(await listApplications(db(), user, query));
});

export const POST = route(async (req) => {
  const user = await requireUser();
  const input = await readJson(req, applicationSchema);
  const created = await createApplication(db(), user, input, clientIp(req.headers));
  return NextResponse.json({ application: created }, { status: 201 });
});
