import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, route } from "@/lib/api/handler";
import { clientIp } from "@/lib/auth/request-ip";
import { requireUser } from "@/lib/auth/session";
import { commentFromCheck } from "@/lib/checks/service";

// A failed, disputed or near-limit check becomes a draft correction comment in the current cycle.
export const POST = route<{ id: string; checkId: string }>(async (req, p) => {
  const user = await requireUser();
  const comment = await commentFromCheck(db(), user, pathId(p.id, "That application"), pathId(p.checkId, "That check"), clientIp(req.headers));
  return NextResponse.json({ comment }, { status: 201 });
});
