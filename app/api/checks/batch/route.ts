import { NextResponse } from "next/server";
import { readJson, route } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { batchRequestSchema } from "@/lib/checks/schemas";
import { runSchedule } from "@/lib/checks/service";

// A member schedule (CSV text) in, one verdict per row out; a bad row is reported on its line.
export const POST = route(async (req) => {
  const user = await requireUser();
  const body = await readJson(req, batchRequestSchema);
  return NextResponse.json(runSchedule(user, body.csv, body.options));
});
