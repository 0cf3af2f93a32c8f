import { NextResponse } from "next/server";
import { readJson, route } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { runRequestSchema } from "@/lib/checks/schemas";
import { runCheck } from "@/lib/checks/service";

// A model (or the beam form / the tables it is built from) in, the checker's result out. Nothing is stored.
export const POST = route(async (req) => {
  const user = await requireUser();
  const body = await readJson(req, runRequestSchema);
  return NextResponse.json(runCheck(user, body.source, body.options));
});
